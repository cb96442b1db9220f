"""What every side panel shares: it follows the model's changes of the kinds it declares, draws itself only
when it can be seen (a panel in a background tab catches up when its tab is shown), guards its own
rendering so the widget signals it sets off are not taken for the person's edits, and tells the person
what happened in one message line.

A panel sets ``watches`` (change kinds from app/model.py) and writes ``render()``. When only part of it
depends on some kinds, ``render_change(change)`` draws that part (the whole panel by default). State that
must follow every change whether the panel is seen or not (forgetting a fit made in the last session, a
signal the Scene listens to) goes in ``follow(change)``.
"""

from __future__ import annotations

from contextlib import contextmanager
from functools import cached_property

from PySide6.QtWidgets import QWidget

from app.model import Change
from app.widgets.message_line import MessageLine


class FollowsModel:
    """Mixin for a QWidget (a panel, or a box inside one) that renders from the model."""

    watches: frozenset = frozenset()   # the change kinds this view renders on
    _stale = False                     # a change it watches came while it could not be seen
    _rendering = False                 # it is setting its own widgets: their signals are not edits

    def follow_model(self, model) -> None:
        self.model = model
        if model is not None:
            model.changed.connect(self._model_changed)

    # ---- for each panel to write ---------------------------------------------------------------------
    def render(self) -> None:
        raise NotImplementedError

    def render_change(self, change: Change) -> None:
        """Draw what this change touched; the whole panel unless the panel knows better."""
        self.render()

    def follow(self, change: Change) -> None:
        """Keep up with a change whether the panel is seen or not (nothing by default)."""

    # ---- shared ------------------------------------------------------------------------------------
    @contextmanager
    def rendering(self):
        """Inside it the panel sets its own widgets; handlers check ``self._rendering`` and do nothing."""
        was, self._rendering = self._rendering, True
        try:
            yield
        finally:
            self._rendering = was

    def seen(self) -> bool:
        """False for a view hidden in a shown window (a tab in the background); a view standing alone, as
        in a test, counts as seen."""
        return not (self.window().isVisible() and not self.isVisible())

    def render_when_seen(self) -> None:
        if not self.seen():
            self._stale = True
            return
        self._stale = False
        self.render()

    def _model_changed(self, change: Change) -> None:
        self.follow(change)
        if not change.touches(*self.watches):
            return
        if not self.seen():
            self._stale = True        # the whole panel is drawn when it is shown
            return
        if self._stale:
            self.render_when_seen()
        else:
            self.render_change(change)

    def showEvent(self, event) -> None:
        super().showEvent(event)
        if self._stale:
            self._stale = False
            self.render()


class Panel(FollowsModel, QWidget):
    """A side panel: the model it shows and its message line, made when the panel first asks for it
    (and placed in its layout there), so a panel with nothing to say has none."""

    def __init__(self, model, parent=None):
        super().__init__(parent)
        self.follow_model(model)

    @cached_property
    def message(self) -> MessageLine:
        return MessageLine()

    def say(self, text: str, problem: bool = False) -> None:
        self.message.say(text, problem)

    def problem(self, text: str) -> None:
        self.message.problem(text)
