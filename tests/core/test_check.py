"""Nominal against measured: deviation, pointing error and roll, tolerances and margins.

Check values: SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library), and the
hand-worked 0.5° shim written out below."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import InvalidInputError, Orientation
from core.check import CheckSettings, check, swing_twist_angles
from tests.core.sampling import random_quaternions

NOMINAL = Orientation.from_angles("ZYX", [30, 20, 10])

# Hand-worked: a 0.5° shim under one edge tilts the part 0.5° about its own Y axis:
#   M = N · Ry(0.5°), so D = Nᵀ M = Ry(0.5°): total 0.5°, axis (0, 1, 0) in the nominal body frame.
#   Body +Z and +X lie perpendicular to the tilt axis: each swings by the full 0.5° with no roll.
#   Body +Y is the tilt axis: it keeps pointing (0°) and the whole 0.5° is roll about it.
SHIM = Orientation.from_axis_angle([0, 1, 0], 0.5)
SHIMMED = NOMINAL @ SHIM


def test_shim_total_deviation_and_axis():
    result = check(NOMINAL, SHIMMED, CheckSettings(total_tolerance_deg=1.0))
    assert result.total_deg == pytest.approx(0.5, abs=1e-12)
    np.testing.assert_allclose(result.axis, [0, 1, 0], atol=1e-12)
    assert result.passed and result.margin_deg == pytest.approx(0.5, abs=1e-12)
    assert result.summary().startswith("PASS")


def test_shim_fails_a_tighter_tolerance_with_a_negative_margin():
    result = check(NOMINAL, SHIMMED, CheckSettings(total_tolerance_deg=0.25))
    assert not result.passed
    assert result.margin_deg == pytest.approx(-0.25, abs=1e-12)
    assert result.summary().startswith("FAIL")


@pytest.mark.parametrize("axis, pointing, roll", [("+Z", 0.5, 0.0), ("+X", 0.5, 0.0), ("+Y", 0.0, 0.5),
                                                  ("-Y", 0.0, -0.5)])
def test_shim_pointing_and_roll_of_each_axis(axis, pointing, roll):
    result = check(NOMINAL, SHIMMED, CheckSettings(body_axis=axis))
    assert result.pointing_deg == pytest.approx(pointing, abs=1e-12)
    assert result.roll_deg == pytest.approx(roll, abs=1e-12)


def test_pointing_and_roll_mode_judges_each_figure():
    # Hand-worked: a pure 2° turn about the boresight +Z points it nowhere new but rolls it 2°.
    rolled = NOMINAL @ Orientation.from_axis_angle([0, 0, 1], 2.0)
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=0.1,
                             roll_tolerance_deg=1.0)
    result = check(NOMINAL, rolled, settings)
    assert [c.name for c in result.criteria] == ["pointing error", "roll"]
    assert result.criteria[0].passed and not result.criteria[1].passed
    assert result.margin_deg == pytest.approx(-1.0, abs=1e-12)
    assert check(NOMINAL, rolled, CheckSettings(total_tolerance_deg=3.0)).passed


def scipy_figures(qn, qm, axis):
    """Total, axis, pointing and roll from SciPy, by the definitions of CONVENTIONS.md."""
    n = Rotation.from_quat(qn, scalar_first=True)
    m = Rotation.from_quat(qm, scalar_first=True)
    d = n.inv() * m
    total = np.degrees(d.magnitude())
    # Pointing: the angle between N a and M a.
    na, ma = n.apply(axis), m.apply(axis)
    pointing = np.degrees(np.arctan2(np.linalg.norm(np.cross(na, ma)), na @ ma))
    # Roll: the swing S is the shortest turn taking a onto D a (align_vectors with a single vector returns
    # exactly that); the twist T = S⁻¹ D must then be a turn about a, and its signed angle is the roll.
    da = d.apply(axis)
    swing = Rotation.align_vectors(da[None, :], axis[None, :])[0]
    twist = swing.inv() * d
    rv = twist.as_rotvec()
    assert np.linalg.norm(np.cross(rv, axis)) < 1e-9, "twist not about the axis"
    return total, d.as_rotvec(), pointing, np.degrees(rv @ axis), np.degrees(swing.magnitude())


def test_random_pairs_against_scipy():
    qn = random_quaternions(300, seed=21)
    qm = random_quaternions(300, seed=22)
    rng = np.random.default_rng(3)
    for i in range(300):
        axis = rng.normal(size=3)
        axis /= np.linalg.norm(axis)
        result = check(Orientation(qn[i]), Orientation(qm[i]), CheckSettings(body_axis=tuple(axis)))
        total, rotvec, pointing, roll, swing = scipy_figures(qn[i], qm[i], axis)
        assert result.total_deg == pytest.approx(total, abs=1e-10)
        np.testing.assert_allclose(result.axis, rotvec / np.linalg.norm(rotvec), atol=1e-9)
        assert result.pointing_deg == pytest.approx(pointing, abs=1e-9)
        assert result.pointing_deg == pytest.approx(swing, abs=1e-9)
        assert result.roll_deg == pytest.approx(roll, abs=1e-9)


def test_roll_is_the_same_whichever_order_the_split_is_taken():
    # D = T' · S' (twist first in the reference sense): build it from SciPy pieces and recover the twist.
    rng = np.random.default_rng(8)
    a = np.array([0.0, 0.0, 1.0])
    for _ in range(50):
        twist_deg = rng.uniform(-170, 170)
        swing_axis = np.array([*rng.normal(size=2), 0.0])
        swing = Rotation.from_rotvec(np.radians(rng.uniform(0, 120)) * swing_axis / np.linalg.norm(swing_axis))
        twist = Rotation.from_rotvec(np.radians(twist_deg) * a)
        for d in (swing * twist, twist * swing):
            _, roll, defined = swing_twist_angles(d.as_quat(scalar_first=True), a)
            assert defined and np.degrees(roll) == pytest.approx(twist_deg, abs=1e-9)


def test_no_deviation_has_no_axis_and_a_reversed_axis_has_no_roll():
    same = check(NOMINAL, NOMINAL, CheckSettings(body_axis="+Z"))
    assert same.total_deg < 1e-12 and same.pointing_deg < 1e-12 and abs(same.roll_deg) < 1e-12
    exact = check(Orientation.identity(), Orientation.identity())
    assert exact.total_deg == 0.0
    np.testing.assert_array_equal(exact.axis, [0.0, 0.0, 0.0])
    flipped = check(NOMINAL, NOMINAL @ Orientation.from_axis_angle([1, 0, 0], 180), CheckSettings(body_axis="+Z"))
    assert flipped.pointing_deg == pytest.approx(180.0, abs=1e-12)
    assert not flipped.roll_defined and flipped.notes
    # Judged on pointing and roll, an undefined roll fails on its own, whatever the tolerances.
    lenient = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=180.0,
                            roll_tolerance_deg=179.0)
    result = check(NOMINAL, NOMINAL @ Orientation.from_axis_angle([1, 0, 0], 180), lenient)
    assert not result.criteria[1].passed and not result.passed


def test_settings_round_trip_and_refusals():
    settings = CheckSettings(mode="pointing_and_roll", total_tolerance_deg=0.2, pointing_tolerance_deg=0.05,
                             roll_tolerance_deg=0.3, body_axis=(0.0, 1.0, 1.0))
    assert CheckSettings.from_dict(settings.to_dict()) == settings
    assert CheckSettings(body_axis="z").body_axis == "+Z"
    assert CheckSettings.from_dict({"body_axis": "-x"}).to_dict()["body_axis"] == "-X"
    with pytest.raises(InvalidInputError, match="expected one of total, pointing_and_roll"):
        CheckSettings(mode="angle")
    with pytest.raises(InvalidInputError, match="from 0 to 180 degrees"):
        CheckSettings(total_tolerance_deg=-1)
    # no deviation exceeds a half turn, so a tolerance beyond 180° cannot fail: refused on both sides
    assert CheckSettings(total_tolerance_deg=180).total_tolerance_deg == 180
    for beyond in (180.000001, 1e308, float("inf"), float("nan")):
        with pytest.raises(InvalidInputError, match="from 0 to 180 degrees"):
            CheckSettings(pointing_tolerance_deg=beyond)
    with pytest.raises(InvalidInputError, match="needs a body axis"):
        CheckSettings(mode="pointing_and_roll")
    with pytest.raises(InvalidInputError, match="zero-length"):
        CheckSettings(body_axis=(0, 0, 0))
    with pytest.raises(ValueError, match="unknown key"):
        CheckSettings.from_dict({"tolerance": 1})


def test_a_figure_equal_to_its_tolerance_passes_despite_rounding():
    # Common practice: "within tolerance" includes the limit. A computed 0.5° carries rounding of about
    # 1e-15°, which must not turn an exact shim into a failure; a micro-degree over must still fail.
    from core.check import Criterion
    assert Criterion("total deviation", 0.5 + 1e-13, 0.5).passed
    assert not Criterion("total deviation", 0.5 + 1e-6, 0.5).passed
