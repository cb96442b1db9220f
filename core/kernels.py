"""Vectorised conversions between orientation representations.

Every function takes arrays with any number of leading dimensions: a single quaternion has shape (4,), a
batch of a million has shape (1000000, 4); the same code serves both, with no Python loop over the batch.
Quaternions are Hamilton, stored w-first (w, x, y, z). Angles are radians here; degrees are the business of
the callers that talk to people. Matrices map body to reference: v_ref = R @ v_body.

The functions trust their input to be finite and of the right shape unless they say otherwise; the
`check_*` helpers at the top do that validation for callers that face users.
"""

import functools
import math

import numpy as np

from core.errors import FlagTypeError, InvalidInputError, SequenceError

TAIT_BRYAN = ("XYZ", "XZY", "YXZ", "YZX", "ZXY", "ZYX")
PROPER_EULER = ("XYX", "XZX", "YXY", "YZY", "ZXZ", "ZYZ")
ALL_SEQUENCES = TAIT_BRYAN + PROPER_EULER

# Below this gimbal margin (radians) the first and third angles cannot be told apart in double precision
# without moving the orientation by more than about this much; we then report lock and set the third
# angle to zero. The bound is small because a larger one would change the orientation the angles spell.
LOCK_MARGIN_RAD = 1e-13
_TAN_HALF_LOCK = math.tan(LOCK_MARGIN_RAD / 2)

_AXIS_INDEX = {"X": 0, "Y": 1, "Z": 2}

# |w| at or below this is a half turn (see canonical_quaternions).
_HALF_TURN_W = 1.5e-15


# Batches are processed in slices of this many orientations, so that every temporary array stays in the
# processor's cache: for a million orientations this is several times faster than whole-array passes.
_CHUNK = 4096


def _in_slices(*trailing_ndims, fills=None):
    """Run a kernel slice by slice over the leading dimension of its array arguments.

    `trailing_ndims` gives, for each leading positional array argument, how many of its last dimensions
    belong to one orientation (1 for a quaternion, 2 for a matrix, 0 for an angle). Small inputs, and
    inputs whose leading shapes differ (broadcasting), go straight through. A kernel that takes `out=`
    says the shape of one result with `fills`, and then writes each slice straight into the result."""

    def wrap(kernel):
        count = len(trailing_ndims)

        @functools.wraps(kernel)
        def run(*args, **kwargs):
            first = args[0]
            if type(first) is not np.ndarray:
                first = np.asarray(first, dtype=np.float64)
            lead = first.shape[:first.ndim - trailing_ndims[0]]
            n = math.prod(lead)
            if n <= _CHUNK:   # the common case of one orientation: straight through, nothing to slice
                return kernel(first, *args[1:], **kwargs)
            arrays = [first] + [np.asarray(a, dtype=np.float64) for a in args[1:count]]
            rest = args[count:]
            if any(a.shape[:a.ndim - t] != lead for a, t in zip(arrays[1:], trailing_ndims[1:])):
                return kernel(*arrays, *rest, **kwargs)
            flat = [a.reshape((n,) + a.shape[a.ndim - t:]) for a, t in zip(arrays, trailing_ndims)]
            if fills is not None:
                result = np.empty((n,) + fills, dtype=np.float64)
                for start in range(0, n, _CHUNK):
                    stop = min(start + _CHUNK, n)
                    kernel(*[f[start:stop] for f in flat], *rest, out=result[start:stop], **kwargs)
                return result.reshape(lead + fills)
            outputs, single = None, True
            for start in range(0, n, _CHUNK):
                stop = min(start + _CHUNK, n)
                part = kernel(*[f[start:stop] for f in flat], *rest, **kwargs)
                single = not isinstance(part, tuple)
                parts = (part,) if single else part
                if outputs is None:
                    outputs = [np.empty((n,) + p.shape[1:], dtype=p.dtype) for p in parts]
                for out, p in zip(outputs, parts):
                    out[start:stop] = p
            outputs = [out.reshape(lead + out.shape[1:]) for out in outputs]
            return outputs[0] if single else tuple(outputs)

        return run

    return wrap


# --- validation -------------------------------------------------------------------------------------

