"""Every conversion of the core against SciPy's scipy.spatial.transform.Rotation, a general-purpose
reference library, over thousands of seeded random orientations and the adversarial sets of sampling.py.

Agreement is asked to 1e-12, compared the rotation-aware way: q and −q are the same orientation, and in
gimbal lock the matrices are compared, not the angles (there only t1 ± t3 is determined)."""

import warnings

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import Orientation, kernels
from core.kernels import ALL_SEQUENCES
from tests.core.sampling import (
    near_lock_angles,
    near_zero_and_half_turn_quaternions,
    quaternion_distance,
    random_quaternions,
    small_w_quaternions,
)

TOL = 1e-12
N = 4000


def scipy_rotation(q_wxyz):
    return Rotation.from_quat(q_wxyz, scalar_first=True)


@pytest.fixture(scope="module", params=["random", "near 0 and 180 deg", "w near 0"])
def quaternions(request):
    if request.param == "random":
        return random_quaternions(N)
    if request.param == "near 0 and 180 deg":
        return near_zero_and_half_turn_quaternions(N)
    return small_w_quaternions(N)


def test_quaternion_to_matrix_matches_scipy(quaternions):
    # Reference: SciPy Rotation.as_matrix.
    ours = kernels.quaternions_to_matrices(quaternions)
    assert np.abs(ours - scipy_rotation(quaternions).as_matrix()).max() <= TOL


def test_matrix_to_quaternion_matches_scipy(quaternions):
    # Reference: SciPy Rotation.from_matrix(...).as_quat(scalar_first=True).
    matrices = scipy_rotation(quaternions).as_matrix()
    ours = kernels.matrices_to_quaternions(matrices)
    theirs = Rotation.from_matrix(matrices).as_quat(scalar_first=True)
    assert quaternion_distance(ours, theirs) <= TOL


def test_matrix_to_quaternion_is_canonical(quaternions):
    # CONVENTIONS.md: w >= 0; if w = 0 the first non-zero of x, y, z positive.
    ours = kernels.matrices_to_quaternions(scipy_rotation(quaternions).as_matrix())
    assert np.all(ours[:, 0] >= 0)
    zero_w = ours[:, 0] == 0
    first = np.where(ours[:, 1] != 0, ours[:, 1], np.where(ours[:, 2] != 0, ours[:, 2], ours[:, 3]))
    assert np.all(first[zero_w] > 0)


def test_rotation_vector_both_ways_matches_scipy(quaternions):
    # Reference: SciPy Rotation.as_rotvec / from_rotvec. Both give the angle in [0, pi]; at exactly pi
    # the two signs of the axis are the same rotation, so compare the rotations there.
    ours = kernels.quaternions_to_rotation_vectors(quaternions)
    theirs = scipy_rotation(quaternions).as_rotvec()
    near_half_turn = np.linalg.norm(theirs, axis=1) > np.pi - 1e-6
    if np.any(~near_half_turn):
        assert np.abs(ours[~near_half_turn] - theirs[~near_half_turn]).max() <= TOL
    assert np.abs(np.linalg.norm(ours, axis=1) - np.linalg.norm(theirs, axis=1)).max() <= TOL
    back = kernels.rotation_vectors_to_quaternions(ours)
    assert quaternion_distance(back, Rotation.from_rotvec(ours).as_quat(scalar_first=True)) <= TOL
    assert quaternion_distance(back, quaternions) <= TOL


def test_axis_angle_agrees_with_scipy_rotvec(quaternions):
    # Reference: SciPy's rotation vector is angle times unit axis.
    axis, angle = kernels.quaternions_to_axis_angles(quaternions)
    theirs = scipy_rotation(quaternions).as_rotvec()
    assert np.abs(angle - np.linalg.norm(theirs, axis=1)).max() <= TOL
    rebuilt = kernels.axis_angles_to_quaternions(axis, angle)
    assert quaternion_distance(rebuilt, quaternions) <= TOL


def test_composition_and_inverse_match_scipy():
    # Reference: SciPy Rotation multiplication (p * q is p after q, the matrix product) and inv().
    p = random_quaternions(N, seed=1)
    q = random_quaternions(N, seed=2)
    ours = kernels.multiply_quaternions(p, q)
    theirs = (scipy_rotation(p) * scipy_rotation(q)).as_quat(scalar_first=True)
    assert quaternion_distance(ours, theirs) <= TOL
    inverse = kernels.conjugate_quaternions(p)
    assert quaternion_distance(inverse, scipy_rotation(p).inv().as_quat(scalar_first=True)) <= TOL


def test_rotate_vectors_matches_scipy_apply():
    # Reference: SciPy Rotation.apply.
    q = random_quaternions(N, seed=3)
    v = np.random.default_rng(4).normal(size=(N, 3))
    assert np.abs(kernels.rotate_vectors(q, v) - scipy_rotation(q).apply(v)).max() <= TOL


def test_angle_between_matches_scipy_magnitude():
    # Reference: SciPy (p.inv() * q).magnitude().
    p = random_quaternions(N, seed=5)
    q = random_quaternions(N, seed=6)
    theirs = (scipy_rotation(p).inv() * scipy_rotation(q)).magnitude()
    assert np.abs(kernels.angles_between(p, q) - theirs).max() <= TOL


