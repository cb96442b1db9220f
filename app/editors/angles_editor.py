"""Angles editor: three angles of one of the twelve sequences, intrinsic or extrinsic, and under them the
same orientation spelled in the other convention."""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QComboBox, QGridLayout, QLabel

from app.editors.base import EditorBase
from app.widgets.number_field import NumberField
from core.errors import FramewrightError
from core.orientation import Orientation
from core.sequences import ALL_SEQUENCES, is_proper_euler, other_convention, preset_names, spelled_sequence
from core.representations import ANGLES

PRIMES = ("", "′", "″")


def axis_labels(sequence: str, intrinsic: bool) -> list[str]:
    """'Z', 'Y′', 'X″' for intrinsic (moving axes), plain letters for extrinsic (fixed axes), plus the
    preset's angle names where there is one."""
    names = preset_names(sequence, intrinsic)
    labels = []
    for i, axis in enumerate(sequence):
        text = f"{axis}{PRIMES[i] if intrinsic else ''}"
        if names:
            text += f" ({names[i]})"
        labels.append(text)
    return labels


class AnglesEditor(EditorBase):
    representation = ANGLES

    def __init__(self, model, parent=None):
        super().__init__(model, "Angles", parent)
        self.sequence_box = QComboBox()
        for seq in ALL_SEQUENCES:
            kind = "proper Euler" if is_proper_euler(seq) else "Tait–Bryan"
            self.sequence_box.addItem(f"{'-'.join(seq)}  ({kind})", seq)
        self.sequence_box.setToolTip("Axis order of the three turns. Tait–Bryan use three different axes; "
                                     "proper Euler repeat the first axis last.")
        self.kind_box = QComboBox()
        # Short words in the box: a closed combo box is cut, not elided, and at 1280 px it is ~23 characters
        # wide; the whole sense is in each entry's tooltip and the box's.
        for words, whole, intrinsic in (("intrinsic (body axes)", "about the moving body axes", True),
                                        ("extrinsic (fixed axes)", "about the fixed reference axes", False)):
            self.kind_box.addItem(words, intrinsic)
            self.kind_box.setItemData(self.kind_box.count() - 1, f"{words.split()[0]}: {whole}",
                                      Qt.ItemDataRole.ToolTipRole)
        self.kind_box.setToolTip("Intrinsic: R = R1(θ1)·R2(θ2)·R3(θ3), each turn about the axes already turned. "
                                 "Extrinsic: R = R3(θ3)·R2(θ2)·R1(θ1), each about the fixed reference axes, "
                                 "in the order written.")
        self.narrow_combo(self.sequence_box)
        self.narrow_combo(self.kind_box)
        self.fields = [NumberField("", step=1.0) for _ in range(3)]
        self.labels = [QLabel() for _ in range(3)]
        self.other_label = QLabel()
        self.other_label.setWordWrap(True)
        self.other_label.setToolTip("Intrinsic a1-a2-a3 (θ1, θ2, θ3) is the same orientation as extrinsic "
                                    "a3-a2-a1 (θ3, θ2, θ1).")
        self.note = self.note_label()

        grid = QGridLayout(self)
        grid.addWidget(QLabel("Sequence"), 0, 0)
        grid.addWidget(self.sequence_box, 0, 1)
        grid.addWidget(QLabel("Turns"), 1, 0)
        grid.addWidget(self.kind_box, 1, 1)
        for i, (label, field) in enumerate(zip(self.labels, self.fields)):
            grid.addWidget(label, i + 2, 0)
            grid.addWidget(field, i + 2, 1)
        grid.addWidget(self.other_label, 5, 0, 1, 2)
        grid.addWidget(self.note, 6, 0, 1, 2)
        grid.setColumnStretch(1, 1)
        grid.setRowStretch(7, 1)

        self.connect_fields(self.fields)
        self.sequence_box.activated.connect(
            lambda i: self.model.set_preferences(origin=self, sequence=self.sequence_box.itemData(i)))
        self.kind_box.activated.connect(
            lambda i: self.model.set_preferences(origin=self, intrinsic=self.kind_box.itemData(i)))
        self.render()

    @property
    def sequence(self) -> str:
        return self.model.preferences.sequence

    @property
    def intrinsic(self) -> bool:
        return self.model.preferences.intrinsic

    def _tooltip(self, i: int) -> str:
        seq, intr = self.sequence, self.intrinsic
        axis = seq[i]
        frame = "moving body" if intr else "fixed reference"
        if i == 1:
            span = "[−90°, 90°]" if not is_proper_euler(seq) else "[0°, 180°]"
        else:
            span = "(−180°, 180°]"
        return (f"θ{i + 1} ({self.angle_unit}): turn about the {frame} {axis} axis, right-handed, "
                f"{spelled_sequence(seq, intr)} {'intrinsic' if intr else 'extrinsic'}. Shown in {span}.")

    def render_setup(self) -> None:
        seq, intr = self.sequence, self.intrinsic
        self.show_unit_in_title("Angles")
        self.limit_angles(self.fields)
        self.sequence_box.setCurrentIndex(self.sequence_box.findData(seq))
        self.kind_box.setCurrentIndex(0 if intr else 1)
        for i, (label, text) in enumerate(zip(self.labels, axis_labels(seq, intr))):
            label.setText(self.unit_label(text))
            self.fields[i].set_convention_tooltip(self._tooltip(i))
            self.fields[i].set_step(self.angle_step)

    def render_values(self) -> None:
        seq, intr = self.sequence, self.intrinsic
        angle_set = self.model.current_orientation().as_angles(seq, intrinsic=intr, degrees=True)
        shown = self.shown_angles(angle_set.angles)
        for field, value in zip(self.fields, shown):
            field.set_text(self.fmt(value))
        self._show_other(shown)
        self.note.setText(
            "Gimbal lock: θ1 and θ3 are coupled (see Gimbal margin); θ3 is shown as 0."
            if angle_set.locked else "")

    def _show_other(self, angles) -> None:
        seq, intr = self.sequence, self.intrinsic
        other_seq, other_angles, other_intr = other_convention(seq, angles, intr)
        names = preset_names(other_seq, other_intr)
        values = ", ".join(f"{self.fmt(a)}" for a in other_angles)
        named = f" ({', '.join(names)})" if names else ""
        self.other_label.setText(
            f"Same orientation: {'intrinsic' if other_intr else 'extrinsic'} "
            f"{spelled_sequence(other_seq, other_intr)}{named} = ({values}) {self.angle_unit}")

    def read_orientation(self) -> Orientation | None:
        values = self.read_fields(self.fields)
        if values is None:
            return None
        try:
            o = Orientation.from_angles(self.sequence, self.angles_in_degrees(values), intrinsic=self.intrinsic,
                                        degrees=True)
        except FramewrightError as exc:
            for field in self.fields:
                field.set_problem(str(exc))
            return None
        self._show_other(np.asarray(values))
        return o
