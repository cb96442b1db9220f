"""The correction after a check, adjustment angles about arbitrary axes, and shims. Reference values come
from SciPy's Rotation (named beside each check) and from cases worked by hand here."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.correction import adjustment_angles, compose_about_axes, correction
from core.errors import InvalidInputError
from core.orientation import Orientation
from core.shims import shims, swing_and_twist

RNG = np.random.default_rng(20261201)


def _orientation(rotation: Rotation) -> Orientation:
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


def _random_pairs(count):
    nominal = Rotation.random(count, random_state=11)
    measured = nominal * Rotation.from_rotvec(RNG.normal(scale=0.05, size=(count, 3)))
    return nominal, measured


def test_the_correction_turns_measured_into_nominal_in_both_frames():
    nominal, measured = _random_pairs(200)
    for n, m in zip(nominal, measured):
        result = correction(_orientation(n), _orientation(m))
        # SciPy: C = Mᵀ N in body axes, C_ref = N Mᵀ in reference axes (CONVENTIONS.md)
        assert result.body.isclose(_orientation(m.inv() * n), 1e-12)
        assert result.reference.isclose(_orientation(n * m.inv()), 1e-12)
        assert (_orientation(m) @ result.body).isclose(_orientation(n), 1e-12)
        assert (result.reference @ _orientation(m)).isclose(_orientation(n), 1e-12)
        assert np.allclose(result.small_angles_body_deg, (m.inv() * n).as_rotvec(degrees=True), atol=1e-9)


def test_no_correction_has_no_axis():
    o = Orientation.from_axis_angle((1, 2, 3), 40)
    result = correction(o, o)
    assert result.angle_deg < 1e-12 and result.axis_body is None and result.axis_reference is None


def _orthogonal_axes():
    a1 = RNG.normal(size=3)
    a2 = np.cross(a1, RNG.normal(size=3))
    a3 = np.cross(a2, RNG.normal(size=3))
    return np.array([a / np.linalg.norm(a) for a in (a1, a2, a3)])


@pytest.mark.parametrize("case", range(150))
def test_angles_about_orthogonal_consecutive_axes_reproduce_scipys_davenport_rotation(case):
    axes = _orthogonal_axes()
    target = Rotation.random(random_state=case)
    result = adjustment_angles(_orientation(target), axes)
    # SciPy's from_davenport (intrinsic) composes our angles about the same axes: it must give the target
    rebuilt = Rotation.from_davenport(axes, "intrinsic", result.angles_deg, degrees=True)
    assert np.degrees((rebuilt * target.inv()).magnitude()) < 1e-12      # the 1e-12°
    assert result.exact and result.residual_deg < 1e-12


@pytest.mark.parametrize("case", range(100))
def test_angles_about_skew_axes_that_can_reach_the_target_are_exact(case):
    axes = RNG.normal(size=(3, 3))
    axes /= np.linalg.norm(axes, axis=1)[:, None]
    angles = RNG.uniform(-170, 170, 3)
    # SciPy: the target composed from single-axis rotations, R(a1, θ1) R(a2, θ2) R(a3, θ3)
    target = (Rotation.from_rotvec(np.radians(angles[0]) * axes[0]) * Rotation.from_rotvec(np.radians(angles[1]) * axes[1])
              * Rotation.from_rotvec(np.radians(angles[2]) * axes[2]))
    result = adjustment_angles(_orientation(target), axes)
    rebuilt = (Rotation.from_rotvec(np.radians(result.angles_deg[0]) * axes[0])
               * Rotation.from_rotvec(np.radians(result.angles_deg[1]) * axes[1])
               * Rotation.from_rotvec(np.radians(result.angles_deg[2]) * axes[2]))
    assert np.degrees((rebuilt * target.inv()).magnitude()) < 1e-12
    assert result.exact


def _nearly_parallel_ends(flip):
    """First and last axes a few degrees from parallel (flip: antiparallel), the middle one square to both:
    SciPy's Davenport axes, where the middle angle sits near the edge of the axes' reach."""
    a1 = RNG.normal(size=3)
    a1 /= np.linalg.norm(a1)
    a2 = np.cross(a1, RNG.normal(size=3))
    a2 /= np.linalg.norm(a2)
    a3 = Rotation.from_rotvec(np.radians(RNG.uniform(0.5, 10)) * a2).apply(a1) * (-1 if flip else 1)
    return np.array([a1, a2, a3])


@pytest.mark.parametrize("case", range(120))
def test_davenport_angles_near_the_edge_of_reach_agree_with_scipys_as_davenport_to_1e_12_degrees(case):
    axes = _nearly_parallel_ends(flip=case % 2 == 1)
    target = Rotation.from_davenport(axes, "intrinsic", RNG.uniform(-10, 10, 3), degrees=True)
    result = adjustment_angles(_orientation(target), axes)
    # SciPy's from_davenport rebuilds the target from our angles to 1e-12° (the closed form alone left up
    # to 5e-11° here before its Newton polish)
    rebuilt = Rotation.from_davenport(axes, "intrinsic", result.angles_deg, degrees=True)
    assert np.degrees((rebuilt * target.inv()).magnitude()) < 1e-12 and result.exact
    # SciPy's as_davenport: the same angles when it picks the same of the two exact answers (its range
    # of the middle angle depends on the axes); otherwise ours is the one with the smaller largest turn
    theirs = target.as_davenport(axes, "intrinsic", degrees=True)
    if np.abs(theirs).max() < 90:
        assert np.allclose(result.angles_deg, theirs, atol=1e-9)
    else:
        assert max(abs(a) for a in result.angles_deg) < np.abs(theirs).max()


@pytest.mark.parametrize("count_axes", [2, 3])
def test_the_adjustment_applied_to_the_measured_gives_the_nominal_or_leaves_exactly_the_residual(count_axes):
    """By construction, over 300 random mounts and random skew axes: M · R(a1, θ1) R(a2, θ2) [R(a3, θ3)] is N
    to 1e-12° when the angles are exact, and otherwise its angle from N is the reported residual."""
    nominal, measured = _random_pairs(300)
    exact = 0
    for n, m in zip(nominal, measured):
        axes = RNG.normal(size=(count_axes, 3))
        fix = correction(_orientation(n), _orientation(m))
        result = adjustment_angles(fix.body, axes)
        # SciPy composes the turns about the unit axes, then applies them to M
        turns = Rotation.identity()
        for axis, angle in zip(axes, result.angles_deg):
            turns = turns * Rotation.from_rotvec(np.radians(angle) * axis / np.linalg.norm(axis))
        left = np.degrees(((m * turns) * n.inv()).magnitude())
        assert left == pytest.approx(result.residual_deg, abs=1e-12)
        if result.exact:
            exact += 1
            assert left < 1e-12
    assert (exact > 200) if count_axes == 3 else (exact == 0)


def test_coordinate_axes_give_the_ordinary_sequence_angles_scipy_gives():
    # SciPy as_euler('XYZ') (intrinsic); our choice between the two exact answers is the smaller largest
    # turn, which for small angles is SciPy's own range
    target = Rotation.from_euler("XYZ", [3.0, -2.0, 1.5], degrees=True)
    result = adjustment_angles(_orientation(target), np.eye(3))
    assert np.allclose(result.angles_deg, target.as_euler("XYZ", degrees=True), atol=1e-10)


@pytest.mark.parametrize("sequence", ["XYZ", "ZYX", "YZX", "ZXZ", "XYX", "YZY"])
def test_coordinate_axes_in_any_order_give_scipys_angles_for_that_sequence(sequence):
    """Tait–Bryan and proper Euler sequences as Davenport axes: SciPy's as_euler (intrinsic, upper case)
    gives the same angles over 50 random targets away from gimbal lock, each angle within ±60° (its
    middle 20° to 70° for the proper ones), where SciPy's range holds the answer with the smaller turns."""
    axes = np.eye(3)[["XYZ".index(c) for c in sequence]]
    proper = sequence[0] == sequence[2]
    for _ in range(50):
        angles = RNG.uniform(-60, 60, 3)
        if proper:
            angles[1] = RNG.uniform(20, 70)
        target = Rotation.from_euler(sequence, angles, degrees=True)
        result = adjustment_angles(_orientation(target), axes)
        assert np.allclose(result.angles_deg, target.as_euler(sequence, degrees=True), atol=1e-10)
        assert result.exact


