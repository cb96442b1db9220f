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
    √(trace / 3) (for equal weights rms / √(3 (n − 1))); both None for one measurement;
    flagged: measurements more than OUTLIER_SCATTERS scatters from the average of the others."""
    mean: Orientation
    count: int
    angles_deg: np.ndarray
    rms_deg: float
    max_deg: float
    standard_uncertainty_deg: float | None
    flagged: tuple[int, ...]
    covariance_rad2: np.ndarray | None = None


def _quaternions(measurements) -> np.ndarray:
    if isinstance(measurements, np.ndarray):
        q = np.array(measurements, dtype=float)
    else:
        items = list(measurements)
        if not items:
            raise InvalidInputError("average: expected at least one measurement, got none")
        q = np.array([m.quaternion if isinstance(m, Orientation) else m for m in items], dtype=float)
    if q.ndim != 2 or q.shape[1] != 4:
        raise InvalidInputError(f"average: expected quaternions (w, x, y, z), got shape {q.shape}")
    if not 1 <= len(q) <= MAX_MEASUREMENTS:
        raise InvalidInputError(f"average: expected 1 to {MAX_MEASUREMENTS} measurements, got {len(q)}")
    if not np.all(np.isfinite(q)) or np.abs(q).max() > 1e150:
        raise InvalidInputError("average: every quaternion must hold finite numbers")
    norms = np.linalg.norm(q, axis=1)
    bad = np.flatnonzero(np.abs(norms - 1) > 1e-6)
    if len(bad):
        raise InvalidInputError(f"average: measurement {bad[0] + 1} has norm {norms[bad[0]]:.9g}; expected unit "
                                "quaternions")
    return q / norms[:, None]


def _weights(weights, n) -> np.ndarray:
    if weights is None:
        return np.ones(n)
    w = np.array(weights, dtype=float).reshape(-1)
    if w.shape != (n,) or not np.all(np.isfinite(w)) or np.any(w < 0) or w.sum() <= 0 or w.max() > 1e150:
        raise InvalidInputError(f"average: expected {n} finite weights, 0 or more and not all 0")
    return w / w.max()


def _mean(q: np.ndarray, w: np.ndarray) -> np.ndarray:
    values, vectors = np.linalg.eigh((q * w[:, None]).T @ q)
    return vectors[:, -1]


def _far_from_the_others(errors: np.ndarray, w: np.ndarray) -> list[int]:
    """Measurements more than OUTLIER_SCATTERS scatters from the average of the others. Leaving out
    measurement i (error eᵢ from the average, small turns) moves the average by Δ = −wᵢ eᵢ / (W − wᵢ), so its
    distance from the others' average is |eᵢ| W / (W − wᵢ), and the others' mean square error about their
    own average is (Σ w|e|² − wᵢ|eᵢ|² − wᵢ²|eᵢ|² / (W − wᵢ)) / (W − wᵢ): every case at once, to first order."""
    square = np.einsum("ij,ij->i", errors, errors)
    total, total_square = w.sum(), float(w @ square)
    rest = total - w
    usable = (w > 0) & (rest > 0)
    rest = np.where(usable, rest, 1.0)
    own = np.sqrt(square) * total / rest
    rest_rms = np.sqrt(np.maximum(total_square - w * square - w * w * square / rest, 0.0) / rest)
    return [int(i) for i in np.flatnonzero(usable & (own > OUTLIER_SCATTERS * rest_rms) & (rest_rms > 0))]


def average(measurements, weights=None) -> Average:
    """The weighted average of Orientations (or (n, 4) w-first quaternions), with its scatter."""
    q = _quaternions(measurements)
    w = _weights(weights, len(q))
    mean = Orientation.from_quaternion(_mean(q, w))
    # each measurement as a small turn from the average, in the average's body axes (radians)
    turns = kernels.multiply_quaternions(kernels.conjugate_quaternions(mean.quaternion), q)
    turns *= np.where(turns[:, :1] < 0, -1.0, 1.0)          # w >= 0: the short way round, as canonical
    errors = kernels.quaternions_to_rotation_vectors(turns, assume_canonical=True)
    angles = np.degrees(np.sqrt(np.einsum("ij,ij->i", errors, errors)))
    total = w.sum()
    rms = math.sqrt(float((w * angles ** 2).sum() / total))
    n = len(q)
    flagged = _far_from_the_others(errors, w) if n >= 3 else []
    covariance = uncertainty = None
    if n > 1:
        spread = mean.apply(errors)                  # the same turns in the reference frame: δ = M · e
        covariance = (spread * w[:, None]).T @ spread / total / (n - 1)
        uncertainty = math.degrees(math.sqrt(float(np.trace(covariance)) / 3))
    return Average(mean, n, angles, rms, float(angles.max()), uncertainty, tuple(flagged),
                   covariance)
