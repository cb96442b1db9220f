"""What a check knows about the mount's hardware for the step after the verdict: its adjustment axes, its
footprint (feet or bolt points) with the pivot foot and the screw pitch, and the measurement's standard
uncertainty with the coverage factor for the ISO 14253-1 decision. Plain data, saved with the check."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Any

import numpy as np

from core.errors import FramewrightError
from core.units import LENGTH_UNITS

FRAMES = ("body", "reference")
_KEYS = ("axes", "axes_frame", "footprint", "pivot", "pitch_mm", "uncertainty_deg", "coverage", "length_unit",
         "covariance_deg2")


@dataclass(frozen=True)
class AdjustmentSetup:
    """axes: the adjustment axes as typed ('+Z; 0.2 1 0'; '' for none); footprint: feet in body mm (empty:
    none); pivot: 0-based foot that stays put; pitch_mm: levelling-screw pitch or None; uncertainty_deg:
    standard uncertainty of the measured orientation or None; coverage: k of U = k u; length_unit: the unit
    the feet, the pitch and the shims are shown and typed in (they are kept in mm whatever it is);
    covariance_deg2: when the uncertainty came from repeated measurements or a fit, the 3×3 covariance of
    the measured orientation (a small turn in the reference frame, degrees²) that each judged figure's
    uncertainty is propagated from (core/uncertainty.py), else None (u is the same about every axis)."""
    axes: str = ""
    axes_frame: str = "body"
    footprint: tuple = ()
    pivot: int = 0
    pitch_mm: float | None = None
    uncertainty_deg: float | None = None
    coverage: float = 2.0
    length_unit: str = "mm"
    covariance_deg2: tuple | None = None

    def __post_init__(self):
        if self.length_unit not in LENGTH_UNITS:
            raise FramewrightError(f"adjustment length unit: expected one of {', '.join(LENGTH_UNITS)}, "
                                   f"got {self.length_unit!r}")
        if not isinstance(self.axes, str) or len(self.axes) > 1000:
            raise FramewrightError("adjustment axes: expected text of at most 1000 characters")
        if self.axes_frame not in FRAMES:
            raise FramewrightError(f"adjustment axes frame: expected body or reference, got {self.axes_frame!r}")
        try:
            feet = np.array(self.footprint, dtype=float).reshape(-1, 3) if len(self.footprint) else np.zeros((0, 3))
        except (TypeError, ValueError):
            raise FramewrightError("footprint: expected feet of three numbers each") from None
        if len(feet) > 64 or not np.all(np.isfinite(feet)) or (len(feet) and np.abs(feet).max() > 1e9):
            raise FramewrightError("footprint: expected at most 64 feet of finite numbers below 1e9 mm")
        object.__setattr__(self, "footprint", tuple(tuple(float(v) for v in f) for f in feet))
        if isinstance(self.pivot, bool) or not isinstance(self.pivot, int) or self.pivot < 0 \
                or (feet.size and self.pivot >= len(feet)):
            raise FramewrightError(f"pivot: expected a foot number of the footprint, got {self.pivot!r}")
        for name, low, high, optional in (("pitch_mm", 0, 100, True), ("uncertainty_deg", 0, 180, True),
                                          ("coverage", 0, 10, False)):
            value = getattr(self, name)
            if value is None and optional:
                continue
            if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value) \
                    or not low <= value <= high or (name != "uncertainty_deg" and value == 0):
                raise FramewrightError(f"{name.replace('_', ' ')}: expected a number above {low:g} and up to "
                                       f"{high:g}, got {value!r}")
            object.__setattr__(self, name, float(value))
        if self.covariance_deg2 is not None:
            object.__setattr__(self, "covariance_deg2", _covariance(self.covariance_deg2, self.uncertainty_deg))

    def to_dict(self) -> dict[str, Any]:
        data = {"axes": self.axes, "axes_frame": self.axes_frame, "footprint": [list(f) for f in self.footprint],
                "pivot": self.pivot, "pitch_mm": self.pitch_mm, "uncertainty_deg": self.uncertainty_deg,
                "coverage": self.coverage,
                # only when not mm, so a file saved before lengths had a choice is written the same way
                **({"length_unit": self.length_unit} if self.length_unit != "mm" else {})}
        if self.covariance_deg2 is not None:        # only when there is one: older files read back the same
            data["covariance_deg2"] = [list(row) for row in self.covariance_deg2]
        return data

    @classmethod
    def from_dict(cls, data: Any) -> "AdjustmentSetup":
        if not isinstance(data, dict):
            raise FramewrightError(f"adjustment: expected a JSON object, got {type(data).__name__}")
        unknown = sorted(set(data) - set(_KEYS))
        if unknown:
            raise FramewrightError(f"adjustment: unknown key(s) {', '.join(unknown)}; expected {', '.join(_KEYS)}")
        return cls(**{k: (tuple(data[k]) if k == "footprint" and isinstance(data[k], list) else data[k])
                      for k in _KEYS if k in data})


def _covariance(value, uncertainty_deg) -> tuple:
    """A 3×3 covariance in degrees²: finite, symmetric, no negative variance beyond rounding, at most 180²,
    and only beside a standard uncertainty (the headline it was summed up in)."""
    if uncertainty_deg is None:
        raise FramewrightError("orientation covariance: expected it only with a standard uncertainty")
    try:
        c = np.array(value, dtype=float)
    except (TypeError, ValueError):
        raise FramewrightError("orientation covariance: expected 3 rows of 3 numbers (degrees²)") from None
    if c.shape != (3, 3) or not np.all(np.isfinite(c)) or np.abs(c).max() > 180.0 ** 2:
        raise FramewrightError("orientation covariance: expected 3 rows of 3 finite numbers up to 180² (degrees²)")
    scale = max(float(np.abs(c).max()), 1e-300)
    if np.abs(c - c.T).max() > 1e-9 * scale:
        raise FramewrightError("orientation covariance: expected a symmetric matrix")
    c = (c + c.T) / 2
    if float(np.linalg.eigvalsh(c)[0]) < -1e-9 * scale:
        raise FramewrightError("orientation covariance: a variance below zero; expected a covariance")
    return tuple(tuple(float(v) for v in row) for row in c)
