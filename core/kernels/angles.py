"""Three angles of any of the twelve sequences, intrinsic or extrinsic, on arrays (..., 3): to and from
quaternions, and the gimbal margin."""

import functools
import math

import numpy as np

from core.errors import SequenceError
from core.kernels.checks import check_array, check_flag, check_sequence_name
from core.kernels.quaternions import canonical_quaternions, conjugate_quaternions, multiply_quaternions
from core.kernels.slices import _arctan2, _in_slices, _maximum, _minimum, _parts, _sqrt


# Below this gimbal margin (radians) the first and third angles cannot be told apart in double precision
# without moving the orientation by more than about this much; we then report lock and set the third
# angle to zero. The bound is small because a larger one would change the orientation the angles spell.
LOCK_MARGIN_RAD = 1e-13
_TAN_HALF_LOCK = math.tan(LOCK_MARGIN_RAD / 2)

_AXIS_INDEX = {"X": 0, "Y": 1, "Z": 2}


def _elementary_quaternions(axis_index, angle):
    q = np.zeros(np.shape(angle) + (4,), dtype=np.float64)
    q[..., 0] = np.cos(0.5 * angle)
    q[..., 1 + axis_index] = np.sin(0.5 * angle)
    return q


@_in_slices(1,)
def angles_to_quaternions(angles, sequence, intrinsic=True):
    """Quaternions of three angles (radians) about the axes of `sequence`.

    Intrinsic a1 a2 a3 (about the moving axes): R = R_a1(t1) R_a2(t2) R_a3(t3).
    Extrinsic a1 a2 a3 (about the fixed axes, in the order written): R = R_a3(t3) R_a2(t2) R_a1(t1)."""
    check_sequence_name(sequence)
    intrinsic = check_flag(intrinsic, "intrinsic")
    angles = np.asarray(angles, dtype=np.float64)
    parts = [_elementary_quaternions(_AXIS_INDEX[a], angles[..., i]) for i, a in enumerate(sequence)]
    if intrinsic:
        q = multiply_quaternions(multiply_quaternions(parts[0], parts[1]), parts[2])
    else:
        q = multiply_quaternions(multiply_quaternions(parts[2], parts[1]), parts[0])
    return canonical_quaternions(q)


def _sequence_terms(q, sequence, intrinsic):
    """The four terms a, b, c, d of Bernardes & Viollet (2022) for the extrinsic form of the sequence.

    An intrinsic sequence equals the extrinsic one with axes and angles reversed, so both are computed
    as extrinsic. For a proper Euler sequence (i, j, i) the missing axis k completes the triple; for a
    Tait–Bryan sequence the quaternion is first turned by 90 degrees about the middle axis, which makes
    it look like a proper Euler one."""
    check_sequence_name(sequence)
    intrinsic = check_flag(intrinsic, "intrinsic")
    axes = [_AXIS_INDEX[a] for a in sequence]
    if intrinsic:
        axes.reverse()
    i, j, k = axes
    proper = i == k
    if proper:
        k = 3 - i - j
    sign = (i - j) * (j - k) * (k - i) // 2
    parts = _parts(q)
    w, qi, qj, qk = parts[0], parts[1 + i], parts[1 + j], parts[1 + k] * sign
    if proper:
        return w, qi, qj, qk, proper, sign
    return w - qj, qi + qk, qj + w, qk - qi, proper, sign


def _wrap_half_open(angle):
    """Angles into (−pi, pi]."""
    # The inputs are sums of two atan2 results, so one turn either way is always enough.
    if type(angle) is float:
        angle = angle - 2.0 * np.pi if angle > np.pi else angle
        return angle + 2.0 * np.pi if angle <= -np.pi else angle
    angle = np.where(angle > np.pi, angle - 2.0 * np.pi, angle)
    return np.where(angle <= -np.pi, angle + 2.0 * np.pi, angle)


@_in_slices(1,)
def gimbal_margins(q, sequence, intrinsic=True):
    """Angular distance (radians) of the middle angle from its nearest singular value: 90° − |t2| for
    Tait–Bryan, min(t2, 180° − t2) for proper Euler. Computed from the half-angle terms directly so it
    keeps its accuracy right at the singularity."""
    q = np.asarray(q, dtype=np.float64)
    a, b, c, d, _, _ = _sequence_terms(q, sequence, intrinsic)
    h_ab, h_cd = _sqrt(a * a + b * b), _sqrt(c * c + d * d)
    return 2.0 * _arctan2(_minimum(h_ab, h_cd), _maximum(h_ab, h_cd))


