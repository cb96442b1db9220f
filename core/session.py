"""A session as plain data: named mounts, the selected one and display preferences, with our own
versioned JSON file format (``*.fwsession.json``). Numpy only; never imports Qt.

File layout (version 2; version 1 is the same without positions)::

    {
      "format": "framewright-session",
      "version": 1,
      "description": "free text",
      "reference_frame": "enu",          # names of the reference axes: enu, ned, vehicle, aircraft, camera
      "selected": 0,
      "preferences": {...},              # Preferences fields, all optional when reading
      "mounts": [
        {"name": "...",
         "orientation": {"quaternion_wxyz": [w, x, y, z]},   # Hamilton, body -> reference
         "position": {"metres": [x, y, z], "unit": "mm"},    # optional (version 2): origin in reference
         "part": {"box_size_mm": [x, y, z], "face_names": {"+X": "connector", ...},
                  "boresight": "+Z"},
         "notes": "...",
         "measurements": [                                   # optional: repeated measurements
           {"orientation": {"quaternion_wxyz": [w, x, y, z]}, "weight": 1.0, "source": "typed"}]}
      ],
      "chains": [...],                   # Chain.to_dict() each (core/chain.py)
      "checks": [                        # SavedCheck.to_dict() each: which mounts a check compares
        {"name": "check", "nominal": "mount name" or null, "measured": "mount name" or null,
         "settings": {...}}              # CheckSettings.to_dict() (core/check.py)
      ]
    }

A mount's measurements are an optional key (written only when there are some; at most
MAX_MEASUREMENTS_PER_MOUNT), so files without it read as before and the version stays 2.

Chains and checks stay in ``Session.extra`` as read (so a file keeps exactly what it held); they are
checked when the file is read, and `read_chains` / `read_checks` / `with_chains_and_checks` turn them
into values and back. A check names its mounts (names survive reordering and deleting; the window
renames them along with a mount).

Top-level keys this module does not know (the reserved ones above, or keys a newer minor revision adds)
are kept in ``Session.extra`` and written back unchanged, so saving never drops someone else's data.
"""

from __future__ import annotations

import json
import math
import os
import re
from dataclasses import dataclass, field, fields, replace
from pathlib import Path
from typing import Any, Mapping

from core import atomic_file, bounded_json
from core.adjustment_setup import AdjustmentSetup
from core.axes import SIGNED_AXES
from core.chain import Chain
from core.check import CheckSettings
from core.errors import FramewrightError
from core.measurement import MAX_MEASUREMENTS_PER_MOUNT, MAX_SOURCE_CHARS, MAX_WEIGHT, Measurement, \
    measurements_problem
from core.orientation import Orientation
from core.position import LENGTH_UNITS, LIMIT_M, Position

FORMAT_NAME = "framewright-session"
FORMAT_VERSION = 2
# Version 2 added the mounts' and chain steps' optional positions; a version-1 file holds none.
FIRST_VERSION_WITH_POSITIONS = 2
FILE_SUFFIX = ".fwsession.json"

# Keys reserved for settings other parts of the program will add; listed so readers know where they go.
RESERVED_KEYS = ("chains", "checks")

FACE_KEYS = SIGNED_AXES
ANGLE_UNITS = ("deg", "rad")
QUATERNION_ORDERS = ("wxyz", "xyzw")
MATRIX_MEANINGS = ("body_to_reference", "reference_to_body")
# A box of a micrometre or a kilometre is a typing error, not a part; the bounds also keep the Scene's
# arithmetic (half sizes, reciprocals, a size next to another) far from underflow and overflow.
BOX_SIZE_RANGE_MM = (1e-3, 1e6)
MAX_NAME_CHARS = 500

