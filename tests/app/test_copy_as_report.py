"""The copied report, without a window: it names the mount, carries the date and time to the second with
the local offset, names the reference directions after the session's frame (and says where gravity points
in it), prints its angles in the session's sequence against SciPy, and, for the measured mount of the
session's check, the check's verdict and ISO 14253-1 decision.

Check values: SciPy's Rotation (angles); the frame presets' directions (ENU z up, NED z down, camera
optical y down: common practice, CONVENTIONS.md); the invented demo check (resources/demo_check: 3° off in
pointing, 0.4° in roll, tolerance 1°, u = 0.05°), with U = k·u worked by hand."""

import re
from dataclasses import replace
from datetime import datetime, timedelta
from pathlib import Path

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from app import copy_as
from app.model import SessionModel
from core import operations
from core.decision import check_lines, setup_figure_uncertainties
from core.errors import FramewrightError
from core.orientation import Orientation
from core.session import Mount, SavedCheck, Session, load_session

DEMO_CHECK = Path(__file__).resolve().parents[2] / "resources" / "demo_check.fwsession.json"
NUMBER = re.compile(r"[-+−]?\d+\.\d+")
ROTATION = Rotation.from_euler("ZYX", [25.0, -40.0, 110.0], degrees=True)


def report(model):
    result = copy_as.copy_to_clipboard(model, "report")
    assert result.verified, result.status_message
    return result.text.splitlines()


def line_starting(lines, start):
    return next(line for line in lines if line.startswith(start))


@pytest.fixture
def model():
    return SessionModel(Session((Mount("Mast unit"),
                                 Mount("Boom camera", Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True)))),
                                selected=1))


def test_the_report_names_the_mount_and_the_time_to_the_second_with_its_offset(model):
    before = datetime.now().astimezone().replace(microsecond=0)
    lines = report(model)
    after = datetime.now().astimezone()
    assert lines[0] == "Framewright orientation report" and lines[1] == "Mount: Boom camera"
    stamp = line_starting(lines, "Date and time: ").removeprefix("Date and time: ")
    assert re.fullmatch(r"\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d[+-]\d\d:\d\d", stamp), stamp
    when = datetime.fromisoformat(stamp)
    assert when.utcoffset() == after.utcoffset() and before <= when <= after + timedelta(seconds=1)


@pytest.mark.parametrize("sequence, intrinsic, units", [("ZYX", True, "deg"), ("XYZ", False, "rad"),
                                                        ("ZXZ", True, "mrad")])
def test_the_reports_angles_follow_the_sequence_and_stay_in_degrees(model, sequence, intrinsic, units):
    model.set_preferences(sequence=sequence, intrinsic=intrinsic, angle_units=units)
    kind = "intrinsic" if intrinsic else "extrinsic"
    angles = line_starting(report(model), "Angles ")
    assert angles.split(" ")[2].rstrip(",") == kind and angles.split(" ")[1].replace("'", "").replace("-", "") == sequence
    name = sequence if intrinsic else sequence.lower()
    got = [float(x) for x in NUMBER.findall(angles.split("deg:")[1])]
    np.testing.assert_allclose(got, ROTATION.as_euler(name, degrees=True), atol=1e-9)   # ten decimals


@pytest.mark.parametrize("frame, words, gravity, z_elevation", [
    ("enu", "ENU (x east, y north, z up)", "reference −Z (Z up)", "+90.000"),
    ("ned", "NED (x north, y east, z down)", "reference +Z (Z down)", "−90.000"),
    ("camera", None, "reference +Y", "0.000"),
])
def test_the_report_words_follow_the_sessions_reference_frame(model, frame, words, gravity, z_elevation):
    model.select(0)                                              # the identity: body axes = reference axes
    model.set_reference_frame(frame)
    lines = report(model)
    named = line_starting(lines, "Where the body axes point (reference directions named as ")
    if words is not None:
        assert named == f"Where the body axes point (reference directions named as {words}):"
    assert line_starting(lines, "Level readings, gravity along ") == \
        f"Level readings, gravity along {gravity}; degrees to three decimals:"
    elevations = line_starting(lines, "    elevation above the horizontal: ")
    assert elevations.endswith(f"+Z {z_elevation.lstrip('+')}")