@functools.lru_cache(maxsize=16)
def _terms_matrices(sequences: tuple, intrinsic: bool):
    """(S, 4, 4): for each sequence, the matrix taking a quaternion (w, x, y, z) to its terms a, b, c, d.
    The terms are signed sums of two components, linear in q, so their values on the four unit
    quaternions are the matrix; its entries are 0 and ±1, so the product gives the same bits."""
    basis = np.eye(4)
    return np.stack([np.stack(_sequence_terms(basis, s, intrinsic)[:4]) for s in sequences])


def gimbal_margins_of_sequences(q, sequences, intrinsic=True):
    """gimbal_margins for several sequences at once, (..., len(sequences)): one product and one pass for
    all of them, where a call per sequence costs its overhead twelve times (the meter's best-conditioned
    sequence is asked on every edit)."""
    sequences = tuple(sequences)
    if not sequences:
        raise SequenceError("no sequences given; expected at least one, such as 'ZYX'")
    matrices = _terms_matrices(sequences, check_flag(intrinsic, "intrinsic"))
    q = check_array(q, (4,), "quaternions")
    terms = np.einsum("stm,...m->...st", matrices, q)
    h_ab = np.sqrt(terms[..., 0] ** 2 + terms[..., 1] ** 2)
    h_cd = np.sqrt(terms[..., 2] ** 2 + terms[..., 3] ** 2)
    return 2.0 * np.arctan2(np.minimum(h_ab, h_cd), np.maximum(h_ab, h_cd))


@_in_slices(1,)
def quaternions_to_angles(q, sequence, intrinsic=True):
    """Three angles (radians) of `sequence` for each quaternion, and whether gimbal lock occurred.

    Ranges: t1, t3 in (−pi, pi]; t2 in [−pi/2, pi/2] (Tait–Bryan) or [0, pi] (proper Euler). In lock only
    t1 ± t3 is determined; then t3 = 0 and t1 takes the whole coupled angle (CONVENTIONS.md). The method
    is Bernardes & Viollet (2022), which works on the quaternion directly for all twelve sequences."""
    q = np.asarray(q, dtype=np.float64)
    a, b, c, d, proper, sign = _sequence_terms(q, sequence, intrinsic)
    # sqrt of squares rather than hypot: same accuracy for unit-scale input, several times faster.
    h_ab, h_cd = _sqrt(a * a + b * b), _sqrt(c * c + d * d)
    half_sum = _arctan2(b, a)
    half_diff = _arctan2(d, c)
    angles = np.empty(np.shape(a) + (3,), dtype=np.float64)
    first, third = (2, 0) if intrinsic else (0, 2)   # computed in the extrinsic order
    angles[..., first] = _wrap_half_open(half_sum - half_diff)
    outer = half_sum + half_diff
    angles[..., third] = _wrap_half_open(outer if proper else outer * sign)
    angles[..., 1] = 2.0 * _arctan2(h_cd, h_ab) - (0.0 if proper else 0.5 * np.pi)
    # margin < LOCK_MARGIN_RAD, written without a further arctan2
    locked = _minimum(h_ab, h_cd) < _TAN_HALF_LOCK * _maximum(h_ab, h_cd)
    if locked if type(locked) is bool else locked.any():
        angles[locked] = _locked_angles(q[locked], sequence, intrinsic, angles[locked, 1])
    return angles + 0.0, locked


def _locked_angles(q, sequence, intrinsic, middle):
    """In lock, set t3 = 0 and find t1 as the turn left about the first axis once the middle rotation is
    taken away: q1 = q ⊗ q2⁻¹ (intrinsic) or q2⁻¹ ⊗ q (extrinsic)."""
    first_axis = _AXIS_INDEX[sequence[0]]
    middle_q = _elementary_quaternions(_AXIS_INDEX[sequence[1]], middle)
    if intrinsic:
        rest = multiply_quaternions(q, conjugate_quaternions(middle_q))
    else:
        rest = multiply_quaternions(conjugate_quaternions(middle_q), q)
    first = _wrap_half_open(2.0 * np.arctan2(rest[..., 1 + first_axis], rest[..., 0]))
    return np.stack([first, middle, np.zeros_like(middle)], axis=-1)
