"""Transform flags: `--x 1 --y 2 --z 3` with `--qx --qy --qz --qw` or `--roll --pitch --yaw`, and
`--frame-id` / `--child-frame-id` for the transform's name (the named-flag form of transform arguments)."""

from __future__ import annotations

from core.decode.pose_fields import Field
from core.decode.poses import PoseText, checked_translation, one_value

_COMPONENTS_T = ("x", "y", "z")


def _one(field: Field) -> float:
    return one_value(field.value, field.line, f"--{field.key}")


def flag_pose(flags: list[Field]) -> list[PoseText] | None:
    """--x --y --z with --qx --qy --qz --qw or --roll --pitch --yaw, and the frame flags for the name."""
    by = {f.name: f for f in flags}
    if not all(k in by for k in _COMPONENTS_T):
        return None
    translation = checked_translation([_one(by[k]) for k in _COMPONENTS_T], by["x"].line)
    if all(k in by for k in ("qx", "qy", "qz", "qw")):
        rotation = [_one(by[k]) for k in ("qw", "qx", "qy", "qz")]
        fixed = {"kind": "quaternion", "order": "wxyz"}
        note = "flags --qx --qy --qz --qw read as a quaternion"
    elif all(k in by for k in ("roll", "pitch", "yaw")):
        rotation = [_one(by[k]) for k in ("yaw", "pitch", "roll")]
        fixed = {"kind": "angles", "sequence": "ZYX", "intrinsic": True, "units": "rad"}
        note = "flags --yaw --pitch --roll read as yaw-pitch-roll (intrinsic Z-Y'-X'') in radians (common practice)"
    else:
        return None
    parent = next((by[k].value for k in ("frame_id", "parent", "parent_frame") if k in by), None)
    child = next((by[k].value for k in ("child_frame_id", "child", "child_frame") if k in by), None)
    name = f"{parent} -> {child}" if parent and child else None
    return [PoseText(tuple(rotation), "transform flags", by["x"].line, fixed, translation, None, name,
                     [note, "transform arguments' lengths are metres (common practice), but the text does not say so"])]
