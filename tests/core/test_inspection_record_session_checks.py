"""A check as the record prints it (core/inspection_record.py): its section title in a whole-session record
(the verdict, PASS or FAIL), the ISO 14253-1 decision line, and the adjustment angles worked about the
mount's body axes or about the reference axes, as the set-up asks. Built in-process from the small invented
bracket session. Check values: SciPy's Rotation and worked by hand."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.adjustment_setup import AdjustmentSetup
from core.check import CheckSettings
from core.orientation import Orientation
from tests.core.test_inspection_record_check_words import bracket_record, bracket_session


def _figures(items):
    return {i.key: i for i in items if isinstance(i, records.Figure)}


@pytest.mark.parametrize("pointing_tolerance, verdict", [(0.999, "FAIL"), (1.001, "PASS")])
def test_a_session_records_check_section_is_titled_with_its_verdict(pointing_tolerance, verdict):
    # worked by hand: the measured bracket is 1° off about Y, so body Z points 1° off and the roll is 0
    settings = CheckSettings(mode="pointing_and_roll", body_axis=(0, 0, 1), pointing_tolerance_deg=pointing_tolerance)
    whole = records.session_record(bracket_session(settings), "bracket.fwsession.json", "0" * 64)
    titles = [s.title for s in whole.sections]
    assert titles == ["Mount 1: Nominal bracket", "Mount 2: Measured bracket", f"Check “Bracket check”: {verdict}"]
    assert _figures(whole.sections[2].items)["check[0].verdict"].values == (verdict,)


def test_the_decision_line_is_labelled_with_its_standard():
    # worked by hand: 1° pointing error against 0.5°, U = 2 × 0.05° = 0.1°: out even with the guard band
    figure = _figures(bracket_record().sections[0].items)["check[0].decision"]
    assert figure.label == "Decision (ISO 14253-1)"
    assert figure.values == ("does not conform",)


# Invented: the nominal is a quarter turn about reference Z; the part was measured 1° about its own -Y from it,
# M = N · R_Y(-1°). The correction in body axes is then 1° about body +Y; in reference axes, about N·Y = -X.
NOMINAL = Orientation.from_axis_angle([0, 0, 1], 90.0)
MEASURED = NOMINAL @ Orientation.from_axis_angle([0, 1, 0], -1.0)


def _scipy(o):
    return Rotation.from_quat(o.as_quaternion(), scalar_first=True)


@pytest.mark.parametrize("frame", ["body", "reference"])
def test_the_adjustment_angles_are_worked_about_the_axes_the_setup_names(frame):
    session = bracket_session(nominal=NOMINAL, measured=MEASURED,
                              setup=AdjustmentSetup(axes="+Y; +X", axes_frame=frame))
    items = bracket_record(session).sections[0].items
    table = next(i for i in items if isinstance(i, records.Table) and i.title.startswith("Adjustment angles"))
    assert table.title.startswith(f"Adjustment angles about the mount's {frame} axes")
    # SciPy's Rotation: C = M⁻¹ N in body axes, N M⁻¹ in reference axes; each is a single 1° turn, so its
    # rotation vector (degrees) splits over +Y and +X directly
    n, m = _scipy(NOMINAL), _scipy(MEASURED)
    c = (m.inv() * n) if frame == "body" else (n * m.inv())
    rotvec = np.degrees(c.as_rotvec())
    assert [float(r.values[0]) for r in table.rows] == pytest.approx([rotvec[1], rotvec[0]], abs=1e-6)
    # worked by hand: (1, 0) about body +Y, +X; (0, -1) about reference +Y, +X
    assert [r.values for r in table.rows] == ([("1",), ("0",)] if frame == "body" else [("0",), ("-1",)])
    assert "These reach the correction exactly." in items
