"""Poses written with keys: calibration YAML and JSON (position/translation beside orientation/rotation,
named components, `rows`/`cols`/`data` matrices, 4x4 lists under a key), INI-like calibration text
(`R:` beside `T:`, `Tr:` with 12 numbers, `R_00`/`T_00` pairs, rectifying rotations); flag lists
(`--x 1 --yaw 0.5`) are read by pose_flags. Keys that hold no part of a pose are named in a note, never read as numbers."""

from __future__ import annotations

import re

from core.decode.candidates import POINTS
from core.decode.clues import _WXYZ, _XYZW
from core.decode.column_major import laid_out_in_lines, matrix_numbers, says_column_major, transform_grid
from core.decode.pose_fields import ORPHAN, Field, flag_fields, json_fields, with_shaped_matrices, yaml_like_fields
from core.decode.pose_flags import flag_pose
from core.decode.pose_names import _GENERIC_NAMES, _bare, _frames, _group_name, _unit_of
from core.decode.poses import PoseText, checked_translation, homogeneous, one_value, unit_said, values_in
from core.errors import DecodeError
from core.representations import ROTATION_VECTOR

_TRANSLATION = {"translation", "position", "trans", "t", "xyz", "p", "pos", "tvec", "tvecs", "origin", "offset",
                "translation_vector", "location"}
_ROTATION = {"rotation", "orientation", "quaternion", "quat", "q", "rot", "r", "attitude", "rotation_matrix",
             "dcm", "rpy", "ypr", "rvec", "rvecs", "om", "rotvec", "rotation_vector", "q_wxyz", "q_xyzw",
             "quaternion_wxyz", "quaternion_xyzw"}
_WHOLE = re.compile(r"t|tr|rt|r_t|rt_\w+|\w+_rt|h|transform|transformation|pose|extrinsics?|matrix|t_\w+|tr_\w+|\w+_to_\w+|"
                    r"transform_\w+|\w+_transform|\w+_pose|pose_\w+|extrinsics?_\w+")
_ROTATION_ONLY = re.compile(r"r\d*_rect\w*|r_rect\w*|rectification\w*|r_\w+|rotation_\w+|\w+_rotation|rot_\w+")
_ROTATION_VECTOR = ROTATION_VECTOR.key_names      # rvec, om, rotvec, rotation_vector, ... (core/representations.py)
_COMPONENTS_Q = {"x", "y", "z", "w", "qx", "qy", "qz", "qw"}
_COMPONENTS_T = ("x", "y", "z")
_SET_ASIDE_NOTE = 12
_LENGTH_SUFFIX = re.compile(r"_(?:mm|m|cm)$")      # 'translation_mm': the key names its unit (pose_names reads it)


def _translation_key(key: str) -> bool:
    return _LENGTH_SUFFIX.sub("", key.lower()) in _TRANSLATION


