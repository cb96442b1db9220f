"""Text that came from a user or a file (mount and chain names, pasted text quoted in a message, file
names) shown as the characters it is, never as markup: Qt takes a label's or a message box's text as rich
text when it merely looks like HTML, so a name such as "<b>ALL PASS</b><img src=…>" would draw. Every
label and message box that can show such text is made plain here; a problem is coloured by a style
sheet instead of a <span>."""

from __future__ import annotations

import html

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLabel, QMessageBox

ERROR_STYLE = "color:#c62828"


def plain(*labels: QLabel) -> None:
    """Show these labels' text as plain text."""
    for label in labels:
        label.setTextFormat(Qt.TextFormat.PlainText)


def plain_label(text: str = "") -> QLabel:
    label = QLabel(text)
    plain(label)
    return label


def say(label: QLabel, text: str, problem: bool = False) -> None:
    """Plain text on the label, in the error colour when it tells of a problem."""
    label.setTextFormat(Qt.TextFormat.PlainText)
    label.setStyleSheet(ERROR_STYLE if problem else "")
    label.setText(text)


def plain_tip(text: str) -> str:
    """A tooltip showing `text` as typed: Qt takes a tooltip as rich text when it looks like markup, so
    the text is escaped inside a paragraph that keeps its spaces and line breaks."""
    return "<p style='white-space:pre-wrap'>" + html.escape(text, quote=False) + "</p>"


def _box(parent, icon, title, text, buttons, default):
    box = QMessageBox(icon, title, text, buttons, parent)
    box.setTextFormat(Qt.TextFormat.PlainText)
    if default is not None:
        box.setDefaultButton(default)
    return QMessageBox.StandardButton(box.exec())


def warning(parent, title: str, text: str):
    """A modal warning with plain text (QMessageBox.warning's text would be auto-detected as markup)."""
    return _box(parent, QMessageBox.Icon.Warning, title, text, QMessageBox.StandardButton.Ok, None)


def question(parent, title: str, text: str, buttons, default=None):
    """A modal question with plain text; returns the StandardButton chosen."""
    return _box(parent, QMessageBox.Icon.Question, title, text, buttons, default)
