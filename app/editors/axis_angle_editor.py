"""Axis & angle editor: unit axis and angle (right-hand rule), or the rotation vector (axis times angle)."""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QCheckBox, QGridLayout, QLabel, QSlider

from app.editors.base import EditorBase
from app.widgets.number_field import NumberField
from core.errors import FramewrightError
from core.orientation import Orientation
from core.representations import AXIS_ANGLE, ROTATION_VECTOR

_AXIS_TIP = ("Axis {c}: component of the rotation axis in the reference frame. The axis is normalised to "
             "unit length when you commit (Enter or leaving the editor). Right-hand rule: thumb along the "
             "axis, positive angles turn counter-clockwise seen from its tip.")
_ANGLE_TIP = ("Rotation angle about the axis ({unit}), right-hand rule. Shown in [0, 180]; at 0 the axis is "
              "undefined and the last axis is kept.")
_ROTVEC_TIP = ("Rotation vector {c}: axis times angle ({unit}), in the reference frame. Its length is the "
               "rotation angle; its direction is the axis.")


class AxisAngleEditor(EditorBase):
    def __init__(self, model, parent=None):
        super().__init__(model, "Axis && angle", parent)
        self._last_axis = np.array([0.0, 0.0, 1.0])
        self._pending_length: float | None = None  # typed axis length, when it was not 1
        self.axis_fields = [NumberField(_AXIS_TIP.format(c=c), step=0.01) for c in "xyz"]
        self.angle_field = NumberField("", step=1.0)
        self.axis_labels = [QLabel(f"Axis {c}") for c in "xyz"]
        self.angle_label = QLabel("Angle")
        self.slider = QSlider(Qt.Orientation.Horizontal)
        self.slider.setRange(0, 1800)  # tenths of a degree
        self.slider.setToolTip("Drag to turn about the axis shown, 0° to 180° (one undo step per drag).")
        self.rotvec_toggle = QCheckBox("Show as rotation vector")
        self.rotvec_toggle.setToolTip("Show and edit axis × angle as three numbers instead of axis and angle.")
        self.note = self.note_label()

        grid = QGridLayout(self)
        for row, (label, field) in enumerate(zip(self.axis_labels, self.axis_fields)):
            grid.addWidget(label, row, 0)
            grid.addWidget(field, row, 1)
        grid.addWidget(self.angle_label, 3, 0)
        grid.addWidget(self.angle_field, 3, 1)
        grid.addWidget(self.slider, 4, 1)
        grid.addWidget(self.rotvec_toggle, 5, 0, 1, 2)
        grid.addWidget(self.note, 6, 0, 1, 2)
        grid.setColumnStretch(1, 1)
        grid.setRowStretch(7, 1)

        self.connect_fields(self.axis_fields + [self.angle_field])
        self.slider.valueChanged.connect(self._on_slider)
        self.slider.sliderReleased.connect(self.model.end_continuous)
        self.rotvec_toggle.toggled.connect(lambda _: self.render())
        self.render()

    @property
    def representation(self):
        return ROTATION_VECTOR if self.showing_rotation_vector else AXIS_ANGLE

    @property
    def showing_rotation_vector(self) -> bool:
        return self.rotvec_toggle.isChecked()

    @property
    def fields(self) -> list[NumberField]:
        return self.axis_fields if self.showing_rotation_vector else self.axis_fields + [self.angle_field]

    # ---- model -> fields ------------------------------------------------------------------------
    def render_setup(self) -> None:
        unit = self.angle_unit
        rotvec = self.showing_rotation_vector
        self.angle_label.setVisible(not rotvec)
        self.angle_field.setVisible(not rotvec)
        self.slider.setVisible(not rotvec)
        self.angle_field.set_convention_tooltip(_ANGLE_TIP.format(unit=unit))
        self.angle_field.set_step(self.angle_step)
        self.limit_angles([self.angle_field] + (self.axis_fields if rotvec else []))
        if not rotvec:
            for field in self.axis_fields:
                field.clear_range()
        self.angle_label.setText(self.unit_label("Angle"))
        self.show_unit_in_title("Axis && angle")
        for c, label, field in zip("xyz", self.axis_labels, self.axis_fields):
            label.setText(self.unit_label(f"Vector {c}") if rotvec else f"Axis {c}")
            field.set_convention_tooltip((_ROTVEC_TIP if rotvec else _AXIS_TIP).format(c=c, unit=unit))
            field.set_step(self.angle_step if rotvec else 0.01)
            if not rotvec:
                field.set_angle_unit(None)          # axis components are plain numbers

    def render_values(self) -> None:
        self._pending_length = None
        o = self.model.current_orientation()
        if self.showing_rotation_vector:
            for field, v in zip(self.axis_fields, self.shown_angles(o.as_rotation_vector(degrees=True))):
                field.set_text(self.fmt(v))
            self.note.setText("Length = angle; direction = axis.")
            return
        axis, angle = o.as_axis_angle(degrees=True)
        angle = float(self.shown_angles(angle))
        if angle == 0:
            axis = self._last_axis
            self.note.setText("Angle 0: the axis is undefined (last axis kept).")
        else:
            self._last_axis = axis
            self.note.setText("")
        for field, v in zip(self.axis_fields, axis):
            field.set_text(self.fmt(v))
        self.angle_field.set_text(self.fmt(angle))
        self._set_slider(o.angle)

    def _set_slider(self, angle_deg: float) -> None:
        self.slider.blockSignals(True)
        self.slider.setValue(int(round(angle_deg * 10)))
        self.slider.blockSignals(False)

    # ---- fields -> model ------------------------------------------------------------------------
    def read_orientation(self) -> Orientation | None:
        values = self.read_fields(self.fields)
        if values is None:
            return None
        try:
            if self.showing_rotation_vector:
                return Orientation.from_rotation_vector(self.angles_in_degrees(values), degrees=True)
            o = Orientation.from_axis_angle(values[:3], float(self.angles_in_degrees(values[3])), degrees=True)
        except FramewrightError as exc:
            for field in self.axis_fields:
                field.set_problem(str(exc))
            return None
        length = float(np.linalg.norm(values[:3]))
        self._pending_length = length if o.notes and not self.showing_rotation_vector else None
        if self.showing_rotation_vector:
            return o
        if values[3] == 0:
            self.note.setText("Angle 0: the axis is undefined (axis typed kept).")
        elif o.notes:
            self.note.setText(f"Axis length {length:.6g}, not unit length: normalised on commit.")
        else:
            self.note.setText("")
        if length > 0:
            self._last_axis = np.asarray(values[:3]) / length
        return o

    def after_edit(self, orientation) -> None:
        if not self.showing_rotation_vector:
            self._set_slider(orientation.angle)

    def finish_editing(self) -> None:
        length = self._pending_length
        super().finish_editing()
        if length is not None and not self.showing_rotation_vector:
            self.note.setText(f"Axis normalised (its length was {length:.6g}).")

    def _on_slider(self, tenths: int) -> None:
        axis = self._last_axis
        angle = tenths / 10.0
        o = Orientation.from_axis_angle(axis, angle, degrees=True)
        self.angle_field.set_text(self.fmt(self.shown_angles(angle)))
        for field, v in zip(self.axis_fields, axis):
            field.set_text(self.fmt(v))
        self.push(o, "slider")
