"""Where the file dialogs open: in the folder last used in any of them (kept in QSettings), else in the
user's documents folder, else in the home folder, and never in the program's own folder (which is where
a dialog given no folder starts when the program is run from its source)."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QSettings, QStandardPaths
from PySide6.QtWidgets import QFileDialog

from app import settings as app_settings

KEY = "files/last_folder"


def documents_folder() -> str:
    """The user's documents folder when it exists, else the home folder."""
    documents = QStandardPaths.writableLocation(QStandardPaths.StandardLocation.DocumentsLocation)
    if documents and Path(documents).is_dir():
        return documents
    return str(Path.home())


def start_folder(settings: QSettings | None = None) -> str:
    settings = settings or app_settings.open_settings()
    last = settings.value(KEY)
    if isinstance(last, str) and last and Path(last).is_dir():
        return last
    return documents_folder()


def remember(path: str, settings: QSettings | None = None) -> None:
    """The folder of a file just chosen, for the next dialog."""
    settings = settings or app_settings.open_settings()
    settings.setValue(KEY, str(Path(path).resolve().parent))
    settings.sync()


def open_file_name(parent, caption: str, filters: str) -> str:
    """The file the user chose to open ('' when they cancelled); its folder is remembered."""
    path, _ = QFileDialog.getOpenFileName(parent, caption, start_folder(), filters)
    if path:
        remember(path)
    return path


def save_file_name(parent, caption: str, suggested: str, filters: str) -> str:
    """The file the user chose to save to ('' when they cancelled). A bare suggested name starts in the
    start folder; a full path (e.g. beside the file it came from) is kept as it is."""
    start = suggested if Path(suggested).is_absolute() else str(Path(start_folder()) / suggested)
    path, _ = QFileDialog.getSaveFileName(parent, caption, start, filters)
    if path:
        remember(path)
    return path
