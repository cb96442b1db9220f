"""Nominal against measured: total deviation, pointing error of a body axis and the roll about it, each
against a tolerance with a pass / fail and a margin.

Definitions (CONVENTIONS.md):
- Deviation D = Nᵀ M: the turn that takes the nominal body frame onto the measured one, written in the
  nominal body frame. Its angle is the total deviation; its axis is given in nominal body axes.
- Pointing error of a body axis a: the angle between N a and M a (where the axis should point and where it
  does point). Equal to the angle between a and D a.
- Roll about a: what is left of D once the pointing is corrected. D is split as D = S · T (swing–twist),
  T a turn about a, S a turn about an axis perpendicular to a. The swing angle is the pointing error, the
  twist angle is the roll (signed, right-hand rule about a, in (−180°, 180°]). The twist angle is the same
  whichever order the split is taken in (S · T or T · S), so "roll" has one meaning.
- Margin = tolerance − value (negative when failing). A value equal to its tolerance passes.

The array functions (radians, quaternions w-first, any leading shape) serve one check and a batch of a
million alike; `check` wraps them for one pair of Orientations.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from core import axes, kernels
from core.axes import axis_name
from core.errors import FramewrightError, InvalidInputError
from core.orientation import Orientation
from core.position import LIMIT_M, Position

MODES = ("total", "pointing_and_roll")

# A body axis turned to within this (radians) of straight back has no roll worth reporting: the twist
# would be rounding noise.
ROLL_UNDEFINED_RAD = 2e-9

def axis_vector(spec, what="body axis"):
    """A unit 3-vector from a named axis ('+Z', '-x', 'Y') or three numbers (normalised)."""
    if isinstance(spec, str):
        return axes.unit_vector(spec, what, or_else="three numbers")
    v = kernels.check_array(spec, (3,), what)
    if v.shape != (3,):
        raise InvalidInputError(f"{what}: expected three numbers, got shape {v.shape}")
    if not np.any(v):
        raise InvalidInputError(f"{what}: zero-length direction; expected a non-zero (x, y, z)")
    return kernels.unit_vectors(v, what)[0]   # scaled: 1e200 or 1e-200 keeps its direction


# --- array functions (radians) ---------------------------------------------------------------------

def deviation_quaternions(q_nominal, q_measured):
    """D = N⁻¹ ⊗ M for unit quaternions (any leading shape): the deviation in the nominal body frame."""
    return kernels.multiply_quaternions(kernels.conjugate_quaternions(q_nominal), q_measured)


def deviation_angles(d):
    """Rotation angle of each deviation quaternion, radians in [0, pi] (atan2 form: exact near 0)."""
    d = np.asarray(d, dtype=np.float64)
    return 2.0 * np.arctan2(np.linalg.norm(d[..., 1:], axis=-1), np.abs(d[..., 0]))


def deviation_axes(d):
    """Unit rotation axis of each deviation (nominal body frame); (0, 0, 0) where the angle is zero.

    The sign follows w >= 0, so the axis goes with an angle in [0, pi]."""
    d = np.asarray(d, dtype=np.float64)
    v = d[..., 1:] * np.where(d[..., :1] < 0, -1.0, 1.0)
    s = np.linalg.norm(v, axis=-1)
    return np.where((s > 0)[..., None], v / np.where(s > 0, s, 1.0)[..., None], 0.0) + 0.0


def swing_twist_angles(d, axis):
    """(swing, twist, twist_defined) of each deviation about the unit body axis `axis` (radians).

    With D = (w, v) and p = v · a: the twist is the normalised (w, p a), so cos(swing/2) = hypot(w, p)
    and sin(swing/2) = |v − p a|. swing is the pointing error of a, in [0, pi]; twist is the roll about a,
    in (−pi, pi]. When swing is pi the twist is undefined; within ROLL_UNDEFINED_RAD of pi the rounding of
    D decides it. There it is reported as 0 with twist_defined False."""
    d = np.asarray(d, dtype=np.float64)
    a = np.asarray(axis, dtype=np.float64)
    w = d[..., 0]
    v = d[..., 1:]
    p = np.einsum("...i,...i->...", v, np.broadcast_to(a, v.shape))
    perpendicular = np.linalg.norm(v - p[..., None] * a, axis=-1)
    along = np.hypot(w, p)
    swing = 2.0 * np.arctan2(perpendicular, along)
    # twist = 2 atan2(p, w); taking w >= 0 first keeps it in (−pi, pi] for either sign of D.
    sign = np.where(w < 0, -1.0, 1.0)
    twist = 2.0 * np.arctan2(p * sign, w * sign)
    twist = np.where(twist <= -np.pi, twist + 2.0 * np.pi, twist)
    defined = along > 0.5 * ROLL_UNDEFINED_RAD     # cos(swing/2) ≈ (pi − swing)/2
    return swing, np.where(defined, twist, 0.0) + 0.0, defined


def pointing_errors(q_nominal, q_measured, body_axis):
    """Angle (radians) between N a and M a for each pair: the pointing error of body axis a."""
    return swing_twist_angles(deviation_quaternions(q_nominal, q_measured), body_axis)[0]


# --- settings and one check ------------------------------------------------------------------------

def _tolerance(value, what):
    try:
        number = float(value)
    except (TypeError, ValueError) as exc:
        raise InvalidInputError(f"{what}: expected a number of degrees, got {value!r}") from exc
    if not math.isfinite(number) or not 0 <= number <= 180:
        # No deviation exceeds 180°: a larger tolerance cannot fail and is a typo, not a tolerance.
        raise InvalidInputError(f"{what}: expected an angle from 0 to 180 degrees, got {value!r}")
    return number


# A position tolerance beyond the farthest position there is (core/position.py) cannot fail: a typo.
POSITION_TOLERANCE_LIMIT_MM = LIMIT_M * 1e3


def _length_tolerance(value):
    if isinstance(value, (bool, str)):
        raise InvalidInputError(f"position tolerance: expected a number of mm, got {value!r}")
    try:
        number = float(value)
    except (TypeError, ValueError) as exc:
        raise InvalidInputError(f"position tolerance: expected a number of mm, got {value!r}") from exc
    if not math.isfinite(number) or not 0 <= number <= POSITION_TOLERANCE_LIMIT_MM:
        raise InvalidInputError(f"position tolerance: expected a distance from 0 to "
                                f"{POSITION_TOLERANCE_LIMIT_MM:g} mm, got {value!r}")
    return number


TOLERANCE_NAMES = ("total", "pointing", "roll")


def _tolerance_units(value) -> tuple:
    """(('pointing', 'mrad'), ...) checked: known tolerances, known angle units, each once; degrees left out."""
    from core.units import ANGLE_UNITS

    if isinstance(value, dict):
        value = tuple(value.items())
    try:
        pairs = tuple((str(k), str(u)) for k, u in value)
    except (TypeError, ValueError):
        raise InvalidInputError(f"tolerance units: expected pairs of a tolerance and a unit, got {value!r}"[:200]) \
            from None
    names = [k for k, _ in pairs]
    for name, unit in pairs:
        if name not in TOLERANCE_NAMES:
            raise InvalidInputError(f"tolerance units: {name!r} is no tolerance; expected {', '.join(TOLERANCE_NAMES)}")
        if unit not in ANGLE_UNITS:
            raise InvalidInputError(f"tolerance units: {unit!r} is no angle unit; expected one of "
                                    f"{', '.join(ANGLE_UNITS)}")
    if len(set(names)) != len(names):
        raise InvalidInputError("tolerance units: a tolerance is named twice")
    return tuple(sorted((k, u) for k, u in pairs if u != "deg"))


@dataclass(frozen=True)
class CheckSettings:
    """What a check compares against.

    mode: 'total' (the total deviation against total_tolerance_deg) or 'pointing_and_roll' (the pointing
    error of body_axis against pointing_tolerance_deg and |roll| about it against roll_tolerance_deg).
    body_axis: a named axis ('+Z') or three numbers; None reports no pointing figures (mode 'total' only).
    position_tolerance_mm: None (positions are not judged) or the largest distance (mm) the measured
    position may be from the nominal one; judged only when both mounts have a position
    (`check_position`), and reported after the orientation verdict.
    tolerance_units: the unit each angle tolerance was stated in (('total', 'mrad'), ...), as the drawing
    gives it; the tolerances themselves are always degrees. Absent: degrees.
    """

    mode: str = "total"
    total_tolerance_deg: float = 0.5
    pointing_tolerance_deg: float = 0.5
    roll_tolerance_deg: float = 1.0
    body_axis: str | tuple | None = None
    position_tolerance_mm: float | None = None
    tolerance_units: tuple = ()

    def __post_init__(self):
        object.__setattr__(self, "tolerance_units", _tolerance_units(self.tolerance_units))
        if self.position_tolerance_mm is not None:
            object.__setattr__(self, "position_tolerance_mm", _length_tolerance(self.position_tolerance_mm))
        if self.mode not in MODES:
            raise InvalidInputError(f"check mode {self.mode!r} is unknown; expected one of {', '.join(MODES)}")
        for name in ("total_tolerance_deg", "pointing_tolerance_deg", "roll_tolerance_deg"):
            object.__setattr__(self, name, _tolerance(getattr(self, name), name.replace("_", " ")))
        axis = self.body_axis
        if axis is not None:
            name = axis_name(axis)
            if name is not None:
                axis = name
            else:
                axis_vector(axis)  # validates
                axis = tuple(float(c) for c in np.asarray(axis, dtype=float))
            object.__setattr__(self, "body_axis", axis)
        if self.mode == "pointing_and_roll" and axis is None:
            raise InvalidInputError(
                "check mode 'pointing_and_roll' needs a body axis; expected body_axis such as '+Z'")

    def unit_of(self, tolerance: str) -> str:
        """The unit the 'total', 'pointing' or 'roll' tolerance was stated in ('deg' unless another)."""
        return dict(self.tolerance_units).get(tolerance, "deg")

    def with_unit(self, tolerance: str, unit: str) -> "CheckSettings":
        kept = {k: v for k, v in self.tolerance_units if k != tolerance}
        if unit != "deg":
            kept[tolerance] = unit
        return replace(self, tolerance_units=tuple(sorted(kept.items())))

    def axis_vector(self):
        """The unit body axis, or None."""
        return None if self.body_axis is None else axis_vector(self.body_axis)

    def to_dict(self):
        axis = self.body_axis
        return {
            "mode": self.mode,
            "total_tolerance_deg": self.total_tolerance_deg,
            "pointing_tolerance_deg": self.pointing_tolerance_deg,
            "roll_tolerance_deg": self.roll_tolerance_deg,
            "body_axis": list(axis) if isinstance(axis, tuple) else axis,
            **({} if self.position_tolerance_mm is None else {"position_tolerance_mm": self.position_tolerance_mm}),
            **({"tolerance_units": dict(self.tolerance_units)} if self.tolerance_units else {}),
        }

    @classmethod
    def from_dict(cls, data):
        """Settings from to_dict's form; missing keys take the defaults, unknown keys are refused."""
        if not isinstance(data, dict):
            raise FramewrightError(f"check settings: expected a JSON object, got {type(data).__name__}")
        known = {"mode", "total_tolerance_deg", "pointing_tolerance_deg", "roll_tolerance_deg", "body_axis",
                 "position_tolerance_mm", "tolerance_units"}
        unknown = sorted(set(data) - known)
        if unknown:
            raise FramewrightError(
                f"check settings: unknown key(s) {', '.join(unknown)}; expected some of {', '.join(sorted(known))}")
        values = dict(data)
        if isinstance(values.get("tolerance_units"), dict):
            values["tolerance_units"] = tuple(sorted(values["tolerance_units"].items()))
        if isinstance(values.get("body_axis"), list):
            values["body_axis"] = tuple(values["body_axis"])
        return cls(**values)


