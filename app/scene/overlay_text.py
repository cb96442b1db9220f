"""Text of the scene's overlay: the current orientation in the chosen representation, and in words where
each body axis points (core.describe). Plain strings; the label layer draws them."""

from __future__ import annotations

import numpy as np

from app import text
from core import describe, representations, units
from core.sequences import preset_names, spelled_sequence

# In the order the Show box lists them: the kinds of core/representations.py ('rotation vector', the
# spelling of earlier versions, is read as 'rotation-vector': see overlay_kind).
REPRESENTATION_TITLES = {
    "axis-angle": "Axis & angle",
    "quaternion": "Quaternion",
    "matrix": "Matrix",
    **{r.kind: r.menu_title for r in representations.VECTORS if r is representations.ROTATION_VECTOR},
    "angles": "Angles",
    **{r.kind: r.menu_title for r in representations.VECTORS if r is not representations.ROTATION_VECTOR},
}
REPRESENTATIONS = tuple(REPRESENTATION_TITLES)


def overlay_kind(kind) -> str:
    """The kind any accepted spelling names ('rotation vector' -> 'rotation-vector'); ValueError when none."""
    found = representations.lookup(kind)
    if found is None or found.kind not in REPRESENTATIONS:
        raise ValueError(f"unknown representation {kind!r}; expected one of {', '.join(REPRESENTATIONS)}")
    return found.kind


def _sequence_words(sequence, intrinsic) -> str:
    spelled = spelled_sequence(sequence, intrinsic)
    return f"intrinsic {spelled}" if intrinsic else f"extrinsic {spelled} (fixed axes)"


def representation_lines(orientation, kind="axis-angle", sequence="ZYX", intrinsic=True,
                         angle_unit="deg") -> list[str]:
    """The orientation's lines in `kind`; angles in the display unit `angle_unit` (core/units.py)."""
    kind = overlay_kind(kind)
    if kind == "axis-angle":
        axis, angle = orientation.as_axis_angle()
        if angle == 0:
            return ["angle \u03c6 0\u00b0: at the reference (axis undefined)"]
        return [f"axis n {text.vector(axis)}", f"angle \u03c6 {text.angle(angle, angle_unit)}"]
    if kind == "quaternion":
        return [f"q (w, x, y, z) {text.vector(orientation.as_quaternion(), 6)}"]
    if kind == "matrix":
        m = orientation.as_matrix()
        rows = ["[" + " ".join(text.fixed(v, 4, width=7) for v in row) + " ]" for row in m]
        return ["R (body \u2192 reference; columns = body axes)", *rows]
    vector = representations.by_kind(kind)
    if vector.vector:
        if vector.half_turn_words and orientation.quaternion[0] == 0:
            return [f"{vector.symbol} = {vector.formula}: {vector.half_turn_words}"]
        values = vector.values(orientation)
        if vector.units != representations.ANGLE:
            return [f"{vector.symbol} = {vector.formula} {text.vector(values, 4)}"]
        if angle_unit == "deg":
            return [f"{vector.symbol} = {vector.formula} {text.vector(values, 3)} deg"]
        found = units.angle_unit(angle_unit)
        shown = text.vector(units.degrees_to(values, angle_unit), found.decimals)
        return [f"{vector.symbol} = {vector.formula} {shown} {found.symbol}"]
    if kind == "angles":
        angles = orientation.as_angles(sequence, intrinsic=intrinsic)
        names = _angle_names(sequence, intrinsic)
        values = "  ".join(f"{name} {text.angle(v, angle_unit)}" for name, v in zip(names, angles.angles))
        lines = [_sequence_words(sequence, intrinsic), values]
        if angles.locked:
            lines.append("gimbal lock: only the sum/difference of the first and third angle is determined")
        return lines
    raise ValueError(f"unknown representation {kind!r}; expected one of {', '.join(REPRESENTATIONS)}")


def _angle_names(sequence, intrinsic):
    return preset_names(sequence, intrinsic) or ("\u03b81", "\u03b82", "\u03b83")


def orientation_panel(orientation, kind, sequence, intrinsic, preset, angle_unit="deg") -> list[str]:
    """The top-left overlay panel, line by line."""
    title = REPRESENTATION_TITLES[overlay_kind(kind)]
    lines = [f"{title}:", *("  " + s for s in representation_lines(orientation, kind, sequence, intrinsic,
                                                                      angle_unit))]
    lines.append(f"Body axes ({describe.frame_preset(preset).title.split(' (')[0]}):")
    lines += ["  " + s for s in describe.describe_axes(orientation, preset)]
    near = describe.nearest_right_angle(orientation)
    lines.append(f"Nearest right angle: {near.right_angle.rotation_words}, {describe.format_off(near.residual_deg)}")
    lines.append(f"  ({near.right_angle.mapping_words})")
    return lines


def short_angle(value_deg: float, unit: str = "deg") -> str:
    """A label's angle, short: '30.6°' to a tenth of a degree, or four digits in another unit ('534.3 mrad')."""
    if unit == "deg":
        return f"{value_deg:.1f}\u00b0"
    value = float(units.degrees_to(value_deg, unit))
    return units.with_symbol(f"{value:.0f}" if abs(value) >= 1000 else f"{value:.4g}", unit)


def sweep_line(t, angle_deg) -> str:
    return f"sweep t = {t:.2f}: {t * angle_deg:.1f}\u00b0 of {angle_deg:.1f}\u00b0 about n"


def tracked_words(name, vector) -> str:
    if name:
        return name
    return "typed " + text.vector(np.asarray(vector) / np.linalg.norm(vector), 3)
