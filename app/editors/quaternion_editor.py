"""Quaternion editor: four fields in the chosen order (w first or w last), the norm of what is typed, and
a normalise action. While typing, the user's own sign is kept; q and −q are the same orientation."""

from __future__ import annotations

import numpy as np
from PySide6.QtWidgets import QComboBox, QGridLayout, QHBoxLayout, QLabel, QPushButton

from app.editors.base import EditorBase
from app.widgets.number_field import NumberField
from core.errors import FramewrightError
from core.orientation import Orientation
from core.representations import QUATERNION

_TIPS = {
    "w": "w: scalar part of the Hamilton unit quaternion q = w + xi + yj + zk (v_ref = q v_body q*). "
         "Shown with w ≥ 0; q and −q are the same orientation.",
    "x": "x: first vector part (i) of the Hamilton quaternion, body → reference.",
    "y": "y: second vector part (j) of the Hamilton quaternion, body → reference.",
    "z": "z: third vector part (k) of the Hamilton quaternion, body → reference.",
}
ORDERS = {"wxyz": "w, x, y, z (scalar first)", "xyzw": "x, y, z, w (scalar last)"}


class QuaternionEditor(EditorBase):
    representation = QUATERNION

    def __init__(self, model, parent=None):
        super().__init__(model, "Quaternion", parent)
        self.order_box = QComboBox()
        for key, text in ORDERS.items():
            self.order_box.addItem(text, key)
        self.order_box.setToolTip("Order of the four numbers on screen and in copies. The quaternion is the "
                                  "same (Hamilton); only the order it is written in changes.")
        self.narrow_combo(self.order_box)
        self.fields = [NumberField("", step=0.01) for _ in range(4)]
        self.labels = [QLabel() for _ in range(4)]
        self.norm_label = QLabel()
        self.norm_label.setToolTip("Length of the four numbers as typed; a unit quaternion has norm 1. "
                                   "Other lengths are normalised before use.")
        self.normalise_button = QPushButton("Normalise")
        self.normalise_button.setToolTip("Divide the four numbers by their norm (keeps their sign).")
        self.note = self.note_label()

        grid = QGridLayout(self)
        grid.addWidget(QLabel("Order"), 0, 0)
        grid.addWidget(self.order_box, 0, 1)
        for i, (label, field) in enumerate(zip(self.labels, self.fields)):
            grid.addWidget(label, i + 1, 0)
            grid.addWidget(field, i + 1, 1)
        row = QHBoxLayout()
        row.addWidget(self.norm_label, 1)
        row.addWidget(self.normalise_button)
        grid.addLayout(row, 5, 0, 1, 2)
        grid.addWidget(self.note, 6, 0, 1, 2)
        grid.setColumnStretch(1, 1)
        grid.setRowStretch(7, 1)

        self.connect_fields(self.fields)
        self.order_box.activated.connect(self._on_order_chosen)
        self.normalise_button.clicked.connect(self._on_normalise)
        self.render()

    @property
    def order(self) -> str:
        return self.model.preferences.quaternion_order

    def render_setup(self) -> None:
        order = self.order
        self.order_box.setCurrentIndex(self.order_box.findData(order))
        for letter, label, field in zip(order, self.labels, self.fields):
            label.setText(letter)
            field.set_convention_tooltip(_TIPS[letter])

    def render_values(self) -> None:
        q = self.model.current_orientation().as_quaternion(scalar_last=(self.order == "xyzw"))
        for field, value in zip(self.fields, q):
            field.set_text(self.fmt(value))
        self._show_norm(q)
        self.note.setText("")

    def _show_norm(self, values) -> float:
        norm = float(np.linalg.norm(values))
        self.norm_label.setText(f"Norm {self.fmt(norm)}")
        return norm

    def _read(self):
        values = self.read_fields(self.fields)
        if values is None:
            self.norm_label.setText("Norm –")
            return None, None
        norm = self._show_norm(values)
        try:
            o = Orientation.from_quaternion(values, scalar_last=(self.order == "xyzw"))
        except FramewrightError as exc:
            for field in self.fields:
                field.set_problem(str(exc))
            return values, None
        self.note.setText("" if abs(norm - 1) <= 1e-9 else "Norm is not 1: the unit quaternion in the same "
                          "direction is used.")
        return values, o

    def read_orientation(self) -> Orientation | None:
        return self._read()[1]

    def _on_normalise(self) -> None:
        values, o = self._read()
        if o is None:
            return
        norm = float(np.linalg.norm(values))
        for field, v in zip(self.fields, values):
            field.set_text(self.fmt(v / norm))  # the user's sign is kept
        self._show_norm([v / norm for v in values])
        self.note.setText(f"Normalised (the norm was {norm:.6g}).")
        self.push(o, "typing")

    def _on_order_chosen(self, index: int) -> None:
        self.model.set_preferences(origin=self, quaternion_order=self.order_box.itemData(index))
