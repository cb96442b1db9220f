"""The two Copy as formats for a mount that has a position (a pose): a 4×4 homogeneous matrix and a pose
line (position, then quaternion), each with a header that names the order, the units and the convention
(CONVENTIONS.md "Poses": p_ref = R · p_body + t, the 4×4 [[R, t], [0 0 0 1]]).

    render_pose(orientation, position, "pose-matrix", options) -> text
    pose_round_trip(orientation, position, text, "pose-matrix", options) -> (degrees, metres)

The round trip decodes the copy before it is called verified: the decoder (core/decode) reads the 4x4
with the unit its header names ('t in mm') and the pose line under its column header ('x_mm … qw qx qy qz');
a copy that reads as anything else, or with no unit, refuses the round trip.
"""

from __future__ import annotations

import numpy as np

from core.decode import DecodeHints, decode
from core.errors import FramewrightError
from core.number_text import format_number
from core.position import LENGTH_UNITS, Position

POSE_FORMATS = (
    ("pose-matrix", "4×4 pose matrix (rotation and position)"),
    ("pose-line", "Pose line (position, then quaternion)"),
)
POSE_FORMAT_NAMES = tuple(name for name, _ in POSE_FORMATS)

_MATRIX_HEADER = ("# Pose as a 4x4 homogeneous matrix [[R, t], [0, 0, 0, 1]], p_ref = R p_body + t; "
                  "R body -> reference (columns are the body axes); t in {unit}; row-major")
_LINE_HEADER = ("# Pose: position x, y, z in {unit}, then quaternion {order} (Hamilton, {scalar}); "
                "p_ref = R p_body + t, body -> reference\n"
                "# {columns}")


# The unit as the header writes it: 'in' in full ('t in inches'), which a reader cannot take for a word.
_UNIT_WORD = {"in": "inches"}


def render_pose(orientation, position: Position, fmt: str, scalar_last: bool = False) -> str:
    """The pose as text: the header line, then the numbers (position in its own unit)."""
    if not isinstance(position, Position):
        raise FramewrightError(f"the {fmt} format needs a mount with a position; this one has none")
    t = position.shown()
    if fmt == "pose-matrix":
        r = orientation.as_matrix()
        rows = [list(r[i]) + [t[i]] for i in range(3)]
        lines = ["  ".join(format_number(v) for v in row) for row in rows] + ["0.0  0.0  0.0  1.0"]
        return _MATRIX_HEADER.format(unit=_UNIT_WORD.get(position.unit, position.unit)) + "\n" + "\n".join(lines) + "\n"
    if fmt == "pose-line":
        q = orientation.as_quaternion(scalar_last=scalar_last)
        columns = [f"{axis}_{position.unit}" for axis in "xyz"] + (
            ["qx", "qy", "qz", "qw"] if scalar_last else ["qw", "qx", "qy", "qz"])
        header = _LINE_HEADER.format(unit=_UNIT_WORD.get(position.unit, position.unit),
                                     order="x, y, z, w" if scalar_last else "w, x, y, z",
                                     scalar="scalar last" if scalar_last else "scalar first", columns=" ".join(columns))
        return header + "\n" + ", ".join(format_number(v) for v in list(t) + list(q)) + "\n"
    raise FramewrightError(f"unknown pose format {fmt!r}; expected one of {', '.join(POSE_FORMAT_NAMES)}")


def pose_round_trip(orientation, position: Position, text: str, fmt: str, scalar_last: bool = False):
    """(angle in degrees, distance in metres) between the pose rendered and the pose `text` decodes to."""
    back_orientation, back_metres = read_pose(text, fmt, scalar_last)
    angle = orientation.angle_to(back_orientation)
    return angle, float(np.linalg.norm(np.array(back_metres) - np.array(position.metres)))


def read_pose(text: str, fmt: str, scalar_last: bool = False):
    """(Orientation, translation in metres) of a pose copy, as the decoder reads it with the hints that
    match the format: exactly one reading, of the layout the format writes, with a translation in mm, m,
    inches or thou."""
    hints = DecodeHints(kind="matrix", transposed=False) if fmt == "pose-matrix" else \
        DecodeHints(kind="quaternion", order="xyzw" if scalar_last else "wxyz")
    readings = decode(text, hints)              # DecodeError is a FramewrightError: the copy is refused
    if len(readings) != 1:
        raise FramewrightError(f"the {fmt} text decodes to {len(readings)} readings; expected exactly one")
    reading = readings[0]
    layout = reading.label.split(":")[0]
    expected = "4x4 transform" if fmt == "pose-matrix" else "pose line"
    if layout != expected:
        raise FramewrightError(f"the {fmt} text reads as '{layout}', not as a {expected}")
    if reading.translation is None:
        raise FramewrightError(f"the {fmt} text holds no translation")
    if reading.translation_unit not in LENGTH_UNITS:
        raise FramewrightError(f"the {fmt} text names no length unit (mm, m, inches or thou) for its translation")
    return reading.orientation, Position.from_shown(reading.translation, reading.translation_unit).metres
