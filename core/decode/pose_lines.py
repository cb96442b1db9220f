"""Poses written on lines: description-file origins (`<origin xyz=… rpy=…/>`), transform-publisher
argument lists (`x y z yaw pitch roll parent child`, `x y z qx qy qz qw parent child`), pose lines under
a header naming their columns (`# timestamp tx ty tz qx qy qz qw`, a CSV header row), and quaternions
written as a sum (`0.7071 + 0i + 0.7071j + 0k`)."""

from __future__ import annotations

import re

from core.decode.characters import _normalise_characters, _strip_comments
from core.decode.pose_fields import xml_fields
from core.decode.poses import PoseText, checked_translation, values_in
from core.errors import DecodeError

_URDF_NOTE = ("a description file's origin: rpy in radians as roll, pitch, yaw about fixed X, Y, Z; the format's"
              " lengths are metres (common practice), but the text does not say so")
_NAME = r"[A-Za-z_/][\w/.\-]{0,80}"
_NUM = r"(?:[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?|\$\{[^{}\s]{1,80}\}|[-+]?(?:M_PI|PI|pi)(?:/\d+)?)"
_ARGS = re.compile(rf"(?<![\w.])(?P<numbers>(?:{_NUM}[ ]+){{5,6}}{_NUM})[ ]+(?P<parent>{_NAME})[ ]+(?P<child>{_NAME})"
                   rf"(?:[ ]+(?P<period>\d+(?:\.\d*)?))?(?=[ \"')]*(?:$|/>|>|\n|\)))")
_NUMBER_LIKE = re.compile(r"[-+]?(?:\d|\.\d|\.?nan|\.?inf|\$)", re.IGNORECASE)
_SUM_TERM = re.compile(r"(?P<sign>[-+]?)[ ]*(?P<value>(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?)[ ]*\*?[ ]*(?P<unit>[ijk])?(?![\w.])")
_TERM = r"(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?[ ]*\*?[ ]*[ijk]?(?![\w.])"
_SUM = re.compile(rf"(?:^|[^\w.])[-+]?[ ]*{_TERM}(?:[ ]*[-+][ ]*{_TERM}){{1,3}}")
_TIME_COLUMN = re.compile(r"#?(?:timestamp|time|t|stamp|sec|secs|nsec|ns|field\.header\.stamp)")
_Q_COLUMN = re.compile(r"(?:q|quat|quaternion|orientation|rot|rotation)[\w.]*?[_.]?([wxyz])|q([wxyz])")
_T_COLUMN = re.compile(r"(?:t|p|pos|position|trans|translation)[\w.]*?[_.]?([xyz])|([xyz])")
_UNIT_SUFFIX = re.compile(r"_(mm|m|cm|in|thou)$")
_COLUMN_UNIT = re.compile(r"[ ]*(?:\[(?P<unit>[^\[\]()]{0,12})\]|\((?P<unit2>[^\[\]()]{0,12})\))$")
_INLINE_HEADER = re.compile(r"^[^\d\n\[(]{0,80}[\[(](?P<names>[A-Za-z_][^\[\]()\n]{0,200})[\])][ ]*[:=][ ]*(?P<data>[^\n]+)$",
                            re.MULTILINE)
# names of columns, then ':' or '=', then their numbers, on one line ('x y z qx qy qz qw = 1 2 3 0 0 0 1')
# (possessive runs of blanks: two runs side by side would share a long run of spaces in n² ways)
_INLINE_NAMES = re.compile(r"^[ \t]*+(?:(?:#++|//++)[ \t]*+)?(?P<names>[A-Za-z_][A-Za-z_ ,]{0,200}?)[ ]*[:=][ ]*"
                           r"(?P<data>[-+.\d][^\n]*)$", re.MULTILINE)
_LETTER = re.compile(r"[A-Za-z]")
_DIGIT = re.compile(r"\d")
_MAX_LINE = 400             # a pose line or a header is short; longer lines are not one (and stay cheap)


