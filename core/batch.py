"""Batch check: a CSV of many mounts, nominal against measured, becomes a table of deviations with the
out-of-tolerance rows flagged, written back as CSV.

Input file
----------
Comma-separated, '.' as decimal point, first line the header. Cells may be quoted ("a, b"). The Unicode
minus (−), the en dash used as a minus and non-breaking spaces are accepted in number cells. Blank lines
are skipped.

The first column is ``name``. The other columns are two sets, each named with its prefix ``nominal_`` or
``measured_`` followed by one of these field groups (all fields of the group, in any column order):

    qw qx qy qz                      quaternion, Hamilton (names say which number is w)
    r11 r12 r13 r21 ... r33          matrix, r<row><column> as printed
    axis_x axis_y axis_z angle       axis and angle
    rv_x rv_y rv_z                   rotation vector (angle × unit axis)
    gibbs_x gibbs_y gibbs_z          Gibbs vector (classical Rodrigues parameters, n tan(angle/2))
    mrp_x mrp_y mrp_z                modified Rodrigues parameters (n tan(angle/4), either set)
    yaw pitch roll                   yaw–pitch–roll: intrinsic ZYX (= roll–pitch–yaw about fixed axes)
    angle1 angle2 angle3             three angles of a sequence that must be stated

(the field groups of core/representations.py, its batch_columns, plus yaw pitch roll)

Conventions are written in square brackets after a column name, as words separated by spaces, on any
one column of the set (or spread over several; they must not contradict each other)::

    deg | rad                                angles and rotation vectors (default deg)
    ZYX, Z-Y'-X'', XZX, ...                  the sequence of angle1..angle3
    intrinsic | extrinsic                    for angle1..angle3
    body_to_reference | reference_to_body    what the nine matrix numbers mean (default body_to_reference)

Example header::

    name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_angle1[XYZ extrinsic deg],measured_angle2,measured_angle3

An optional column ``uncertainty_deg`` gives each row's standard uncertainty u of the measured orientation
(degrees, 0 to 180, a number in every row), taken as the standard uncertainty of every figure judged. Rows
are then also decided by ISO 14253-1 (see core/decision.py): with U = k·u (coverage k, default 2) a row
*conforms* when its margin is at least U, *does not conform* when its margin is below −U, and otherwise
the measurement *cannot decide*.

Conventions can also be passed in (`SetConventions`) for a file whose header has none; a passed-in value
that contradicts the header is refused, never silently preferred. Other columns (serial, notes) are
ignored and named in the table's notes; an unknown ``nominal_``/``measured_`` column is refused (a typo).

A file that is not a table (its header unreadable, no rows, a line over MAX_LINE_CHARS, unbalanced
quotes) is refused whole with a BatchFileError naming the line (and column). A row whose numbers cannot
be trusted (not a number, not finite, outside the range its meaning allows, the wrong number of cells)
is an error row: a RowProblem names its line, column and what was expected; it is counted apart and never
judged pass or fail. Line endings may be LF, CR LF or a bare CR.

Output file
-----------
``name,total_deviation_deg,deviation_axis_x,deviation_axis_y,deviation_axis_z[,pointing_error_deg,roll_deg],result,margin_deg[,uncertainty_deg,decision],problem``
with the deviation D = Nᵀ M and its axis in the nominal body frame, the pointing error and roll of the
chosen body axis when one is set, ``pass``/``fail`` and the margin (tolerance − value, the smallest of
the criteria) under the CheckSettings given (see core/check.py); an error row has empty figures, ``error``
and its problem. Text cells are spreadsheet-safe (core/csv_cells.py).

The arithmetic is vectorised over all rows (core/kernels.py on arrays); rows are processed in chunks of
CHUNK_ROWS only so that a progress callback can report and cancel.

The pieces, one purpose each: batch_header (column sets and conventions), batch_cells (reading the rows),
batch_quaternions (numbers to quaternions); this module reads a file with them, computes the deviations
and writes the table, and names everything it did before the split.
"""

from __future__ import annotations

import csv
from dataclasses import dataclass

import numpy as np

from core.batch_cells import (MAX_ANGLE_DEG, MAX_CELL_CHARS, MAX_HEADER_CHARS, MAX_LINE_CHARS, MAX_MATRIX_ENTRY,
                              QUATERNION_LENGTHS, RowProblem, _check_line_lengths, _read_cells, _row_lines, _where,
                              normalise_line_ends)
