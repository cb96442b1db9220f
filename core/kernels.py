"""Vectorised conversions between orientation representations.

Every function takes arrays with any number of leading dimensions: a single quaternion has shape (4,), a
batch of a million has shape (1000000, 4); the same code serves both, with no Python loop over the batch.
Quaternions are Hamilton, stored w-first (w, x, y, z). Angles are radians here; degrees are the business of
the callers that talk to people. Matrices map body to reference: v_ref = R @ v_body.

The functions trust their input to be finite and of the right shape unless they say otherwise; the
`check_*` helpers at the top do that validation for callers that face users.
"""

import numpy as np

from core.errors import InvalidInputError, SequenceError

TAIT_BRYAN = ("XYZ", "XZY", "YXZ", "YZX", "ZXY", "ZYX")
PROPER_EULER = ("XYX", "XZX", "YXY", "YZY", "ZXZ", "ZYZ")
ALL_SEQUENCES = TAIT_BRYAN + PROPER_EULER

# Below this gimbal margin (radians) the first and third angles cannot be told apart in double precision
# without moving the orientation by more than about this much; we then report lock and set the third
# angle to zero. The bound is small because a larger one would change the orientation the angles spell.
LOCK_MARGIN_RAD = 1e-13

_AXIS_INDEX = {"X": 0, "Y": 1, "Z": 2}

# |w| at or below this is a half turn (see canonical_quaternions).
_HALF_TURN_W = 1.5e-15


# --- validation -------------------------------------------------------------------------------------

def check_array(values, trailing_shape, what):
    """Return `values` as a float64 array whose last dimensions are `trailing_shape`, all finite."""
    try:
        array = np.asarray(values, dtype=np.float64)
    except (TypeError, ValueError) as exc:
        raise InvalidInputError(f"{what}: expected numbers, got {values!r}") from exc
    n = len(trailing_shape)
    if array.ndim < n or array.shape[array.ndim - n:] != tuple(trailing_shape):
        expected = "(..., " + ", ".join(str(s) for s in trailing_shape) + ")"
        raise InvalidInputError(f"{what}: expected shape {expected}, got {array.shape}")
    if not np.isfinite(array).all():
        raise InvalidInputError(f"{what}: contains NaN or infinity; expected finite numbers")
    return array


def check_sequence_name(sequence):
    """Accept exactly one of the twelve canonical names ('ZYX', 'ZXZ', ...)."""
    if sequence not in ALL_SEQUENCES:
        raise SequenceError(
            f"unknown angle sequence {sequence!r}; expected one of {', '.join(ALL_SEQUENCES)}"
        )
    return sequence


# --- quaternion algebra -----------------------------------------------------------------------------

def normalize_quaternions(q):
    """Unit quaternions and the norms they had. A zero quaternion is refused."""
    q = np.asarray(q, dtype=np.float64)
    norms = np.sqrt(np.einsum("...i,...i->...", q, q))
    if np.any(norms == 0):
        raise InvalidInputError("quaternion of zero length; expected a non-zero (w, x, y, z)")
    return q / norms[..., None], norms


def canonical_quaternions(q):
    """The sign of q that CONVENTIONS.md calls canonical: w > 0, or w = 0 and the first non-zero of
    x, y, z positive. q and -q are the same orientation; this picks one spelling."""
    q = np.array(q, dtype=np.float64)
    w, x, y, z = q[..., 0], q[..., 1], q[..., 2], q[..., 3]
    # A half turn computed in floating point leaves w at about 1e-16 (cos(pi/2) is not 0): treat that as
    # the half turn it is, so its axis gets the canonical sign. Moves the orientation by < 3e-15 rad.
    half_turn = np.abs(w) <= _HALF_TURN_W
    w[half_turn] = 0.0
    first_vector = np.where(x != 0, x, np.where(y != 0, y, z))
    flip = (w < 0) | (half_turn & (first_vector < 0))
    # Adding 0.0 turns any -0.0 into +0.0, so no "-0" ever reaches a screen.
    return np.where(flip[..., None], -q, q) + 0.0


def multiply_quaternions(p, q):
    """Hamilton product p ⊗ q: the rotation q followed by p, i.e. matrix(p) @ matrix(q)."""
    p = np.asarray(p, dtype=np.float64)
    q = np.asarray(q, dtype=np.float64)
    pw, px, py, pz = p[..., 0], p[..., 1], p[..., 2], p[..., 3]
    qw, qx, qy, qz = q[..., 0], q[..., 1], q[..., 2], q[..., 3]
    shape = np.broadcast_shapes(p.shape, q.shape)
    out = np.empty(shape, dtype=np.float64)
    out[..., 0] = pw * qw - px * qx - py * qy - pz * qz
    out[..., 1] = pw * qx + px * qw + py * qz - pz * qy
    out[..., 2] = pw * qy - px * qz + py * qw + pz * qx
    out[..., 3] = pw * qz + px * qy - py * qx + pz * qw
    return out


