"""4x4 homogeneous transforms and 3x4 [R | t] written as bare numbers: four (or three) rows of four, or
16 (12) numbers on one line, row-major unless the text says column-major."""

from __future__ import annotations

from core.decode.column_major import says_column_major, transform_grid
from core.decode.numbers import ParsedNumbers
from core.decode.number_refusals import refuse_strays
from core.decode.poses import PoseText, homogeneous, unit_said


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
    if says_column_major(parsed.words):
        grid, more = transform_grid(values, len(rows) > 1, parsed.numbers[0].line)
        notes += more
    rotation, translation = homogeneous(grid, parsed.numbers[0].line, layout, parsed.numbers[-1].line)
    return [PoseText(tuple(rotation), layout, parsed.numbers[0].line, {"kind": "matrix"}, translation,
                     unit_said(parsed.words),
                     None, notes)]
