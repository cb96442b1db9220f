"""The core against transforms3d and numpy-quaternion, two more general-purpose reference libraries
(w-first quaternions in both). transforms3d's 'r' prefix is a rotating (intrinsic) sequence and 's' a
static (extrinsic) one; its mat2quat uses Bar-Itzhack's eigenvector method."""

import numpy as np
import pytest
import quaternion as npq
from transforms3d import axangles, euler, quaternions

from core import Orientation, kernels
from core.kernels import ALL_SEQUENCES
from tests.core.sampling import quaternion_distance, random_quaternions

TOL = 1e-12


@pytest.fixture(scope="module")
def samples():
    return random_quaternions(500, seed=11)


def test_matrix_and_quaternion_match_transforms3d(samples):
    for q in samples:
        # Reference: transforms3d.quaternions.quat2mat / mat2quat.
        m = quaternions.quat2mat(q)
        assert np.abs(kernels.quaternions_to_matrices(q) - m).max() <= TOL
        assert quaternion_distance(kernels.matrices_to_quaternions(m), quaternions.mat2quat(m)) <= TOL


def test_axis_angle_matches_transforms3d(samples):
    for q in samples:
        # Reference: transforms3d.axangles.mat2axangle / axangle2mat.
        axis, angle = Orientation.from_quaternion(q).as_axis_angle(degrees=False)
        assert np.abs(axangles.axangle2mat(axis, angle) - quaternions.quat2mat(q)).max() <= TOL
        t_axis, t_angle = quaternions.quat2axangle(q)
        # transforms3d may return the same rotation as (-axis, -angle) or (axis, 2pi - angle); compare
        # the rotations it spells.
        assert np.abs(axangles.axangle2mat(t_axis, t_angle) - Orientation.from_axis_angle(
            axis, angle, degrees=False).as_matrix()).max() <= TOL


@pytest.mark.parametrize("sequence", ALL_SEQUENCES)
@pytest.mark.parametrize("intrinsic", [True, False], ids=["intrinsic", "extrinsic"])
def test_angle_sequences_match_transforms3d(sequence, intrinsic):
    # Reference: transforms3d.euler.euler2mat with axes 'r' + letters for a rotating frame (intrinsic)
    # or 's' + letters for a static one (extrinsic), angles in the order written.
    rng = np.random.default_rng(12)
    code = ("r" if intrinsic else "s") + sequence.lower()
    for angles in rng.uniform(-np.pi, np.pi, size=(200, 3)):
        reference = euler.euler2mat(*angles, axes=code)
        ours = Orientation.from_angles(sequence, angles, intrinsic=intrinsic, degrees=False)
        assert np.abs(ours.as_matrix() - reference).max() <= TOL


def test_products_match_numpy_quaternion():
    # Reference: numpy-quaternion's quaternion dtype (Hamilton product, w-first) and rotate_vectors.
    p = random_quaternions(1000, seed=13)
    q = random_quaternions(1000, seed=14)
    theirs = npq.as_float_array(npq.as_quat_array(p) * npq.as_quat_array(q))
    assert quaternion_distance(kernels.multiply_quaternions(p, q), theirs) <= TOL
    v = np.random.default_rng(15).normal(size=(3,))
    rotated = npq.rotate_vectors(npq.as_quat_array(p), v)
    assert np.abs(kernels.rotate_vectors(p, v) - rotated).max() <= TOL
    assert np.abs(kernels.quaternions_to_matrices(p) - npq.as_rotation_matrix(npq.as_quat_array(p))).max() <= TOL
