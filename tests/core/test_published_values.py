"""Check values from published sources and handbook facts (../shared/REFERENCES.md), and the Rodrigues
formula applied directly inside the test, independently of the core."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import Orientation
from core.sequences import gimbal_margin


def rodrigues(r, n, phi):
    """O. Rodrigues (1840): r' = r cos φ + (n × r) sin φ + n (n · r)(1 − cos φ), written out here."""
    n = np.asarray(n, dtype=float) / np.linalg.norm(n)
    r = np.asarray(r, dtype=float)
    return r * np.cos(phi) + np.cross(n, r) * np.sin(phi) + n * np.dot(n, r) * (1 - np.cos(phi))


def test_120_degrees_about_the_diagonal_cycles_the_axes():
    # Common practice: 120° about (1, 1, 1)/√3 maps x -> y -> z -> x.
    o = Orientation.from_axis_angle([1, 1, 1], 120)
    expected = np.array([[0, 0, 1], [1, 0, 0], [0, 1, 0]], dtype=float)
    assert np.abs(o.as_matrix() - expected).max() <= 1e-15
    assert np.allclose(o.apply([1, 0, 0]), [0, 1, 0], atol=1e-15)


def test_quarter_turn_about_z():
    # Common practice: 90° about z: R = [[0,−1,0],[1,0,0],[0,0,1]], q = (√½, 0, 0, √½).
    o = Orientation.from_axis_angle([0, 0, 1], 90)
    assert np.abs(o.as_matrix() - np.array([[0, -1, 0], [1, 0, 0], [0, 0, 1]])).max() <= 1e-15
    assert np.abs(o.as_quaternion() - [np.sqrt(0.5), 0, 0, np.sqrt(0.5)]).max() <= 1e-15


def test_half_turn_about_x():
    # transforms3d doctest: 180° about x: R = diag(1, −1, −1), quaternion (0, 1, 0, 0).
    o = Orientation.from_matrix(np.diag([1.0, -1.0, -1.0]))
    assert np.array_equal(o.as_quaternion(), [0.0, 1.0, 0.0, 0.0])
    axis, angle = o.as_axis_angle()
    assert angle == 180.0 and np.array_equal(axis, [1.0, 0.0, 0.0])


def test_half_turn_axis_sign_is_canonical():
    # CONVENTIONS.md: at 180° the axis whose first non-zero component is positive.
    o = Orientation.from_axis_angle([0, -1, 1], 180)
    axis, angle = o.as_axis_angle()
    assert angle == pytest.approx(180.0, abs=1e-12)
    assert axis[1] > 0 and axis[2] < 0
    assert o.isclose(Orientation.from_axis_angle([0, 1, -1], 180))


def test_intrinsic_zyx_30_20_10():
    # Computed with SciPy (REFERENCES.md lists the digits; recomputed here rather than trusted):
    # intrinsic ZYX (30°, 20°, 10°) -> quaternion ≈ (0.951548525, 0.038134576, 0.189307857, 0.239298338).
    expected = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True).as_quat(scalar_first=True)
    got = Orientation.from_angles("ZYX", [30, 20, 10]).as_quaternion()
    assert np.abs(got - expected).max() <= 1e-15
    assert np.abs(got - [0.951548525, 0.038134576, 0.189307857, 0.239298338]).max() <= 1e-9


def test_rounded_drawing_matrix_with_four_decimals_is_accepted_with_notice():
    # Common practice: 45° about z printed to four decimals (0.7071) has orthogonality error about 2e-5;
    # the nearest rotation is 45° about z.
    m = np.array([[0.7071, -0.7071, 0], [0.7071, 0.7071, 0], [0, 0, 1]])
    o = Orientation.from_matrix(m)
    assert o.notes and "nearest rotation" in o.notes[0]
    axis, angle = o.as_axis_angle()
    assert angle == pytest.approx(45.0, abs=1e-12)
    assert np.allclose(axis, [0, 0, 1], atol=1e-15)


@pytest.mark.parametrize("pitch", [90.0, -90.0])
def test_gimbal_lock_in_yaw_pitch_roll_keeps_only_the_coupled_angle(pitch):
    # Common practice: intrinsic ZYX with pitch ±90° determines only yaw ∓ roll.
    yaw, roll = 50.0, 15.0
    o = Orientation.from_angles("ZYX", [yaw, pitch, roll])
    result = o.as_angles("ZYX")
    assert result.locked
    coupled = yaw - roll if pitch > 0 else yaw + roll
    assert result.angles[0] == pytest.approx(coupled, abs=1e-9)
    assert result.angles[1] == pytest.approx(pitch, abs=1e-9)
    assert result.angles[2] == 0.0
    assert gimbal_margin(o, "ZYX").locked