def test_two_axes_that_cannot_reach_a_turn_about_the_third_leave_it_all_as_residual():
    # Worked here: for q1 q2 · (cos 5°, 0, 0, sin 5°) the best is the largest singular value of
    # diag(cos 5°, sin 5°), cos 5°, with no turn at all: the 10° about Z remains.
    result = adjustment_angles(Orientation.from_axis_angle((0, 0, 1), 10), [(1, 0, 0), (0, 1, 0)])
    assert np.allclose(result.angles_deg, [0, 0], atol=1e-12)
    assert result.residual_deg == pytest.approx(10, abs=1e-9) and not result.exact


# Worked here: turning about Z, then about an axis 30° from Z, then about Z again can tilt Z by at most
# 60°; a quarter turn about X tilts it by 90°, so these three axes cannot reach it.
@pytest.mark.parametrize("axes, target", [
    ([(1, 0, 0), (0, 1, 0)], Orientation.from_axis_angle((0.3, 0.5, 0.8), 25)),
    ([(0, 0, 1), (0.5, 0, math.sqrt(0.75)), (0, 0, 1)], Orientation.from_axis_angle((1, 0, 0), 90))])
def test_least_squares_angles_are_not_beaten_by_any_nearby_angles(axes, target):
    result = adjustment_angles(target, axes)
    assert result.residual_deg > 1e-3
    if len(axes) == 3:
        assert result.residual_deg == pytest.approx(30, abs=1e-6)     # the 30° of tilt out of reach
    # the residual is the angle between what the angles make and the target
    assert compose_about_axes(axes, result.angles_deg).angle_to(target) == pytest.approx(result.residual_deg,
                                                                                         abs=1e-12)
    for _ in range(300):
        nudged = np.array(result.angles_deg) + RNG.normal(scale=0.5, size=len(axes))
        assert compose_about_axes(axes, nudged).angle_to(target) >= result.residual_deg - 1e-7