from core.batch_header import (MATRIX_MEANINGS, REPRESENTATIONS, ROLES, UNCERTAINTY_COLUMN, BatchCancelledError,
                               BatchFileError, ColumnSet, SetConventions, _read_header)
from core.batch_quaternions import _to_quaternions, scaled_lengths
from core.check import ROUNDING_ALLOWANCE_DEG, CheckSettings, deviation_angles, deviation_axes, deviation_quaternions, swing_twist_angles
from core.csv_cells import spreadsheet_safe
from core.decision import CANNOT_DECIDE, CONFORMS, DEFAULT_COVERAGE, DOES_NOT_CONFORM
from core.errors import InvalidInputError

CHUNK_ROWS = 50_000
MAX_UNCERTAINTY_DEG = 180.0


@dataclass(frozen=True)
class MountTable:
    names: tuple
    nominal: np.ndarray     # (N, 4) unit quaternions, w-first
    measured: np.ndarray
    sets: tuple             # (nominal ColumnSet, measured ColumnSet)
    notes: tuple = ()
    problems: tuple = ()    # RowProblem of every error row (its quaternions are placeholders, never judged)
    uncertainty: np.ndarray | None = None   # (N,) standard uncertainty in degrees, when the file has the column

    def error_rows(self):
        """(N,) True where the row is in error."""
        error = np.zeros(len(self.names), dtype=bool)
        error[[p.row for p in self.problems]] = True
        return error


@dataclass(frozen=True)
class BatchResult:
    names: tuple
    total_deg: np.ndarray
    axis: np.ndarray
    pointing_deg: np.ndarray | None
    roll_deg: np.ndarray | None
    passed: np.ndarray
    margin_deg: np.ndarray
    settings: CheckSettings
    notes: tuple = ()
    problems: tuple = ()          # RowProblem per error row; their figures are NaN and passed is False
    error: np.ndarray | None = None   # (N,) True where the row is in error (None: no error rows)
    uncertainty_deg: np.ndarray | None = None   # (N,) u per row, when the file gives it
    coverage: float = DEFAULT_COVERAGE
    decision: tuple | None = None  # ISO 14253-1 outcome per row ('' for error rows), with an uncertainty

    def decision_counts(self):
        """{outcome: rows} of the decided rows (empty without an uncertainty column)."""
        if self.decision is None:
            return {}
        return {o: self.decision.count(o) for o in (CONFORMS, DOES_NOT_CONFORM, CANNOT_DECIDE)}

    def error_mask(self):
        return np.zeros(len(self.names), dtype=bool) if self.error is None else self.error

    @property
    def error_count(self):
        return len(self.problems)

    @property
    def failed_count(self):
        """Rows judged and outside the tolerance (error rows are counted apart)."""
        return int(np.count_nonzero(~self.passed & ~self.error_mask()))

    @property
    def passed_count(self):
        return int(np.count_nonzero(self.passed))

    def verdicts(self):
        """'pass', 'fail' or 'error' per row, in file order."""
        return np.where(self.error_mask(), "error", np.where(self.passed, "pass", "fail")).tolist()

    def problem_texts(self):
        """{row: message} of the error rows."""
        return {p.row: p.message for p in self.problems}


def _report(progress, done, total, stage):
    if progress is not None and progress(done, total, stage) is False:
        raise BatchCancelledError(f"batch cancelled while {stage} ({done} of {total})")