# A figure equal to its tolerance passes. Computed figures carry rounding of about 1e-14°, so "equal" is
# taken to a nanodegree: far below anything a bench instrument resolves, far above double rounding.
ROUNDING_ALLOWANCE_DEG = 1e-9


@dataclass(frozen=True)
class Criterion:
    """One figure against its tolerance (degrees). margin = tolerance − value; passed when margin >= 0."""

    name: str
    value_deg: float
    tolerance_deg: float

    @property
    def margin_deg(self):
        return self.tolerance_deg - self.value_deg

    @property
    def passed(self):
        return self.value_deg <= self.tolerance_deg + ROUNDING_ALLOWANCE_DEG


@dataclass(frozen=True)
class CheckResult:
    """deviation: D = Nᵀ M. total_deg and axis (nominal body frame; zeros at no deviation).
    pointing_deg / roll_deg: for settings.body_axis (None without one); roll_defined is False when the
    axis points exactly backwards and the roll cannot be told. criteria: the figures judged."""

    deviation: Orientation
    total_deg: float
    axis: np.ndarray
    body_axis: np.ndarray | None
    pointing_deg: float | None
    roll_deg: float | None
    roll_defined: bool
    criteria: tuple
    notes: tuple = ()

    @property
    def passed(self):
        return all(c.passed for c in self.criteria)

    @property
    def margin_deg(self):
        """The smallest margin of the criteria (the one that decides)."""
        return min(c.margin_deg for c in self.criteria)

    def summary(self):
        """One line for a person, e.g. 'PASS: total deviation 0.500° within 1.000° (margin 0.500°)'."""
        parts = [f"{c.name} {c.value_deg:.3f}° {'within' if c.passed else 'exceeds'} "
                 f"{c.tolerance_deg:.3f}° (margin {c.margin_deg:+.3f}°)" for c in self.criteria]
        return ("PASS: " if self.passed else "FAIL: ") + "; ".join(parts)