def check_array(values, trailing_shape, what):
    """Return `values` as a float64 array whose last dimensions are `trailing_shape`, all finite."""
    try:
        array = np.asarray(values, dtype=np.float64)
    except OverflowError as exc:   # an integer of hundreds of digits
        raise InvalidInputError(f"{what}: a number is beyond the range of a double (about 1.8e308); "
                                f"expected finite numbers") from exc
    except (TypeError, ValueError) as exc:
        raise InvalidInputError(f"{what}: expected numbers, got {shortened_repr(values)}") from exc
    n = len(trailing_shape)
    if array.ndim < n or array.shape[array.ndim - n:] != tuple(trailing_shape):
        expected = "(..., " + ", ".join(str(s) for s in trailing_shape) + ")"
        raise InvalidInputError(f"{what}: expected shape {expected}, got {array.shape}")
    if not np.isfinite(array).all():
        raise InvalidInputError(f"{what}: contains NaN or infinity; expected finite numbers")
    return array


def check_flag(value, name):
    """`value` as a Python bool; anything but True or False (numpy's booleans included) is refused, so
    None, 0, 1 or "yes" never stand for a convention by their truth value."""
    if isinstance(value, (bool, np.bool_)):
        return bool(value)
    raise FlagTypeError(f"{name}={value!r}: expected True or False")


def unit_vectors(v, what="direction"):
    """Unit vectors of `v` (..., n) and their lengths, scaled by the largest component first so that
    components of 1e200 or 1e-200 neither overflow nor underflow. A length beyond the largest double
    comes back as inf (the direction is still right); a zero vector is refused, naming its number
    (counted from 1)."""
    v = np.asarray(v, dtype=np.float64)
    scale = np.abs(v).max(axis=-1, keepdims=True)
    zero = scale[..., 0] == 0
    if np.any(zero):
        at = f" {int(np.argmax(zero.ravel())) + 1}" if v.ndim > 1 else ""   # counted from 1, as rows are
        raise InvalidInputError(f"{what}{at} has zero length; expected a non-zero (x, y, z)")
    scaled = v / scale
    norms = np.sqrt(np.einsum("...i,...i->...", scaled, scaled))[..., None]
    with np.errstate(over="ignore"):
        lengths = (scale * norms)[..., 0]
    return scaled / norms, lengths


def shortened_repr(values, limit=80):
    """repr of user input for a message, cut to `limit` characters (input can be of any length)."""
    text = repr(values)
    return text if len(text) <= limit else text[:limit] + "…"


def check_sequence_name(sequence):
    """Accept exactly one of the twelve canonical names ('ZYX', 'ZXZ', ...)."""
    if sequence not in ALL_SEQUENCES:
        raise SequenceError(
            f"unknown angle sequence {sequence!r}; expected one of {', '.join(ALL_SEQUENCES)}"
        )
    return sequence


def _parts(a):
    """The components along the last axis: views for a batch, Python floats for a single value. Same
    IEEE arithmetic either way; on floats it costs a fraction of numpy scalar arithmetic (and a tenth of
    0-d arrays), which matters on the path of every edit. Divisions that may meet a zero use np.divide,
    so a float never raises where an array would give inf."""
    if a.ndim == 1:
        return tuple(a.tolist())
    return tuple(a[..., i] for i in range(a.shape[-1]))


def _on_floats_or_arrays(array_function, float_function):
    """One function for both kinds of _parts: the math module's on Python floats (one orientation),
    numpy's on arrays."""
    return lambda *args: float_function(*args) if type(args[0]) is float else array_function(*args)


_sqrt = _on_floats_or_arrays(np.sqrt, math.sqrt)
_arctan2 = _on_floats_or_arrays(np.arctan2, math.atan2)
_minimum = _on_floats_or_arrays(np.minimum, min)
_maximum = _on_floats_or_arrays(np.maximum, max)


# --- quaternion algebra -----------------------------------------------------------------------------

@_in_slices(1,)
def normalize_quaternions(q):
    """Unit quaternions and the norms they had. A zero quaternion is refused."""
    q = np.asarray(q, dtype=np.float64)
    norms = np.sqrt(np.einsum("...i,...i->...", q, q))
    extreme = ~((norms > 1e-150) & (norms < 1e150))
    if np.any(extreme):
        # Scale by the largest component first, so 1e200 or 1e-200 neither overflows nor underflows.
        scale = np.abs(q).max(axis=-1)
        if np.any(scale == 0):
            raise InvalidInputError("quaternion of zero length; expected a non-zero (w, x, y, z)")
        q = np.where(extreme[..., None], q / np.where(extreme, scale, 1.0)[..., None], q)
        lengths = np.sqrt(np.einsum("...i,...i->...", q, q))
        return q / lengths[..., None], np.where(extreme, scale * lengths, norms)
    # A quaternion already unit to the last bit is kept exactly as it is, so reading a saved value back
    # (or normalising twice) never moves it.
    return q / np.where(np.abs(norms - 1.0) <= 4.5e-16, 1.0, norms)[..., None], norms


