"""Reading a session file with its refusals: every field is checked for its type and range before any
value is built from it, and refused by its place in the file (`mounts[3].part.box_size_mm[1]`) with what
was expected. Anything the checks here miss but a constructor refuses is still a SessionFileError (see
load_session), marked `unexpected` so the tests can tell a named refusal from a gap in these checks.
Numpy only; never imports Qt."""

from __future__ import annotations

import math
import os
from typing import Any

from core import bounded_json
from core.chain import Chain
from core.errors import FramewrightError
from core.measurement import MAX_MEASUREMENTS_PER_MOUNT, MAX_SOURCE_CHARS, MAX_WEIGHT, Measurement
from core.name_rules import free_text_problem, kind_of, name_problem
from core.orientation import Orientation
from core.position import LENGTH_UNITS, LIMIT_M, Position
from core.session_values import (ANGLE_UNITS, BOX_SIZE_RANGE_MM, FACE_KEYS, FIRST_VERSION_WITH_POSITIONS,
                                 FORMAT_NAME, FORMAT_VERSION, MATRIX_MEANINGS, QUATERNION_ORDERS, Mount,
                                 PartProperties, Preferences, SavedCheck, Session, SessionFileError)


def _require(condition: bool, where: str, message: str) -> None:
    if not condition:
        raise SessionFileError(f"{where}: {message}")


def _at(where: str, key: str | int) -> str:
    return where + (f"[{key}]" if isinstance(key, int) else f".{key}")


def _object(value: Any, where: str, what: str = "an object") -> dict:
    _require(isinstance(value, dict), where, f"expected {what}, got {kind_of(value)}")
    return value


def _only_keys(data: dict, where: str, keys: tuple[str, ...]) -> None:
    """Refuse a key this format does not have: a misspelt one ("boresite", "invert") would otherwise be
    dropped and its field read as the default, silently pointing the part another way."""
    unknown = sorted(set(data) - set(keys))
    _require(not unknown, where, f"expected only {', '.join(keys)}, found also {unknown}")


def _is_number(value: Any) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def _number(value: Any, where: str, low: float, high: float | None, what: str = "a number") -> float:
    """A number from low to high (high None: no bound but finiteness, which bounded_json has checked)."""
    _require(_is_number(value), where, f"expected {what}, got {kind_of(value)}")
    number = float(value)     # bounded_json has already refused numbers a double cannot hold
    if high is None:
        _require(low <= number, where, f"expected {what} of at least {low:g}, got {number!r}")
    else:
        _require(low <= number <= high, where, f"expected {what} from {low:g} to {high:g}, got {number!r}")
    return number


def _numbers(value: Any, count: int, where: str) -> list[float]:
    _require(isinstance(value, list) and len(value) == count, where, f"expected a list of {count} numbers")
    for i, v in enumerate(value):
        _require(_is_number(v), f"{where}[{i}]", f"expected a number, got {kind_of(v)}")
    return [float(v) for v in value]


def _name(value: Any, where: str, empty_ok: bool = False) -> str:
    problem = name_problem(value, empty_ok=empty_ok)
    _require(problem is None, where, problem or "")
    return value


def _free_text(value: Any, where: str) -> str:
    problem = free_text_problem(value)
    _require(problem is None, where, problem or "")
    return value


def _choice(value: Any, where: str, choices) -> str:
    _require(isinstance(value, str) and value in choices, where,
             f"expected one of {', '.join(choices)}, got {value!r}" if isinstance(value, str)
             else f"expected one of {', '.join(choices)}, got {kind_of(value)}")
    return value


def _flag(value: Any, where: str) -> bool:
    _require(isinstance(value, bool), where, f"expected true or false, got {kind_of(value)}")
    return value


def _whole(value: Any, where: str, low: int, high: int) -> int:
    _require(isinstance(value, int) and not isinstance(value, bool) and low <= value <= high, where,
             f"expected a whole number from {low} to {high}, got {value!r}" if _is_number(value)
             else f"expected a whole number from {low} to {high}, got {kind_of(value)}")
    return value


def _unit_quaternion(value: Any, where: str) -> list[float]:
    q = _numbers(value, 4, where)
    scale = max(abs(v) for v in q)
    norm = 0.0 if scale == 0 else scale * math.sqrt(sum((v / scale) ** 2 for v in q))  # scaled: never overflows
    _require(abs(norm - 1.0) <= 1e-6, where,
             f"expected a unit quaternion, its norm is {norm:.9g} (the file may be damaged)")
    return q