def keyed_poses(text: str) -> list[PoseText] | None:
    """The poses a keyed text holds, or None when its keys name no pose."""
    fields = json_fields(text)
    layout = "pose (JSON)"
    if fields is None:
        poses = flag_pose(flag_fields(text))
        if poses:
            return poses
        fields = yaml_like_fields(text)
        layout = "pose (keyed text)"
    if not fields:
        return None
    fields = with_shaped_matrices(fields)
    groups: dict[tuple, dict[str, Field]] = {}
    twins: list[tuple[Field, Field]] = []     # the same key twice in one group (the last is kept)
    for f in fields:
        lowered = tuple(p.lower() for p in f.path)
        for depth in range(len(lowered)):        # every enclosing group, so 'pose:' sees its 'position:'
            groups.setdefault(lowered[:depth], {})
        group = groups.setdefault(lowered, {})
        key = _bare(f.name)
        if key in group:
            twins.append((group[key], f))
        group[key] = f
    poses: list[PoseText] = []
    used: set[int] = set()
    column_major = says_column_major(text)
    for path, group in groups.items():
        poses += _group_poses(path, group, groups, used, layout, column_major)
    for first, second in twins:     # a key read into a pose is written twice: which one is meant?
        if id(second) in used:
            where = f" under '{'.'.join(second.path)[:60]}'" if second.path else ""
            raise DecodeError(f"line {second.line}: '{second.key[:40]}'{where} is written twice (lines {first.line}"
                              f" and {second.line}); Framewright will not guess which one is meant")
    said = unit_said(text)                  # '# t in m' beside a transform whose key names no unit
    for p in poses:
        if p.translation is not None and p.unit is None and said:
            p.unit = said
    if not poses:
        _refuse_a_lone_translation(groups)
        return None
    orphan = next((f for f in fields if f.key == ORPHAN), None)
    if orphan is not None:
        raise DecodeError(f"line {orphan.line}: '{orphan.value[:40]}' holds numbers under no key of the pose;"
                          " Framewright will not guess where they belong")
    unused = [f.key for f in fields if id(f) not in used and f.key not in ("rows", "cols", "dt")]
    for p in poses:
        if unused:
            shown = ", ".join(dict.fromkeys(unused[:_SET_ASIDE_NOTE])) + (" …" if len(unused) > _SET_ASIDE_NOTE else "")
            p.notes.append(f"keys not read (no part of a pose): {shown}")
    return sorted(poses, key=lambda p: p.line)


def _group_poses(path, group, groups, used, layout, column_major=False) -> list[PoseText]:
    out: list[PoseText] = []
    for key, f in group.items():                       # whole transforms under one key: 16 or 12 numbers
        if not (_WHOLE.fullmatch(key.lower()) or f.shape == (4, 4)):   # a 3x4 projection_matrix is no pose
            continue
        values = values_in(f.value, f.line)
        if len(values) not in (16, 12) or (f.shape and f.shape not in ((4, 4), (3, 4))):
            continue
        rows = [values[i:i + 4] for i in range(0, len(values), 4)]
        shape = "4x4" if len(values) == 16 else "3x4"
        more = []
        if column_major:
            rows, more = transform_grid(values, laid_out_in_lines(f), f.line)
        rotation, t = homogeneous(rows, f.line, f"{shape} transform", f.line)
        used.add(id(f))
        note = (f"a {shape} matrix with its shape written beside it (rows, cols, data); the shape is not data"
                if f.shape else f"read '{f.key}' as a {shape} transform, "
                + ("as the text orders it" if column_major else "rows written one after another"))
        name = _frames(path, groups) or (f.key if key not in _GENERIC_NAMES else _group_name(path, groups, f))
        out.append(PoseText(tuple(rotation), f"{shape} transform", f.line, {"kind": "matrix"}, t,
                            _unit_of(f, group), name, [note] + more))
    pose = _translation_and_rotation(path, group, groups, used, layout, whole=bool(out), column_major=column_major)
    if pose:
        out.append(pose)
    out += _suffix_pairs(group, used, column_major)
    out += _rotations_alone(group, used, bool(out) or len(groups) > 1, column_major)
    return out