def origin_poses(text: str) -> list[PoseText] | None:
    """Every `<origin …/>` of the joints in a description file (or a bare origin element)."""
    if "<origin" not in text:
        return None
    fields = xml_fields(text)
    has_joints = any(f.path[0] == "joint" for f in fields)
    tags: dict[tuple, dict] = {}
    for f in fields:
        tags.setdefault(f.path, {})[f.name] = f
    poses, owners, joint, links, set_aside = [], [], None, {}, 0
    for (tag, _), attrs in tags.items():
        if tag == "joint" and "name" in attrs:
            joint, links = attrs["name"].value, {}
        elif tag == "link":
            joint = None                    # a link's visual, collision and inertial origins follow
        elif tag in ("parent", "child") and "link" in attrs and joint is not None:
            links[tag] = attrs["link"].value
        if tag != "origin":
            continue
        if joint is None and has_joints:
            set_aside += 1
            continue
        line = next(iter(attrs.values())).line
        xyz = values_in(attrs["xyz"].value, line) if "xyz" in attrs else [0.0, 0.0, 0.0]
        rpy = values_in(attrs["rpy"].value, line) if "rpy" in attrs else [0.0, 0.0, 0.0]
        if len(rpy) != 3:
            raise DecodeError(f"line {line}: rpy holds {len(rpy)} numbers; it needs roll, pitch and yaw")
        notes = [_URDF_NOTE] + [f"{k} not written: 0 0 0 (the description format's default)"
                                for k in ("xyz", "rpy") if k not in attrs]
        poses.append(PoseText(tuple(rpy), "description-file origin", line,
                              {"kind": "angles", "sequence": "XYZ", "intrinsic": False, "units": "rad"},
                              checked_translation(xyz, line), None, joint, notes))
        owners.append(links)
    if not poses:
        return None
    for pose, joint_links in zip(poses, owners):     # parent and child may follow the origin
        if pose.name is not None and len(joint_links) == 2:
            pose.notes.append(f"joint '{pose.name}': {joint_links['parent']} -> {joint_links['child']}")
        if set_aside:
            pose.notes.append(f"{set_aside} origin(s) outside a joint (visual, collision or inertial offsets) not read")
    return poses


def argument_poses(text: str) -> list[PoseText] | None:
    """`x y z yaw pitch roll parent child` or `x y z qx qy qz qw parent child` (and an optional period)."""
    clean = re.sub(r"['\",\[\]]", " ", _normalise_characters(text))   # arguments=['0', '0', …, 'base', 'imu']
    found = list(_ARGS.finditer(clean))
    if not found:
        return None
    poses = []
    for m in found:
        line = clean.count("\n", 0, m.start()) + 1
        before = clean[clean.rfind("\n", 0, m.start()) + 1:m.start()]
        odd = [t for t in before.split() if _NUMBER_LIKE.match(t)]
        if odd:     # '0 NaN 0 0 0 0 0.7 0.7 map odom': the run of numbers starts after something we cannot read
            raise DecodeError(f"line {line}: '{odd[-1][:24]}' before the transform arguments is not one of them;"
                              " Framewright will not guess which numbers are the pose (remove it)")
        values = values_in(" ".join(m.group("numbers").split()), line)
        translation = checked_translation(values[:3], line)
        notes = ["transform arguments are in radians; their lengths are metres (common practice), but the text does not say so"]
        if m.group("period"):
            notes.append(f"the last argument ({m.group('period')}) is the publishing period, not part of the pose")
        if len(values) == 6:
            fixed = {"kind": "angles", "sequence": "ZYX", "intrinsic": True, "units": "rad"}
            notes.append("arguments x y z yaw pitch roll: yaw-pitch-roll, intrinsic Z-Y'-X''")
            rotation = values[3:]
        else:
            fixed = {"kind": "quaternion", "order": "xyzw"}
            notes.append("arguments x y z qx qy qz qw: the quaternion is written w last")
            rotation = values[3:]
        poses.append(PoseText(tuple(rotation), "transform arguments", line, fixed, translation, None,
                              f"{m.group('parent')} -> {m.group('child')}", notes))
    return poses


