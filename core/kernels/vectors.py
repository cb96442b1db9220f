"""Axis and angle, and rotation vectors, on arrays (..., 3): to and from quaternions."""

import math

import numpy as np

from core.errors import InvalidInputError
from core.kernels.quaternions import _HALF_TURN_W, canonical_quaternions
from core.kernels.slices import _arctan2, _in_slices, _parts, _sqrt


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
    """Canonical quaternions of rotation vectors (radians), from the tangent of a quarter of the angle:
    with t = tan(phi/4), cos(phi/2) = (1 − t²) / (1 + t²) and sin(phi/2) = 2t / (1 + t²). One tangent
    instead of a cosine and a sine: numpy's tangent is vectorised and theirs are not, so this is several
    times faster on a batch, and as exact (every step is well conditioned in t; the result is unit to
    rounding for any length and needs no second normalisation). A vector longer than a half turn gives
    w < 0, and the sign is folded into the same products."""
    rv = np.asarray(rv, dtype=np.float64)
    x, y, z = _parts(rv)
    squared = x * x
    squared += y * y
    squared += z * z
    if type(squared) is float:           # one orientation: Python floats
        angle = math.sqrt(squared)
        if angle >= _SERIES_ANGLE:
            t = math.tan(0.25 * angle)
            inverse = 1.0 / (1.0 + t * t)
            w = (1.0 - t * t) * inverse
            ratio = 2.0 * t * inverse / angle
        else:
            w, ratio = math.cos(0.5 * angle), 0.5 - squared / 48.0
        ratio = math.copysign(ratio, w)      # w < 0 beyond a half turn: take -q
        out = np.array((abs(w), x * ratio + 0.0, y * ratio + 0.0, z * ratio + 0.0))
        return canonical_quaternions(out) if out[0] <= _HALF_TURN_W else out
    angle = np.sqrt(squared)
    t = np.multiply(angle, 0.25)
    np.tan(t, out=t)
    t_squared = t * t
    inverse = t_squared + 1.0
    np.divide(1.0, inverse, out=inverse)
    if out is None:
        out = np.empty(rv.shape[:-1] + (4,), dtype=np.float64)
    w = out[..., 0]
    np.subtract(1.0, t_squared, out=w)
    w *= inverse
    # sin(phi/2)/phi, from the series near zero (and at zero, where the quotient is 0/0)
    ratio = squared
    ratio *= -1.0 / 48.0
    ratio += 0.5
    large = angle >= _SERIES_ANGLE
    t *= inverse
    t += t
    np.divide(t, angle, out=ratio, where=large)
    np.copysign(ratio, w, out=ratio)
    np.abs(w, out=w)
    for i, c in enumerate((x, y, z), start=1):
        np.multiply(c, ratio, out=out[..., i])
    out += 0.0                                   # no -0.0 reaches a screen
    half_turn = w <= _HALF_TURN_W
    if half_turn.any():
        out[half_turn] = canonical_quaternions(out[half_turn])
    return out