@_in_slices(1,)
def canonical_quaternions(q):
    """The sign of q that CONVENTIONS.md calls canonical: w > 0, or w = 0 and the first non-zero of
    x, y, z positive. q and -q are the same orientation; this picks one spelling."""
    q = np.asarray(q, dtype=np.float64)
    # A half turn computed in floating point leaves w, and often an axis component, at about 1e-16 (cos(pi/2)
    # is not 0): treat those as the zeros they are, so the axis gets the canonical sign and no rounding dust
    # decides it. Moves the orientation by < 3e-15 rad.
    half_turn = np.abs(q[..., 0]) <= _HALF_TURN_W
    q = np.where(half_turn[..., None] & (np.abs(q) <= _HALF_TURN_W), 0.0, q)
    w, x, y, z = _parts(q)
    first_vector = np.where(x != 0, x, np.where(y != 0, y, z))
    flip = np.where(half_turn, first_vector < 0, w < 0)
    # Adding 0.0 turns any -0.0 into +0.0, so no "-0" ever reaches a screen.
    return np.where(flip[..., None], -q, q) + 0.0


@_in_slices(1, 1, fills=(4,))
def multiply_quaternions(p, q, out=None):
    """Hamilton product p ⊗ q: the rotation q followed by p, i.e. matrix(p) @ matrix(q)."""
    p = np.asarray(p, dtype=np.float64)
    q = np.asarray(q, dtype=np.float64)
    pw, px, py, pz = _parts(p)
    qw, qx, qy, qz = _parts(q)
    if out is None:
        out = np.empty(np.broadcast_shapes(p.shape, q.shape), dtype=np.float64)
    # Each component is a sum of four products, accumulated in place; the last operation writes straight
    # into the result.
    t = pw * qw
    t -= px * qx
    t -= py * qy
    np.subtract(t, pz * qz, out=out[..., 0])
    t = pw * qx
    t += px * qw
    t += py * qz
    np.subtract(t, pz * qy, out=out[..., 1])
    t = pw * qy
    t -= px * qz
    t += py * qw
    np.add(t, pz * qx, out=out[..., 2])
    t = pw * qz
    t += px * qy
    t -= py * qx
    np.add(t, pz * qw, out=out[..., 3])
    return out


@_in_slices(1,)
def conjugate_quaternions(q):
    """The inverse of a unit quaternion."""
    q = np.asarray(q, dtype=np.float64)
    return q * np.array([1.0, -1.0, -1.0, -1.0])


@_in_slices(1, 1, fills=(3,))
def rotate_vectors(q, v, out=None):
    """v' = q v q*, computed as v + w t + u × t with t = 2 u × v and u the vector part (unit q), written
    out component by component: np.cross costs several times these few products on a batch."""
    q = np.asarray(q, dtype=np.float64)
    v = np.asarray(v, dtype=np.float64)
    w, x, y, z = _parts(q)
    a, b, c = _parts(v)
    tx = y * c
    tx -= z * b
    tx += tx
    ty = z * a
    ty -= x * c
    ty += ty
    tz = x * b
    tz -= y * a
    tz += tz
    if out is None:
        out = np.empty(np.broadcast_shapes(q.shape[:-1], v.shape[:-1]) + (3,), dtype=np.float64)
    for i, (vi, ti, cross) in enumerate(((a, tx, (y, tz, z, ty)), (b, ty, (z, tx, x, tz)),
                                          (c, tz, (x, ty, y, tx)))):
        r = w * ti
        r += vi
        r += cross[0] * cross[1]
        np.subtract(r, cross[2] * cross[3], out=out[..., i])
    return out


@_in_slices(1, 1)
def angles_between(p, q):
    """Rotation angle (radians, in [0, pi]) of p⁻¹ ⊗ q, the turn that takes p onto q.

    atan2 of the vector and scalar parts keeps full accuracy near 0 and near pi, where an arccos of a
    dot product would lose half the digits."""
    d = multiply_quaternions(conjugate_quaternions(p), q)
    return 2.0 * np.arctan2(np.linalg.norm(d[..., 1:], axis=-1), np.abs(d[..., 0]))


