"""Poses written with keys: calibration YAML and JSON (position/translation beside orientation/rotation,
named components, `rows`/`cols`/`data` matrices, 4x4 lists under a key), INI-like calibration text
(`R:` beside `T:`, `Tr:` with 12 numbers, `R_00`/`T_00` pairs), and flag lists (`--x 1 --yaw 0.5`).
Keys that hold no part of a pose are named in a note, never read as numbers."""

from __future__ import annotations

import re

from core.decode.pose_fields import Field, flag_fields, json_fields, yaml_like_fields
from core.decode.poses import AS_WRITTEN, PoseText, checked_translation, homogeneous, values_in
from core.errors import DecodeError

_TRANSLATION = {"translation", "position", "trans", "t", "xyz", "p", "pos", "tvec", "tvecs", "origin", "offset",
                "translation_vector", "location"}
_ROTATION = {"rotation", "orientation", "quaternion", "quat", "q", "rot", "r", "attitude", "rotation_matrix",
             "rotationmatrix", "dcm", "rpy", "ypr", "euler", "angles", "rvec", "rvecs", "om", "rotvec",
             "rotation_vector", "q_wxyz", "q_xyzw", "quaternion_wxyz", "quaternion_xyzw"}
_WHOLE = re.compile(r"(?:t|tr|h|transform|transformation|pose|extrinsics?|matrix|t_\w+|tr_\w+|\w+_to_\w+|"
                    r"\w+2\w+|t\d\w*)")
_UNIT_MARK = re.compile(r"[ _]?[\[(]?(mm|m|cm|in)[\])]?$")
_ROTATION_VECTOR = {"rvec", "rvecs", "om", "rotvec", "rotation_vector"}
_COMPONENTS_Q = {"x", "y", "z", "w", "qx", "qy", "qz", "qw"}
_COMPONENTS_T = ("x", "y", "z")
_SET_ASIDE_NOTE = 12


def keyed_poses(text: str) -> list[PoseText] | None:
    """The poses a keyed text holds, or None when its keys name no pose."""
    fields = json_fields(text)
    layout = "pose (JSON)"
    if fields is None:
        fields = yaml_like_fields(text)
        layout = "pose (keyed text)"
        flags = flag_fields(text)
        if len(flags) >= 4:
            return _flag_pose(flags)
    if not fields:
        return None
    groups: dict[tuple, dict[str, Field]] = {}
    for f in fields:
        for depth in range(len(f.path)):        # every enclosing group, so 'pose:' sees its 'position:'
            groups.setdefault(f.path[:depth], {})
        groups.setdefault(f.path, {})[_bare(f.name)] = f
    poses: list[PoseText] = []
    used: set[int] = set()
    for path, group in groups.items():
        poses += _group_poses(path, group, groups, used, layout)
    if not poses:
        return None
    unused = [f.key for f in fields if id(f) not in used]
    if unused:
        shown = ", ".join(dict.fromkeys(unused[:_SET_ASIDE_NOTE])) + (" …" if len(unused) > _SET_ASIDE_NOTE else "")
        for p in poses:
            p.notes.append(f"keys not read (no part of a pose): {shown}")
    return sorted(poses, key=lambda p: p.line)


def _bare(name: str) -> str:
    """'translation [m]' -> 'translation'; 'orientation.x' -> 'x'."""
    name = name.split(".")[-1]
    return re.sub(r"[ ]*[\[(].*$", "", name).strip()


def _unit_of(field: Field, group: dict) -> str | None:
    m = _UNIT_MARK.search(field.key.lower())
    if m and m.group(1) != field.name:
        return m.group(1)
    for key in ("unit", "units", "length_unit"):
        if key in group and group[key].value.strip().strip("'\"").lower() in ("m", "mm", "cm", "in"):
            return group[key].value.strip().strip("'\"").lower()
    return None


