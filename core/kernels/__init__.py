"""Vectorised conversions between orientation representations.

Every function takes arrays with any number of leading dimensions: a single quaternion has shape (4,), a
batch of a million has shape (1000000, 4); the same code serves both, with no Python loop over the batch.
Quaternions are Hamilton, stored w-first (w, x, y, z). Angles are radians here; degrees are the business of
the callers that talk to people. Matrices map body to reference: v_ref = R @ v_body.

The functions trust their input to be finite and of the right shape unless they say otherwise; the
`check_*` helpers at the top do that validation for callers that face users.

One module per purpose: slices (how one code path serves one orientation and a million), checks (users'
arrays, flags and sequence names), quaternions (the algebra), matrices, vectors (axis and angle, rotation
vectors), angles (the twelve sequences) and rodrigues (the Gibbs vector and the modified Rodrigues
parameters). `from core import kernels` and `kernels.<name>` keep working for every name listed here.
"""

from core.kernels.angles import (LOCK_MARGIN_RAD, angles_to_quaternions, gimbal_margins, gimbal_margins_of_sequences,
                                 quaternions_to_angles)
from core.kernels.checks import (ALL_SEQUENCES, PROPER_EULER, TAIT_BRYAN, check_array, check_flag,
                                 check_sequence_name, float_array, shortened_repr, unit_vectors)
from core.kernels.matrices import (determinants, matrices_to_quaternions, nearest_rotations, orthogonality_errors,
                                   quaternions_to_matrices)
from core.kernels.quaternions import (angles_between, canonical_quaternions, conjugate_quaternions,
                                      multiply_quaternions, normalize_quaternions, rotate_vectors)
from core.kernels.vectors import (axis_angles_to_quaternions, quaternions_to_axis_angles,
                                  quaternions_to_rotation_vectors, rotation_vectors_to_quaternions)

# Two private names the kernel tests read through this module (the slice size, the angle wrap).
from core.kernels.angles import _wrap_half_open  # noqa: E402,F401
from core.kernels.slices import _CHUNK  # noqa: E402,F401

__all__ = ["ALL_SEQUENCES", "LOCK_MARGIN_RAD", "PROPER_EULER", "TAIT_BRYAN", "angles_between", "angles_to_quaternions",
           "axis_angles_to_quaternions", "canonical_quaternions", "check_array", "check_flag", "check_sequence_name",
           "conjugate_quaternions", "determinants", "gimbal_margins", "gimbal_margins_of_sequences",
           "matrices_to_quaternions", "multiply_quaternions",
           "nearest_rotations", "normalize_quaternions", "orthogonality_errors", "quaternions_to_angles",
           "quaternions_to_axis_angles", "quaternions_to_matrices", "quaternions_to_rotation_vectors", "rotate_vectors",
           "float_array", "rotation_vectors_to_quaternions", "shortened_repr", "unit_vectors"]
