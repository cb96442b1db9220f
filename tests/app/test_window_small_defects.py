"""Small defects a technician meets with mouse and keyboard: the Chain step form stays put while steps
are added, a duplicated mount does not carry the original's note (with the original's angles), and the
lock note does not contradict the field being typed in."""

from PySide6.QtCore import QPoint, Qt

from tests.app.window_driver import type_into


def test_a_duplicated_mount_names_its_original_instead_of_copying_its_note(qtbot, window):
    model = window.model
    original = model.current_mount()
    assert "yaw, pitch, roll" in original.notes          # the demo's note states the angles
    qtbot.mouseClick(window.mounts.duplicate_button, Qt.MouseButton.LeftButton)
    copy = model.current_mount()
    assert copy.name != original.name and copy.orientation == original.orientation
    assert original.name in copy.notes and "yaw, pitch, roll" not in copy.notes
    assert model.mounts[model.selected_index - 1].notes == original.notes   # the original keeps its own


def test_the_lock_note_does_not_say_roll_is_shown_as_0_while_the_field_shows_10(qtbot, window):
    fields = window.angles.fields
    for field, text in zip(fields, ("30", "90", "10")):
        type_into(qtbot, field, text)
    assert fields[2].text() == "10"                     # the user's spelling, until they leave
    note = window.meter.lock_label.text()
    assert "Gimbal lock" in note and "shown as 0" not in note


def test_file_new_starts_an_empty_session_after_asking_about_unsaved_changes(qtbot, window, monkeypatch):
    from PySide6.QtWidgets import QMessageBox

    model = window.model
    type_into(qtbot, window.angles.fields[0], "33")
    qtbot.keyClick(window.angles.fields[0].lineEdit(), Qt.Key.Key_Return)
    before = model.session()
    asked = []
    monkeypatch.setattr(QMessageBox, "question",
                        lambda *a, **k: asked.append(a[2]) or QMessageBox.StandardButton.Cancel)
    window.new_action.trigger()
    assert asked and model.session() == before          # cancelled: nothing changed
    monkeypatch.setattr(QMessageBox, "question", lambda *a, **k: QMessageBox.StandardButton.Discard)
    window.new_action.trigger()
    assert len(model.mounts) == 1 and model.file_path is None
    assert model.words_preset == before.reference_frame  # the frame's names stay (the demo's NED)
    assert model.undo_stack.count() == 0 and model.undo_stack.isClean()
    assert window.new_action.shortcut().toString() == "Ctrl+N"
