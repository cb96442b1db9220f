"""Vectorised conversions between quaternions and the two Rodrigues parameter sets.

- The Gibbs vector (classical Rodrigues parameters) g = n·tan(φ/2) = (x, y, z) / w. It grows without bound
  towards a half turn and does not exist at 180° (w = 0).
- The modified Rodrigues parameters (MRP) p = n·tan(φ/4) = (x, y, z) / (1 + w). Of the two sets that spell
  one orientation, p and its shadow p_s = −p / |p|², the one with |p| <= 1 is returned (the same choice as
  SciPy's Rotation.as_mrp); both are read.

Shapes as in core/kernels.py: (..., 4) quaternions (Hamilton, w first), (..., 3) parameter vectors; any
number of leading dimensions, no Python loop over a batch. Input is trusted to be finite unless a
function says otherwise; users' input is checked by Orientation and the batch reader.
"""

import numpy as np

from core.kernels.quaternions import canonical_quaternions
from core.kernels.slices import _in_slices


def _scaled(v):
    """v divided by its largest component (1 where that is below 1) and the divisor, so squares of
    components as large as 1e300 neither overflow nor lose the direction."""
    scale = np.maximum(np.abs(v).max(axis=-1), 1.0)
    return v / scale[..., None], scale


@_in_slices(1,)
def quaternions_to_gibbs(q):
    """Gibbs vectors (x, y, z) / w of quaternions (q and −q give the same vector). Where w = 0 (a half
    turn) the vector does not exist: its components are ±inf (nan for a zero component); callers that
    face people say so rather than print them."""
    q = np.asarray(q, dtype=np.float64)
    with np.errstate(divide="ignore", invalid="ignore"):
        return q[..., 1:] / q[..., :1]


@_in_slices(1,)
def gibbs_to_quaternions(g):
    """Canonical unit quaternions (1, g) / sqrt(1 + |g|²) of Gibbs vectors, computed at a scale where no
    square overflows: a vector of 1e200 is a half turn to within 1e-200 rad."""
    g = np.asarray(g, dtype=np.float64)
    unit, scale = _scaled(g)
    q = np.empty(g.shape[:-1] + (4,), dtype=np.float64)
    q[..., 0] = 1.0 / scale
    q[..., 1:] = unit
    q /= np.linalg.norm(q, axis=-1)[..., None]
    return canonical_quaternions(q)


@_in_slices(1,)
def quaternions_to_mrps(q):
    """Modified Rodrigues parameters of quaternions, the set with |p| <= 1: the quaternion is first given
    w >= 0, then p = (x, y, z) / (1 + w). At a half turn |p| = 1 and the canonical sign of q decides."""
    q = canonical_quaternions(q)
    return q[..., 1:] / (1.0 + q[..., :1])


@_in_slices(1,)
def mrps_to_quaternions(p):
    """Canonical unit quaternions of modified Rodrigues parameters, either set: q = (1 − |p|², 2p) / (1 + |p|²).
    A set with |p| > 1 (a turn beyond 180° the short way round) is first replaced by its shadow, so the
    squares stay small for any finite input."""
    return _mrps_to_quaternions(mrp_shadows_if_long(np.asarray(p, dtype=np.float64)))


def _mrps_to_quaternions(p):
    squared = np.einsum("...i,...i->...", p, p)[..., None]
    q = np.empty(p.shape[:-1] + (4,), dtype=np.float64)
    q[..., :1] = 1.0 - squared
    q[..., 1:] = 2.0 * p
    q /= (1.0 + squared)
    q /= np.linalg.norm(q, axis=-1)[..., None]      # a last rounding step to unit length
    return canonical_quaternions(q)


@_in_slices(1,)
def mrp_shadows(p):
    """The shadow set −p / |p|² of modified Rodrigues parameters: the same orientation turned the other
    way round. The shadow of zero (no rotation) is infinite: its components are inf or nan."""
    p = np.asarray(p, dtype=np.float64)
    # −(u / |u|²) / s with u = p / s and s the largest component: |u| is between 1 and √3, so no square
    # overflows (|p| near 1e308) or underflows (|p| near 1e-200, whose shadow is near 1e200)
    scale = np.abs(p).max(axis=-1)[..., None]
    with np.errstate(divide="ignore", invalid="ignore"):
        unit = p / scale
        return -(unit / np.einsum("...i,...i->...", unit, unit)[..., None]) / scale


def mrp_shadows_if_long(p):
    """Each vector with |p| > 1 replaced by its shadow (|p_s| < 1); the others as they are."""
    p = np.asarray(p, dtype=np.float64)
    unit, scale = _scaled(p)
    # a component beyond 1 makes |p| > 1; otherwise unit is p itself: no square of a huge length is taken
    long = (scale > 1.0) | (np.einsum("...i,...i->...", unit, unit) > 1.0)
    if not np.any(long):
        return p
    return np.where(long[..., None], mrp_shadows(np.where(long[..., None], p, 1.0)), p)