def _orientation(value: Any, where: str) -> Orientation:
    orient = _object(value, where, 'an object {"quaternion_wxyz": [w, x, y, z]}')
    _require("quaternion_wxyz" in orient, where, 'expected {"quaternion_wxyz": [w, x, y, z]}')
    # One representation only: a second one beside it could disagree, and silently dropping it would hide
    # that the file is not what it claims.
    _require(set(orient) == {"quaternion_wxyz"}, where,
             f'expected only "quaternion_wxyz", found also {sorted(set(orient) - {"quaternion_wxyz"})}')
    return Orientation.from_quaternion(_unit_quaternion(orient["quaternion_wxyz"], _at(where, "quaternion_wxyz")))


def _position(value: Any, where: str, version: int) -> Position:
    """A stored position, checked field by field: finite metres within LIMIT_M and a known unit."""
    _require(version >= FIRST_VERSION_WITH_POSITIONS, where,
             f"a position needs format version {FIRST_VERSION_WITH_POSITIONS}; this file says version {version} "
             "(the file may have been edited by hand)")
    data = _object(value, where, 'an object {"metres": [x, y, z], "unit": "mm"}')
    _require("metres" in data, where, 'expected {"metres": [x, y, z], "unit": "mm"}')
    unknown = sorted(set(data) - {"metres", "unit"})
    _require(not unknown, where, f'expected only "metres" and "unit", found also {unknown}')
    metres = _numbers(data["metres"], 3, _at(where, "metres"))
    for i, v in enumerate(metres):
        _number(v, f"{_at(where, 'metres')}[{i}]", -LIMIT_M, LIMIT_M, "a distance in metres")
    unit = _choice(data.get("unit", "mm"), _at(where, "unit"), tuple(LENGTH_UNITS))
    return Position(tuple(metres), unit)


def _measurements(value: Any, where: str) -> tuple[Measurement, ...]:
    """A mount's stored measurements, each checked by its place: a unit quaternion, a weight from 0 to
    MAX_WEIGHT, a short one-line source note, no other keys, and not more than the mount may keep."""
    _require(isinstance(value, list), where, f"expected a list of measurements, got {kind_of(value)}")
    _require(len(value) <= MAX_MEASUREMENTS_PER_MOUNT, where,
             f"{len(value):,} measurements; a mount keeps at most {MAX_MEASUREMENTS_PER_MOUNT:,}")
    out = []
    for i, entry in enumerate(value):
        here = _at(where, i)
        entry = _object(entry, here, 'an object {"orientation": {...}, "weight": 1, "source": "typed"}')
        unknown = sorted(set(entry) - {"orientation", "weight", "source"})
        _require(not unknown, here, f'expected only "orientation", "weight" and "source", found also {unknown}')
        _require("orientation" in entry, here, 'missing its orientation {"quaternion_wxyz": [w, x, y, z]}')
        orientation = _orientation(entry["orientation"], _at(here, "orientation"))
        weight = _number(entry.get("weight", 1.0), _at(here, "weight"), 0, MAX_WEIGHT, "a weight")
        source = _name(entry.get("source", ""), _at(here, "source"), empty_ok=True)
        _require(len(source) <= MAX_SOURCE_CHARS, _at(here, "source"),
                 f"{len(source)} characters; expected a short note of at most {MAX_SOURCE_CHARS}")
        out.append(Measurement(orientation, weight, source))
    return tuple(out)


def _part_from_dict(value: Any, where: str) -> PartProperties:
    data = _object(value, where)
    _only_keys(data, where, ("box_size_mm", "face_names", "boresight"))
    sizes = data.get("box_size_mm", list(PartProperties.box_size_mm))
    size_where = _at(where, "box_size_mm")
    _require(isinstance(sizes, list) and len(sizes) == 3, size_where,
             f"expected a list of 3 sizes in mm, got {kind_of(sizes)}" if not isinstance(sizes, list)
             else f"expected a list of 3 sizes in mm, got {len(sizes)}")
    size = tuple(_number(v, f"{size_where}[{i}]", BOX_SIZE_RANGE_MM[0], BOX_SIZE_RANGE_MM[1], "a size in mm")
                 for i, v in enumerate(sizes))
    faces = _object(data.get("face_names", {}), _at(where, "face_names"), 'an object like {"+Z": "lens"}')
    for key, face_name in faces.items():
        _choice(key, f"{_at(where, 'face_names')} key", FACE_KEYS)
        _name(face_name, f'{_at(where, "face_names")}["{key}"]', empty_ok=True)
    boresight = _choice(data.get("boresight", "+Z"), _at(where, "boresight"), FACE_KEYS)
    return PartProperties(box_size_mm=size, face_names=faces, boresight=boresight)


