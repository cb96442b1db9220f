"""Numbers that carry their own names: w=…, axis/angle, yaw/pitch/roll, X:/Y:/Z: rows, CSV headers."""

from __future__ import annotations

import re
from dataclasses import dataclass

from core import representations
from core.decode.numbers import ParsedNumbers

_QUATERNION_KEYS = {
    "w": ("w", "qw", "q_w", "qs", "s", "scalar", "real", "re"),
    "x": ("x", "qx", "q_x", "i", "qi"),
    "y": ("y", "qy", "q_y", "j", "qj"),
    "z": ("z", "qz", "q_z", "k", "qk"),
}
_COMPONENT = {name: part for part, names in _QUATERNION_KEYS.items() for name in names}
_UNIT_SUFFIX = re.compile(r"[ _]?(?:\((deg|rad)\w*\)|\[(deg|rad)\w*\]|(?<=_)(deg|rad)\w*)$")


@dataclass
class _Keyed:
    """Numbers put in order by their names, and what the names fixed."""
    values: list
    kind: str
    order: str | None = None
    sequence: str | None = None
    intrinsic: bool | None = None
    units: str | None = None
    note: str = ""


def _without_prefix(name: str, prefixes: tuple) -> str:
    for prefix in prefixes:
        if name.startswith(prefix):
            return name[len(prefix):]
    return name


def _split_key(label: str | None) -> tuple[str | None, str | None]:
    """'angle (deg)' -> ('angle', 'deg'); 'orientation.x' -> ('x', None)."""
    if label is None:
        return None, None
    label = label.strip().strip("'\"").split(".")[-1]
    m = _UNIT_SUFFIX.search(label)
    unit = None
    if m:
        unit = next(g for g in m.groups() if g)
        label = label[:m.start()].rstrip(" _")
    return label, unit


def _labels(parsed: ParsedNumbers) -> list:
    labels = [n.label for n in parsed.numbers]
    # A CSV header above one data line names its columns.
    lines = {n.line for n in parsed.numbers}
    if len(lines) == 1 and parsed.headers and all(label is None for label in labels):
        names = [t for t in re.split(r"[\s,;|]+", parsed.headers[0][1]) if t]
        if len(names) == len(labels):
            labels = names
    return labels


def _keyed(parsed: ParsedNumbers) -> _Keyed | None:
    labels = _labels(parsed)
    if not any(labels):
        return None
    values = [n.value for n in parsed.numbers]
    keys, units = zip(*(_split_key(label) for label in labels))
    keys = tuple(k or "" for k in keys)
    unit_set = {u for u in units if u}
    unit = unit_set.pop() if len(unit_set) == 1 else None
    n = len(values)
    # quaternion components
    if n == 4:
        named = [_COMPONENT.get(k or "") for k in keys]
        if sorted(keys) == ["q0", "q1", "q2", "q3"]:
            named = [{"q0": "w", "q1": "x", "q2": "y", "q3": "z"}[k] for k in keys]
        elif sorted(keys) == ["q1", "q2", "q3", "q4"]:
            named = [{"q4": "w", "q1": "x", "q2": "y", "q3": "z"}[k] for k in keys]
        if sorted(p or "" for p in named) == ["w", "x", "y", "z"]:
            by = dict(zip(named, values))
            note = f"read by their names ({', '.join(k for k in keys)}) and put in the order w, x, y, z"
            if "q4" in keys:
                note += "; q4 taken as the scalar part"
            written = "wxyz" if named[0] == "w" else "xyzw" if named[3] == "w" else "by name"
            return _Keyed([by["w"], by["x"], by["y"], by["z"]], "quaternion", order=written, note=note)
        axis = [v for k, v in zip(keys, values) if k in ("axis", "rotation axis", "n", "u")]
        parts = {k: v for k, v in zip(keys, values) if k in ("axis_x", "axis_y", "axis_z", "ax", "ay", "az")}
        angle = [(v, u) for k, v, u in zip(keys, values, units) if k in ("angle", "theta", "rotation angle", "phi")]
        if len(parts) == 3:
            axis = [parts.get("axis_x", parts.get("ax")), parts.get("axis_y", parts.get("ay")),
                    parts.get("axis_z", parts.get("az"))]
        if len(axis) == 3 and len(angle) == 1:
            return _Keyed(axis + [angle[0][0]], representations.AXIS_ANGLE.kind, units=angle[0][1] or unit,
                          note="read by their names as an axis and an angle")
    if n == 3:
        names = {"yaw": "yaw", "heading": "yaw", "psi": None, "pitch": "pitch", "elevation": "pitch",
                 "roll": "roll", "bank": "roll"}
        named = [names.get(k or "") for k in keys]
        if sorted(p or "" for p in named) == ["pitch", "roll", "yaw"]:
            by = dict(zip(named, values))
            return _Keyed([by["yaw"], by["pitch"], by["roll"]], "angles", sequence="ZYX", intrinsic=True,
                          units=unit, note="read by their names as yaw, pitch, roll (intrinsic Z-Y'-X'')")
        comps = [k for k in keys if k]
        for vector in representations.VECTORS:
            units = unit if vector.units == representations.ANGLE else None
            if all(k in vector.key_names for k in keys):
                return _Keyed(values, vector.kind, units=units, note=f"named as the {vector.name}")
            prefixes = vector.component_prefixes
            if len(comps) == 3 and all(c.startswith(prefixes) for c in comps) \
                    and {_without_prefix(c, prefixes) for c in comps} == {"x", "y", "z"}:
                by = {c[-1]: v for c, v in zip(comps, values)}
                return _Keyed([by["x"], by["y"], by["z"]], vector.kind, units=units,
                              note=f"read by their names as a {vector.name}")
    if n == 9:
        element = [re.fullmatch(r"(?:[rmc]|dcm)_?([0-3])([0-3])", k or "") for k in keys]
        if all(element):
            idx = [(int(e.group(1)), int(e.group(2))) for e in element]
            base = 0 if min(min(i) for i in idx) == 0 else 1
            cells = {(r - base, c - base): v for (r, c), v in zip(idx, values)}
            if sorted(cells) == [(r, c) for r in range(3) for c in range(3)]:
                return _Keyed([cells[(r, c)] for r in range(3) for c in range(3)], "matrix",
                              note="placed by their element names (row, column)")
        row_names = [k for k in keys]
        if set(row_names) == {"x", "y", "z"} and all(row_names.count(a) == 3 for a in "xyz"):
            rows = {a: [v for k, v in zip(row_names, values) if k == a] for a in "xyz"}
            order = list(dict.fromkeys(row_names))
            note = "rows labelled X, Y, Z"
            if order != ["x", "y", "z"]:
                note += f" (written in the order {', '.join(o.upper() for o in order)}; put in order X, Y, Z)"
            return _Keyed(rows["x"] + rows["y"] + rows["z"], "matrix", note=note)
    return None
