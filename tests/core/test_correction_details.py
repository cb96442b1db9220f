"""core/correction.py's details that test_correction.py leaves open: the reference frame's rotation vector
and axes, the no-correction limit from both sides, the axes as text (every refusal word for word, the
length limit, parallel axes at their limit), `exact` at its limit, gimbal lock, the ±180° wrap, a least-
squares answer no grid of angles beats, and hostile axes. Check values: SciPy's Rotation (from_rotvec,
as_euler, from_davenport), named beside each check, and hand-worked geometry named as such."""

import math
import warnings

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.correction import (MIN_AXIS_SEPARATION_RAD, NO_CORRECTION_DEG, AdjustmentAngles, adjustment_angles,
                             compose_about_axes, correction, read_axes)
from core.errors import InvalidInputError
from core.orientation import Orientation


def _orientation(rotation: Rotation) -> Orientation:
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


def _refused(words, call, *args):
    with pytest.raises(InvalidInputError) as caught:
        call(*args)
    assert str(caught.value) == words


# ---------------------------------------------------------------------------------------------------
# The correction
# ---------------------------------------------------------------------------------------------------
def test_the_reference_frame_figures_match_scipy():
    nominal = Rotation.from_euler("ZYX", [40, -15, 8], degrees=True)
    measured = nominal * Rotation.from_rotvec(np.radians([0.3, -0.2, 0.5]))
    result = correction(_orientation(nominal), _orientation(measured))
    # SciPy: C_ref = N Mᵀ, its rotation vector in degrees, its angle and unit axes in both frames
    reference = nominal * measured.inv()
    body = measured.inv() * nominal
    assert np.allclose(result.small_angles_reference_deg, reference.as_rotvec(degrees=True), atol=1e-12)
    assert np.allclose(result.small_angles_body_deg, body.as_rotvec(degrees=True), atol=1e-12)
    assert result.angle_deg == pytest.approx(np.degrees(body.magnitude()), abs=1e-12)
    assert np.allclose(result.axis_body, body.as_rotvec() / body.magnitude(), atol=1e-12)
    assert np.allclose(result.axis_reference, reference.as_rotvec() / reference.magnitude(), atol=1e-12)
    # hand-worked: C_ref = M C Mᵀ, so the reference axis is the body axis turned by M
    assert np.allclose(result.axis_reference, measured.apply(result.axis_body), atol=1e-12)


def test_a_correction_just_above_the_rounding_limit_has_an_axis_and_one_below_has_none():
    assert NO_CORRECTION_DEG == 1e-12
    above = correction(Orientation.from_axis_angle((0, 0, 1), 2e-12), Orientation.identity())
    assert above.angle_deg == pytest.approx(2e-12, rel=1e-6)
    assert np.allclose(above.axis_body, (0, 0, 1)) and np.allclose(above.axis_reference, (0, 0, 1))
    below = correction(Orientation.from_axis_angle((0, 0, 1), 0.5e-12), Orientation.identity())
    assert below.angle_deg == pytest.approx(0.5e-12, rel=1e-6)
    assert below.axis_body is None and below.axis_reference is None
    # the small angles are still given, for what they are worth
    assert below.small_angles_body_deg[2] == pytest.approx(0.5e-12, rel=1e-6)


# ---------------------------------------------------------------------------------------------------
# Axes as text
# ---------------------------------------------------------------------------------------------------
def test_axes_are_read_by_name_or_as_three_numbers():
    axes = read_axes(" +X; 0, 1, 1 ;−z")
    # hand-worked: (0, 1, 1) / √2
    assert np.allclose(axes, [(1, 0, 0), (0, 1 / math.sqrt(2), 1 / math.sqrt(2)), (0, 0, -1)], atol=1e-15)
    assert np.array_equal(read_axes("y; -X"), [(0, 1, 0), (-1, 0, 0)])
    # a proper-Euler layout (first and last the same) is allowed: only neighbours must differ
    assert np.array_equal(read_axes("Z;X;Z"), [(0, 0, 1), (1, 0, 0), (0, 0, 1)])