def read_mounts(text, nominal=None, measured=None, progress=None):
    """Read a batch CSV (the text of the file) into unit quaternions per row. `nominal` / `measured` are
    optional SetConventions for a header that states none.

    A file whose header cannot be read, with no rows, with a line too long or with unbalanced quotes is
    refused whole (BatchFileError). A row whose numbers cannot be trusted (not a number, not finite, out of
    the range its meaning allows, the wrong number of cells) becomes an error row: its RowProblem names
    line, column and what was expected, and it is never judged."""
    if not isinstance(text, str):
        raise InvalidInputError(f"batch file: expected the file's text, got {type(text).__name__}")
    text = normalise_line_ends(text.lstrip("\ufeff"))
    first_line = text.split("\n", 1)[0]
    if len(first_line) > MAX_HEADER_CHARS:
        _check_line_lengths(first_line, None)
    header = next(csv.reader([first_line]), [])
    sets, ignored, uncertainty_index = _read_header(header, nominal, measured)
    _check_line_lengths(text, header)
    _report(progress, 0, 1, "reading")
    numeric = [i for s in sets for i in s.indices] + ([uncertainty_index] if uncertainty_index else [])
    names, values, problems = _read_cells(text, header, numeric)
    if len(names) == 0:
        raise BatchFileError("the file has a header but no rows; expected one row per mount", line=2)
    notes = [f"ignored column(s): {', '.join(ignored)}"] if ignored else []
    width = len(sets[0].indices)
    usable = np.ones(len(names), dtype=bool)
    usable[[p.row for p in problems]] = False
    nominal_q, bad_nominal, usable = _to_quaternions(sets[0], values[:, :width], usable, notes)
    measured_q, bad_measured, usable = _to_quaternions(sets[1], values[:, width:width + len(sets[1].indices)],
                                                       usable, notes)
    found = {**bad_measured, **bad_nominal}
    uncertainty = None
    if uncertainty_index:
        uncertainty = values[:, -1].copy()
        bad_u = usable & ~((uncertainty >= 0) & (uncertainty <= MAX_UNCERTAINTY_DEG))
        lines = _row_lines(text) if bad_u.any() else []
        for row in np.flatnonzero(bad_u):
            if row not in found:
                problems.append(RowProblem(int(row), lines[row], header[uncertainty_index],
                                           f"{_where(lines[row], row, names[row])}, column {header[uncertainty_index]!r}:"
                                           f" {uncertainty[row]:g} is not a standard uncertainty; expected 0 to"
                                           f" {MAX_UNCERTAINTY_DEG:g} degrees"))
        uncertainty[~usable | bad_u] = np.nan
    if found:
        lines = _row_lines(text)
        for row, what in found.items():
            column_set = sets[0] if row in bad_nominal else sets[1]
            problems.append(RowProblem(row, lines[row], column_set.columns[0],
                                       f"{_where(lines[row], row, names[row])}, {what}"))
    _report(progress, 1, 1, "reading")
    return MountTable(names, nominal_q, measured_q, sets, tuple(notes),
                      tuple(sorted(problems, key=lambda p: p.row)), uncertainty)


# --- deviations -------------------------------------------------------------------------------------

def compute_deviations(table, settings=CheckSettings(), progress=None, coverage=DEFAULT_COVERAGE):
    """Deviation of every row under `settings` (vectorised; chunked only to report progress); with an
    uncertainty column, the ISO 14253-1 decision of every row with expanded uncertainty U = coverage·u."""
    n = len(table.names)
    axis = settings.axis_vector()
    total = np.empty(n)
    dev_axis = np.empty((n, 3))
    pointing = np.empty(n) if axis is not None else None
    roll = np.empty(n) if axis is not None else None
    judged_roll = np.empty(n) if axis is not None else None   # an undefined roll is judged as 180° (check.py)
    for start in range(0, n, CHUNK_ROWS):
        part = slice(start, min(start + CHUNK_ROWS, n))
        d = deviation_quaternions(table.nominal[part], table.measured[part])
        total[part] = np.degrees(deviation_angles(d))
        dev_axis[part] = deviation_axes(d)
        if axis is not None:
            swing, twist, defined = swing_twist_angles(d, axis)
            pointing[part] = np.degrees(swing)
            roll[part] = np.degrees(twist)
            judged_roll[part] = np.where(defined, np.abs(roll[part]), 180.0)
        _report(progress, part.stop, n, "computing")
    if settings.mode == "total":
        margin = settings.total_tolerance_deg - total
    else:
        margin = np.minimum(settings.pointing_tolerance_deg - pointing,
                            settings.roll_tolerance_deg - judged_roll)
    error = table.error_rows()
    problems = list(table.problems)
    figures = [total, dev_axis, margin] + ([pointing, roll] if axis is not None else [])
    # Belt and braces: a figure that came out non-finite from trusted input is an error, never a verdict.
    # No text reaches this: read_mounts makes every row it does not refuse a finite unit quaternion, and
    # CheckSettings holds finite tolerances, so every figure is finite. A MountTable built by a caller
    # (it is a public value) can carry NaN in a row with no problem: that is what this still catches.
    unfinished = ~error & ~np.logical_and.reduce([np.isfinite(f).reshape(n, -1).all(axis=1) for f in figures])
    if unfinished.any():
        for row in np.flatnonzero(unfinished):
            problems.append(RowProblem(int(row), None, None, f"row {row + 1} (mount {table.names[row][:80]!r}): the deviation could not be "
                                       "computed as a finite number; expected finite, in-range numbers"))
        error = error | unfinished
    for f in figures:
        f[error] = np.nan
    passed = (margin >= -ROUNDING_ALLOWANCE_DEG) & ~error
    decision = None
    if table.uncertainty is not None:
        coverage = _coverage(coverage)
        expanded = coverage * table.uncertainty
        outcome = np.where(margin >= expanded - ROUNDING_ALLOWANCE_DEG, CONFORMS,
                           np.where(margin < -expanded - ROUNDING_ALLOWANCE_DEG, DOES_NOT_CONFORM, CANNOT_DECIDE))
        decision = tuple(np.where(error, "", outcome).tolist())
    return BatchResult(table.names, total, dev_axis, pointing, roll, passed, margin, settings, table.notes,
                       tuple(sorted(problems, key=lambda p: p.row)), error if error.any() else None,
                       table.uncertainty, coverage, decision)