def conjugate_quaternions(q):
    """The inverse of a unit quaternion."""
    q = np.asarray(q, dtype=np.float64)
    return q * np.array([1.0, -1.0, -1.0, -1.0])


def rotate_vectors(q, v):
    """v' = q v q*, computed as v + 2w (u × v) + 2 u × (u × v) with u the vector part."""
    q = np.asarray(q, dtype=np.float64)
    v = np.asarray(v, dtype=np.float64)
    w = q[..., :1]
    u = q[..., 1:]
    t = 2.0 * np.cross(u, v)
    return v + w * t + np.cross(u, t)


def angles_between(p, q):
    """Rotation angle (radians, in [0, pi]) of p⁻¹ ⊗ q, the turn that takes p onto q.

    atan2 of the vector and scalar parts keeps full accuracy near 0 and near pi, where an arccos of a
    dot product would lose half the digits."""
    d = multiply_quaternions(conjugate_quaternions(p), q)
    return 2.0 * np.arctan2(np.linalg.norm(d[..., 1:], axis=-1), np.abs(d[..., 0]))


# --- matrices ---------------------------------------------------------------------------------------

def quaternions_to_matrices(q):
    """Rotation matrices (body -> reference) of unit quaternions."""
    q = np.asarray(q, dtype=np.float64)
    w, x, y, z = q[..., 0], q[..., 1], q[..., 2], q[..., 3]
    xx, yy, zz = x * x, y * y, z * z
    xy, xz, yz = x * y, x * z, y * z
    wx, wy, wz = w * x, w * y, w * z
    m = np.empty(q.shape[:-1] + (3, 3), dtype=np.float64)
    m[..., 0, 0] = 1.0 - 2.0 * (yy + zz)
    m[..., 0, 1] = 2.0 * (xy - wz)
    m[..., 0, 2] = 2.0 * (xz + wy)
    m[..., 1, 0] = 2.0 * (xy + wz)
    m[..., 1, 1] = 1.0 - 2.0 * (xx + zz)
    m[..., 1, 2] = 2.0 * (yz - wx)
    m[..., 2, 0] = 2.0 * (xz - wy)
    m[..., 2, 1] = 2.0 * (yz + wx)
    m[..., 2, 2] = 1.0 - 2.0 * (xx + yy)
    return m


def matrices_to_quaternions(m):
    """Canonical unit quaternions of rotation matrices, by Shepperd's method in Markley's form: of the
    four ways to solve for the quaternion, take the one built on the largest of m00, m11, m22 and the
    trace, so the division is never by a small number. The input must already be a rotation; run
    `nearest_rotations` first on measured or rounded matrices."""
    m = np.asarray(m, dtype=np.float64)
    m00, m01, m02 = m[..., 0, 0], m[..., 0, 1], m[..., 0, 2]
    m10, m11, m12 = m[..., 1, 0], m[..., 1, 1], m[..., 1, 2]
    m20, m21, m22 = m[..., 2, 0], m[..., 2, 1], m[..., 2, 2]
    trace = m00 + m11 + m22
    s01, s02, s12 = m01 + m10, m02 + m20, m12 + m21
    d0, d1, d2 = m21 - m12, m02 - m20, m10 - m01
    choice = np.argmax(np.stack([m00, m11, m22, trace], axis=-1), axis=-1)
    q = np.empty(m.shape[:-2] + (4,), dtype=np.float64)
    q[..., 0] = np.choose(choice, [d0, d1, d2, 1.0 + trace])
    q[..., 1] = np.choose(choice, [1.0 + 2.0 * m00 - trace, s01, s02, d0])
    q[..., 2] = np.choose(choice, [s01, 1.0 + 2.0 * m11 - trace, s12, d1])
    q[..., 3] = np.choose(choice, [s02, s12, 1.0 + 2.0 * m22 - trace, d2])
    q /= np.sqrt(np.einsum("...i,...i->...", q, q))[..., None]
    return canonical_quaternions(q)


def determinants(m):
    """Determinants of 3x3 matrices by the triple product (cheaper than LU for a batch of 3x3)."""
    m = np.asarray(m, dtype=np.float64)
    a, b, c = m[..., :, 0], m[..., :, 1], m[..., :, 2]
    return np.einsum("...i,...i->...", a, np.cross(b, c))