def _group_poses(path, group, groups, used, layout) -> list[PoseText]:
    name = path[-1] if path else None
    out: list[PoseText] = []
    # rows / cols / data: a matrix with its shape written beside it
    if "data" in group and "rows" in group and "cols" in group:
        shape = [values_in(group[k].value, group[k].line) for k in ("rows", "cols")]
        data = values_in(group["data"].value, group["data"].line)
        used.update(id(group[k]) for k in ("rows", "cols", "data"))
        used.update(id(f) for k, f in group.items() if k == "dt")
        rows, cols = (int(v[0]) if len(v) == 1 else -1 for v in shape)
        if rows * cols != len(data):
            raise DecodeError(f"line {group['data'].line}: rows {rows} x cols {cols} is {rows * cols} numbers;"
                              f" 'data' holds {len(data)}")
        matrix = [data[r * cols:(r + 1) * cols] for r in range(rows)]
        note = f"a {rows}x{cols} matrix with its shape written beside it (rows, cols, data); the shape is not data"
        if (rows, cols) in ((4, 4), (3, 4)):
            rotation, t = homogeneous(matrix, group["data"].line, f"{rows}x{cols} transform")
            out.append(PoseText(tuple(rotation), f"{rows}x{cols} transform", group["data"].line, {"kind": "matrix"},
                                t, _unit_of(group["data"], group), name, [note], AS_WRITTEN))
        elif (rows, cols) == (3, 3):
            out.append(PoseText(tuple(data), "3x3 matrix", group["data"].line, {"kind": "matrix"}, None, None,
                                name, [note], AS_WRITTEN))
        elif rows * cols == 3 and name:
            pass                            # a vector (rvec / tvec) read with its sibling below
        else:
            raise DecodeError(f"line {group['data'].line}: a {rows}x{cols} matrix is no rotation or transform")
        if out:
            return out
    # whole transforms under one key: 16 or 12 numbers
    for key, f in group.items():
        if _WHOLE.fullmatch(key) and key not in _TRANSLATION and key not in _ROTATION:
            values = values_in(f.value, f.line)
            if len(values) in (16, 12):
                rows = [values[i:i + 4] for i in range(0, len(values), 4)]
                shape = "4x4" if len(values) == 16 else "3x4"
                rotation, t = homogeneous(rows, f.line, f"{shape} transform")
                used.add(id(f))
                out.append(PoseText(tuple(rotation), f"{shape} transform", f.line, {"kind": "matrix"}, t,
                                    _unit_of(f, group), f.key if len(group) > 1 or not name else name,
                                    [f"read '{f.key}' as a {shape} transform, rows written one after another"],
                                    AS_WRITTEN))
    # a translation beside a rotation (keys, or sub-groups of named components)
    pose = _translation_and_rotation(path, group, groups, used, layout)
    if pose:
        out.append(pose)
    out += _suffix_pairs(group, used)
    return out



def _translation_and_rotation(path, group, groups, used, layout) -> PoseText | None:
    name = path[-1] if path else None
    t_field = next((group[k] for k in group if k in _TRANSLATION), None)
    r_field = next((group[k] for k in group if k in _ROTATION), None)
    t_sub = next((k for k in _TRANSLATION if _components(groups.get(path + (k,), {}), _COMPONENTS_T)), None)
    r_sub = next((k for k in _ROTATION if _components(groups.get(path + (k,), {}), _COMPONENTS_Q)), None)
    translation = unit = None
    line = None
    notes: list[str] = []
    if t_field is not None:
        translation = checked_translation(values_in(t_field.value, t_field.line), t_field.line)
        unit, line = _unit_of(t_field, group), t_field.line
        used.add(id(t_field))
    elif t_sub is not None:
        sub = groups[path + (t_sub,)]
        translation = checked_translation([_one(sub[c]) for c in _COMPONENTS_T], sub["x"].line)
        unit, line = _unit_of(sub["x"], sub) or _unit_of(sub["x"], group), sub["x"].line
        used.update(id(sub[c]) for c in _COMPONENTS_T)
    if translation is None and t_sub is None and (r_field is None or not path):
        return None                         # a lone rotation (not under a name): the ordinary decoder reads it
    if r_field is not None:
        rotation, fixed, prefer, more = _rotation_from_key(r_field)
        used.add(id(r_field))
        notes += more
        line = min(line or r_field.line, r_field.line)
    elif r_sub is not None:
        sub = groups[path + (r_sub,)]
        names = [k for k in ("w", "x", "y", "z", "qw", "qx", "qy", "qz") if k in sub]
        by = {k.removeprefix("q"): _one(sub[k]) for k in names}
        if sorted(by) != ["w", "x", "y", "z"]:
            return None
        used.update(id(sub[k]) for k in names)
        rotation = (by["w"], by["x"], by["y"], by["z"])
        fixed, prefer = {"kind": "quaternion", "order": "wxyz"}, ()
        notes.append(f"the quaternion's components are named ({', '.join(names)}); read as w, x, y, z")
        line = min(line or sub[names[0]].line, sub[names[0]].line)
    elif translation is not None:
        flat = _flat_rotation(group, used)
        if flat is None:
            return None
        rotation, fixed, prefer, more = flat
        notes += more
    else:
        return None
    return PoseText(tuple(rotation), layout, line or 1, fixed, translation, unit, name, notes, prefer)


