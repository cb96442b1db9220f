"""How sure a measured orientation is, and what that means for the figures a check judges.

An orientation's uncertainty is a 3×3 covariance of a small rotation δ (radians², reference frame) with
M_true = exp([δ]×) · M. It comes from a hand-typed standard uncertainty (the same on every axis), from the
scatter of repeated measurements (core.average), or from a point fit's residuals and geometry.

Point fit (measured = R · nominal + t, least squares): linearised about the fit, each point's residual
changes by −[c_i]× δ with c_i = R (p_i − p̄) the centred nominal point turned into the reference frame, so
Cov(δ) = σ² H⁻¹ with H = Σ w_i (|c_i|² I − c_i c_iᵀ) and σ² = Σ w_i |r_i|² / (3n − 6) (per coordinate, for a
weight of 1; six parameters fitted). This is the small-angle covariance of the absolute-orientation fit
(Horn 1987; Kabsch 1976 for the fit itself).

Figures of a check (D = Nᵀ M, CONVENTIONS.md), to first order in δ:
- total deviation d = |log D|: its change is a · (Mᵀ δ) with a the deviation axis in body axes (where d is
  near zero, the largest spread of Mᵀ δ);
- pointing error of body axis b: the change of the angle between N b and M b is e · δ, e the unit normal of
  the plane through them (where the pointing error is near zero the largest spread across M b is used);
- roll about b: (M b) · δ.
"""

from __future__ import annotations

import math

import numpy as np

from core.errors import InvalidInputError
from core.fit import read_weights
from core.kernels import unit_vectors
from core.orientation import Orientation

# Below this deviation or pointing error (radians) its direction is rounding (N⁻¹ N itself comes out as
# about 7e-18 rad about some axis): use the largest spread instead.
_DIRECTION_DEFINED_RAD = 1e-9
# An information matrix whose smallest eigenvalue is below this fraction of its largest leaves the turn about
# one direction to rounding (collinear points, parallel directions): refused. The fits refuse far sooner
# (core/fit.py: points off their line by 1e-3 of the along-line spread give a ratio of about 5e-7; directions
# 2° apart about 3e-4), so a covariance is refused only where its fit was.
_DETERMINED_RATIO = 1e-9


def isotropic(standard_uncertainty_deg) -> np.ndarray:
    """The covariance of an orientation known to u degrees (one standard deviation) about every axis."""
    return np.eye(3) * _radians(standard_uncertainty_deg, "standard uncertainty") ** 2


def _radians(degrees, what) -> float:
    """A typed standard uncertainty, 0 to 180 degrees, in radians."""
    if isinstance(degrees, bool):
        raise InvalidInputError(f"{what}: expected a number of degrees")
    try:
        u = float(degrees)
    except (TypeError, ValueError):
        raise InvalidInputError(f"{what}: expected a number of degrees, got {degrees!r}") from None
    if not math.isfinite(u) or not 0 <= u <= 180:
        raise InvalidInputError(f"{what}: expected 0 to 180 degrees, got {degrees!r}")
    return math.radians(u)


def point_fit_covariance(nominal_points, orientation: Orientation, residuals, weights=None) -> np.ndarray:
    """Cov(δ) (radians², reference frame) of a point fit from its nominal points, result and residuals."""
    p = np.asarray(nominal_points, dtype=float)
    r = np.asarray(residuals, dtype=float)
    n = len(p)
    if p.ndim != 2 or p.shape[1] != 3 or r.shape != p.shape:
        raise InvalidInputError("point fit covariance: expected nominal points and residuals as matching (N, 3) rows")
    if not (np.all(np.isfinite(p)) and np.all(np.isfinite(r))):
        raise InvalidInputError("point fit covariance: expected finite numbers in the nominal points and residuals")
    w = np.ones(n) if weights is None else read_weights(weights, n, "point fit covariance: weights")
    used = int(np.count_nonzero(w))
    if used < 3:
        raise InvalidInputError("point fit covariance: expected at least 3 points with weight above zero")
    centre = (w @ p) / w.sum()
    c = orientation.apply(p - centre)
    h = (w * np.einsum("ij,ij->i", c, c)).sum() * np.eye(3) - (c * w[:, None]).T @ c
    sigma2 = float((w * np.einsum("ij,ij->i", r, r)).sum()) / (3 * used - 6)
    return _covariance(sigma2, h, "point fit covariance", "the nominal points do not fix the rotation (collinear "
                                                          "or nearly so)")


