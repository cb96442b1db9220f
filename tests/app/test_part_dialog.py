"""The part of a mount: editable box size, face names and boresight face, one undo step, drawn by the
Scene; bad text keeps the dialog open, says which field, and changes nothing."""

import pytest
from PySide6.QtCore import Qt

from app.part_dialog import PartDialog


def retype(qtbot, field, text):
    field.selectAll()
    qtbot.keyClicks(field, text)


def test_typed_part_changes_the_mount_and_the_scene_in_one_undo_step(qtbot, window):
    model = window.model
    before = model.current_mount().part
    steps = model.undo_stack.count()
    dialog = PartDialog(model, window)
    qtbot.addWidget(dialog)
    dialog.show()
    qtbot.waitExposed(dialog)
    for field, text in zip(dialog.size_fields, ("150", "90.5", "40")):
        retype(qtbot, field, text)
    retype(qtbot, dialog.name_fields["+Y"], "mounting tab")
    dialog.boresight_box.setCurrentIndex(dialog.boresight_box.findData("+Y"))
    qtbot.keyClick(dialog.name_fields["+Y"], Qt.Key.Key_Return)   # Enter presses OK
    part = model.current_mount().part
    assert part.box_size_mm == (150.0, 90.5, 40.0)
    assert part.face_names["+Y"] == "mounting tab" and part.boresight == "+Y"
    assert model.undo_stack.count() == steps + 1
    assert window.scene.part.boresight_face == "+Y"                 # the Scene follows the model
    model.undo()
    assert model.current_mount().part == before


@pytest.mark.parametrize("text, words", [("1,5", "decimal point"), ("-3", "positive"), ("", "empty")])
def test_bad_size_says_which_field_and_changes_nothing(qtbot, window, text, words):
    model = window.model
    before = model.current_mount().part
    dialog = PartDialog(model, window)
    qtbot.addWidget(dialog)
    retype(qtbot, dialog.size_fields[1], text)
    if not text:
        dialog.size_fields[1].clear()
    dialog.apply()
    assert words in dialog.message.text() and "nothing was changed" in dialog.message.text()
    assert model.current_mount().part == before and dialog.result() == 0