_SDF_POSE = re.compile(r"<pose(?P<attrs>[^<>]{0,200})>(?P<body>[^<>]{0,400})</pose>")


def sdf_poses(text: str) -> list[PoseText] | None:
    """`<pose>x y z roll pitch yaw</pose>` of the SDFormat description files (radians unless the element
    says degrees="true"; roll, pitch, yaw about fixed X, Y, Z, as in description-file origins)."""
    if "<pose" not in text:
        return None
    clean = _normalise_characters(text)
    poses = []
    for m in _SDF_POSE.finditer(clean):
        line = clean.count("\n", 0, m.start()) + 1
        values = values_in(m.group("body"), line)
        if len(values) != 6:
            raise DecodeError(f"line {line}: a <pose> holds {len(values)} numbers; it needs x y z roll pitch yaw")
        degrees = re.search(r"degrees[ ]*=[ ]*[\"']true", m.group("attrs")) is not None
        relative = re.search(r"relative_to[ ]*=[ ]*[\"']([^\"']{1,80})", m.group("attrs"))
        unit_words = "degrees (the element says degrees)" if degrees else "radians"
        notes = [f"a <pose> element: x y z, then roll, pitch, yaw about fixed X, Y, Z in {unit_words}"]
        if relative:
            notes.append(f"relative to '{relative.group(1)}'")
        poses.append(PoseText(tuple(values[3:]), "description-file pose", line,
                              {"kind": "angles", "sequence": "XYZ", "intrinsic": False,
                               "units": "deg" if degrees else "rad"},
                              checked_translation(values[:3], line), None, None, notes))
    return poses or None


def quaternion_sum(text: str) -> list[PoseText] | None:
    """`0.7071 + 0i + 0.7071j + 0k` (also with `*i`, and with zero terms left out: `0.7071 + 0.7071k`):
    the scalar is the term without i, j or k."""
    if not re.search(r"\d[ ]*\*?[ ]*[ijk](?![\w.])", text):
        return None
    clean = _normalise_characters(text)
    found = next(((text_line, m) for text_line in clean.split("\n")
                  if len(text_line) <= _MAX_LINE and (m := _SUM.search(text_line))), None)
    if found is None:
        return None
    text_line, m = found
    outside = text_line[:m.start()] + " " + text_line[m.end():]
    if re.search(r"[\d*/^]", outside):          # '0.7071 2**3 + 0i + …': more than the sum on its line
        raise DecodeError(f"line {clean.split(chr(10)).index(text_line) + 1}: '{text_line.strip()[:40]}' holds more"
                          " than a quaternion written as a sum; Framewright will not guess which part it is")
    parts: dict[str, float] = {}
    for term in _SUM_TERM.finditer(m.group()):
        value = float(term.group("value")) * (-1.0 if term.group("sign") == "-" else 1.0)
        part = term.group("unit") or "w"
        if part in parts:
            raise DecodeError(f"the quaternion '{m.group().strip()[:40]}' names {part} twice")
        parts[part] = value
    if not set(parts) & {"i", "j", "k"}:
        return None                         # '0.5 - 0.5': two numbers, not a sum with imaginary units
    line = next(k for k, text_line in enumerate(clean.split("\n"), start=1) if m.group() in text_line)
    notes = ["written as w + xi + yj + zk: the term without i, j or k is the scalar part"]
    missing = [{"w": "w", "i": "x", "j": "y", "k": "z"}[p] for p in ("w", "i", "j", "k") if p not in parts]
    if missing:
        notes.append(f"terms not written are zero: {', '.join(missing)}")
    return [PoseText(tuple(parts.get(p, 0.0) for p in ("w", "i", "j", "k")), "quaternion written as a sum", line,
                     {"kind": "quaternion", "order": "wxyz"}, None, None, None, notes)]


