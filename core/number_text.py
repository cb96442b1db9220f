"""One number as a person types or pastes it into a cell or a field: '.' as the decimal point whatever
the locale, the Unicode minus and its look-alikes, non-breaking and thin spaces. No Qt: the editors, the
Measure tables and the command line all read cells through this one function.

And one number as the core writes it (the copies, the pose formats, the inspection record): the shortest
decimal that reads back as the double, or fixed decimals; never '-0'. app/text.py builds the window's and
the command line's spellings on it."""

from __future__ import annotations

import math

# Characters people paste in place of a plain minus sign or space.
_MINUS_SIGNS = {"\u2212": "-", "\u2013": "-", "\u2012": "-", "\ufe63": "-", "\uff0d": "-"}
_SPACES = ("\u00a0", "\u202f", "\u2009", " ", "\t")


QUOTE_LIMIT = 40  # characters of a person's text quoted back in a message; the rest is cut


def quoted(text: str) -> str:
    """The text as a message quotes it: stripped, and cut short so a pasted screenful never fills a panel."""
    text = text.strip()
    if len(text) > QUOTE_LIMIT:
        text = text[: QUOTE_LIMIT - 1] + "…"
    return f"“{text}”"


def parse_number(text: str) -> float:
    """Read one number typed or pasted by a person. Raises ValueError with a message for that person."""
    cleaned = text
    for odd, plain in _MINUS_SIGNS.items():
        cleaned = cleaned.replace(odd, plain)
    for space in _SPACES:   # spaces of any kind around the number are fine ...
        cleaned = cleaned.strip(space)
    cleaned = cleaned.strip()
    if cleaned == "":
        raise ValueError("empty: type a number")
    if "," in cleaned:
        raise ValueError(f"{quoted(text)}: use '.' as the decimal point, not ','")
    if any(space in cleaned for space in _SPACES):
        # ... but inside it they would join two numbers into one ("1 2" is not 12)
        raise ValueError(f"{quoted(text)} has a space inside: one number per field")
    if not cleaned.isascii() or "_" in cleaned:
        raise ValueError(f"{quoted(text)} is not a plain number (digits 0-9, '.', 'e', a sign)")
    try:
        value = float(cleaned)
    except ValueError:
        raise ValueError(f"{quoted(text)} is not a number") from None
    if not math.isfinite(value):
        raise ValueError(f"{quoted(text)} is not a finite number")
    return value


# The last few bits of arithmetic noise (a conversion to the quaternion and back leaves about 1e-15
# relative): rounding off no more than this keeps every exact format's round trip within 1e-12 degrees,
# which a relative 1e-12 would not (a quaternion component off by 1e-12 turns the orientation ~1e-10°).
NOISE_RELATIVE = 2e-15


def shortest_decimal(value: float, relative: float = NOISE_RELATIVE) -> str:
    """The shortest decimal (as Python writes a float) within `relative` of value; '0.0' for zero."""
    value = float(value) + 0.0            # + 0.0 turns -0.0 into 0.0
    if value == 0.0 or not math.isfinite(value):
        return repr(value)
    for digits in range(1, 17):
        rounded = float(f"{value:.{digits}g}")
        if abs(rounded - value) <= relative * abs(value):
            return repr(rounded)
    return repr(value)


def format_number(value: float, decimals: int | None = None) -> str:
    """'0.7071067811865476' (the shortest decimal, arithmetic noise off) or fixed decimals; never '-0'."""
    value = float(value)
    if decimals is None:
        text = shortest_decimal(value)
    else:
        text = f"{value:.{decimals}f}"
        if float(text) == 0:
            text = text.lstrip("-")
    return text
