"""Decode panel: pasted text becomes ranked readings; choosing one applies it to every editor, undoably;
Ctrl+V outside a text field pastes into the panel."""

import re

import numpy as np
import pytest
from PySide6.QtCore import QPoint, Qt
from PySide6.QtGui import QGuiApplication
from scipy.spatial.transform import Rotation

from app.text import significant
from tests.app.window_driver import assert_editors_agree, focus

# Four decimals as on a drawing; rows of a reference -> body matrix. The numbers are cos/sin of 12°
# rounded (from memory: cos 12° = 0.97815, sin 12° = 0.20791).
DRAWING = """0.0000  0.9781 -0.2079
-1.0000  0.0000  0.0000
0.0000  0.2079  0.9781"""


def _reading_rows(window):
    return [window.decode_panel.list.item(i).text() for i in range(window.decode_panel.list.count())]


def _type_and_read(qtbot, window, text):
    panel = window.decode_panel
    window.side_tabs.setCurrentWidget(panel)
    focus(qtbot, panel.paste_box)
    for i, line in enumerate(text.splitlines()):
        if i:
            qtbot.keyClick(panel.paste_box, Qt.Key.Key_Return)
        qtbot.keyClicks(panel.paste_box, line)
    assert panel.paste_box.toPlainText() == text
    qtbot.mouseClick(panel.read_button, Qt.MouseButton.LeftButton)
    return panel


def test_pasted_matrix_lists_both_meanings_and_applying_one_updates_every_editor(qtbot, window):
    window.model.set_preferences(significant_digits=15)
    panel = _type_and_read(qtbot, window, DRAWING)
    rows = _reading_rows(window)
    assert len(rows) >= 2 and all(row.split(". ", 1)[1].startswith("matrix") for row in rows)
    transposed = next(i for i, r in enumerate(panel.readings)
                      if str(r.conventions.get("matrix", "")).startswith("reference"))
    rect = panel.list.visualItemRect(panel.list.item(transposed))
    qtbot.mouseClick(panel.list.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    before = window.model.current_orientation()
    qtbot.mouseClick(panel.apply_button, Qt.MouseButton.LeftButton)
    chosen = panel.readings[transposed].orientation
    assert window.model.current_orientation() == chosen
    # The rows of the pasted numbers are the body axes: SciPy's nearest rotation of their transpose.
    m = np.array([[float(v) for v in line.split()] for line in DRAWING.splitlines()]).T
    u, _, vt = np.linalg.svd(m)
    assert_editors_agree(window, Rotation.from_matrix(u @ vt), atol=1e-9)
    window.model.undo()
    assert window.model.current_orientation() == before


def test_junk_gets_a_message_and_changes_nothing(qtbot, window):
    before = window.model.current_orientation()
    window.decode_panel.set_text("see drawing rev B")
    assert "Cannot read" in window.decode_panel.message.text()
    assert window.decode_panel.list.count() == 0
    assert not window.decode_panel.apply_button.isEnabled()
    assert window.model.current_orientation() == before


def test_ctrl_v_outside_a_text_field_pastes_into_decode(qtbot, window):
    QGuiApplication.clipboard().setText("q = [0.5, 0.5, 0.5, 0.5]")
    focus(qtbot, window.mounts.list)
    qtbot.keyClick(window.mounts.list, Qt.Key.Key_V, Qt.KeyboardModifier.ControlModifier)
    assert window.decode_panel.paste_box.toPlainText() == "q = [0.5, 0.5, 0.5, 0.5]"
    assert window.decode_panel.list.count() >= 1
    assert window.side_tabs.currentWidget() is window.decode_panel


def test_ctrl_v_in_a_field_pastes_into_that_field_not_decode(qtbot, window):
    QGuiApplication.clipboard().setText("12.5")
    field = window.angles.fields[2]
    focus(qtbot, field.lineEdit())
    field.lineEdit().selectAll()
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_V, Qt.KeyboardModifier.ControlModifier)
    assert field.text() == "12.5"
    assert window.decode_panel.paste_box.toPlainText() == ""


