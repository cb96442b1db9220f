"""The units the trade states angles, slopes and lengths in, and text with a unit mark read as a number.

Angles: degrees, radians, milliradians, arcminutes, arcseconds, gon and NATO mils (6400 to a turn, named
so because other mils exist: the Warsaw Pact's 6000 and the thousandth of an inch). Slopes: a tilt as
degrees, mm per metre, µm per metre, inches per foot or percent grade, all from tan(tilt). Lengths:
millimetres, metres, inches and thousandths of an inch (thou). Every conversion is a multiplication by
a factor defined exactly (the inch is 25.4 mm by the 1959 international agreement); degrees and
millimetres are what the program keeps.

`read_angle("1′30″")` gives degrees and the unit the text named; text that names two kinds of unit
("1° 2 gon"), a mark twice ("1′ 2′"), parts out of order or a part beyond its range ("1° 75′"), a
non-finite number or anything else is refused with the reason. Numpy only.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

import numpy as np

from core.errors import InvalidInputError

MINUS_SIGNS = "-\u2212\u2013"        # ASCII hyphen-minus, the Unicode minus, the en dash
MAX_TEXT_CHARS = 80


@dataclass(frozen=True)
class Unit:
    """key: the one spelling the program uses (settings, JSON, --units). per_base: how many of this unit
    make one degree (angles) or one millimetre (lengths). marks: spellings read from text, lower case
    unless the case matters."""

    key: str
    name: str
    symbol: str
    per_base: float
    marks: tuple[str, ...]
    decimals: int            # what a person reads this unit to, for display
    note: str = ""


_RAD_PER_DEG = math.pi / 180.0
ANGLE_UNITS: dict[str, Unit] = {u.key: u for u in (
    Unit("deg", "degrees", "°", 1.0, ("°", "deg", "degs", "degree", "degrees", "º"), 4),
    # Degrees shown as degrees, minutes and seconds; read from text written that way (1°30′15″).
    Unit("dms", "degrees, minutes and seconds", "°′″", 1.0, (), 1),
    Unit("rad", "radians", "rad", _RAD_PER_DEG, ("rad", "rads", "radian", "radians"), 6),
    Unit("mrad", "milliradians", "mrad", 1000.0 * _RAD_PER_DEG, ("mrad", "mrads", "milliradian", "milliradians"), 3),
    Unit("arcmin", "arcminutes", "′", 60.0, ("′", "'", "arcmin", "arcmins", "arcminute", "arcminutes", "moa"), 2),
    Unit("arcsec", "arcseconds", "″", 3600.0,
         ("″", "\"", "''", "′′", "arcsec", "arcsecs", "arcsecond", "arcseconds", "asec"), 1),
    Unit("gon", "gon", "gon", 400.0 / 360.0, ("gon", "gons", "grad", "grads", "gradian", "gradians"), 4),
    Unit("mil", "NATO mils", "mil", 6400.0 / 360.0, ("mil", "mils", "nato mil", "nato mils"), 2,
         "NATO mils: 6400 to a turn (not the Warsaw Pact's 6000, nor a thousandth of an inch)"),
)}

LENGTH_UNITS: dict[str, Unit] = {u.key: u for u in (
    Unit("mm", "millimetres", "mm", 1.0, ("mm", "millimetre", "millimetres", "millimeter", "millimeters"), 3),
    Unit("m", "metres", "m", 1e-3, ("m", "metre", "metres", "meter", "meters"), 6),
    Unit("in", "inches", "in", 1.0 / 25.4, ("in", "inch", "inches", "\""), 4),
    Unit("thou", "thousandths of an inch", "thou", 1000.0 / 25.4, ("thou", "thous", "mil", "mils"), 2,
         "thou: a thousandth of an inch (0.0254 mm), also called a mil; not the angular NATO mil"),
)}


@dataclass(frozen=True)
class SlopeUnit:
    """A tilt as a slope: `per_tangent` of this unit make tan(tilt) = 1 (degrees are the exception: the
    tilt itself)."""

    key: str
    name: str
    symbol: str
    per_tangent: float | None      # None: degrees of tilt, not a ratio
    decimals: int


SLOPE_UNITS: dict[str, SlopeUnit] = {u.key: u for u in (
    SlopeUnit("deg", "degrees of tilt", "°", None, 4),
    SlopeUnit("mm/m", "millimetres per metre", "mm/m", 1000.0, 3),
    SlopeUnit("um/m", "micrometres per metre", "µm/m", 1e6, 0),
    SlopeUnit("in/ft", "inches per foot", "in/ft", 12.0, 4),
    SlopeUnit("percent", "percent grade", "%", 100.0, 3),
)}


def angle_unit(key: str) -> Unit:
    try:
        return ANGLE_UNITS[key]
    except (KeyError, TypeError):
        raise InvalidInputError(f"unknown angle unit {key!r}; expected one of {', '.join(ANGLE_UNITS)}") from None


def length_unit(key: str) -> Unit:
    try:
        return LENGTH_UNITS[key]
    except (KeyError, TypeError):
        raise InvalidInputError(f"unknown length unit {key!r}; expected one of {', '.join(LENGTH_UNITS)}") from None


def slope_unit(key: str) -> SlopeUnit:
    try:
        return SLOPE_UNITS[key]
    except (KeyError, TypeError):
        raise InvalidInputError(f"unknown slope unit {key!r}; expected one of {', '.join(SLOPE_UNITS)}") from None


# --- conversions (vectorised: a number or an array) -------------------------------------------------

def degrees_to(values, key: str):
    """Degrees in the angle unit `key`."""
    return np.multiply(values, angle_unit(key).per_base)


def to_degrees(values, key: str):
    """Values in the angle unit `key`, in degrees."""
    return np.divide(values, angle_unit(key).per_base)


def millimetres_to(values, key: str):
    return np.multiply(values, length_unit(key).per_base)


def to_millimetres(values, key: str):
    return np.divide(values, length_unit(key).per_base)


def tilt_to_slope(tilt_deg, key: str):
    """A tilt in degrees as a slope in unit `key` (tan of the tilt, scaled), or degrees for 'deg'."""
    unit = slope_unit(key)
    if unit.per_tangent is None:
        return np.asarray(tilt_deg, dtype=float) * 1.0
    return np.tan(np.radians(tilt_deg)) * unit.per_tangent


def slope_to_tilt(slope, key: str):
    """A slope in unit `key`, as the tilt in degrees (arctan, so any slope maps below 90°)."""
    unit = slope_unit(key)
    if unit.per_tangent is None:
        return np.asarray(slope, dtype=float) * 1.0
    return np.degrees(np.arctan(np.divide(slope, unit.per_tangent)))


def rise_over(tilt_deg, base_mm):
    """The height a tilt makes over a base (mm): base · tan(tilt), e.g. a shim per 100 mm of footprint."""
    return np.multiply(base_mm, np.tan(np.radians(tilt_deg)))


# --- reading text with a unit mark -----------------------------------------------------------------

# The number is an atomic group: a part never ends inside a number ('10' is not '1' then '0'), and a part may
# end before a sign, so text that cannot be read is quoted from where it goes wrong ('+ 30′' in '10° + 30′').
_NUMBER = r"(?>[+\-\u2212\u2013]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+\-\u2212\u2013]?\d+)?)"
_PART = re.compile(rf"\s*({_NUMBER})\s*([^\d\s+\-\u2212\u2013.][^\d+\-\u2212\u2013]*?)?\s*(?=$|[+\-\u2212\u2013]|\d|\.\d)")
_SEXAGESIMAL = ("deg", "arcmin", "arcsec")


@dataclass(frozen=True)
class ReadAngle:
    degrees: float
    unit: str            # the unit the text named (or the default, when it named none)
    said: str            # what was understood, in words: "1′30″ = 0.025°"


def _unit_of_mark(mark: str, units: dict[str, Unit]) -> str | None:
    spelled = " ".join(mark.strip().split())
    for candidate in (spelled, spelled.lower()):
        for unit in units.values():
            if candidate in unit.marks:
                return unit.key
    return None


def _as_float(text: str, whole: str) -> float:
    value = float(text.replace("\u2212", "-").replace("\u2013", "-"))
    if not math.isfinite(value):
        raise InvalidInputError(f"{whole!r}: {text} is beyond the range of a number")
    return value


def _checked_text(text, what: str) -> str:
    """The text stripped, or a refusal: not text, too long, empty, non-finite, a decimal comma."""
    a_what = f"{'an' if what[0] in 'aeiou' else 'a'} {what}"
    if not isinstance(text, str):
        raise InvalidInputError(f"expected {a_what} as text, got {type(text).__name__}")
    if len(text) > MAX_TEXT_CHARS:
        raise InvalidInputError(f"{a_what} of {len(text):,} characters; expected at most {MAX_TEXT_CHARS}")
    whole = text.strip()
    if not whole:
        raise InvalidInputError(f"expected {a_what}, got nothing")
    if re.search(r"(?i)\b(nan|inf|infinity)\b", whole):
        raise InvalidInputError(f"{whole!r}: not a finite {what}")
    if re.search(r"\d,\d", whole):
        raise InvalidInputError(f"{whole!r}: a decimal comma; write the decimal point as '.' (1.5, not 1,5)")
    return whole


def _split_parts(text: str) -> list[tuple[str, str]]:
    """[(number, mark)] for text such as '1°30′15″' or '0.5 mrad'; refuses what is neither."""
    parts, at = [], 0
    while at < len(text):
        found = _PART.match(text, at)
        if found is None or found.end() == at:
            raise InvalidInputError(f"{text!r}: cannot read {text[at:at + 20]!r} as a number with a unit mark "
                                    f"(e.g. 0.5 mrad, 30″, 1°30′, 2 gon)")
        parts.append((found.group(1), (found.group(2) or "").strip()))
        at = found.end()
    return parts


def read_angle(text: str, default_unit: str = "deg") -> ReadAngle:
    """Degrees from text with an optional unit mark: '0.5 mrad', '0.5mrad', '30″', "1'30\"", '1°30′15″',
    '-1°30′' (the sign applies to the whole), '12 arcsec', '2 gon', '1.5' (in `default_unit`)."""
    default = angle_unit(default_unit).key
    whole = _checked_text(text, "angle")
    parts = _split_parts(whole)
    units = []
    for number, mark in parts:
        if not mark:
            units.append(None)
            continue
        key = _unit_of_mark(mark, ANGLE_UNITS)
        if key is None:
            raise InvalidInputError(f"{whole!r}: {mark!r} is not an angle unit; expected one of "
                                    f"° deg, rad, mrad, ′ arcmin, ″ arcsec, gon, mil")
        units.append(key)
    if len(parts) == 1:
        number, _ = parts[0]
        key = units[0] or default
        value = _as_float(number, whole)
        degrees = value / ANGLE_UNITS[key].per_base
        return ReadAngle(float(degrees), key, _said(whole, degrees, key))
    return _read_sexagesimal(whole, parts, units)


def _read_sexagesimal(whole: str, parts, units) -> ReadAngle:
    """Degrees, minutes, seconds written together: each part marked, in that order, each once; only the
    first part signed; minutes and seconds below 60 when a larger part precedes them."""
    if None in units:
        raise InvalidInputError(f"{whole!r}: every part needs its mark when several are written (e.g. 1°30′15″)")
    if any(u not in _SEXAGESIMAL for u in units):
        named = sorted({ANGLE_UNITS[u].name for u in units})
        raise InvalidInputError(f"{whole!r}: mixes {' and '.join(named)}; write one angle in one unit "
                                f"(only degrees, minutes and seconds combine, as 1°30′15″)")
    order = [_SEXAGESIMAL.index(u) for u in units]
    if len(set(order)) != len(order):
        raise InvalidInputError(f"{whole!r}: a unit mark is written twice")
    if order != sorted(order):
        raise InvalidInputError(f"{whole!r}: the parts are out of order; expected degrees, then minutes, then "
                                f"seconds")
    values = [_as_float(number, whole) for number, _ in parts]
    if any(number.lstrip()[0] in MINUS_SIGNS + "+" for number, _ in parts[1:]):
        raise InvalidInputError(f"{whole!r}: only the first part takes a sign (write −1°30′, not 1°−30′)")
    for value, unit, index in zip(values[1:], units[1:], range(1, len(values))):
        if value >= 60:
            raise InvalidInputError(f"{whole!r}: {value:g} {ANGLE_UNITS[unit].name} is 60 or more; carry it "
                                    f"into the {ANGLE_UNITS[units[index - 1]].name}")
    negative = parts[0][0].lstrip()[0] in MINUS_SIGNS
    magnitude = sum(abs(v) / ANGLE_UNITS[u].per_base for v, u in zip(values, units))
    degrees = -magnitude if negative else magnitude
    return ReadAngle(float(degrees), "dms", _said(whole, degrees, "deg"))


def _said(text: str, degrees: float, unit: str) -> str:
    """What was understood, for the person to confirm: '0.5 mrad = 0.028648°', or '1.5°'."""
    shown = format_angle(degrees, "deg", decimals=9)
    return shown if unit == "deg" and not any(m in text for m in "′'″\"") else f"{text} = {shown}"


# --- showing ---------------------------------------------------------------------------------------

def _plain(value: float, decimals: int) -> str:
    text = f"{value:.{decimals}f}"
    if "." in text:
        text = text.rstrip("0").rstrip(".")
    if text in ("-0", ""):
        text = "0"
    return text.replace("-", "\u2212")


def with_symbol(shown: str, key: str) -> str:
    """A number already written in angle unit `key`, with its symbol: a mark (°, ′, ″) is written on the
    number, a symbol of letters after a space ('30″', '0.5 mrad')."""
    symbol = angle_unit(key).symbol
    return f"{shown}{symbol}" if symbol in "°′″" else f"{shown} {symbol}"


def format_angle(degrees: float, key: str, decimals: int | None = None) -> str:
    """An angle in degrees shown in unit `key` with its symbol: '0.5 mrad', '30″', '1.5°', '2 gon'."""
    unit = angle_unit(key)
    if not math.isfinite(degrees):
        raise InvalidInputError(f"not a finite angle: {degrees!r}")
    if unit.key == "dms":
        return format_dms(degrees, unit.decimals if decimals is None else decimals)
    return with_symbol(_plain(float(degrees) * unit.per_base, unit.decimals if decimals is None else decimals),
                       unit.key)


def format_dms(degrees: float, second_decimals: int = 1) -> str:
    """Degrees, minutes and seconds: '−1° 30′ 15.0″'. Rounding carries (59.96″ shows as the next minute)."""
    if not math.isfinite(degrees):
        raise InvalidInputError(f"not a finite angle: {degrees!r}")
    scale = 10 ** second_decimals
    total = round(abs(float(degrees)) * 3600 * scale)      # whole units of the last shown digit
    whole_degrees, rest = divmod(total, 3600 * scale)
    minutes, seconds = divmod(rest, 60 * scale)
    sign = "\u2212" if degrees < 0 and total else ""
    seconds_text = f"{seconds / scale:.{second_decimals}f}"
    return f"{sign}{whole_degrees}° {minutes}′ {seconds_text}″"


def format_slope(tilt_deg: float, key: str) -> str:
    unit = slope_unit(key)
    value = float(tilt_to_slope(tilt_deg, key))
    if not math.isfinite(value):
        raise InvalidInputError(f"a tilt of {tilt_deg!r}° has no finite slope")
    shown = _plain(value, unit.decimals)
    return f"{shown}{unit.symbol}" if unit.symbol in "°%" else f"{shown} {unit.symbol}"


def format_length(millimetres: float, key: str, decimals: int | None = None) -> str:
    unit = length_unit(key)
    if not math.isfinite(millimetres):
        raise InvalidInputError(f"not a finite length: {millimetres!r}")
    return f"{_plain(float(millimetres) * unit.per_base, unit.decimals if decimals is None else decimals)} {unit.symbol}"


def read_length(text: str, default_unit: str = "mm") -> tuple[float, str]:
    """Millimetres from text with an optional length mark: '0.5 mm', '2 in', '3 thou', '0.1 m', '4'."""
    default = length_unit(default_unit).key
    whole = _checked_text(text, "length")
    parts = _split_parts(whole)
    if len(parts) != 1:
        raise InvalidInputError(f"{whole!r}: expected one number with at most one unit (e.g. 0.5 mm, 2 in)")
    number, mark = parts[0]
    key = default if not mark else _unit_of_mark(mark, LENGTH_UNITS)
    if key is None:
        raise InvalidInputError(f"{whole!r}: {mark!r} is not a length unit; expected one of "
                                f"{', '.join(LENGTH_UNITS)}")
    return float(_as_float(number, whole) / LENGTH_UNITS[key].per_base), key
