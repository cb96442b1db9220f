"""Adjust panel: after the Check panel's verdict, what to turn and how sure the measurement is.

For the check's nominal N and measured M it shows the correction C (M · C = N) in body and reference
axes, the angles about the mount's own adjustment axes, the shims under its footprint with the turn about
the face normal left for slotted holes, and, with a standard uncertainty, the ISO 14253-1 decision drawn
on one bar (tolerance, guard band, measured value). Its inputs are saved with the check (one undo step
each); the numbers come from core/correction.py, core/shims.py and core/decision.py. Above the
uncertainty, the selected mount's repeated measurements (app/panels/repeats_box.py), whose scatter can
fill the uncertainty.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import QRectF
from PySide6.QtGui import QColor, QPainter
from PySide6.QtWidgets import (QFormLayout, QGroupBox, QPlainTextEdit, QSizePolicy, QSpinBox, QVBoxLayout,
                               QWidget)

from app.model import CHECK, MEASUREMENTS, MOUNTS, ORIENTATION, PREFERENCES, SELECTION, SESSION, Change, SessionModel
from app.panels.base import Panel
from app.panels.repeats_box import RepeatedMeasurementsBox
from app.text import angle, fixed, vector
from app.widgets.with_tips import button, choice_box, length_choice, line_field, reading_label
from core import operations, units
from core.check import check
from core.correction import adjustment_angles, correction, read_axes
from core.decision import CANNOT_DECIDE, CONFORMS, DOES_NOT_CONFORM, decide_setup
from core.errors import FramewrightError
from core.number_text import parse_number
from core.shims import outward_normal, read_footprint, shims


class DecisionBar(QWidget):
    """Zero to beyond the tolerance: the conformance zone (green), the guard bands either side of the
    tolerance (amber), non-conformance (red), and the measured value as a black mark."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.setMinimumHeight(26)
        self.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Fixed)
        self.decision = None

    def show_decision(self, decision) -> None:
        self.decision = decision
        self.update()

    def paintEvent(self, event) -> None:
        if self.decision is None:
            return
        d = self.decision
        top = max(d.non_conformance_limit_deg, d.value_deg) * 1.15 or 1.0
        painter = QPainter(self)
        width, height = self.width() - 2, self.height() - 8

        def x(value):
            return 1 + width * min(value, top) / top

        for start, end, colour in ((0, d.conformance_limit_deg, "#2e7d32"),
                                   (d.conformance_limit_deg, d.non_conformance_limit_deg, "#f9a825"),
                                   (d.non_conformance_limit_deg, top, "#c62828")):
            if end > start:
                painter.fillRect(QRectF(x(start), 4, x(end) - x(start), height), QColor(colour))
        painter.setPen(QColor("#000000"))
        painter.drawLine(int(x(d.tolerance_deg)), 0, int(x(d.tolerance_deg)), self.height())
        mark = x(d.value_deg)
        painter.fillRect(QRectF(mark - 2, 0, 4, self.height()), QColor("#000000"))
        painter.end()