@pytest.mark.parametrize("text, words", [
    ("+X; 1 2", "adjustment axis 2 ('1 2'): expected a named axis such as +X or three numbers"),
    ("+X;", "adjustment axis 2 (''): expected a named axis such as +X or three numbers"),
    ("+W; +X", "adjustment axis 1 ('+W'): expected a named axis such as +X or three numbers"),
    ("+X; " + "1 " * 30, f"adjustment axis 2 ('{('1 ' * 30).strip()[:40]}'): expected a named axis such as +X or "
                         "three numbers"),
    ("+X; 1 2 abc", "adjustment axis 2: “abc” is not a number"),
    ("+X; 1 2 inf", "adjustment axis 2: “inf” is not a finite number"),
    ("+X", "adjustment axes: expected two or three axes of three numbers each, got shape (1, 3)"),
    ("+X; +Y; +Z; +X", "adjustment axes: expected two or three axes of three numbers each, got shape (4, 3)"),
    ("+X; 0 0 0", "adjustment axis 2 has zero length; expected a direction"),
    ("+X; 1e200 0 0", "adjustment axis 2: expected finite numbers, got [1e+200, 0.0, 0.0]"),
    ("+X; -x", "adjustment axes 1 and 2 are parallel; turning about one and then the other reaches nothing the "
               "first alone does not: expected different axes"),
    ("+X; +Y; 0 5 0", "adjustment axes 2 and 3 are parallel; turning about one and then the other reaches nothing "
                      "the first alone does not: expected different axes"),
    (None, "adjustment axes: expected text such as '+X; 0 1 1' (at most 1000 characters)"),
    (("+X", "+Y"), "adjustment axes: expected text such as '+X; 0 1 1' (at most 1000 characters)"),
])
def test_axes_text_refusals_word_for_word(text, words):
    _refused(words, read_axes, text)


def test_axes_text_of_1000_characters_is_read_and_of_1001_refused():
    text = "+X;" + " " * 995 + "+Y"
    assert len(text) == 1000 and np.array_equal(read_axes(text), [(1, 0, 0), (0, 1, 0)])
    _refused("adjustment axes: expected text such as '+X; 0 1 1' (at most 1000 characters)", read_axes, text + " ")


# ---------------------------------------------------------------------------------------------------
# Axes as numbers
# ---------------------------------------------------------------------------------------------------
def test_axes_just_apart_are_accepted_and_just_parallel_refused_either_way_round():
    assert MIN_AXIS_SEPARATION_RAD == 1e-6
    for angle, accepted in ((2e-6, True), (0.5e-6, False)):
        for sign in (1, -1):                      # parallel and antiparallel
            axes = [(1, 0, 0), (sign * math.cos(angle), sign * math.sin(angle), 0)]
            if accepted:
                assert len(adjustment_angles(Orientation.identity(), axes).angles_deg) == 2
            else:
                with pytest.raises(InvalidInputError, match="^adjustment axes 1 and 2 are parallel"):
                    adjustment_angles(Orientation.identity(), axes)


@pytest.mark.parametrize("axes, words", [
    ([("a", 0, 0), (0, 1, 0)], "adjustment axes: expected two or three axes of three numbers, got [('a', 0, 0), "
                               "(0, 1, 0)]"),
    ([(0, 0, 0), (0, 1)], "adjustment axes: expected two or three axes of three numbers, got [(0, 0, 0), (0, 1)]"),
    ([(1, 0, 0), (0, float("nan"), 0)], "adjustment axis 2: expected finite numbers, got [0.0, nan, 0.0]"),
    ([(1, 0, 0), (0, 0, -float("inf"))], "adjustment axis 2: expected finite numbers, got [0.0, 0.0, -inf]"),
    ([(0, 0, 1.0000001e150), (1, 0, 0)], "adjustment axis 1: expected finite numbers, got [0.0, 0.0, 1.0000001e+150]"),
    ([(1, 0, 0), (0, 0.5e-12, 0)], "adjustment axis 2 has zero length; expected a direction"),
    ([(1, 0, 0), (0, 1e-300, 1e-300)], "adjustment axis 2 has zero length; expected a direction"),
])
def test_axes_as_numbers_refused_word_for_word(axes, words):
    _refused(words, adjustment_angles, Orientation.identity(), axes)