# Names (mounts, faces, chains, steps, checks) are one line of plain text: no control characters (C0, DEL,
# C1) and no line or paragraph separators. Free text (notes, description) may hold tabs and line breaks.
# Neither may hold a lone surrogate, which is not Unicode text and cannot be written in UTF-8.
_NOT_IN_NAME = re.compile("[\x00-\x1f\x7f-\x9f\u2028\u2029\ud800-\udfff]")
_NOT_IN_TEXT = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f\ud800-\udfff]")


def _character_problem(text: str, found: re.Match, what: str) -> str:
    char = found.group()
    kind = "a lone surrogate (not valid Unicode text)" if "\ud800" <= char <= "\udfff" else "a control character"
    return f"{what} holds {kind} U+{ord(char):04X} at character {found.start() + 1}; expected plain text"


def _kind(value: Any) -> str:
    if value is None:
        return "null"
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return "a number"
    if isinstance(value, str):
        return "text"
    if isinstance(value, list):
        return "a list"
    if isinstance(value, dict):
        return "an object"
    return type(value).__name__


def name_problem(value, empty_ok: bool = False) -> str | None:
    """Why `value` is not a valid name (None when it is): text, one line, printable, not too long."""
    if not isinstance(value, str):
        return f"expected a name (text), got {_kind(value)}"
    if not empty_ok and not value.strip():
        return "expected a non-empty name"
    if len(value) > MAX_NAME_CHARS:
        return f"a name of {len(value):,} characters; expected at most {MAX_NAME_CHARS}"
    found = _NOT_IN_NAME.search(value)
    return None if found is None else _character_problem(value, found, "the name")


def free_text_problem(value) -> str | None:
    """Why `value` is not valid free text (notes, description); None when it is."""
    if not isinstance(value, str):
        return f"expected text, got {_kind(value)}"
    found = _NOT_IN_TEXT.search(value)
    return None if found is None else _character_problem(value, found, "the text")


class SessionFileError(FramewrightError):
    """A session file that cannot be read or written: damaged, foreign, or from a newer program."""

    unexpected = False   # True: refused by a constructor rather than by the loader's own field checks


@dataclass(frozen=True)
class PartProperties:
    """What the scene and descriptions need to know about the physical part."""

    box_size_mm: tuple[float, float, float] = (100.0, 60.0, 40.0)
    face_names: Mapping[str, str] = field(default_factory=dict)  # e.g. {"+Z": "lens", "-X": "connector"}
    boresight: str = "+Z"  # the face (and so body axis) the part points with

    def __post_init__(self):
        low, high = BOX_SIZE_RANGE_MM
        size = tuple(float(v) for v in self.box_size_mm)
        if len(size) != 3 or not all(low <= v <= high for v in size):
            raise FramewrightError(f"box size must be three positive numbers from {low:g} to {high:g} mm, "
                                   f"got {self.box_size_mm!r}")
        object.__setattr__(self, "box_size_mm", size)
        for key, name in self.face_names.items():
            if key not in FACE_KEYS:
                raise FramewrightError(f"face name key {key!r} is not one of {', '.join(FACE_KEYS)}")
            problem = name_problem(name, empty_ok=True)
            if problem:
                raise FramewrightError(f"face {key} name: {problem}")
        object.__setattr__(self, "face_names", dict(self.face_names))
        if self.boresight not in FACE_KEYS:
            raise FramewrightError(f"boresight {self.boresight!r} is not one of {', '.join(FACE_KEYS)}")