def test_double_click_applies_a_reading(qtbot, window):
    window.decode_panel.set_text("axis 0 0 1 angle 90 deg")
    panel = window.decode_panel
    rect = panel.list.visualItemRect(panel.list.item(0))
    # A person's double-click: press and release, then the second press arrives as a double-click.
    qtbot.mouseClick(panel.list.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    qtbot.mouseDClick(panel.list.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    assert window.model.current_orientation() == panel.readings[0].orientation
    assert window.model.undo_stack.count() == 1


def test_a_100_kB_paste_is_read_off_the_gui_thread_and_a_newer_text_wins(qtbot, window):
    from tests.core.hostile_decode_inputs import hostile_inputs
    panel = window.decode_panel
    big = hostile_inputs()["long word before numbers"]          # ~99 kB: a long word, then '1 2 3'
    QGuiApplication.clipboard().setText(big)
    qtbot.mouseClick(panel.paste_button, Qt.MouseButton.LeftButton)
    # The click returned before the decoder finished: the work is on a worker thread.
    assert panel.message.text() == "Reading…"
    qtbot.waitUntil(lambda: panel.message.text() != "Reading…", timeout=30_000)   # hang guard only
    assert panel.list.count() >= 1 and panel.readings[0].numbers == (1.0, 2.0, 3.0)
    # A long paste replaced at once by a short one: the short one's readings stay.
    QGuiApplication.clipboard().setText(big)
    qtbot.mouseClick(panel.paste_button, Qt.MouseButton.LeftButton)
    panel.paste_box.clear()
    focus(qtbot, panel.paste_box)
    qtbot.keyClicks(panel.paste_box, "0 0 1 45")
    qtbot.mouseClick(panel.read_button, Qt.MouseButton.LeftButton)
    qtbot.wait(1500)                                             # let the stale worker finish
    assert panel.readings and panel.readings[0].numbers == (0.0, 0.0, 1.0, 45.0)


# ---- readings a person can compare: each row shows its result, its translation and its transform ----

PYTHON_WORDS = re.compile(r"\b(True|False|None)\b")


def _number_after(words, row):
    """The number a row writes after `words` (the list shows numbers as the editors do)."""
    found = re.search(re.escape(words) + r" (-?[0-9.e+-]+)", row)
    assert found, f"{words!r} not in {row!r}"
    return float(found.group(1))


def _vector_after(words, row):
    found = re.search(re.escape(words) + r" \(([^)]*)\)", row)
    assert found, f"{words!r} not in {row!r}"
    return np.array([float(v) for v in found.group(1).split(", ")])


def _nearest_rotation(m):
    u, _, vt = np.linalg.svd(np.asarray(m, dtype=float))
    return Rotation.from_matrix(u @ vt)


# A 4x4 homogeneous transform (common practice: [[R, t], [0 0 0 1]]), invented: 90° about x, t = (0.1, 0.2, 0.3).
TRANSFORM_4X4 = """1 0 0 0.1
0 0 -1 0.2
0 1 0 0.3
0 0 0 1"""


def test_a_4x4_transform_shows_both_readings_with_their_result_and_the_distance_between_them(qtbot, window):
    digits = window.model.preferences.significant_digits
    panel = _type_and_read(qtbot, window, TRANSFORM_4X4)
    rows = _reading_rows(window)
    assert len(rows) == 2 and "as written" in rows[0] and "transposed" in rows[1]
    m = np.array([[float(v) for v in line.split()] for line in TRANSFORM_4X4.splitlines()])[:3, :3]
    as_written, transposed = Rotation.from_matrix(m), Rotation.from_matrix(m.T)       # SciPy's readings
    # SciPy: the angle of the rotation taking one reading to the other (180° for these numbers)
    apart = np.degrees((as_written.inv() * transposed).magnitude())
    assert f"differs from reading 1 by {significant(apart, digits)}°" in rows[1] and "by 180°" in rows[1]
    assert "differs" not in rows[0]                                    # the best reading is the yardstick
    for row, rotation in zip(rows, (as_written, transposed)):
        rotvec = np.degrees(rotation.as_rotvec())                      # SciPy's axis times angle
        angle = _number_after("rotation", row)
        assert angle == pytest.approx(np.linalg.norm(rotvec), abs=1e-6)
        np.testing.assert_allclose(_vector_after(f"{significant(angle, digits)}° about", row),
                                   rotvec / np.linalg.norm(rotvec), atol=1e-8)
        # the session's sequence (intrinsic ZYX, the demo's preference), as SciPy spells it: 'ZYX' upper case
        yaw, pitch, roll = rotation.as_euler("ZYX", degrees=True)
        assert (f"Z-Y′-X″ intrinsic (yaw, pitch, roll): {significant(yaw, digits)}°, "
                f"{significant(pitch, digits)}°, {significant(roll, digits)}°") in row
        assert "translation x, y, z: 0.1, 0.2, 0.3 (unit not stated)" in row
    assert panel.list.item(0).isSelected()


def test_the_rows_follow_the_digits_and_the_sequence_the_session_prefers(qtbot, window):
    panel = _type_and_read(qtbot, window, "axis 0.6 0 0.8 angle 33.3333333 deg")
    window.digits_box.setFocus()
    window.digits_box.selectAll()
    qtbot.keyClicks(window.digits_box, "4")
    qtbot.keyClick(window.digits_box, Qt.Key.Key_Return)
    assert window.model.preferences.significant_digits == 4
    rows = _reading_rows(window)
    assert "rotation 33.33° about (0.6, 0, 0.8)" in rows[0]
    window.model.set_preferences(sequence="XYZ", intrinsic=False)
    # SciPy: lower case 'xyz' is extrinsic X, then Y, then Z (roll, pitch, yaw about fixed axes)
    roll, pitch, yaw = Rotation.from_rotvec(np.radians(33.3333333) * np.array([0.6, 0, 0.8])).as_euler("xyz", degrees=True)
    row = panel.list.item(0).text()
    assert (f"X-Y-Z extrinsic (roll, pitch, yaw): {significant(roll, 4)}°, {significant(pitch, 4)}°, "
            f"{significant(yaw, 4)}°") in row
    assert panel.list.currentRow() == 0


def _kitti_layout():
    """A calibration file in the layout of the KITTI object benchmark's calib/*.txt (keys P0, R0_rect,
    Tr_velo_to_cam; 12, 9 and 12 numbers, rows one after another, six-decimal exponent form). The values
    are invented: a small rectifying turn and the usual lidar-to-camera axes swap, made with SciPy."""
    r0 = Rotation.from_euler("ZYX", (0.55, -0.4, 0.25), degrees=True).as_matrix()
    tr = Rotation.from_euler("ZYX", (-90.4, 0.3, -90.6), degrees=True).as_matrix()
    t = (-0.0041, -0.0763, -0.2718)
    p0 = (720.0, 0, 610.0, 0, 0, 720.0, 173.0, 0, 0, 0, 1, 0)
    numbers = lambda values: " ".join(f"{v:.6e}" for v in values)   # noqa: E731
    text = (f"P0: {numbers(p0)}\nR0_rect: {numbers(r0.ravel())}\n"
            f"Tr_velo_to_cam: {numbers(np.hstack([tr, np.array(t)[:, None]]).ravel())}")
    printed = [np.array([float(v) for v in line.split(":")[1].split()]) for line in text.splitlines()]
    return text, printed[1].reshape(3, 3), printed[2].reshape(3, 4)


def test_a_calibration_file_with_two_transforms_lists_them_under_their_names(qtbot, window):
    text, r0, tr = _kitti_layout()
    panel = _type_and_read(qtbot, window, text)
    rows = _reading_rows(window)
    headers = [i for i in range(panel.list.count()) if not panel.list.item(i).flags() & Qt.ItemFlag.ItemIsSelectable]
    assert [rows[i] for i in headers] == ["Transform R0_rect: 2 readings", "Transform Tr_velo_to_cam: 2 readings"]
    assert headers == [0, 3] and len(rows) == 6 and "of 2 transforms" in panel.message.text()
    assert "translation x, y, z" not in rows[1] + rows[2]               # R0_rect is a rotation alone
    assert all("translation x, y, z: -0.0041, -0.0763, -0.2718 (unit not stated)" in rows[i] for i in (4, 5))
    # each group's best reading first; the other is measured from it (SciPy's angle between the two)
    for first, other, m in ((1, 2, r0), (4, 5, tr[:, :3])):
        assert "as written" in rows[first] and "transposed" in rows[other]
        apart = np.degrees((_nearest_rotation(m).inv() * _nearest_rotation(m.T)).magnitude())
        assert _number_after(f"differs from reading {first if first == 1 else 3} by", rows[other]) == \
            pytest.approx(apart, abs=1e-6)
    # the arrow key passes over the second header, from R0_rect's last reading to Tr_velo_to_cam's first
    rect = panel.list.visualItemRect(panel.list.item(2))
    qtbot.mouseClick(panel.list.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    qtbot.keyClick(panel.list, Qt.Key.Key_Down)
    assert panel.list.currentRow() == 4
    focus(qtbot, panel.unit_box)
    qtbot.keyClick(panel.unit_box, Qt.Key.Key_Down)                     # "read it as mm"
    qtbot.mouseClick(panel.apply_button, Qt.MouseButton.LeftButton)
    np.testing.assert_allclose(window.model.current_orientation().as_matrix(),
                               _nearest_rotation(tr[:, :3]).as_matrix(), atol=1e-9)   # SciPy's rotation of it
    assert window.model.current_mount().position.shown("mm") == pytest.approx((-0.0041, -0.0763, -0.2718))


def test_a_description_file_origin_shows_its_translation_without_a_unit(qtbot, window):
    digits = window.model.preferences.significant_digits
    panel = _type_and_read(qtbot, window, '<origin xyz="0.1 0 0.2" rpy="0 0 1.5708"/>')
    row = _reading_rows(window)[0]
    assert "translation x, y, z: 0.1, 0, 0.2 (unit not stated)" in row
    # SciPy: rpy about fixed X, Y, Z is lower-case 'xyz'; 1.5708 rad is a little over 90°
    rotvec = np.degrees(Rotation.from_euler("xyz", (0, 0, 1.5708)).as_rotvec())
    assert f"rotation {significant(np.linalg.norm(rotvec), digits)}° about (0, 0, 1)" in row
    assert panel.unit_row.isVisible() and not panel.apply_button.isEnabled()   # the unit is asked, not guessed
    # the decoder's note about the whole text is said once, above the list, and in full in its tooltip
    note = panel.readings[0].notes[0]
    assert "note:" not in row and note in panel.message.toolTip()


def test_a_long_list_is_grouped_by_kind_with_the_best_of_each_kind_first(qtbot, window):
    panel = _type_and_read(qtbot, window, "30 20 10")
    rows = _reading_rows(window)
    headers = [r for i, r in enumerate(rows) if not panel.list.item(i).flags() & Qt.ItemFlag.ItemIsSelectable]
    kinds = list(dict.fromkeys(r.kind for r in panel.readings))
    assert len(headers) == len(kinds) >= 2 and headers[0].startswith("Three angles: ")
    assert rows[1].startswith("1. ")                                    # the best reading heads its group
    assert sum(1 for r in rows if re.match(r"\d+\. ", r)) == len(panel.readings)


@pytest.mark.parametrize("text", [TRANSFORM_4X4, '<origin xyz="0.1 0 0.2" rpy="0 0 1.5708"/>', "30 20 10",
                                  "q = [0.5, 0.5, 0.5, 0.5]", "0.1 0.2 0.3 0 0 0.7071068 0.7071068 base_link imu"])
def test_no_row_tooltip_or_message_shows_python_words(qtbot, window, text):
    panel = _type_and_read(qtbot, window, text)
    shown = [panel.message.text(), panel.message.toolTip()]
    for i in range(panel.list.count()):
        shown += [panel.list.item(i).text(), panel.list.item(i).toolTip()]
    assert panel.list.count() >= 1
    for words in shown:
        assert not PYTHON_WORDS.search(words), words
        assert "{" not in words and "'intrinsic'" not in words
    assert "Conventions: " in panel.list.item(0).toolTip() or "Conventions: " in panel.list.item(1).toolTip()


def test_a_single_named_transform_shows_its_name_in_its_rows(qtbot, window):
    _type_and_read(qtbot, window, "0.1 0.2 0.3 0 0 0.7071068 0.7071068 base_link imu")
    assert all("transform base_link -> imu" in row for row in _reading_rows(window))