def test_presets_are_the_same_matrix_spelled_two_ways():
    # CONVENTIONS.md: yaw–pitch–roll (intrinsic ZYX) equals roll–pitch–yaw about fixed axes (extrinsic
    # XYZ) with the angles reversed.
    a = Orientation.from_angles("ZYX", [35, -12, 71], intrinsic=True)
    b = Orientation.from_angles("XYZ", [71, -12, 35], intrinsic=False)
    assert a.isclose(b, atol=1e-15)


def test_rotation_of_vectors_agrees_with_the_rodrigues_formula():
    rng = np.random.default_rng(16)
    for _ in range(500):
        n = rng.normal(size=3)
        phi = rng.uniform(-2 * np.pi, 2 * np.pi)
        r = rng.normal(size=3)
        o = Orientation.from_axis_angle(n, phi, degrees=False)
        assert np.abs(o.apply(r) - rodrigues(r, n, phi)).max() <= 1e-12


def test_matrix_agrees_with_the_rodrigues_matrix_form():
    # R = I + sin φ [n]x + (1 − cos φ) [n]x², written out here.
    rng = np.random.default_rng(17)
    for _ in range(500):
        n = rng.normal(size=3)
        n /= np.linalg.norm(n)
        phi = rng.uniform(0, np.pi)
        k = np.array([[0, -n[2], n[1]], [n[2], 0, -n[0]], [-n[1], n[0], 0]])
        expected = np.eye(3) + np.sin(phi) * k + (1 - np.cos(phi)) * k @ k
        assert np.abs(Orientation.from_axis_angle(n, phi, degrees=False).as_matrix() - expected).max() <= 1e-12


def test_parallel_part_stays_fixed_and_perpendicular_part_sweeps_its_circle():
    # The pieces of the construction: r∥ = (r·n) n is fixed; r⊥ keeps its length |n × r|.
    n = np.array([1.0, 2.0, 2.0]) / 3.0
    r = np.array([0.3, -1.2, 0.8])
    o = Orientation.from_axis_angle(n, 73)
    r_par = np.dot(r, n) * n
    rotated = o.apply(r)
    assert np.allclose(np.dot(rotated, n) * n, r_par, atol=1e-15)
    assert np.linalg.norm(rotated - r_par) == pytest.approx(np.linalg.norm(np.cross(n, r)), abs=1e-15)


@pytest.mark.parametrize("build", [
    lambda: Orientation.from_angles("XYZ", [-180, 0, 180]),           # 180° about y, from angles
    lambda: Orientation.from_angles("ZYX", [180, 0, 0]),              # 180° about z
    lambda: Orientation.from_matrix(np.diag([-1.0, 1.0, -1.0])),      # 180° about y, from a matrix
    lambda: Orientation.from_rotation_vector([0, -180, 0]),
])
def test_half_turns_from_any_representation_have_the_canonical_axis(build):
    # CONVENTIONS.md: at 180° the axis whose first non-zero component is positive; rounding dust (about
    # 1e-16 from cos(90°)) must not count as "non-zero".
    axis, angle = build().as_axis_angle()
    assert angle == pytest.approx(180.0, abs=1e-12)
    first = next(c for c in axis if abs(c) > 1e-12)
    assert first > 0
    assert np.all((np.abs(axis) > 1e-12) | (axis == 0))   # no dust left in the axis shown


def test_many_half_turns_built_from_angles_are_canonical():
    # A grid of angle triples that give half turns: 0 or ±180 in each place (common practice: two half
    # turns about perpendicular axes make the third).
    values = [-180.0, 0.0, 180.0]
    for sequence in ("XYZ", "ZYX", "ZXZ"):
        for a in values:
            for b in values:
                for c in values:
                    o = Orientation.from_angles(sequence, [a, b, c])
                    axis, angle = o.as_axis_angle()
                    if angle < 90:
                        continue
                    first = next(v for v in axis if v != 0)
                    assert first > 0, (sequence, a, b, c, axis)
