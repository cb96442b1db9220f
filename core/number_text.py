"""One number as a person types or pastes it into a cell or a field: '.' as the decimal point whatever
the locale, the Unicode minus and its look-alikes, non-breaking and thin spaces. No Qt: the editors, the
Measure tables and the command line all read cells through this one function."""

from __future__ import annotations

import math

# Characters people paste in place of a plain minus sign or space.
_MINUS_SIGNS = {"\u2212": "-", "\u2013": "-", "\u2012": "-", "\ufe63": "-", "\uff0d": "-"}
_SPACES = {"\u00a0": "", "\u202f": "", "\u2009": "", " ": ""}


def parse_number(text: str) -> float:
    """Read one number typed or pasted by a person. Raises ValueError with a message for that person."""
    cleaned = text.strip()
    for odd, plain in {**_MINUS_SIGNS, **_SPACES}.items():
        cleaned = cleaned.replace(odd, plain)
    if cleaned == "":
        raise ValueError("empty: type a number")
    if "," in cleaned:
        raise ValueError(f"“{text.strip()}”: use '.' as the decimal point, not ','")
    try:
        value = float(cleaned)
    except ValueError:
        raise ValueError(f"“{text.strip()}” is not a number") from None
    if not math.isfinite(value):
        raise ValueError(f"“{text.strip()}” is not a finite number")
    return value
