"""The plain controls every panel is made of, each with its tooltip in the same call: a panel's __init__
then reads as the list of what it shows, not as the settings of each widget."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QComboBox, QLineEdit, QPushButton

from app import plain_text
from core import units


def button(text: str, tip: str) -> QPushButton:
    widget = QPushButton(text)
    widget.setToolTip(tip)
    return widget


def line_field(tip: str, placeholder: str = "") -> QLineEdit:
    widget = QLineEdit()
    widget.setToolTip(tip)
    if placeholder:
        widget.setPlaceholderText(placeholder)
    return widget


def length_choice(tip: str, keys) -> QComboBox:
    """A drop-down of length units (keys of core/units.LENGTH_UNITS), each shown by its symbol with its
    name, or its note, as the entry's tooltip: a thou is said in words wherever it is chosen, so a
    thousandth of an inch is never taken for an angular mil."""
    widget = choice_box(tip, [(units.length_unit(key).symbol, key) for key in keys])
    for index, key in enumerate(keys):
        found = units.length_unit(key)
        widget.setItemData(index, found.note or found.name, Qt.ItemDataRole.ToolTipRole)
    return widget


def choice_box(tip: str, items=(), least_chars: int | None = None) -> QComboBox:
    """A drop-down of (label, data) items; `least_chars` lets it shrink to that many characters in a narrow
    side area instead of widening it to its longest item."""
    widget = QComboBox()
    for label, data in items:
        widget.addItem(label, data)
    widget.setToolTip(tip)
    if least_chars is not None:
        widget.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        widget.setMinimumContentsLength(least_chars)
    return widget


def reading_label(tip: str = "", selectable: bool = True):
    """A label of results to read (and copy): plain text (it may name mounts or steps as typed), wrapping."""
    label = plain_text.plain_label()
    label.setWordWrap(True)
    if selectable:
        label.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
    if tip:
        label.setToolTip(tip)
    return label
