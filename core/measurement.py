"""One of a mount's repeated measurements: the orientation measured, its weight in the average and a
short note of where it came from ("typed", "decoded", "fit"). core/average.py averages them; a mount
keeps them in the session file (core/session.py)."""

from __future__ import annotations

import math
from dataclasses import dataclass

from core.errors import FramewrightError
from core.name_rules import name_problem
from core.orientation import Orientation

MAX_MEASUREMENTS_PER_MOUNT = 1_000
# A weight only says how much one measurement counts against the others; beyond this it is a typing error
# (and the average's arithmetic stays far from overflow).
MAX_WEIGHT = 1e12
MAX_SOURCE_CHARS = 40
SOURCES = ("typed", "decoded", "fit", "measured")      # what the window offers; a file may say other words


@dataclass(frozen=True)
class Measurement:
    orientation: Orientation
    weight: float = 1.0
    source: str = ""

    def __post_init__(self):
        if not isinstance(self.orientation, Orientation):
            raise FramewrightError("measurement: expected an Orientation")
        if isinstance(self.weight, bool) or not isinstance(self.weight, (int, float)):
            raise FramewrightError(f"measurement weight: expected a number, got {self.weight!r}")
        weight = float(self.weight)
        if not (math.isfinite(weight) and 0 <= weight <= MAX_WEIGHT):
            raise FramewrightError(f"measurement weight {weight!r}: expected a finite number from 0 to "
                                   f"{MAX_WEIGHT:g}")
        object.__setattr__(self, "weight", weight)
        problem = name_problem(self.source, empty_ok=True)
        if problem is None and len(self.source) > MAX_SOURCE_CHARS:
            problem = f"{len(self.source)} characters; expected at most {MAX_SOURCE_CHARS}"
        if problem:
            raise FramewrightError(f"measurement source: {problem}")


def measurements_problem(values) -> str | None:
    """Why `values` cannot be a mount's measurements (None when they can)."""
    if not isinstance(values, tuple) or not all(isinstance(v, Measurement) for v in values):
        return "expected a tuple of Measurement"
    if len(values) > MAX_MEASUREMENTS_PER_MOUNT:
        return f"{len(values):,} measurements; a mount keeps at most {MAX_MEASUREMENTS_PER_MOUNT:,}"
    return None
