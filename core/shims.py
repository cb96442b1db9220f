"""Shims under a mount's footprint: how thick a shim goes under each foot so that the part tilts from where
it was measured to where it should be.

The footprint is the mount's feet (or bolt points) in body coordinates, lying in its mounting face, whose
outward normal n (a body axis) points into the plate. With the body correction C = Mᵀ N (core.correction),
foot i at q_i from the pivot foot must end at height s_i = −n · (C q_i) above the plate. Shims only tilt:
the turn about n (the twist of C about n) is made by slotted holes, and is reported apart. Writing
C = W · S with W the twist about n and S the swing (axis ⊥ n), n · (C q) = (Wᵀ n) · (S q) = n · (S q): the
shims for C and for its swing alone are the same, so the twist does not disturb them.

All shims are made non-negative by adding the same thickness to every foot (a lift along n, which does not
turn the part): the thinnest set has one foot without a shim.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core.errors import InvalidInputError
from core.kernels.checks import shortened_repr
from core.orientation import Orientation

MAX_FEET = 64
# A foot further out of the plane of the others than this fraction of the footprint's size is not on
# the same face: refused by name.
PLANE_TOLERANCE = 1e-6


@dataclass(frozen=True)
class ShimResult:
    """shims_mm[i]: thickness under foot i (0 for at least one foot); turns[i]: the same as turns of a
    levelling screw of the given pitch (None without a pitch); tilt_deg: the tilt the shims make;
    twist_deg: the turn about the face normal left for slotted holes (signed, right hand about n);
    swing, twist: the two parts of the correction (C = twist @ swing)."""
    shims_mm: np.ndarray
    turns: np.ndarray | None
    tilt_deg: float
    twist_deg: float
    pivot: int
    pivot_lifted_mm: float
    swing: Orientation
    twist: Orientation


def _footprint(points) -> np.ndarray:
    try:
        p = np.array(points, dtype=float)
    except (TypeError, ValueError):
        raise InvalidInputError("footprint: expected rows of three numbers (x, y, z in body coordinates)") from None
    if p.ndim != 2 or p.shape[1] != 3:
        raise InvalidInputError(f"footprint: expected rows of three numbers, got shape {p.shape}")
    if not 3 <= len(p) <= MAX_FEET:
        raise InvalidInputError(f"footprint: expected 3 to {MAX_FEET} feet, got {len(p)}")
    bad = np.argwhere(~np.isfinite(p) | (np.abs(p) > 1e9))
    if len(bad):
        row, column = bad[0]
        value = float(p[row, column])        # as written (inf, 1e+10), not numpy's spelling of its type
        raise InvalidInputError(f"footprint: foot {row + 1}, {'xyz'[column]} = {value!r} is not a finite length "
                                "below 1e9")
    return p


def _unit(vector, what) -> np.ndarray:
    try:
        v = np.array(vector, dtype=float).reshape(-1)
    except (TypeError, ValueError, OverflowError):   # text, complex, or an integer beyond a double: refused
        v = np.full(1, np.nan)                          # by name like any other slip
    if v.shape != (3,) or not np.all(np.isfinite(v)) or np.abs(v).max() == 0:
        raise InvalidInputError(f"{what}: expected a direction of three finite numbers, "
                                f"got {shortened_repr(vector)}")
    v = v / np.abs(v).max()
    return v / np.linalg.norm(v)


def read_footprint(text: str) -> np.ndarray:
    """Feet as text: one foot a line, x y z in body coordinates (commas, spaces or tabs between), a first
    line of column names and lines starting with '#' allowed."""
    from core.number_text import parse_number
    if not isinstance(text, str) or len(text) > 100_000:
        raise InvalidInputError("footprint: expected text of at most 100,000 characters")
    rows = []
    for line_no, line in enumerate(text.replace("\r\n", "\n").replace("\r", "\n").split("\n"), start=1):
        cells = line.replace(",", " ").replace(";", " ").split()
        if not cells or cells[0].startswith("#"):
            continue
        if not rows and not any(c[0].isdigit() or c[0] in "+-.−" for c in cells):
            continue                                             # the column names
        if len(cells) != 3:
            raise InvalidInputError(f"footprint line {line_no}: expected three numbers (x y z), got {len(cells)}")
        try:
            rows.append([parse_number(c) for c in cells])
        except ValueError as error:
            raise InvalidInputError(f"footprint line {line_no}: {error}") from None
        if len(rows) > MAX_FEET:
            raise InvalidInputError(f"footprint: more than {MAX_FEET} feet")
    return _footprint(rows) if rows else _footprint(np.zeros((0, 3)))


def outward_normal(footprint) -> np.ndarray:
    """The normal of the feet's plane that points away from the body origin (the part's centre), which is
    the mounting face's outward normal for a part whose origin is inside it."""
    p = _footprint(footprint)
    centre = p.mean(axis=0)
    normal = np.linalg.svd(p - centre)[2][-1]
    offset = float(centre @ normal)
    if abs(offset) < 1e-9 * max(1.0, float(np.abs(p).max())):
        raise InvalidInputError("footprint: the feet's plane passes through the body origin, so its outward side is "
                                "not known; give the face normal")
    return normal if offset > 0 else -normal


