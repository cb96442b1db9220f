"""Every representation of one orientation as plain JSON-ready values (the JSON format, the report and
the command line's readings), and the vector representations as lines of words."""

from __future__ import annotations

from core import representations
from core.sequences import gimbal_margin, parse_sequence


def summary(orientation, sequence: str = "ZYX", intrinsic: bool = True) -> dict:
    """Every representation of one orientation as plain JSON-ready values (degrees; body -> reference;
    canonical w-first quaternion; the axis is None at angle 0, where it is undefined)."""
    sequence = parse_sequence(sequence)
    axis, angle = orientation.as_axis_angle()
    angles = orientation.as_angles(sequence, intrinsic=intrinsic)
    margin = gimbal_margin(orientation, sequence, intrinsic)
    return {
        "matrix": [[float(v) for v in row] for row in orientation.as_matrix()],
        "quaternion_wxyz": [float(v) for v in orientation.as_quaternion()],
        "axis": None if angle == 0 else [float(v) for v in axis],
        "angle_deg": float(angle),
        **{r.json_key: _vector_or_none(r, orientation) for r in representations.VECTORS},
        "sequence": sequence,
        "intrinsic": bool(intrinsic),
        "angles_deg": [float(v) for v in angles.angles],
        "gimbal_margin_deg": float(margin.margin_deg),
        "gimbal_lock": bool(angles.locked or margin.locked),
    }


def _vector_or_none(representation, orientation):
    """The numbers of a vector representation (degrees for angles), or None where it does not exist (the
    Gibbs vector at a half turn)."""
    if representation.half_turn_words and orientation.quaternion[0] == 0:
        return None
    return [float(v) for v in representation.values(orientation)]


def _vector_line(representation, values, number) -> str:
    """'rotation vector (deg): 1, 2, 3', or what is said where the representation does not exist."""
    unit = representations.unit_text(representation, True)
    label = representation.name + (f" ({unit})" if unit else "")
    if values is None:
        return f"{label}: {representation.half_turn_words}"
    return f"{label}: {', '.join(number(v) for v in values)}"


def vector_lines(data: dict, number) -> list[str]:
    """One line per vector representation of a `summary` dict, in words ('rotation vector (deg): …'),
    the numbers written by `number`."""
    return [_vector_line(r, data[r.json_key], number) for r in representations.VECTORS]