def check(nominal, measured, settings=CheckSettings()):
    """Compare a measured Orientation with the nominal one under `settings`."""
    if not isinstance(nominal, Orientation) or not isinstance(measured, Orientation):
        raise InvalidInputError("check: expected two Orientation values (nominal, measured)")
    d = deviation_quaternions(nominal.quaternion, measured.quaternion)
    total = float(np.degrees(deviation_angles(d)))
    axis = deviation_axes(d)
    body_axis = settings.axis_vector()
    pointing = roll = None
    roll_defined = True
    notes = []
    if body_axis is not None:
        swing, twist, defined = swing_twist_angles(d, body_axis)
        pointing, roll, roll_defined = float(np.degrees(swing)), float(np.degrees(twist)), bool(defined)
        if not roll_defined:
            notes.append("the body axis points exactly backwards: the roll about it is undefined (shown as 0)")
    if settings.mode == "total":
        criteria = (Criterion("total deviation", total, settings.total_tolerance_deg),)
    else:
        # An undefined roll is never "within tolerance": it is judged as the worst roll there is.
        roll_criterion = (Criterion("roll", abs(roll), settings.roll_tolerance_deg) if roll_defined else
                          Criterion("roll (undefined, judged as 180°)", 180.0, settings.roll_tolerance_deg))
        criteria = (Criterion("pointing error", pointing, settings.pointing_tolerance_deg), roll_criterion)
    return CheckResult(Orientation(d), total, axis, body_axis, pointing, roll, roll_defined, criteria,
                       tuple(notes))


