"""The window as a whole: preferences and geometry survive closing and reopening, the Mounts list, files,
standard shortcuts and the About box."""

import configparser

import pytest
from PySide6.QtCore import QPoint, QRect, QSettings, Qt
from PySide6.QtGui import QKeySequence
from PySide6.QtWidgets import QApplication, QLineEdit

from app import about, plain_text, settings, window as window_module
from core.session import load_session
from tests.app.window_driver import focus


def _reopen(qtbot, win):
    win.model.undo_stack.setClean()
    win.close()
    new = window_module.make_window()
    new.show()
    qtbot.waitExposed(new)
    return new


def test_preferences_survive_closing_and_reopening_the_window(qtbot, window, isolated_settings):
    window.units_box.setCurrentIndex(1)
    window.units_box.activated.emit(1)
    box = window.quaternion.order_box
    box.setCurrentIndex(1)
    box.activated.emit(1)
    qtbot.mouseClick(window.matrix.meaning_buttons["reference_to_body"], Qt.MouseButton.LeftButton,
                     pos=QPoint(6, 8))
    seq = window.angles.sequence_box
    seq.setCurrentIndex(seq.findData("YXZ"))
    seq.activated.emit(seq.currentIndex())
    window.angles.kind_box.setCurrentIndex(1)
    window.angles.kind_box.activated.emit(1)
    window.digits_box.setValue(7)
    again = _reopen(qtbot, window)
    try:
        prefs = again.model.preferences
        assert (prefs.angle_units, prefs.quaternion_order, prefs.matrix_meaning, prefs.sequence,
                prefs.intrinsic, prefs.significant_digits) == ("rad", "xyzw", "reference_to_body", "YXZ", False, 7)
        assert again.quaternion.labels[0].text() == "x"
        assert again.units_box.currentData() == "rad"
        # the settings went to the test's own folder, never the user's
        files = list(isolated_settings.rglob("*.ini"))
        assert files and "YXZ" in files[0].read_text()
    finally:
        again.close()


def test_window_geometry_is_restored(qtbot, window):
    window.resize(1500, 930)
    qtbot.wait(20)
    again = _reopen(qtbot, window)
    try:
        assert (again.width(), again.height()) == (1500, 930)
    finally:
        again.close()


def test_damaged_settings_fall_back_to_defaults_one_by_one(isolated_settings, qapp):
    store = settings.open_settings()
    store.setValue("preferences/sequence", "QQQ")
    store.setValue("preferences/significant_digits", "lots")
    store.setValue("preferences/quaternion_order", "xyzw")
    store.sync()
    prefs = settings.load_preferences()
    assert prefs.sequence == "ZYX" and prefs.significant_digits == 9 and prefs.quaternion_order == "xyzw"


def test_mounts_list_add_duplicate_rename_delete_by_clicks_and_undo(qtbot, window):
    names = [m.name for m in window.model.mounts]
    panel = window.mounts
    qtbot.mouseClick(panel.add_button, Qt.MouseButton.LeftButton)
    assert window.mounts.list.count() == len(names) + 1
    qtbot.mouseClick(panel.duplicate_button, Qt.MouseButton.LeftButton)
    assert window.mounts.list.count() == len(names) + 2
    assert window.model.current_mount().name.endswith("copy")
    qtbot.mouseClick(panel.rename_button, Qt.MouseButton.LeftButton)
    qtbot.waitUntil(lambda: panel.list.findChild(QLineEdit) is not None, timeout=2000)
    line = panel.list.findChild(QLineEdit)
    line.selectAll()
    qtbot.keyClicks(line, "Spare bracket")
    qtbot.keyClick(line, Qt.Key.Key_Return)
    qtbot.waitUntil(lambda: window.model.current_mount().name == "Spare bracket", timeout=2000)
    qtbot.mouseClick(panel.delete_button, Qt.MouseButton.LeftButton)
    assert "Spare bracket" not in [m.name for m in window.model.mounts]
    focus(qtbot, panel.list)
    for _ in range(4):
        qtbot.keyClick(window, Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)
    assert [m.name for m in window.model.mounts] == names
    assert [panel.list.item(i).text() for i in range(panel.list.count())] == names