@dataclass(frozen=True)
class Mount:
    """One named orientation of a part on the equipment, and optionally its position (with the
    orientation, a pose): where the body frame's origin is in the reference frame."""

    name: str
    orientation: Orientation = field(default_factory=Orientation.identity)
    part: PartProperties = field(default_factory=PartProperties)
    notes: str = ""
    position: Position | None = None
    measurements: tuple[Measurement, ...] = ()       # repeated measurements (core/measurement.py)

    def __post_init__(self):
        problem = name_problem(self.name)
        if problem:
            raise FramewrightError(f"mount name: {problem}")
        if isinstance(self.measurements, list):
            object.__setattr__(self, "measurements", tuple(self.measurements))
        problem = measurements_problem(self.measurements)
        if problem:
            raise FramewrightError(f"mount {self.name!r} measurements: {problem}")
        if self.position is not None and not isinstance(self.position, Position):
            raise FramewrightError(f"mount {self.name!r} position: expected a Position or none")
        problem = free_text_problem(self.notes)
        if problem:
            raise FramewrightError(f"mount {self.name!r} notes: {problem}")

    def renamed(self, name: str) -> "Mount":
        return replace(self, name=name)

    def with_orientation(self, orientation: Orientation) -> "Mount":
        return replace(self, orientation=orientation)

    def with_position(self, position: Position | None) -> "Mount":
        return replace(self, position=position)

    def with_measurements(self, measurements) -> "Mount":
        return replace(self, measurements=tuple(measurements))


@dataclass(frozen=True)
class Preferences:
    """How numbers are shown and typed. They never change an orientation, only its spelling."""

    angle_units: str = "deg"
    quaternion_order: str = "wxyz"
    matrix_meaning: str = "body_to_reference"
    sequence: str = "ZYX"
    intrinsic: bool = True
    significant_digits: int = 9
    amber_margin_deg: float = 10.0
    red_margin_deg: float = 1.0

    def __post_init__(self):
        problems = []
        if self.angle_units not in ANGLE_UNITS:
            problems.append(f"angle_units {self.angle_units!r} (expected one of {ANGLE_UNITS})")
        if self.quaternion_order not in QUATERNION_ORDERS:
            problems.append(f"quaternion_order {self.quaternion_order!r} (expected one of {QUATERNION_ORDERS})")
        if self.matrix_meaning not in MATRIX_MEANINGS:
            problems.append(f"matrix_meaning {self.matrix_meaning!r} (expected one of {MATRIX_MEANINGS})")
        from core.sequences import ALL_SEQUENCES  # late: keeps this module importable on its own

        if self.sequence not in ALL_SEQUENCES:
            problems.append(f"sequence {self.sequence!r} (expected one of the 12, e.g. 'ZYX')")
        if not isinstance(self.intrinsic, bool):
            problems.append(f"intrinsic {self.intrinsic!r} (expected true or false)")
        if not isinstance(self.significant_digits, int) or not 3 <= self.significant_digits <= 17:
            problems.append(f"significant_digits {self.significant_digits!r} (expected a whole number 3..17)")
        try:
            amber, red = float(self.amber_margin_deg), float(self.red_margin_deg)
            if not (0 < red < amber <= 90):
                problems.append(f"margin thresholds red {red} / amber {amber} (expected 0 < red < amber <= 90)")
        except (TypeError, ValueError):
            problems.append("margin thresholds must be numbers of degrees")
        if problems:
            raise FramewrightError("preferences not valid: " + "; ".join(problems))

    def to_dict(self) -> dict[str, Any]:
        return {f.name: getattr(self, f.name) for f in fields(self)}

    @classmethod
    def from_dict(cls, data: Mapping[str, Any]) -> "Preferences":
        """Known keys only; missing keys take the defaults, unknown keys are ignored."""
        known = {f.name for f in fields(cls)}
        return cls(**{k: v for k, v in data.items() if k in known})


@dataclass(frozen=True)
class Session:
    mounts: tuple[Mount, ...]
    selected: int = 0
    preferences: Preferences = field(default_factory=Preferences)
    description: str = ""
    extra: Mapping[str, Any] = field(default_factory=dict)  # reserved/unknown top-level keys, kept as read
    # What the reference frame's axes are called (a core/describe.py frame preset: "enu", "ned", ...).
    # It names directions in words ("+Z → down") and sets where gravity points; it never changes R.
    reference_frame: str = "enu"

    def __post_init__(self):
        from core.describe import FRAME_PRESETS  # late, as for Preferences

        if self.reference_frame not in FRAME_PRESETS:
            raise FramewrightError(f"reference frame {self.reference_frame!r} is unknown; expected one of "
                                   f"{', '.join(FRAME_PRESETS)}")
        object.__setattr__(self, "mounts", tuple(self.mounts))
        if not self.mounts:
            raise FramewrightError("a session needs at least one mount")
        if not 0 <= self.selected < len(self.mounts):
            raise FramewrightError(f"selected mount {self.selected} is outside 0..{len(self.mounts) - 1}")

    @classmethod
    def single(cls, name: str = "Mount 1") -> "Session":
        return cls(mounts=(Mount(name),))


