"""Angle units on the command line: `--units deg|dms|rad|mrad|arcmin|arcsec|gon|mil` chooses how angles are
printed, and angle options (`--tolerance 0.5mrad`, `--uncertainty 3″`) take a number with its unit mark
(degrees when it has none). The JSON always carries degrees, and beside them the unit chosen."""

from __future__ import annotations

import argparse

from core import units
from core.errors import FramewrightError

UNIT_HELP = ("print angles in this unit: " + ", ".join(f"{u.key} ({u.name})" for u in units.ANGLE_UNITS.values())
             + "; degrees by default")


def angle_argument(text: str) -> units.ReadAngle:
    """argparse type: '0.5mrad', '30″', '1°30′', '2 gon' or a bare number of degrees."""
    try:
        return units.read_angle(text.strip(), "deg")
    except FramewrightError as error:
        raise argparse.ArgumentTypeError(str(error)) from None


def add_units_option(parser: argparse.ArgumentParser) -> None:
    # dest differs from --radians/--degrees (dest "units"), which say how the input text is to be read
    parser.add_argument("--units", dest="show_units", choices=tuple(units.ANGLE_UNITS), default="deg",
                        metavar="UNIT", help=UNIT_HELP)


def degrees_of(value: units.ReadAngle | None) -> float | None:
    return None if value is None else value.degrees


def shown(degrees: float, unit: str, plain) -> str:
    """An angle for the printed lines, its number spelled by `plain` (the command line's ten significant
    digits): degrees as always ('0.5 deg'), any other unit with its symbol ('8.726646259 mrad', '30″'), and
    degrees-minutes-seconds to a tenth of a second."""
    if unit == "deg":
        return f"{plain(degrees)} deg"
    if unit == "dms":
        return units.format_dms(degrees)
    symbol = units.ANGLE_UNITS[unit].symbol
    number = plain(float(units.degrees_to(degrees, unit)))
    return f"{number}{symbol}" if symbol in "′″" else f"{number} {symbol}"


def in_unit(degrees: float | None, unit: str) -> float | None:
    """Degrees in the chosen unit, for the JSON beside the degrees (None stays None)."""
    return None if degrees is None else float(units.degrees_to(degrees, unit))


def as_given(value: units.ReadAngle | None) -> dict | None:
    """What the person typed, read: {'degrees': ..., 'unit': 'mrad', 'read_as': '0.5mrad = 0.02864789°'}."""
    if value is None:
        return None
    return {"degrees": value.degrees, "unit": value.unit, "read_as": value.said}
