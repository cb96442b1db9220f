"""Repeated measurements of one mount: their average, scatter and the standard uncertainty of the average.

The average is the eigenvector of the largest eigenvalue of Σ wᵢ qᵢ qᵢᵀ (F. L. Markley, Y. Cheng,
J. L. Crassidis & Y. Oshman 2007, "Averaging quaternions", J. Guidance, Control, and Dynamics 30(4)); it
does not care whether a measurement came as q or −q. Scatter is the angle of each measurement from the
average. Each measurement is also compared with the average of the others (leave one out), so one bad
reading cannot hide by pulling the average and the scatter towards itself.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core import kernels
from core.errors import InvalidInputError
from core.orientation import Orientation

MAX_MEASUREMENTS = 1_000_000
OUTLIER_SCATTERS = 3.0          # a measurement this many scatters from the others' average is flagged


@dataclass(frozen=True)
class Average:
    """mean: the average; angles_deg[i]: measurement i's angle from it; rms_deg, max_deg: the scatter;
    covariance_rad2: of the average, a small rotation in the reference frame (core.uncertainty), the
    scatter's covariance (Bessel-corrected) over n; standard_uncertainty_deg: its mean per axis,
    √(trace / 3) (for equal weights rms / √(3 (n − 1))), n counting the measurements of weight above 0;
    both None for one such measurement;
    flagged: measurements more than OUTLIER_SCATTERS scatters from the average of the others;
    counted: how many have a weight above 0 (those that move the mean; count is all of them)."""
    mean: Orientation
    count: int
    angles_deg: np.ndarray
    rms_deg: float
    max_deg: float
    standard_uncertainty_deg: float | None
    flagged: tuple[int, ...]
    covariance_rad2: np.ndarray | None = None
    counted: int | None = None


def _quaternions(measurements) -> np.ndarray:
    if isinstance(measurements, np.ndarray):
        q = kernels.float_array(measurements, "average")
    else:
        items = list(measurements)
        if not items:
            raise InvalidInputError("average: expected at least one measurement, got none")
        q = kernels.float_array([m.quaternion if isinstance(m, Orientation) else m for m in items], "average")
    if q.ndim != 2 or q.shape[1] != 4:
        raise InvalidInputError(f"average: expected quaternions (w, x, y, z), got shape {q.shape}")
    if not 1 <= len(q) <= MAX_MEASUREMENTS:
        raise InvalidInputError(f"average: expected 1 to {MAX_MEASUREMENTS} measurements, got {len(q)}")
    # one pass over the squared norms: within about 1e-6 of 1 also proves the four numbers finite and at most
    # about 1 (NaN fails the comparison), so finiteness is looked at only to word the refusal
    with np.errstate(over="ignore"):          # 1e200 squared is inf: refused below
        square = (q * q) @ np.ones(4)
        off = float(np.abs(square - 1).max())
    if not off <= 2e-6:
        if not np.all(np.isfinite(q)) or np.abs(q).max() > 1e150:
            raise InvalidInputError("average: every quaternion must hold finite numbers")
        bad = int(np.argmax(np.abs(square - 1) > 2e-6))
        raise InvalidInputError(f"average: measurement {bad + 1} has norm {math.sqrt(square[bad]):.9g}; expected "
                                "unit quaternions")
    # rows unit to a few ulps (as every Orientation's and SciPy's are) would change by rounding only
    return q if off <= 1e-15 else q / np.sqrt(square)[:, None]


def _weights(weights, n) -> np.ndarray | None:
    """None for equal weights (the sums skip the products), else the weights scaled to a largest of 1."""
    if weights is None:
        return None
    w = kernels.float_array(weights, "average: weights").reshape(-1)
    if w.shape != (n,) or not np.all(np.isfinite(w)) or np.any(w < 0) or w.sum() <= 0 or w.max() > 1e150:
        raise InvalidInputError(f"average: expected {n} finite weights, 0 or more and not all 0")
    return w / w.max()


def _mean(q: np.ndarray, w: np.ndarray | None) -> Orientation:
    values, vectors = np.linalg.eigh((q.T if w is None else (q * w[:, None]).T) @ q)
    top = vectors[:, -1]
    top = top / math.sqrt(float(top @ top))
    # eigh gives a unit vector; the canonical sign makes it an Orientation without the constructor's checks
    # (w far from 0 decides the sign alone; near a half turn the kernel's rule does). + 0.0 turns the -0.0
    # that eigh leaves into 0.0, as the kernel does, so no component prints as "-0".
    w = float(top[0])
    return Orientation._from_kernel((top if w > 1e-6 else -top if w < -1e-6 else kernels.canonical_quaternions(top))
                                    + 0.0)


def mean_orientation(measurements, weights=None) -> Orientation:
    """The weighted average alone (the same input and checks as average, without the scatter)."""
    q = _quaternions(measurements)
    return _mean(q, _weights(weights, len(q)))


def _far_from_the_others(square: np.ndarray, w: np.ndarray) -> list[int]:
    """Measurements more than OUTLIER_SCATTERS scatters from the average of the others, from the squared
    errors |eᵢ|² about the average and the weights. Leaving out
    measurement i (error eᵢ from the average, small turns) moves the average by Δ = −wᵢ eᵢ / (W − wᵢ), so its
    distance from the others' average is |eᵢ| W / (W − wᵢ), and the others' mean square error about their
    own average is (Σ w|e|² − wᵢ|eᵢ|² − wᵢ²|eᵢ|² / (W − wᵢ)) / (W − wᵢ): every case at once, to first order."""
    total, total_square = w.sum(), float(w @ square)
    rest = total - w
    usable = (w > 0) & (rest > 0)
    rest = np.where(usable, rest, 1.0)
    own = np.sqrt(square) * total / rest
    rest_rms = np.sqrt(np.maximum(total_square - w * square - w * w * square / rest, 0.0) / rest)
    return [int(i) for i in np.flatnonzero(usable & (own > OUTLIER_SCATTERS * rest_rms) & (rest_rms > 0))]


def _left_product_matrix(p) -> np.ndarray:
    """L with L · q = p ⊗ q (Hamilton product, w first): one matrix product turns every measurement."""
    a, b, c, d = p
    return np.array([[a, -b, -c, -d], [b, a, -d, c], [c, d, a, -b], [d, -c, b, a]])


def average(measurements, weights=None) -> Average:
    """The weighted average of Orientations (or (n, 4) w-first quaternions), with its scatter."""
    q = _quaternions(measurements)
    weighted = _weights(weights, len(q))
    mean = _mean(q, weighted)
    w = np.ones(len(q)) if weighted is None else weighted
    # each measurement as a small turn from the average, in the average's body axes (radians)
    turns = q @ _left_product_matrix(kernels.conjugate_quaternions(mean.quaternion)).T     # mean⁻¹ ⊗ qᵢ
    turns *= np.where(turns[:, :1] < 0, -1.0, 1.0)          # w >= 0: the short way round, as canonical
    errors = kernels.quaternions_to_rotation_vectors(turns, assume_canonical=True)
    square = (errors * errors) @ np.ones(3)
    angles = np.degrees(np.sqrt(square))
    total = w.sum()
    rms = math.sqrt(float((w * angles ** 2).sum() / total))
    n = len(q)
    flagged = _far_from_the_others(square, w) if n >= 3 else []
    covariance = uncertainty = None
    used = n if weighted is None else int(np.count_nonzero(weighted))     # a weight of 0 leaves one out
    if used > 1:
        spread = errors @ mean.as_matrix().T         # the same turns in the reference frame: δ = M · e
        covariance = (spread * w[:, None]).T @ spread / total / (used - 1)
        uncertainty = math.degrees(math.sqrt(float(np.trace(covariance)) / 3))
    return Average(mean, n, angles, rms, float(angles.max()), uncertainty, tuple(flagged),
                   covariance, used)