def _covariance(sigma2, information, what, singular):
    """σ² times the inverse of a symmetric information matrix; refused (`singular`) when the matrix is singular
    to rounding: an exact zero eigenvalue comes out as ±1e-16 once the points are turned, and its inverse
    would be a confident figure with no meaning. Refused too when the product is beyond a double."""
    values = np.linalg.eigvalsh(information)
    if not values[0] > _DETERMINED_RATIO * values[-1]:      # also all zeros
        raise InvalidInputError(f"{what}: {singular}")
    with np.errstate(over="ignore", invalid="ignore"):
        covariance = sigma2 * np.linalg.inv(information)
    if not np.all(np.isfinite(covariance)):
        raise InvalidInputError(f"{what}: the covariance is beyond the largest number a double holds; expected "
                                "residuals and weights in proportion to the spread of the points or directions")
    return covariance


def point_fit_standard_uncertainty(nominal_points, orientation: Orientation, residuals, weights=None):
    """(largest, (about reference X, Y, Z)) standard uncertainty in degrees of a point fit's orientation:
    the square roots of the covariance's largest eigenvalue and of its diagonal. The largest is what a
    check may take as one uncertainty for every figure (no figure's projection of Cov(δ) exceeds it)."""
    largest, per_axis, _ = point_fit_uncertainty(nominal_points, orientation, residuals, weights)
    return largest, per_axis


def _summed_up(cov) -> tuple:
    """(largest, per reference axis) standard uncertainty in degrees of a finite covariance in radians², and it."""
    largest = math.degrees(math.sqrt(max(float(np.linalg.eigvalsh(cov).max()), 0.0)))
    per_axis = tuple(math.degrees(math.sqrt(max(float(v), 0.0))) for v in np.diag(cov))
    return largest, per_axis, cov


def point_fit_uncertainty(nominal_points, orientation: Orientation, residuals, weights=None):
    """(largest, per axis, covariance in radians², reference frame) of a point fit's orientation."""
    # Cov(δ) depends only on residuals over point spread: scale both by one length first (the largest
    # coordinate, then the spread), so points of 1e300 mm (or 1e-300) neither overflow nor underflow.
    p = np.asarray(nominal_points, dtype=float)
    r = np.asarray(residuals, dtype=float)
    if p.ndim != 2 or p.shape[1:] != (3,) or r.shape != p.shape or not len(p):
        raise InvalidInputError("point fit uncertainty: expected nominal points and residuals as matching (N, 3) rows")
    if not (np.all(np.isfinite(p)) and np.all(np.isfinite(r))):
        raise InvalidInputError("point fit uncertainty: expected finite numbers in the nominal points and residuals")
    largest = float(np.abs(p).max())
    if largest > 0:
        p = p / largest
    spread = float(np.abs(p - p.mean(axis=0)).max())
    if spread == 0.0:
        raise InvalidInputError("point fit uncertainty: all nominal points coincide; the rotation is not determined")
    with np.errstate(over="ignore"):
        r = r / largest / spread
    if not np.all(np.abs(r) <= 1e100):     # their squares and sums stay far from overflow
        raise InvalidInputError("point fit uncertainty: the residuals are out of all proportion to the points' "
                                "spread (more than 1e100 times it); expected residuals and points in one unit")
    return _summed_up(point_fit_covariance(p / spread, orientation, r, weights))


# Below this many directions the residuals say too little of the directions' own spread (2n − 3 degrees
# of freedom; two directions leave one, and TRIAD matches the first exactly).
MIN_DIRECTIONS_FOR_SCATTER = 3


def direction_fit_uncertainty(reference_directions, orientation: Orientation, residual_angles_deg, weights=None):
    """(largest, per axis, covariance in radians², reference frame) of a direction fit's orientation, the
    directions' spread estimated from the residual angles (direction_fit_covariance); three directions at
    least, or InvalidInputError."""
    r = _unit_directions(reference_directions)
    w = np.ones(len(r)) if weights is None else read_weights(weights, len(r), "direction fit uncertainty: weights")
    if int(np.count_nonzero(w)) < MIN_DIRECTIONS_FOR_SCATTER:
        raise InvalidInputError(f"direction fit uncertainty: expected {MIN_DIRECTIONS_FOR_SCATTER} or more "
                                "directions with weight, so that the residuals show their spread")
    return _summed_up(direction_fit_covariance(r, orientation, residual_angles_deg, w))


