"""Whether the window can be shown here, decided from the environment before Qt is loaded: Qt aborts the
whole process when the display server it tries cannot be reached, so the entry point looks first and
refuses in one line instead. No Qt and no core import here."""

from __future__ import annotations

import os
import sys

# Qt platforms that draw on a display server, and the variable that names the server of each.
_DISPLAY_PLATFORMS = {"xcb": ("DISPLAY",), "wayland": ("WAYLAND_DISPLAY",), "wayland-egl": ("WAYLAND_DISPLAY",)}


def open_display_problem(environ=None, platform: str | None = None) -> str | None:
    """Why the window cannot be shown here (None: it can, as far as the environment tells)."""
    environ = os.environ if environ is None else environ
    if (platform or sys.platform) in ("win32", "darwin", "cygwin"):
        return None                       # the native platform needs no display variable
    requested = [p.split(":")[0].strip() for p in environ.get("QT_QPA_PLATFORM", "").split(";") if p.strip()]
    if any(p not in _DISPLAY_PLATFORMS for p in requested):
        return None                       # e.g. offscreen or vnc, chosen on purpose: no display needed
    candidates = requested or ["wayland", "xcb"]
    if any(environ.get(var) for p in candidates for var in _DISPLAY_PLATFORMS[p]):
        return None
    names = " and ".join(sorted({v for p in candidates for v in _DISPLAY_PLATFORMS[p]}))
    return (f"no display found ({names} not set); the window needs a desktop session "
            "(the other commands work without one)")