@pytest.mark.parametrize("axes, words", [
    ([(0, 0, 0), (0, 1, 0)], "axis 1 has zero length"),
    ([(1, 0, 0), (2, 0, 0)], "axes 1 and 2 are parallel"),
    ([(1, 0, 0), (0, 1, 0), (0, -3, 0)], "axes 2 and 3 are parallel"),
    ([(1, 0, 0)], "two or three axes"),
    ([(1, 0, 0), (0, float("nan"), 0)], "finite"),
    ([(1, 0), (0, 1)], "three numbers"),
])
def test_degenerate_adjustment_axes_are_refused_by_name(axes, words):
    with pytest.raises(InvalidInputError, match=words):
        adjustment_angles(Orientation.from_axis_angle((0, 0, 1), 1), axes)


# ---------------------------------------------------------------------------------------------------
# Shims
# ---------------------------------------------------------------------------------------------------
PLATE = [(100, 50, -20), (-100, 50, -20), (-100, -50, -20), (100, -50, -20)]   # 200 × 100 mm, on its −Z face


def test_a_plate_on_four_feet_tilted_about_its_long_edge_gets_the_hand_worked_shims():
    # Worked here: a turn of 0.5° about body +X lifts the +Y edge off the plate by 100 mm · sin 0.5°
    # (the feet are 100 mm apart across X), so both +Y feet need that shim and the −Y feet none.
    result = shims(Orientation.from_axis_angle((1, 0, 0), 0.5), PLATE, (0, 0, -1), pivot=2, pitch_mm=0.5)
    lift = 100 * math.sin(math.radians(0.5))
    assert np.allclose(result.shims_mm, [lift, lift, 0, 0], atol=1e-12)
    assert np.allclose(result.turns, np.array([lift, lift, 0, 0]) / 0.5, atol=1e-12)
    assert result.tilt_deg == pytest.approx(0.5, abs=1e-12) and result.twist_deg == pytest.approx(0, abs=1e-12)
    assert result.pivot_lifted_mm == 0


def test_shims_are_never_negative_and_the_thinnest_set_leaves_one_foot_bare():
    for _ in range(100):
        tilt = Orientation.from_rotation_vector(RNG.normal(scale=1.0, size=3))
        result = shims(tilt, PLATE, (0, 0, -1), pivot=int(RNG.integers(4)))
        assert np.all(result.shims_mm >= 0) and result.shims_mm.min() == 0


