"""The two Copy as formats for a mount that has a position (a pose): a 4×4 homogeneous matrix and a pose
line (position, then quaternion), each with a header that names the order, the units and the convention
(CONVENTIONS.md "Poses": p_ref = R · p_body + t, the 4×4 [[R, t], [0 0 0 1]]).

    render_pose(orientation, position, "pose-matrix", options) -> text
    pose_round_trip(orientation, position, text, "pose-matrix", options) -> (degrees, metres)

The round trip decodes the copy before it is called verified. The decoder (core/decode.py) reads a pose
and keeps its translation once its pose readers are in; until then it refuses the 16 or 7 numbers, and
the copy is read back here instead, strictly in the layout written below: the header's unit, every
number token (core/number_text), the last row exactly 0 0 0 1, and the rotation part through the
decoder with the hints that match it. Anything else in the text refuses the round trip.
"""

from __future__ import annotations

import re

import numpy as np

from core.decode import DecodeHints, decode
from core.errors import DecodeError, FramewrightError
from core.number_text import parse_number
from core.position import LENGTH_UNITS, Position

POSE_FORMATS = (
    ("pose-matrix", "4×4 pose matrix (rotation and position)"),
    ("pose-line", "Pose line (position, then quaternion)"),
)
POSE_FORMAT_NAMES = tuple(name for name, _ in POSE_FORMATS)

_MATRIX_HEADER = ("# Pose as a 4x4 homogeneous matrix [[R, t], [0, 0, 0, 1]], p_ref = R p_body + t; "
                  "R body -> reference (columns are the body axes); t in {unit}; row-major")
_LINE_HEADER = ("# Pose: position x, y, z in {unit}, then quaternion {order} (Hamilton, {scalar}); "
                "p_ref = R p_body + t, body -> reference")
_UNIT_IN_HEADER = re.compile(r"\bt in (\w+);|position x, y, z in (\w+),")


def _number(value: float) -> str:
    from core.formats import format_number   # late: formats imports this module
    return format_number(value)


def render_pose(orientation, position: Position, fmt: str, scalar_last: bool = False) -> str:
    """The pose as text: the header line, then the numbers (position in its own unit)."""
    if not isinstance(position, Position):
        raise FramewrightError(f"the {fmt} format needs a mount with a position; this one has none")
    t = position.shown()
    if fmt == "pose-matrix":
        r = orientation.as_matrix()
        rows = [list(r[i]) + [t[i]] for i in range(3)]
        lines = ["  ".join(_number(v) for v in row) for row in rows] + ["0.0  0.0  0.0  1.0"]
        return _MATRIX_HEADER.format(unit=position.unit) + "\n" + "\n".join(lines) + "\n"
    if fmt == "pose-line":
        q = orientation.as_quaternion(scalar_last=scalar_last)
        header = _LINE_HEADER.format(unit=position.unit, order="x, y, z, w" if scalar_last else "w, x, y, z",
                                     scalar="scalar last" if scalar_last else "scalar first")
        return header + "\n" + ", ".join(_number(v) for v in list(t) + list(q)) + "\n"
    raise FramewrightError(f"unknown pose format {fmt!r}; expected one of {', '.join(POSE_FORMAT_NAMES)}")


def pose_round_trip(orientation, position: Position, text: str, fmt: str, scalar_last: bool = False):
    """(angle in degrees, distance in metres) between the pose rendered and the pose `text` decodes to."""
    back_orientation, back_metres = read_pose(text, fmt, scalar_last)
    angle = orientation.angle_to(back_orientation)
    return angle, float(np.linalg.norm(np.array(back_metres) - np.array(position.metres)))


def read_pose(text: str, fmt: str, scalar_last: bool = False):
    """(Orientation, translation in metres) of a pose copy: the decoder's reading when it keeps a
    translation, else this module's own strict reading of the layout render_pose writes."""
    hints = DecodeHints(kind="matrix", transposed=False) if fmt == "pose-matrix" else \
        DecodeHints(kind="quaternion", order="xyzw" if scalar_last else "wxyz")
    try:
        readings = decode(text, hints)
    except DecodeError:
        readings = None
    if readings:
        if len(readings) != 1:
            raise FramewrightError(f"the {fmt} text decodes to {len(readings)} readings; expected exactly one")
        reading = readings[0]
        if reading.translation is not None:
            unit = reading.translation_unit
            if unit not in LENGTH_UNITS:
                raise FramewrightError(f"the {fmt} text decodes with a translation in {unit!r}; expected mm or m")
            return reading.orientation, Position.from_shown(reading.translation, unit).metres
    return _read_own_layout(text, fmt, scalar_last)


def _read_own_layout(text: str, fmt: str, scalar_last: bool):
    lines = [line for line in text.splitlines() if line.strip()]
    if not lines or not lines[0].startswith("#"):
        raise FramewrightError(f"the {fmt} text has no header line naming its unit")
    found = _UNIT_IN_HEADER.search(lines[0])
    unit = next((g for g in found.groups() if g), None) if found else None
    if unit not in LENGTH_UNITS:
        raise FramewrightError(f"the {fmt} header names no length unit (mm or m)")
    try:
        rows = [[parse_number(token) for token in re.split(r"[,\s]+", line.strip()) if token]
                for line in lines[1:]]
    except ValueError as exc:
        raise FramewrightError(f"the {fmt} text holds something that is not a number: {exc}") from None
    if fmt == "pose-matrix":
        if [len(r) for r in rows] != [4, 4, 4, 4]:
            raise FramewrightError("the 4x4 pose text does not hold four rows of four numbers")
        if rows[3] != [0.0, 0.0, 0.0, 1.0]:
            raise FramewrightError(f"the 4x4 pose's last row is {rows[3]}; expected 0 0 0 1")
        rotation = "\n".join("  ".join(repr(v) for v in row[:3]) for row in rows[:3])
        readings = decode(rotation, DecodeHints(kind="matrix", transposed=False))
        translation = [row[3] for row in rows[:3]]
    else:
        if [len(r) for r in rows] != [7]:
            raise FramewrightError("the pose line does not hold one line of seven numbers")
        translation = rows[0][:3]
        readings = decode(", ".join(repr(v) for v in rows[0][3:]),
                          DecodeHints(kind="quaternion", order="xyzw" if scalar_last else "wxyz"))
    if len(readings) != 1:
        raise FramewrightError(f"the {fmt} rotation decodes to {len(readings)} readings; expected exactly one")
    return readings[0].orientation, Position.from_shown(translation, unit).metres
