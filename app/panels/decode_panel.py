"""Decode panel: paste any text, see every plausible reading ranked, apply the one that matches the part."""

from __future__ import annotations

from PySide6.QtCore import QTimer
from PySide6.QtGui import QGuiApplication
from PySide6.QtWidgets import (QHBoxLayout, QLabel, QListWidget, QListWidgetItem, QPlainTextEdit,
                               QPushButton, QVBoxLayout, QWidget)

from app import plain_text
from app.model import SessionModel
from core.errors import FramewrightError


def _words(value) -> str:
    """Conventions or notes as one line, whatever container the decoder uses."""
    if value is None:
        return ""
    if isinstance(value, str):
        return value
    if isinstance(value, dict):
        return ", ".join(f"{k}: {v}" for k, v in value.items())
    return "; ".join(str(v) for v in value)


def _conventions(reading) -> str:
    """The reading's conventions without repeating its kind ("matrix: body-to-reference", not twice)."""
    conventions = reading.conventions
    if isinstance(conventions, dict):
        return ", ".join(str(v) if k == reading.kind else f"{k} {v}" for k, v in conventions.items())
    return _words(conventions)


class DecodePanel(QWidget):
    def __init__(self, model: SessionModel, parent=None):
        super().__init__(parent)
        self.model = model
        self.readings: list = []
        self.paste_box = QPlainTextEdit()
        self.paste_box.setPlaceholderText("Paste a matrix, quaternion, axis and angle or three angles here, "
                                          "as printed on the drawing or written in the file.")
        self.paste_box.setToolTip("Text to decode. '.' is the decimal point; the Unicode minus, en dash and "
                                  "non-breaking spaces are accepted.")
        self.paste_box.setMaximumHeight(120)
        self.read_button = QPushButton("Read")
        self.read_button.setToolTip("List every plausible reading of the text, most likely first.")
        self.paste_button = QPushButton("Paste")
        self.paste_button.setToolTip("Replace the text with the clipboard and read it.")
        self.message = plain_text.plain_label()
        self.message.setWordWrap(True)
        self.list = QListWidget()
        self.list.setWordWrap(True)
        self.list.setSpacing(2)
        self.list.setAlternatingRowColors(True)
        self.list.setToolTip("Readings of the text, most plausible first. Double-click or Apply to use one "
                             "(undo takes it back).")
        self.apply_button = QPushButton("Apply reading")
        self.apply_button.setToolTip("Set the selected mount's orientation to the chosen reading (undoable).")
        self.apply_button.setEnabled(False)

        layout = QVBoxLayout(self)
        layout.addWidget(self.paste_box)
        row = QHBoxLayout()
        row.addWidget(self.paste_button)
        row.addWidget(self.read_button)
        row.addStretch(1)
        layout.addLayout(row)
        layout.addWidget(self.message)
        layout.addWidget(self.list, 1)
        layout.addWidget(self.apply_button)

        self._debounce = QTimer(self)
        self._debounce.setSingleShot(True)
        self._debounce.setInterval(250)
        self._debounce.timeout.connect(self.read)
        self.paste_box.textChanged.connect(self._debounce.start)
        self.read_button.clicked.connect(self.read)
        self.paste_button.clicked.connect(self.paste_from_clipboard)
        self.apply_button.clicked.connect(self.apply_selected)
        self.list.itemActivated.connect(lambda *_: self.apply_selected())  # Enter
        self.list.itemDoubleClicked.connect(lambda *_: self.apply_selected())
        self.list.currentItemChanged.connect(lambda *_: self.apply_button.setEnabled(self.list.currentItem() is not None))

    def paste_from_clipboard(self) -> None:
        self.set_text(QGuiApplication.clipboard().text())

    def set_text(self, text: str) -> None:
        self.paste_box.setPlainText(text)
        self.read()

    def read(self) -> None:
        from core.decode import decode  # late: the decoder is only needed here

        self._debounce.stop()
        text = self.paste_box.toPlainText()
        self.list.clear()
        self.readings = []
        self.apply_button.setEnabled(False)
        if not text.strip():
            plain_text.say(self.message, "")
            return
        try:
            self.readings = list(decode(text))  # no hints: every plausible reading, side by side
        except FramewrightError as exc:
            plain_text.say(self.message, f"Cannot read this: {exc}", problem=True)
            return
        if not self.readings:
            plain_text.say(self.message, "No reading of this text is a valid orientation.")
            return
        plural = "s" if len(self.readings) != 1 else ""
        plain_text.say(self.message, f"{len(self.readings)} reading{plural}, most plausible first.")
        for rank, reading in enumerate(self.readings, start=1):
            lines = [f"{rank}. {reading.kind}: {_conventions(reading)}"]
            if _words(reading.notes):
                lines.append(f"    {_words(reading.notes)}")
            item = QListWidgetItem("\n".join(lines))
            tip = f"{getattr(reading, 'label', reading.kind)}\n{_words(reading.conventions)}"
            if getattr(reading, "why", ""):
                tip += f"\nRank: {reading.why}"
            item.setToolTip(tip)
            self.list.addItem(item)
        self.list.setCurrentRow(0)

    def apply_selected(self) -> None:
        item = self.list.currentItem()
        if item is None:
            return
        reading = self.readings[self.list.row(item)]
        self.model.set_orientation(reading.orientation, origin=self,
                                   text=f"Apply decoded reading ({reading.kind})")
        plain_text.say(self.message, f"Applied: {reading.kind}, {_conventions(reading)}.")
