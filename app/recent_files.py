"""The Recent files list: up to MAX_RECENT session files, newest first, kept in QSettings. Files that
have gone missing are dropped when the list is read, and the caller is told which, to say so."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QSettings

MAX_RECENT = 8
KEY = "files/recent"


def _stored(settings: QSettings) -> list[str]:
    value = settings.value(KEY)
    if value is None:
        return []
    if isinstance(value, str):          # INI files hand a one-item list back as a plain string
        value = [value]
    return [str(v) for v in value if str(v).strip()]


def load_recent(settings: QSettings) -> tuple[list[str], list[str]]:
    """(files that still exist, files dropped because they are gone)."""
    kept, dropped = [], []
    for path in _stored(settings):
        (kept if Path(path).is_file() else dropped).append(path)
    if dropped:
        _store(kept, settings)
    return kept, dropped


def add_recent(path: str, settings: QSettings) -> list[str]:
    path = str(Path(path).resolve())
    paths = [path] + [p for p in _stored(settings) if p != path]
    _store(paths[:MAX_RECENT], settings)
    return paths[:MAX_RECENT]


def _store(paths: list[str], settings: QSettings) -> None:
    settings.setValue(KEY, list(paths))
    settings.sync()