@pytest.mark.parametrize("scale", [1e150, 2e-12, 1e-10, 3.0])
def test_axes_of_any_length_inside_the_limits_are_taken_as_their_directions(scale):
    # SciPy: intrinsic Davenport angles about the unit axes rebuild the target
    target = Rotation.from_euler("XYZ", [5, -7, 11], degrees=True)
    axes = np.eye(3) * scale
    result = adjustment_angles(_orientation(target), axes)
    assert np.allclose(result.axes, np.eye(3), atol=0)
    rebuilt = Rotation.from_davenport(np.eye(3), "intrinsic", result.angles_deg, degrees=True)
    assert np.degrees((rebuilt * target.inv()).magnitude()) < 1e-12


# ---------------------------------------------------------------------------------------------------
# Angles
# ---------------------------------------------------------------------------------------------------
def test_exact_means_a_residual_below_1e_9_degrees():
    axes = ((1.0, 0.0, 0.0), (0.0, 1.0, 0.0))
    assert AdjustmentAngles(axes, (0.0, 0.0), 0.9e-9).exact
    assert not AdjustmentAngles(axes, (0.0, 0.0), 1.1e-9).exact


def test_the_orientation_of_the_angles_is_scipys_intrinsic_davenport_rotation():
    axes = np.array([(0, 0, 1), (1, 0, 0), (0, 0.6, 0.8)])
    result = AdjustmentAngles(tuple(map(tuple, axes)), (30.0, -20.0, 75.0), 0.0)
    # SciPy's from_davenport (intrinsic): R(a1, θ1) R(a2, θ2) R(a3, θ3)
    want = Rotation.from_davenport(axes, "intrinsic", [30, -20, 75], degrees=True)
    assert result.orientation().isclose(_orientation(want), 1e-12)
    # one unit axis composes as one turn (SciPy from_rotvec)
    assert compose_about_axes([(0, 0.6, 0.8)], [40]).isclose(
        _orientation(Rotation.from_rotvec(np.radians(40) * np.array([0, 0.6, 0.8]))), 1e-12)


def test_in_gimbal_lock_the_last_angle_is_zero_and_the_first_carries_the_turn_as_in_scipy():
    # SciPy's as_euler sets the third angle to zero in gimbal lock (it warns), as we do
    for sequence, angles in (("ZXZ", [50, 0, 0]), ("XYZ", [20, 90, 0]), ("ZYX", [-35, -90, 0])):
        target = Rotation.from_euler(sequence, angles, degrees=True)
        axes = np.eye(3)[["XYZ".index(c) for c in sequence]]
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", UserWarning)
            theirs = target.as_euler(sequence, degrees=True)
        result = adjustment_angles(_orientation(target), axes)
        assert np.allclose(result.angles_deg, theirs, atol=1e-9) and result.exact


def test_a_half_turn_is_180_not_minus_180_and_no_turn_is_a_positive_zero():
    # hand-worked: a half turn about X is θ1 = 180° about X and nothing about Y; (−180, 180] keeps +180
    result = adjustment_angles(Orientation.from_axis_angle((1, 0, 0), 180), [(1, 0, 0), (0, 1, 0)])
    assert result.angles_deg[0] == 180.0 and result.angles_deg[1] == pytest.approx(0, abs=1e-12)
    for count in (2, 3):
        zero = adjustment_angles(Orientation.identity(), np.eye(3)[:count])
        assert all(a == 0 and math.copysign(1, a) == 1 for a in zero.angles_deg) and zero.residual_deg == 0