def test_clicking_a_mount_shows_its_orientation_everywhere(qtbot, window):
    panel = window.mounts
    rect = panel.list.visualItemRect(panel.list.item(4))
    qtbot.mouseClick(panel.list.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    assert window.model.selected_index == 4
    expected = window.model.mounts[4].orientation.as_angles("ZYX").angles
    assert [float(f.text()) for f in window.angles.fields] == pytest.approx(list(expected), abs=1e-6)


def test_save_and_open_a_session_file(qtbot, window, tmp_path):
    from core.orientation import Orientation

    window.model.set_orientation(Orientation.from_axis_angle((0, 1, 0), 33))
    path = tmp_path / "rig.fwsession.json"
    assert window.save_file_as(str(path))
    assert window.model.undo_stack.isClean()
    loaded = load_session(path)
    assert loaded.mounts[window.model.selected_index].orientation == window.model.current_orientation()
    window.model.add_mount("temporary")
    window.model.undo_stack.setClean()
    assert window.open_file(str(path))
    assert "temporary" not in [m.name for m in window.model.mounts]


def test_opening_a_foreign_file_says_why_and_keeps_the_session(qtbot, window, tmp_path, monkeypatch):
    shown = []
    monkeypatch.setattr(plain_text, "warning", lambda *args: shown.append(args[2]))
    path = tmp_path / "other.json"
    path.write_text('{"format": "something else", "version": 1}')
    names = [m.name for m in window.model.mounts]
    assert not window.open_file(str(path))
    assert shown and "not a Framewright session" in shown[0]
    assert [m.name for m in window.model.mounts] == names


def test_standard_shortcuts(window):
    keys = QKeySequence.StandardKey
    for action, key in ((window.undo_action, keys.Undo), (window.redo_action, keys.Redo),
                        (window.copy_action, keys.Copy), (window.paste_action, keys.Paste),
                        (window.open_action, keys.Open), (window.save_action, keys.Save),
                        (window.quit_action, keys.Quit)):
        assert action.shortcut() == QKeySequence(key)
    assert window.copy_again_action.shortcut() == QKeySequence("Ctrl+Shift+C")


def test_about_box_has_version_license_and_caution():
    text = about.about_text()
    assert about.version() in text and "MIT" in text
    assert "qualified personnel" in text and "governing drawing" in text


def test_layout_has_every_part_with_plain_labels(window):
    titles = [window.mounts.title(), window.axis_angle.title(), window.quaternion.title(), window.matrix.title(),
              window.angles.title(), window.meter.title()]
    assert titles == ["Mounts", "Axis && angle", "Quaternion", "Matrix", "Angles", "Gimbal margin"]
    tabs = [window.side_tabs.tabText(i) for i in range(window.side_tabs.count())]
    assert tabs == ["Decode", "Chain", "Check", "Adjust", "Level", "Measure", "Batch"]   # DESIGN.md's panels
    from app.scene.scene_widget import SceneWidget
    assert isinstance(window.scene, SceneWidget)
    # Fits a 1600-pixel-wide screen (the narrow side of a common desktop monitor and our Xvfb).
    assert window.minimumSizeHint().width() <= 1600


def test_demo_session_says_it_is_invented(window):
    assert "invented" in window.model.session().description.lower()
    assert len(window.model.mounts) >= 3



def test_renaming_a_mount_to_nothing_keeps_the_name_and_says_why(qtbot, window):
    panel = window.mounts
    before = window.model.current_mount().name
    qtbot.mouseClick(panel.rename_button, Qt.MouseButton.LeftButton)
    qtbot.waitUntil(lambda: panel.list.findChild(QLineEdit) is not None, timeout=2000)
    line = panel.list.findChild(QLineEdit)
    line.selectAll()
    qtbot.keyClick(line, Qt.Key.Key_Delete)
    qtbot.keyClick(line, Qt.Key.Key_Return)
    qtbot.waitUntil(lambda: panel.message.text() != "", timeout=2000)
    assert "needs a name" in panel.message.text()
    assert window.model.current_mount().name == before