def figure_uncertainties(nominal: Orientation, measured: Orientation, covariance, body_axis=None) -> dict:
    """Standard uncertainties (degrees) of the total deviation and, for a body axis, of its pointing error
    and of the roll about it, from the measured orientation's covariance (radians², reference frame)."""
    cov = np.asarray(covariance, dtype=float)
    if cov.shape != (3, 3) or not np.all(np.isfinite(cov)):
        raise InvalidInputError("orientation covariance: expected a finite 3×3 matrix")
    m = measured.as_matrix()
    deviation = nominal.inverse() @ measured
    axis, angle = deviation.as_axis_angle(degrees=False)
    body_cov = m.T @ cov @ m
    if angle > _DIRECTION_DEFINED_RAD:
        total = math.sqrt(max(0.0, float(axis @ body_cov @ axis)))
    else:   # at zero deviation the angle grows with the whole spread: its largest direction
        total = math.sqrt(max(0.0, float(np.linalg.eigvalsh(body_cov)[-1])))
    out = {"total_deg": math.degrees(total)}
    if body_axis is not None:
        b = unit_vectors(body_axis, "body axis")[0]        # scaled: 1e-200 keeps its direction
        nominal_b, measured_b = nominal.apply(b), measured.apply(b)
        normal = np.cross(nominal_b, measured_b)
        if np.linalg.norm(normal) > _DIRECTION_DEFINED_RAD:
            e = normal / np.linalg.norm(normal)
            pointing = float(e @ cov @ e)
        else:
            across = np.eye(3) - np.outer(measured_b, measured_b)
            pointing = float(np.linalg.eigvalsh(across @ cov @ across)[-1])
        out["pointing_deg"] = math.degrees(math.sqrt(max(0.0, pointing)))
        out["roll_deg"] = math.degrees(math.sqrt(max(0.0, float(measured_b @ cov @ measured_b))))
    return out


def direction_fit_covariance(reference_directions, orientation: Orientation, residual_angles_deg=None,
                             weights=None, direction_uncertainty_deg=None) -> np.ndarray:
    """Cov(δ) (radians², reference frame) of an orientation fitted to two or more measured directions, by
    the QUEST covariance of M. D. Shuster & S. D. Oh (1981), "Three-axis attitude determination from vector
    observations", J. Guidance and Control 4(1) (from memory): P = σ² (Σ wᵢ (I − rᵢ rᵢᵀ))⁻¹, with σ the
    directions' own uncertainty when given (that of a direction of weight 1), else estimated from the residual
    angles, Σ wᵢ θᵢ² / (2n − 3)."""
    r = _unit_directions(reference_directions)
    w = np.ones(len(r)) if weights is None else read_weights(weights, len(r), "direction fit covariance: weights")
    if direction_uncertainty_deg is not None:
        sigma2 = _radians(direction_uncertainty_deg, "direction fit covariance: the directions' uncertainty") ** 2
        if weights is not None:     # σ is a direction's of weight 1 (weight w: σ² / w): the weights as given
            w = np.asarray(weights, dtype=float)
    else:
        if residual_angles_deg is None:
            raise InvalidInputError("direction fit covariance: give the directions' uncertainty or the residuals")
        theta = np.asarray(residual_angles_deg, dtype=float)
        if theta.shape != (len(r),) or not np.all((theta >= 0) & (theta <= 180)):     # NaN fails too
            raise InvalidInputError(f"direction fit covariance: expected {len(r)} residual angles, one per "
                                    "direction, each 0 to 180 degrees")
        theta = np.radians(theta)
        dof = 2 * int(np.count_nonzero(w)) - 3
        sigma2 = float((w * theta ** 2).sum()) / dof
    information = (w[:, None, None] * (np.eye(3) - r[:, :, None] * r[:, None, :])).sum(axis=0)
    return _covariance(sigma2, information, "direction fit covariance",
                       "the directions are parallel or nearly so; the turn about them is not determined")


def _unit_directions(reference_directions) -> np.ndarray:
    r = np.asarray(reference_directions, dtype=float)
    if r.ndim != 2 or r.shape[1] != 3 or len(r) < 2:
        raise InvalidInputError("direction fit covariance: expected two or more measured directions")
    if not np.all(np.isfinite(r)):
        raise InvalidInputError("direction fit covariance: expected finite numbers in the directions")
    return unit_vectors(r, "direction fit covariance: direction")[0]      # scaled: 1e200 keeps its direction


def check_figure_uncertainties(nominal: Orientation, measured: Orientation, settings, covariance) -> dict:
    """Each figure a check judges (its criterion's name, core/check.py) with its standard uncertainty in
    degrees, propagated from the measured orientation's covariance (radians², reference frame)."""
    body_axis = settings.axis_vector() if settings.mode == "pointing_and_roll" else None
    figures = figure_uncertainties(nominal, measured, covariance, body_axis)
    if body_axis is None:
        return {"total deviation": figures["total_deg"]}
    return {"pointing error": figures["pointing_deg"], "roll": figures["roll_deg"],
            "roll (undefined, judged as 180°)": figures["roll_deg"]}
