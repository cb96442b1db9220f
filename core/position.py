"""A position: where a body frame's origin is in its parent (reference) frame, p_ref = R · p_body + t.

Kept in SI (metres) with the unit a person reads it in, so a value typed in millimetres is shown in
millimetres again and never rounded through a second unit. Numpy only; never imports Qt.

    Position.from_shown((12.5, 0, -3), "mm").metres   -> (0.0125, 0.0, -0.003)
    Position((0.0125, 0, -0.003), "mm").shown()       -> (12.5, 0.0, -3.0)

Session-file form: {"metres": [x, y, z], "unit": "mm"}.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from core.errors import FramewrightError
from core.units import LENGTH_UNITS as _UNITS

# Metres per unit, from the one table of lengths (the inch is exactly 25.4 mm): mm, m, in, thou.
LENGTH_UNITS = {key: 1.0 / (1000.0 * unit.per_base) for key, unit in _UNITS.items()}
DEFAULT_UNIT = "mm"          # CONVENTIONS.md: translations in mm by default in the window
# No mount sits farther than a thousand kilometres from its reference: a larger number is a slip (an
# exponent, a unit mistaken), and the bound keeps every product and difference far from overflow.
LIMIT_M = 1e6


def position_problem(values, unit: str | None = "m") -> str | None:
    """Why `values` (three numbers in `unit`) is not a position; None when it is."""
    if unit not in LENGTH_UNITS:
        return f"unknown length unit {unit!r}; expected one of {', '.join(LENGTH_UNITS)}"
    if isinstance(values, (str, bytes)) or not hasattr(values, "__len__") or len(values) != 3:
        return "expected three numbers (x, y, z)"
    for axis, value in zip("xyz", values):
        if isinstance(value, (bool, str, bytes)):
            return f"{axis}: expected a number, got {type(value).__name__}"
        try:
            number = float(value)
        except (TypeError, ValueError):
            return f"{axis}: expected a number, got {type(value).__name__}"
        if not math.isfinite(number):
            return f"{axis}: {number!r} is not a finite number"
        if abs(number * LENGTH_UNITS[unit]) > LIMIT_M:
            return (f"{axis}: {number:g} {unit} is farther than {LIMIT_M:g} m (1000 km) from the reference; "
                    "expected a mounting distance")
    return None


@dataclass(frozen=True)
class Position:
    """metres: (x, y, z) in the parent frame, metres; unit: the unit it is shown and typed in."""

    metres: tuple[float, float, float]
    unit: str = DEFAULT_UNIT

    def __post_init__(self):
        problem = position_problem(self.metres, "m")
        if self.unit not in LENGTH_UNITS:
            problem = f"unknown length unit {self.unit!r}; expected one of {', '.join(LENGTH_UNITS)}"
        if problem:
            raise FramewrightError(f"position: {problem}")
        object.__setattr__(self, "metres", tuple(float(v) + 0.0 for v in self.metres))

    @classmethod
    def from_shown(cls, values, unit: str = DEFAULT_UNIT) -> "Position":
        """From numbers in `unit` (as typed or as a text states them)."""
        problem = position_problem(values, unit)
        if problem:
            raise FramewrightError(f"position: {problem}")
        scale = LENGTH_UNITS[unit]
        return cls(tuple(float(v) * scale for v in values), unit)

    def shown(self, unit: str | None = None) -> tuple[float, float, float]:
        """The numbers in `unit` (its own unit by default)."""
        unit = self.unit if unit is None else unit
        if unit not in LENGTH_UNITS:
            raise FramewrightError(f"unknown length unit {unit!r}; expected one of {', '.join(LENGTH_UNITS)}")
        scale = LENGTH_UNITS[unit]
        return tuple(v / scale + 0.0 for v in self.metres)

    def in_unit(self, unit: str) -> "Position":
        """The same place, shown in another unit."""
        return Position(self.metres, unit)

    def to_dict(self) -> dict:
        return {"metres": list(self.metres), "unit": self.unit}

    @classmethod
    def from_dict(cls, data) -> "Position":
        if not isinstance(data, dict) or set(data) - {"metres", "unit"} or "metres" not in data:
            raise FramewrightError('position: expected {"metres": [x, y, z], "unit": "mm", "m", "in" or "thou"}')
        return cls(tuple(data["metres"]) if isinstance(data["metres"], list) else data["metres"],
                   data.get("unit", DEFAULT_UNIT))


# Units a text may state a translation in: the ones shown, and centimetres (shown as millimetres).
STATED_UNITS = {**LENGTH_UNITS, "cm": 1e-2}
_SHOWN_FOR = {"cm": "mm"}


def position_as_stated(values, unit: str) -> Position:
    """A translation in the unit a text states ('cm' is shown in mm); FramewrightError for any other unit."""
    if unit not in STATED_UNITS:
        raise FramewrightError(f"the translation is in {unit!r}, which Framewright cannot convert yet "
                               f"(expected {', '.join(STATED_UNITS)})")
    shown = _SHOWN_FOR.get(unit, unit)
    metres = [float(v) * STATED_UNITS[unit] for v in values]
    return Position.from_shown([m / LENGTH_UNITS[shown] for m in metres], shown)
