"""The angle unit marks written right after a number: degrees and radians (°, deg, rad), and the units of
the trade that are converted to degrees as they are read (mrad, arcminutes ′, arcseconds ″, gon), with
the quotes of a quoted string told apart from minutes and seconds marks."""

from __future__ import annotations

import bisect
import functools
import re

from core.decode.characters import _shorten
from core.errors import DecodeError

_UNIT = re.compile(r"[ ]?(?:(?P<deg>°|deg(?:rees?|s)?(?![A-Za-z]))|(?P<rad>rad(?:ians?|s)?(?![A-Za-z])))")
# Angle units besides degrees and radians, marked on the number: converted to degrees as they are read.
# Seconds before minutes ('' before '); a quote that closes a quoted string ('0.5') is not a mark.
_OTHER_UNIT = re.compile(r"""[ ]?(?:(?P<mrad>mrads?(?![A-Za-z])|milliradians?(?![A-Za-z]))
    |(?P<arcsec>arcsec(?:onds?|s)?(?![A-Za-z])|''|")
    |(?P<arcmin>arcmin(?:utes?|s)?(?![A-Za-z])|')
    |(?P<gon>(?:gons?|grads?|gradians?)(?![A-Za-z]))
    |(?P<mil>mils?(?![A-Za-z])))""", re.VERBOSE)
_SECONDS_AFTER_MINUTES = re.compile(r"[ ]?(?P<s>\d+(?:\.\d*)?)[ ]?(?:''|\")")
_MINUTES = re.compile(r"[ ]?(?P<m>\d+(?:\.\d*)?)[ ]?'(?:[ ]?(?P<s>\d+(?:\.\d*)?)[ ]?(?:\"|''))?")


def _inside_quotes(line: str, position: int, quote: str) -> bool:
    """Whether `position` is inside a string opened by `quote` earlier on the line. A quote right after a
    digit (or after such a mark, as in 30'') is a minutes or seconds mark when no string is open. The line
    is walked once per quote character (cached), so a long line of numbers stays linear."""
    positions, states = _quote_states(line, quote)
    at = bisect.bisect_left(positions, position)       # quotes before `position`
    return states[at - 1] if at else False


@functools.lru_cache(maxsize=8)
def _quote_states(line: str, quote: str) -> tuple[tuple[int, ...], tuple[bool, ...]]:
    """(the index of every `quote` on the line, whether a string is open just after each)."""
    positions, states = [], []
    inside, mark_end = False, -1
    for i, ch in enumerate(line):
        if ch != quote:
            continue
        if inside:
            inside = False
        elif i > 0 and (line[i - 1].isdigit() or i - 1 == mark_end):
            mark_end = i
        else:
            inside = True
        positions.append(i)
        states.append(inside)
    return tuple(positions), tuple(states)


def _other_unit(line: str, m, end: int, value: float, line_no: int, notes) -> tuple:
    """(value, unit, converted_from, end): a number marked in milliradians, arcminutes (′), arcseconds (″)
    or gon, converted to degrees (core/units.py's definitions); unchanged when it carries no such mark.
    1′30″ is one angle. A bare 'mil' is refused: a NATO mil or a thousandth of an inch, it cannot be told."""
    from core.units import ANGLE_UNITS

    mark = _OTHER_UNIT.match(line, end)
    if mark is None:
        return value, None, None, end
    key = mark.lastgroup
    quote = mark.group().strip()
    if quote in ("'", '"', "''") and _inside_quotes(line, m.start(), quote[0]):
        # '0.5', rpy="0 0 1.57": the quote closes a quoted string; it is not minutes or seconds
        return value, None, None, end
    if key == "mil":
        raise DecodeError(f"line {line_no}: '{_shorten(line[m.start():mark.end()].strip())}': 'mil' is either a NATO "
                          "mil (1/6400 of a turn) or a thousandth of an inch; Framewright will not guess: convert it "
                          "to degrees or milliradians")
    degrees = abs(value) / ANGLE_UNITS[key].per_base
    end = mark.end()
    if key == "arcmin":
        seconds = _SECONDS_AFTER_MINUTES.match(line, end)
        if seconds:
            if not float(value).is_integer() or float(seconds.group("s")) >= 60:
                raise DecodeError(f"line {line_no}: '{_shorten(line[m.start():seconds.end()].strip())}': minutes and "
                                  "seconds must be whole minutes and seconds below 60")
            degrees += float(seconds.group("s")) / 3600.0
            key, end = "dms", seconds.end()
    negative = value < 0 or (value == 0 and m.group("sign") == "-")
    degrees = -degrees if negative else degrees
    written = line[m.start():end].strip()
    notes.add(f"line {line_no}: '{_shorten(written)}' ({ANGLE_UNITS[key].name if key != 'dms' else 'minutes and seconds'})"
              f" read as {degrees:.10g}°")
    return degrees, "deg", key, end
