"""Numbers and words every export format writes the same way: the shortest decimal, fixed decimals,
sequences spelled in plain ASCII and their angle names."""

from __future__ import annotations

import math

from core import sequences


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


def spelled_sequence(sequence: str, intrinsic: bool) -> str:
    """Z-Y'-X'' for intrinsic (the moving axes), Z-Y-X for extrinsic: plain ASCII, so every copy reads
    back in any program."""
    return sequences.spelled_sequence(sequence, intrinsic, ascii=True)


def angle_names(sequence: str, intrinsic: bool) -> str:
    names = sequences.preset_names(sequence, intrinsic)
    return f" ({', '.join(names)})" if names else ""
