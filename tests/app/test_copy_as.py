"""Copy as: every format, from every editor, decodes back to the same orientation; the clipboard gets plain
text and JSON where useful; Ctrl+C copies the default, Ctrl+Shift+C the last used."""

import json

import numpy as np
import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QGuiApplication
from scipy.spatial.transform import Rotation

from app import copy_as
from core.decode import decode
from tests.app.window_driver import focus, leave_editor, scipy_rotation


ORIENTATION_FORMATS = [f for f in copy_as.FORMATS if f not in copy_as.POSE_FORMATS]  # poses: test_copy_as_pose.py


@pytest.mark.parametrize("fmt", ORIENTATION_FORMATS)
@pytest.mark.parametrize("editor_name", ["axis_angle", "quaternion", "matrix", "angles"])
def test_every_format_round_trips_from_every_editor(qtbot, window, fmt, editor_name):
    editor = getattr(window, editor_name)
    focus(qtbot, editor.findChildren(type(window.angles.fields[0]))[0].lineEdit())
    leave_editor(qtbot, window)  # the editor stays "the one in use" for the plain-text copy
    window.current_editor = editor
    result = window.copy_as(fmt)
    assert result.round_trip_error_deg is not None and result.verified, result.status_message
    assert "round-trip error" in window.statusBar().currentMessage()
    clipboard = QGuiApplication.clipboard()
    assert clipboard.text() == result.text
    # Decode the clipboard text independently of the copy code and compare with SciPy's view of the
    # orientation (an outside reference): the best-matching reading must be the copied orientation.
    readings = decode(clipboard.text())
    want = scipy_rotation(window.model.current_orientation())
    errors = [np.degrees((scipy_rotation(r.orientation) * want.inv()).magnitude()) for r in readings]
    assert min(errors) < 1e-9
    if fmt in ("json", "report"):
        data = json.loads(bytes(clipboard.mimeData().data(copy_as.JSON_MIME)).decode("utf-8"))
        x, y, z, w = want.as_quat()
        assert np.allclose(np.abs(np.dot(data["quaternion_wxyz"], [w, x, y, z])), 1.0, atol=1e-15)


def test_report_holds_every_representation_date_and_caution(window):
    result = window.copy_as("report")
    text = result.text.lower()
    for words in ("quaternion", "matrix", "axis", "angles", "date and time", "qualified personnel"):
        assert words in text


def test_ctrl_c_outside_a_field_copies_the_default_format(qtbot, window):
    focus(qtbot, window.mounts.list)
    qtbot.keyClick(window.mounts.list, Qt.Key.Key_C, Qt.KeyboardModifier.ControlModifier)
    text = QGuiApplication.clipboard().text()
    assert text and "verified" in window.statusBar().currentMessage()
    readings = decode(text)
    assert any(r.orientation.isclose(window.model.current_orientation(), atol=1e-12) for r in readings)


def test_ctrl_shift_c_copies_again_in_the_last_format_used(qtbot, window):
    window.copy_as("matlab")
    QGuiApplication.clipboard().setText("")
    focus(qtbot, window.mounts.list)
    qtbot.keyClick(window.mounts.list, Qt.Key.Key_C,
                   Qt.KeyboardModifier.ControlModifier | Qt.KeyboardModifier.ShiftModifier)
    assert QGuiApplication.clipboard().text().startswith("%")  # a MATLAB comment line, then the literal
    assert "MATLAB" in window.copy_again_action.text()


def test_copy_as_menu_lists_every_format_in_plain_words(window):
    labels = [a.text() for a in window.copy_as_menu.actions()]
    assert len(labels) == 9      # seven for the orientation, two for a pose (offered with a position)
    assert any("JSON" in t for t in labels) and any("C / C++" in t for t in labels)
    assert any("4×4 pose matrix" in t for t in labels) and any("Pose line" in t for t in labels)


def test_a_copy_of_an_orientation_from_scipy_round_trips_exactly(window):
    from core.orientation import Orientation

    rotation = Rotation.from_euler("ZXZ", [10, 100, -30], degrees=True)
    x, y, z, w = rotation.as_quat()
    window.model.set_orientation(Orientation.from_quaternion((w, x, y, z)))
    for fmt in ORIENTATION_FORMATS:
        assert window.copy_as(fmt).verified


def test_the_copied_report_of_a_checks_measured_mount_carries_the_verdict_and_decision(qtbot, window):
    # The invented demo check: measured 3° off in pointing (tolerance 1°), u = 0.05°, k = 2, so U = 0.1° and
    # ISO 14253-1 says 3° > 1° + 0.1°: does not conform; the roll of 0.4° is below 1° − 0.1°: conforms.
    from pathlib import Path
    from PySide6.QtGui import QGuiApplication
    demo_check = Path(__file__).resolve().parents[2] / "resources" / "demo_check.fwsession.json"
    window.model.undo_stack.setClean()
    assert window.open_file(str(demo_check))
    model = window.model
    model.select(next(i for i, m in enumerate(model.mounts) if m.name == "Radar antenna, as measured"))
    window.copy_as_actions["report"].trigger()
    assert "verified" in window.statusBar().currentMessage()
    text = QGuiApplication.clipboard().text()
    assert "Note: Check verdict: FAIL" in text
    assert "pointing error 3.0000 deg against 1.0000 deg: does not conform (U = 0.1°, k = 2)" in text
    assert "roll 0.4000 deg against 1.0000 deg: conforms" in text
    assert "Note: ISO 14253-1 decision: does not conform" in text
    model.select(0)                      # another mount: no check lines
    window.copy_as_actions["report"].trigger()
    assert "Check verdict" not in QGuiApplication.clipboard().text()
