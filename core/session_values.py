"""The session's values: named mounts with their parts and measurements, display preferences, the mount
chains, the saved checks and the session that holds them. Immutable; each refuses a value it cannot hold.
Numpy only; never imports Qt. Reading and writing files: core/session_reading.py, core/session_writing.py."""

from __future__ import annotations

from dataclasses import dataclass, field, fields, replace
from typing import Any, Mapping

from core.adjustment_setup import AdjustmentSetup
from core.axes import SIGNED_AXES
from core.chain import Chain
from core.check import CheckSettings
from core.errors import FramewrightError
from core.measurement import Measurement, measurements_problem
from core.name_rules import free_text_problem, name_problem
from core.orientation import Orientation
from core.position import Position

FORMAT_NAME = "framewright-session"
FORMAT_VERSION = 2
# Version 2 added the mounts' and chain steps' optional positions; a version-1 file holds none.
FIRST_VERSION_WITH_POSITIONS = 2
FILE_SUFFIX = ".fwsession.json"

# Top-level keys that are typed fields of Session (never kept in its extra).
RESERVED_KEYS = ("chains", "checks")

FACE_KEYS = SIGNED_AXES
# The display units of angles (core/units.py keys); degrees-minutes-seconds is for readouts, not fields.
ANGLE_UNITS = ("deg", "rad", "mrad", "arcmin", "arcsec", "gon", "mil")
QUATERNION_ORDERS = ("wxyz", "xyzw")
MATRIX_MEANINGS = ("body_to_reference", "reference_to_body")
# A box of a micrometre or a kilometre is a typing error, not a part; the bounds also keep the Scene's
# arithmetic (half sizes, reciprocals, a size next to another) far from underflow and overflow.
BOX_SIZE_RANGE_MM = (1e-3, 1e6)


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



@dataclass(frozen=True)
class Session:
    """The whole state a session file holds. The window's model keeps one and replaces it whole on each
    edit (core/operations.py makes the new one)."""

    mounts: tuple[Mount, ...]
    selected: int = 0
    preferences: Preferences = field(default_factory=Preferences)
    description: str = ""
    extra: Mapping[str, Any] = field(default_factory=dict)  # unknown top-level keys, kept as read
    # What the reference frame's axes are called (a core/describe.py frame preset: "enu", "ned", ...).
    # It names directions in words ("+Z → down") and sets where gravity points; it never changes R.
    reference_frame: str = "enu"
    chains: tuple[Chain, ...] = ()          # mount chains (core/chain.py); the Chain panel edits the first
    checks: tuple[SavedCheck, ...] = ()     # saved checks; the Check panel shows the first

    def __post_init__(self):
        from core.describe import FRAME_PRESETS  # late, as for Preferences

        if self.reference_frame not in FRAME_PRESETS:
            raise FramewrightError(f"reference frame {self.reference_frame!r} is unknown; expected one of "
                                   f"{', '.join(FRAME_PRESETS)}")
        object.__setattr__(self, "mounts", tuple(self.mounts))
        if not self.mounts:
            raise FramewrightError("a session needs at least one mount")
        if not all(isinstance(m, Mount) for m in self.mounts):
            raise FramewrightError("a session's mounts must each be a Mount")
        if not 0 <= self.selected < len(self.mounts):
            raise FramewrightError(f"selected mount {self.selected} is outside 0..{len(self.mounts) - 1}")
        for key, kind in (("chains", Chain), ("checks", SavedCheck)):
            values = tuple(getattr(self, key))
            if not all(isinstance(v, kind) for v in values):
                raise FramewrightError(f"a session's {key} must each be a {kind.__name__}")
            object.__setattr__(self, key, values)
        reserved = sorted(set(self.extra) & set(RESERVED_KEYS))
        if reserved:   # one place for each value: a second copy among the kept keys could disagree
            raise FramewrightError(f"{', '.join(reserved)} are fields of the session, not kept keys")

    @classmethod
    def single(cls, name: str = "Mount 1") -> "Session":
        return cls(mounts=(Mount(name),))

    @property
    def current_mount(self) -> Mount:
        return self.mounts[self.selected]

    @property
    def chain(self) -> Chain:
        """The chain the Chain panel edits (the first; an empty one when there is none)."""
        return self.chains[0] if self.chains else Chain()

    @property
    def check(self) -> SavedCheck:
        """The check the Check panel shows (the first; an empty one when there is none)."""
        return self.checks[0] if self.checks else SavedCheck()
