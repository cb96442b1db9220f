"""The Measure tables' rows as CSV (no Qt): the columns of each table, the header names each column
accepts, and the reader. One definition serves the Measure panel's Import CSV and `framewright fit`.

A CSV file has a header row naming its columns; each table column accepts a few header names (see
`Column.keys`), compared without case, spaces, '-' or a trailing unit in brackets ("Measured X [mm]").
Other columns (a point name, a note) are ignored and named in the notes. Cells are read by
`core.number_text.parse_number` ('.' is the decimal point whatever the locale).
"""

from __future__ import annotations

import csv
import io
import re
from dataclasses import dataclass

import numpy as np

from core.number_text import parse_number


class RowsError(ValueError):
    """Text that cannot become table rows; the message points at the line (and column)."""


@dataclass(frozen=True)
class Column:
    """One table column: its title, the tooltip stating its frame and unit, the CSV header names it
    accepts, and its kind: 'input' (a coordinate), 'weight' (optional input, blank = 1) or 'output'."""

    title: str
    tooltip: str
    keys: tuple = ()
    kind: str = "input"


@dataclass(frozen=True)
class Rows:
    """Rows of numbers (None where a line gave no number for a column), with notes on what was set aside;
    texts: the numbers as written (after character clean-up), when they read back to the same value."""

    values: tuple
    notes: tuple = ()
    texts: tuple | None = None


_DECIMAL = "'.' is the decimal point."


def _coordinate_columns(title: str, what: str, keys: tuple) -> list[Column]:
    return [Column(f"{title} {axis}", f"{what}, {axis} coordinate. {_DECIMAL}",
                   tuple(f"{k}_{axis}" for k in keys) + tuple(f"{k}{axis}" for k in keys if len(k) == 1),
                   "input") for axis in "xyz"]


WEIGHT = Column("Weight", "How much this row counts in the fit: a number of 0 or more (blank = 1; 0 leaves the "
                "row out). " + _DECIMAL, ("weight", "w"), "weight")

POINT_COLUMNS = (
    _coordinate_columns("Nominal", "Nominal point in the body frame (from the drawing), in the "
                        "length unit chosen above", ("nominal", "nom", "n"))
    + _coordinate_columns("Measured", "Measured point in the reference frame (arm, tracker), "
                          "in the length unit chosen above", ("measured", "meas", "m"))
    + [WEIGHT,
       Column("Residual", "Distance from the measured point to the fitted nominal point (R · nominal + t), "
              "in the length unit; filled by Fit.", kind="output"),
       Column("Flag", "'flagged': this point's residual stands far above the others (look at it again); "
              "'worst': the largest residual.", kind="output")])

THREE_POINT_COLUMNS = [
    Column(f"Measured {axis}", f"Measured datum point in the reference frame, {axis} coordinate, in the length "
           f"unit chosen above. {_DECIMAL}", (axis, f"measured_{axis}", f"meas_{axis}", f"m{axis}"), "input")
    for axis in "xyz"]
THREE_POINT_ROWS = ["Origin", "On +X axis", "In XY plane (+Y side)"]

DIRECTION_COLUMNS = (
    _coordinate_columns("Body", "Direction in the body frame (e.g. the part's boresight axis, or "
                        "'down' as the part sees it); any length, only the direction counts", ("body", "b"))
    + _coordinate_columns("Measured", "The same direction measured in the reference frame "
                          "(e.g. gravity from a level, a boresight from a sight); any length",
                          ("measured", "reference", "ref", "m", "r"))
    + [WEIGHT,
       Column("Residual (°)", "Angle between the measured direction and the fitted body direction "
              "(R · body), in degrees; filled by Fit.", kind="output")])


def _without_brackets(text: str) -> str:
    """Text with every bracketed part ("[mm]", "(m)") removed, in one pass (a regular expression that
    looks for each '[' 's closing bracket would take time growing with the square of the length)."""
    kept, depth = [], 0
    for character in text:
        if character in "[(":
            depth += 1
        elif character in "])" and depth:
            depth -= 1
        elif not depth:
            kept.append(character)
    return "".join(kept)


def header_key(cell: str) -> str:
    """'Measured X [mm]' -> 'measured_x'."""
    cell = _without_brackets(cell.lstrip("\ufeff")).strip().lower()
    return re.sub(r"[\s\-]+", "_", cell)


# Caps checked before the csv module reads a line (its own field limit is process-wide and raises a bare
# csv.Error): no header, number or note needs more.
MAX_HEADER_CHARS = 20_000
MAX_LINE_CHARS = 100_000
MAX_CELL_CHARS = 1_000
# A coordinate beyond this (a thousand kilometres in millimetres) is a misplaced number, and squaring it in
# the fit would lose every digit of a real part; refused before any arithmetic.
MAX_COORDINATE = 1e9


