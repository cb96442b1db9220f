"""The mount's position as a user meets it: typed key by key into the three fields beside the orientation
editors, one undo step (Ctrl+Z), hostile text refused with a visible note, saved and reopened, a version-1
file opening without one, copied as a 4×4 or a pose line, applied from a decoded pose, and judged by the
Check panel.

Check values: 1 mm = 1e-3 m (SI brochure); the 4×4 copy against numpy and SciPy's Rotation (a
general-purpose reference library); CONVENTIONS.md "Poses" for [[R, t], [0 0 0 1]]."""

import dataclasses
import json

import numpy as np
import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QGuiApplication

from app.panels import decode_panel
from core import operations
from core.decode import decode
from core.position import Position
from core.session import FORMAT_NAME
from tests.app.window_driver import focus, leave_editor, scipy_rotation, type_into


def _type_position(qtbot, window, x, y, z, enter=True):
    editor = window.position
    for field, text in zip(editor.fields, (x, y, z)):
        type_into(qtbot, field, text)
    if enter:
        qtbot.keyClick(editor.fields[2].lineEdit(), Qt.Key.Key_Return)


def _ctrl_z(qtbot, window):
    focus(qtbot, window.mounts.list)
    qtbot.keyClick(window.mounts.list, Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)


def test_a_typed_position_is_kept_in_metres_and_one_ctrl_z_takes_it_back(qtbot, window):
    assert window.model.current_mount().position is None
    assert [f.lineEdit().placeholderText() for f in window.position.fields] == ["none"] * 3
    steps = window.model.undo_stack.count()
    _type_position(qtbot, window, "125.5", "-40.25", "812")
    position = window.model.current_mount().position
    assert position.unit == "mm"
    assert position.metres == pytest.approx((0.1255, -0.04025, 0.812), abs=1e-15)   # 1 mm = 1e-3 m
    assert window.model.undo_stack.count() == steps + 1                             # one undo step
    assert [f.text() for f in window.position.fields] == ["125.5", "-40.25", "812"]
    _ctrl_z(qtbot, window)
    assert window.model.current_mount().position is None
    assert [f.text() for f in window.position.fields] == ["", "", ""]


def test_half_typed_numbers_are_not_sent_until_enter(qtbot, window):
    _type_position(qtbot, window, "1", "2", "3", enter=False)
    assert window.model.current_mount().position is None       # typing alone commits nothing
    leave_editor(qtbot, window)                                 # leaving the fields commits
    assert window.model.current_mount().position.shown() == pytest.approx((1.0, 2.0, 3.0))


@pytest.mark.parametrize("text, words", [("nan", "not a finite number"), ("1e308", "farther than 1e+06 m"),
                                         ("abc", "is not a number"), ("1,5", "use '.' as the decimal point")])
def test_hostile_text_is_refused_with_a_visible_note_and_the_last_position_stays(qtbot, window, text, words):
    _type_position(qtbot, window, "10", "20", "30")
    good = window.model.current_mount().position
    steps = window.model.undo_stack.count()
    type_into(qtbot, window.position.fields[1], text)
    qtbot.keyClick(window.position.fields[1].lineEdit(), Qt.Key.Key_Return)
    leave_editor(qtbot, window)
    assert window.model.current_mount().position == good
    assert window.model.undo_stack.count() == steps
    assert words in window.position.note.text() and window.position.note.isVisible()
    assert window.position.fields[1].problem is not None       # the red frame on the bad field


def test_one_empty_field_is_refused_and_all_three_empty_clear_the_position(qtbot, window):
    _type_position(qtbot, window, "10", "20", "30")
    type_into(qtbot, window.position.fields[0], "")
    qtbot.keyClick(window.position.fields[0].lineEdit(), Qt.Key.Key_Delete)
    qtbot.keyClick(window.position.fields[0].lineEdit(), Qt.Key.Key_Return)
    assert "type all three" in window.position.note.text()
    assert window.model.current_mount().position is not None
    for field in window.position.fields:
        type_into(qtbot, field, "x")
        qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Backspace)
    qtbot.keyClick(window.position.fields[2].lineEdit(), Qt.Key.Key_Return)
    assert window.model.current_mount().position is None


def test_the_unit_box_shows_the_same_place_in_metres(qtbot, window):
    _type_position(qtbot, window, "1500", "0", "-250")
    box = window.position.unit_box
    focus(qtbot, box)
    qtbot.keyClick(box, Qt.Key.Key_Down)        # mm -> m
    position = window.model.current_mount().position
    assert position.unit == "m" and position.metres == pytest.approx((1.5, 0.0, -0.25))
    assert [f.text() for f in window.position.fields] == ["1.5", "0", "-0.25"]