@dataclass(frozen=True)
class SavedCheck:
    """A check as the session keeps it: the nominal and measured mounts by name (None: not chosen)."""

    nominal: str | None = None
    measured: str | None = None
    settings: CheckSettings = field(default_factory=CheckSettings)
    name: str = "check"
    adjustment: AdjustmentSetup = field(default_factory=AdjustmentSetup)

    def __post_init__(self):
        for key in ("nominal", "measured"):
            value = getattr(self, key)
            if value is not None and not isinstance(value, str):
                raise FramewrightError(f"check {key}: expected a mount name or null, got {value!r}")
        problem = name_problem(self.name)
        if problem:
            raise FramewrightError(f"check name: {problem}")
        if not isinstance(self.settings, CheckSettings):
            raise FramewrightError("check settings: expected CheckSettings")
        if not isinstance(self.adjustment, AdjustmentSetup):
            raise FramewrightError("check adjustment: expected AdjustmentSetup")

    def to_dict(self) -> dict[str, Any]:
        data = {"name": self.name, "nominal": self.nominal, "measured": self.measured,
                "settings": self.settings.to_dict()}
        if self.adjustment != AdjustmentSetup():     # files without one stay as they were
            data["adjustment"] = self.adjustment.to_dict()
        return data

    @classmethod
    def from_dict(cls, data: Any) -> "SavedCheck":
        if not isinstance(data, dict):
            raise FramewrightError(f"expected a JSON object, got {type(data).__name__}")
        unknown = sorted(set(data) - {"name", "nominal", "measured", "settings", "adjustment"})
        if unknown:
            raise FramewrightError(f"unknown key(s) {', '.join(unknown)}; expected name, nominal, measured, "
                                   "settings, adjustment")
        name = data.get("name", "check")
        if not isinstance(name, str):
            raise FramewrightError(f"name: expected text, got {name!r}")
        adjustment = AdjustmentSetup.from_dict(data["adjustment"]) if "adjustment" in data else AdjustmentSetup()
        return cls(data.get("nominal"), data.get("measured"), CheckSettings.from_dict(data.get("settings", {})),
                   name, adjustment)


def _read_list(session_or_extra, key: str, read, source: str) -> tuple:
    extra = session_or_extra.extra if isinstance(session_or_extra, Session) else session_or_extra
    entries = extra.get(key, [])
    _require(isinstance(entries, list), f"{source}: {key}", "expected a list")
    out = []
    for i, entry in enumerate(entries):
        try:
            out.append(read(entry))
        except SessionFileError:
            raise
        except FramewrightError as exc:
            raise SessionFileError(f"{source}: {key}[{i}]: {exc}") from None
    return tuple(out)


def read_chains(session: "Session", source: str = "session") -> tuple[Chain, ...]:
    """The session's mount chains (none when the file holds none)."""
    return _read_list(session, "chains", Chain.from_dict, source)


def read_checks(session: "Session", source: str = "session") -> tuple[SavedCheck, ...]:
    """The session's checks (none when the file holds none)."""
    return _read_list(session, "checks", SavedCheck.from_dict, source)


def with_chains_and_checks(session: "Session", chains, checks) -> "Session":
    """The session with its chains and checks replaced (a key is left out when it is empty and the
    session did not hold it before)."""
    extra = dict(session.extra)
    for key, values in (("chains", chains), ("checks", checks)):
        if values or key in extra:
            extra[key] = [v.to_dict() for v in values]
    return replace(session, extra=extra)