def swing_and_twist(rotation: Orientation, axis) -> tuple[Orientation, Orientation]:
    """(swing, twist) with rotation = twist @ swing, twist about `axis`, swing about an axis ⊥ `axis`."""
    n = _unit(axis, "face normal")
    w, v = rotation.quaternion[0], rotation.quaternion[1:]
    along = float(v @ n)
    size = math.hypot(w, along)
    if size < 1e-15:      # a half turn about a line in the face: the twist is undefined; take none
        twist_q = np.array([1.0, 0, 0, 0])
    else:
        twist_q = np.concatenate([[w], along * n]) / size
    twist = Orientation.from_quaternion(twist_q)
    return twist.inverse() @ rotation, twist


def shims(correction_body: Orientation, footprint, face_normal, pivot: int = 0,
          pitch_mm: float | None = None) -> ShimResult:
    """Shim thicknesses under each foot of `footprint` (body coordinates, mm) for the body correction."""
    p = _footprint(footprint)
    n = _unit(face_normal, "face normal")
    if not isinstance(pivot, (int, np.integer)) or isinstance(pivot, bool) or not 0 <= pivot < len(p):
        raise InvalidInputError(f"pivot: expected a foot number from 1 to {len(p)}, got {pivot!r}")
    if pitch_mm is not None:
        if isinstance(pitch_mm, bool) or not (isinstance(pitch_mm, (int, float)) and math.isfinite(pitch_mm)
                                              and 0 < pitch_mm <= 100):
            raise InvalidInputError(f"thread pitch: expected a length in mm above 0 and up to 100, got {pitch_mm!r}")
    q = p - p[pivot]
    size = float(np.abs(q).max())
    if size == 0:
        raise InvalidInputError("footprint: all feet are at the same point; expected feet spread over the face")
    heights = q @ n
    off = int(np.argmax(np.abs(heights)))
    if abs(heights[off]) > PLANE_TOLERANCE * size:
        raise InvalidInputError(f"footprint: foot {off + 1} is {abs(heights[off]):.6g} mm out of the face's plane (normal "
                                f"{np.round(n, 6).tolist()}); expected feet on one face")
    in_plane = q - np.outer(heights, n)
    if np.linalg.matrix_rank(in_plane / size, tol=1e-9) < 2:
        raise InvalidInputError("footprint: the feet are on one line; a tilt across that line cannot be shimmed")
    swing, twist = swing_and_twist(correction_body, n)
    raw = -(swing.apply(in_plane) @ n)
    lift = -float(raw.min())
    thickness = raw + lift
    thickness[np.abs(thickness) < 1e-12 * size] = 0.0
    twist_axis, twist_angle = twist.as_axis_angle()
    signed_twist = float(twist_angle) * (1.0 if twist_angle == 0 or twist_axis @ n >= 0 else -1.0)
    return ShimResult(shims_mm=thickness, turns=None if pitch_mm is None else thickness / pitch_mm,
                      tilt_deg=float(swing.angle), twist_deg=signed_twist, pivot=pivot,
                      pivot_lifted_mm=float(thickness[pivot]), swing=swing, twist=twist)
