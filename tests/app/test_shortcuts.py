"""Undo and redo from any field reach the model's undo stack (not the line edit's own history), and redo
answers both Ctrl+Shift+Z and Ctrl+Y — driven by key events while a number field has focus."""

import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QApplication

from tests.app.window_driver import type_into

CTRL = Qt.KeyboardModifier.ControlModifier
CTRL_SHIFT = Qt.KeyboardModifier.ControlModifier | Qt.KeyboardModifier.ShiftModifier


def commit(qtbot, field, text):
    type_into(qtbot, field, text)
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Return)


def third_angle(window):
    return window.model.current_orientation().as_angles("ZYX", degrees=True).angles[2]


@pytest.mark.parametrize("redo_key, redo_modifiers", [(Qt.Key.Key_Z, CTRL_SHIFT), (Qt.Key.Key_Y, CTRL)])
def test_undo_and_redo_from_a_focused_field_reach_the_model(qtbot, window, redo_key, redo_modifiers):
    model = window.model
    start = third_angle(window)
    field = window.angles.fields[2]
    commit(qtbot, field, "12.5")
    assert third_angle(window) == pytest.approx(12.5, abs=1e-9)
    line = field.lineEdit()
    assert QApplication.focusWidget() in (line, field)  # still in the field, as after typing
    qtbot.keyClick(line, Qt.Key.Key_Z, CTRL)
    assert third_angle(window) == pytest.approx(start, abs=1e-9)
    assert float(field.text()) == pytest.approx(start, abs=1e-6)   # the field shows the model again
    assert model.undo_stack.index() == 0
    qtbot.keyClick(line, redo_key, redo_modifiers)
    assert third_angle(window) == pytest.approx(12.5, abs=1e-9)
    assert field.text() == "12.5"


def test_undo_from_a_field_of_another_editor_and_from_a_tolerance_field(qtbot, window):
    model = window.model
    before = model.current_orientation()
    commit(qtbot, window.angles.fields[0], "33")
    after = model.current_orientation()
    quaternion_field = window.quaternion.fields[0]
    type_into(qtbot, quaternion_field, "")
    qtbot.keyClick(quaternion_field.lineEdit(), Qt.Key.Key_Z, CTRL)
    assert model.current_orientation() == before
    tolerance = window.check_panel.total_field
    window.side_tabs.setCurrentIndex(window.side_tabs.indexOf(window.check_panel.parentWidget().parentWidget()))
    type_into(qtbot, tolerance, "")
    qtbot.keyClick(tolerance.lineEdit(), Qt.Key.Key_Y, CTRL)
    assert model.current_orientation() == after


def test_undo_while_typing_undoes_the_typing_run_not_the_last_keystroke(qtbot, window):
    field = window.angles.fields[1]
    before_text = field.text()
    before = window.model.current_orientation()
    type_into(qtbot, field, "45")
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Z, CTRL)
    # the line edit's own history would leave "4"; the model's undo takes back the whole run
    assert window.model.current_orientation() == before
    assert field.text() == before_text and window.model.undo_stack.index() == 0