def orthogonality_errors(m):
    """max |MᵀM − I| per matrix: how far the columns are from unit length and mutual perpendicularity."""
    m = np.asarray(m, dtype=np.float64)
    gram = np.matmul(np.swapaxes(m, -1, -2), m)
    gram[..., 0, 0] -= 1.0
    gram[..., 1, 1] -= 1.0
    gram[..., 2, 2] -= 1.0
    return np.abs(gram).reshape(gram.shape[:-2] + (9,)).max(axis=-1)


# Newton–Schulz is used while the error is below this; beyond, the iteration may not converge and the
# SVD takes over. Matrices that far off are refused for use anyway; the SVD only serves their report.
_NEWTON_SCHULZ_LIMIT = 0.25
_POLAR_TOLERANCE = 4e-16


def nearest_rotations(m):
    """The orthogonal polar factor of each matrix: the rotation closest to it in the least-squares
    (Frobenius) sense, with the input's orthogonality error and determinant.

    Near-orthogonal input (rounded drawings, measurement noise) takes the Newton–Schulz iteration
    X <- X (3I − XᵀX) / 2 (Higham 1986), which converges quadratically to the polar factor and needs only
    matrix products; the rest go through the SVD (U Vᵀ). A matrix with det <= 0 has no rotation nearby:
    its entry is returned as the SVD's orthogonal factor (det −1) and the caller must refuse it."""
    m = np.asarray(m, dtype=np.float64)
    error = orthogonality_errors(m)
    det = determinants(m)
    result = m.copy()
    near = (error <= _NEWTON_SCHULZ_LIMIT) & (det > 0)
    needs_work = near & (error > _POLAR_TOLERANCE)
    if np.any(needs_work):
        x = m[needs_work]
        for _ in range(12):
            gram = np.matmul(np.swapaxes(x, -1, -2), x)
            residual = np.abs(gram - np.eye(3)).max()
            if residual <= _POLAR_TOLERANCE:
                break
            x = 0.5 * np.matmul(x, 3.0 * np.eye(3) - gram)
        result[needs_work] = x
    far = ~near
    if np.any(far):
        u, _, vt = np.linalg.svd(m[far])
        result[far] = np.matmul(u, vt)
    return result, error, det


# --- rotation vectors and axis-angle ------------------------------------------------------------------

def quaternions_to_axis_angles(q):
    """Unit axis and angle in [0, pi] (radians) of canonical quaternions. The axis is (0, 0, 0) where the
    angle is exactly zero, because there it is undefined; at pi the canonical sign of q gives the axis
    whose first non-zero component is positive."""
    q = canonical_quaternions(q)
    v = q[..., 1:]
    s = np.linalg.norm(v, axis=-1)
    angle = 2.0 * np.arctan2(s, q[..., 0])
    safe = np.where(s > 0, s, 1.0)
    axis = np.where((s > 0)[..., None], v / safe[..., None], 0.0)
    return axis, angle


def axis_angles_to_quaternions(axis, angle):
    """Quaternions of a rotation by `angle` (radians) about `axis` (normalised here). A zero axis is
    accepted only with a zero angle, where it means "no rotation"."""
    axis = np.asarray(axis, dtype=np.float64)
    angle = np.asarray(angle, dtype=np.float64)
    length = np.linalg.norm(axis, axis=-1)
    if np.any((length == 0) & (angle != 0)):
        raise InvalidInputError("rotation axis of zero length; expected a non-zero direction (x, y, z)")
    unit = axis / np.where(length > 0, length, 1.0)[..., None]
    half = 0.5 * angle
    q = np.empty(np.broadcast_shapes(unit.shape[:-1], angle.shape) + (4,), dtype=np.float64)
    q[..., 0] = np.cos(half)
    q[..., 1:] = np.sin(half)[..., None] * unit
    return canonical_quaternions(q)


def quaternions_to_rotation_vectors(q):
    """Rotation vectors phi·n (radians) of quaternions, with phi in [0, pi]."""
    q = canonical_quaternions(q)
    v = q[..., 1:]
    s = np.linalg.norm(v, axis=-1)
    angle = 2.0 * np.arctan2(s, q[..., 0])
    # angle / s tends to 2 / w as s -> 0; atan2 keeps the ratio exact right down to the last bit.
    has_axis = s > 0
    factor = np.where(has_axis, angle / np.where(has_axis, s, 1.0), 2.0 / np.where(has_axis, 1.0, q[..., 0]))
    return v * factor[..., None]


