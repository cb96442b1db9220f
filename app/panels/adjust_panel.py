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
from PySide6.QtWidgets import (QFormLayout, QGroupBox, QLineEdit, QPlainTextEdit, QSizePolicy, QSpinBox, QVBoxLayout,
                               QWidget)

from app.model import CHECK, MEASUREMENTS, MOUNTS, ORIENTATION, PREFERENCES, SELECTION, SESSION, Change, SessionModel
from app.panels.base import Panel
from app.panels.repeats_box import RepeatedMeasurementsBox
from app.text import degrees, vector
from app.widgets.with_tips import button, choice_box, line_field, reading_label
from core import operations
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

        self.correction_label = reading_label()
        self.axes_field = line_field("The mount's adjustment axes in the order they are turned, separated by ';': a "
                                     "named axis (+X, −Y, Z) or three numbers. Any directions; they need not be at "
                                     "right angles. Enter to use them.", placeholder="+Z; +Y; +X   or   0 0 1; 0.2 1 0")
        self.frame_box = choice_box("The frame the adjustment axes are written in.",
                                    [("body axes", "body"), ("reference axes", "reference")])
        self.angles_label = reading_label()

        self.footprint_field = QPlainTextEdit()
        self.footprint_field.setPlaceholderText("one foot a line: x y z (body mm)")
        self.footprint_field.setToolTip("The feet or bolt points in body coordinates, mm, one 'x y z' a line. "
                                        "They must lie on one face; its outward normal is taken on the side away "
                                        "from the body origin.")
        self.footprint_field.setMaximumHeight(90)
        self.corners_button = button("Corners of the face opposite the boresight",
                                     "Fill in the four corners of the part box's face opposite its boresight "
                                     "face (Edit ▸ Part of the mount…).")
        self.use_feet_button = button("Use these feet", "Take the feet typed above (a footprint that is refused "
                                                        "keeps the last good one).")
        self.pivot_box = QSpinBox()
        self.pivot_box.setMinimum(1)
        self.pivot_box.setToolTip("The foot that should stay put.")
        self.pitch_field = line_field("Thread pitch of levelling screws under the feet, mm per turn (empty: none). "
                                      "Enter to use it.", placeholder="none")
        self.shims_label = reading_label()

        self.uncertainty_field = line_field("Standard uncertainty u of the measured orientation, degrees, the same "
                                            "about every axis (empty: none). With it the check decides by ISO "
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
        feet_form.addRow(self.footprint_field)
        feet_form.addRow(self.corners_button)
        feet_form.addRow(self.use_feet_button)
        feet_form.addRow("Pivot foot", self.pivot_box)
        feet_form.addRow("Screw pitch (mm)", self.pitch_field)
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
        self.pitch_field.returnPressed.connect(lambda: self._optional_number(self.pitch_field, "pitch_mm"))
        self.uncertainty_field.returnPressed.connect(
            lambda: self._optional_number(self.uncertainty_field, "uncertainty_deg"))
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
        try:
            feet = read_footprint(text) if text.strip() else ()
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

    def _optional_number(self, field: QLineEdit, key: str) -> None:
        text = field.text().strip()
        try:
            value = None if text in ("", "none") else parse_number(text)
        except ValueError as error:
            self.message.problem(f"{error} (kept the last good value)")
            return
        # a u typed by hand is the same about every axis: a covariance from a scatter or a fit no longer holds
        self._set(**{key: value}, **({"covariance_deg2": None} if key == "uncertainty_deg" else {}))

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
        if not self.footprint_field.hasFocus():
            self.footprint_field.setPlainText("\n".join(" ".join(f"{v:g}" for v in foot) for foot in setup.footprint))
        self.pivot_box.setMaximum(max(1, len(setup.footprint)))
        self.pivot_box.setValue(setup.pivot + 1)
        self.pivot_box.setEnabled(bool(setup.footprint))
        for field, value in ((self.pitch_field, setup.pitch_mm), (self.uncertainty_field, setup.uncertainty_deg)):
            if not field.hasFocus():
                field.setText("" if value is None else f"{value:g}")
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
        fix = correction(nominal, measured)
        if fix.axis_body is None:
            self.correction_label.setText("No correction needed: the measured orientation is the nominal.")
        else:
            self.correction_label.setText(
                f"{degrees(fix.angle_deg, 4)} about {vector(fix.axis_body)} in body axes\n"
                f"{degrees(fix.angle_deg, 4)} about {vector(fix.axis_reference)} in reference axes\n"
                f"Small turns about body X, Y, Z: {vector(fix.small_angles_body_deg)}°")
        self.angles_label.setText(self._angles_text(fix, setup))
        self.shims_label.setText(self._shims_text(fix, setup))
        self._render_decision(nominal, measured, setup)

    @staticmethod
    def _angles_text(fix, setup) -> str:
        if not setup.axes:
            return "Type the axes the mount turns about to get the angles for each."
        try:
            result = adjustment_angles(fix.body if setup.axes_frame == "body" else fix.reference,
                                       read_axes(setup.axes))
        except FramewrightError as error:
            return str(error)
        lines = [f"{i}. about {vector(axis, 3)}: {degrees(angle, 4)}"
                 for i, (axis, angle) in enumerate(zip(result.axes, result.angles_deg), start=1)]
        lines.append("These reach the correction exactly." if result.exact else
                     f"These axes cannot reach the correction: {degrees(result.residual_deg, 4)} remains "
                     "(the closest they can do).")
        return "\n".join(lines)

    @staticmethod
    def _shims_text(fix, setup) -> str:
        if not setup.footprint:
            return "Type the feet, or take the corners of the part's face, to get the shims."
        try:
            normal = outward_normal(setup.footprint)
            result = shims(fix.body, setup.footprint, normal, pivot=setup.pivot, pitch_mm=setup.pitch_mm)
        except FramewrightError as error:
            return str(error)
        lines = []
        for i, (foot, thickness) in enumerate(zip(setup.footprint, result.shims_mm), start=1):
            turns = "" if result.turns is None else f", {result.turns[i - 1]:.3f} turns"
            lines.append(f"Foot {i} at {vector(foot, 1)}: {thickness:.3f} mm{turns}")
        lines.append(f"Tilt made by the shims: {degrees(result.tilt_deg, 4)}; turn about the face normal "
                     f"{vector(normal, 3)} left for the slotted holes: {degrees(result.twist_deg, 4)}")
        if result.pivot_lifted_mm > 0:
            lines.append(f"The pivot foot needs {result.pivot_lifted_mm:.3f} mm too: no shim can be negative.")
        return "\n".join(lines)

    def _render_decision(self, nominal, measured, setup) -> None:
        result = check(nominal, measured, self.model.check.settings)
        try:
            decisions, overall = decide_setup(nominal, measured, self.model.check.settings, result, setup)
        except FramewrightError as error:
            self.decision_label.setText(str(error))
            self.decision_bar.show_decision(None)
            return
        words = {CONFORMS: "Conforms", CANNOT_DECIDE: "Cannot decide", DOES_NOT_CONFORM: "Does not conform"}
        lines = [f"{words[overall]}"]
        lines += [f"• {c.name} {degrees(c.value_deg, 4)} against {degrees(c.tolerance_deg, 4)}: {d.words()}"
                  for c, d in decisions]
        self.decision_label.setText("\n".join(lines))
        closest = max(decisions, key=lambda cd: cd[0].value_deg - cd[0].tolerance_deg)
        self.decision_bar.show_decision(closest[1])