def column_poses(text: str) -> list[PoseText] | None:
    """Lines of numbers under a header that names their columns (in a comment or a CSV header row):
    time, position x y z, quaternion x y z w in any order, or roll pitch yaw. The last line is read."""
    clean = _normalise_characters(text)
    inline = _INLINE_HEADER.search(clean)
    if inline and len(inline.group()) <= _MAX_LINE:   # 'pose [x, y, z, qx, qy, qz, qw] = [2.0, …]'
        names = [n.strip() for n in inline.group("names").split(",") if n.strip()]
        if _names_a_pose([_role(n) for n in names]):
            line = clean.count("\n", 0, inline.start()) + 1
            return _pose_from_columns(names, [(line, values_in(inline.group("data"), line))], line)
    bare = _INLINE_NAMES.search(clean)
    if bare and len(bare.group()) <= _MAX_LINE:       # 'x y z yaw pitch roll: 0.1 0 0.2 90 0 0'
        names = [n for n in re.split(r"[ ,]+", bare.group("names").strip()) if n]
        roles = [_role(n) for n in names]
        if all(roles) and _names_a_pose(roles):       # every word names a column: nothing else is on the line
            line = clean.count("\n", 0, bare.start()) + 1
            return _pose_from_columns(names, [(line, values_in(bare.group("data"), line))], line)
    lines = clean.split("\n")
    header, header_line, start = None, 0, 0
    for i, raw in enumerate(lines):
        stripped = raw.strip().lstrip("#%/").strip()
        if not stripped or len(stripped) > _MAX_LINE:
            continue
        if not _LETTER.search(stripped):
            if _DIGIT.search(stripped.replace("_", "")):
                break                                # data begins
            continue                                 # no letters, no names
        separators = r"[,;|]" if re.search(r"[,;|]", stripped) else r"\s+"
        names = [n.strip() for n in re.split(separators, stripped) if n.strip()]
        # a pose needs six columns at least: fewer names are no header (and 50,000 short lines stay cheap)
        if len(names) >= 6 and _names_a_pose([_role(n) for n in names]):
            header, header_line, start = names, i + 1, i + 1
    if header is None:
        return None
    body = "\n".join(lines[start:])
    data, _ = _strip_comments(body)
    rows = []
    for k, raw in enumerate(data.split("\n"), start=start + 1):
        if raw.strip():
            values = values_in(raw, k)
            if len(values) != len(header):
                raise DecodeError(f"line {k}: {len(values)} numbers under a header of {len(header)} columns")
            rows.append((k, values))
    if not rows:
        return None
    return _pose_from_columns(header, rows, header_line)


def _names_a_pose(roles) -> bool:
    """Column names for a position with a quaternion, or a position with roll, pitch and yaw."""
    count = lambda kind: sum(1 for r in roles if r and r[0] == kind)
    return count("t") + count("q") >= 6 or (count("t") == 3 and count("a") == 3)


