"""The numbers in a pasted block of text, read by the decoder (the one place that knows how people write
numbers: Unicode minus, non-breaking spaces, brackets, separators)."""

from __future__ import annotations

from core.errors import FramewrightError


def numbers_in_text(text: str) -> list[float] | None:
    """All numbers in `text` in reading order, or None when the decoder cannot read it."""
    from core.decode import parse_numbers  # late: only needed on paste

    try:
        return [float(v) for v in parse_numbers(text).values]
    except FramewrightError:
        return None
