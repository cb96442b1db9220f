"""A batch file's rows: the caps on line and cell lengths, line endings, the number cells read fast by
numpy or row by row, and a RowProblem for each row that cannot be read."""

from __future__ import annotations

import csv
import io
import warnings
from dataclasses import dataclass

import numpy as np

from core.batch_header import BatchFileError


# Caps checked before the csv module sees the text (its own limit, 131,072 characters per field, is
# process-wide and raises a bare csv.Error): no number or name needs more.
MAX_LINE_CHARS = 100_000
MAX_HEADER_CHARS = 20_000
MAX_CELL_CHARS = 1_000
# The range each kind of number may take before any arithmetic. Angles: ten turns, as the decoder allows
# (beyond that a decimal point was lost, not a mount measured). Matrix entries of a rotation lie in
# [-1, 1]; 1.5 leaves room for rounding and still keeps the SVD far from overflow. A quaternion is about
# unit; a length outside [1e-6, 1e6] is a misplaced number, not one to normalise.
MAX_ANGLE_DEG = 3600.0
MAX_MATRIX_ENTRY = 1.5
QUATERNION_LENGTHS = (1e-6, 1e6)


@dataclass(frozen=True)
class RowProblem:
    """Why one data row cannot be checked. row: 0-based data row; line: 1-based line in the file;
    column: the header cell at fault (None for the row as a whole)."""

    row: int
    line: int | None
    column: str | None
    message: str


def _clean_number_text(text):
    return text.replace("−", "-").replace("–", "-").replace("\u00a0", " ")


def normalise_line_ends(text):
    """CR LF and old-style bare CR become LF, so every reader sees the same lines."""
    return text.replace("\r\n", "\n").replace("\r", "\n")


def _check_line_lengths(text, header):
    """Refuse a line too long to be a table's (naming line and column) before the csv module sees it."""
    for number, line in enumerate(text.split("\n"), start=1):
        limit = MAX_HEADER_CHARS if number == 1 else MAX_LINE_CHARS
        if len(line) > limit:
            pieces = line.split(",")
            index = next((i for i, piece in enumerate(pieces) if len(piece) > MAX_CELL_CHARS), None)
            column = header[index] if header and index is not None and index < len(header) else None
            where = f", column {column!r}" if column else (f", cell {index + 1}" if index is not None else "")
            raise BatchFileError(f"line {number}{where}: the line is {len(line):,} characters long; expected "
                                 f"at most {limit:,}", line=number, column=column)


def _scan_rows(text):
    """(line number, cells) of every non-blank data row, by the csv module (used to locate problems)."""
    reader = csv.reader(io.StringIO(text))
    try:
        next(reader, None)
        for cells in reader:
            if cells and any(c.strip() for c in cells):
                yield reader.line_num, cells
    except csv.Error as error:
        raise BatchFileError(f"line {reader.line_num}: the file is not readable as CSV ({error}); expected "
                             f"comma-separated cells with balanced quotes", line=reader.line_num) from None


def _cell_problem(cell):
    if len(cell) > MAX_CELL_CHARS:
        return f"the cell is {len(cell):,} characters long; expected a number"
    text = _clean_number_text(cell).strip()
    if not text:
        return "is empty; expected a number"
    try:
        value = float(text)
    except ValueError:
        return f"{cell!r} is not a number; expected a decimal number such as -0.25"
    if "_" in text or not np.isfinite(value):
        return f"{cell!r} is not a finite decimal number; expected e.g. -0.25"
    return None


def _where(line, row, name):
    return f"line {line} (row {row + 1}, mount {name[:80]!r})"


def _row_problem(row, line, cells, header, numeric):
    """The first problem of one row (a RowProblem) or None."""
    where = _where(line, row, cells[0])
    if len(cells) != len(header):
        return RowProblem(row, line, None, f"{where} has {len(cells)} cells; expected {len(header)} as in "
                          f"the header")
    if len(cells[0]) > MAX_CELL_CHARS:
        return RowProblem(row, line, header[0], f"{where}, column {header[0]!r}: the name is "
                          f"{len(cells[0]):,} characters long; expected at most {MAX_CELL_CHARS:,}")
    for index in numeric:
        problem = _cell_problem(cells[index])
        if problem:
            return RowProblem(row, line, header[index], f"{where}, column {header[index]!r}: {problem}")
    return None


def _read_one_by_one(text, header, numeric):
    """Every row through the csv module: names, values (NaN in rows that cannot be read) and problems."""
    names, rows, problems = [], [], []
    for row, (line, cells) in enumerate(_scan_rows(text)):
        names.append(cells[0][:MAX_CELL_CHARS])
        problem = _row_problem(row, line, cells, header, numeric)
        if problem is None:
            rows.append([float(_clean_number_text(cells[i]).strip()) for i in numeric])
        else:
            problems.append(problem)
            rows.append([np.nan] * len(numeric))
    values = np.array(rows, dtype=np.float64).reshape(len(rows), len(numeric))
    return tuple(names), values, problems


def _has_long_cell(text):
    """Whether some cell may be over MAX_CELL_CHARS (numpy's reader would take a 1,001-character number):
    such a file is read row by row, where the limit is applied. Splitting at every comma never makes a
    cell look longer than it is."""
    return any(len(line) > MAX_CELL_CHARS and any(len(piece) > MAX_CELL_CHARS for piece in line.split(","))
               for line in text.split("\n")[1:])


def _structure_problems(text, header):
    """Rows with the wrong number of cells (loadtxt's usecols would not notice extra cells)."""
    if '"' in text:
        counts = ((line, len(cells)) for line, cells in _scan_rows(text))
    else:
        lines = text.splitlines()[1:]
        counts = ((i + 2, line.count(",") + 1) for i, line in enumerate(lines) if line.strip())
    return any(count != len(header) for _, count in counts)


def _read_cells(text, header, numeric):
    """Names (tuple), the numeric columns (N, len(numeric)) and the RowProblems of rows that cannot be
    read. Clean files take numpy's fast reader; any doubt sends every row through the csv module."""
    if _structure_problems(text, header) or _has_long_cell(text):
        return _read_one_by_one(text, header, numeric)
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", UserWarning)
            values = np.loadtxt(io.StringIO(_clean_number_text(text)), delimiter=",", skiprows=1,
                                usecols=numeric, quotechar='"', comments=None, ndmin=2, dtype=np.float64)
        with warnings.catch_warnings():
            # numpy remarks that blank lines are not counted as rows; skipping them is what we want.
            warnings.simplefilter("ignore", UserWarning)
            names = np.loadtxt(io.StringIO(text), delimiter=",", skiprows=1, usecols=[0], quotechar='"',
                               comments=None, ndmin=1, dtype=str)
    except ValueError:
        return _read_one_by_one(text, header, numeric)
    if not np.isfinite(values).all() or values.shape[0] != names.shape[0] \
            or (names.size and max(map(len, names.tolist())) > MAX_CELL_CHARS):
        return _read_one_by_one(text, header, numeric)
    return tuple(names.tolist()), values, []


def _row_lines(text):
    """1-based line of every data row, in order."""
    return [line for line, _ in _scan_rows(text)]
