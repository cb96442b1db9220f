"""A check record's point-fit section (core/inspection_record.py) item by item: the opening line in full,
the flag threshold and RMS figures, the worst point's mark when none is flagged, the unit the fit was
measured in, and the refusal of a fit of another orientation on both sides of the agreement it asks for.
Check values: the record's own words; the rotation's angle from SciPy's Rotation; hand-worked counts."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.fit import fit_points
from core.orientation import Orientation
from tests.core.test_inspection_record_check_words import bracket_session
from tests.core.test_inspection_record_fit_and_scope import FIT, NOMINAL_POINTS, TRUE_TURN

HEAD = ("The measured orientation is the best fit of {n} point pairs (measured = R · nominal + t, nominal in body "
        "axes, measured in reference axes); a residual is measured − fitted.")


def _record(fit, measured=None, **kwargs):
    session = bracket_session(measured=measured if measured is not None else fit.orientation)
    return records.check_record(session, "Bracket check", "b", "0" * 64, fit=fit, **kwargs)


def test_the_fit_section_comes_last_with_its_items_in_order():
    record = _record(FIT, fit_source="bracket_points.csv", fit_unit="in")
    assert record.fit_source == "bracket_points.csv"
    section = record.sections[-1]
    assert [s.title for s in record.sections] == ["Check “Bracket check”: FAIL", "Nominal", "Measured",
                                                  "The measured orientation's point fit"]
    items = section.items
    assert (items[0].key, items[0].label, items[0].unit) == ("check[0].fit_points", "Points file", "")
    assert items[1] == HEAD.format(n=6)
    assert (items[2].key, items[2].label, items[2].unit) == \
        ("check[0].fit_flag_threshold", f"Flag threshold of the residual distance ({FIT.flag_rule})", "in")
    assert [float(v) for v in items[2].values] == pytest.approx([FIT.flag_threshold], rel=1e-8)
    assert (items[3].key, items[3].label, items[3].unit) == ("check[0].fit_rms", "RMS residual of the point fit",
                                                             "in")
    table = items[4]
    assert table.title == "Residuals of the point fit (measured − fitted, reference axes), in"
    assert all(row.unit == "in" for row in table.rows)
    assert [row.key for row in table.rows] == [f"check[0].fit_residual[{i}]" for i in range(6)]
    assert len(items) == 5


def test_without_a_points_file_the_section_opens_with_the_fit():
    record = _record(FIT)
    assert record.fit_source is None
    assert record.sections[-1].items[0] == HEAD.format(n=6)


def test_the_worst_point_is_marked_when_none_is_flagged():
    # Invented: four points, the third measured 0.05 mm off and the others exact
    nominal = NOMINAL_POINTS[:4]
    measured = nominal @ TRUE_TURN.as_matrix().T
    measured[2] += [0.0, 0.05, 0.0]
    fit = fit_points(nominal, measured)
    assert not fit.flagged
    rows = _record(fit).sections[-1].items[-1].rows
    labels = [row.label for row in rows]
    assert labels[fit.worst_index].endswith(" (worst)")
    assert sum(label.endswith(")") for label in labels) == 1
    assert [label.split(" (")[0] for label in labels] == ["row 1", "row 2", "row 3", "row 4"]


def test_without_a_threshold_no_threshold_is_printed():
    # Invented: three points, too few to flag any (the fit says so with no threshold)
    nominal = NOMINAL_POINTS[:3]
    measured = nominal @ TRUE_TURN.as_matrix().T
    measured[1, 1] += 0.01
    fit = fit_points(nominal, measured)
    assert fit.flag_threshold is None
    section = _record(fit).sections[-1]
    keys = [i.key for i in section.items if isinstance(i, records.Figure)]
    assert keys == ["check[0].fit_rms"]
    assert section.items[0] == HEAD.format(n=3)


def _scipy_angle(a, b):
    qa = Rotation.from_quat(a.as_quaternion(), scalar_first=True)
    qb = Rotation.from_quat(b.as_quaternion(), scalar_first=True)
    return float(np.degrees((qa.inv() * qb).magnitude()))


def test_a_fit_within_its_agreement_is_taken_and_one_beyond_is_refused_word_for_word():
    near = FIT.orientation @ Orientation.from_axis_angle([0, 0, 1], 0.5e-6)
    assert _record(FIT, measured=near).sections[-1].title == "The measured orientation's point fit"
    far = FIT.orientation @ Orientation.from_axis_angle([0, 0, 1], 2e-6)
    apart = _scipy_angle(FIT.orientation, far)          # SciPy's Rotation: 2e-6° apart
    with pytest.raises(records.RecordError) as refused:
        _record(FIT, measured=far, fit_source="pts.csv")
    assert str(refused.value) == (f"the measured mount 'Measured bracket' is not the fit of pts.csv: they are "
                                  f"{apart:.6g}° apart (at most 1e-06° expected), so the residuals would "
                                  "describe another orientation")
    with pytest.raises(records.RecordError) as refused:
        _record(FIT, measured=far)
    assert "is not the fit of the points: they are" in str(refused.value)
