"""Check panel: a measured mount against its nominal, within tolerance (core/check.py).

Shows the total deviation and its axis, the pointing error of a chosen body axis and the roll about it
(a swing-twist split), a large plain PASS or FAIL and the margin. The choices (which mount is nominal,
which is measured, the mode, the body axis, the tolerances) are session state in the model, so each
change is one undo step and is saved with the session. Choosing the measured mount selects it, so the
Scene shows it with the nominal as its ghost.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtGui import QFont
from PySide6.QtWidgets import QComboBox, QFormLayout, QGroupBox, QHBoxLayout, QLabel, QVBoxLayout

from app.model import CHECK, MOUNTS, ORIENTATION, POSITION, PREFERENCES, SELECTION, Change, SessionModel
from app.panels.base import Panel
from app.text import angle, fixed, vector
from app.widgets.message_line import MessageLine
from app.widgets.number_field import NumberField, parse_number
from app.widgets.with_tips import button, choice_box, line_field, reading_label
from core import axes, operations, units
from core.check import POSITION_TOLERANCE_LIMIT_MM, check, check_position
from core.decision import CANNOT_DECIDE, decide_setup
from core.errors import FramewrightError

PASS_STYLE = "background:#2e7d32; color:white; padding:6px 18px; border-radius:4px"
FAIL_STYLE = "background:#c62828; color:white; padding:6px 18px; border-radius:4px"
IDLE_STYLE = "background:#5f6368; color:white; padding:6px 18px; border-radius:4px"
NOT_CHOSEN = "(none chosen)"
MODES = (("total", "Total deviation"), ("pointing_and_roll", "Pointing error and roll"))
TYPED = "typed"
NO_AXIS = "none"


# No two orientations are more than 180° apart, so a larger tolerance could never fail.
TOLERANCE_MAX_DEG = 180.0


class CheckPanel(Panel):
    watches = frozenset({CHECK, MOUNTS, ORIENTATION, SELECTION, POSITION, PREFERENCES})

    def __init__(self, model: SessionModel, parent=None):
        super().__init__(model, parent)
        self.nominal_box = choice_box("The mount that holds the orientation the part should have (from the "
                                      "drawing). It is drawn as the ghost while the measured mount is shown.",
                                      least_chars=14)
        self.measured_box = choice_box("The mount that holds the orientation the part was measured to have. "
                                       "Choosing it shows it in the Scene, with the nominal as the ghost.",
                                       least_chars=14)
        self.show_button = button("Show the measured mount", "Select the measured mount, so the editors and the "
                                                             "Scene show it with the nominal as the ghost.")
        self.mode_box = choice_box("Total deviation: the angle of the one turn from the nominal to the measured "
                                   "orientation (D = Nᵀ M), against one tolerance. Pointing error and roll: how "
                                   "far the chosen body axis points off, and the turn left about that axis, each "
                                   "against its own tolerance.", [(label, key) for key, label in MODES])
        self.axis_box = QComboBox()
        self.axis_box.addItem("none", NO_AXIS)
        for name in axes.SIGNED_AXES:
            self.axis_box.addItem(axes.display(name), name)
        self.axis_box.addItem("typed (x, y, z)", TYPED)
        self.axis_box.setToolTip("The body axis whose pointing is judged (e.g. the boresight), in body "
                                 "coordinates. 'none' reports the total deviation only.")
        self.axis_field = line_field("A body-frame direction as three numbers x, y, z (any length; '.' is the "
                                     "decimal point); Enter to use it.", placeholder="x, y, z")
        self.total_field = self._tolerance_field(
            "Total deviation tolerance: the largest angle of the turn from nominal to measured that "
            "passes. A value equal to the tolerance passes.")
        self.pointing_field = self._tolerance_field(
            "Pointing tolerance: the largest angle between where the body axis should point "
            "(nominal) and where it does point (measured) that passes.")
        self.roll_field = self._tolerance_field(
            "Roll tolerance: the largest turn about the body axis (after the pointing is corrected) "
            "that passes, either sign.")
        self.position_field = NumberField(
            "Position tolerance in mm: the largest distance of the measured origin from the nominal one that "
            "passes, judged when both mounts have a position. Empty: positions are reported, not judged. "
            "'.' is the decimal point; Enter to use it.", steppable=False)
        self.position_field.set_range(0.0, POSITION_TOLERANCE_LIMIT_MM,
                                      f"0 to {POSITION_TOLERANCE_LIMIT_MM:g} mm")
        self.position_field.fit_digits(4)

        choose = QGroupBox("Compare")
        form = QFormLayout(choose)
        form.addRow("Nominal", self.nominal_box)
        form.addRow("Measured", self.measured_box)
        form.addRow("", self.show_button)
        form.addRow("Check by", self.mode_box)
        axis_row = QHBoxLayout()
        axis_row.addWidget(self.axis_box)
        axis_row.addWidget(self.axis_field, 1)
        form.addRow("Body axis", axis_row)
        form.addRow(self.message)
        tolerances = QGroupBox("Tolerances")
        t_form = QFormLayout(tolerances)
        self.tolerance_labels = {}
        for name, field in (("total", self.total_field), ("pointing", self.pointing_field),
                            ("roll", self.roll_field)):
            row = QHBoxLayout()
            row.addWidget(field)
            row.addStretch(1)
            self.tolerance_labels[name] = QLabel(name.capitalize())
            t_form.addRow(self.tolerance_labels[name], row)
        position_row = QHBoxLayout()
        position_row.addWidget(self.position_field)
        position_row.addWidget(QLabel("mm (empty: not judged)"))
        position_row.addStretch(1)
        t_form.addRow("Position", position_row)
        # What is wrong with a typed tolerance is said here, under the tolerances, not under the axis.
        self.tolerance_note = MessageLine()
        t_form.addRow(self.tolerance_note)

        result = QGroupBox("Result")
        self.verdict = QLabel("—")
        font = QFont(self.font())
        font.setPointSizeF(max(self.font().pointSizeF(), 9.0) * 2.4)
        font.setBold(True)
        self.verdict.setFont(font)
        self.verdict.setAlignment(Qt.AlignmentFlag.AlignCenter)
        self.verdict.setToolTip("PASS when every figure judged (the orientation first, then the position when a position "
                                "tolerance is given) is within its tolerance, else FAIL.")
        self.margin_label = QLabel("")
        margin_font = QFont(self.font())
        margin_font.setBold(True)
        self.margin_label.setFont(margin_font)
        self.margin_label.setToolTip("Margin = tolerance − value of the figure closest to failing; negative when "
                                     "it fails.")
        self.details = reading_label("Deviation D = Nᵀ M, written in the nominal body frame; its axis is in nominal "
                                     "body axes. Pointing error: angle between N·a and M·a. Roll: the turn about a "
                                     "left after the pointing correction (right-hand rule about a).")
        self.margin_label.setWordWrap(True)
        self.decision_words = reading_label("With a standard uncertainty u of the measurement (typed on the Adjust tab, "
                                            "or taken from a fit or from repeated measurements), the decision of "
                                            "ISO 14253-1: conforms at most T − U, does not conform beyond T + U, "
                                            "and in between the measurement cannot decide (U = k·u).")
        verdict_row = QHBoxLayout()
        verdict_row.addWidget(self.verdict)
        verdict_row.addStretch(1)
        result_layout = QVBoxLayout(result)
        result_layout.addLayout(verdict_row)
        result_layout.addWidget(self.margin_label)
        result_layout.addWidget(self.decision_words)
        result_layout.addWidget(self.details)
        # After the orientation's figures: the position offset, when both mounts have a position.
        self.position_result = reading_label("Offset of the measured origin from the nominal one: the distance, and "
                                             "its parts along the nominal body axes, Nᵀ (t_measured − t_nominal).")
        result_layout.addWidget(self.position_result)

        layout = QVBoxLayout(self)
        layout.addWidget(choose)
        layout.addWidget(tolerances)
        layout.addWidget(result)
        layout.addStretch(1)

        self.nominal_box.activated.connect(lambda i: self._choose("nominal", self.nominal_box.itemData(i)))
        self.measured_box.activated.connect(lambda i: self._choose("measured", self.measured_box.itemData(i)))
        self.show_button.clicked.connect(self.show_measured)
        self.mode_box.activated.connect(self._mode_chosen)
        self.axis_box.activated.connect(self._axis_chosen)
        self.axis_field.returnPressed.connect(self._typed_axis)
        for field, key in ((self.total_field, "total_tolerance_deg"), (self.pointing_field, "pointing_tolerance_deg"),
                           (self.roll_field, "roll_tolerance_deg")):
            field.committed.connect(lambda f=field, k=key: self._tolerance_typed(f, k))
            field.editingFinished.connect(lambda f=field, k=key: self._tolerance_typed(f, k))
            field.stepped.connect(lambda v, k=key: self._tolerance_stepped(k, v))
        self.position_field.committed.connect(self._position_tolerance_typed)
        self.position_field.editingFinished.connect(self._position_tolerance_typed)
        self.render()

    def _position_tolerance_typed(self) -> None:
        text = self.position_field.text().strip()
        try:
            value = None if not text else self.position_field.value()
        except ValueError as exc:
            self.position_field.set_problem(str(exc))
            self.tolerance_note.problem(f"{exc} (kept the last good position tolerance)")
            return
        self.tolerance_note.clear()
        self.position_field.set_problem(None)
        if value != self.model.check.settings.position_tolerance_mm:
            self.position_field.set_problem(self._set_settings("position_tolerance_mm", value))

    @staticmethod
    def _tolerance_field(tip: str) -> NumberField:
        field = NumberField(tip + f" More than 0 and at most {TOLERANCE_MAX_DEG:g}° (no two orientations are "
                                  "further apart). '.' is the decimal point; a number may carry its unit as the "
                                  "drawing states it (0.5 mrad, 30″, 1′30″, 2 gon), and the field keeps that "
                                  "unit. Enter to use it.", step=0.1)
        field.fit_digits(4)
        return field

    @staticmethod
    def _unit_range(field: NumberField, unit: str) -> None:
        """The field reads and shows `unit`; its range is 0 < tolerance ≤ 180° in that unit."""
        field.set_angle_unit(unit)
        high = float(units.degrees_to(TOLERANCE_MAX_DEG, unit))
        field.set_range(0.0, high, f"0 < tolerance ≤ {units.format_angle(TOLERANCE_MAX_DEG, unit)}",
                        low_excluded=True)

    @staticmethod
    def _tolerance_name(key: str) -> str:
        return key.replace("_tolerance_deg", "")

    def _tolerance_stepped(self, key: str, shown: float) -> None:
        unit = self.model.check.settings.unit_of(self._tolerance_name(key))
        degrees_value = float(units.to_degrees(shown, unit)) if unit != "dms" else shown
        self._set_settings(key, min(TOLERANCE_MAX_DEG, max(0.0, round(degrees_value, 12))))

    # ---- edits -------------------------------------------------------------------------------------
    def _choose(self, which: str, name) -> None:
        check_state = self.model.check
        self.model.apply(operations.set_check, replace(check_state, **{which: name}), origin=self,
                         text=f"Check: {which} {('“' + name + '”') if name else 'none'}")
        if which == "measured":
            self.show_measured()

    def show_measured(self) -> None:
        _, measured = self.model.check_mount_indices()
        if measured is not None:
            self.model.select(measured, origin=self)

    def _set_settings(self, key: str, value) -> str | None:
        """Change one setting (one undo step); returns what is wrong when the value is refused."""
        check_state = self.model.check
        try:
            settings = replace(check_state.settings, **{key: value})
        except FramewrightError as exc:
            self.say(f"{exc} (kept the last good setting)", problem=True)
            return str(exc)
        self.say("")
        self.model.apply(operations.set_check, replace(check_state, settings=settings), origin=self,
                         text=f"Check: {key.replace('_deg', '').replace('_', ' ')}")
        return None

    def _mode_chosen(self, index: int) -> None:
        mode = self.mode_box.itemData(index)
        settings = self.model.check.settings
        if mode == "pointing_and_roll" and settings.body_axis is None:
            # pointing needs an axis: start from the measured part's boresight
            _, measured = self.model.check_mount_indices()
            axis = self.model.mounts[measured].part.boresight if measured is not None else "+Z"
            new = replace(settings, mode=mode, body_axis=axis)
            self.model.apply(operations.set_check, replace(self.model.check, settings=new), origin=self,
                             text="Check: pointing error and roll")
            self.say(f"Pointing needs a body axis: took the boresight, {axes.display(axis)}.")
            self.render()
            return
        self._set_settings("mode", mode)
        self.render()

    def _axis_chosen(self, index: int) -> None:
        choice = self.axis_box.itemData(index)
        if choice == TYPED:
            self.axis_field.setFocus()
            self.render_axis_field_only()
            return
        if choice == NO_AXIS and self.model.check.settings.mode == "pointing_and_roll":
            self.say("Pointing error and roll need a body axis; choose one, or check by "
                     "total deviation (kept the last axis).", problem=True)
            self.render()
            return
        self._set_settings("body_axis", None if choice == NO_AXIS else choice)
        self.render()

    def render_axis_field_only(self) -> None:
        self.axis_field.setEnabled(True)

    def _typed_axis(self) -> None:
        text = self.axis_field.text()
        parts = [p for p in text.replace(",", " ").split() if p]
        try:
            if len(parts) != 3:
                raise ValueError(f"type three numbers x, y, z for the body axis; got “{text.strip()}”")
            values = tuple(parse_number(p) for p in parts)
        except ValueError as exc:
            self.say(f"{exc} (kept the last good axis)", problem=True)
            return
        self._set_settings("body_axis", values)

    def _tolerance_typed(self, field: NumberField, key: str) -> None:
        name = self._tolerance_name(key)
        settings = self.model.check.settings
        try:
            field.value()                              # the range, in the field's unit
            read = units.read_angle(field.text(), settings.unit_of(name))
        except (ValueError, FramewrightError) as exc:
            field.set_problem(str(exc))
            self.tolerance_note.problem(f"{exc} (kept the last good tolerance)")
            return
        if read.degrees == getattr(settings, key) and read.unit == settings.unit_of(name):
            field.set_problem(None)      # nothing new (Enter, then focus leaving): a note of how it was
            if self.tolerance_note.is_problem:     # read stays; a complaint about earlier text goes
                self.tolerance_note.clear()
            return
        self.tolerance_note.clear()
        try:   # the value and the unit it was stated in: one undo step
            new = replace(settings, **{key: read.degrees}).with_unit(name, read.unit)
        except FramewrightError as exc:
            field.set_problem(str(exc))
            self.tolerance_note.problem(f"{exc} (kept the last good tolerance)")
            return
        field.set_problem(None)
        self.say("")
        if read.unit != "deg" or field.understood:
            self.tolerance_note.say(f"Read {read.said}.")
        self.model.apply(operations.set_check, replace(self.model.check, settings=new), origin=self,
                         text=f"Check: {name} tolerance")

    # ---- model -> view -----------------------------------------------------------------------------
    def render_change(self, change: Change) -> None:
        if change.touches(CHECK, MOUNTS):
            self.render()
        else:                          # the orientations or positions compared: the result only
            self._render_result()

    def render(self) -> None:
        with self.rendering():
            self._render_choices()
        self._render_result()

    def _render_choices(self) -> None:
        state = self.model.check
        settings = state.settings
        for box, name in ((self.nominal_box, state.nominal), (self.measured_box, state.measured)):
            box.clear()
            box.addItem(NOT_CHOSEN, None)
            for mount in self.model.mounts:
                box.addItem(mount.name, mount.name)
            index = box.findData(name) if name is not None else 0
            if index < 0:  # a name no mount has any more (deleted): say so, keep it
                box.addItem(f"{name} (no such mount)", name)
                index = box.count() - 1
            box.setCurrentIndex(index)
        self.mode_box.setCurrentIndex(self.mode_box.findData(settings.mode))
        axis = settings.body_axis
        if axis is None:
            self.axis_box.setCurrentIndex(self.axis_box.findData(NO_AXIS))
        elif isinstance(axis, str):
            self.axis_box.setCurrentIndex(self.axis_box.findData(axis))
        else:
            self.axis_box.setCurrentIndex(self.axis_box.findData(TYPED))
            if not self.axis_field.hasFocus():
                self.axis_field.setText(", ".join(f"{c:g}" for c in axis))
        self.axis_field.setEnabled(self.axis_box.currentData() == TYPED)
        pointing = settings.mode == "pointing_and_roll"
        for field, key, used in ((self.total_field, "total_tolerance_deg", not pointing),
                                 (self.pointing_field, "pointing_tolerance_deg", pointing),
                                 (self.roll_field, "roll_tolerance_deg", pointing)):
            name = self._tolerance_name(key)
            unit = settings.unit_of(name)
            self._unit_range(field, unit)
            self.tolerance_labels[name].setText(f"{name.capitalize()} ({units.ANGLE_UNITS[unit].symbol})")
            if not field.hasFocus() or field.problem is None:
                value = getattr(settings, key)
                field.set_text(units.format_dms(value) if unit == "dms" else
                               f"{float(units.degrees_to(value, unit)):.10g}")
            field.setEnabled(used)
        if not self.position_field.hasFocus() or self.position_field.problem is None:
            tolerance = settings.position_tolerance_mm
            self.position_field.set_text("" if tolerance is None else f"{tolerance:g}")

    def _render_result(self) -> None:
        nominal, measured = self.model.check_mount_indices()
        self.show_button.setEnabled(measured is not None and measured != self.model.selected_index)
        if nominal is None or measured is None:
            self._idle("Choose a nominal and a measured mount.")
            return
        mounts = self.model.mounts
        settings = self.model.check.settings
        unit = self.model.preferences.angle_units        # figures in the display unit; judged in degrees
        result = check(mounts[nominal].orientation, mounts[measured].orientation, settings)
        offset = check_position(mounts[nominal].orientation, mounts[nominal].position, mounts[measured].position,
                                settings.position_tolerance_mm)
        passed = result.passed and (offset is None or offset.passed is not False)
        self.verdict.setText("PASS" if passed else "FAIL")
        self.verdict.setStyleSheet(PASS_STYLE if passed else FAIL_STYLE)
        self.position_result.setText(self._position_words(offset, mounts[nominal], mounts[measured], settings))
        deciding = min(result.criteria, key=lambda c: c.margin_deg)
        self.margin_label.setText(
            f"Margin {angle(result.margin_deg, unit, signed=True)}: {deciding.name} "
            f"{angle(deciding.value_deg, unit)} {'within' if deciding.passed else 'exceeds'} "
            f"{angle(deciding.tolerance_deg, unit)}")
        self.decision_words.setText(self._decision_words(mounts[nominal].orientation, mounts[measured].orientation,
                                                         result))
        lines = []
        if nominal == measured:
            lines.append("The nominal and the measured are the same mount.")
        if result.total_deg == 0:
            lines.append(f"Total deviation: {angle(0.0, unit)} (the orientations are the same)")
        else:
            lines.append(f"Total deviation: {angle(result.total_deg, unit)}, about {vector(result.axis)} "
                         "in the nominal body axes")
        if result.body_axis is not None:
            name = axes.axis_name(settings.body_axis) if isinstance(settings.body_axis, str) else None
            axis = axes.display(name) if name else vector(result.body_axis)
            lines.append(f"Pointing error of body {axis}: {angle(result.pointing_deg, unit)}")
            roll = (angle(result.roll_deg, unit, signed=True) if result.roll_defined
                    else "undefined (the axis points backwards)")
            lines.append(f"Roll about body {axis}: {roll}")
        for c in result.criteria:
            verdict = "within" if c.passed else "exceeds"
            lines.append(f"• {c.name}: {angle(c.value_deg, unit)} {verdict} its tolerance "
                         f"{angle(c.tolerance_deg, unit)}, margin {angle(c.margin_deg, unit, signed=True)}")
        lines.extend(result.notes)
        self.details.setText("\n".join(lines))

    def _decision_words(self, nominal, measured, result) -> str:
        """The verdict's standing: the ISO 14253-1 decision when the check has an uncertainty, else that
        none was given (a PASS by less than the uncertainty has not shown conformance)."""
        setup = self.model.check.adjustment
        if setup.uncertainty_deg is None:
            return ("No measurement uncertainty was given: the verdict is the plain comparison (give one on the "
                    "Adjust tab for the ISO 14253-1 decision).")
        try:
            _, overall = decide_setup(nominal, measured, self.model.check.settings, result, setup)
        except FramewrightError as error:
            return f"ISO 14253-1 decision: none ({error})"
        expanded = setup.coverage * setup.uncertainty_deg
        words = {CANNOT_DECIDE: "cannot decide within the measurement uncertainty"}.get(overall, overall)
        unit = self.model.preferences.angle_units
        return (f"ISO 14253-1 decision: {words} (u = {angle(setup.uncertainty_deg, unit)}, k = {setup.coverage:g}, "
                f"U = {angle(expanded, unit)})")

    @staticmethod
    def _position_words(offset, nominal, measured, settings) -> str:
        if offset is None:
            if settings.position_tolerance_mm is None:
                return ""
            missing = " and ".join(m for m, mount in (("nominal", nominal), ("measured", measured))
                                   if mount.position is None)
            return f"Position not judged: the {missing} mount has no position."
        x, y, z = (fixed(v, 3, signed=True) for v in offset.along_nominal_mm)
        along = f"along the nominal body axes x {x}, y {y}, z {z} mm"
        if offset.tolerance_mm is None:
            return f"Position offset {offset.distance_mm:.3f} mm, {along} (not judged: no position tolerance)."
        word = "within" if offset.passed else "exceeds"
        margin = fixed(offset.margin_mm, 3, signed=True)
        return (f"Position {'PASS' if offset.passed else 'FAIL'}: offset {offset.distance_mm:.3f} mm {word} "
                f"{offset.tolerance_mm:.3f} mm (margin {margin} mm), {along}.")

    def _idle(self, text: str) -> None:
        self.position_result.setText("")
        self.decision_words.setText("")
        self.verdict.setText("—")
        self.verdict.setStyleSheet(IDLE_STYLE)
        self.margin_label.setText("")
        self.details.setText(text)

    # for tests and the window: the text a person reads
    def verdict_text(self) -> str:
        return self.verdict.text()