def test_angles_are_wrapped_into_minus_180_to_180():
    for seed in range(30):
        target = Rotation.random(random_state=seed)
        result = adjustment_angles(_orientation(target), np.eye(3)[[2, 0, 2]])
        assert all(-180 < a <= 180 for a in result.angles_deg)


def test_axes_that_cannot_reach_get_an_answer_no_grid_of_angles_beats():
    """Axes X, Z and a third 30° from Z (from X 90°, from Z 30°): turning about Z keeps the angle from Z,
    so the third axis can never be brought onto X (worked here); a correction that takes the third axis onto X
    is out of reach. SciPy composes a 5° grid of all three angles: none comes closer than our answer."""
    a3 = np.array([0, math.sin(math.radians(30)), math.cos(math.radians(30))])
    axes = np.array([(1, 0, 0), (0, 0, 1), a3])
    turn_axis = np.cross(a3, (1, 0, 0))
    target = Rotation.from_rotvec(turn_axis / np.linalg.norm(turn_axis) * math.acos(a3 @ (1, 0, 0)))
    result = adjustment_angles(_orientation(target), axes)
    assert not result.exact and result.residual_deg > 1
    grid = np.radians(np.arange(-180, 180, 5.0))
    t1, t2, t3 = (g.reshape(-1) for g in np.meshgrid(grid, grid, grid, indexing="ij"))
    composed = (Rotation.from_rotvec(t1[:, None] * axes[0]) * Rotation.from_rotvec(t2[:, None] * axes[1])
                * Rotation.from_rotvec(t3[:, None] * axes[2]))
    best_on_grid = np.degrees((composed * target.inv()).magnitude()).min()
    assert result.residual_deg <= best_on_grid + 1e-9
    assert result.residual_deg > best_on_grid - 5      # and the grid is close enough to say so
    # the residual is the angle the returned angles leave (SciPy composes the three turns)
    rebuilt = Rotation.identity()
    for axis, angle in zip(axes, result.angles_deg):
        rebuilt = rebuilt * Rotation.from_rotvec(math.radians(angle) * axis)
    assert np.degrees((rebuilt * target.inv()).magnitude()) == pytest.approx(result.residual_deg, abs=1e-9)


@pytest.mark.parametrize("axis", [(1, 1, 1), (3, -7, 11), (1e-3, 2, 5)])
def test_an_axis_twice_is_refused_as_parallel_even_where_rounding_puts_its_cosine_above_1(axis):
    # worked here: each of these, made unit, has a dot product with itself of 1.0000000000000002
    with pytest.raises(InvalidInputError, match="^adjustment axes 1 and 2 are parallel"):
        adjustment_angles(Orientation.identity(), [axis, axis])


def test_axes_that_are_not_unit_compose_as_their_directions():
    # SciPy: turns of 30° about Z then 40° about X, given as (0, 0, 2) and (3, 0, 0)
    want = Rotation.from_rotvec(np.radians(30) * np.array([0, 0, 1])) * Rotation.from_rotvec(
        np.radians(40) * np.array([1, 0, 0]))
    assert compose_about_axes([(0, 0, 2), (3, 0, 0)], [30, 40]).isclose(_orientation(want), 1e-12)


def test_one_axis_of_any_length_composes_as_a_turn_about_its_direction():
    # (0, 0, 2) at 90° is a quarter turn about z (SciPy from_rotvec of the unit axis times the angle); an axis
    # left unscaled would give about 127°
    got = compose_about_axes([(0, 0, 2)], [90])
    assert got.isclose(_orientation(Rotation.from_rotvec([0, 0, np.pi / 2])), 1e-12)
    assert got.angle_to(Orientation.identity()) == pytest.approx(90.0, abs=1e-12)


@pytest.mark.parametrize("axes, angles", [([(0, 0, 1)], [10, 20]), ([(0, 0, 1), (1, 0, 0)], [10])])
def test_an_angle_count_other_than_the_axis_count_is_refused(axes, angles):
    with pytest.raises(InvalidInputError, match="one angle per axis"):
        compose_about_axes(axes, angles)
