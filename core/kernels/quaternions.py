"""Quaternion algebra on arrays (..., 4), Hamilton, w first: normalising, the canonical sign, products,
inverses, rotating vectors and the angle between two orientations."""

import numpy as np

from core.errors import InvalidInputError
from core.kernels.slices import _in_slices, _parts


# |w| at or below this is a half turn (see canonical_quaternions).
_HALF_TURN_W = 1.5e-15


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