def _translation_and_rotation(path, group, groups, used, layout, whole: bool, column_major=False) -> PoseText | None:
    t_field = next((group[k] for k in group if _translation_key(k) and id(group[k]) not in used), None)
    r_field = next((group[k] for k in group if k.lower() in _ROTATION and id(group[k]) not in used), None)
    t_sub = next((k for k in _TRANSLATION if _components(groups.get(path + (k,), {}), _COMPONENTS_T)), None)
    r_sub = next((k for k in _ROTATION if _components(groups.get(path + (k,), {}), _COMPONENTS_Q)), None)
    # x, y, z beside qx … qw or roll, pitch, yaw in one group: a flat pose block
    t_flat = t_field is None and t_sub is None and r_field is None and r_sub is None and \
        all(k in group and id(group[k]) not in used for k in _COMPONENTS_T) and _flat_names(group)
    has_translation = t_field is not None or t_sub is not None or t_flat
    if not has_translation and (whole or not path or (r_field is None and r_sub is None)):
        return None                         # a lone rotation (not under a name): the ordinary decoder reads it
    if has_translation and r_field is None and r_sub is None and not _flat_names(group):
        return None
    translation = unit = line = None
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
    elif t_flat:
        translation = checked_translation([_one(group[c]) for c in _COMPONENTS_T], group["x"].line)
        unit, line = _unit_of(group["x"], group), group["x"].line
        used.update(id(group[c]) for c in _COMPONENTS_T)
        notes.append("x, y, z read as the position beside the named rotation components")
    if r_field is not None:
        rotation, fixed, prefer, more = _rotation_from_key(r_field, column_major)
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
    else:
        rotation, fixed, prefer, more = _flat_rotation(group, used)
        notes += more
    display = t_field or r_field or next(iter(group.values()), None)
    return PoseText(tuple(rotation), layout, line or 1, fixed, translation, unit,
                    _group_name(path, groups, display), notes, prefer)


def _refuse_a_lone_translation(groups) -> None:
    """'translation: [1, 2, 3]' with no rotation beside it: the key says the numbers are a position, so they
    must not fall through to the ordinary decoder and come back as three angles."""
    for path, group in groups.items():
        for key, f in group.items():
            count = len(values_in(f.value, f.line)) if _translation_key(key) else 0
            if count == 3:
                raise DecodeError(f"line {f.line}: '{f.key[:40]}' holds a position (x, y, z), and no rotation is"
                                  " written with it; Framewright will not read a position as angles")
            if count:
                raise DecodeError(f"line {f.line}: '{f.key[:40]}' names a position but holds {count} numbers"
                                  " (x, y, z are 3), and no rotation is written with it; Framewright will not"
                                  " read them as a rotation")
        for k in _TRANSLATION:
            sub = groups.get(path + (k,), {})
            if all(c in sub for c in _COMPONENTS_T):
                raise DecodeError(f"line {sub['x'].line}: '{k}' holds a position (x, y, z), and no rotation is"
                                  " written with it; Framewright will not read a position as angles")


def _flat_names(group) -> bool:
    return all(k in group for k in ("qx", "qy", "qz", "qw")) or all(k in group for k in ("roll", "pitch", "yaw"))


def _components(group: dict, names) -> bool:
    return sum(1 for n in names if n in group) >= 3


def _one(field: Field) -> float:
    return one_value(field.value, field.line, field.key)


def _rotation_from_key(field: Field, column_major=False):
    """(numbers, fixed hints, ranking bonuses, notes) of a rotation written under one key."""
    values = values_in(field.value, field.line)
    key = _bare(field.name)
    caption = field.key.lower()
    notes = []
    if key in _ROTATION_VECTOR:
        if len(values) != 3:
            raise DecodeError(f"line {field.line}: '{field.key}' (a rotation vector) needs 3 numbers; found"
                              f" {len(values)}")
        return values, {"kind": ROTATION_VECTOR.kind, "units": "rad"}, (), [
            f"'{field.key}' is a rotation vector; its length is in radians (common practice)"]
    if key == "rpy":
        return values, {"kind": "angles", "sequence": "XYZ", "intrinsic": False, "units": "rad"}, (), [
            "rpy: roll, pitch, yaw about fixed axes X, Y, Z in radians (common practice)"]
    if key == "ypr":
        return values, {"kind": "angles", "sequence": "ZYX", "intrinsic": True}, (), []
    if len(values) == 4:
        fixed = {"kind": "quaternion"}
        if "wxyz" in caption or _WXYZ.search(caption):
            fixed["order"] = "wxyz"
        elif "xyzw" in caption or _XYZW.search(caption):
            fixed["order"] = "xyzw"
        prefer = ()
        if "order" not in fixed:
            notes.append(f"'{field.key}' holds 4 numbers and does not say which is w: both orders are offered")
            if key == "orientation":
                prefer = (({"order": "xyzw", "convention": "Hamilton"}, POINTS["orientation list scalar last"],
                           "orientation lists are usually x, y, z, w (common practice)"),)
        return values, fixed, prefer, notes
    if len(values) == 9:
        values, more = matrix_numbers(field, values, column_major)
        return values, {"kind": "matrix"}, (), notes + more
    if len(values) == 3:
        return values, {}, (), notes
    raise DecodeError(f"line {field.line}: '{field.key}' holds {len(values)} numbers; a rotation is 9 (a matrix),"
                      " 4 (a quaternion) or 3 (angles or a rotation vector)")


