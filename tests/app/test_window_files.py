"""File ▸ Open of a damaged file and a save that fails, as a user meets them: one plain-text message box
(answered by the test when it appears, so nothing hangs), the session kept, the work kept in memory and in
the recovery file."""

import errno
import os

from PySide6.QtCore import Qt, QTimer
from PySide6.QtWidgets import QApplication, QFileDialog, QMessageBox

from core.orientation import Orientation
from core.session import load_session
from tests.app.window_driver import focus


def answer_message_box(qtbot, seen, tries=250):
    """Click OK on the next message box once it shows, recording its title, text and text format."""
    def poll(left=tries):
        box = QApplication.activeModalWidget()
        if isinstance(box, QMessageBox):
            seen.append((box.windowTitle(), box.text(), box.textFormat()))
            qtbot.mouseClick(box.button(QMessageBox.StandardButton.Ok), Qt.MouseButton.LeftButton)
        elif left:
            QTimer.singleShot(20, lambda: poll(left - 1))
    QTimer.singleShot(0, poll)


def test_file_open_of_a_damaged_file_shows_one_message_and_keeps_the_session(qtbot, window, tmp_path,
                                                                            monkeypatch):
    path = tmp_path / "damaged.fwsession.json"
    path.write_text('{"format": "framewright-session", "version": 1, "mounts": [{"name": "<b>x</b>", '
                    '"orientation": {"quaternion_wxyz": [1, 0, 0, 0]}, "part": {"box_size_mm": [1, 5e-324, 1]}}]}')
    monkeypatch.setattr(QFileDialog, "getOpenFileName", lambda *a, **k: (str(path), ""))
    before = window.model.session()
    seen = []
    answer_message_box(qtbot, seen)
    focus(qtbot, window.mounts.list)
    qtbot.keyClick(window, Qt.Key.Key_O, Qt.KeyboardModifier.ControlModifier)     # File ▸ Open
    qtbot.waitUntil(lambda: len(seen) > 0, timeout=5000)
    assert len(seen) == 1
    title, text, text_format = seen[0]
    assert title == "Cannot open session" and text_format == Qt.TextFormat.PlainText
    assert "mounts[0].part.box_size_mm[1]" in text and "unchanged" in text
    assert window.model.session() == before
    assert "Not opened" in window.statusBar().currentMessage()


def test_a_save_that_fails_says_why_and_keeps_the_work_here_and_in_the_recovery_file(qtbot, window, tmp_path,
                                                                                    monkeypatch):
    path = tmp_path / "rig.fwsession.json"
    assert window.save_file_as(str(path))
    before = path.read_bytes()
    window.model.set_orientation(Orientation.from_axis_angle((0, 1, 0), 21))
    edited = window.model.session()
    real_write = os.write

    def full_disk(fd, data):
        if os.readlink(f"/proc/self/fd/{fd}").startswith(str(tmp_path)):
            raise OSError(errno.ENOSPC, "No space left on device")
        return real_write(fd, data)

    monkeypatch.setattr(os, "write", full_disk)      # the session's folder is full; the recovery folder not
    seen = []
    answer_message_box(qtbot, seen)
    focus(qtbot, window.mounts.list)
    qtbot.keyClick(window, Qt.Key.Key_S, Qt.KeyboardModifier.ControlModifier)     # File ▸ Save
    qtbot.waitUntil(lambda: len(seen) > 0, timeout=5000)
    title, text, _ = seen[0]
    assert title == "Cannot save session" and "No space left on device" in text
    assert "in the recovery file" in text
    assert path.read_bytes() == before and [p.name for p in tmp_path.iterdir() if p.name.startswith(".")] == []
    assert not window.model.undo_stack.isClean() and "(changed)" in window.windowTitle()
    assert window.model.session() == edited
    kept = load_session(window.recovery.path)
    assert kept.mounts[window.model.selected_index].orientation == edited.mounts[edited.selected].orientation


def test_an_autosave_that_fails_says_so_in_the_status_bar(qtbot, window, monkeypatch):
    monkeypatch.setattr(os, "fsync", lambda fd: (_ for _ in ()).throw(OSError(errno.EIO, "Input/output error")))
    window.model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 3))
    assert not window.recovery.write_now()
    assert "Autosave failed" in window.statusBar().currentMessage()
    assert "Input/output error" in window.statusBar().currentMessage()
