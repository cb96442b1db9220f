"""Transform flags: `--x 1 --y 2 --z 3` with `--qx --qy --qz --qw` or `--roll --pitch --yaw`, and
`--frame-id` / `--child-frame-id` for the transform's name (the named-flag form of transform arguments).

The named-flag form lets a flag be left out: the tool then uses 0 (1 for --qw). A left-out flag is filled
in with that value and a note says so; read bare, the numbers that remain would be another kind (three
flags --x --y --z and one --yaw are four numbers: an axis and an angle)."""

from __future__ import annotations

from core.decode.pose_fields import Field
from core.decode.poses import PoseText, checked_translation, one_value
from core.errors import DecodeError

_COMPONENTS_T = ("x", "y", "z")
_QUATERNION = ("qx", "qy", "qz", "qw")
_ANGLES = ("roll", "pitch", "yaw")
POSE_FLAGS = frozenset(_COMPONENTS_T + _QUATERNION + _ANGLES)
_DEFAULT = {"qw": 1.0}             # every other left-out flag is 0 (the named-flag form's defaults, from memory)
_PARENT = ("frame_id", "parent", "parent_frame")
_CHILD = ("child_frame_id", "child", "child_frame")


def _one(field: Field) -> float:
    return one_value(field.value, field.line, f"--{field.key}")


def _filled(by: dict, keys: tuple, notes: list) -> list[float]:
    missing = [k for k in keys if k not in by]
    if missing:
        said = ", ".join(f"--{k} {_DEFAULT.get(k, 0.0):g}" for k in missing)
        notes.append(f"not given, so taken as the named-flag form's default: {said}")
    return [_one(by[k]) if k in by else _DEFAULT.get(k, 0.0) for k in keys]


def flag_pose(flags: list[Field]) -> list[PoseText] | None:
    """A pose from the flags when at least one names a part of a pose; None otherwise."""
    by = {}
    for f in flags:
        if f.name in by and f.name in POSE_FLAGS:
            raise DecodeError(f"line {f.line}: the flag --{f.key} is given twice; which one is meant?")
        by[f.name] = f
    if not POSE_FLAGS & set(by):
        return None
    quaternion, angles = [k for k in _QUATERNION if k in by], [k for k in _ANGLES if k in by]
    if quaternion and angles:
        raise DecodeError(f"line {by[quaternion[0]].line}: the flags give both a quaternion (--{quaternion[0]})"
                          f" and angles (--{angles[0]}); a pose has one rotation: drop one set")
    line = min(f.line for k, f in by.items() if k in POSE_FLAGS)
    notes: list[str] = []
    translation = checked_translation(_filled(by, _COMPONENTS_T, notes), line)
    if quaternion:
        x, y, z, w = _filled(by, _QUATERNION, notes)
        rotation = [w, x, y, z]
        fixed = {"kind": "quaternion", "order": "wxyz"}
        notes.insert(0, "flags --qx --qy --qz --qw read as a quaternion")
    else:
        roll, pitch, yaw = _filled(by, _ANGLES, notes)
        rotation = [yaw, pitch, roll]
        fixed = {"kind": "angles", "sequence": "ZYX", "intrinsic": True, "units": "rad"}
        notes.insert(0, "flags --yaw --pitch --roll read as yaw-pitch-roll (intrinsic Z-Y'-X'') in radians"
                        " (common practice)")
    others = [f"--{f.key}" for k, f in by.items() if k not in POSE_FLAGS and k not in _PARENT + _CHILD]
    if others:
        notes.append(f"flags that are no part of the pose were set aside: {', '.join(others)[:200]}")
    parent = next((by[k].value for k in _PARENT if k in by), None)
    child = next((by[k].value for k in _CHILD if k in by), None)
    name = f"{parent} -> {child}" if parent and child else None
    notes.append("transform arguments' lengths are metres (common practice), but the text does not say so")
    return [PoseText(tuple(rotation), "transform flags", line, fixed, translation, None, name, notes)]