def _pose_from_columns(header: list[str], rows: list, header_line: int) -> list[PoseText] | None:
    roles = [_role(n) or f"other {k}" for k, n in enumerate(header)]
    others = [n for n, r in zip(header, roles) if r.startswith("other")]
    line, values = rows[-1]
    if len(values) != len(header):
        raise DecodeError(f"line {line}: {len(values)} numbers under a header of {len(header)} columns")
    by = {role: v for role, v in zip(roles, values)}
    unit = _columns_unit(header, roles, ("tx", "ty", "tz"), _LENGTH_UNITS, "position", header_line)
    angle_unit = _columns_unit(header, roles, ("aroll", "apitch", "ayaw"), _ANGLE_UNITS, "angle", header_line)
    translation = checked_translation([by.get("tx"), by.get("ty"), by.get("tz")], line) if \
        all(k in by for k in ("tx", "ty", "tz")) else None
    notes = [f"columns named by the header on line {header_line}: {' '.join(header)[:120]}"]
    if others:
        notes.append(f"columns not read (no part of a pose): {', '.join(others)[:160]}")
    if "time" in by:
        notes.append(f"the time column ({values[roles.index('time')]:.15g}) was set aside")
    if len(rows) > 1:
        notes.append(f"the text holds {len(rows)} pose lines; read the last (line {line})")
    if all(k in by for k in ("qw", "qx", "qy", "qz")):
        # The order the text writes, so that a hint of that order agrees and the other is refused; a
        # shuffled order (qx qw qz qy) is put in w, x, y, z order by name.
        written = "".join(r[1] for r in roles if r in ("qw", "qx", "qy", "qz"))
        order = "xyzw" if written == "xyzw" else "wxyz"
        rotation = tuple(by["q" + axis] for axis in order)
        fixed = {"kind": "quaternion", "order": order}
        notes.append(f"the quaternion's columns are named; read as {', '.join(order)}")
    elif all(k in by for k in ("ayaw", "apitch", "aroll")):
        rotation = (by["ayaw"], by["apitch"], by["aroll"])
        fixed = {"kind": "angles", "sequence": "ZYX", "intrinsic": True}
        if angle_unit:
            fixed["units"] = angle_unit
        notes.append("roll, pitch and yaw read by name (yaw-pitch-roll, intrinsic Z-Y'-X'')")
    else:
        return None
    return [PoseText(rotation, "pose line", line, fixed, translation, unit, None, notes)]


_LENGTH_UNITS = {"m": "m", "mm": "mm", "cm": "cm", "in": "in", "thou": "thou"}
_ANGLE_UNITS = {"deg": "deg", "degree": "deg", "degrees": "deg", "rad": "rad", "radian": "rad", "radians": "rad"}


def _columns_unit(header, roles, wanted, known: dict, what: str, line: int) -> str | None:
    """The one unit the header marks on these columns ('x [mm]', 'yaw (deg)'); a mark we do not know, or
    two different ones, is refused: the numbers would be read in the wrong unit."""
    marks = {n: u for n, r in zip(header, roles) if r in wanted and (u := _column_unit(n))}
    for name, mark in marks.items():
        if mark not in known:
            raise DecodeError(f"line {line}: the {what} column '{name[:40]}' is marked in '{mark}', a unit Framewright"
                              f" does not read here (it reads {', '.join(dict.fromkeys(known))})")
    found = sorted({known[u] for u in marks.values()})
    if len(found) > 1:
        raise DecodeError(f"line {line}: the {what} columns are marked in different units ({', '.join(found)});"
                          " Framewright will not mix them: write them in one unit")
    return found[0] if found else None


def _column_unit(name: str) -> str | None:
    suffix = _UNIT_SUFFIX.search(name.lower())
    if suffix:
        return suffix.group(1)
    m = _COLUMN_UNIT.search(name)
    return (m.group("unit") or m.group("unit2") or "").strip().lower() or None if m else None


def _role(name: str) -> str | None:
    if len(name) > 60:
        return None
    bare = _UNIT_SUFFIX.sub("", _COLUMN_UNIT.sub("", name).strip().lower())
    if _TIME_COLUMN.fullmatch(bare):
        return "time"
    if bare in ("roll", "pitch", "yaw"):
        return "a" + bare
    m = _Q_COLUMN.fullmatch(bare)
    if m and not re.fullmatch(r"[xyz]", bare):
        return "q" + (m.group(1) or m.group(2))
    m = _T_COLUMN.fullmatch(bare)
    if m:
        return "t" + (m.group(1) or m.group(2))
    return None