class AdjustPanel(Panel):
    watches = frozenset({CHECK, MOUNTS, ORIENTATION, MEASUREMENTS, SELECTION, PREFERENCES})

    def __init__(self, model: SessionModel, parent=None):
        super().__init__(model, parent)
        self._shown: dict[str, str] = {}        # the feet and pitch text as last rendered

        self.correction_label = reading_label()
        self.axes_field = line_field("The mount's adjustment axes in the order they are turned, separated by ';': a "
                                     "named axis (+X, −Y, Z) or three numbers. Any directions; they need not be at "
                                     "right angles. Enter to use them.", placeholder="+Z; +Y; +X   or   0 0 1; 0.2 1 0")
        self.frame_box = choice_box("The frame the adjustment axes are written in.",
                                    [("body axes", "body"), ("reference axes", "reference")])
        self.angles_label = reading_label()

        self.footprint_field = QPlainTextEdit()
        self.footprint_field.setPlaceholderText("one foot a line: x y z (body axes)")
        self.footprint_field.setToolTip("The feet or bolt points in body coordinates, in the length unit chosen "
                                        "above, one 'x y z' a line. They must lie on one face; its outward normal "
                                        "is taken on the side away from the body origin.")
        self.length_box = length_choice("The unit the feet, the screw pitch and the shims are typed and shown in. "
                                        "They are kept in mm; changing it shows the same lengths in the new unit. "
                                        "thou: a thousandth of an inch (0.0254 mm), not an angular mil.",
                                        ("mm", "in", "thou"))
        self.footprint_field.setMaximumHeight(90)
        self.corners_button = button("Corners of the face opposite the boresight",
                                     "Fill in the four corners of the part box's face opposite its boresight "
                                     "face (Edit ▸ Part of the mount…).")
        self.use_feet_button = button("Use these feet", "Take the feet typed above (a footprint that is refused "
                                                        "keeps the last good one).")
        self.pivot_box = QSpinBox()
        self.pivot_box.setMinimum(1)
        self.pivot_box.setToolTip("The foot that should stay put.")
        self.pitch_field = line_field("Thread pitch of levelling screws under the feet, in the length unit per turn "
                                      "(an inch thread of 20 per inch is 0.05 in; empty: none). "
                                      "Enter to use it.", placeholder="none")
        self.shims_label = reading_label()

        self.uncertainty_field = line_field("Standard uncertainty u of the measured orientation, degrees or a number "
                                            "with its unit mark (0.1 mrad, 20″), the same about every axis (empty: "
                                            "none). With it the check decides by ISO "
                                            "14253-1. Enter to use it.", placeholder="none")
        self.coverage_field = line_field("Coverage factor k of the expanded uncertainty U = k·u (usually 2).")
        self.decision_label = reading_label()
        self.decision_bar = DecisionBar()
        self.repeats = RepeatedMeasurementsBox(model)

        what = QGroupBox("Correction (turns measured into nominal)")
        QVBoxLayout(what).addWidget(self.correction_label)
        turn = QGroupBox("Adjustment axes")
        turn_form = QFormLayout(turn)
        turn_form.addRow("Axes, in order", self.axes_field)
        turn_form.addRow("Written in", self.frame_box)
        turn_form.addRow(self.angles_label)
        feet = QGroupBox("Shims under the footprint")
        feet_form = QFormLayout(feet)
        feet_form.addRow("Lengths in", self.length_box)
        feet_form.addRow(self.footprint_field)
        feet_form.addRow(self.corners_button)
        feet_form.addRow(self.use_feet_button)
        feet_form.addRow("Pivot foot", self.pivot_box)
        feet_form.addRow("Screw pitch", self.pitch_field)
        feet_form.addRow(self.shims_label)
        sure = QGroupBox("Measurement uncertainty (ISO 14253-1)")
        sure_form = QFormLayout(sure)
        sure_form.addRow("Standard uncertainty u (°)", self.uncertainty_field)
        sure_form.addRow("Coverage k", self.coverage_field)
        sure_form.addRow(self.decision_bar)
        sure_form.addRow(self.decision_label)
        layout = QVBoxLayout(self)
        for box in (what, turn, feet, self.repeats, sure):
            layout.addWidget(box)
        layout.addWidget(self.message)
        layout.addStretch(1)

        self.axes_field.returnPressed.connect(self._axes_typed)
        self.frame_box.activated.connect(lambda i: self._set(axes_frame=self.frame_box.itemData(i)))
        self.use_feet_button.clicked.connect(self._feet_typed)
        self.corners_button.clicked.connect(self._corners)
        self.pivot_box.valueChanged.connect(self._pivot_chosen)
        self.pitch_field.returnPressed.connect(self._pitch_typed)
        self.length_box.activated.connect(lambda i: self._set(length_unit=self.length_box.itemData(i)))
        self.uncertainty_field.returnPressed.connect(self._uncertainty_typed)
        self.coverage_field.returnPressed.connect(self._coverage_typed)
        self.render()

    # ---- edits -------------------------------------------------------------------------------------
    def _set(self, **fields) -> bool:
        check_state = self.model.check
        try:
            setup = replace(check_state.adjustment, **fields)
        except FramewrightError as error:
            self.message.problem(f"{error} (kept the last good value)")
            return False
        self.message.clear()
        if setup != check_state.adjustment:
            self.model.apply(operations.set_check, replace(check_state, adjustment=setup), origin=self,
                             text="Adjust: " + ", ".join(k.replace("_", " ") for k in fields))
        return True

    def _axes_typed(self) -> None:
        text = self.axes_field.text().strip()
        if text:
            try:
                read_axes(text)
            except FramewrightError as error:
                self.message.problem(f"{error} (kept the last good axes)")
                return
        self._set(axes=text)

    def _feet_typed(self) -> None:
        text = self.footprint_field.toPlainText()
        if text == self._shown.get("feet"):
            return          # the feet as shown, untouched: the stored ones stay exactly as they are
        try:
            feet = units.to_millimetres(read_footprint(text), self._length()) if text.strip() else ()
            if len(feet):
                outward_normal(feet)
        except FramewrightError as error:
            self.message.problem(f"{error} (kept the last good footprint)")
            return
        setup = self.model.check.adjustment
        self._set(footprint=tuple(map(tuple, feet)), pivot=min(setup.pivot, max(len(feet) - 1, 0)))

    def _corners(self) -> None:
        _, measured = self.model.check_mount_indices()
        if measured is None:
            self.message.problem("Choose a measured mount in the Check panel first.")
            return
        part = self.model.mounts[measured].part
        sign = -1.0 if part.boresight.startswith("+") else 1.0
        index = "XYZ".index(part.boresight[1])
        half = [s / 2 for s in part.box_size_mm]
        others = [i for i in range(3) if i != index]
        feet = []
        for a, b in ((1, 1), (-1, 1), (-1, -1), (1, -1)):
            foot = [0.0, 0.0, 0.0]
            foot[index] = sign * half[index]
            foot[others[0]], foot[others[1]] = a * half[others[0]], b * half[others[1]]
            feet.append(tuple(foot))
        self._set(footprint=tuple(feet), pivot=0)

    def _pivot_chosen(self, value: int) -> None:
        if not self._rendering and self.model.check.adjustment.footprint:
            self._set(pivot=value - 1)

    def _length(self) -> str:
        return self.model.check.adjustment.length_unit

    def _pitch_typed(self) -> None:
        text = self.pitch_field.text().strip()
        if text == self._shown.get("pitch"):
            return
        try:
            value = None if text in ("", "none") else float(units.to_millimetres(parse_number(text), self._length()))
        except ValueError as error:
            self.message.problem(f"{error} (kept the last good value)")
            return
        self._set(pitch_mm=value)

    def _uncertainty_typed(self) -> None:
        """Degrees, or a number with its unit mark as the instrument's certificate states it (0.1 mrad, 20″)."""
        text = self.uncertainty_field.text().strip()
        try:
            value = None if text in ("", "none") else units.read_angle(text, "deg").degrees
        except ValueError as error:
            self.message.problem(f"{error} (kept the last good value)")
            return
        # a u typed by hand is the same about every axis: a covariance from a scatter or a fit no longer holds
        self._set(uncertainty_deg=value, covariance_deg2=None)

    def _coverage_typed(self) -> None:
        try:
            value = parse_number(self.coverage_field.text())
        except ValueError as error:
            self.message.problem(f"{error} (kept the last good value)")
            return
        self._set(coverage=value)

    # ---- model -> view -----------------------------------------------------------------------------
    def follow(self, change: Change) -> None:
        if change.touches(SESSION, SELECTION):
            self.repeats.forget_message()   # it spoke of the last mount (or of another session's)

    def render(self) -> None:
        with self.rendering():
            self._render_inputs()
            self._render_results()
            self.repeats.render()

    def _render_inputs(self) -> None:
        setup = self.model.check.adjustment
        if not self.axes_field.hasFocus():
            self.axes_field.setText(setup.axes)
        self.frame_box.setCurrentIndex(self.frame_box.findData(setup.axes_frame))
        unit = setup.length_unit
        self.length_box.setCurrentIndex(max(0, self.length_box.findData(unit)))
        if not self.footprint_field.hasFocus():
            self._shown["feet"] = "\n".join(" ".join(_length_text(v, unit) for v in foot) for foot in setup.footprint)
            self.footprint_field.setPlainText(self._shown["feet"])
        self.pivot_box.setMaximum(max(1, len(setup.footprint)))
        self.pivot_box.setValue(setup.pivot + 1)
        self.pivot_box.setEnabled(bool(setup.footprint))
        if not self.pitch_field.hasFocus():
            self._shown["pitch"] = "" if setup.pitch_mm is None else _length_text(setup.pitch_mm, unit)
            self.pitch_field.setText(self._shown["pitch"])
        if not self.uncertainty_field.hasFocus():
            self.uncertainty_field.setText("" if setup.uncertainty_deg is None else f"{setup.uncertainty_deg:g}")
        if not self.coverage_field.hasFocus():
            self.coverage_field.setText(f"{setup.coverage:g}")

    def _render_results(self) -> None:
        nominal_index, measured_index = self.model.check_mount_indices()
        if nominal_index is None or measured_index is None:
            for label in (self.correction_label, self.angles_label, self.shims_label, self.decision_label):
                label.setText("")
            self.correction_label.setText("Choose a nominal and a measured mount in the Check panel.")
            self.decision_bar.show_decision(None)
            return
        mounts = self.model.mounts
        nominal, measured = mounts[nominal_index].orientation, mounts[measured_index].orientation
        setup = self.model.check.adjustment
        unit = self.model.preferences.angle_units
        fix = correction(nominal, measured)
        if fix.axis_body is None:
            self.correction_label.setText("No correction needed: the measured orientation is the nominal.")
        else:
            self.correction_label.setText(
                f"{_angle(fix.angle_deg, unit)} about {vector(fix.axis_body)} in body axes\n"
                f"{_angle(fix.angle_deg, unit)} about {vector(fix.axis_reference)} in reference axes\n"
                f"Small turns about body X, Y, Z: {_small_turns(fix.small_angles_body_deg, unit)}")
        self.angles_label.setText(self._angles_text(fix, setup, unit))
        self.shims_label.setText(self._shims_text(fix, setup, unit))
        self._render_decision(nominal, measured, setup, unit)

    @staticmethod
    def _angles_text(fix, setup, unit: str) -> str:
        if not setup.axes:
            return "Type the axes the mount turns about to get the angles for each."
        try:
            result = adjustment_angles(fix.body if setup.axes_frame == "body" else fix.reference,
                                       read_axes(setup.axes))
        except FramewrightError as error:
            return str(error)
        lines = [f"{i}. about {vector(axis, 3)}: {_angle(angle, unit)}"
                 for i, (axis, angle) in enumerate(zip(result.axes, result.angles_deg), start=1)]
        lines.append("These reach the correction exactly." if result.exact else
                     f"These axes cannot reach the correction: {_angle(result.residual_deg, unit)} remains "
                     "(the closest they can do).")
        return "\n".join(lines)

    @staticmethod
    def _shims_text(fix, setup, unit: str) -> str:
        if not setup.footprint:
            return "Type the feet, or take the corners of the part's face, to get the shims."
        try:
            normal = outward_normal(setup.footprint)
            result = shims(fix.body, setup.footprint, normal, pivot=setup.pivot, pitch_mm=setup.pitch_mm)
        except FramewrightError as error:
            return str(error)
        lines, length = [], setup.length_unit
        for i, (foot, thickness) in enumerate(zip(setup.footprint, result.shims_mm), start=1):
            turns = "" if result.turns is None else f", {result.turns[i - 1]:.3f} turns"
            at = vector(units.millimetres_to(foot, length), _FOOT_DECIMALS[length])
            lines.append(f"Foot {i} at {at}: {_shim_text(thickness, length)}{turns}")
        slope = units.format_slope(result.tilt_deg, "mm/m" if length in ("mm", "m") else "in/ft")
        lines.append(f"Tilt made by the shims: {_angle(result.tilt_deg, unit)} ({slope}); turn about the face "
                     f"normal {vector(normal, 3)} left for the slotted holes: {_angle(result.twist_deg, unit)}")
        if result.pivot_lifted_mm > 0:
            lines.append(f"The pivot foot needs {_shim_text(result.pivot_lifted_mm, length)} too: no shim "
                         "can be negative.")
        return "\n".join(lines)

    def _render_decision(self, nominal, measured, setup, unit: str) -> None:
        result = check(nominal, measured, self.model.check.settings)
        try:
            decisions, overall = decide_setup(nominal, measured, self.model.check.settings, result, setup)
        except FramewrightError as error:
            self.decision_label.setText(str(error))
            self.decision_bar.show_decision(None)
            return
        words = {CONFORMS: "Conforms", CANNOT_DECIDE: "Cannot decide", DOES_NOT_CONFORM: "Does not conform"}
        lines = [f"{words[overall]}"]
        lines += [f"• {c.name} {_angle(c.value_deg, unit)} against {_angle(c.tolerance_deg, unit)}: {d.words()}"
                  for c, d in decisions]
        self.decision_label.setText("\n".join(lines))
        closest = max(decisions, key=lambda cd: cd[0].value_deg - cd[0].tolerance_deg)
        self.decision_bar.show_decision(closest[1])


