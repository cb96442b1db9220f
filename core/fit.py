"""A measured orientation from what the bench can measure: point pairs, three datum points, or two or more
directions.

Point pairs (`fit_points`): nominal points p_i in the body frame (from the drawing) and measured points
q_i in the reference frame (arm, tracker). The best rigid fit q ≈ R p + t in the weighted least-squares
sense is the Kabsch (1976) / Horn (1987) solution: with centroids removed, H = Σ w q pᵀ = U S Vᵀ and
R = U diag(1, 1, d) Vᵀ, d = ±1 making det R = +1.
- A genuine mirror image (the best orthogonal fit is a reflection and it fits clearly better than any
  rotation) is refused: a sign or an axis convention is wrong; it is never "fixed".
- Collinear nominal points leave the rotation about their line undetermined: refused when the off-line
  spread is below COLLINEAR_REFUSE of the along-line spread, a note below COLLINEAR_NOTE.
- Flagged points: the modified z-score rule of Iglewicz & Hoaglin (1993, from memory) on the residual
  distances, z = 0.6745 (d − median) / MAD; a point is flagged when z > 3.5 (only large residuals count),
  and its residual is also above a floor of 1e-9 of the point set's size (so round-off is never flagged).
  At least FLAG_MIN_POINTS points are needed; with fewer, the fit absorbs any one bad point. On clean
  Gaussian noise the rule flags about 0.3 % of points (residual distances have a long upper tail), so a
  flag is a point to look at again, not a verdict; no point is dropped from the fit automatically (give it
  weight 0 to leave it out).

Three datum points (`frame_from_three_points`, the "3-2-1" construction): the body origin, a point on
the body +X axis, and a point in the body XY plane on the +Y side, all measured in the reference frame.

Directions (`triad`, `fit_directions`) are fitted in core/direction_fit.py.

Points, directions and weights are numbered from 1 in messages, as a person counts rows. Any finite
numbers are accepted: points are divided by a power of two near their largest magnitude
before any arithmetic (exact, so ordinary input gives the same digits), every step runs at unit scale,
and lengths are multiplied back at the end. Only a result beyond the range of a double (a translation or
residual above about 1.8e308) or point sets whose spread is lost against their coordinates are refused;
the linear algebra never sees an infinity, and its rare failures come back as a FitRefusedError.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core import kernels
from core.errors import FramewrightError, InvalidInputError
from core.orientation import Orientation

COLLINEAR_REFUSE = 1e-3
COLLINEAR_NOTE = 5e-2
MEASURED_COLLINEAR_REFUSE = 1e-6
FLAG_Z = 3.5
FLAG_MIN_POINTS = 5
MIN_PAIR_ANGLE_DEG = 2.0
WEAK_PAIR_ANGLE_DEG = 15.0
_MAD_TO_Z = 0.6745
# A point set whose spread is below this fraction of its largest coordinate is not resolved in double
# precision (and its squares would underflow): refused as a unit or offset mistake.
_SPREAD_FLOOR = 1e-100
_NO_SCALE_BELOW, _NO_SCALE_ABOVE = 1e-50, 1e50


class FitRefusedError(FramewrightError):
    """The measurements do not determine an orientation (collinear, mirrored, parallel, too few).

    `reason` is one of 'too few', 'collinear', 'reflection', 'parallel', 'range' (numbers a double cannot
    carry through the fit) or 'numerical' (the linear algebra did not converge)."""

    def __init__(self, message, reason):
        super().__init__(message)
        self.reason = reason


def read_points(values, what):
    try:
        array = np.asarray(values, dtype=np.float64)
    except (TypeError, ValueError, OverflowError) as exc:
        raise InvalidInputError(f"{what}: expected rows of three numbers, got "
                                f"{kernels.shortened_repr(values)}") from exc
    if array.ndim != 2 or array.shape[1] != 3:
        raise InvalidInputError(f"{what}: expected shape (N, 3), got {array.shape}")
    if not np.isfinite(array).all():
        row = int(np.argwhere(~np.isfinite(array))[0, 0])
        raise InvalidInputError(f"{what}: point {row + 1} has NaN or infinity; expected finite numbers")
    return array


def read_weights(weights, n, what="weights"):
    if weights is None:
        return None
    w = kernels.float_array(weights, what)
    if w.shape != (n,):
        raise InvalidInputError(f"{what}: expected {n} numbers (one per point), got shape {w.shape}")
    bad = ~np.isfinite(w) | (w < 0)
    if bad.any():
        i = int(np.argmax(bad))
        raise InvalidInputError(f"{what}: weight {i + 1} is {float(w[i])!r}; expected a finite number >= 0")
    return w / _binary_scale(_largest(w))    # only their ratios count; 1e308s must not overflow the sum


def _largest(a):
    """The largest magnitude in `a` (0 for an empty array), without an |a| temporary."""
    return max(float(a.max()), -float(a.min())) if a.size else 0.0


def _binary_scale(largest):
    """A power of two s with largest / s in [1, 2): dividing by it is exact and brings any finite
    magnitude, 5e-324 or 1.797e308, to unit scale (1 for zero)."""
    return 1.0 if largest == 0 else math.ldexp(1.0, math.frexp(largest)[1] - 1)


def _scaled_back(scale, *arrays, what="the fitted translation or residuals"):
    """The unit-scale results times `scale` (arrays in place), refused when a length no longer fits in a
    double."""
    with np.errstate(over="ignore"):
        out = [np.multiply(a, scale, out=a) if isinstance(a, np.ndarray) else a * scale for a in arrays]
    if not all(np.isfinite(a).all() for a in out):
        raise FitRefusedError(
            f"{what} exceed the largest number a double holds (about 1.8e308); expected points that lie "
            f"closer together than that", "range")
    return out


def _largest_entry(p, q):
    """Words for where the largest magnitude of two (N, 3) point sets is: 'measured point 2, y'."""
    which, points = max((("nominal", p), ("measured", q)), key=lambda item: _largest(item[1]))
    row, column = np.unravel_index(int(np.argmax(np.abs(points))), points.shape)
    return f"{which} point {row + 1}, {'xyz'[column]} = {points[row, column]:.4g}"


def _spread_check(size, largest, scale, what, p, q):
    """Refuse a point set whose spread (`size`) is lost against the largest coordinate (`largest`, both
    at the working scale; `scale` turns them back into the user's numbers)."""
    if size < _SPREAD_FLOOR * largest:
        raise FitRefusedError(
            f"{_largest_entry(p, q)} is out of all proportion to the spread of the {what} points, "
            f"{size * scale:.3g} (a ratio of {size / largest:.2g}): double precision cannot resolve the "
            f"rotation; expected nominal and measured points in one unit, with no huge coordinate (a mistyped "
            f"exponent?) or common offset", "range")


def rotation_from_profile(h):
    """The proper rotation maximising trace(Rᵀ H), with the singular values and the sign d that was
    needed (d = −1: the best orthogonal matrix would have been a reflection)."""
    if not np.isfinite(h).all():   # never reached with unit-scale input; an SVD of inf would not return
        raise FitRefusedError("the fit's sums overflowed; expected coordinates below about 1e308", "range")
    try:
        u, s, vt = np.linalg.svd(h)
    except np.linalg.LinAlgError as exc:
        raise FitRefusedError(f"the singular value decomposition did not converge ({exc}); expected "
                              f"ordinary coordinates", "numerical") from None
    d = 1.0 if np.linalg.det(u) * np.linalg.det(vt) > 0 else -1.0
    u[:, 2] *= d
    return u @ vt, s, d


# --- point pairs -----------------------------------------------------------------------------------

@dataclass(frozen=True)
class PointFit:
    """orientation R and translation t with measured ≈ R · nominal + t (reference frame).

    residuals: measured − fitted per point (reference frame); distances: their lengths.
    rms: sqrt(Σ w d² / Σ w) (the plain RMS when unweighted). worst_index: the largest distance.
    flagged: indices of points standing far above the rest (see the module docstring for the rule),
    flag_threshold the distance above which a point is flagged (None when too few points).
    spread_ratio: off-line over along-line spread of the nominal points (0 collinear, 1 well spread)."""

    orientation: Orientation
    translation: np.ndarray
    residuals: np.ndarray
    distances: np.ndarray
    rms: float
    worst_index: int
    flagged: tuple
    flag_threshold: float | None
    spread_ratio: float
    notes: tuple = ()

    def summary(self, unit="mm"):
        """A few lines for a person: the fit, its residuals and any flagged points (1-based numbers)."""
        axis, angle = self.orientation.as_axis_angle()
        t = self.translation
        lines = [f"best fit of {len(self.distances)} points: {angle:.4f}° about "
                 f"[{axis[0]:.5f}, {axis[1]:.5f}, {axis[2]:.5f}], translation "
                 f"[{t[0]:.4f}, {t[1]:.4f}, {t[2]:.4f}] {unit}",
                 f"RMS residual {self.rms:.4g} {unit}; worst point {self.worst_index + 1} at "
                 f"{self.distances[self.worst_index]:.4g} {unit}"]
        if self.flagged:
            lines.append(f"flagged (residual above {self.flag_threshold:.4g} {unit}): point(s) "
                         + ", ".join(str(i + 1) for i in self.flagged))
        return "\n".join(lines + list(self.notes))

    @property
    def flag_rule(self):
        return (f"flagged when 0.6745·(d − median)/MAD > {FLAG_Z:g} "
                f"(modified z-score, Iglewicz & Hoaglin), with at least {FLAG_MIN_POINTS} points")


def fit_points(nominal, measured, weights=None):
    """Best-fit rotation and translation taking nominal body-frame points onto measured reference-frame
    points, with residuals. `weights` (optional, >= 0, one per point) scale each point's say."""
    p = read_points(nominal, "nominal points")
    q = read_points(measured, "measured points")
    n = len(p)
    if q.shape != p.shape:
        raise InvalidInputError(f"nominal and measured points differ in number ({n} and {len(q)}); "
                                f"expected one measured point per nominal point")
    w = read_weights(weights, n)
    used = n if w is None else int(np.count_nonzero(w))
    if used < 3:
        raise FitRefusedError(f"{used} point pair(s) with weight above zero; expected at least 3", "too few")

    # Points as (3, N) rows, so every step below runs over contiguous memory, scaled and centred in place
    # (large temporaries cost more in fresh pages than in arithmetic). Weights are normalised to sum 1.
    # Everything runs at unit scale (see the module docstring) and is scaled back at the end.
    largest = max(_largest(p), _largest(q))
    # Coordinates between 1e-50 and 1e50 keep every square and sum in range as they are (the common
    # case costs nothing); beyond, they are brought to unit scale by a power of two.
    scale = 1.0 if _NO_SCALE_BELOW <= largest <= _NO_SCALE_ABOVE or largest == 0 else _binary_scale(largest)
    Pc = np.array(p.T, order="C")
    Qc = np.array(q.T, order="C")
    if scale != 1.0:
        Pc /= scale
        Qc /= scale
    weight = np.full(n, 1.0 / n) if w is None else w / w.sum()
    p_mean = Pc @ weight
    q_mean = Qc @ weight
    Pc -= p_mean[:, None]
    Qc -= q_mean[:, None]
    if w is None:
        h = (Qc @ Pc.T) / n                            # profile matrix Σ w (q − q̄)(p − p̄)ᵀ
        scatter = np.einsum("ik,jk->ij", Pc, Pc) / n   # nominal scatter, for collinearity
        energy_p = float(np.trace(scatter))
    else:
        Pw = Pc * weight
        h = Qc @ Pw.T
        scatter = Pc @ Pw.T
        energy_p = float(np.trace(scatter))
        del Pw

    spread = _eigenvalues(scatter)
    if spread[2] <= 0:   # every point of weight above zero at one place, or a spread lost to underflow
        if _largest(Pc) > 0:
            _spread_check(_largest(Pc), largest / scale, scale, "nominal", p, q)
        raise FitRefusedError("all nominal points coincide; expected points spread over the part", "collinear")
    spread_ratio = float(np.sqrt(max(spread[1], 0.0) / spread[2]))
    size = float(np.sqrt(spread[2]))
    _spread_check(size, largest / scale, scale, "nominal", p, q)
    if spread_ratio < COLLINEAR_REFUSE:
        raise FitRefusedError(
            f"the nominal points lie on one line (off-line spread {spread_ratio:.2g} of the along-line "
            f"spread, limit {COLLINEAR_REFUSE:g}): the rotation about that line is not determined; "
            f"expected at least one point well off the line", "collinear")

    r, s, d = rotation_from_profile(h)
    if s[0] == 0:
        raise FitRefusedError("all measured points coincide: the rotation is not determined; expected the "
                              "measured points spread like the nominal ones", "collinear")
    _spread_check(float(s[0]) / size, largest / scale, scale, "measured", p, q)   # s0 ≈ both spreads
    # Measured points on one line while the nominal ones are not (no rigid motion does that) leave the
    # profile matrix of rank one, and the rotation about that line would be whatever the SVD returned.
    # Only a degenerate set is refused; one far-off point is left to the residuals and the flags.
    if s[1] <= MEASURED_COLLINEAR_REFUSE * s[0]:
        farthest = int(np.argmax(np.einsum("ij,ij->j", Qc, Qc)))
        raise FitRefusedError(
            f"the measured points lie on one line (their second spread is {s[1] / s[0]:.2g} of the first, "
            f"limit {MEASURED_COLLINEAR_REFUSE:g}) while the nominal points do not: no rotation takes one "
            f"onto the other and the rotation about that line is not determined; the farthest from the "
            f"others is measured point {farthest + 1}; expected the measured points spread like the "
            f"nominal ones (a repeated or mistyped row?)", "collinear")
    if d < 0 and s[2] > 1e-9 * s[0]:
        # The best mirror fit and the best rotation differ in residual energy by 4 s3: refuse when the
        # mirror explains the points clearly better than any rotation could.
        energy = float(np.einsum("ij,ij,j->", Qc, Qc, weight)) + energy_p
        mirror_energy = max(energy - 2.0 * float(s.sum()), 0.0)
        if 4.0 * s[2] > mirror_energy:
            raise FitRefusedError(
                "the measured points are a mirror image of the nominal points: the best fit is a "
                "reflection (det −1), not a rotation; a sign or an axis convention is wrong (a left-handed "
                "frame?); expected both point sets in right-handed frames", "reflection")

    t = q_mean - r @ p_mean
    residual_rows = r @ Pc
    np.subtract(Qc, residual_rows, out=residual_rows)   # measured − (R nominal + t), as (3, N)
    sq = np.einsum("ij,ij->j", residual_rows, residual_rows)
    rms = float(np.sqrt(sq @ weight))
    distances = np.sqrt(sq, out=sq)
    flagged, threshold = _flag(distances, size)
    rms_unit_scale = rms
    if scale != 1.0:
        extra = () if threshold is None else (threshold,)
        t, residual_rows, distances, rms, *extra = _scaled_back(scale, t, residual_rows, distances, rms, *extra)
        rms, threshold = float(rms), float(extra[0]) if extra else None
    residuals = residual_rows.T

    notes = []
    if spread_ratio < COLLINEAR_NOTE:
        off_line = float(np.sqrt(max(spread[1] + spread[0], 0.0)))
        uncertainty = np.degrees(np.arctan2(rms_unit_scale, off_line * np.sqrt(used)))
        notes.append(f"the nominal points are nearly collinear (off-line spread {spread_ratio:.2g} of the "
                     f"along-line spread): the rotation about their line is weakly determined, about "
                     f"±{uncertainty:.2g}° from the residuals")
    if n < FLAG_MIN_POINTS:
        notes.append(f"with {n} points no point is flagged: the fit absorbs a single bad point "
                     f"(at least {FLAG_MIN_POINTS} are needed)")
    # r is orthogonal by construction (U Vᵀ of an SVD): no orthogonality band to apply.
    orientation = Orientation(kernels.matrices_to_quaternions(r))
    return PointFit(orientation, t, residuals, distances, rms, int(np.argmax(distances)), flagged, threshold,
                    spread_ratio, tuple(notes))


def _eigenvalues(symmetric):
    """Ascending eigenvalues of a 3x3 symmetric matrix; a failure is the fit's own refusal."""
    try:
        return np.linalg.eigvalsh(symmetric)
    except np.linalg.LinAlgError as exc:
        raise FitRefusedError(f"the spread of the points could not be computed ({exc}); expected ordinary "
                              f"coordinates", "numerical") from None


def _median(values):
    k = len(values) // 2
    part = np.partition(values, k)
    return float(part[k]) if len(values) % 2 else 0.5 * float(part[k] + part[:k].max())


def _flag(distances, size):
    if len(distances) < FLAG_MIN_POINTS:
        return (), None
    median = _median(distances)
    mad = _median(np.abs(distances - median))
    threshold = max(median + FLAG_Z * mad / _MAD_TO_Z, 1e-9 * size)
    return tuple(int(i) for i in np.flatnonzero(distances > threshold)), threshold


# --- three datum points ----------------------------------------------------------------------------

@dataclass(frozen=True)
class PointFrame:
    """orientation: body -> reference; origin: the body origin in the reference frame."""

    orientation: Orientation
    origin: np.ndarray
    x_distance: float       # from the origin to the X-axis point
    off_axis_distance: float  # of the XY-plane point from the X axis
    notes: tuple = ()


def frame_from_three_points(origin, on_x_axis, in_xy_plane):
    """The body frame from three measured points (reference frame): X from the origin towards the X-axis
    point, Z normal to the plane of the three (right-handed, so the third point is on the +Y side),
    Y = Z × X."""
    points = read_points([origin, on_x_axis, in_xy_plane], "three datum points")
    # At unit scale (a power of two, exact), so differences and lengths of any finite points are in range.
    scale = _binary_scale(_largest(points))
    o, a, b = points / scale
    x, x_length = _length(a - o)
    to_b, b_length = _length(b - o)
    size = max(x_length, b_length)
    if x_length == 0 or x_length <= 1e-12 * size:
        raise FitRefusedError("the X-axis point coincides with the origin; expected a point some way along "
                              "the body +X axis", "collinear")
    z, off_axis = _length(np.cross(x, to_b) * b_length)
    if off_axis <= 1e-9 * size:
        raise FitRefusedError("the XY-plane point lies on the X axis: the rotation about X is not "
                              "determined; expected a point well off the X axis, on the +Y side", "collinear")
    y = np.cross(z, x)
    x_distance, off_axis_distance = _scaled_back(scale, x_length, off_axis, what="the distances between the points")
    notes = ()
    if off_axis < COLLINEAR_NOTE * x_length:
        notes = (f"the XY-plane point is only {off_axis_distance:.3g} off the X axis ({off_axis / x_length:.2g} "
                 f"of the X distance): the rotation about X is weakly determined",)
    return PointFrame(Orientation(kernels.matrices_to_quaternions(np.column_stack([x, y, z]))), points[0],
                      float(x_distance), float(off_axis_distance), notes)


def _length(v):
    """(unit vector, length) of a 3-vector at unit scale; (v, 0.0) for the zero vector."""
    length = float(np.linalg.norm(v))
    return (v / length if length > 0 else v), length