# --- matrices ---------------------------------------------------------------------------------------

@_in_slices(1, fills=(3, 3))
def quaternions_to_matrices(q, out=None):
    """Rotation matrices (body -> reference) of quaternions. Any non-zero length is accepted: the
    normalisation is folded into the factor s = 2 / |q|² (Shoemake's form), with no square root."""
    q = np.asarray(q, dtype=np.float64)
    w, x, y, z = _parts(q)
    s = w * w
    s += x * x
    s += y * y
    s += z * z
    s = np.divide(2.0, s)
    xs, ys, zs = x * s, y * s, z * s
    m = np.empty(q.shape[:-1] + (3, 3), dtype=np.float64) if out is None else out
    if q.ndim == 1:   # one orientation: scalar arithmetic, then one small array
        wx, wy, wz, xx, xy, xz, yy, yz, zz = w * xs, w * ys, w * zs, x * xs, x * ys, x * zs, y * ys, y * zs, z * zs
        m[...] = ((1.0 - (yy + zz), xy - wz, xz + wy), (xy + wz, 1.0 - (xx + zz), yz - wx),
                  (xz - wy, yz + wx, 1.0 - (xx + yy)))
        return m
    # Each entry is written straight into the result (no temporary and copy per entry).
    xx, yy, zz = x * xs, y * ys, z * zs
    for (i, j), (a, b) in (((0, 0), (yy, zz)), ((1, 1), (xx, zz)), ((2, 2), (xx, yy))):
        t = a + b
        np.subtract(1.0, t, out=m[..., i, j])
    # (entry of t − c, entry of t + c, t, c): m01 = xy − wz, m10 = xy + wz, and so on.
    for minus, plus, t, c in (((0, 1), (1, 0), x * ys, w * zs), ((2, 0), (0, 2), x * zs, w * ys),
                              ((1, 2), (2, 1), y * zs, w * xs)):
        np.subtract(t, c, out=m[(Ellipsis,) + minus])
        np.add(t, c, out=m[(Ellipsis,) + plus])
    return m


@_in_slices(2, fills=(4,))
def matrices_to_quaternions(m, out=None):
    """Canonical unit quaternions of rotation matrices, by Shepperd's method in Markley's form: of the
    four ways to solve for the quaternion, take the one built on the largest of m00, m11, m22 and the
    trace, so the division is never by a small number. The input must already be a rotation; run
    `nearest_rotations` first on measured or rounded matrices."""
    m = np.asarray(m, dtype=np.float64)
    lead = m.shape[:-2]
    n = math.prod(lead)
    if n == 1:
        return _matrix_to_quaternion(m.reshape(9).tolist()).reshape(lead + (4,))
    # One copy to rows of nine entries: every later pass then reads contiguous memory, which halves
    # the cost of each of them against reading the entries 72 bytes apart.
    e = np.ascontiguousarray(m.reshape(n, 9).T)
    m00, m01, m02, m10, m11, m12, m20, m21, m22 = e
    # The 4x4 matrix K of Markley's form (K = 4 q qᵀ for an exact rotation), row by row: row c is the
    # unnormalised quaternion solved on candidate c (trace last). Only the chosen row is kept below.
    k = np.empty((4, 4, n), dtype=np.float64)
    trace = m00 + m11
    trace += m22
    np.add(trace, 1.0, out=k[3, 0])
    diagonal = k.reshape(16, n)[1:12:5]          # k[0, 1], k[1, 2], k[2, 3]
    np.multiply(e[0::4], 2.0, out=diagonal)
    diagonal += 1.0 - trace
    np.subtract(m21, m12, out=k[3, 1])
    np.subtract(m02, m20, out=k[3, 2])
    np.subtract(m10, m01, out=k[3, 3])
    k[0:3, 0] = k[3, 1:]
    np.add(m01, m10, out=k[0, 2])
    np.add(m02, m20, out=k[0, 3])
    np.add(m12, m21, out=k[1, 3])
    k[1, 1] = k[0, 2]
    k[2, 1] = k[0, 3]
    k[2, 2] = k[1, 3]
    # The largest of m00, m11, m22, trace; ties go to the earlier one.
    larger_11 = m11 > m00
    largest = np.maximum(m00, m11)
    larger_22 = m22 > largest
    np.maximum(largest, m22, out=largest)
    # Row index of the chosen candidate for each matrix, then one gather of its four entries.
    choice = np.where(larger_22, 8 * n, larger_11 * (4 * n))
    choice[trace > largest] = 12 * n
    q = np.take(k, _row_offsets(n) + choice)
    out = np.empty(lead + (4,), dtype=np.float64) if out is None else out
    _store_canonical(q, out.reshape(n, 4).T)
    return out


