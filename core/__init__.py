"""Framewright core: numpy-only orientation arithmetic. Never imports Qt."""

from core.errors import (
    DecodeError,
    FlagTypeError,
    FramewrightError,
    InvalidInputError,
    MatrixRefusedError,
    SequenceError,
)
from core.orientation import AngleSet, Orientation

__all__ = [
    "AngleSet",
    "DecodeError",
    "FlagTypeError",
    "FramewrightError",
    "InvalidInputError",
    "MatrixRefusedError",
    "Orientation",
    "SequenceError",
]
