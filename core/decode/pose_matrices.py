"""4x4 homogeneous transforms and 3x4 [R | t] written as bare numbers: four (or three) rows of four, or
16 (12) numbers on one line, row-major unless the text says column-major."""

from __future__ import annotations

import re

from core.decode.numbers import ParsedNumbers
from core.errors import DecodeError
from core.decode.number_refusals import refuse_strays
from core.decode.poses import PoseText, homogeneous, unit_said

_COLUMN_MAJOR = re.compile(r"column[ _-]?major|col[ _-]?major|fortran order|order=['\"]?f")

def matrix_poses(parsed: ParsedNumbers) -> list[PoseText] | None:
    """One transform when the text holds 16 or 12 numbers laid out as one; None otherwise."""
    count = len(parsed.numbers)
    if count not in (16, 12):
        return None
    rows = parsed.rows
    shapes = [len(r) for r in rows]
    if shapes not in ([4] * (count // 4), [count]):
        return None                          # 16 numbers in another layout: not a transform we recognise
    refuse_strays(parsed, {n.line for n in parsed.numbers})
    values = [n.value for n in parsed.numbers]
    layout = "4x4 transform" if count == 16 else "3x4 transform [R | t]"
    notes = []
    if len(rows) == 1:
        notes.append(f"{count} numbers on one line read as a {'4x4' if count == 16 else '3x4'} matrix, row after row")
    grid = [values[i:i + 4] for i in range(0, count, 4)]
    if _COLUMN_MAJOR.search(parsed.words):
        if count != 16:
            grid = None
        else:
            grid = [list(col) for col in zip(*grid)]
            notes.append("the text says column-major: read column after column")
    if grid is None:
        raise DecodeError("a column-major 3x4 matrix is ambiguous (3 columns of 4 or 4 of 3?): write it row-major")
    rotation, translation = homogeneous(grid, parsed.numbers[0].line, layout, parsed.numbers[-1].line)
    return [PoseText(tuple(rotation), layout, parsed.numbers[0].line, {"kind": "matrix"}, translation,
                     unit_said(parsed.words),
                     None, notes)]
