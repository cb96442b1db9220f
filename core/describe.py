"""Words for an orientation: where each body axis points, and the nearest right-angle orientation.

numpy only (never Qt). A frame preset only *names* the reference directions ("+Z is up"); it never changes R.
Every function accepts an Orientation (anything with ``as_matrix()``) or a 3x3 body -> reference matrix,
whose columns are the body axes in reference coordinates (CONVENTIONS.md).
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass

import numpy as np

from core import axes
from core.axes import MINUS  # many callers still name it describe.MINUS

ARROW = "\u2192"


@dataclass(frozen=True)
class FramePreset:
    """Names for the six reference directions. ``words[(axis_index, sign)]`` e.g. ``words[(2, -1)] = 'down'``."""

    key: str
    title: str
    words: dict


def _words(px, nx, py, ny, pz, nz):
    return {(0, 1): px, (0, -1): nx, (1, 1): py, (1, -1): ny, (2, 1): pz, (2, -1): nz}


# Trade and open-standard conventions, as listed in CONVENTIONS.md.
FRAME_PRESETS = {
    p.key: p
    for p in (
        FramePreset("enu", "ENU (x east, y north, z up)",
                    _words("east", "west", "north", "south", "up", "down")),
        FramePreset("ned", "NED (x north, y east, z down)",
                    _words("north", "south", "east", "west", "down", "up")),
        FramePreset("vehicle", "vehicle body (x forward, y left, z up; ROS REP 103)",
                    _words("forward", "back", "left", "right", "up", "down")),
        FramePreset("aircraft", "aircraft body (x forward, y right, z down)",
                    _words("forward", "back", "right", "left", "down", "up")),
        FramePreset("camera", "camera optical (z forward, x right, y down)",
                    _words("right", "left", "down", "up", "forward", "back")),
    )
}
DEFAULT_PRESET = "enu"


def gravity_direction(name=None):
    """The reference direction a preset calls "down" (where gravity points), e.g. (0, 0, 1) for NED."""
    for (axis, sign), word in frame_preset(name).words.items():
        if word == "down":
            return tuple(axes.unit_vector(axes.signed_axis(axis, sign)).tolist())
    raise ValueError(f"frame preset {name!r} names no direction 'down'")


def frame_preset(name: str | FramePreset | None) -> FramePreset:
    """The preset for a key such as 'ned' (case-insensitive); None gives the default (ENU)."""
    if isinstance(name, FramePreset):
        return name
    key = (name or DEFAULT_PRESET).strip().lower()
    if key not in FRAME_PRESETS:
        raise ValueError(f"unknown frame preset {name!r}; expected one of {', '.join(FRAME_PRESETS)}")
    return FRAME_PRESETS[key]


def signed_axis_name(axis_index: int, sign: int) -> str:
    """'+X', '−Z' (Unicode minus)."""
    return axes.display(axes.signed_axis(axis_index, sign))


def matrix_of(orientation) -> np.ndarray:
    """The body -> reference matrix of an Orientation, or a (..., 3, 3) array passed through."""
    if hasattr(orientation, "as_matrix"):
        return np.asarray(orientation.as_matrix(), dtype=float)
    m = np.asarray(orientation, dtype=float)
    if m.shape[-2:] != (3, 3):
        raise ValueError(f"expected an Orientation or a 3x3 matrix, got an array of shape {m.shape}")
    if not np.all(np.isfinite(m)):
        raise ValueError("the matrix contains NaN or infinity")
    return m


def rotation_angle_between(a, b) -> np.ndarray:
    """Angle in degrees of the rotation taking a to b (aᵀb), batched; accurate near 0 (atan2 form)."""
    d = np.swapaxes(matrix_of(a), -1, -2) @ matrix_of(b)
    skew = np.stack([d[..., 2, 1] - d[..., 1, 2], d[..., 0, 2] - d[..., 2, 0], d[..., 1, 0] - d[..., 0, 1]], -1)
    sin_part = 0.5 * np.linalg.norm(skew, axis=-1)
    cos_part = 0.5 * (np.trace(d, axis1=-2, axis2=-1) - 1.0)
    return np.degrees(np.arctan2(sin_part, cos_part))


# ---------------------------------------------------------------------------------------------------------
# Where each body axis points
# ---------------------------------------------------------------------------------------------------------

@dataclass(frozen=True)
class AxisPointing:
    """Body axis ``body_axis`` (0..2) points nearest to the reference direction (``ref_axis``, ``ref_sign``),
    ``off_deg`` away. ``also`` lists other reference directions that are exactly as near (a tie)."""

    body_axis: int
    ref_axis: int
    ref_sign: int
    off_deg: float
    also: tuple = ()

    @property
    def body_name(self) -> str:
        return signed_axis_name(self.body_axis, 1)

    @property
    def reference_name(self) -> str:
        return signed_axis_name(self.ref_axis, self.ref_sign)


_TIE_TOLERANCE = 1e-9


def axis_pointing(orientation) -> tuple[AxisPointing, AxisPointing, AxisPointing]:
    """For body +X, +Y, +Z: the nearest of the six reference directions and the angle off it."""
    m = matrix_of(orientation)
    if m.shape != (3, 3):
        raise ValueError("axis_pointing takes one orientation")
    result = []
    for body_axis in range(3):
        column = m[:, body_axis] / np.linalg.norm(m[:, body_axis])
        magnitudes = np.abs(column)
        ref_axis = int(np.argmax(magnitudes))
        sign = 1 if column[ref_axis] >= 0 else -1
        others = np.delete(column, ref_axis)
        # atan2 keeps small offsets accurate where arccos would lose half the digits
        off = float(np.degrees(np.arctan2(np.linalg.norm(others), magnitudes[ref_axis])))
        also = tuple(
            (k, 1 if column[k] >= 0 else -1)
            for k in range(3)
            if k != ref_axis and magnitudes[ref_axis] - magnitudes[k] <= _TIE_TOLERANCE
        )
        result.append(AxisPointing(body_axis, ref_axis, sign, off, also))
    return tuple(result)


def format_off(off_deg: float) -> str:
    """'exact', '0.30° off', '12.5° off' — two decimals below one degree so small errors stay visible."""
    if off_deg < 5e-7:
        return "exact"
    if off_deg < 1.0:
        return f"{off_deg:.2f}\u00b0 off"
    return f"{off_deg:.1f}\u00b0 off"


def describe_axis(pointing: AxisPointing, preset=None) -> str:
    """'+X → −Z (down), 0.30° off' under the given frame preset."""
    words = frame_preset(preset).words
    targets = sorted([(pointing.ref_axis, pointing.ref_sign), *pointing.also])
    names = " or ".join(signed_axis_name(a, s) for a, s in targets)
    said = " or ".join(words[t] for t in targets)
    return f"{pointing.body_name} {ARROW} {names} ({said}), {format_off(pointing.off_deg)}"


def describe_axes(orientation, preset=None) -> list[str]:
    """One line per body axis: where it points in words of the preset."""
    return [describe_axis(p, preset) for p in axis_pointing(orientation)]


# ---------------------------------------------------------------------------------------------------------
# The 24 right-angle orientations (the rotation group of the cube)
# ---------------------------------------------------------------------------------------------------------

def _enumerate_right_angle_matrices() -> np.ndarray:
    """Every signed permutation matrix with determinant +1: 6 permutations x 8 sign patterns / 2 = 24."""
    found = []
    for perm in itertools.permutations(range(3)):
        for signs in itertools.product((1, -1), repeat=3):
            m = np.zeros((3, 3))
            for body_axis, (ref_axis, sign) in enumerate(zip(perm, signs)):
                m[ref_axis, body_axis] = sign  # column = where this body axis goes
            if np.linalg.det(m) > 0:
                found.append(m)
    return np.array(found)


RIGHT_ANGLE_MATRICES = _enumerate_right_angle_matrices()
RIGHT_ANGLE_MATRICES.setflags(write=False)


def _axis_angle_words(m: np.ndarray) -> str:
    """'identity', '90° about +Z', '120° about (1, 1, 1)', '180° about (1, −1, 0)' for a right-angle matrix."""
    angle = int(round(float(rotation_angle_between(np.eye(3), m))))
    if angle == 0:
        return "identity"
    if angle == 180:
        axis = np.array([np.sqrt(max(0.0, (m[i, i] + 1) / 2)) for i in range(3)])
        first = int(np.argmax(axis > 0.1))
        for i in range(3):  # signs from the symmetric part, first non-zero positive (CONVENTIONS.md)
            if i != first and axis[i] > 0.1:
                axis[i] *= np.sign(m[first, i])
    else:
        axis = np.array([m[2, 1] - m[1, 2], m[0, 2] - m[2, 0], m[1, 0] - m[0, 1]])
    steps = np.round(axis / np.max(np.abs(axis))).astype(int)
    if np.count_nonzero(steps) == 1:
        k = int(np.flatnonzero(steps)[0])
        return f"{angle}\u00b0 about {signed_axis_name(k, int(steps[k]))}"
    parts = ", ".join(str(int(s)).replace("-", MINUS) for s in steps)
    return f"{angle}\u00b0 about ({parts})"


def _mapping_words(m: np.ndarray) -> str:
    """'X→+Y, Y→−X, Z→+Z': where each body axis lands."""
    out = []
    for body_axis in range(3):
        ref_axis = int(np.argmax(np.abs(m[:, body_axis])))
        out.append(f"{axes.LETTERS[body_axis]}{ARROW}{signed_axis_name(ref_axis, int(np.sign(m[ref_axis, body_axis])))}")
    return ", ".join(out)


@dataclass(frozen=True)
class RightAngleOrientation:
    index: int  # position in RIGHT_ANGLE_MATRICES
    matrix: np.ndarray
    rotation_words: str  # '90° about +Z'
    mapping_words: str  # 'X→+Y, Y→−X, Z→+Z'


RIGHT_ANGLE_ORIENTATIONS = tuple(
    RightAngleOrientation(i, m, _axis_angle_words(m), _mapping_words(m)) for i, m in enumerate(RIGHT_ANGLE_MATRICES)
)


@dataclass(frozen=True)
class NearestRightAngle:
    right_angle: RightAngleOrientation
    residual_deg: float  # angle of the rotation from the right-angle orientation to the given one


def nearest_right_angle_indices(matrices) -> tuple[np.ndarray, np.ndarray]:
    """Batched: for (..., 3, 3) rotations, the index of the nearest right-angle orientation and the residual
    angle in degrees. Nearest = largest trace(Rkᵀ R), which is the smallest rotation angle between them."""
    m = matrix_of(matrices)
    traces = np.einsum("kij,...ij->...k", RIGHT_ANGLE_MATRICES, m)
    index = np.argmax(traces, axis=-1)
    residual = rotation_angle_between(RIGHT_ANGLE_MATRICES[index], m)
    return index, residual


def nearest_right_angle(orientation) -> NearestRightAngle:
    """The nearest of the 24 right-angle orientations and how far off it the given one is."""
    index, residual = nearest_right_angle_indices(matrix_of(orientation))
    return NearestRightAngle(RIGHT_ANGLE_ORIENTATIONS[int(index)], float(residual))


def describe_nearest_right_angle(orientation) -> str:
    """'nearest right angle: 90° about +Z (X→+Y, Y→−X, Z→+Z), 0.30° off'."""
    near = nearest_right_angle(orientation)
    ra = near.right_angle
    return f"nearest right angle: {ra.rotation_words} ({ra.mapping_words}), {format_off(near.residual_deg)}"


def describe_orientation(orientation, preset=None) -> list[str]:
    """The lines the report and the scene overlay share: where each body axis points, then the nearest
    right-angle orientation."""
    return [*describe_axes(orientation, preset), describe_nearest_right_angle(orientation)]
