"""The six signed axes (+X, −X, +Y, −Y, +Z, −Z) in one place: their names in one order, their unit
vectors, the one reader of the ways people type them, and the one way they are shown.

numpy only (never Qt). The ASCII spelling ('-Z') is the stored form: keys in session files, data behind
choice boxes, what functions take and return. The display spelling ('−Z', Unicode minus) is what the
window and the printed report show, so a minus sign never looks like a hyphen.
"""

from __future__ import annotations

import reprlib
from types import MappingProxyType

import numpy as np

from core.errors import InvalidInputError

MINUS = "\u2212"  # the typographic minus sign, as in every printed direction ("−Z")

LETTERS = ("X", "Y", "Z")
SIGNED_AXES = ("+X", "-X", "+Y", "-Y", "+Z", "-Z")  # this order everywhere: faces, choices, tables
POSITIVE_AXES = SIGNED_AXES[0::2]  # +X, +Y, +Z: the body axes themselves
NEGATIVE_AXES = SIGNED_AXES[1::2]

# Row i is the unit vector of SIGNED_AXES[i]: the identity's columns, each with its sign (+ 0.0 turns the
# -0.0 the product leaves into 0.0, so no printed component reads "-0"). Read-only, so no caller can
# change an axis for everyone.
UNIT_VECTORS = np.repeat(np.eye(3), 2, axis=0) * np.tile([[1.0], [-1.0]], (3, 1)) + 0.0
UNIT_VECTORS.setflags(write=False)
VECTORS = MappingProxyType(dict(zip(SIGNED_AXES, UNIT_VECTORS)))  # '+X' -> its (read-only) unit vector

_LONGEST_ECHO = 40  # characters of a refused text repeated in the message


def axis_name(spec) -> str | None:
    """'+X' for 'x', '+x', 'X', ' +X ', '−x' (Unicode minus); None when `spec` is not a signed axis."""
    if not isinstance(spec, str):
        return None
    text = spec.strip()
    if len(text) > 2:  # before any copy: a long text is never an axis
        return None
    text = text.upper().replace(MINUS, "-")
    if len(text) == 1:
        text = "+" + text
    return text if text in SIGNED_AXES else None


def parse_axis(spec, what: str = "axis", or_else: str = "") -> str:
    """The ASCII name ('-Z') of a typed signed axis, or InvalidInputError saying what was expected
    (`or_else` names what else the caller takes, e.g. 'three numbers')."""
    name = axis_name(spec)
    if name is None:
        shown = repr(spec[:_LONGEST_ECHO]) + "…" if isinstance(spec, str) and len(spec) > _LONGEST_ECHO \
            else reprlib.repr(spec)
        alternative = f" or {or_else}" if or_else else ""
        raise InvalidInputError(
            f"{what}: cannot read {shown}; expected one of {', '.join(SIGNED_AXES)}{alternative}")
    return name


def unit_vector(spec, what: str = "axis", or_else: str = "") -> np.ndarray:
    """The unit 3-vector of a signed axis ('+Z', '-x', 'Y'), a fresh array the caller may change."""
    return VECTORS[parse_axis(spec, what, or_else)].copy()


def signed_axis(index: int, sign) -> str:
    """'+X' for (0, +1), '-Z' for (2, -1): the axis of a matrix column or a direction's largest part."""
    return ("+" if sign > 0 else "-") + LETTERS[index]


def name_of_vector(vector, atol: float = 0.0, rtol: float = 0.0) -> str | None:
    """'-Z' for (0, 0, -1): the signed axis a vector is (exactly, unless tolerances are given, as for
    numpy.allclose); None for any other direction."""
    v = np.asarray(vector, dtype=float)
    if v.shape != (3,):
        return None
    for name, axis in VECTORS.items():
        if np.allclose(v, axis, atol=atol, rtol=rtol):
            return name
    return None


def display(name: str) -> str:
    """'−Z' for '-Z': the spelling the window and the report show (Unicode minus)."""
    return name.replace("-", MINUS)