# ---- writing ---------------------------------------------------------------------------------------

def _mount_to_dict(mount: Mount) -> dict[str, Any]:
    data = {
        "name": mount.name,
        "orientation": {"quaternion_wxyz": [float(v) for v in mount.orientation.as_quaternion()]},
        "part": {
            "box_size_mm": list(mount.part.box_size_mm),
            "face_names": dict(mount.part.face_names),
            "boresight": mount.part.boresight,
        },
        "notes": mount.notes,
    }
    if mount.position is not None:       # no key at all for a mount without one
        data["position"] = mount.position.to_dict()
    if mount.measurements:               # nor for one without measurements
        data["measurements"] = [
            {"orientation": {"quaternion_wxyz": [float(v) for v in m.orientation.as_quaternion()]},
             "weight": m.weight, "source": m.source} for m in mount.measurements]
    return data


def session_to_dict(session: Session) -> dict[str, Any]:
    data: dict[str, Any] = {
        "format": FORMAT_NAME,
        "version": FORMAT_VERSION,
        "description": session.description,
        "reference_frame": session.reference_frame,
        "selected": session.selected,
        "preferences": session.preferences.to_dict(),
        "mounts": [_mount_to_dict(m) for m in session.mounts],
    }
    for key, value in session.extra.items():
        data.setdefault(key, value)
    return data


def session_file_bytes(session: Session, source: str = "session") -> bytes:
    """The bytes a save writes. They are checked to read back first: a session the loader would refuse
    (a lone surrogate or a control character in a name, a non-finite number among kept data) is a
    SessionFileError naming the field, before anything is written."""
    try:
        as_dict = session_to_dict(session)
        bounded_json.check_values(as_dict)       # names the place of a lone surrogate or a NaN
        plain = json.dumps(as_dict, ensure_ascii=True, allow_nan=False)
        data = json.loads(plain)
        bounded_json.check_values(data)
        session_from_dict(data, source=source)
        text = json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False) + "\n"
        return text.encode("utf-8")
    except SessionFileError:
        raise
    except bounded_json.BoundedJsonError as exc:
        raise SessionFileError(f"{source}: {exc}") from None
    except _UNEXPECTED as exc:   # e.g. NaN or an object JSON cannot hold among the kept data
        raise SessionFileError(f"{source}: cannot be written as a session file ({exc})"[:2000]) from None


def save_session(session: Session, path: str | os.PathLike) -> None:
    """Write atomically through core/atomic_file: a temporary file beside the target, flushed to disk,
    then renamed over it, so a crash leaves either the old file or the new one, never half of one. A
    symbolic link is written through, the file's permissions are kept, pipes, devices and folders are
    refused, and temporaries of earlier killed saves are removed. Raises SessionFileError (the session
    cannot be written) or OSError (the file cannot); either way the old file is unchanged."""
    raw = session_file_bytes(session, source=str(path))
    atomic_file.write_atomically(path, raw)


# ---- reading ---------------------------------------------------------------------------------------
# Every field is checked for its type and range before any value is built from it, and refused by its
# place in the file (`mounts[3].part.box_size_mm[1]`) with what was expected. Anything the checks here
# miss but a constructor refuses is still a SessionFileError (see load_session), marked `unexpected` so
# the tests can tell a named refusal from a gap in these checks.

def _require(condition: bool, where: str, message: str) -> None:
    if not condition:
        raise SessionFileError(f"{where}: {message}")


def _at(where: str, key: str | int) -> str:
    return where + (f"[{key}]" if isinstance(key, int) else f".{key}")


def _object(value: Any, where: str, what: str = "an object") -> dict:
    _require(isinstance(value, dict), where, f"expected {what}, got {_kind(value)}")
    return value


