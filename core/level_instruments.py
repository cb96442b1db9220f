"""Levels and inclinometers a technician lays on a part, with the resolution each reads to, so a reading is
shown as the instrument would show it (rounded to its division), in its own unit.

The resolutions are typical values of each class of instrument (common practice, from memory; the
instrument's own certificate governs): a precision machinist's level reads 0.02 mm/m a division, an
engineer's (general-purpose) precision level 0.05 mm/m, a digital inclinometer 0.01°, an electronic level
1 µm/m, a builder's level about 0.5 mm/m (one division of its vial)."""

from __future__ import annotations

import math
from dataclasses import dataclass

from core import units
from core.errors import InvalidInputError


@dataclass(frozen=True)
class Instrument:
    key: str
    name: str
    unit: str            # a core/units.py slope unit key
    resolution: float    # one division, in `unit`


INSTRUMENTS: dict[str, Instrument] = {i.key: i for i in (
    # name: short enough for a drop-down in the narrow side area; one division of each in the resolution
    Instrument("machinist", "machinist's level, 0.02 mm/m", "mm/m", 0.02),
    Instrument("engineer", "engineer's level, 0.05 mm/m", "mm/m", 0.05),
    Instrument("electronic", "electronic level, 1 µm/m", "um/m", 1.0),
    Instrument("inclinometer", "digital inclinometer, 0.01°", "deg", 0.01),
    Instrument("builder", "builder's level, 0.5 mm/m", "mm/m", 0.5),
)}
SOURCE_NOTE = ("typical resolution of the class of instrument (common practice); the instrument's own "
               "certificate governs")


def instrument(key: str) -> Instrument:
    try:
        return INSTRUMENTS[key]
    except (KeyError, TypeError):
        raise InvalidInputError(f"unknown instrument {key!r}; expected one of {', '.join(INSTRUMENTS)}") from None


@dataclass(frozen=True)
class InstrumentReading:
    value: float           # the slope (or tilt) rounded to the instrument's division, in its unit
    divisions: int         # how many divisions that is
    text: str              # as shown: '1.74 mm/m'
    beyond_range: bool     # more than 45° of tilt: a level laid on this face reads nothing useful


def read_with(tilt_deg: float, key: str) -> InstrumentReading:
    """What the instrument shows for a face tilted `tilt_deg` from level (or from plumb): rounded to one
    division, never a finer digit than the instrument has."""
    chosen = instrument(key)
    if not math.isfinite(tilt_deg):
        raise InvalidInputError(f"not a finite tilt: {tilt_deg!r}")
    exact = float(units.tilt_to_slope(tilt_deg, chosen.unit))
    divisions = round(exact / chosen.resolution)
    value = divisions * chosen.resolution
    decimals = max(0, -math.floor(math.log10(chosen.resolution) + 1e-12))
    unit = units.SLOPE_UNITS[chosen.unit]
    shown = f"{value:.{decimals}f}".replace("-", "\u2212")
    if float(value) == 0:
        shown = shown.lstrip("\u2212")
    text = f"{shown}{unit.symbol}" if unit.symbol in "°%" else f"{shown} {unit.symbol}"
    return InstrumentReading(value, int(divisions), text, abs(tilt_deg) > 45.0)