def _flat_rotation(group, used):
    """qx…qw or roll, pitch, yaw beside x, y, z in one group (a flat pose block)."""
    if all(k in group for k in ("qx", "qy", "qz", "qw")):
        keys = ("qw", "qx", "qy", "qz")
        used.update(id(group[k]) for k in keys)
        return [_one(group[k]) for k in keys], {"kind": "quaternion", "order": "wxyz"}, (), [
            "the quaternion's components are named (qx, qy, qz, qw); read as w, x, y, z"]
    keys = ("yaw", "pitch", "roll")
    used.update(id(group[k]) for k in keys)
    return [_one(group[k]) for k in keys], {"kind": "angles", "sequence": "ZYX", "intrinsic": True}, (), [
        "roll, pitch and yaw read by name (yaw-pitch-roll, intrinsic Z-Y'-X'')"]


def _suffix_pairs(group: dict, used: set, column_major=False) -> list[PoseText]:
    """`R: …` with `T: …`, and `R_00`/`T_00` pairs: one transform per suffix (the suffix names it)."""
    out = []
    lowered = {k.lower(): f for k, f in group.items()}
    for key, f in lowered.items():
        m = re.fullmatch(r"r(_\w+)?", key)
        if not m or id(f) in used:
            continue
        suffix = m.group(1) or ""
        t = lowered.get("t" + suffix)
        if t is None or id(t) in used:
            continue
        rotation = values_in(f.value, f.line)
        if len(rotation) != 9:
            continue
        rotation, more = matrix_numbers(f, rotation, column_major)
        used.update((id(f), id(t)))
        out.append(PoseText(tuple(rotation), "rotation R with translation T", f.line, {"kind": "matrix"},
                            checked_translation(values_in(t.value, t.line), t.line), _unit_of(t, group),
                            suffix.lstrip("_") or None, [f"read '{f.key}' (3x3) with '{t.key}' (translation)"] + more))
    return out


def _rotations_alone(group: dict, used: set, among_others: bool, column_major=False) -> list[PoseText]:
    """A rectifying rotation (R0_rect, rectification_matrix, R_rect_00) among other transforms, or a
    rotation written with its shape: a transform without a translation, named by its key."""
    out = []
    for key, f in group.items():
        if id(f) in used or not (_ROTATION_ONLY.fullmatch(key.lower()) or (f.shape == (3, 3) and key in _ROTATION)):
            continue
        if not (among_others or f.shape):
            continue
        values = values_in(f.value, f.line)
        if len(values) != 9:
            continue
        values, more = matrix_numbers(f, values, column_major)
        used.add(id(f))
        out.append(PoseText(tuple(values), "rotation", f.line, {"kind": "matrix"}, None, None, f.key,
                            [f"read '{f.key}' as a 3x3 rotation (no translation is written with it)"] + more))
    vectors = [f for k, f in group.items() if id(f) not in used and f.shape in ((3, 1), (1, 3)) and k in _ROTATION]
    for f in vectors:
        rotation, fixed, prefer, notes = _rotation_from_key(f, column_major)
        used.add(id(f))
        out.append(PoseText(tuple(rotation), "rotation", f.line, fixed, None, None, f.key, notes, prefer))
    return out
