"""Names and units a keyed pose takes from its keys: the bare key ('Translation (mm)' -> 'translation'),
the translation's unit ('x_mm', 'unit: mm'), and the transform's name (frame_id -> child_frame_id, or
the group it sits under)."""

from __future__ import annotations

import re

from core.decode.pose_fields import Field
from core.decode.poses import unit_said

_UNIT_MARK = re.compile(r"(?:\[(mm|m|cm)\]|\((mm|m|cm)\)|_(mm|m|cm))$")
_GENERIC_NAMES = {"transform", "pose", "data", "value", "extrinsics", "calibration"}


def _bare(name: str) -> str:
    """'Translation (mm)' -> 'translation'; 'orientation.x' -> 'x'; 'Rotation matrix' -> 'rotation_matrix'."""
    name = name.split(".")[-1]
    name = re.sub(r"[ ]*[\[(].*$", "", name).strip()
    return re.sub(r"[ ]+", "_", name)


def _unit_of(field: Field, group: dict) -> str | None:
    m = _UNIT_MARK.search(field.key.lower().strip())
    if m:
        return next(g for g in m.groups() if g)
    said = unit_said(field.key)                          # 'T_base_cam (translation in mm)'
    if said:
        return said
    for key in ("unit", "units", "length_unit"):
        if key in group and group[key].value.strip().strip("'\"").lower() in ("m", "mm", "cm", "in"):
            return group[key].value.strip().strip("'\"").lower()
    return None


def _frames(path: tuple, groups: dict) -> str | None:
    """'parent -> child' from frame_id / child_frame_id beside the transform or in its header."""
    for depth in range(len(path), -1, -1):
        here = groups.get(path[:depth], {})
        child = here.get("child_frame_id")
        parent = here.get("frame_id") or groups.get(path[:depth] + ("header",), {}).get("frame_id")
        if child is not None and parent is not None:
            return f"{parent.value.strip(chr(34) + chr(39))} -> {child.value.strip(chr(34) + chr(39))}"
    return None


def _group_name(path: tuple, groups: dict, display: Field | None) -> str | None:
    frames = _frames(path, groups)
    if frames:
        return frames
    if display is not None and display.path:
        for part in reversed(display.path):
            if not part.startswith("#") and part.lower() not in _GENERIC_NAMES:
                return part
    return None