def _components(group: dict, names) -> bool:
    return sum(1 for n in names if n in group) >= 3


def _one(field: Field) -> float:
    values = values_in(field.value, field.line)
    if len(values) != 1:
        raise DecodeError(f"line {field.line}: '{field.key}' should hold one number; found {len(values)}")
    return values[0]


def _rotation_from_key(field: Field):
    """(numbers, fixed hints, ranking bonuses, notes) of a rotation written under one key."""
    values = values_in(field.value, field.line)
    key = _bare(field.name)
    notes = []
    if key in _ROTATION_VECTOR:
        if len(values) != 3:
            raise DecodeError(f"line {field.line}: '{field.key}' (a rotation vector) needs 3 numbers; found {len(values)}")
        return values, {"kind": "rotation-vector", "units": "rad"}, (), [
            f"'{field.key}' is a rotation vector; its length is in radians (common practice)"]
    if key == "rpy":
        return values, {"kind": "angles", "sequence": "XYZ", "intrinsic": False, "units": "rad"}, (), [
            "rpy: roll, pitch, yaw about fixed axes X, Y, Z in radians (common practice)"]
    if key == "ypr":
        return values, {"kind": "angles", "sequence": "ZYX", "intrinsic": True}, (), []
    if len(values) == 4:
        fixed = {"kind": "quaternion"}
        if "wxyz" in key:
            fixed["order"] = "wxyz"
        elif "xyzw" in key:
            fixed["order"] = "xyzw"
        prefer = ()
        if "order" not in fixed:
            notes.append(f"'{field.key}' holds 4 numbers and does not say which is w: both orders are offered")
            if key == "orientation":
                prefer = (({"order": "xyzw", "convention": "Hamilton"}, 1.0,
                           "orientation lists are usually x, y, z, w (common practice)"),)
        return values, fixed, prefer, notes
    if len(values) == 9:
        return values, {"kind": "matrix"}, AS_WRITTEN, notes
    if len(values) == 3:
        return values, {}, (), notes
    raise DecodeError(f"line {field.line}: '{field.key}' holds {len(values)} numbers; a rotation is 9 (a matrix),"
                      " 4 (a quaternion) or 3 (angles or a rotation vector)")


def _flat_rotation(group, used):
    """x, y, z beside qx…qw or roll, pitch, yaw in one group (a flat pose block)."""
    if all(k in group for k in ("qx", "qy", "qz", "qw")):
        keys = ("qw", "qx", "qy", "qz")
        used.update(id(group[k]) for k in keys)
        return [_one(group[k]) for k in keys], {"kind": "quaternion", "order": "wxyz"}, (), [
            "the quaternion's components are named (qx, qy, qz, qw); read as w, x, y, z"]
    if all(k in group for k in ("roll", "pitch", "yaw")):
        keys = ("yaw", "pitch", "roll")
        used.update(id(group[k]) for k in keys)
        return [_one(group[k]) for k in keys], {"kind": "angles", "sequence": "ZYX", "intrinsic": True}, (), [
            "roll, pitch and yaw read by name (yaw-pitch-roll, intrinsic Z-Y'-X'')"]
    return None


def _suffix_pairs(group: dict, used: set) -> list[PoseText]:
    """`R: …` with `T: …`, and `R_00`/`T_00` pairs: one transform per suffix (the suffix names it)."""
    out = []
    for key, f in group.items():
        m = re.fullmatch(r"r(_\w+)?", key)
        if not m or id(f) in used:
            continue
        suffix = m.group(1) or ""
        t = group.get("t" + suffix)
        if t is None or id(t) in used:
            continue
        rotation = values_in(f.value, f.line)
        if len(rotation) != 9:
            continue
        used.update((id(f), id(t)))
        out.append(PoseText(tuple(rotation), "rotation R with translation T", f.line, {"kind": "matrix"},
                            checked_translation(values_in(t.value, t.line), t.line), _unit_of(t, group),
                            suffix.lstrip("_") or None, [f"read '{f.key}' (3x3) with '{t.key}' (translation)"],
                            AS_WRITTEN))
    return out


def _flag_pose(flags: list[Field]) -> list[PoseText] | None:
    """--x --y --z with --qx --qy --qz --qw or --roll --pitch --yaw (or --yaw --pitch --roll), and the
    frame flags for the name."""
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
