"""Copy as: put the current orientation on the clipboard in a chosen format, then decode the copy back
and report its round-trip error before calling it verified. A mount with a position can also be copied
as a pose (core/pose_formats.py): its round trip checks the position as well as the orientation."""

from __future__ import annotations

import json
from dataclasses import dataclass
from datetime import datetime

from PySide6.QtCore import QMimeData
from PySide6.QtGui import QGuiApplication

from core import describe


FORMATS = {
    "text": "Plain text (editor in use)",
    "json": "JSON",
    "csv": "CSV (header and row)",
    "python": "Python / numpy",
    "c": "C / C++ initializer",
    "matlab": "MATLAB / Octave",
    "report": "Report (every representation)",
    "pose-matrix": "4×4 pose matrix (needs a position)",
    "pose-line": "Pose line: position, quaternion (needs a position)",
}
POSE_FORMATS = ("pose-matrix", "pose-line")
JSON_MIME = "application/json"
# A copy whose decoded value is farther than this from the original is not called verified.
VERIFIED_LIMIT_DEG = 1e-9
# ... or whose decoded position is farther than this (a nanometre: far below any bench measurement,
# far above the rounding of a shortest decimal).
VERIFIED_LIMIT_M = 1e-9


@dataclass(frozen=True)
class CopyResult:
    fmt: str
    text: str
    json_text: str | None
    round_trip_error_deg: float | None
    status_message: str
    round_trip_error_m: float | None = None      # pose formats only

    @property
    def verified(self) -> bool:
        return (self.round_trip_error_deg is not None and self.round_trip_error_deg <= VERIFIED_LIMIT_DEG
                and (self.fmt not in POSE_FORMATS
                     or self.round_trip_error_m is not None and self.round_trip_error_m <= VERIFIED_LIMIT_M))


def _options(model, editor) -> dict:
    prefs = model.preferences
    return {
        "representation": _editor_representation(editor),
        "angle_units": prefs.angle_units,
        "degrees": prefs.angle_units != "rad",   # copies are in degrees or radians, their unit stated
        "quaternion_order": prefs.quaternion_order,
        "scalar_last": prefs.quaternion_order == "xyzw",
        "matrix_meaning": prefs.matrix_meaning,
        "transposed": prefs.matrix_meaning == "reference_to_body",
        "sequence": prefs.sequence,
        "intrinsic": prefs.intrinsic,
        "reference_frame": model.reference_frame,
        "gravity_down": describe.gravity_direction(model.reference_frame),
        "name": model.current_mount().name,
        "timestamp": datetime.now().astimezone().isoformat(timespec="seconds"),
    }


def _editor_representation(editor) -> str:
    """What the editor in use shows (its core/representations.py entry); the quaternion without one."""
    shown = getattr(editor, "representation", None)
    return shown.kind if shown is not None else "quaternion"


def offered(model, fmt: str) -> bool:
    """Whether the menu offers `fmt` for the selected mount (a pose needs a position)."""
    return fmt not in POSE_FORMATS or model.current_mount().position is not None


def render_pose_copy(model, fmt: str) -> tuple[str, float, float]:
    """(text, round-trip error in degrees, in metres) of the selected mount as a pose."""
    from core import pose_formats  # late: only needed when copying

    mount = model.current_mount()
    scalar_last = model.preferences.quaternion_order == "xyzw"
    text = pose_formats.render_pose(mount.orientation, mount.position, fmt, scalar_last)
    angle, distance = pose_formats.pose_round_trip(mount.orientation, mount.position, text, fmt, scalar_last)
    return text, float(angle), float(distance)


def render_copy(model, fmt: str, editor=None) -> tuple[str, str | None, float]:
    """(text, JSON for the JSON MIME type or None, round-trip error in degrees)."""
    from core import formats  # late: only needed when copying

    if fmt not in FORMATS:
        raise KeyError(f"unknown copy format {fmt!r}; expected one of {', '.join(FORMATS)}")
    if fmt in POSE_FORMATS:
        text, error, _ = render_pose_copy(model, fmt)
        return text, None, error
    orientation = model.current_orientation()
    options = _options(model, editor)
    if fmt == "report":
        options["notes"] = tuple(_check_notes(model))
    text = formats.render(orientation, fmt, options)
    if fmt == "csv":
        # the header names each column with its unit and convention (qw…/qx… order, r11… body -> reference
        # or dcm11… reference -> body, the sequence and intrinsic/extrinsic), and is decoded back with the row
        # and its first column is the mount's name (the decoder reads it as text, with a note)
        text = formats.csv_with_name(model.current_mount().name, formats.csv_header(options), text)
    error = float(formats.round_trip_error(orientation, text, fmt, options))
    json_text = formats.render(orientation, "json", options) if fmt in ("json", "report") else None
    return text, json_text, error


def _check_notes(model) -> list[str]:
    """When the copied mount is the check's measured one: the check, its verdict and its decision."""
    from core.check import check
    from core.decision import check_lines, setup_figure_uncertainties
    from core.errors import FramewrightError

    nominal, measured = model.check_mount_indices()
    if nominal is None or measured is None or measured != model.selected_index:
        return []
    state = model.check
    setup = state.adjustment
    try:
        pair = model.mounts[nominal].orientation, model.mounts[measured].orientation
        result = check(*pair, state.settings)
        lines = check_lines(result, setup.uncertainty_deg, setup.coverage,
                            setup_figure_uncertainties(*pair, state.settings, setup))
    except FramewrightError as error:
        return [f"the check could not be judged: {error}"]
    return [f"measured side of the check against “{model.mounts[nominal].name}”"] + lines


def copy_to_clipboard(model, fmt: str, editor=None) -> CopyResult:
    distance = None
    try:
        if fmt in POSE_FORMATS:
            text, error, distance = render_pose_copy(model, fmt)
            json_text = None
        else:
            text, json_text, error = render_copy(model, fmt, editor)
    except Exception as exc:  # a failing renderer must never lose the user's clipboard silently
        return CopyResult(fmt, "", None, None, f"Nothing copied: {FORMATS.get(fmt, fmt)} failed ({exc}).")
    mime = QMimeData()
    mime.setText(text)
    if json_text is not None:
        try:
            json.loads(json_text)
            mime.setData(JSON_MIME, json_text.encode("utf-8"))
        except ValueError:
            pass
    QGuiApplication.clipboard().setMimeData(mime)
    label = FORMATS[fmt]
    result = CopyResult(fmt, text, json_text, error, "", distance)
    moved = "" if distance is None else f" and {distance * 1e3:.1e} mm"
    if result.verified:
        message = f"Copied as {label}; decoded back, round-trip error {error:.1e}°{moved} — verified."
    else:
        moved = "" if distance is None else f" and {distance * 1e3:.3g} mm"
        message = (f"Copied as {label}, but decoded back it differs by {error:.3g}°{moved} — NOT verified; "
                   "check the digits before handing it on.")
    return CopyResult(fmt, text, json_text, error, message, distance)