def test_a_session_with_a_position_saves_and_reopens(qtbot, window, tmp_path):
    _type_position(qtbot, window, "125.5", "-40.25", "812")
    path = tmp_path / "with-position.fwsession.json"
    assert window.save_file_as(str(path))
    assert json.loads(path.read_text())["version"] == 2
    window.new_session()
    assert window.model.current_mount().position is None
    assert window.open_file(str(path))
    assert window.model.current_mount().position.shown() == pytest.approx((125.5, -40.25, 812.0))
    assert [f.text() for f in window.position.fields] == ["125.5", "-40.25", "812"]


def test_a_version_1_file_opens_without_a_position(qtbot, window, tmp_path):
    path = tmp_path / "old.fwsession.json"
    path.write_text(json.dumps({"format": FORMAT_NAME, "version": 1, "mounts": [
        {"name": "old mount", "orientation": {"quaternion_wxyz": [1, 0, 0, 0]}}]}))
    assert window.open_file(str(path))
    assert window.model.current_mount().name == "old mount"
    assert [f.text() for f in window.position.fields] == ["", "", ""]
    assert not window.copy_as_actions["pose-matrix"].isEnabled()


def test_copy_as_offers_the_pose_formats_only_with_a_position_and_verifies_them(qtbot, window):
    assert not window.copy_as_actions["pose-matrix"].isEnabled()
    _type_position(qtbot, window, "125.5", "-40.25", "812")
    assert window.copy_as_actions["pose-matrix"].isEnabled() and window.copy_as_actions["pose-line"].isEnabled()
    window.copy_as_actions["pose-matrix"].trigger()
    assert "verified" in window.statusBar().currentMessage()
    text = QGuiApplication.clipboard().text()
    h = np.array([[float(v) for v in line.split()] for line in text.splitlines()[1:]])
    # numpy and SciPy: [[R, t], [0 0 0 1]] with R from SciPy's view of the orientation, t in mm.
    np.testing.assert_allclose(h[:3, :3], scipy_rotation(window.model.current_orientation()).as_matrix(), atol=1e-12)
    np.testing.assert_allclose(h[:3, 3], (125.5, -40.25, 812.0), atol=1e-12)
    np.testing.assert_array_equal(h[3], (0, 0, 0, 1))
    window.copy_as_actions["pose-line"].trigger()
    assert "verified" in window.statusBar().currentMessage()
    assert QGuiApplication.clipboard().text().splitlines()[2].startswith("125.5, -40.25, 812.0, ")


def _readings_with_translation(translation, unit):
    """Real readings of a quaternion's text carrying a translation in a unit the decoder never gives (it
    names only mm, cm and m): the panel's defence against a unit it cannot convert."""
    def decode_with_translation(text):
        return [dataclasses.replace(r, translation=translation, translation_unit=unit) for r in decode(text)]
    return decode_with_translation


def _read_in_decode(qtbot, window, text):
    panel = window.decode_panel
    window.side_tabs.setCurrentWidget(panel)
    focus(qtbot, panel.paste_box)
    qtbot.keyClicks(panel.paste_box, text)
    qtbot.mouseClick(panel.read_button, Qt.MouseButton.LeftButton)
    return panel


# A transform-argument list (x y z qx qy qz qw parent child) says no unit; a header with x_m columns does.
NO_UNIT = "0.1 0.2 0.3 0 0 0.7071068 0.7071068 base_link imu"
IN_METRES = "pose [x_m, y_m, z_m, qx, qy, qz, qw] = [1.5, -2.0, 0.25, 0, 0, 0.7071068, 0.7071068]"


def test_a_decoded_translation_without_a_unit_waits_for_the_user_to_choose_one(qtbot, window):
    panel = _read_in_decode(qtbot, window, NO_UNIT)
    assert panel.unit_row.isVisible() and "gives no unit" in panel.unit_label.text()
    assert not panel.apply_button.isEnabled()        # nothing is guessed
    focus(qtbot, panel.unit_box)
    qtbot.keyClick(panel.unit_box, Qt.Key.Key_Down)  # "read it as mm"
    assert panel.unit_box.currentData() == "mm" and panel.apply_button.isEnabled()
    steps = window.model.undo_stack.count()
    qtbot.mouseClick(panel.apply_button, Qt.MouseButton.LeftButton)
    position = window.model.current_mount().position
    assert position.unit == "mm" and position.metres == pytest.approx((1e-4, 2e-4, 3e-4), abs=1e-18)
    assert "read as mm (you chose it: the text gives no unit)" in panel.message.text()
    assert window.model.undo_stack.count() == steps + 1      # orientation and position: one step
    _ctrl_z(qtbot, window)
    assert window.model.current_mount().position is None


def test_a_decoded_translation_with_a_unit_is_converted_to_metres(qtbot, window):
    panel = _read_in_decode(qtbot, window, IN_METRES)
    assert not panel.unit_row.isVisible() and panel.apply_button.isEnabled()
    qtbot.mouseClick(panel.apply_button, Qt.MouseButton.LeftButton)
    position = window.model.current_mount().position
    assert position.unit == "m" and position.metres == pytest.approx((1.5, -2.0, 0.25))
    assert "in m, as the text says" in panel.message.text()