def demo_check_model():
    model = SessionModel(load_session(DEMO_CHECK))
    names = [m.name for m in model.mounts]
    return model, names.index("Radar antenna on the bracket"), names.index("Radar antenna, as measured")


def notes(lines):
    return [line.removeprefix("Note: ") for line in lines if line.startswith("Note: ")]


def test_the_measured_mount_of_the_check_carries_its_verdict_and_decision():
    model, nominal, measured = demo_check_model()
    model.select(measured)
    assert notes(report(model)) == [
        "measured side of the check against “Radar antenna on the bracket”",
        "Check verdict: FAIL",
        "  pointing error 3.0000 deg against 1.0000 deg: does not conform (U = 0.1°, k = 2)",
        "  roll 0.4000 deg against 1.0000 deg: conforms (U = 0.1°, k = 2)",
        "ISO 14253-1 decision: does not conform",
    ]


def test_the_checks_coverage_factor_reaches_the_report():
    model, nominal, measured = demo_check_model()
    check = model.check
    model.apply(operations.set_check, replace(check, adjustment=replace(check.adjustment, coverage=3.0)))
    model.select(measured)
    lines = notes(report(model))
    # U = k u = 3 × 0.05° = 0.15°: pointing 3° > 1° + 0.15°, roll 0.4° < 1° − 0.15°
    assert lines[2] == "  pointing error 3.0000 deg against 1.0000 deg: does not conform (U = 0.15°, k = 3)"
    assert lines[3] == "  roll 0.4000 deg against 1.0000 deg: conforms (U = 0.15°, k = 3)"


def test_a_check_without_an_uncertainty_says_there_is_no_decision():
    model, nominal, measured = demo_check_model()
    check = model.check
    model.apply(operations.set_check, replace(check, adjustment=replace(check.adjustment, uncertainty_deg=None)))
    model.select(measured)
    assert notes(report(model))[-1] == "ISO 14253-1 decision: none (no measurement uncertainty was given)"


def test_a_checks_covariance_gives_each_figure_its_own_uncertainty():
    model, nominal, measured = demo_check_model()
    check = model.check
    covariance = ((0.01, 0.0, 0.0), (0.0, 0.0004, 0.0), (0.0, 0.0, 0.0001))     # degrees², one axis loose
    setup = replace(check.adjustment, covariance_deg2=covariance)
    model.apply(operations.set_check, replace(check, adjustment=setup))
    model.select(measured)
    pair = model.mounts[nominal].orientation, model.mounts[measured].orientation
    from core.check import check as run_check
    figures = setup_figure_uncertainties(*pair, check.settings, setup)
    assert figures is not None
    want = check_lines(run_check(*pair, check.settings), setup.uncertainty_deg, setup.coverage, figures)
    assert want != check_lines(run_check(*pair, check.settings), setup.uncertainty_deg, setup.coverage)
    assert notes(report(model))[1:] == want


@pytest.mark.parametrize("which", ["nominal", "other", "no nominal", "no measured"])
def test_no_check_lines_on_other_mounts_or_a_check_not_chosen(which):
    model, nominal, measured = demo_check_model()
    if which == "nominal":
        model.select(nominal)
    elif which == "other":
        model.select(0)
    else:
        model.select(measured)
        chosen = replace(model.check, nominal=None) if which == "no nominal" else replace(model.check, measured=None)
        model.apply(operations.set_check, chosen)
    assert notes(report(model)) == []


def test_a_check_that_cannot_be_judged_says_why(monkeypatch):
    model, nominal, measured = demo_check_model()
    model.select(measured)

    def cannot(*args):
        raise FramewrightError("simulated: the body axis is not a direction")

    monkeypatch.setattr("core.check.check", cannot)
    assert notes(report(model)) == ["the check could not be judged: simulated: the body axis is not a direction"]


def test_the_empty_check_of_a_new_session_adds_nothing(model):
    assert model.check == SavedCheck()
    assert notes(report(model)) == []
