"""The check's smaller parts, each pinned: named axes and their refusals, the deviation axis's sign, the
settings' dictionary form, tolerance limits from both sides, and the one-line summary.

Check values: worked by hand from CONVENTIONS.md's definitions beside each case; SciPy's Rotation (a
general-purpose reference library) for the deviation axis."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import InvalidInputError, Orientation
from core.check import (CheckSettings, Criterion, axis_name, axis_vector, check, deviation_angles,
                        deviation_axes)
from core.errors import FramewrightError


@pytest.mark.parametrize("spec, name", [("x", "+X"), ("+x", "+X"), (" +X ", "+X"), ("-y", "-Y"), ("\u2212z", "-Z"),
                                        ("Z", "+Z"), ("+W", None), ("xy", None), ("", None), (3, None),
                                        (None, None)])
def test_axis_names(spec, name):
    assert axis_name(spec) == name


def test_axis_vectors_and_their_refusals():
    np.testing.assert_array_equal(axis_vector("-y"), [0.0, -1.0, 0.0])
    np.testing.assert_allclose(axis_vector((0, 3, 4)), [0, 0.6, 0.8], atol=1e-16)   # by hand: 3-4-5
    with pytest.raises(InvalidInputError, match=r"body axis: cannot read 'up'; expected one of \+X, -X"):
        axis_vector("up")
    with pytest.raises(InvalidInputError, match="boresight: zero-length direction"):
        axis_vector((0, 0, 0), "boresight")
    with pytest.raises(InvalidInputError, match=r"expected shape \(\.\.\., 3\)"):
        axis_vector((1, 2))
    with pytest.raises(InvalidInputError, match=r"expected three numbers, got shape \(2, 3\)"):
        axis_vector([[1, 0, 0], [0, 1, 0]])


def test_deviation_axis_follows_the_positive_scalar_part():
    # SciPy: the rotation vector of D, whichever sign of the quaternion is given.
    d = Rotation.from_rotvec([0.3, -0.2, 0.1]).as_quat(scalar_first=True)
    want = np.array([0.3, -0.2, 0.1]) / np.linalg.norm([0.3, -0.2, 0.1])
    np.testing.assert_allclose(deviation_axes(d), want, atol=1e-15)
    np.testing.assert_allclose(deviation_axes(-d), want, atol=1e-15)
    assert deviation_angles(-d) == pytest.approx(0.3741657386773941, abs=1e-15)   # |(0.3, −0.2, 0.1)|
    np.testing.assert_array_equal(deviation_axes(np.array([-1.0, 0, 0, 0])), [0.0, 0.0, 0.0])
    assert not np.signbit(deviation_axes(np.array([1.0, 0, 0, 0]))).any()        # no −0 on a screen


def test_settings_dictionary_form():
    s = CheckSettings(mode="pointing_and_roll", total_tolerance_deg=1, pointing_tolerance_deg="0.25",
                      roll_tolerance_deg=2, body_axis=[0, 0, 2])
    assert s.to_dict() == {"mode": "pointing_and_roll", "total_tolerance_deg": 1.0, "pointing_tolerance_deg": 0.25,
                           "roll_tolerance_deg": 2.0, "body_axis": [0.0, 0.0, 2.0]}
    assert isinstance(s.body_axis, tuple)
    np.testing.assert_array_equal(s.axis_vector(), [0.0, 0.0, 1.0])
    assert CheckSettings().axis_vector() is None and CheckSettings().to_dict()["body_axis"] is None
    assert CheckSettings.from_dict({}) == CheckSettings()
    assert CheckSettings.from_dict(s.to_dict()) == s
    with pytest.raises(FramewrightError, match="expected a JSON object, got list"):
        CheckSettings.from_dict([1])
    with pytest.raises(FramewrightError, match="unknown key.*tolerance.*expected some of body_axis"):
        CheckSettings.from_dict({"tolerance": 1})


@pytest.mark.parametrize("value, accepted", [(0, True), (-1e-9, False), (180, True), (float("nan"), False),
                                             (float("inf"), False), ("abc", False), (None, False)])
def test_tolerance_limits(value, accepted):
    if accepted:
        assert CheckSettings(roll_tolerance_deg=value).roll_tolerance_deg == float(value)
    else:
        with pytest.raises(InvalidInputError, match="roll tolerance deg"):
            CheckSettings(roll_tolerance_deg=value)


def test_criterion_margin_and_rounding_allowance_both_sides():
    # By hand: margin = tolerance − value; "equal" is taken to 1e-9°.
    c = Criterion("total deviation", 0.75, 1.0)
    assert c.margin_deg == 0.25 and c.passed
    assert Criterion("x", 1.0 + 0.9e-9, 1.0).passed
    assert not Criterion("x", 1.0 + 1.1e-9, 1.0).passed


def test_summary_and_margin_of_a_two_figure_check():
    # By hand: a 2° roll about +Z, tolerances pointing 0.1°, roll 1°: roll fails by 1°, pointing passes.
    nominal = Orientation.identity()
    measured = Orientation.from_axis_angle([0, 0, 1], 2.0)
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=0.1,
                             roll_tolerance_deg=1.0)
    result = check(nominal, measured, settings)
    assert result.margin_deg == pytest.approx(-1.0, abs=1e-12)
    assert result.summary() == ("FAIL: pointing error 0.000° within 0.100° (margin +0.100°); "
                                "roll 2.000° exceeds 1.000° (margin -1.000°)")
    assert result.total_deg == pytest.approx(2.0, abs=1e-12)
    np.testing.assert_allclose(result.axis, [0, 0, 1], atol=1e-15)
    np.testing.assert_array_equal(result.body_axis, [0.0, 0.0, 1.0])
    total = check(nominal, measured, CheckSettings(total_tolerance_deg=2.5))
    assert total.summary() == "PASS: total deviation 2.000° within 2.500° (margin +0.500°)"
    assert total.pointing_deg is None and total.roll_deg is None and total.roll_defined
    with pytest.raises(InvalidInputError, match="two Orientation values"):
        check(nominal, measured.as_quaternion())


def test_result_carries_the_deviation_and_names_an_undefined_roll():
    nominal = Orientation.from_angles("ZYX", [30, 20, 10])
    measured = Orientation.from_angles("ZYX", [31, 19, 12])
    result = check(nominal, measured, CheckSettings(body_axis="+X"))
    # SciPy: D = N⁻¹ M.
    want = (Rotation.from_quat(nominal.as_quaternion(scalar_last=True)).inv()
            * Rotation.from_quat(measured.as_quaternion(scalar_last=True)))
    assert result.deviation.isclose(Orientation.from_quaternion(want.as_quat(scalar_first=True)), 1e-15)
    assert result.notes == () and isinstance(result.pointing_deg, float) and isinstance(result.roll_deg, float)
    flipped = nominal @ Orientation.from_axis_angle([1, 0, 0], 180)
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=180.0,
                             roll_tolerance_deg=10.0)
    result = check(nominal, flipped, settings)
    assert result.notes == ("the body axis points exactly backwards: the roll about it is undefined (shown as 0)",)
    assert result.criteria[1].name == "roll (undefined, judged as 180°)"
    assert result.criteria[1].tolerance_deg == 10.0 and result.margin_deg == pytest.approx(-170.0)
    with pytest.raises(InvalidInputError, match="two Orientation values"):
        check(nominal.as_quaternion(), measured)


def test_pointing_errors_on_arrays_against_scipy():
    from core.check import pointing_errors
    from tests.core.sampling import random_quaternions
    qn, qm = random_quaternions(50, seed=31), random_quaternions(50, seed=32)
    axis = np.array([0.0, 0.6, 0.8])
    # SciPy: the angle between N a and M a.
    n, m = Rotation.from_quat(qn[:, [1, 2, 3, 0]]), Rotation.from_quat(qm[:, [1, 2, 3, 0]])
    na, ma = n.apply(axis), m.apply(axis)
    want = np.arctan2(np.linalg.norm(np.cross(na, ma), axis=1), np.sum(na * ma, axis=1))
    np.testing.assert_allclose(pointing_errors(qn, qm, axis), want, atol=1e-12)


def test_refusal_messages_word_for_word():
    with pytest.raises(FramewrightError) as caught:
        CheckSettings.from_dict({"tolerance": 1, "axis": "+Z"})
    assert str(caught.value) == ("check settings: unknown key(s) axis, tolerance; expected some of body_axis, "
                                 "mode, pointing_tolerance_deg, position_tolerance_mm, roll_tolerance_deg, "
                                 "tolerance_units, total_tolerance_deg")
    with pytest.raises(InvalidInputError) as caught:
        check(Orientation.identity(), None)
    assert str(caught.value) == "check: expected two Orientation values (nominal, measured)"
