"""A check record that holds the measured orientation's point fit (its residual table, RMS and points file),
and the record a report file names by scope (record_for), with the units it was printed in. Check values:
SciPy's Rotation.align_vectors (the same least-squares fit) and hand-worked row numbers."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.fit import fit_points
from core.orientation import Orientation
from tests.core.test_inspection_record_check_words import bracket_session

# Invented: six target points on the bracket (body mm), measured with small errors, the fourth 1 mm off.
NOMINAL_POINTS = np.array([[0, 0, 0], [200, 0, 0], [200, 100, 0], [0, 100, 0], [0, 0, 80], [200, 100, 80]], float)
ERRORS = np.array([[0.01, -0.02, 0.0], [-0.01, 0.0, 0.02], [0.0, 0.01, -0.01], [1.0, 0.0, 0.0],
                   [0.02, 0.01, 0.0], [0.0, -0.01, 0.01]])
TRUE_TURN = Orientation.from_axis_angle([0.2, -1.0, 0.1], 1.5)
SHIFT = np.array([500.0, -20.0, 35.0])
MEASURED_POINTS = NOMINAL_POINTS @ TRUE_TURN.as_matrix().T + SHIFT + ERRORS
FIT = fit_points(NOMINAL_POINTS, MEASURED_POINTS)
ARCSEC = records.ReportUnits("arcsec", "mm/m")


def _fit_session():
    return bracket_session(measured=FIT.orientation)


def _fit_record(**kwargs):
    return records.check_record(_fit_session(), "Bracket check", "bracket.fwsession.json", "0" * 64, fit=FIT,
                                **kwargs)


def _scipy_residuals():
    # SciPy's Rotation.align_vectors: the rotation taking the centred nominal points onto the centred
    # measured ones in the least-squares sense; t = mean(measured) - R mean(nominal)
    p_mean, q_mean = NOMINAL_POINTS.mean(axis=0), MEASURED_POINTS.mean(axis=0)
    rotation, _ = Rotation.align_vectors(MEASURED_POINTS - q_mean, NOMINAL_POINTS - p_mean)
    fitted = rotation.apply(NOMINAL_POINTS) + (q_mean - rotation.apply(p_mean))
    return MEASURED_POINTS - fitted


def _fit_section(record):
    section = record.sections[-1]
    assert section.title == "The measured orientation's point fit"
    return section


def test_the_residual_table_numbers_rows_from_one_and_marks_the_bad_point():
    section = _fit_section(_fit_record())
    table = section.items[-1]
    assert table.columns == ("point", "x", "y", "z", "distance")
    assert table.title == "Residuals of the point fit (measured − fitted, reference axes), mm"
    # worked by hand: six points numbered 1..6 as a person counts rows; the fourth, 1 mm off, stands out
    assert [row.label for row in table.rows] == ["row 1", "row 2", "row 3", "row 4 (flagged)", "row 5", "row 6"]
    residuals = _scipy_residuals()
    for row, residual in zip(table.rows, residuals):
        assert row.unit == "mm" and len(row.values) == 4
        expected = [*residual, np.linalg.norm(residual)]
        assert [float(v) for v in row.values] == pytest.approx(expected, abs=1e-6), row.label


def test_given_row_numbers_label_the_rows():
    record = records.check_record(_fit_session(), "Bracket check", "b", "0" * 64, fit=FIT,
                                  fit_rows=[3, 4, 5, 6, 7, 8])
    assert [row.label for row in _fit_section(record).items[-1].rows][:4] == ["row 3", "row 4", "row 5",
                                                                                "row 6 (flagged)"]


def test_the_rms_residual_is_labelled_and_agrees_with_scipy():
    figures = {i.key: i for i in _fit_section(_fit_record()).items if isinstance(i, records.Figure)}
    rms = figures["check[0].fit_rms"]
    assert rms.label == "RMS residual of the point fit" and rms.unit == "mm"
    expected = np.sqrt(np.mean(np.sum(_scipy_residuals() ** 2, axis=1)))      # RMS of the SciPy residuals
    assert float(rms.values[0]) == pytest.approx(expected, rel=1e-6)
    assert figures["check[0].fit_flag_threshold"].unit == "mm"
    assert "check[0].fit_points" not in figures                 # no points file named, no such line


def test_the_points_file_is_named_first_when_given():
    section = _fit_section(_fit_record(fit_source="bracket_points.csv"))
    first = section.items[0]
    assert (first.key, first.label, first.values) == ("check[0].fit_points", "Points file", ("bracket_points.csv",))
    assert section.items[1].startswith("The measured orientation is the best fit of 6 point pairs")


def test_a_fit_of_another_orientation_is_refused():
    with pytest.raises(records.RecordError, match="is not the fit of"):
        records.check_record(bracket_session(), "Bracket check", "b", "0" * 64, fit=FIT)


def test_record_for_a_check_is_the_check_record_in_its_units():
    session = bracket_session()
    for shown in (records.ReportUnits(), ARCSEC):
        named = records.record_for(session, "check", "Bracket check", "b.json", "0" * 64, shown)
        direct = records.check_record(session, "Bracket check", "b.json", "0" * 64, shown=shown)
        assert named.canonical_json() == direct.canonical_json()
    assert named.numbers()["units"] == {"angle": "arcsec", "slope": "mm/m"}


def test_record_for_a_whole_session_keeps_its_units():
    session = bracket_session()
    whole = records.record_for(session, "all", None, "b.json", "0" * 64, ARCSEC)
    assert whole.scope == "all" and whole.units == ARCSEC
    assert whole.numbers()["units"] == {"angle": "arcsec", "slope": "mm/m"}
    total = {f.key: f for f in whole.figures()}["check[0].total_deviation"]
    assert (total.values, total.unit) == (("3600",), "arcsec")          # 1° = 3600″ (SI Brochure)
    assert "units" not in records.record_for(session, "all", None, "b.json", "0" * 64).numbers()


def test_a_session_record_names_its_units_in_its_numbers():
    whole = records.session_record(bracket_session(), "b.json", "0" * 64, ARCSEC)
    assert whole.units == ARCSEC and whole.numbers()["units"] == {"angle": "arcsec", "slope": "mm/m"}


@pytest.mark.parametrize("scope, check, says", [("check", None, "names no check"), ("pages", "x", "unknown report scope")])
def test_record_for_refuses_what_it_cannot_name(scope, check, says):
    with pytest.raises(records.RecordError, match=says):
        records.record_for(bracket_session(), scope, check, "b.json", "0" * 64)