def _coverage(k):
    if isinstance(k, bool) or not isinstance(k, (int, float)) or not np.isfinite(k) or not 1 <= k <= 10:
        raise InvalidInputError(f"coverage factor: expected a number from 1 to 10 (usually 2), got {k!r}")
    return float(k)



def _quote(cell):
    cell = spreadsheet_safe(cell)
    if any(c in cell for c in ',"\n\r') or cell != cell.strip():
        return '"' + cell.replace('"', '""') + '"'
    return cell


def write_results(result, decimals=9, progress=None):
    """The results as CSV text (header and one line per mount). Error rows have empty figures, the result
    'error' and the problem in the last column; text cells are made spreadsheet-safe (core/csv_cells.py)."""
    columns = ["total_deviation_deg", "deviation_axis_x", "deviation_axis_y", "deviation_axis_z"]
    arrays = [result.total_deg, result.axis[:, 0], result.axis[:, 1], result.axis[:, 2]]
    if result.pointing_deg is not None:
        columns += ["pointing_error_deg", "roll_deg"]
        arrays += [result.pointing_deg, result.roll_deg]
    number = f"%.{int(decimals)}f"
    decided = result.decision is not None
    row_format = "%s," + ",".join([number] * len(arrays)) + ",%s," + number + (f",{number},%s," if decided else ",")
    verdict = result.verdicts()
    names = [_quote(n) for n in result.names]
    problems = result.problem_texts()
    blank = "," * len(arrays) + ",error,," + (",," if decided else "")
    lines = [",".join(["name"] + columns + ["result", "margin_deg"] + (["uncertainty_deg", "decision"] if decided
                                                                         else []) + ["problem"])]
    n = len(names)
    for start in range(0, n, CHUNK_ROWS):
        stop = min(start + CHUNK_ROWS, n)
        # Rounding first and adding 0.0 turns tiny negatives into 0.0, so no "-0.000000000" is written.
        cols = [(np.round(a[start:stop], decimals) + 0.0).tolist() for a in arrays + [result.margin_deg]]
        extra = []
        if decided:
            extra = [(np.round(result.uncertainty_deg[start:stop], decimals) + 0.0).tolist(),
                     list(result.decision[start:stop])]
        lines.extend(map(row_format.__mod__, zip(names[start:stop], *cols[:-1], verdict[start:stop], cols[-1],
                                                  *extra)))
        for row in (r for r in problems if start <= r < stop):
            lines[1 + row] = names[row] + blank + _quote(problems[row])
        _report(progress, stop, n, "writing")
    return "\n".join(lines) + "\n"


def run_batch(text, settings=CheckSettings(), nominal=None, measured=None, progress=None, decimals=9,
              coverage=DEFAULT_COVERAGE):
    """CSV text in, (BatchResult, results CSV text) out."""
    table = read_mounts(text, nominal, measured, progress)
    result = compute_deviations(table, settings, progress, coverage)
    return result, write_results(result, decimals, progress)


__all__ = ["CHUNK_ROWS", "MATRIX_MEANINGS", "MAX_ANGLE_DEG", "MAX_CELL_CHARS", "MAX_HEADER_CHARS", "MAX_LINE_CHARS",
           "MAX_MATRIX_ENTRY", "MAX_UNCERTAINTY_DEG", "QUATERNION_LENGTHS", "REPRESENTATIONS", "ROLES",
           "UNCERTAINTY_COLUMN", "BatchCancelledError", "BatchFileError", "BatchResult", "ColumnSet", "MountTable",
           "RowProblem", "SetConventions", "compute_deviations", "normalise_line_ends", "read_mounts", "run_batch",
           "scaled_lengths", "write_results"]
