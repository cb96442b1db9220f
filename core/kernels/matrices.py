"""Rotation matrices on arrays (..., 3, 3): from and to quaternions, determinants, orthogonality errors
and the nearest rotation."""

import functools
import math

import numpy as np

from core.kernels.quaternions import _HALF_TURN_W, canonical_quaternions
from core.kernels.slices import _in_slices, _parts


@_in_slices(1, fills=(3, 3))
def quaternions_to_matrices(q, out=None):
    """Rotation matrices (body -> reference) of quaternions. Any non-zero length is accepted: the
    normalisation is folded into the factor s = 2 / |q|² (Shoemake's form), with no square root."""
    q = np.asarray(q, dtype=np.float64)
    m = np.empty(q.shape[:-1] + (3, 3), dtype=np.float64) if out is None else out
    if q.ndim == 1:   # one orientation: scalar arithmetic, then one small array
        w, x, y, z = _parts(q)
        s = w * w
        s += x * x
        s += y * y
        s += z * z
        s = np.divide(2.0, s)
        xs, ys, zs = x * s, y * s, z * s
        wx, wy, wz, xx, xy, xz, yy, yz, zz = w * xs, w * ys, w * zs, x * xs, x * ys, x * zs, y * ys, y * zs, z * zs
        m[...] = ((1.0 - (yy + zz), xy - wz, xz + wy), (xy + wz, 1.0 - (xx + zz), yz - wx),
                  (xz - wy, yz + wx, 1.0 - (xx + yy)))
        return m
    # The four components as contiguous rows and the nine entries computed as contiguous rows, then one
    # transposing copy into the result: every pass reads and writes adjacent doubles, where reading
    # q[..., 0] and writing m[..., i, j] in place strides 32 and 72 bytes (15 percent slower, measured).
    w, x, y, z = np.ascontiguousarray(q.reshape(-1, 4).T)
    s = w * w
    s += x * x
    s += y * y
    s += z * z
    np.divide(2.0, s, out=s)
    xs, ys, zs = x * s, y * s, z * s
    rows = np.empty((9, w.shape[0]), dtype=np.float64)
    xx, yy, zz = x * xs, y * ys, z * zs
    for k, (a, b) in ((0, (yy, zz)), (4, (xx, zz)), (8, (xx, yy))):
        np.add(a, b, out=rows[k])
        np.subtract(1.0, rows[k], out=rows[k])
    # (row of t − c, row of t + c, t, c): m01 = xy − wz, m10 = xy + wz, and so on.
    t, c = xx, yy                                 # reused as buffers from here on
    for minus, plus, (a, b), (d, e) in ((1, 3, (x, ys), (w, zs)), (6, 2, (x, zs), (w, ys)),
                                        (5, 7, (y, zs), (w, xs))):
        np.multiply(a, b, out=t)
        np.multiply(d, e, out=c)
        np.subtract(t, c, out=rows[minus])
        np.add(t, c, out=rows[plus])
    m[...] = rows.T.reshape(m.shape)
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
    if type(g00) is float:    # one matrix: Python floats (numpy's ufuncs on floats cost ten times more)
        return max(abs(g00 - 1.0), abs(g11 - 1.0), abs(g22 - 1.0), abs(g01), abs(g02), abs(g12))
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
    if type(error) is float:   # one matrix: an exact rotation needs no float-to-array round trips
        if error <= _POLAR_TOLERANCE:
            return m.copy(), np.float64(error), det
        error = np.float64(error)
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
