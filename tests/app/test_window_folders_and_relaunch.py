"""Where the file dialogs open and what a relaunch shows, with a throw-away home folder and settings:
the first dialog opens in the user's documents folder, every later one in the folder last used; a
relaunch reopens the session that was open (the demo only on the first launch or from Help)."""

from pathlib import Path

import pytest
from PySide6.QtWidgets import QFileDialog

from app import window as window_module
from core.session import FILE_SUFFIX


@pytest.fixture
def home(tmp_path, monkeypatch):
    folder = tmp_path / "home"
    (folder / "Documents").mkdir(parents=True)
    monkeypatch.setenv("HOME", str(folder))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(folder / ".config"))   # no user-dirs file: ~/Documents
    return folder


class Dialogs:
    """Stands in for the file dialogs: records the folder each opened in and answers with a chosen file."""

    def __init__(self, monkeypatch):
        self.opened_in: list[str] = []
        self.answer = ""
        monkeypatch.setattr(QFileDialog, "getOpenFileName", self._answer)
        monkeypatch.setattr(QFileDialog, "getSaveFileName", self._answer)

    def _answer(self, _parent, _caption, start, _filters, *args, **kwargs):
        self.opened_in.append(start)
        return self.answer, ""

    def folder(self, index=-1) -> Path:
        start = Path(self.opened_in[index])
        return start if start.is_dir() else start.parent


def relaunch(qtbot, old):
    """Close the window as the user does and start the program again (what run_window does at launch)."""
    old.model.undo_stack.setClean()
    old.close()
    new = window_module.make_window()
    qtbot.addWidget(new)
    opened = new.reopen_last_session()
    return new, opened


def test_the_first_dialog_opens_in_the_documents_folder_then_in_the_last_used_one(qtbot, window, home,
                                                                                  monkeypatch, tmp_path):
    dialogs = Dialogs(monkeypatch)
    window.open_action.trigger()                      # cancelled: nothing chosen, nothing remembered
    assert dialogs.folder() == home / "Documents"
    assert dialogs.folder() != Path(window_module.__file__).parents[1]   # not the program's own folder

    elsewhere = tmp_path / "job 42"
    elsewhere.mkdir()
    dialogs.answer = str(elsewhere / f"bracket{FILE_SUFFIX}")
    window.save_as_action.trigger()
    assert dialogs.folder() == home / "Documents"
    assert Path(dialogs.answer).is_file()

    # every later dialog, the window's and the panels', starts where the user last was
    dialogs.answer = ""
    window.open_action.trigger()
    assert dialogs.folder() == elsewhere
    window.batch_panel.open_file()
    assert dialogs.folder() == elsewhere
    window.measure_panel.import_csv()
    assert dialogs.folder() == elsewhere
    window.scene._stl_dialog()
    assert dialogs.folder() == elsewhere
    assert len(dialogs.opened_in) == 6


def test_a_remembered_folder_that_is_gone_falls_back_to_the_documents_folder(qtbot, window, home,
                                                                             monkeypatch, tmp_path):
    dialogs = Dialogs(monkeypatch)
    gone = tmp_path / "removed"
    gone.mkdir()
    dialogs.answer = str(gone / f"x{FILE_SUFFIX}")
    window.save_as_action.trigger()
    Path(dialogs.answer).unlink()
    gone.rmdir()
    dialogs.answer = ""
    window.open_action.trigger()
    assert dialogs.folder() == home / "Documents"


def test_the_first_launch_shows_the_demo(qtbot, window):
    new, opened = relaunch(qtbot, window)
    assert "demo" in opened.lower() and new.showing_demo
    assert new.model.file_path is None and "demo session" in new.windowTitle()
    assert [m.name for m in new.model.mounts] == [m.name for m in window_module.demo_session().mounts]
    new.close()


def test_a_relaunch_reopens_the_session_that_was_open(qtbot, window, tmp_path):
    path = tmp_path / f"mast{FILE_SUFFIX}"
    window.model.rename_mount(0, "Mast camera, as fitted")
    assert window.save_file_as(str(path))
    new, opened = relaunch(qtbot, window)
    assert opened == f"Reopened {path}"
    assert new.model.file_path == str(path) and not new.showing_demo
    assert new.model.mounts[0].name == "Mast camera, as fitted"
    assert path.name in new.windowTitle()
    new.close()


def test_a_relaunch_after_file_new_shows_a_new_session_not_the_demo(qtbot, window):
    assert window.new_session()
    assert "new session" in window.windowTitle()
    new, opened = relaunch(qtbot, window)
    assert not new.showing_demo and len(new.model.mounts) == 1 and new.model.file_path is None
    assert "new session" in new.windowTitle()
    new.close()


def test_the_demo_comes_back_from_help_and_a_relaunch_keeps_it(qtbot, window, tmp_path):
    assert window.new_session()
    window.demo_action.trigger()
    assert window.showing_demo and len(window.model.mounts) == len(window_module.demo_session().mounts)
    new, _ = relaunch(qtbot, window)
    assert new.showing_demo
    new.close()


def test_a_last_session_file_that_is_gone_is_said_and_the_demo_shown(qtbot, window, tmp_path):
    path = tmp_path / f"gone{FILE_SUFFIX}"
    assert window.save_file_as(str(path))
    window.model.undo_stack.setClean()
    window.close()
    path.unlink()
    new = window_module.make_window()
    qtbot.addWidget(new)
    opened = new.reopen_last_session()
    assert str(path) in opened and "no longer there" in opened and new.showing_demo
    new.close()
