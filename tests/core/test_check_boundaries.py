"""The check's and the batch's verdict at their edges: a signed roll against its tolerance, the zone near a
half-turn flip where the roll is undefined (both sides of ROLL_UNDEFINED_RAD), and a deviation exactly
equal to its tolerance, in the one-pair check and in the batch alike.

Check values: SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library) for the
deviations, and values worked by hand from the swing–twist definitions of CONVENTIONS.md, named as such."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import Orientation
from core.batch import run_batch
from core.check import ROLL_UNDEFINED_RAD, CheckSettings, check

NOMINAL = Orientation.from_angles("ZYX", [30, 20, 10])
QUATERNION_COLUMNS = "nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz"


def batch_of(pairs, settings):
    """Run the batch on (nominal, measured) Orientation pairs written with every digit (repr)."""
    lines = ["name," + QUATERNION_COLUMNS]
    for i, (n, m) in enumerate(pairs):
        lines.append(f"row {i}," + ",".join(repr(float(v)) for v in (*n.quaternion, *m.quaternion)))
    result, _ = run_batch("\n".join(lines) + "\n", settings)
    return result


def rolled(degrees):
    """Nominal turned about its own +Z: hand-worked, pointing of +Z 0°, roll `degrees` (signed)."""
    return NOMINAL @ Orientation.from_axis_angle([0, 0, 1], degrees)


ROLL_SETTINGS = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=1.0,
                              roll_tolerance_deg=1.0)


@pytest.mark.parametrize("roll, passes", [(-5.0, False), (5.0, False), (-0.5, True), (0.5, True),
                                          (-1.0, True), (-1.000001, False)])
def test_a_signed_roll_is_judged_by_its_size(roll, passes):
    # Hand-worked: a roll of −5° is 5° of roll; against 1° it fails with margin 1 − 5 = −4°.
    result = check(NOMINAL, rolled(roll), ROLL_SETTINGS)
    assert result.roll_deg == pytest.approx(roll, abs=1e-9)
    assert result.passed is passes
    assert result.margin_deg == pytest.approx(1.0 - abs(roll), abs=1e-9)
    batch = batch_of([(NOMINAL, rolled(roll))], ROLL_SETTINGS)
    assert bool(batch.passed[0]) is passes
    assert batch.roll_deg[0] == pytest.approx(roll, abs=1e-9)
    assert batch.margin_deg[0] == pytest.approx(1.0 - abs(roll), abs=1e-9)


def near_flip(delta, twist_deg):
    """D = S · T: S a swing of (180° − delta) about body +X, T a twist of `twist_deg` about body +Z.
    Written from half angles so that delta of 1e-9 rad survives (cos((π − δ)/2) = sin(δ/2)): hand-worked."""
    half_s = 0.5 * (np.pi - delta)
    swing = np.array([np.sin(0.5 * delta), np.sin(half_s), 0.0, 0.0])
    t = np.radians(twist_deg) / 2
    twist = np.array([np.cos(t), 0.0, 0.0, np.sin(t)])
    w1, x1, y1, z1 = swing
    w2, x2, y2, z2 = twist
    d = np.array([w1 * w2 - x1 * x2 - y1 * y2 - z1 * z2, w1 * x2 + x1 * w2 + y1 * z2 - z1 * y2,
                  w1 * y2 - x1 * z2 + y1 * w2 + z1 * x2, w1 * z2 + x1 * y2 - y1 * x2 + z1 * w2])
    return Orientation.from_quaternion(d)


LENIENT = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=180.0,
                        roll_tolerance_deg=179.0)


@pytest.mark.parametrize("factor", [0.9, 0.5])
def test_just_inside_the_flip_zone_the_roll_is_undefined_and_fails(factor):
    measured = near_flip(factor * ROLL_UNDEFINED_RAD, 30.0)
    result = check(Orientation.identity(), measured, LENIENT)
    assert result.pointing_deg == pytest.approx(180.0, abs=1e-6)
    assert not result.roll_defined and result.roll_deg == 0.0 and result.notes
    assert result.criteria[1].value_deg == 180.0 and not result.passed
    # The batch must give the same verdict for the same pair (it judged the roll as 0° before).
    batch = batch_of([(Orientation.identity(), measured)], LENIENT)
    assert not batch.passed[0]


@pytest.mark.parametrize("factor", [1.1, 4.0, 1000.0])
def test_just_outside_the_flip_zone_the_roll_is_defined_and_correct(factor):
    # Hand-worked: the twist of D = S · T about +Z is T's angle (30°) whatever the swing.
    measured = near_flip(factor * ROLL_UNDEFINED_RAD, 30.0)
    result = check(Orientation.identity(), measured, LENIENT)
    assert result.roll_defined and not result.notes
    assert result.roll_deg == pytest.approx(30.0, abs=1e-4)
    assert result.passed
    batch = batch_of([(Orientation.identity(), measured)], LENIENT)
    assert batch.passed[0] and batch.roll_deg[0] == pytest.approx(30.0, abs=1e-4)


def test_the_swing_near_the_flip_matches_scipy():
    measured = near_flip(4.0 * ROLL_UNDEFINED_RAD, 30.0)
    # SciPy: the pointing error is the angle between a and D a.
    d = Rotation.from_quat(measured.as_quaternion(scalar_last=True))
    a = np.array([0.0, 0.0, 1.0])
    da = d.apply(a)
    pointing = np.degrees(np.arctan2(np.linalg.norm(np.cross(a, da)), a @ da))
    assert check(Orientation.identity(), measured, LENIENT).pointing_deg == pytest.approx(pointing, abs=1e-7)


SHIM = Orientation.from_axis_angle([0, 1, 0], 0.5)   # hand-worked: total deviation 0.5° about body +Y


@pytest.mark.parametrize("tolerance, passes", [(0.5, True), (0.5 - 1e-6, False), (0.5 + 1e-6, True)])
def test_batch_at_a_deviation_equal_to_its_tolerance(tolerance, passes):
    # Common practice: a figure equal to its tolerance is within it (core/check.py says the same).
    settings = CheckSettings(total_tolerance_deg=tolerance)
    pairs = [(NOMINAL, NOMINAL @ SHIM)]
    assert check(NOMINAL, NOMINAL @ SHIM, settings).passed is passes
    result = batch_of(pairs, settings)
    assert bool(result.passed[0]) is passes
    assert result.margin_deg[0] == pytest.approx(tolerance - 0.5, abs=1e-12)


@pytest.mark.parametrize("tolerance, passes", [(0.5, True), (0.5 - 1e-6, False)])
def test_batch_pointing_equal_to_its_tolerance(tolerance, passes):
    # Hand-worked: the shim about +Y swings +Z by the full 0.5° with no roll.
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=tolerance,
                             roll_tolerance_deg=0.1)
    assert check(NOMINAL, NOMINAL @ SHIM, settings).passed is passes
    result = batch_of([(NOMINAL, NOMINAL @ SHIM)], settings)
    assert bool(result.passed[0]) is passes
    assert result.pointing_deg[0] == pytest.approx(0.5, abs=1e-12)
