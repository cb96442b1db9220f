"""GUI fixtures: every test gets its own settings folder, so nothing reads or writes the user's real
preferences, and a window on the invented demo session."""

import pytest
from PySide6.QtCore import QSettings

from app import window as window_module
from app.model import SessionModel
from core.session import load_session


@pytest.fixture(autouse=True)
def isolated_settings(tmp_path, qapp):
    folder = tmp_path / "settings"
    folder.mkdir()
    QSettings.setPath(QSettings.Format.IniFormat, QSettings.Scope.UserScope, str(folder))
    yield folder


@pytest.fixture
def demo_session():
    return load_session(window_module.DEMO_SESSION)


@pytest.fixture
def model(demo_session):
    return SessionModel(demo_session)


@pytest.fixture
def changes(model):
    """Every Change the model announces, in order."""
    seen = []
    model.changed.connect(seen.append)
    return seen


@pytest.fixture
def window(qtbot, isolated_settings):
    win = window_module.make_window()
    win.show()
    qtbot.waitExposed(win)
    yield win
    win.model.undo_stack.setClean()  # no "save changes?" question when the test closes it
    win.close()
    win.deleteLater()
