"""What the Measure panel computes and shows, apart from the widgets (no Qt here): one function per
method that calls core/fit.py, the record the panel emits (`MeasuredFit`), and the words for a result."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from app.text import numbers, significant
from core.direction_fit import fit_directions, triad
from core.fit import FitRefusedError, fit_points, frame_from_three_points
from core.kernels import unit_vectors
from core.errors import FramewrightError
from core.orientation import Orientation
from core.uncertainty import direction_fit_uncertainty, point_fit_uncertainty

POINTS, THREE_POINTS, DIRECTIONS = "points", "three_points", "directions"


@dataclass(frozen=True)
class MeasuredFit:
    """The last fit, for a view that draws it (the Scene: points and residual vectors).

    method: POINTS, THREE_POINTS or DIRECTIONS. rows: the 0-based table rows used, in order.
    nominal: body-frame points or directions (None for three datum points); measured: reference-frame
    points or unit directions; fitted: where the fit puts each nominal, in the reference frame
    (R p + t, or R b); residuals: measured − fitted (reference frame); per_row: residual distance (length
    unit) or angle (degrees); flagged: positions in `rows` that the fit flags; fit: the core result."""

    method: str
    orientation: Orientation
    translation: np.ndarray | None
    rows: tuple
    nominal: np.ndarray | None
    measured: np.ndarray
    fitted: np.ndarray | None
    residuals: np.ndarray | None
    per_row: np.ndarray | None
    flagged: tuple
    worst: int | None
    fit: object
    unit: str = "mm"
    uncertainty_deg: float | None = None     # a point fit's largest standard uncertainty (core/uncertainty.py)
    uncertainty_axes_deg: tuple | None = None
    covariance_rad2: np.ndarray | None = None  # of the fitted orientation, a small turn in the reference frame


def fit_point_rows(values: np.ndarray, weights: np.ndarray | None, rows: list[int], unit: str) -> MeasuredFit:
    nominal, measured = values[:, :3], values[:, 3:6]
    if weights is not None and np.all(weights == 1.0):
        weights = None  # plain RMS, as a person expects when no weight was typed
    fit = fit_points(nominal, measured, weights)
    with np.errstate(over="ignore", invalid="ignore"):
        fitted = measured - fit.residuals
    if not np.isfinite(fitted).all():   # R p + t beyond the largest double: nothing to draw it with
        raise FitRefusedError("the fitted points lie beyond the largest number a double holds (about 1.8e308); "
                              "expected coordinates well inside that", "range")
    try:
        largest, per_axis, covariance = point_fit_uncertainty(nominal, fit.orientation, fit.residuals, weights)
    except FramewrightError:
        largest, per_axis, covariance = None, None, None
    return MeasuredFit(POINTS, fit.orientation, fit.translation, tuple(rows), nominal, measured, fitted,
                       fit.residuals, fit.distances, fit.flagged, fit.worst_index, fit, unit, largest, per_axis,
                       covariance)


def fit_three_points(values: np.ndarray, rows: list[int], unit: str) -> MeasuredFit:
    frame = frame_from_three_points(values[0], values[1], values[2])
    return MeasuredFit(THREE_POINTS, frame.orientation, frame.origin, tuple(rows), None, values, None, None, None,
                       (), None, frame, unit)


def fit_direction_rows(values: np.ndarray, weights: np.ndarray | None, rows: list[int]) -> MeasuredFit:
    """TRIAD for exactly two directions of full weight (the first matched exactly); the least-squares
    answer otherwise."""
    body, reference = values[:, :3], values[:, 3:6]
    if len(body) == 2 and (weights is None or np.all(weights > 0)):
        fit = triad(body[0], body[1], reference[0], reference[1])
    else:
        fit = fit_directions(body, reference, weights)
    unit_body = unit_vectors(body, "body direction")[0]        # scaled: 1e200 and 1e-200 are directions too
    unit_ref = unit_vectors(reference, "reference direction")[0]
    fitted = fit.orientation.apply(unit_body)
    residual = fit.residual_angles_deg
    try:   # the QUEST covariance from the residuals, for three or more directions (core/uncertainty.py)
        largest, per_axis, covariance = direction_fit_uncertainty(unit_ref, fit.orientation, residual, weights)
    except FramewrightError:
        largest, per_axis, covariance = None, None, None
    return MeasuredFit(DIRECTIONS, fit.orientation, None, tuple(rows), unit_body, unit_ref, fitted,
                       unit_ref - fitted, residual, (), int(np.argmax(residual)), fit, "mm", largest, per_axis,
                       covariance)


# ---- words --------------------------------------------------------------------------------------

def _short(value) -> str:
    """Four significant digits; round-off (below 1e-7) shows as 0."""
    return significant(value, 4)


def _vector(values, digits) -> str:
    return "[" + numbers(values, digits) + "]"


def orientation_lines(orientation: Orientation, digits: int = 9, sequence: str = "ZYX",
                      intrinsic: bool = True) -> list[str]:
    """The orientation in plain forms: axis and angle, quaternion, angles, matrix (body → reference)."""
    axis, angle = orientation.as_axis_angle()
    w, x, y, z = orientation.as_quaternion()
    angles = orientation.as_angles(sequence, intrinsic)
    kind = "intrinsic" if intrinsic else "extrinsic"
    lines = [f"Axis & angle: {significant(angle, digits)}° about {_vector(axis, digits)}"
             if significant(angle, digits) != "0" else "Axis & angle: 0° (no rotation from the reference)",
             f"Quaternion (w, x, y, z): {_vector((w, x, y, z), digits)}",
             f"Angles {angles.sequence} {kind} (°): {_vector(angles.angles, digits)}"
             + (" — gimbal lock: only the first and third together are known" if angles.locked else ""),
             "Matrix, body → reference (columns are the body axes):"]
    lines += ["    " + _vector(row, digits) for row in orientation.as_matrix()]
    return lines


def result_lines(result: MeasuredFit, digits: int = 9, sequence: str = "ZYX", intrinsic: bool = True) -> list[str]:
    unit = result.unit
    fit = result.fit
    lines = []
    if result.method == POINTS:
        n = len(result.rows)
        lines.append(f"Best fit of {n} point pairs (measured ≈ R · nominal + t).")
        lines += orientation_lines(result.orientation, digits, sequence, intrinsic)
        lines.append(f"Translation t (reference frame, {unit}): {_vector(result.translation, digits)}")
        worst_row = result.rows[result.worst] + 1
        lines.append(f"RMS residual {_short(fit.rms)} {unit}; worst point: row {worst_row} at "
                     f"{_short(fit.distances[fit.worst_index])} {unit}")
        if fit.flagged:
            rows = ", ".join(str(result.rows[i] + 1) for i in fit.flagged)
            lines.append(f"Flagged (residual above {fit.flag_threshold:.4g} {unit}): row(s) {rows}. Look at "
                         f"them again; give a weight of 0 to leave one out of the fit.")
        elif fit.flag_threshold is not None:
            lines.append(f"No point flagged (limit {fit.flag_threshold:.4g} {unit}).")
        lines.append(f"Spread of the nominal points off their main line: {fit.spread_ratio:.3g} "
                     f"(0 = all on one line, 1 = well spread).")
        if result.uncertainty_deg is not None:
            axes = ", ".join(_short(v) for v in result.uncertainty_axes_deg)
            lines.append(f"Standard uncertainty of the orientation (from the residuals): {_short(result.uncertainty_deg)}°"
                         f" at most; about reference X, Y, Z: {axes}°.")
    elif result.method == THREE_POINTS:
        lines.append("Body frame from three datum points (3-2-1): X towards the second point, Z normal to "
                     "the plane of the three, the third point on the +Y side.")
        lines += orientation_lines(result.orientation, digits, sequence, intrinsic)
        lines.append(f"Body origin (reference frame, {unit}): {_vector(result.translation, digits)}")
        lines.append(f"Origin to X-axis point {fit.x_distance:.6g} {unit}; XY-plane point {fit.off_axis_distance:.6g} "
                     f"{unit} off the X axis.")
    else:
        n = len(result.rows)
        how = ("TRIAD: the first direction is matched exactly, the second as well as their plane allows"
               if fit.method == "TRIAD" else f"least squares over {n} directions")
        lines.append(f"From {n} directions ({how}).")
        lines += orientation_lines(result.orientation, digits, sequence, intrinsic)
        lines.append(f"Body directions {fit.pair_angle_deg:.4g}° apart, measured {fit.reference_pair_angle_deg:.4g}° "
                     f"apart: mismatch {fit.mismatch_deg:.4g}° (no rotation can remove it).")
        lines.append(f"Largest residual: row {result.rows[result.worst] + 1} at "
                     f"{float(np.max(fit.residual_angles_deg)):.4g}°")
        if result.uncertainty_deg is not None:
            axes = ", ".join(_short(v) for v in result.uncertainty_axes_deg)
            lines.append(f"Standard uncertainty of the orientation (QUEST covariance, the directions' spread from "
                         f"the residuals): {_short(result.uncertainty_deg)}° at most; about reference X, Y, Z: "
                         f"{axes}°.")
    lines += [f"Note: {note}" for note in fit.notes]
    return lines


def row_outputs(result: MeasuredFit) -> tuple[list[list[str]], set[int]]:
    """Texts of the residual and flag columns per used row, and the table rows to mark."""
    if result.per_row is None:
        return [], set()
    flagged = set(result.flagged)
    texts = []
    for position, value in enumerate(result.per_row):
        mark = "flagged" if position in flagged else ("worst" if position == result.worst else "")
        texts.append([_short(value), mark])
    return texts, {result.rows[i] for i in flagged}
