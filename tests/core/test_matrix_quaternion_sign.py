"""The sign matrix -> quaternion writes: w > 0, and at a half turn (w = 0) the first non-zero of x, y, z
positive, on axes that are not coordinate axes; no −0.0 in what reaches a screen. Check values: SciPy's
Rotation (the same rotation, q or −q)."""

import numpy as np
from scipy.spatial.transform import Rotation

from core import kernels


def _same_rotation_as_scipy(q, rotations):
    expected = rotations.as_quat(scalar_first=True)
    return np.allclose(np.abs(np.einsum("...i,...i", q, expected)), 1.0, atol=1e-12)


def test_half_turns_about_random_axes_have_the_first_non_zero_vector_component_positive():
    rng = np.random.default_rng(18)
    axes = rng.normal(size=(500, 3))
    axes /= np.linalg.norm(axes, axis=1, keepdims=True)
    axes[:100, 0] = 0.0                        # some in the y-z plane, where x is zero and y decides
    axes[:100] /= np.linalg.norm(axes[:100], axis=1, keepdims=True)
    rotations = Rotation.from_rotvec(np.pi * axes)                    # SciPy: half turns
    q = kernels.matrices_to_quaternions(rotations.as_matrix())
    assert _same_rotation_as_scipy(q, rotations)
    assert np.all(np.abs(q[:, 0]) < 1e-15)
    for row in q:
        vector = row[1:]
        first = vector[np.flatnonzero(np.abs(vector) > 1e-12)[0]]
        assert first > 0, row
    # one at a time, too (the path without slices)
    for matrix, expected in zip(rotations.as_matrix()[:20], q[:20]):
        assert np.array_equal(kernels.matrices_to_quaternions(matrix), expected)


def test_no_negative_zero_where_the_sign_flip_meets_a_zero_component():
    # −170° about x (and about y, z): Shepperd's row for the largest diagonal is taken, its w is negative, so
    # the row is flipped and the zero components would come out as −0.0 without the "+ 0.0" (SciPy: the same
    # rotations); one matrix and a batch of them, which take different paths
    rotations = Rotation.from_rotvec(np.radians(-170) * np.eye(3))
    matrices = rotations.as_matrix()
    for q in (kernels.matrices_to_quaternions(matrices), np.array([kernels.matrices_to_quaternions(m)
                                                                   for m in matrices])):
        assert _same_rotation_as_scipy(q, rotations)
        zeros = q == 0
        assert zeros.sum() == 6 and not np.signbit(q[zeros]).any()


def test_a_users_value_in_a_message_is_cut_at_80_characters_with_an_ellipsis():
    exactly = "x" * 78                                  # repr adds the two quotes: 80 characters
    assert kernels.shortened_repr(exactly) == repr(exactly)
    longer = "x" * 79
    assert kernels.shortened_repr(longer) == repr(longer)[:80] + "…"
    assert kernels.shortened_repr([1, 2], limit=3) == "[1," + "…"
