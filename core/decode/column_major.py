"""Matrices the text says are column-major: numbers written column after column.

Numbers on one line (or in one list) are read row after row unless the text says column-major; then they
are the columns one after another. Numbers laid out in lines of four are ambiguous once the text says
column-major (the words may be about how a program stores the matrix, not how it printed it): the line
holding 0 0 0 1 tells rows from columns, and when both readings have it the text is refused unless they
agree."""

from __future__ import annotations

import re

import numpy as np

from core.errors import DecodeError

_COLUMN_MAJOR = re.compile(r"column[ _-]?major|col[ _-]?major|fortran order|order=['\"]?f")
_LAST_ROW = (0.0, 0.0, 0.0, 1.0)
_PRINT_PRECISION = 5e-4
READ_BY_COLUMNS = "the text says column-major: read column after column"


def says_column_major(text: str) -> bool:
    return bool(_COLUMN_MAJOR.search(text.lower()))


def _ends_in_unit_row(grid: np.ndarray) -> bool:
    return bool(np.allclose(grid[3], _LAST_ROW, atol=_PRINT_PRECISION, rtol=0))


def transform_grid(values, laid_out_in_lines: bool, line: int) -> tuple[list[list[float]], list[str]]:
    """The rows of a 4x4 written column-major (16 numbers), and the notes saying how they were read."""
    if len(values) != 16:
        raise DecodeError(f"line {line}: a column-major 3x4 matrix is ambiguous (3 columns of 4 or 4 of 3?):"
                          " write it row-major")
    written = np.array(values, dtype=float).reshape(4, 4)
    if not laid_out_in_lines:
        return written.T.tolist(), [READ_BY_COLUMNS]
    rows_fit, columns_fit = _ends_in_unit_row(written), _ends_in_unit_row(written.T)
    if rows_fit and columns_fit and not np.allclose(written, written.T, atol=_PRINT_PRECISION, rtol=0):
        raise DecodeError(f"line {line}: the text says column-major, but the numbers are laid out in lines and"
                          " both their first three rows and columns end in 0 (no translation): whether the lines"
                          " are rows or columns cannot be told; write the matrix row after row")
    if columns_fit and not rows_fit:
        return written.T.tolist(), ["the text says column-major and the line holding 0 0 0 1 is the last"
                                    " column: each written line is a column"]
    return written.tolist(), ["the text says column-major, but the last written line is 0 0 0 1: each written"
                              " line is a row, read as laid out"]


def rotation_values(values, line: int, key: str) -> tuple[list[float], list[str]]:
    """Nine numbers of one list written column-major, as the rows of the matrix, and a note."""
    if len(values) != 9:
        raise DecodeError(f"line {line}: '{key}' holds {len(values)} numbers; a rotation matrix is 9")
    return np.array(values, dtype=float).reshape(3, 3).T.ravel().tolist(), [
        f"'{key}': {READ_BY_COLUMNS}"]


def laid_out_in_lines(field) -> bool:
    """Rows below the key ('a ; b') or nested lists ('[[…], […]]'), not one flat list (a pose_fields Field)."""
    return ";" in field.value or bool(re.search(r"\]\s*,?\s*\[", field.value))


def matrix_numbers(field, values, column_major: bool) -> tuple[list[float], list[str]]:
    """Nine numbers of a rotation matrix as rows: a flat list the text says is column-major is read column
    after column; laid out in lines, rows and columns cannot be told apart and the text is refused."""
    if not column_major:
        return list(values), []
    if laid_out_in_lines(field):
        raise DecodeError(f"line {field.line}: the text says column-major, but '{field.key[:40]}' is laid out in"
                          " lines: whether they are rows or columns cannot be told; write it row after row")
    return rotation_values(values, field.line, field.key[:40])
