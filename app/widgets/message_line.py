"""The one place a panel or dialog tells the person what happened: a wrapping label of plain text (it
quotes what was typed or pasted, never drawn as markup), in the error colour when it tells of a problem,
selectable so a refusal can be copied into a report."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLabel

from app import plain_text


class MessageLine(QLabel):
    def __init__(self, text: str = "", parent=None):
        super().__init__(parent)
        self.setWordWrap(True)
        self.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self._problem = False
        self.say(text)

    def say(self, text: str, problem: bool = False) -> None:
        """Plain text; red when it tells of a problem, the normal colour otherwise."""
        self._problem = bool(problem) and bool(text)
        plain_text.say(self, text, problem)

    def problem(self, text: str) -> None:
        self.say(text, problem=True)

    def clear(self) -> None:
        self.say("")

    @property
    def is_problem(self) -> bool:
        """Whether the line now tells of a problem (the text shown in the error colour)."""
        return self._problem
