"""Rows of numbers for the Measure tables, from a spreadsheet paste or a CSV file (no Qt here).

A paste goes through the decoder's number reading (`core.decode.parse_numbers`): the Unicode minus, en
dash as minus, non-breaking spaces, scientific notation; words such as point names ("P1") are set aside
with a note. One pasted line is one table row. '.' is the decimal point whatever the locale, so a line
that separates cells with tabs or ';' and also holds '1,5' is refused as a likely decimal comma rather
than read as two numbers.

A CSV file has a header row naming its columns; each table column accepts a few header names (see
`Column.keys`), compared without case, spaces, '-' or a trailing unit in brackets ("Measured X [mm]").
Other columns (a point name, a note) are ignored and named in the notes.
"""

from __future__ import annotations

import csv
import io
import re
from dataclasses import dataclass

from app.editors.number_field import parse_number
from core.errors import FramewrightError


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


_DECIMAL_COMMA = re.compile(r"\d,\d")


def rows_from_paste(text: str, width: int) -> Rows:
    """Numbers per pasted line, at most `width` per line (the input columns from the paste point on)."""
    from core.decode import parse_numbers  # the one place that knows how people write numbers

    for line_no, line in enumerate(text.splitlines(), start=1):
        if ("\t" in line or ";" in line) and _DECIMAL_COMMA.search(line):
            found = _DECIMAL_COMMA.search(line)
            raise RowsError(f"line {line_no}: '{line[max(0, found.start() - 3):found.end() + 3].strip()}' looks "
                            f"like a decimal comma; use '.' as the decimal point (cells may be separated by "
                            f"tabs, ',' or ';')")
    try:
        parsed = parse_numbers(text)
    except FramewrightError as exc:
        raise RowsError(str(exc)) from None
    by_line: dict[int, list[float]] = {}
    texts: dict[int, list[str]] = {}
    for number in parsed.numbers:
        by_line.setdefault(number.line, []).append(number.value)
        texts.setdefault(number.line, []).append(_as_written(number.text, number.value))
    if not by_line:
        raise RowsError("the pasted text holds no numbers; expected one row of numbers per line")
    for line_no, values in by_line.items():
        if len(values) > width:
            raise RowsError(f"line {line_no} has {len(values)} numbers; expected at most {width} here "
                            f"(one per column from the paste point on)")
    return Rows(tuple(tuple(v) for _, v in sorted(by_line.items())), tuple(parsed.notes),
                tuple(tuple(t) for _, t in sorted(texts.items())))


def _as_written(text: str, value: float) -> str:
    """The number as the sheet wrote it ('0.000', '-1.5'), or its exact value when that text would not read
    back the same in a cell (a unit mark, an exponent written as ×10^)."""
    try:
        if parse_number(text) == value:
            return text
    except ValueError:
        pass
    return repr(float(value))


def header_key(cell: str) -> str:
    """'Measured X [mm]' -> 'measured_x'."""
    cell = re.sub(r"[\[(].*?[\])]", "", cell.lstrip("\ufeff")).strip().lower()
    return re.sub(r"[\s\-]+", "_", cell)


def _delimiter(header_line: str) -> str:
    if "\t" in header_line:
        return "\t"
    if ";" in header_line and "," not in header_line:
        return ";"
    return ","


def rows_from_csv(text: str, columns: list[Column]) -> Rows:
    """Rows for the given input columns (input and weight kinds, in table order) from CSV text."""
    text = text.lstrip("\ufeff")
    lines = text.splitlines()
    if not lines or not lines[0].strip():
        raise RowsError("line 1: the file is empty; expected a header row naming the columns")
    reader = csv.reader(io.StringIO(text), delimiter=_delimiter(lines[0]))
    header = next(reader)
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
            try:
                row.append(parse_number(cell))
            except ValueError as exc:
                raise RowsError(f"line {line_no}, column {header[index]!r}: {exc}") from None
        values.append(tuple(row))
    if not values:
        raise RowsError("the file has a header but no rows; expected one row per point")
    notes = (f"ignored column(s): {', '.join(ignored)}",) if ignored else ()
    return Rows(tuple(values), notes)