def _is_number(value: Any) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def _number(value: Any, where: str, low: float, high: float | None, what: str = "a number") -> float:
    """A number from low to high (high None: no bound but finiteness, which bounded_json has checked)."""
    _require(_is_number(value), where, f"expected {what}, got {_kind(value)}")
    number = float(value)     # bounded_json has already refused numbers a double cannot hold
    if high is None:
        _require(low <= number, where, f"expected {what} of at least {low:g}, got {number!r}")
    else:
        _require(low <= number <= high, where, f"expected {what} from {low:g} to {high:g}, got {number!r}")
    return number


def _numbers(value: Any, count: int, where: str) -> list[float]:
    _require(isinstance(value, list) and len(value) == count, where, f"expected a list of {count} numbers")
    for i, v in enumerate(value):
        _require(_is_number(v), f"{where}[{i}]", f"expected a number, got {_kind(v)}")
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
             else f"expected one of {', '.join(choices)}, got {_kind(value)}")
    return value


def _flag(value: Any, where: str) -> bool:
    _require(isinstance(value, bool), where, f"expected true or false, got {_kind(value)}")
    return value


def _whole(value: Any, where: str, low: int, high: int) -> int:
    _require(isinstance(value, int) and not isinstance(value, bool) and low <= value <= high, where,
             f"expected a whole number from {low} to {high}, got {value!r}" if _is_number(value)
             else f"expected a whole number from {low} to {high}, got {_kind(value)}")
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
    _require(isinstance(value, list), where, f"expected a list of measurements, got {_kind(value)}")
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
    sizes = data.get("box_size_mm", list(PartProperties.box_size_mm))
    size_where = _at(where, "box_size_mm")
    _require(isinstance(sizes, list) and len(sizes) == 3, size_where,
             f"expected a list of 3 sizes in mm, got {_kind(sizes)}" if not isinstance(sizes, list)
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
    axis = settings.get("body_axis")
    if axis is not None and not isinstance(axis, str):
        _numbers(axis, 3, _at(here, "body_axis"))
    elif isinstance(axis, str):
        _name(axis, _at(here, "body_axis"))


def _chain_raw(value: Any, where: str, version: int = FORMAT_VERSION) -> None:
    """A chain entry's fields, before Chain and ChainStep build it."""
    data = _object(value, where)
    if "name" in data:
        _name(data["name"], _at(where, "name"))
    steps = data.get("steps", [])
    _require(isinstance(steps, list), _at(where, "steps"), f"expected a list, got {_kind(steps)}")
    for i, step in enumerate(steps):
        here = _at(_at(where, "steps"), i)
        step = _object(step, here, "an object with name and orientation")
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
             f'not a Framewright session (its "format" is {_kind(fmt)}, expected {FORMAT_NAME!r})')
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
             + (repr(selected) if _is_number(selected) else _kind(selected)))
    description = _free_text(data.get("description", ""), f"{source}: description")
    from core.describe import FRAME_PRESETS

    reference_frame = _choice(data.get("reference_frame", "enu"), f"{source}: reference_frame", tuple(FRAME_PRESETS))
    known = {"format", "version", "description", "reference_frame", "selected", "preferences", "mounts"}
    extra = {k: v for k, v in data.items() if k not in known}
    # Refuse damaged chains and checks now, naming the entry and the field.
    for key, check_raw in (("chains", _chain_raw), ("checks", _check_raw)):
        if key in extra:
            _require(isinstance(extra[key], list), f"{source}: {key}", f"expected a list, got {_kind(extra[key])}")
            for i, entry in enumerate(extra[key]):
                check_raw(entry, f"{source}: {key}[{i}]", version)
    read_chains(extra, source)
    read_checks(extra, source)
    return Session(mounts=mounts, selected=selected, preferences=prefs, description=description, extra=extra,
                   reference_frame=reference_frame)


_UNEXPECTED = (FramewrightError, TypeError, ValueError, OverflowError, KeyError, IndexError, AttributeError,
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
    except _UNEXPECTED as exc:
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