def _mount_from_dict(data: Any, where: str, version: int = FORMAT_VERSION) -> Mount:
    data = _object(data, where, "an object with name and orientation")
    _only_keys(data, where, ("name", "orientation", "part", "notes", "position", "measurements"))
    _require("name" in data, where, "missing its name")
    name = _name(data["name"], _at(where, "name"))
    _require("orientation" in data, where, 'missing its orientation {"quaternion_wxyz": [w, x, y, z]}')
    orientation = _orientation(data["orientation"], _at(where, "orientation"))
    part = _part_from_dict(data.get("part", {}), _at(where, "part"))
    notes = _free_text(data.get("notes", ""), _at(where, "notes"))
    position = _position(data["position"], _at(where, "position"), version) if "position" in data else None
    measurements = _measurements(data["measurements"], _at(where, "measurements")) if "measurements" in data else ()
    return Mount(name=name, orientation=orientation, part=part, notes=notes, position=position,
                 measurements=measurements)


def _preferences_from_dict(value: Any, where: str) -> Preferences:
    from core.sequences import ALL_SEQUENCES

    data = _object(value, where)
    checks = {"angle_units": lambda v, w: _choice(v, w, ANGLE_UNITS),
              "quaternion_order": lambda v, w: _choice(v, w, QUATERNION_ORDERS),
              "matrix_meaning": lambda v, w: _choice(v, w, MATRIX_MEANINGS),
              "sequence": lambda v, w: _choice(v, w, ALL_SEQUENCES),
              "intrinsic": _flag,
              "significant_digits": lambda v, w: _whole(v, w, 3, 17),
              "amber_margin_deg": lambda v, w: _number(v, w, 0, 90, "an angle in degrees"),
              "red_margin_deg": lambda v, w: _number(v, w, 0, 90, "an angle in degrees")}
    for key, check in checks.items():
        if key in data:
            check(data[key], _at(where, key))
    try:
        return Preferences.from_dict(data)
    except FramewrightError as exc:
        raise SessionFileError(f"{where}: {exc}") from None


def _check_raw(value: Any, where: str, version: int = FORMAT_VERSION) -> None:
    """A check entry's fields, before SavedCheck and CheckSettings build it."""
    from core.check import MODES

    data = _object(value, where)
    if "name" in data:
        _name(data["name"], _at(where, "name"))
    for key in ("nominal", "measured"):
        if data.get(key) is not None:
            _name(data[key], _at(where, key))
    if "settings" not in data:
        return
    settings = _object(data["settings"], _at(where, "settings"))
    here = _at(where, "settings")
    if "mode" in settings:
        _choice(settings["mode"], _at(here, "mode"), MODES)
    for key in ("total_tolerance_deg", "pointing_tolerance_deg", "roll_tolerance_deg"):
        if key in settings:
            _number(settings[key], _at(here, key), 0, None, "a tolerance in degrees")
    if settings.get("position_tolerance_mm") is not None:
        _require(version >= FIRST_VERSION_WITH_POSITIONS, _at(here, "position_tolerance_mm"),
                 f"a position tolerance needs format version {FIRST_VERSION_WITH_POSITIONS}; this file says "
                 f"version {version}")
        _number(settings["position_tolerance_mm"], _at(here, "position_tolerance_mm"), 0, LIMIT_M * 1e3,
                "a tolerance in mm")
    if "tolerance_units" in settings:
        from core.check import TOLERANCE_NAMES
        from core.units import ANGLE_UNITS as UNIT_TABLE

        stated = _object(settings["tolerance_units"], _at(here, "tolerance_units"))
        for name, unit in stated.items():
            _choice(name, _at(here, "tolerance_units"), TOLERANCE_NAMES)
            _choice(unit, _at(_at(here, "tolerance_units"), name), tuple(UNIT_TABLE))
    axis = settings.get("body_axis")
    if axis is not None and not isinstance(axis, str):
        _numbers(axis, 3, _at(here, "body_axis"))
    elif isinstance(axis, str):
        _name(axis, _at(here, "body_axis"))


def _chain_raw(value: Any, where: str, version: int = FORMAT_VERSION) -> None:
    """A chain entry's fields, before Chain and ChainStep build it."""
    data = _object(value, where)
    _only_keys(data, where, ("name", "steps"))
    if "name" in data:
        _name(data["name"], _at(where, "name"))
    steps = data.get("steps", [])
    _require(isinstance(steps, list), _at(where, "steps"), f"expected a list, got {kind_of(steps)}")
    for i, step in enumerate(steps):
        here = _at(_at(where, "steps"), i)
        step = _object(step, here, "an object with name and orientation")
        _only_keys(step, here, ("name", "orientation", "position", "inverted", "enabled"))
        _require("name" in step, here, "missing its name")
        _name(step["name"], _at(here, "name"), empty_ok=True)
        _require("orientation" in step, here, 'missing its orientation {"quaternion_wxyz": [w, x, y, z]}')
        _orientation(step["orientation"], _at(here, "orientation"))
        if "position" in step:
            _position(step["position"], _at(here, "position"), version)
        for flag in ("inverted", "enabled"):
            if flag in step:
                _flag(step[flag], _at(here, flag))