@functools.lru_cache(maxsize=4)
def _row_offsets(n):
    """Flat offsets j·n + i of entry j of orientation i in a (4, n) block (for gathers)."""
    offsets = np.arange(4 * n, dtype=np.intp).reshape(4, n)
    offsets.setflags(write=False)
    return offsets


def _matrix_to_quaternion(entries):
    """The same method for one matrix, on Python floats: the chosen row of K alone, then one small array."""
    m00, m01, m02, m10, m11, m12, m20, m21, m22 = entries
    trace = m00 + m11 + m22
    largest = max(m00, m11, m22)              # ties go to the earlier one, as in the batch above
    if trace > largest:
        q = (1.0 + trace, m21 - m12, m02 - m20, m10 - m01)
    elif m00 == largest:
        q = (m21 - m12, 2.0 * m00 + (1.0 - trace), m01 + m10, m02 + m20)
    elif m11 == largest:
        q = (m02 - m20, m01 + m10, 2.0 * m11 + (1.0 - trace), m12 + m21)
    else:
        q = (m10 - m01, m02 + m20, m12 + m21, 2.0 * m22 + (1.0 - trace))
    scale = math.copysign(1.0 / math.sqrt(q[0] * q[0] + q[1] * q[1] + q[2] * q[2] + q[3] * q[3]), q[0])
    out = np.array([c * scale + 0.0 for c in q])    # as _store_canonical does for a batch
    return canonical_quaternions(out) if abs(out[0]) <= _HALF_TURN_W else out


def _store_canonical(q, out):
    """Write the unit quaternions of `q` (rows w, x, y, z of any length) into `out` (the same shape,
    often a transposed view of the result) with the canonical sign, folded into the normalisation: the
    sign of w decides, except at a half turn (|w| tiny), where canonical_quaternions settles it."""
    scale = np.add.reduce(q * q, axis=0)
    np.sqrt(scale, out=scale)
    np.divide(1.0, scale, out=scale)
    np.copysign(scale, q[0], out=scale)
    np.multiply(q, scale, out=out)
    out += 0.0                                   # no -0.0 reaches a screen
    half_turn = np.abs(out[0]) <= _HALF_TURN_W
    if half_turn.any():
        out[:, half_turn] = canonical_quaternions(out[:, half_turn].T).T


def _entries(m):
    """The nine entries of each 3x3 matrix, row by row, as separate arrays (views, no copy)."""
    return _parts(m.reshape(m.shape[:-2] + (9,)))


def _gram(e):
    """The six distinct entries of MᵀM (column dot products): g00, g11, g22, g01, g02, g12."""
    m00, m01, m02, m10, m11, m12, m20, m21, m22 = e
    return (m00 * m00 + m10 * m10 + m20 * m20,
            m01 * m01 + m11 * m11 + m21 * m21,
            m02 * m02 + m12 * m12 + m22 * m22,
            m00 * m01 + m10 * m11 + m20 * m21,
            m00 * m02 + m10 * m12 + m20 * m22,
            m01 * m02 + m11 * m12 + m21 * m22)


def _gram_error(g):
    g00, g11, g22, g01, g02, g12 = g
    error = np.maximum(np.abs(g00 - 1.0), np.abs(g11 - 1.0))
    error = np.maximum(error, np.abs(g22 - 1.0))
    error = np.maximum(error, np.abs(g01))
    error = np.maximum(error, np.abs(g02))
    return np.maximum(error, np.abs(g12))


def _determinant(e):
    m00, m01, m02, m10, m11, m12, m20, m21, m22 = e
    return (m00 * (m11 * m22 - m12 * m21) - m01 * (m10 * m22 - m12 * m20)
            + m02 * (m10 * m21 - m11 * m20))


@_in_slices(2,)
def determinants(m):
    """Determinants of 3x3 matrices, written out (cheaper than an LU factorisation for a batch of 3x3)."""
    return _determinant(_entries(np.asarray(m, dtype=np.float64)))