def _check_lengths(lines: list[str]) -> None:
    for number, line in enumerate(lines, start=1):
        limit = MAX_HEADER_CHARS if number == 1 else MAX_LINE_CHARS
        if len(line) > limit:
            raise RowsError(f"line {number}: {len(line):,} characters; expected at most {limit:,}"
                            + (" in the header row" if number == 1 else ""))


def _delimiter(header_line: str) -> str:
    if "\t" in header_line:
        return "\t"
    if ";" in header_line and "," not in header_line:
        return ";"
    return ","


def rows_from_csv(text: str, columns: list[Column]) -> Rows:
    """Rows for the given input columns (input and weight kinds, in table order) from CSV text."""
    # CR LF and old-style bare CR become LF, so the csv module sees every line end the same way.
    text = text.lstrip("\ufeff").replace("\r\n", "\n").replace("\r", "\n")
    lines = text.split("\n")
    if not lines or not lines[0].strip():
        raise RowsError("line 1: the file is empty; expected a header row naming the columns")
    _check_lengths(lines)
    reader = csv.reader(io.StringIO(text), delimiter=_delimiter(lines[0]))
    try:
        return _read_rows(reader, columns)
    except csv.Error as error:
        raise RowsError(f"line {reader.line_num}: not readable as CSV ({error}); expected cells separated "
                        f"by commas with balanced quotes") from None


def _read_rows(reader, columns: list[Column]) -> Rows:
    header = next(reader)
    for index, cell in enumerate(header):
        if len(cell) > MAX_CELL_CHARS:
            raise RowsError(f"line 1, column {index + 1}: a header cell of {len(cell):,} characters; expected "
                            f"at most {MAX_CELL_CHARS:,}")
    keys = [header_key(c) for c in header]
    where: list[int | None] = []
    for column in columns:
        found = [i for i, k in enumerate(keys) if k in column.keys]
        if len(found) > 1:
            raise RowsError(f"line 1: columns {', '.join(repr(header[i]) for i in found)} all name "
                            f"{column.title}; expected one")
        if not found and column.kind == "input":
            raise RowsError(f"line 1: no column for {column.title}; expected one headed "
                            + " or ".join(repr(k) for k in column.keys[:2]))
        where.append(found[0] if found else None)
    used = {i for i in where if i is not None}
    ignored = [header[i] for i in range(len(header)) if i not in used and header[i].strip()]
    values = []
    for cells in reader:
        if not any(c.strip() for c in cells):
            continue
        line_no = reader.line_num
        row = []
        for column, index in zip(columns, where):
            cell = cells[index] if index is not None and index < len(cells) else ""
            if not cell.strip():
                if column.kind == "input":
                    raise RowsError(f"line {line_no}, column {header[index]!r}: empty; expected a number")
                row.append(None)
                continue
            if len(cell) > MAX_CELL_CHARS:
                raise RowsError(f"line {line_no}, column {header[index]!r}: a cell of {len(cell):,} "
                                f"characters; expected a number")
            try:
                value = parse_number(cell)
            except ValueError as exc:
                raise RowsError(f"line {line_no}, column {header[index]!r}: {exc}") from None
            if abs(value) > MAX_COORDINATE:
                raise RowsError(f"line {line_no}, column {header[index]!r}: {cell.strip()} is beyond "
                                f"±{MAX_COORDINATE:g}; expected a coordinate or weight in the length unit")
            row.append(value)
        values.append(tuple(row))
    if not values:
        raise RowsError("the file has a header but no rows; expected one row per point")
    notes = (f"ignored column(s): {', '.join(ignored)}",) if ignored else ()
    return Rows(tuple(values), notes)


@dataclass(frozen=True)
class PointPairs:
    """Point pairs read from a CSV in the point table's columns: nominal (N, 3) in the body frame,
    measured (N, 3) in the reference frame, weights (N,) or None when the file gives none (blank = 1)."""

    nominal: np.ndarray
    measured: np.ndarray
    weights: np.ndarray | None
    notes: tuple = ()


def read_point_pairs(text: str) -> PointPairs:
    """The point pairs of a CSV file's text; RowsError names the line and column of a bad cell."""
    columns = [c for c in POINT_COLUMNS if c.kind in ("input", "weight")]
    rows = rows_from_csv(text, columns)
    weight_at = columns.index(WEIGHT)
    values = np.array([[v for i, v in enumerate(row) if i != weight_at] for row in rows.values], dtype=float)
    raw = [row[weight_at] for row in rows.values]
    weights = None if all(w is None for w in raw) else np.array([1.0 if w is None else w for w in raw])
    return PointPairs(values[:, :3], values[:, 3:6], weights, rows.notes)