def _angle(value_deg: float, unit: str) -> str:
    """An angle in the display unit; degrees to 0.0001° here, finer than a check's figures, since a turn
    of a screw or a shim is set from it."""
    return angle(value_deg, unit, 4 if unit == "deg" else None)


def _small_turns(values_deg, unit: str) -> str:
    key = "deg" if unit == "dms" else unit          # three small turns read best as decimals
    return units.with_symbol(vector(units.degrees_to(values_deg, key), units.angle_unit(key).decimals), key)


# Feet are read to a tenth of a millimetre (or its like); shims to the unit's usual reading (0.001 mm,
# 0.0001 in, 0.01 thou: core/units.py).
_FOOT_DECIMALS = {"mm": 1, "in": 3, "thou": 1}


def _shim_text(millimetres: float, unit: str) -> str:
    return f"{fixed(float(units.millimetres_to(millimetres, unit)), units.length_unit(unit).decimals)} " \
           f"{units.length_unit(unit).symbol}"


def _length_text(millimetres: float, unit: str) -> str:
    """A stored length in the shown unit to six significant digits (9.84252 in for 250 mm): what a person
    reads and types. Text left as shown is not read back, so the stored mm are never rounded through it."""
    return f"{float(units.millimetres_to(millimetres, unit)):.6g}"
