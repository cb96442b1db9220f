"""Numbers as the window and the command line write them, built on the core's one writer
(core/number_text.py). No Qt: the command line uses these too.

Two spellings, each for its own reader:
- ``significant``: what a field holds and a person may type again or paste elsewhere: significant
  digits, the ASCII minus, arithmetic dust shown as 0, never '-0'.
- ``fixed`` (and ``degrees``, ``vector``, ``compact``): what a panel or the overlay shows to be read:
  the typographic minus (U+2212), a number that rounds to zero shown without a sign, fixed decimals so
  a column of figures lines up.
Neither writes a huge number out digit by digit: past EXPONENT_FROM a figure is written with an exponent,
so a hostile value cannot fill a panel. Not-a-number and infinity are written 'nan', 'inf', '−inf'.
"""

from __future__ import annotations

import math

from core import units
from core.describe import MINUS
from core.number_text import format_number

DEGREE = "\u00b0"
# Beyond this every double is a whole number and fixed decimals only add digits nobody can check.
EXPONENT_FROM = 1e15


def _people(text: str) -> str:
    """ASCII minus signs as the typographic minus a person reads."""
    return text.replace("-", MINUS)


def significant(value: float, digits: int, dust: float | None = None) -> str:
    """'0.7071', '-12.5', '1e+300': `digits` significant digits. A value below `dust` in size (by default
    10^-(digits+3), round-off of a zero) is written 0."""
    value = float(value)
    if dust is None:
        dust = 10.0 ** -(digits + 3)
    if abs(value) < dust:
        value = 0.0
    text = f"{value + 0.0:.{digits}g}"
    return "0" if text == "-0" else text


def compact(value: float, digits: int = 6) -> str:
    """significant() for reading: no dust taken off, the typographic minus."""
    return _people(significant(value, digits, dust=0.0))


def fixed(value: float, decimals: int, *, signed: bool = False, width: int = 0) -> str:
    """'12.500', '−0.250', '+1.000' (signed), right-aligned in `width` characters; zero never signed."""
    value = float(value)
    if not math.isfinite(value):
        text = f"{value:+}" if signed and value > 0 else repr(value)
    elif abs(value) >= EXPONENT_FROM:
        text = f"{value:{'+' if signed else ''}.{decimals}e}"
    else:
        text = format_number(value, decimals)
        if signed and float(text) != 0 and not text.startswith("-"):
            text = "+" + text
    return _people(text).rjust(width)


def degrees(value: float, decimals: int = 3, *, signed: bool = False) -> str:
    return fixed(value, decimals, signed=signed) + DEGREE


def angle(value: float, unit: str = "deg", decimals: int | None = None, *, signed: bool = False) -> str:
    """An angle held in degrees, shown in the display unit `unit` (core/units.py): '0.390°',
    '0.390 mrad', '81.0″', '1° 30′ 15.0″'. Degrees keep three decimals unless told; another unit is
    read to its usual decimals (a milliradian to 0.001, an arcsecond to 0.1)."""
    if unit == "deg":
        return degrees(value, 3 if decimals is None else decimals, signed=signed)
    if not math.isfinite(value):
        return fixed(value, 0) + " " + units.angle_unit(unit).symbol
    if unit == "dms":
        shown = units.format_dms(value)
        return "+" + shown if signed and not shown.startswith(MINUS) and shown.strip("0° ′″.") else shown
    found = units.angle_unit(unit)
    return units.with_symbol(fixed(float(value) * found.per_base, found.decimals if decimals is None else decimals,
                                   signed=signed), unit)


def numbers(values, digits: int) -> str:
    """'0.1, 0, -0.2': significant() of each, comma-separated."""
    return ", ".join(significant(v, digits) for v in values)


def vector(values, decimals: int = 4) -> str:
    """'(0.7071, −0.7071, 0.0000)'."""
    return "(" + ", ".join(fixed(v, decimals) for v in values) + ")"
