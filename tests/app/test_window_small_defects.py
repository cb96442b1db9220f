"""Small defects a technician meets with mouse and keyboard: the Chain step form stays put while steps
are added, a duplicated mount does not carry the original's note (with the original's angles), and the
lock note does not contradict the field being typed in."""

from PySide6.QtCore import QPoint, Qt

from tests.app.window_driver import type_into


def test_the_chain_step_form_does_not_move_when_steps_are_added(qtbot, window):
    window.resize(1280, 800)
    qtbot.waitUntil(lambda: window.height() == 800, timeout=3000)
    panel = window.chain_panel
    window.side_tabs.setCurrentIndex(window.side_tabs.indexOf(panel.parentWidget().parentWidget()))
    qtbot.wait(50)

    def form_position():
        return [b.mapTo(window, QPoint(0, 0)) for b in (panel.add_from_editors, panel.add_from_text, panel.pasted)]

    before = form_position()
    for _ in range(3):
        qtbot.mouseClick(panel.add_from_editors, Qt.MouseButton.LeftButton)
        qtbot.wait(20)
        assert form_position() == before   # the next click lands where the last one did
    assert len(window.model.chain.steps) == 3


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
