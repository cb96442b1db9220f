"""Mounts list: the session's named orientations; add, duplicate, rename (double-click), delete."""

from __future__ import annotations

from PySide6.QtCore import Qt, QTimer
from PySide6.QtWidgets import QGroupBox, QHBoxLayout, QListWidget, QListWidgetItem, QPushButton, QVBoxLayout

from app import plain_text
from app.widgets.message_line import MessageLine
from app.model import MOUNTS, SELECTION, Change, SessionModel


class MountsList(QGroupBox):
    def __init__(self, model: SessionModel, parent=None):
        super().__init__("Mounts", parent)
        self.model = model
        self.list = QListWidget()
        self.list.setToolTip("The session's named orientations. Double-click a name to rename it.")
        self.list.setWordWrap(True)
        self.add_button = QPushButton("Add")
        self.add_button.setToolTip("Add a mount at the identity orientation.")
        self.duplicate_button = QPushButton("Duplicate")
        self.duplicate_button.setToolTip("Add a copy of the selected mount.")
        self.rename_button = QPushButton("Rename")
        self.rename_button.setToolTip("Rename the selected mount.")
        self.delete_button = QPushButton("Delete")
        self.delete_button.setToolTip("Delete the selected mount (undo brings it back).")

        self.message = MessageLine()   # why a rename or delete was not done; empty otherwise

        layout = QVBoxLayout(self)
        layout.addWidget(self.list, 1)
        layout.addWidget(self.message)
        buttons = QHBoxLayout()
        for b in (self.add_button, self.duplicate_button, self.rename_button, self.delete_button):
            # as narrow as the words, so the list can be narrow on a laptop
            b.setMinimumWidth(b.fontMetrics().horizontalAdvance(b.text()) + 16)
        for b in (self.add_button, self.duplicate_button):
            buttons.addWidget(b)
        layout.addLayout(buttons)
        buttons2 = QHBoxLayout()
        for b in (self.rename_button, self.delete_button):
            buttons2.addWidget(b)
        layout.addLayout(buttons2)

        self.add_button.clicked.connect(lambda: self.model.add_mount(origin=self))
        self.duplicate_button.clicked.connect(lambda: self.model.duplicate_mount(origin=self))
        self.rename_button.clicked.connect(self.start_rename)
        self.delete_button.clicked.connect(self._delete)
        self.list.currentRowChanged.connect(self._on_row_changed)
        self.list.itemChanged.connect(self._on_item_changed)
        model.changed.connect(self._on_model_changed)
        self.render()

    def _on_model_changed(self, change: Change) -> None:
        if change.touches(MOUNTS, SELECTION):
            self.render()

    def render(self) -> None:
        self.list.blockSignals(True)
        self.list.clear()
        for mount in self.model.mounts:
            item = QListWidgetItem(mount.name)
            item.setFlags(item.flags() | Qt.ItemFlag.ItemIsEditable)
            item.setToolTip(plain_text.plain_tip(mount.notes or mount.name))
            self.list.addItem(item)
        self.list.setCurrentRow(self.model.selected_index)
        self.list.blockSignals(False)
        self.delete_button.setEnabled(len(self.model.mounts) > 1)

    def start_rename(self) -> None:
        item = self.list.currentItem()
        if item is not None:
            self.list.editItem(item)

    def _delete(self) -> None:
        if len(self.model.mounts) > 1:
            self.model.delete_mount(origin=self)
            self.message.clear()
        else:
            self.message.problem("The session needs at least one mount; the last one cannot be deleted.")

    def _on_row_changed(self, row: int) -> None:
        if 0 <= row < len(self.model.mounts):
            self.model.select(row, origin=self)

    def _on_item_changed(self, item: QListWidgetItem) -> None:
        # Rename after the editor has closed: the model's change rebuilds the list, item included.
        row, text = self.list.row(item), item.text()
        QTimer.singleShot(0, lambda: self._rename(row, text))

    def _rename(self, row: int, text: str) -> None:
        try:
            self.model.rename_mount(row, text, origin=self)
            self.message.clear()
        except ValueError as exc:
            self.message.problem(str(exc))   # e.g. "a mount needs a name; the old one is kept"
        self.render()  # shows the kept name when the new one was empty
