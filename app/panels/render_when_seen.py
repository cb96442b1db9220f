"""Panels in a tab nobody is looking at need not redraw on every edit: they catch up when shown."""

from __future__ import annotations


class RendersWhenSeen:
    """Mixin for a QWidget with a render() method. render_when_seen() draws now when the panel can be
    seen (or stands alone, as in a test), and otherwise marks it stale so its next showEvent draws it."""

    _stale = False

    def render_when_seen(self) -> None:
        if self.window().isVisible() and not self.isVisible():
            self._stale = True   # hidden in a shown window (a tab in the background): draw when shown
            return
        self._stale = False
        self.render()

    def showEvent(self, event) -> None:
        super().showEvent(event)
        if self._stale:
            self._stale = False
            self.render()
