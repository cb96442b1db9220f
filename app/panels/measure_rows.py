"""Rows of numbers for the Measure tables, from a spreadsheet paste or a CSV file (no Qt here).

A paste goes through the decoder's number reading (`core.decode.parse_numbers`): the Unicode minus, en
dash as minus, non-breaking spaces, scientific notation; words such as point names ("P1") are set aside
with a note. One pasted line is one table row. '.' is the decimal point whatever the locale, so a line
that separates cells with tabs or ';' and also holds '1,5' is refused as a likely decimal comma rather
than read as two numbers.

A CSV file is read by `core.point_rows.rows_from_csv` (re-exported here), which the command line
shares; the columns of each table and the header names they accept are defined there too.
"""

from __future__ import annotations

import re

from core.errors import FramewrightError
from core.number_text import parse_number
from core.point_rows import Column, Rows, RowsError, header_key, rows_from_csv  # noqa: F401  (re-exported)

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