def test_a_decoded_translation_in_an_unknown_unit_applies_nothing(qtbot, window, monkeypatch):
    before = window.model.current_mount()
    monkeypatch.setattr(decode_panel, "_decode_or_error", _readings_with_translation((1.0, 2.0, 3.0), "furlong"))
    panel = _read_in_decode(qtbot, window, "quaternion w x y z: 0.7071068, 0, 0, 0.7071068")
    qtbot.mouseClick(panel.apply_button, Qt.MouseButton.LeftButton)
    assert window.model.current_mount() == before
    assert "Not applied" in panel.message.text() and "furlong" in panel.message.text()


def test_the_check_reports_the_position_offset_after_the_orientation(qtbot, window):
    model = window.model
    nominal, measured = model.mounts[0], model.mounts[1]
    model.set_position(Position.from_shown((100.0, 0.0, 0.0), "mm"), index=0)
    model.set_position(Position.from_shown((100.3, 0.4, 0.0), "mm"), index=1)
    from core.session import SavedCheck
    model.apply(operations.set_check, SavedCheck(nominal=nominal.name, measured=measured.name))
    panel = window.check_panel
    window.side_tabs.setCurrentIndex(2)
    assert "not judged" in panel.position_result.text()
    type_into(qtbot, panel.position_field, "0.4")
    qtbot.keyClick(panel.position_field.lineEdit(), Qt.Key.Key_Return)
    assert model.check.settings.position_tolerance_mm == 0.4
    text = panel.position_result.text()
    assert text.startswith("Position FAIL: offset 0.500 mm exceeds 0.400 mm"), text
    type_into(qtbot, panel.position_field, "nan")
    qtbot.keyClick(panel.position_field.lineEdit(), Qt.Key.Key_Return)
    assert model.check.settings.position_tolerance_mm == 0.4
    assert "not a finite number" in panel.tolerance_note.text()


def test_a_chain_step_from_the_editors_keeps_the_mounts_position_and_the_product_is_the_rigid_transform(qtbot,
                                                                                                        window):
    # issue 11 item 6: the Chain composes full rigid transforms; a step taken from the editors of a mount
    # with a position keeps it. Check value: numpy's product of the two 4x4 matrices [[R, t], [0 0 0 1]]
    # (CONVENTIONS.md "Poses"), the rotations from SciPy's Rotation.
    panel = window.chain_panel
    window.side_tabs.setCurrentIndex(window.side_tabs.indexOf(panel.parent().parent()))
    first = window.model.current_mount()
    window.model.set_orientation(first.orientation.from_rotation_vector([0, 0, 90], degrees=True))
    _type_position(qtbot, window, "100", "0", "50")
    qtbot.mouseClick(panel.add_from_editors, Qt.MouseButton.LeftButton)
    window.model.set_orientation(first.orientation.from_rotation_vector([90, 0, 0], degrees=True))
    _type_position(qtbot, window, "0", "20", "0")
    qtbot.mouseClick(panel.add_from_editors, Qt.MouseButton.LeftButton)
    steps = window.model.chain.steps
    assert [s.position.shown() for s in steps] == [pytest.approx((100, 0, 50)), pytest.approx((0, 20, 0))]
    assert "origin x 100, y 0, z 50 mm" in panel.table.item(0, 3).text()

    def pose(rotvec_deg, t_mm):
        m = np.eye(4)
        m[:3, :3] = scipy_rotation_from_rotvec(rotvec_deg)
        m[:3, 3] = np.array(t_mm) / 1000.0
        return m

    expected = pose([0, 0, 90], [100, 0, 50]) @ pose([90, 0, 0], [0, 20, 0])
    orientation, position = window.model.chain.pose_product()
    np.testing.assert_allclose(orientation.as_matrix(), expected[:3, :3], atol=1e-12)
    np.testing.assert_allclose(position.metres, expected[:3, 3], atol=1e-12)
    assert "Product position" in panel.product_label.text()
    # 'Set from the text' changes the orientation only: the step keeps its position
    panel.select_row(0)
    panel.pasted.text_box.setFocus()
    qtbot.keyClicks(panel.pasted.text_box, "axis 0 0 1 angle 45")
    qtbot.mouseClick(panel.set_from_text, Qt.MouseButton.LeftButton)
    assert window.model.chain.steps[0].position.shown() == pytest.approx((100, 0, 50))


def scipy_rotation_from_rotvec(rotvec_deg):
    from scipy.spatial.transform import Rotation
    return Rotation.from_rotvec(rotvec_deg, degrees=True).as_matrix()             # SciPy from_rotvec
