"""Side tabs whose panel is built the first time it is needed: when its tab is shown, or when code asks for
the panel. Only the first tab is in view at launch; building the others (and importing their modules) then
would only delay the window's first paint. The tab's page exists from the start, so the tab bar, the side
area's size and the layout are the same whether the panel is built yet or not."""

from __future__ import annotations

from typing import Callable

from PySide6.QtWidgets import QScrollArea, QTabWidget, QWidget


class PanelOnDemand:
    """One tab's page: a scroll area at once, the panel inside it on the first call of panel()."""

    def __init__(self, area: QScrollArea, build: Callable[[], QWidget]):
        self.area = area
        self._build = build
        self._panel: QWidget | None = None

    @property
    def built(self) -> bool:
        return self._panel is not None

    def panel(self) -> QWidget:
        if self._panel is None:
            self._panel = self._build()
            self.area.setWidget(self._panel)   # replaces (and deletes) the empty placeholder
        return self._panel


class SidePages:
    """The side tabs' pages built on demand, by name; a tab shown for the first time builds its panel."""

    def __init__(self, tabs: QTabWidget):
        self.tabs = tabs
        self.pages: dict[str, PanelOnDemand] = {}
        tabs.currentChanged.connect(self._tab_shown)

    def add(self, name: str, title: str, area: QScrollArea, build: Callable[[], QWidget]) -> None:
        """area holds an empty placeholder until the panel is built; it keeps its own minimum size."""
        self.pages[name] = PanelOnDemand(area, build)
        self.tabs.addTab(area, title)

    def panel(self, name: str) -> QWidget:
        return self.pages[name].panel()

    def _tab_shown(self, index: int) -> None:
        page = self.tabs.widget(index)
        for entry in self.pages.values():
            if entry.area is page:
                entry.panel()


class SidePanel:
    """A window attribute that is one of its on-demand side panels: reading it builds the panel if needed,
    so code and tests reach window.check_panel exactly as before."""

    def __set_name__(self, owner, name: str) -> None:
        self.name = name

    def __get__(self, window, owner=None):
        if window is None:
            return self
        return window.side_pages.panel(self.name)
