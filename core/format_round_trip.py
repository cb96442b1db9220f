"""Reading an export back: the decode hints that match a format, the round-trip error, and how far the
printed decimals let a round trip be off."""

from __future__ import annotations

import math

from core.decode import DecodeHints, decode
from core.errors import FramewrightError
from core.format_options import _options, _representation, _unit, _unit_of
from core.representations import ANGLE


def round_trip_hints(fmt: str, options=None) -> DecodeHints:
    """The decode hints that match what `render(…, fmt, options)` wrote, so exactly one reading comes back."""
    o = _options(options)
    if fmt in ("json", "report"):
        return DecodeHints(kind="quaternion", order="wxyz")
    if o.representation == "matrix":
        return DecodeHints(kind="matrix", transposed=o.transposed)
    if o.representation == "quaternion":
        return DecodeHints(kind="quaternion", order="xyzw" if o.scalar_last else "wxyz")
    if o.representation == "angles":
        return DecodeHints(kind="angles", sequence=o.sequence, intrinsic=o.intrinsic, units=_unit(o))
    return DecodeHints(kind=o.representation, units=_unit_of(o) or None)


def round_trip_error(orientation, text: str, fmt: str, options=None) -> float:
    """Decode `text` (as written by render) with matching hints; the angle in degrees between the two.

    Raises DecodeError if the text does not decode, and FramewrightError if it decodes ambiguously."""
    readings = decode(text, round_trip_hints(fmt, options))
    if len(readings) != 1:
        raise FramewrightError(f"the {fmt} text decodes to {len(readings)} readings; expected exactly one")
    return orientation.angle_to(readings[0].orientation)


def printed_precision_deg(fmt: str, options=None) -> float:
    """How far a round trip may be off because of the printed decimals (0 when printed exactly).

    A unit quantity printed to d decimals is off by at most 0.5e-d per number; the orientation then by
    at most a few times that (in radians). Angles printed in degrees are off by 0.5e-d degrees each.
    The report prints its quaternion exactly and the rest to REPORT_DECIMALS decimals unless told
    otherwise; JSON and the report decode by their quaternion, so their bound is the quaternion's."""
    o = _options(options)
    decimals = o.decimals
    if decimals is None:
        return 0.0
    step = 0.5 * 10.0 ** -decimals
    if fmt in ("json", "report"):
        return math.degrees(8 * step)
    if _representation(o).units == ANGLE and o.degrees:
        return 4 * step + math.degrees(4 * step)
    return math.degrees(8 * step)
