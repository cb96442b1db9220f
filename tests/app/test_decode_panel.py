"""Decode panel: pasted text becomes ranked readings; choosing one applies it to every editor, undoably;
Ctrl+V outside a text field pastes into the panel."""

import numpy as np
from PySide6.QtCore import QPoint, Qt
from PySide6.QtGui import QGuiApplication
from scipy.spatial.transform import Rotation

from tests.app.window_driver import assert_editors_agree, focus

# Four decimals as on a drawing; rows of a reference -> body matrix. The numbers are cos/sin of 12°
# rounded (from memory: cos 12° = 0.97815, sin 12° = 0.20791).
DRAWING = """0.0000  0.9781 -0.2079
-1.0000  0.0000  0.0000
0.0000  0.2079  0.9781"""


def _reading_rows(window):
    return [window.decode_panel.list.item(i).text() for i in range(window.decode_panel.list.count())]


def test_pasted_matrix_lists_both_meanings_and_applying_one_updates_every_editor(qtbot, window):
    window.model.set_preferences(significant_digits=15)
    panel = window.decode_panel
    focus(qtbot, panel.paste_box)
    for i, line in enumerate(DRAWING.splitlines()):
        if i:
            qtbot.keyClick(panel.paste_box, Qt.Key.Key_Return)
        qtbot.keyClicks(panel.paste_box, line)
    assert panel.paste_box.toPlainText() == DRAWING
    qtbot.mouseClick(panel.read_button, Qt.MouseButton.LeftButton)
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
