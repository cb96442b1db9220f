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
# Up to this many measurements each is judged against the others alone (n² work); beyond it one reading
# cannot move the average or the scatter enough to hide, and the whole set's figures are used.
LEAVE_ONE_OUT_MAX = 1000


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


def average(measurements, weights=None) -> Average:
    """The weighted average of Orientations (or (n, 4) w-first quaternions), with its scatter."""
    q = _quaternions(measurements)
    w = _weights(weights, len(q))
    mean = Orientation.from_quaternion(_mean(q, w))
    angles = np.degrees(kernels.angles_between(mean.quaternion, q))
    total = w.sum()
    rms = math.sqrt(float((w * angles ** 2).sum() / total))
    n = len(q)
    flagged = []
    if n > LEAVE_ONE_OUT_MAX:
        flagged = list(np.flatnonzero(angles > OUTLIER_SCATTERS * rms)) if rms > 0 else []
    elif n >= 3:
        total_matrix = (q * w[:, None]).T @ q
        for i in range(n):
            others = np.arange(n) != i
            if w[i] == 0 or w[others].sum() == 0:
                continue
            # the average of the others: the eigenvector of the sum less this measurement's own term
            rest = np.linalg.eigh(total_matrix - w[i] * np.outer(q[i], q[i]))[1][:, -1]
            rest_angles = np.degrees(kernels.angles_between(rest, q[others]))
            rest_rms = math.sqrt(float((w[others] * rest_angles ** 2).sum() / w[others].sum()))
            if float(np.degrees(kernels.angles_between(rest, q[i]))) > OUTLIER_SCATTERS * rest_rms > 0:
                flagged.append(i)
    covariance = uncertainty = None
    if n > 1:
        # each measurement as a small turn from the average, in the reference frame: δ = M · e
        spread = mean.apply(kernels.quaternions_to_rotation_vectors(
            kernels.multiply_quaternions(kernels.conjugate_quaternions(mean.quaternion), q)))
        scatter = (spread * w[:, None]).T @ spread / total * n / (n - 1)
        covariance = scatter / n
        uncertainty = math.degrees(math.sqrt(float(np.trace(covariance)) / 3))
    return Average(mean, n, angles, rms, float(angles.max()), uncertainty, tuple(int(i) for i in flagged),
                   covariance)
