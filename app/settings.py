"""Persisted user preferences (QSettings, INI format in the user's configuration folder).

Tests redirect everything with ``QSettings.setPath(QSettings.IniFormat, QSettings.UserScope, folder)``
before the window opens, so they never touch the real user settings.
"""

from __future__ import annotations

from dataclasses import fields

from PySide6.QtCore import QByteArray, QSettings

from core.errors import FramewrightError
from core.session import Preferences

ORGANISATION = "Framewright"
APPLICATION = "Framewright"


def open_settings() -> QSettings:
    return QSettings(QSettings.Format.IniFormat, QSettings.Scope.UserScope, ORGANISATION, APPLICATION)


def _convert(raw, like):
    """QSettings hands INI values back as text; turn them into the type of the default."""
    if isinstance(like, bool):
        if isinstance(raw, bool):
            return raw
        if str(raw).lower() in ("true", "1"):
            return True
        if str(raw).lower() in ("false", "0"):
            return False
        raise ValueError(raw)
    if isinstance(like, int):
        return int(raw)
    if isinstance(like, float):
        return float(raw)
    return str(raw)


def load_preferences(settings: QSettings | None = None) -> Preferences:
    """Stored preferences; any missing or damaged value falls back to its default, one by one."""
    settings = settings or open_settings()
    defaults = Preferences()
    values = {}
    for f in fields(Preferences):
        raw = settings.value(f"preferences/{f.name}")
        if raw is None:
            continue
        try:
            candidate = _convert(raw, getattr(defaults, f.name))
            Preferences(**{**values, f.name: candidate})  # validate with what is known so far
            values[f.name] = candidate
        except (ValueError, TypeError, FramewrightError):
            continue
    try:
        return Preferences(**values)
    except FramewrightError:  # e.g. thresholds valid alone but not together
        return defaults


def save_preferences(preferences: Preferences, settings: QSettings | None = None) -> None:
    settings = settings or open_settings()
    for key, value in preferences.to_dict().items():
        settings.setValue(f"preferences/{key}", value)
    settings.sync()


def load_window_state(settings: QSettings | None = None) -> tuple[QByteArray | None, QByteArray | None]:
    settings = settings or open_settings()
    geometry = settings.value("window/geometry")
    state = settings.value("window/state")
    return (geometry if isinstance(geometry, QByteArray) else None,
            state if isinstance(state, QByteArray) else None)


def save_window_state(geometry: QByteArray, state: QByteArray, settings: QSettings | None = None) -> None:
    settings = settings or open_settings()
    settings.setValue("window/geometry", geometry)
    settings.setValue("window/state", state)
    settings.sync()


def load_text(key: str, default: str, settings: QSettings | None = None) -> str:
    settings = settings or open_settings()
    value = settings.value(key)
    return str(value) if value is not None else default


def save_text(key: str, value: str, settings: QSettings | None = None) -> None:
    settings = settings or open_settings()
    settings.setValue(key, value)
    settings.sync()
