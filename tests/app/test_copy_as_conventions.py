"""Copy as writes the convention the user's preferences ask for: the numbers on the clipboard are read
with a plain regular expression (never our decoder) and compared with SciPy for the matrix direction, the
quaternion order, the sequence and intrinsic/extrinsic and the angle unit. And the "not verified" path: a
renderer that writes a wrong value, or fails, is reported as such in the status bar.

Check values: SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library)."""

import csv
import json

import numpy as np
import pytest
from PySide6.QtGui import QGuiApplication
from scipy.spatial.transform import Rotation

from core import formats
from core.formats import FormatOptions
from core.orientation import Orientation
from tests.app.window_driver import focus, leave_editor
from tests.core.test_formats_against_scipy import numbers_in, scipy_numbers

ROTATION = Rotation.from_euler("ZYX", [-141.0, 27.0, 58.0], degrees=True)
CODE_FORMATS = ("text", "csv", "python", "c", "matlab")

CASES = [
    ("matrix", {"matrix_meaning": "body_to_reference"}, {"transposed": False}),
    ("matrix", {"matrix_meaning": "reference_to_body"}, {"transposed": True}),
    ("quaternion", {"quaternion_order": "wxyz"}, {"scalar_last": False}),
    ("quaternion", {"quaternion_order": "xyzw"}, {"scalar_last": True}),
    ("angles", {"sequence": "ZYX", "intrinsic": True, "angle_units": "deg"},
     {"sequence": "ZYX", "intrinsic": True, "degrees": True}),
    ("angles", {"sequence": "XYZ", "intrinsic": False, "angle_units": "rad"},
     {"sequence": "XYZ", "intrinsic": False, "degrees": False}),
    ("angles", {"sequence": "ZXZ", "intrinsic": False, "angle_units": "deg"},
     {"sequence": "ZXZ", "intrinsic": False, "degrees": True}),
    ("axis-angle", {"angle_units": "rad"}, {"degrees": False}),
]
EDITORS = {"matrix": "matrix", "quaternion": "quaternion", "angles": "angles", "axis-angle": "axis_angle"}


def use_editor(qtbot, window, name):
    """Click into the editor's first field and leave it, as a person would before copying."""
    editor = getattr(window, name)
    focus(qtbot, editor.findChildren(type(window.angles.fields[0]))[0].lineEdit())
    leave_editor(qtbot, window)
    window.current_editor = editor


@pytest.mark.parametrize("representation, preferences, claimed", CASES)
def test_copies_follow_the_preferences_and_agree_with_scipy(qtbot, window, representation, preferences, claimed):
    window.model.set_orientation(Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True)))
    window.model.set_preferences(**preferences)
    use_editor(qtbot, window, EDITORS[representation])
    want = scipy_numbers(ROTATION, representation, FormatOptions(representation=representation, **claimed))
    for fmt in CODE_FORMATS:
        window.copy_as_actions[fmt].trigger()                      # as the Copy as menu does
        text = QGuiApplication.clipboard().text()
        message = window.statusBar().currentMessage()
        assert message.endswith("verified.") and "NOT" not in message, message
        if fmt == "csv":   # a header row naming the mount, units and convention, then the mount's row
            header, text = text.splitlines()
            assert header == "name," + formats.csv_header(FormatOptions(representation=representation,
                                                                        **claimed)).strip()
            name, text = next(csv.reader([text]))[0], ",".join(next(csv.reader([text]))[1:])
            assert name == window.model.current_mount().name
        np.testing.assert_allclose(numbers_in(fmt, text), want, atol=1e-12, err_msg=f"{fmt}: {text}")
    window.copy_as_actions["json"].trigger()
    data = json.loads(QGuiApplication.clipboard().text())
    np.testing.assert_allclose(data["matrix"], ROTATION.as_matrix(), atol=1e-15)   # JSON: body -> reference
    sequence = window.model.preferences.sequence
    name = sequence if window.model.preferences.intrinsic else sequence.lower()
    np.testing.assert_allclose(data["angles_deg"], ROTATION.as_euler(name, degrees=True), atol=1e-12)


