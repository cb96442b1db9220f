"""A session as plain data: named mounts, the selected one and display preferences, with our own
versioned JSON file format (``*.fwsession.json``). Numpy only; never imports Qt.

File layout (version 1)::

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
         "part": {"box_size_mm": [x, y, z], "face_names": {"+X": "connector", ...},
                  "boresight": "+Z"},
         "notes": "..."}
      ],
      "chains": [...],                   # Chain.to_dict() each (core/chain.py)
      "checks": [                        # SavedCheck.to_dict() each: which mounts a check compares
        {"name": "check", "nominal": "mount name" or null, "measured": "mount name" or null,
         "settings": {...}}              # CheckSettings.to_dict() (core/check.py)
      ]
    }

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
import tempfile
from dataclasses import dataclass, field, fields, replace
from pathlib import Path
from typing import Any, Mapping

from core.adjustment_setup import AdjustmentSetup
from core.chain import Chain
from core.check import CheckSettings
from core.errors import FramewrightError
from core.orientation import Orientation

FORMAT_NAME = "framewright-session"
FORMAT_VERSION = 1
FILE_SUFFIX = ".fwsession.json"

# Keys reserved for settings other parts of the program will add; listed so readers know where they go.
RESERVED_KEYS = ("chains", "checks")

FACE_KEYS = ("+X", "-X", "+Y", "-Y", "+Z", "-Z")
ANGLE_UNITS = ("deg", "rad")
QUATERNION_ORDERS = ("wxyz", "xyzw")
MATRIX_MEANINGS = ("body_to_reference", "reference_to_body")


class SessionFileError(FramewrightError):
    """A session file that cannot be read: damaged, foreign, or from a newer program."""


@dataclass(frozen=True)
class PartProperties:
    """What the scene and descriptions need to know about the physical part."""

    box_size_mm: tuple[float, float, float] = (100.0, 60.0, 40.0)
    face_names: Mapping[str, str] = field(default_factory=dict)  # e.g. {"+Z": "lens", "-X": "connector"}
    boresight: str = "+Z"  # the face (and so body axis) the part points with

    def __post_init__(self):
        size = tuple(float(v) for v in self.box_size_mm)
        if len(size) != 3 or not all(math.isfinite(v) and v > 0 for v in size):
            raise FramewrightError(f"box size must be three positive numbers in mm, got {self.box_size_mm!r}")
        object.__setattr__(self, "box_size_mm", size)
        for key in self.face_names:
            if key not in FACE_KEYS:
                raise FramewrightError(f"face name key {key!r} is not one of {', '.join(FACE_KEYS)}")
        object.__setattr__(self, "face_names", dict(self.face_names))
        if self.boresight not in FACE_KEYS:
            raise FramewrightError(f"boresight {self.boresight!r} is not one of {', '.join(FACE_KEYS)}")


@dataclass(frozen=True)
class Mount:
    """One named orientation of a part on the equipment."""

    name: str
    orientation: Orientation = field(default_factory=Orientation.identity)
    part: PartProperties = field(default_factory=PartProperties)
    notes: str = ""

    def renamed(self, name: str) -> "Mount":
        return replace(self, name=name)

    def with_orientation(self, orientation: Orientation) -> "Mount":
        return replace(self, orientation=orientation)


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
    return {
        "name": mount.name,
        "orientation": {"quaternion_wxyz": [float(v) for v in mount.orientation.as_quaternion()]},
        "part": {
            "box_size_mm": list(mount.part.box_size_mm),
            "face_names": dict(mount.part.face_names),
            "boresight": mount.part.boresight,
        },
        "notes": mount.notes,
    }


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


def save_session(session: Session, path: str | os.PathLike) -> None:
    """Write atomically: a temporary file in the same folder, flushed to disk, then renamed over the
    target, so a crash leaves either the old file or the new one, never half of one."""
    path = Path(path)
    text = json.dumps(session_to_dict(session), indent=2, ensure_ascii=False, allow_nan=False) + "\n"
    fd, tmp_name = tempfile.mkstemp(prefix="." + path.name + ".", suffix=".tmp", dir=path.parent)
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as handle:
            handle.write(text)
            handle.flush()
            os.fsync(handle.fileno())
        os.replace(tmp_name, path)
    except BaseException:
        try:
            os.unlink(tmp_name)
        except FileNotFoundError:
            pass
        raise
    try:  # make the rename itself durable where the platform allows it
        dir_fd = os.open(path.parent, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(dir_fd)
    except OSError:
        pass
    finally:
        os.close(dir_fd)


# ---- reading ---------------------------------------------------------------------------------------

def _require(condition: bool, where: str, message: str) -> None:
    if not condition:
        raise SessionFileError(f"{where}: {message}")


def _numbers(value: Any, count: int, where: str) -> list[float]:
    _require(isinstance(value, list) and len(value) == count, where, f"expected a list of {count} numbers")
    out = []
    for i, v in enumerate(value):
        _require(isinstance(v, (int, float)) and not isinstance(v, bool), f"{where}[{i}]",
                 f"expected a number, got {v!r}")
        _require(math.isfinite(v), f"{where}[{i}]", "expected a finite number")
        out.append(float(v))
    return out


def _mount_from_dict(data: Any, where: str) -> Mount:
    _require(isinstance(data, dict), where, "expected an object with name and orientation")
    name = data.get("name")
    _require(isinstance(name, str) and name.strip() != "", f"{where}.name", "expected a non-empty text")
    orient = data.get("orientation")
    _require(isinstance(orient, dict) and "quaternion_wxyz" in orient, f"{where}.orientation",
             'expected {"quaternion_wxyz": [w, x, y, z]}')
    # One representation only: a second one beside it could disagree, and silently dropping it would hide
    # that the file is not what it claims.
    _require(set(orient) == {"quaternion_wxyz"}, f"{where}.orientation",
             f'expected only "quaternion_wxyz", found also {sorted(set(orient) - {"quaternion_wxyz"})}')
    q = _numbers(orient["quaternion_wxyz"], 4, f"{where}.orientation.quaternion_wxyz")
    norm = math.sqrt(sum(v * v for v in q))
    _require(abs(norm - 1.0) <= 1e-6, f"{where}.orientation.quaternion_wxyz",
             f"expected a unit quaternion, its norm is {norm:.9g} (the file may be damaged)")
    part_data = data.get("part", {})
    _require(isinstance(part_data, dict), f"{where}.part", "expected an object")
    try:
        size = _numbers(part_data.get("box_size_mm", list(PartProperties.box_size_mm)), 3, f"{where}.part.box_size_mm")
        faces = part_data.get("face_names", {})
        _require(isinstance(faces, dict) and all(isinstance(v, str) for v in faces.values()),
                 f"{where}.part.face_names", 'expected an object like {"+Z": "lens"}')
        part = PartProperties(box_size_mm=tuple(size), face_names=faces,
                              boresight=part_data.get("boresight", "+Z"))
    except SessionFileError:
        raise
    except FramewrightError as exc:
        raise SessionFileError(f"{where}.part: {exc}") from None
    notes = data.get("notes", "")
    _require(isinstance(notes, str), f"{where}.notes", "expected text")
    return Mount(name=name, orientation=Orientation.from_quaternion(q), part=part, notes=notes)


def session_from_dict(data: Any, source: str = "session") -> Session:
    _require(isinstance(data, dict), source, "expected a JSON object at the top level")
    fmt = data.get("format")
    _require(fmt == FORMAT_NAME, source,
             f'not a Framewright session (its "format" is {fmt!r}, expected {FORMAT_NAME!r})')
    version = data.get("version")
    _require(isinstance(version, int) and not isinstance(version, bool), source,
             '"version" is missing or not a whole number')
    _require(version <= FORMAT_VERSION, source,
             f"written by a newer Framewright (format version {version}; this one reads up to {FORMAT_VERSION})")
    _require(version >= 1, source, f"format version {version} is not valid")
    mounts_data = data.get("mounts")
    _require(isinstance(mounts_data, list) and len(mounts_data) > 0, f"{source}: mounts",
             "expected a list of at least one mount")
    mounts = tuple(_mount_from_dict(m, f"{source}: mounts[{i}]") for i, m in enumerate(mounts_data))
    prefs_data = data.get("preferences", {})
    _require(isinstance(prefs_data, dict), f"{source}: preferences", "expected an object")
    try:
        prefs = Preferences.from_dict(prefs_data)
    except (FramewrightError, TypeError) as exc:
        raise SessionFileError(f"{source}: {exc}") from None
    selected = data.get("selected", 0)
    _require(isinstance(selected, int) and 0 <= selected < len(mounts), f"{source}: selected",
             f"expected a mount index 0..{len(mounts) - 1}, got {selected!r}")
    description = data.get("description", "")
    _require(isinstance(description, str), f"{source}: description", "expected text")
    from core.describe import FRAME_PRESETS

    reference_frame = data.get("reference_frame", "enu")
    _require(reference_frame in FRAME_PRESETS, f"{source}: reference_frame",
             f"expected one of {', '.join(FRAME_PRESETS)}, got {reference_frame!r}")
    known = {"format", "version", "description", "reference_frame", "selected", "preferences", "mounts"}
    extra = {k: v for k, v in data.items() if k not in known}
    read_chains(extra, source)  # refuse damaged chains and checks now, naming the entry
    read_checks(extra, source)
    return Session(mounts=mounts, selected=selected, preferences=prefs, description=description, extra=extra,
                   reference_frame=reference_frame)


def load_session(path: str | os.PathLike) -> Session:
    """Read a session file; every failure is a SessionFileError naming the file and the problem."""
    path = Path(path)
    try:
        raw = path.read_bytes()
    except OSError as exc:
        raise SessionFileError(f"{path}: cannot be read ({exc.strerror or exc})") from None
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        raise SessionFileError(f"{path}: not a text file in UTF-8 (byte {exc.start}); "
                               "it may be damaged or not a session file") from None
    if not text.strip():
        raise SessionFileError(f"{path}: the file is empty")
    try:
        data = json.loads(text)
    except json.JSONDecodeError as exc:
        raise SessionFileError(f"{path}: damaged JSON at line {exc.lineno}, column {exc.colno}: {exc.msg}") from None
    return session_from_dict(data, source=str(path))