@_in_slices(2,)
def orthogonality_errors(m):
    """max |MᵀM − I| per matrix: how far the columns are from unit length and mutual perpendicularity."""
    return _gram_error(_gram(_entries(np.asarray(m, dtype=np.float64))))


# Newton–Schulz is used while the error is below this; beyond, the iteration may not converge and the
# SVD takes over. Matrices that far off are refused for use anyway; the SVD only serves their report.
_NEWTON_SCHULZ_LIMIT = 0.25
# Rounding alone leaves |MᵀM − I| at a few 1e-16 for an exact rotation; below this we call it converged.
_POLAR_TOLERANCE = 1e-14


def _newton_schulz_step(e, g):
    """X (3I − XᵀX) / 2 = X H with H = 1.5 I − 0.5 G, entry by entry."""
    m00, m01, m02, m10, m11, m12, m20, m21, m22 = e
    g00, g11, g22, g01, g02, g12 = g
    h00, h11, h22 = 1.5 - 0.5 * g00, 1.5 - 0.5 * g11, 1.5 - 0.5 * g22
    h01, h02, h12 = -0.5 * g01, -0.5 * g02, -0.5 * g12
    return (m00 * h00 + m01 * h01 + m02 * h02, m00 * h01 + m01 * h11 + m02 * h12,
            m00 * h02 + m01 * h12 + m02 * h22,
            m10 * h00 + m11 * h01 + m12 * h02, m10 * h01 + m11 * h11 + m12 * h12,
            m10 * h02 + m11 * h12 + m12 * h22,
            m20 * h00 + m21 * h01 + m22 * h02, m20 * h01 + m21 * h11 + m22 * h12,
            m20 * h02 + m21 * h12 + m22 * h22)


@_in_slices(2,)
def nearest_rotations(m):
    """The orthogonal polar factor of each matrix: the rotation closest to it in the least-squares
    (Frobenius) sense, with the input's orthogonality error and determinant.

    Near-orthogonal input (rounded drawings, measurement noise) takes the Newton–Schulz iteration
    X <- X (3I − XᵀX) / 2 (Higham 1986), which converges quadratically to the polar factor and needs only
    products; the rest go through the SVD (U Vᵀ). A matrix with det <= 0 has no rotation nearby: its
    entry is returned as the SVD's orthogonal factor (det −1) and the caller must refuse it."""
    m = np.asarray(m, dtype=np.float64)
    entries = _entries(m)
    gram = _gram(entries)
    error = _gram_error(gram)
    det = _determinant(entries)
    near = (error <= _NEWTON_SCHULZ_LIMIT) & (det > 0)
    if np.all(error <= _POLAR_TOLERANCE):
        return m.copy(), error, det
    x, g, residual = entries, gram, error
    for _ in range(12):
        if np.max(np.where(near, residual, 0.0)) <= _POLAR_TOLERANCE:
            break
        x = _newton_schulz_step(x, g)
        g = _gram(x)
        residual = _gram_error(g)
    result = np.stack(x, axis=-1).reshape(m.shape)
    far = ~near
    if np.any(far):
        u, _, vt = np.linalg.svd(m[far])
        result[far] = np.matmul(u, vt)
    return result, error, det


# --- rotation vectors and axis-angle ------------------------------------------------------------------

@_in_slices(1,)
def quaternions_to_axis_angles(q, assume_canonical=False):
    """Unit axis and angle in [0, pi] (radians) of quaternions. The axis is (0, 0, 0) where the angle is
    exactly zero, because there it is undefined; at pi the canonical sign of q gives the axis whose first
    non-zero component is positive. assume_canonical=True skips that sign step for input that already
    has it (an Orientation's own quaternion)."""
    q = np.asarray(q, dtype=np.float64) if assume_canonical else canonical_quaternions(q)
    w, x, y, z, s, angle = _vector_length_and_angle(q)
    axis = np.zeros(q.shape[:-1] + (3,), dtype=np.float64)
    if q.ndim == 1:
        if s > 0:
            axis[:] = (x / s, y / s, z / s)
        return axis, angle
    has_axis = s > 0
    for i, c in enumerate((x, y, z)):
        np.divide(c, s, out=axis[..., i], where=has_axis)
    return axis, angle