# --- positions -------------------------------------------------------------------------------------

# As ROUNDING_ALLOWANCE_DEG: a distance equal to its tolerance passes; a nanometre absorbs the rounding
# of metres to millimetres and back.
ROUNDING_ALLOWANCE_MM = 1e-6


@dataclass(frozen=True)
class PositionOffset:
    """Where the measured origin is from the nominal one. distance_mm: the straight distance;
    along_nominal_mm: the offset in the nominal body axes, Nᵀ (t_M − t_N); along_reference_mm: the same
    in reference axes; tolerance_mm: None when positions are not judged."""

    distance_mm: float
    along_nominal_mm: tuple[float, float, float]
    along_reference_mm: tuple[float, float, float]
    tolerance_mm: float | None

    @property
    def judged(self) -> bool:
        return self.tolerance_mm is not None

    @property
    def passed(self) -> bool | None:
        return None if self.tolerance_mm is None else self.distance_mm <= self.tolerance_mm + ROUNDING_ALLOWANCE_MM

    @property
    def margin_mm(self) -> float | None:
        return None if self.tolerance_mm is None else self.tolerance_mm - self.distance_mm

    def summary(self) -> str:
        """One line for a person, e.g. 'position offset 0.412 mm within 0.500 mm (margin +0.088 mm)'."""
        x, y, z = self.along_nominal_mm
        axes = f"(x {x:+.3f}, y {y:+.3f}, z {z:+.3f} mm along the nominal body axes)"
        if self.tolerance_mm is None:
            return f"position offset {self.distance_mm:.3f} mm {axes}, not judged (no position tolerance)"
        word = "within" if self.passed else "exceeds"
        return (f"{'PASS' if self.passed else 'FAIL'}: position offset {self.distance_mm:.3f} mm {word} "
                f"{self.tolerance_mm:.3f} mm (margin {self.margin_mm:+.3f} mm) {axes}")


def check_position(nominal, nominal_position, measured_position, tolerance_mm=None):
    """The offset of the measured origin from the nominal one, or None when either has no position.

    nominal: the nominal Orientation N (its body axes are the frame of the per-axis figures);
    positions: Position values (or None); tolerance_mm: None, or the distance judged."""
    if nominal_position is None or measured_position is None:
        return None
    if not isinstance(nominal, Orientation) or not all(isinstance(p, Position)
                                                      for p in (nominal_position, measured_position)):
        raise InvalidInputError("check_position: expected an Orientation and two Position values")
    if tolerance_mm is not None:
        tolerance_mm = _length_tolerance(tolerance_mm)
    offset_m = np.array(measured_position.metres) - np.array(nominal_position.metres)
    along_nominal = nominal.as_matrix().T @ offset_m
    distance_m = float(np.linalg.norm(offset_m))
    return PositionOffset(distance_m * 1e3, tuple(float(v) * 1e3 + 0.0 for v in along_nominal),
                          tuple(float(v) * 1e3 + 0.0 for v in offset_m), tolerance_mm)
