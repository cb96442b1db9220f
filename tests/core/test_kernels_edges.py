"""Kernels at their edges: half turns about axes that are not coordinate axes (the canonical sign rule),
angles exactly at the ±180° wrap, and batches larger than one processing slice compared with SciPy
element by element (a last slice left unwritten, or a slice written twice, must show).

Check values: SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library); the
canonical sign rule and the angle ranges of CONVENTIONS.md; R = 2 n nᵀ − I for a half turn, the Rodrigues
formula at 180° worked by hand."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import Orientation, kernels
from tests.core.sampling import quaternion_distance, random_quaternions

HALF_TURN_AXES = [(1, 2, 3), (-1, 2, 3), (1, -2, -3), (0, -0.6, 0.8), (0, 0.6, -0.8), (0, 0, -1),
                  (-1, -1, 0), (-3, 0, 4), (1e-3, -1, 1)]


def expected_canonical_axis(axis):
    """CONVENTIONS.md: at 180° the sign of n whose first non-zero component is positive (hand rule)."""
    n = np.asarray(axis, dtype=float) / np.linalg.norm(axis)
    first = n[np.nonzero(n)[0][0]]
    return n if first > 0 else -n


@pytest.mark.parametrize("axis", HALF_TURN_AXES)
def test_half_turns_about_any_axis_take_the_canonical_sign(axis):
    want = expected_canonical_axis(axis)
    for given in (np.asarray(axis, float), -np.asarray(axis, float)):
        o = Orientation.from_axis_angle(given, 180.0)
        got_axis, angle = o.as_axis_angle()
        assert angle == pytest.approx(180.0, abs=1e-12)
        np.testing.assert_allclose(got_axis, want, atol=1e-15)
        q = o.as_quaternion()
        assert q[0] == 0.0 and q[1:][np.nonzero(q[1:])[0][0]] > 0       # w = 0, first non-zero positive
        np.testing.assert_allclose(o.as_rotation_vector(), 180.0 * want, atol=1e-12)
        # The same rotation as SciPy's (a reference library), whichever sign it picks.
        scipy_matrix = Rotation.from_rotvec(np.pi * given / np.linalg.norm(given)).as_matrix()
        np.testing.assert_allclose(o.as_matrix(), scipy_matrix, atol=1e-15)


@pytest.mark.parametrize("axis", HALF_TURN_AXES)
def test_a_half_turn_matrix_reads_back_with_the_canonical_axis(axis):
    n = np.asarray(axis, dtype=float) / np.linalg.norm(axis)
    matrix = 2.0 * np.outer(n, n) - np.eye(3)          # Rodrigues at 180°, by hand
    o = Orientation.from_matrix(matrix)
    got_axis, angle = o.as_axis_angle()
    assert angle == pytest.approx(180.0, abs=1e-9)
    np.testing.assert_allclose(got_axis, expected_canonical_axis(axis), atol=1e-9)
    q = kernels.matrices_to_quaternions(matrix)
    assert q[0] == 0.0 and q[1:][np.nonzero(q[1:])[0][0]] > 0


def test_canonical_quaternions_on_batches_of_half_turns():
    rng = np.random.default_rng(5)
    axes = rng.normal(size=(500, 3))
    axes[:100, 0] = 0.0                  # the sign decided by y
    axes[100:150, :2] = 0.0              # the sign decided by z
    axes /= np.linalg.norm(axes, axis=1, keepdims=True)
    q = np.concatenate([np.zeros((500, 1)), axes], axis=1) * rng.choice([-1.0, 1.0], size=(500, 1))
    out = kernels.canonical_quaternions(q)
    np.testing.assert_array_equal(out[:, 0], 0.0)
    for row, axis in zip(out, axes):
        np.testing.assert_allclose(row[1:], expected_canonical_axis(axis), atol=1e-15)


def test_wrap_keeps_angles_in_the_half_open_range():
    # Hand-worked: (−π, π] includes π and excludes −π.
    values = np.array([np.pi, -np.pi, 1.5 * np.pi, -1.5 * np.pi, 0.0, 2 * np.pi - 1e-12, -2 * np.pi + 1e-12])
    wrapped = kernels._wrap_half_open(values)
    np.testing.assert_allclose(wrapped, [np.pi, np.pi, -0.5 * np.pi, 0.5 * np.pi, 0.0, -1e-12, 1e-12],
                               atol=1e-15)
    assert wrapped[1] == np.pi


EXACT_HALF_TURNS = [(0, 0, 0, 1), (0, 1, 0, 0), (0, 0, 1, 0)]


@pytest.mark.parametrize("q", EXACT_HALF_TURNS)
@pytest.mark.parametrize("sequence", ["ZYX", "XYZ", "YZX", "ZXZ", "XYX", "YXY"])
@pytest.mark.parametrize("intrinsic", [True, False])
def test_angles_exactly_at_the_wrap_are_reported_as_plus_180(q, sequence, intrinsic):
    # CONVENTIONS.md: θ1, θ3 in (−180°, 180°]; a half turn about a coordinate axis lands exactly on the wrap.
    o = Orientation.from_quaternion(q)
    angles = o.as_angles(sequence, intrinsic=intrinsic).angles
    assert np.all(angles > -180.0) and np.all(angles <= 180.0)
    assert Orientation.from_angles(sequence, angles, intrinsic=intrinsic).isclose(o, 1e-12)
    # SciPy (range [−180°, 180°]) spells the same matrix; agreement modulo 360°.
    name = sequence if intrinsic else sequence.lower()
    reference = Rotation.from_euler(name, angles, degrees=True).as_matrix()
    np.testing.assert_allclose(reference, o.as_matrix(), atol=1e-12)


@pytest.mark.parametrize("given", [-180.0, 180.0])
def test_minus_180_and_its_turns_come_back_as_plus_180(given):
    for sequence in ("ZYX", "ZXZ"):
        o = Orientation.from_angles(sequence, [given, 40.0, 0.0])
        angles = o.as_angles(sequence).angles
        assert angles[0] == pytest.approx(180.0, abs=1e-9), angles
        o = Orientation.from_angles(sequence, [25.0, 40.0, given])
        angles = o.as_angles(sequence).angles
        assert angles[2] == pytest.approx(180.0, abs=1e-9) and angles[0] == pytest.approx(25.0, abs=1e-9)


# --- more than one slice ------------------------------------------------------------------------------

N = 3 * kernels._CHUNK + 7


@pytest.fixture(scope="module")
def many():
    q = random_quaternions(N, seed=77)
    q[-1] = [0.0, 0.0, 0.0, 1.0]            # the very last row is a half turn: a distinct value to find
    return q, Rotation.from_quat(q[:, [1, 2, 3, 0]])


def test_slice_size_is_what_this_test_assumes():
    assert N > 3 * kernels._CHUNK and N % kernels._CHUNK == 7


def test_matrices_of_every_slice_agree_with_scipy(many):
    q, r = many
    m = kernels.quaternions_to_matrices(q)
    assert m.shape == (N, 3, 3)
    np.testing.assert_allclose(m, r.as_matrix(), atol=1e-15)       # SciPy, element by element
    back = kernels.matrices_to_quaternions(r.as_matrix())
    assert quaternion_distance(back, q) <= 1e-15
    assert np.all(back[:, 0] >= 0)


def test_axis_angles_and_rotation_vectors_of_every_slice_agree_with_scipy(many):
    q, r = many
    rotvec = kernels.quaternions_to_rotation_vectors(q)
    want = r.as_rotvec()
    # SciPy may pick the other sign at exactly 180°: compare as rotations there.
    np.testing.assert_allclose(rotvec[:-1], want[:-1], atol=1e-13)
    axis, angle = kernels.quaternions_to_axis_angles(q)
    np.testing.assert_allclose(angle, r.magnitude(), atol=1e-13)
    np.testing.assert_allclose(axis[-1], [0.0, 0.0, 1.0])
    np.testing.assert_allclose(axis[:-1] * angle[:-1, None], want[:-1], atol=1e-13)
    assert quaternion_distance(kernels.rotation_vectors_to_quaternions(want), q) <= 1e-14
    assert quaternion_distance(kernels.axis_angles_to_quaternions(axis, angle), q) <= 1e-14


@pytest.mark.filterwarnings("ignore:Gimbal lock")     # SciPy's remark on the last row (a half turn)
@pytest.mark.parametrize("sequence, intrinsic", [("ZYX", True), ("XYZ", False), ("ZXZ", True)])
def test_angles_of_every_slice_agree_with_scipy(many, sequence, intrinsic):
    q, r = many
    name = sequence if intrinsic else sequence.lower()
    angles, locked = kernels.quaternions_to_angles(q, sequence, intrinsic)
    assert angles.shape == (N, 3) and locked.shape == (N,)
    # SciPy's angles give the same matrix (the last row is a half turn and may be spelled otherwise).
    np.testing.assert_allclose(Rotation.from_euler(name, angles).as_matrix(), r.as_matrix(), atol=1e-12)
    np.testing.assert_allclose(angles[:-1], r[:-1].as_euler(name), atol=1e-10)
    back = kernels.angles_to_quaternions(r.as_euler(name), sequence, intrinsic)
    assert quaternion_distance(back, q) <= 1e-14
    margins = kernels.gimbal_margins(q, sequence, intrinsic)
    middle = angles[:, 1]
    expected = np.minimum(middle, np.pi - middle) if sequence[0] == sequence[2] else np.pi / 2 - np.abs(middle)
    np.testing.assert_allclose(margins, expected, atol=1e-9)


def test_products_rotations_and_angles_of_every_slice_agree_with_scipy(many):
    q, r = many
    p = random_quaternions(N, seed=78)
    rp = Rotation.from_quat(p[:, [1, 2, 3, 0]])
    product = kernels.multiply_quaternions(p, q)
    want = (rp * r).as_quat()[:, [3, 0, 1, 2]]
    assert quaternion_distance(product, want) <= 1e-15
    v = np.random.default_rng(3).normal(size=(N, 3))
    np.testing.assert_allclose(kernels.rotate_vectors(q, v), r.apply(v), atol=1e-14)
    np.testing.assert_allclose(kernels.angles_between(p, q), (rp.inv() * r).magnitude(), atol=1e-12)
    np.testing.assert_array_equal(kernels.conjugate_quaternions(q), q * [1, -1, -1, -1])
    unit, norms = kernels.normalize_quaternions(3.0 * q)
    np.testing.assert_allclose(norms, 3.0, rtol=1e-15)
    np.testing.assert_allclose(unit, q, atol=1e-15)
    canonical = kernels.canonical_quaternions(-q)
    assert np.all(canonical[:, 0] >= 0) and quaternion_distance(canonical, q) == 0.0


def test_matrix_checks_of_every_slice(many):
    q, r = many
    m = r.as_matrix() * 1.001                      # every matrix 0.1% too long: error 2.001e-3
    m[-1] = np.diag([1.0, 1.0, -1.0])             # the last one a reflection
    nearest, error, det = kernels.nearest_rotations(m)
    np.testing.assert_allclose(nearest[:-1], r.as_matrix()[:-1], atol=1e-12)   # polar factor = SciPy's R
    np.testing.assert_allclose(error[:-1], 1.001 ** 2 - 1, rtol=1e-9)
    np.testing.assert_allclose(det[:-1], 1.001 ** 3, rtol=1e-12)
    assert det[-1] == -1.0 and error[-1] == 0.0
    np.testing.assert_allclose(kernels.determinants(m), np.linalg.det(m), atol=1e-12)   # numpy's LU
    np.testing.assert_allclose(kernels.orthogonality_errors(m), error)


def test_broadcast_leading_shapes_still_work_past_one_slice(many):
    q, r = many
    one = random_quaternions(1, seed=79)[0]
    product = kernels.multiply_quaternions(one, q)     # (4,) against (N, 4): goes straight through
    want = (Rotation.from_quat(one[[1, 2, 3, 0]]) * r).as_quat()[:, [3, 0, 1, 2]]
    assert quaternion_distance(product, want) <= 1e-15
    shaped = kernels.quaternions_to_matrices(q[:2 * kernels._CHUNK + 2].reshape(2, -1, 4))
    np.testing.assert_allclose(shaped.reshape(-1, 3, 3), r[:2 * kernels._CHUNK + 2].as_matrix(), atol=1e-15)