def session_from_dict(data: Any, source: str = "session") -> Session:
    _require(isinstance(data, dict), source, "expected a JSON object at the top level")
    fmt = data.get("format")
    _require(fmt == FORMAT_NAME, source,
             f'not a Framewright session (its "format" is {fmt!r}, expected {FORMAT_NAME!r})'
             if isinstance(fmt, str) and len(fmt) < 100 else
             f'not a Framewright session (its "format" is {kind_of(fmt)}, expected {FORMAT_NAME!r})')
    version = data.get("version")
    _require(isinstance(version, int) and not isinstance(version, bool), source,
             '"version" is missing or not a whole number')
    _require(version <= FORMAT_VERSION, source,
             f"written by a newer Framewright (format version {version}; this one reads up to {FORMAT_VERSION})")
    _require(version >= 1, source, f"format version {version} is not valid")
    mounts_data = data.get("mounts")
    _require(isinstance(mounts_data, list) and len(mounts_data) > 0, f"{source}: mounts",
             "expected a list of at least one mount")
    mounts = tuple(_mount_from_dict(m, f"{source}: mounts[{i}]", version) for i, m in enumerate(mounts_data))
    prefs = _preferences_from_dict(data.get("preferences", {}), f"{source}: preferences")
    selected = data.get("selected", 0)
    _require(isinstance(selected, int) and not isinstance(selected, bool) and 0 <= selected < len(mounts),
             f"{source}: selected", f"expected a mount index 0..{len(mounts) - 1}, got "
             + (repr(selected) if _is_number(selected) else kind_of(selected)))
    description = _free_text(data.get("description", ""), f"{source}: description")
    from core.describe import FRAME_PRESETS

    reference_frame = _choice(data.get("reference_frame", "enu"), f"{source}: reference_frame", tuple(FRAME_PRESETS))
    known = {"format", "version", "description", "reference_frame", "selected", "preferences", "mounts",
             "chains", "checks"}
    extra = {k: v for k, v in data.items() if k not in known}
    # Refuse damaged chains and checks now, naming the entry and the field, then build them.
    chains = _entries(data, "chains", _chain_raw, Chain.from_dict, source, version)
    checks = _entries(data, "checks", _check_raw, SavedCheck.from_dict, source, version)
    return Session(mounts=mounts, selected=selected, preferences=prefs, description=description, extra=extra,
                   reference_frame=reference_frame, chains=chains, checks=checks)


def _entries(data: dict, key: str, check_raw, build, source: str, version: int) -> tuple:
    """The chains or the checks of a file: each entry's fields checked, then the value built from it."""
    if key not in data:
        return ()
    entries = data[key]
    _require(isinstance(entries, list), f"{source}: {key}", f"expected a list, got {kind_of(entries)}")
    out = []
    for i, entry in enumerate(entries):
        check_raw(entry, f"{source}: {key}[{i}]", version)
        try:
            out.append(build(entry))
        except SessionFileError:
            raise
        except FramewrightError as exc:
            raise SessionFileError(f"{source}: {key}[{i}]: {exc}") from None
    return tuple(out)


# What a constructor may raise for a value the field checks let through: still a refusal, never a crash.
UNEXPECTED = (FramewrightError, TypeError, ValueError, OverflowError, KeyError, IndexError, AttributeError,
               RecursionError, ZeroDivisionError, MemoryError)


def _session_from_bytes(raw: bytes, source: str) -> Session:
    try:
        data = bounded_json.parse(raw)
    except bounded_json.BoundedJsonError as exc:
        raise SessionFileError(f"{source}: {exc}") from None
    try:
        return session_from_dict(data, source=source)
    except SessionFileError:
        raise
    except UNEXPECTED as exc:
        # A value that passed the checks above but not a constructor: still a refusal, never a crash.
        error = SessionFileError(f"{source}: not a valid session ({exc})"[:2000])
        error.unexpected = True
        raise error from None


def load_session_and_bytes(path: str | os.PathLike) -> tuple[Session, bytes]:
    """As load_session, with the bytes that were read (an inspection record names their SHA-256)."""
    try:
        raw = bounded_json.read_capped(path)
    except bounded_json.BoundedJsonError as exc:
        raise SessionFileError(f"{path}: {exc}") from None
    return _session_from_bytes(raw, str(path)), raw


def load_session(path: str | os.PathLike) -> Session:
    """Read a session file; every failure, for any bytes in any file, is a SessionFileError naming the
    file, the field and the problem."""
    try:
        raw = bounded_json.read_capped(path)
    except bounded_json.BoundedJsonError as exc:
        raise SessionFileError(f"{path}: {exc}") from None
    return _session_from_bytes(raw, str(path))