def test_the_turn_about_the_face_normal_is_reported_apart_and_does_not_change_the_shims():
    tilt = Orientation.from_axis_angle((1, 0, 0), 0.5)
    twisted = tilt @ Orientation.from_axis_angle((0, 0, 1), 2.0)
    plain, with_twist = shims(tilt, PLATE, (0, 0, -1)), shims(twisted, PLATE, (0, 0, -1))
    # the twist about +Z is −2° about the outward normal −Z (right hand about n)
    assert with_twist.twist_deg == pytest.approx(-2.0, abs=1e-9)
    assert (with_twist.twist @ with_twist.swing).isclose(twisted, 1e-12)
    # swing's axis lies in the face: its rotation vector has no component along the normal
    assert abs(with_twist.swing.as_rotation_vector()[2]) < 1e-12
    assert np.allclose(with_twist.shims_mm, shims(with_twist.swing, PLATE, (0, 0, -1)).shims_mm, atol=1e-12)
    assert plain.twist_deg == pytest.approx(0, abs=1e-12)


def test_shimming_the_measured_part_gives_the_nominal_rebuilt_from_the_feet_alone():
    """Rebuild the tilt from the shim heights only (fit a plane through the feet's new heights, turn the face
    normal onto it) and check that measured · twist · tilt is the nominal (verification by construction)."""
    nominal, measured = _random_pairs(50)
    n = np.array([0.0, 0.0, -1.0])
    feet = np.array(PLATE, dtype=float)
    for nom, mea in zip(nominal, measured):
        result = correction(_orientation(nom), _orientation(mea))
        shim = shims(result.body, feet, n)
        q = feet - feet[0]
        # heights: −n · (S q) = s − lift; solve q · g = −(s − h) for g = Sᵀ n in the face plane and h
        design = np.column_stack([q[:, 0], q[:, 1], np.ones(len(q))])
        (gx, gy, h), *_ = np.linalg.lstsq(design, -shim.shims_mm, rcond=None)
        g = np.array([gx, gy, -math.sqrt(max(0.0, 1 - gx * gx - gy * gy))])   # same side as n
        # the swing takes g onto n: the smallest rotation between them (axis in the face plane)
        axis = np.cross(g, n)
        angle = math.atan2(np.linalg.norm(axis), g @ n)
        rebuilt = Orientation.from_axis_angle(axis, angle, degrees=False) if angle > 0 else Orientation.identity()
        achieved = _orientation(mea) @ shim.twist @ rebuilt
        assert achieved.angle_to(_orientation(nom)) < 1e-12       # degrees


@pytest.mark.parametrize("feet, words", [
    ([(0, 0, 0), (1, 0, 0), (2, 0, 0)], "on one line"),
    ([(0, 0, 0), (100, 0, 0), (0, 100, 0), (100, 100, 5)], "foot 4 is 5 mm out of the face"),
    ([(0, 0, 0), (1, 0, 0)], "3 to 64 feet"),
    ([(0, 0, 0), (1, 0, float("inf")), (0, 1, 0)], "foot 2, z"),
    ([(0, 0, 0)] * 3, "same point"),
])
def test_a_footprint_that_cannot_be_shimmed_is_refused_by_name(feet, words):
    with pytest.raises(InvalidInputError, match=words):
        shims(Orientation.from_axis_angle((1, 0, 0), 1), feet, (0, 0, -1))


@pytest.mark.parametrize("kwargs, words", [({"pivot": 4}, "pivot"), ({"pivot": True}, "pivot"),
                                           ({"pitch_mm": 0}, "pitch"), ({"pitch_mm": float("nan")}, "pitch")])
def test_pivot_and_pitch_are_checked(kwargs, words):
    with pytest.raises(InvalidInputError, match=words):
        shims(Orientation.identity(), PLATE, (0, 0, -1), **kwargs)


def test_swing_and_twist_split_any_rotation_about_any_axis():
    for _ in range(200):
        rotation = _orientation(Rotation.random(random_state=int(RNG.integers(1 << 30))))
        axis = RNG.normal(size=3)
        swing, twist = swing_and_twist(rotation, axis)
        assert (twist @ swing).isclose(rotation, 1e-12)
        unit = axis / np.linalg.norm(axis)
        assert abs(swing.as_rotation_vector() @ unit) < 1e-9
        assert np.linalg.norm(np.cross(twist.as_rotation_vector(), unit)) < 1e-9
