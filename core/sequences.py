"""The twelve angle sequences: names, spellings people type, presets, gimbal margin and the
best-conditioned sequence for an orientation. The conversions themselves are in kernels.py."""

import functools
import re
from dataclasses import dataclass

import numpy as np

from core import kernels
from core.errors import SequenceError
from core.kernels import ALL_SEQUENCES, PROPER_EULER, TAIT_BRYAN

__all__ = [
    "ALL_SEQUENCES",
    "PRESETS",
    "PROPER_EULER",
    "TAIT_BRYAN",
    "GimbalMargin",
    "best_conditioned_sequence",
    "gimbal_margin",
    "is_proper_euler",
    "other_convention",
    "parse_sequence",
    "preset_names",
    "spelled_sequence",
]

# Named presets the trade uses: the same matrix spelled two ways (CONVENTIONS.md).
PRESETS = {
    "yaw-pitch-roll": ("ZYX", True, ("yaw", "pitch", "roll")),
    "roll-pitch-yaw (fixed axes)": ("XYZ", False, ("roll", "pitch", "yaw")),
}


@functools.lru_cache(maxsize=256)
def _parse_sequence_text(text):
    return _parse(text)


def preset_names(sequence, intrinsic):
    """('yaw', 'pitch', 'roll') and the like when (sequence, intrinsic) is one of the trade's presets,
    else None."""
    for seq, intr, names in PRESETS.values():
        if seq == sequence and intr == intrinsic:
            return names
    return None


def spelled_sequence(sequence, intrinsic, ascii=False):
    """'Z-Y′-X″' for intrinsic (primes mark the moving axes), 'Z-Y-X' for extrinsic. ascii=True writes
    the primes as ' and '' (for text that must read back anywhere)."""
    intrinsic, ascii = kernels.check_flag(intrinsic, "intrinsic"), kernels.check_flag(ascii, "ascii")
    primes = ("", "'", "''") if ascii else ("", "\u2032", "\u2033")
    return "-".join(f"{a}{primes[i] if intrinsic else ''}" for i, a in enumerate(sequence))


def parse_sequence(text):
    """'ZYX' from the ways people write it: 'zyx', 'Z-Y-X', "Z-Y'-X''", 'Z Y X', 'z,y,x'.

    Case never means intrinsic or extrinsic here: that is always a separate, explicit choice."""
    if not isinstance(text, str):
        raise SequenceError(f"angle sequence must be text such as 'ZYX', got {text!r}")
    return _parse_sequence_text(text)


def _parse(text):
    letters = re.sub(r"[\s\-–,'′″\"_·.]", "", text).upper()
    if not re.fullmatch(r"[XYZ]{3}", letters):
        raise SequenceError(
            f"cannot read {text!r} as an angle sequence; expected three axes from X, Y, Z such as "
            f"'ZYX' or 'Z-Y′-X″'"
        )
    if letters[0] == letters[1] or letters[1] == letters[2]:
        raise SequenceError(
            f"angle sequence {text!r} repeats an axis twice in a row; expected one of "
            f"{', '.join(ALL_SEQUENCES)}"
        )
    return letters


def is_proper_euler(sequence):
    return parse_sequence(sequence) in PROPER_EULER


def other_convention(sequence, angles, intrinsic):
    """The same orientation spelled the other way: intrinsic a1 a2 a3 (t1, t2, t3) equals extrinsic
    a3 a2 a1 (t3, t2, t1), and the reverse."""
    sequence = parse_sequence(sequence)
    return sequence[::-1], tuple(np.asarray(angles, dtype=float)[::-1]), not intrinsic


@dataclass(frozen=True)
class GimbalMargin:
    """How far a sequence is from gimbal lock for one orientation.

    margin_deg: distance of the middle angle from its singular value. amplification: about how many
    times a small change of orientation is magnified in the first and third angles, 1 / sin(margin)
    (infinite in lock)."""

    sequence: str
    intrinsic: bool
    margin_deg: float
    amplification: float
    locked: bool


def _margin_of(q, sequence, intrinsic):
    margin = float(kernels.gimbal_margins(q, sequence, intrinsic))
    locked = margin < kernels.LOCK_MARGIN_RAD
    amplification = float("inf") if locked else 1.0 / np.sin(margin)
    return GimbalMargin(sequence, intrinsic, float(np.degrees(margin)), amplification, locked)


def gimbal_margin(orientation, sequence, intrinsic=True):
    return _margin_of(orientation.quaternion, parse_sequence(sequence), intrinsic)


def best_conditioned_sequence(orientation, candidates=ALL_SEQUENCES, intrinsic=True):
    """The candidate sequence whose middle angle is farthest from lock for this orientation."""
    names = [parse_sequence(c) for c in candidates]
    if not names:
        raise SequenceError("no candidate sequences given; expected at least one, such as 'ZYX'")
    margins = kernels.gimbal_margins_of_sequences(orientation.quaternion, names, intrinsic)
    return _margin_of(orientation.quaternion, names[int(np.argmax(margins))], intrinsic)