def _vector_length_and_angle(q):
    """w, x, y, z, the length s of the vector part and the angle 2 atan2(s, w) of quaternions."""
    w, x, y, z = _parts(q)
    s = x * x
    s += y * y
    s += z * z
    s = _sqrt(s)
    return w, x, y, z, s, 2.0 * _arctan2(s, w)


@_in_slices(1, 0)
def axis_angles_to_quaternions(axis, angle):
    """Quaternions of a rotation by `angle` (radians) about `axis` (normalised here). A zero axis is
    accepted only with a zero angle, where it means "no rotation"."""
    axis = np.asarray(axis, dtype=np.float64)
    angle = np.asarray(angle, dtype=np.float64)
    scale = np.abs(axis).max(axis=-1)   # scaled first: an axis of 1e200 neither overflows nor is lost
    if np.any((scale == 0) & (angle != 0)):
        raise InvalidInputError("rotation axis of zero length; expected a non-zero direction (x, y, z)")
    axis = axis / np.where(scale > 0, scale, 1.0)[..., None]
    length = np.linalg.norm(axis, axis=-1)
    unit = axis / np.where(length > 0, length, 1.0)[..., None]
    half = 0.5 * angle
    q = np.empty(np.broadcast_shapes(unit.shape[:-1], angle.shape) + (4,), dtype=np.float64)
    q[..., 0] = np.cos(half)
    q[..., 1:] = np.sin(half)[..., None] * unit
    return canonical_quaternions(q)


@_in_slices(1, fills=(3,))
def quaternions_to_rotation_vectors(q, assume_canonical=False, out=None):
    """Rotation vectors phi·n (radians) of quaternions, with phi in [0, pi] (assume_canonical: as for
    quaternions_to_axis_angles)."""
    q = np.asarray(q, dtype=np.float64) if assume_canonical else canonical_quaternions(q)
    w, x, y, z, s, angle = _vector_length_and_angle(q)
    # angle / s tends to 2 / w as s -> 0; atan2 keeps the ratio exact right down to the last bit.
    if q.ndim == 1:
        factor = angle / s if s > 0 else float(np.divide(2.0, w))
        return np.array((x * factor, y * factor, z * factor))
    has_axis = s > 0
    factor = np.empty_like(s)
    np.divide(angle, s, out=factor, where=has_axis)
    np.divide(2.0, w, out=factor, where=~has_axis)
    if out is None:
        out = np.empty(q.shape[:-1] + (3,), dtype=np.float64)
    for i, c in enumerate((x, y, z)):
        np.multiply(c, factor, out=out[..., i])
    return out


# Below this angle (radians) sin(phi/2)/phi is taken from its series 1/2 − phi²/48, whose next term is
# below 1e-20 relative there; above it the quotient itself is exact to rounding.
_SERIES_ANGLE = 1e-4


@_in_slices(1, fills=(4,))
def rotation_vectors_to_quaternions(rv, out=None):
    """Canonical quaternions of rotation vectors (radians). cos and sin are taken of the same half angle,
    so the result is unit to rounding for any length and needs no second normalisation; a vector longer
    than a half turn gives w < 0, and the sign is folded into the same products."""
    rv = np.asarray(rv, dtype=np.float64)
    x, y, z = _parts(rv)
    squared = x * x
    squared += y * y
    squared += z * z
    angle = np.sqrt(squared)
    half = 0.5 * angle
    w = np.cos(half)
    # sin(phi/2)/phi, from the series near zero (and at zero, where the quotient is 0/0)
    ratio = 0.5 - squared / 48.0
    if np.ndim(angle) == 0:
        if angle >= _SERIES_ANGLE:
            ratio = np.sin(half) / angle
    else:
        large = angle >= _SERIES_ANGLE
        np.divide(np.sin(half), angle, out=ratio, where=large)
    ratio = np.copysign(ratio, w)                # w < 0 beyond a half turn: take -q
    if out is None:
        out = np.empty(rv.shape[:-1] + (4,), dtype=np.float64)
    np.abs(w, out=out[..., 0])
    for i, c in enumerate((x, y, z), start=1):
        np.multiply(c, ratio, out=out[..., i])
    out += 0.0                                   # no -0.0 reaches a screen
    half_turn = np.abs(out[..., 0]) <= _HALF_TURN_W
    if np.any(half_turn):
        out[half_turn] = canonical_quaternions(out[half_turn])
    return out


# --- angle sequences ----------------------------------------------------------------------------------

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
