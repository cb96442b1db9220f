"""One number as a person types or pastes it into a cell or a field: '.' as the decimal point whatever
the locale, the Unicode minus and its look-alikes, non-breaking and thin spaces. No Qt: the editors, the
Measure tables and the command line all read cells through this one function."""

from __future__ import annotations

import math

# Characters people paste in place of a plain minus sign or space.
_MINUS_SIGNS = {"\u2212": "-", "\u2013": "-", "\u2012": "-", "\ufe63": "-", "\uff0d": "-"}
_SPACES = ("\u00a0", "\u202f", "\u2009", " ", "\t")


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
        raise ValueError(f"“{text.strip()}”: use '.' as the decimal point, not ','")
    if any(space in cleaned for space in _SPACES):
        # ... but inside it they would join two numbers into one ("1 2" is not 12)
        raise ValueError(f"“{text.strip()}” has a space inside: one number per field")
    if not cleaned.isascii() or "_" in cleaned:
        raise ValueError(f"“{text.strip()}” is not a plain number (digits 0-9, '.', 'e', a sign)")
    try:
        value = float(cleaned)
    except ValueError:
        raise ValueError(f"“{text.strip()}” is not a number") from None
    if not math.isfinite(value):
        raise ValueError(f"“{text.strip()}” is not a finite number")
    return value