# The CSV header's words for each convention, as CONVENTIONS.md names them: r = body -> reference,
# dcm = reference -> body; the quaternion order as written; yaw/pitch/roll only for intrinsic Z-Y-X (common
# practice), else the sequence and its kind; the angle unit on every angle column.
CSV_HEADERS = [
    ("matrix", {"matrix_meaning": "reference_to_body"}, "dcm11,dcm12,dcm13,dcm21,dcm22,dcm23,dcm31,dcm32,dcm33"),
    ("quaternion", {"quaternion_order": "xyzw"}, "qx,qy,qz,qw"),
    ("angles", {"sequence": "ZYX", "intrinsic": True, "angle_units": "deg"}, "yaw_deg,pitch_deg,roll_deg"),
    ("angles", {"sequence": "ZXZ", "intrinsic": False, "angle_units": "rad"},
     "zxz_extrinsic_angle1_rad,zxz_extrinsic_angle2_rad,zxz_extrinsic_angle3_rad"),
    ("axis-angle", {"angle_units": "deg"}, "axis_x,axis_y,axis_z,angle_deg"),
]


@pytest.mark.parametrize("representation, preferences, header", CSV_HEADERS)
def test_a_csv_copy_starts_with_a_header_naming_units_and_convention(qtbot, window, representation,
                                                                     preferences, header):
    window.model.set_orientation(Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True)))
    window.model.set_preferences(**preferences)
    use_editor(qtbot, window, EDITORS[representation])
    window.copy_as_actions["csv"].trigger()
    lines = QGuiApplication.clipboard().text().splitlines()
    assert len(lines) == 2 and lines[0] == "name," + header
    row = next(csv.reader([lines[1]]))
    assert row[0] == window.model.current_mount().name and len(row) == len(header.split(",")) + 1
    assert "verified." in window.statusBar().currentMessage()


def test_a_renderer_that_writes_a_wrong_value_is_not_verified(qtbot, window, monkeypatch):
    window.model.set_orientation(Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True)))
    use_editor(qtbot, window, "quaternion")
    real = formats._RENDERERS["csv"]

    def off_by_a_tenth_of_a_degree(orientation, options):
        return real(orientation @ Orientation.from_axis_angle([0, 0, 1], 0.1), options)

    monkeypatch.setitem(formats._RENDERERS, "csv", off_by_a_tenth_of_a_degree)
    window.copy_as_actions["csv"].trigger()
    message = window.statusBar().currentMessage()
    assert "NOT verified" in message and "0.1°" in message
    result = window.copy_as("csv")
    assert not result.verified and result.round_trip_error_deg == pytest.approx(0.1, abs=1e-9)


def test_a_renderer_that_writes_the_wrong_convention_is_not_verified(qtbot, window, monkeypatch):
    # A copy written w-last while the caption (and the decoder's hints) say w-first must not pass.
    window.model.set_orientation(Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True)))
    use_editor(qtbot, window, "quaternion")
    real = formats._values

    def swapped(orientation, options):
        values = real(orientation, options)
        return values[1:] + values[:1] if options.representation == "quaternion" else values

    monkeypatch.setattr(formats, "_values", swapped)
    result = window.copy_as("python")
    assert not result.verified and "NOT verified" in window.statusBar().currentMessage()


def test_a_renderer_that_fails_copies_nothing_and_says_so(qtbot, window, monkeypatch):
    QGuiApplication.clipboard().setText("kept")

    def broken(orientation, options):
        raise RuntimeError("simulated failure")

    monkeypatch.setitem(formats._RENDERERS, "matlab", broken)
    window.copy_as_actions["matlab"].trigger()
    assert window.statusBar().currentMessage().startswith("Nothing copied")
    assert QGuiApplication.clipboard().text() == "kept"