@pytest.mark.parametrize("intrinsic", [True, False], ids=["intrinsic", "extrinsic"])
@pytest.mark.parametrize("sequence", ALL_SEQUENCES)
def test_angles_from_quaternion_match_scipy(sequence, intrinsic):
    # Reference: SciPy Rotation.as_euler, upper-case sequence = intrinsic, lower-case = extrinsic.
    # Away from lock the angles themselves must agree (both use the same ranges).
    q = random_quaternions(N, seed=7)
    ours, locked = kernels.quaternions_to_angles(q, sequence, intrinsic)
    name = sequence if intrinsic else sequence.lower()
    theirs = scipy_rotation(q).as_euler(name)
    assert not locked.any()
    difference = np.abs(ours - theirs)
    # +pi and -pi are the same angle; ours is in (-pi, pi], SciPy's in [-pi, pi).
    difference = np.minimum(difference, np.abs(difference - 2 * np.pi))
    assert difference.max() <= TOL


@pytest.mark.parametrize("intrinsic", [True, False], ids=["intrinsic", "extrinsic"])
@pytest.mark.parametrize("sequence", ALL_SEQUENCES)
def test_angles_to_quaternion_match_scipy(sequence, intrinsic):
    # Reference: SciPy Rotation.from_euler.
    angles = np.random.default_rng(8).uniform(-np.pi, np.pi, size=(N, 3))
    ours = kernels.angles_to_quaternions(angles, sequence, intrinsic)
    name = sequence if intrinsic else sequence.lower()
    theirs = Rotation.from_euler(name, angles).as_quat(scalar_first=True)
    assert quaternion_distance(ours, theirs) <= TOL


@pytest.mark.parametrize("intrinsic", [True, False], ids=["intrinsic", "extrinsic"])
@pytest.mark.parametrize("sequence", ALL_SEQUENCES)
def test_angles_near_and_in_lock_rebuild_the_same_matrix(sequence, intrinsic):
    # Middle angle within 1e-9 of lock (and exactly in it): the angles we return must rebuild the same
    # matrix as SciPy's from_euler of the input, and land in the documented ranges.
    angles = near_lock_angles(N, sequence)
    name = sequence if intrinsic else sequence.lower()
    matrices = Rotation.from_euler(name, angles).as_matrix()
    q = Rotation.from_euler(name, angles).as_quat(scalar_first=True)
    ours, locked = kernels.quaternions_to_angles(q, sequence, intrinsic)
    rebuilt = Rotation.from_euler(name, ours).as_matrix()
    assert np.abs(rebuilt - matrices).max() <= TOL
    assert np.all(ours[:, [0, 2]] > -np.pi) and np.all(ours[:, [0, 2]] <= np.pi)
    if sequence[0] == sequence[2]:
        assert np.all((ours[:, 1] >= 0) & (ours[:, 1] <= np.pi))
    else:
        assert np.all(np.abs(ours[:, 1]) <= np.pi / 2)
    # Lock convention (CONVENTIONS.md): third angle zero wherever lock is reported.
    assert np.all(ours[locked, 2] == 0)
    # SciPy agrees that the exactly-singular cases are singular (it warns there).
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        Rotation.from_quat(q[:4], scalar_first=True).as_euler(name)
    assert any("Gimbal lock" in str(w.message) for w in caught)


def test_noisy_matrices_project_like_scipy():
    # Reference: SciPy Rotation.from_matrix, which projects non-orthogonal input to the nearest rotation
    # by SVD. Rounding noise of 1e-4 on every element.
    rng = np.random.default_rng(9)
    clean = Rotation.random(N, rng=rng).as_matrix()
    noisy = clean + rng.normal(scale=1e-4, size=clean.shape)
    nearest, error, det = kernels.nearest_rotations(noisy)
    ours = kernels.matrices_to_quaternions(nearest)
    theirs = Rotation.from_matrix(noisy).as_quat(scalar_first=True)
    assert quaternion_distance(ours, theirs) <= TOL
    assert np.all(det > 0)
    assert np.abs(error - np.abs(np.swapaxes(noisy, 1, 2) @ noisy - np.eye(3)).max(axis=(1, 2))).max() < 1e-15


def test_orientation_value_matches_scipy_for_each_representation():
    # The single-value class rides on the same kernels; check its degree handling against SciPy.
    for q in random_quaternions(200, seed=10):
        o = Orientation.from_quaternion(q)
        r = scipy_rotation(q)
        assert np.abs(o.as_matrix() - r.as_matrix()).max() <= TOL
        assert np.abs(o.as_matrix(transposed=True) - r.as_matrix().T).max() <= TOL
        assert np.abs(o.as_rotation_vector() - r.as_rotvec(degrees=True)).max() <= 1e-10
        assert np.abs(o.as_rotation_vector(degrees=False) - r.as_rotvec()).max() <= TOL
        got = o.as_angles("ZYX").angles
        assert np.abs(got - r.as_euler("ZYX", degrees=True)).max() <= 1e-10
        assert Orientation.from_matrix(r.as_matrix()).isclose(o)
        assert Orientation.from_matrix(r.as_matrix().T, transposed=True).isclose(o)
        assert Orientation.from_quaternion(r.as_quat(), scalar_last=True).isclose(o)