def rotation_vectors_to_quaternions(rv):
    """Quaternions of rotation vectors (radians). sin(phi/2)/phi is taken through numpy's sinc so the
    zero vector needs no special case."""
    rv = np.asarray(rv, dtype=np.float64)
    angle = np.linalg.norm(rv, axis=-1)
    q = np.empty(rv.shape[:-1] + (4,), dtype=np.float64)
    q[..., 0] = np.cos(0.5 * angle)
    q[..., 1:] = (0.5 * np.sinc(angle / (2.0 * np.pi)))[..., None] * rv
    return canonical_quaternions(q)


# --- angle sequences ----------------------------------------------------------------------------------

def _elementary_quaternions(axis_index, angle):
    q = np.zeros(np.shape(angle) + (4,), dtype=np.float64)
    q[..., 0] = np.cos(0.5 * angle)
    q[..., 1 + axis_index] = np.sin(0.5 * angle)
    return q


def angles_to_quaternions(angles, sequence, intrinsic=True):
    """Quaternions of three angles (radians) about the axes of `sequence`.

    Intrinsic a1 a2 a3 (about the moving axes): R = R_a1(t1) R_a2(t2) R_a3(t3).
    Extrinsic a1 a2 a3 (about the fixed axes, in the order written): R = R_a3(t3) R_a2(t2) R_a1(t1)."""
    check_sequence_name(sequence)
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
    axes = [_AXIS_INDEX[a] for a in sequence]
    if intrinsic:
        axes.reverse()
    i, j, k = axes
    proper = i == k
    if proper:
        k = 3 - i - j
    sign = (i - j) * (j - k) * (k - i) // 2
    w, qi, qj, qk = q[..., 0], q[..., 1 + i], q[..., 1 + j], q[..., 1 + k] * sign
    if proper:
        return w, qi, qj, qk, proper, sign
    return w - qj, qi + qk, qj + w, qk - qi, proper, sign


def _wrap_half_open(angle):
    """Angles into (−pi, pi]."""
    wrapped = np.remainder(angle + np.pi, 2.0 * np.pi) - np.pi
    return np.where(wrapped <= -np.pi, wrapped + 2.0 * np.pi, wrapped)


def gimbal_margins(q, sequence, intrinsic=True):
    """Angular distance (radians) of the middle angle from its nearest singular value: 90° − |t2| for
    Tait–Bryan, min(t2, 180° − t2) for proper Euler. Computed from the half-angle terms directly so it
    keeps its accuracy right at the singularity."""
    q = np.asarray(q, dtype=np.float64)
    a, b, c, d, _, _ = _sequence_terms(q, sequence, intrinsic)
    h_ab, h_cd = np.hypot(a, b), np.hypot(c, d)
    return 2.0 * np.arctan2(np.minimum(h_ab, h_cd), np.maximum(h_ab, h_cd))


def quaternions_to_angles(q, sequence, intrinsic=True):
    """Three angles (radians) of `sequence` for each quaternion, and whether gimbal lock occurred.

    Ranges: t1, t3 in (−pi, pi]; t2 in [−pi/2, pi/2] (Tait–Bryan) or [0, pi] (proper Euler). In lock only
    t1 ± t3 is determined; then t3 = 0 and t1 takes the whole coupled angle (CONVENTIONS.md). The method
    is Bernardes & Viollet (2022), which works on the quaternion directly for all twelve sequences."""
    q = np.asarray(q, dtype=np.float64)
    a, b, c, d, proper, sign = _sequence_terms(q, sequence, intrinsic)
    h_ab, h_cd = np.hypot(a, b), np.hypot(c, d)
    middle = 2.0 * np.arctan2(h_cd, h_ab)
    half_sum = np.arctan2(b, a)
    half_diff = np.arctan2(d, c)
    first = half_sum - half_diff
    third = half_sum + half_diff
    if not proper:
        third = third * sign
        middle = middle - 0.5 * np.pi
    angles = np.stack([first, middle, third], axis=-1)   # in the extrinsic order
    if intrinsic:
        angles = angles[..., ::-1]
    margin = 2.0 * np.arctan2(np.minimum(h_ab, h_cd), np.maximum(h_ab, h_cd))
    locked = margin < LOCK_MARGIN_RAD
    if np.any(locked):
        angles = np.array(angles)   # own the memory before writing the lock convention into it
        angles[locked] = _locked_angles(q[locked], sequence, intrinsic, angles[locked, 1])
    angles[..., 0] = _wrap_half_open(angles[..., 0])
    angles[..., 2] = _wrap_half_open(angles[..., 2])
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
    first = 2.0 * np.arctan2(rest[..., 1 + first_axis], rest[..., 0])
    return np.stack([first, middle, np.zeros_like(middle)], axis=-1)
