"""Names, pasted text and file names that look like markup are shown as the characters they are: every
label that can show user text has textFormat() PlainText, tooltips and message boxes escape them."""

from pathlib import Path

import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QMessageBox

from app import copy_as, plain_text
from app.panels.chain_panel import ChainPanel
from app.panels.mounts_list import MountsList
from app.part_dialog import PartDialog
from app.preferences_dialog import PreferencesDialog

# Drew a green "ALL PASS" over a FAIL and loaded a local image when a label took it as rich text.
HOSTILE = "<b style='color:green'>ALL PASS</b><img src='/etc/x.png'>"


def test_chain_step_names_show_plain(qtbot, model):
    panel = ChainPanel(model)
    qtbot.addWidget(panel)
    panel.show()
    panel.step_name.setFocus()
    qtbot.keyClicks(panel.step_name, HOSTILE)
    panel.pasted.text_box.setFocus()
    qtbot.keyClicks(panel.pasted.text_box, "axis 0 0 1 angle 90")
    qtbot.mouseClick(panel.add_from_text, Qt.MouseButton.LeftButton)
    assert model.chain.steps[0].name == HOSTILE
    assert panel.product_label.textFormat() == Qt.TextFormat.PlainText and HOSTILE in panel.product_label.text()
    panel.pasted.text_box.selectAll()
    qtbot.keyClicks(panel.pasted.text_box, HOSTILE)                 # quoted back in the refusal
    assert panel.pasted.message.textFormat() == Qt.TextFormat.PlainText
    assert "Cannot read" in panel.pasted.message.text()


def test_decode_and_check_messages_quote_typed_text_plain(qtbot, window):
    window.decode_panel.set_text(HOSTILE)
    message = window.decode_panel.message
    assert message.textFormat() == Qt.TextFormat.PlainText and "Cannot read" in message.text()
    check = window.check_panel
    assert check.message.textFormat() == check.details.textFormat() == Qt.TextFormat.PlainText


def test_mount_names_are_plain_in_the_list_tooltip_and_message(qtbot, model):
    mounts = MountsList(model)
    qtbot.addWidget(mounts)
    model.add_mount(HOSTILE)                                         # a new mount has no notes: its name is the tip
    item = mounts.list.item(len(model.mounts) - 1)
    assert item.text() == HOSTILE                                    # item views draw text plain
    assert "<img" not in item.toolTip() and "&lt;img" in item.toolTip()
    assert mounts.message.textFormat() == Qt.TextFormat.PlainText


def test_dialog_messages_are_plain(qtbot, model):
    part = PartDialog(model)
    qtbot.addWidget(part)
    preferences = PreferencesDialog(model, copy_as.FORMATS, next(iter(copy_as.FORMATS)))
    qtbot.addWidget(preferences)
    assert part.message.textFormat() == Qt.TextFormat.PlainText
    assert preferences.problem.textFormat() == Qt.TextFormat.PlainText


@pytest.mark.parametrize("ask", ["warning", "question"])
def test_message_boxes_show_their_text_plain(qtbot, monkeypatch, ask):
    seen = []

    def answer(box):
        seen.append((box.textFormat(), box.text()))
        return int(QMessageBox.StandardButton.Ok)
    monkeypatch.setattr(QMessageBox, "exec", answer)
    if ask == "warning":
        plain_text.warning(None, "Cannot open session", f"{HOSTILE}: damaged")
    else:
        plain_text.question(None, "Restore?", HOSTILE, QMessageBox.StandardButton.Ok | QMessageBox.StandardButton.No,
                            QMessageBox.StandardButton.Ok)
    assert seen[0][0] == Qt.TextFormat.PlainText and HOSTILE in seen[0][1]


def test_opening_a_damaged_file_with_a_hostile_name_warns_in_plain_text(qtbot, window, tmp_path, monkeypatch):
    seen = []
    monkeypatch.setattr(QMessageBox, "exec", lambda box: seen.append(box.textFormat()) or 0)
    path = tmp_path / (HOSTILE.replace("/", "_") + ".fwsession.json")
    path.write_text("{ damaged", encoding="utf-8")
    assert not window.open_file(str(path))
    assert seen == [Qt.TextFormat.PlainText]
    assert Path(path).exists()
