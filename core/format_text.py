"""Numbers and words every export format writes the same way: numbers through core/number_text.py,
sequences spelled in plain ASCII and their angle names."""

from __future__ import annotations

from core import sequences
# Numbers are written by core/number_text.py, the one writer (copies, pose formats, the record, app/text.py).
from core.number_text import NOISE_RELATIVE, format_number, shortest_decimal  # noqa: F401  (part of this API)


def spelled_sequence(sequence: str, intrinsic: bool) -> str:
    """Z-Y'-X'' for intrinsic (the moving axes), Z-Y-X for extrinsic: plain ASCII, so every copy reads
    back in any program."""
    return sequences.spelled_sequence(sequence, intrinsic, ascii=True)


def angle_names(sequence: str, intrinsic: bool) -> str:
    names = sequences.preset_names(sequence, intrinsic)
    return f" ({', '.join(names)})" if names else ""
