"""Check panel: a measured mount against its nominal, within tolerance (core/check.py).

Shows the total deviation and its axis, the pointing error of a chosen body axis and the roll about it
(a swing-twist split), a large plain PASS or FAIL and the margin. The choices (which mount is nominal,
which is measured, the mode, the body axis, the tolerances) are session state in the model, so each
change is one undo step and is saved with the session. Choosing the measured mount selects it, so the
Scene shows it with the nominal as its ghost.
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtGui import QFont
from PySide6.QtWidgets import (QComboBox, QFormLayout, QGroupBox, QHBoxLayout, QLabel, QLineEdit,
                               QPushButton, QVBoxLayout, QWidget)

from app import plain_text
from app.editors.number_field import NumberField, parse_number
from app.model import CHECK, MOUNTS, ORIENTATION, POSITION, SELECTION, Change, SessionModel
from core import axes, describe
from core.check import POSITION_TOLERANCE_LIMIT_MM, CheckSettings, check, check_position
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


def _deg(value: float) -> str:
    text = f"{value:.3f}"
    return ("0.000" if float(text) == 0 else text).replace("-", describe.MINUS) + "\u00b0"


def _signed_deg(value: float) -> str:
    text = f"{value:+.3f}"
    if float(text) == 0:
        text = "0.000"
    return text.replace("-", describe.MINUS) + "\u00b0"


def _vector(v) -> str:
    parts = []
    for c in np.asarray(v, dtype=float):
        text = f"{c:.4f}"
        parts.append(("0.0000" if float(text) == 0 else text).replace("-", describe.MINUS))
    return "(" + ", ".join(parts) + ")"


class CheckPanel(QWidget):
    def __init__(self, model: SessionModel, parent=None):
        super().__init__(parent)
        self.model = model
        self._rendering = False

        self.nominal_box = QComboBox()
        self.nominal_box.setToolTip("The mount that holds the orientation the part should have (from the "
                                    "drawing). It is drawn as the ghost while the measured mount is shown.")
        self.measured_box = QComboBox()
        self.measured_box.setToolTip("The mount that holds the orientation the part was measured to have. "
                                     "Choosing it shows it in the Scene, with the nominal as the ghost.")
        for box in (self.nominal_box, self.measured_box):
            box.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
            box.setMinimumContentsLength(14)
        self.show_button = QPushButton("Show the measured mount")
        self.show_button.setToolTip("Select the measured mount, so the editors and the Scene show it with the "
                                    "nominal as the ghost.")
        self.mode_box = QComboBox()
        for key, label in MODES:
            self.mode_box.addItem(label, key)
        self.mode_box.setToolTip("Total deviation: the angle of the one turn from the nominal to the measured "
                                 "orientation (D = Nᵀ M), against one tolerance. Pointing error and roll: how "
                                 "far the chosen body axis points off, and the turn left about that axis, each "
                                 "against its own tolerance.")
        self.axis_box = QComboBox()
        self.axis_box.addItem("none", NO_AXIS)
        for name in axes.SIGNED_AXES:
            self.axis_box.addItem(axes.display(name), name)
        self.axis_box.addItem("typed (x, y, z)", TYPED)
        self.axis_box.setToolTip("The body axis whose pointing is judged (e.g. the boresight), in body "
                                 "coordinates. 'none' reports the total deviation only.")
        self.axis_field = QLineEdit()
        self.axis_field.setPlaceholderText("x, y, z")
        self.axis_field.setToolTip("A body-frame direction as three numbers x, y, z (any length; '.' is the "
                                   "decimal point); Enter to use it.")
        self.total_field = self._tolerance_field(
            "Total deviation tolerance in degrees: the largest angle of the turn from nominal to measured that "
            "passes. A value equal to the tolerance passes.")
        self.pointing_field = self._tolerance_field(
            "Pointing tolerance in degrees: the largest angle between where the body axis should point "
            "(nominal) and where it does point (measured) that passes.")
        self.roll_field = self._tolerance_field(
            "Roll tolerance in degrees: the largest turn about the body axis (after the pointing is corrected) "
            "that passes, either sign.")
        self.position_field = NumberField(
            "Position tolerance in mm: the largest distance of the measured origin from the nominal one that "
            "passes, judged when both mounts have a position. Empty: positions are reported, not judged. "
            "'.' is the decimal point; Enter to use it.", steppable=False)
        self.position_field.set_range(0.0, POSITION_TOLERANCE_LIMIT_MM,
                                      f"0 to {POSITION_TOLERANCE_LIMIT_MM:g} mm")
        self.position_field.fit_digits(4)
        self.message = plain_text.plain_label()   # quotes typed text
        self.message.setWordWrap(True)

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
        tolerances = QGroupBox("Tolerances (degrees)")
        t_form = QFormLayout(tolerances)
        for label, field in (("Total", self.total_field), ("Pointing", self.pointing_field),
                             ("Roll", self.roll_field)):
            row = QHBoxLayout()
            row.addWidget(field)
            row.addStretch(1)
            t_form.addRow(label, row)
        position_row = QHBoxLayout()
        position_row.addWidget(self.position_field)
        position_row.addWidget(QLabel("mm (empty: not judged)"))
        position_row.addStretch(1)
        t_form.addRow("Position", position_row)
        # What is wrong with a typed tolerance is said here, under the tolerances, not under the axis.
        self.tolerance_note = QLabel("")
        self.tolerance_note.setWordWrap(True)
        self.tolerance_note.setTextFormat(Qt.TextFormat.PlainText)  # it quotes what was typed
        self.tolerance_note.setStyleSheet(plain_text.ERROR_STYLE)
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
        self.details = plain_text.plain_label()   # names the mounts
        self.details.setWordWrap(True)
        self.details.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.details.setToolTip("Deviation D = Nᵀ M, written in the nominal body frame; its axis is in nominal "
                                "body axes. Pointing error: angle between N·a and M·a. Roll: the turn about a "
                                "left after the pointing correction (right-hand rule about a).")
        self.margin_label.setWordWrap(True)
        verdict_row = QHBoxLayout()
        verdict_row.addWidget(self.verdict)
        verdict_row.addStretch(1)
        result_layout = QVBoxLayout(result)
        result_layout.addLayout(verdict_row)
        result_layout.addWidget(self.margin_label)
        result_layout.addWidget(self.details)
        # After the orientation's figures: the position offset, when both mounts have a position.
        self.position_result = plain_text.plain_label()
        self.position_result.setWordWrap(True)
        self.position_result.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.position_result.setToolTip("Offset of the measured origin from the nominal one: the distance, and "
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
            field.stepped.connect(lambda v, f=field, k=key: self._set_settings(
                f"{k}", min(TOLERANCE_MAX_DEG, max(0.0, round(v, 9)))))
        self.position_field.committed.connect(self._position_tolerance_typed)
        self.position_field.editingFinished.connect(self._position_tolerance_typed)
        model.changed.connect(self._on_model_changed)
        self.render()

    def _position_tolerance_typed(self) -> None:
        text = self.position_field.text().strip()
        try:
            value = None if not text else self.position_field.value()
        except ValueError as exc:
            self.position_field.set_problem(str(exc))
            self.tolerance_note.setText(f"{exc} (kept the last good position tolerance)")
            return
        self.tolerance_note.setText("")
        self.position_field.set_problem(None)
        if value != self.model.check.settings.position_tolerance_mm:
            self.position_field.set_problem(self._set_settings("position_tolerance_mm", value))

    @staticmethod
    def _tolerance_field(tip: str) -> NumberField:
        field = NumberField(tip + f" More than 0 and at most {TOLERANCE_MAX_DEG:g}° (no two orientations are "
                                  "further apart). '.' is the decimal point; Enter to use it.", step=0.1)
        field.set_range(0.0, TOLERANCE_MAX_DEG, f"0 < tolerance ≤ {TOLERANCE_MAX_DEG:g}°", low_excluded=True)
        field.fit_digits(4)
        return field

    # ---- edits -------------------------------------------------------------------------------------
    def _choose(self, which: str, name) -> None:
        check_state = self.model.check
        self.model.set_check(replace(check_state, **{which: name}), origin=self,
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
            plain_text.say(self.message, f"{exc} (kept the last good setting)", problem=True)
            return str(exc)
        plain_text.say(self.message, "")
        self.model.set_check(replace(check_state, settings=settings), origin=self,
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
            self.model.set_check(replace(self.model.check, settings=new), origin=self,
                                 text="Check: pointing error and roll")
            plain_text.say(self.message, f"Pointing needs a body axis: took the boresight, {axes.display(axis)}.")
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
            plain_text.say(self.message, "Pointing error and roll need a body axis; choose one, or check by "
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
            plain_text.say(self.message, f"{exc} (kept the last good axis)", problem=True)
            return
        self._set_settings("body_axis", values)

    def _tolerance_typed(self, field: NumberField, key: str) -> None:
        try:
            value = field.value()
        except ValueError as exc:
            field.set_problem(str(exc))
            self.tolerance_note.setText(f"{exc} (kept the last good tolerance)")
            return
        self.tolerance_note.setText("")
        if value == getattr(self.model.check.settings, key):
            field.set_problem(None)
            return
        field.set_problem(self._set_settings(key, value))

    # ---- model -> view -----------------------------------------------------------------------------
    def _on_model_changed(self, change: Change) -> None:
        if change.touches(CHECK, MOUNTS):
            self.render()
        elif change.touches(ORIENTATION, SELECTION, POSITION):
            self._render_result()

    def render(self) -> None:
        self._rendering = True
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
            if not field.hasFocus() or field.problem is None:
                field.set_text(f"{getattr(settings, key):g}")
            field.setEnabled(used)
        if not self.position_field.hasFocus() or self.position_field.problem is None:
            tolerance = settings.position_tolerance_mm
            self.position_field.set_text("" if tolerance is None else f"{tolerance:g}")
        self._rendering = False
        self._render_result()

    def _render_result(self) -> None:
        nominal, measured = self.model.check_mount_indices()
        self.show_button.setEnabled(measured is not None and measured != self.model.selected_index)
        if nominal is None or measured is None:
            self._idle("Choose a nominal and a measured mount.")
            return
        mounts = self.model.mounts
        settings = self.model.check.settings
        result = check(mounts[nominal].orientation, mounts[measured].orientation, settings)
        offset = check_position(mounts[nominal].orientation, mounts[nominal].position, mounts[measured].position,
                                settings.position_tolerance_mm)
        passed = result.passed and (offset is None or offset.passed is not False)
        self.verdict.setText("PASS" if passed else "FAIL")
        self.verdict.setStyleSheet(PASS_STYLE if passed else FAIL_STYLE)
        self.position_result.setText(self._position_words(offset, mounts[nominal], mounts[measured], settings))
        deciding = min(result.criteria, key=lambda c: c.margin_deg)
        self.margin_label.setText(
            f"Margin {_signed_deg(result.margin_deg)}: {deciding.name} {_deg(deciding.value_deg)} "
            f"{'within' if deciding.passed else 'exceeds'} {_deg(deciding.tolerance_deg)}")
        lines = []
        if nominal == measured:
            lines.append("The nominal and the measured are the same mount.")
        if result.total_deg == 0:
            lines.append("Total deviation: 0.000° (the orientations are the same)")
        else:
            lines.append(f"Total deviation: {_deg(result.total_deg)}, about {_vector(result.axis)} "
                         "in the nominal body axes")
        if result.body_axis is not None:
            name = axes.axis_name(settings.body_axis) if isinstance(settings.body_axis, str) else None
            axis = axes.display(name) if name else _vector(result.body_axis)
            lines.append(f"Pointing error of body {axis}: {_deg(result.pointing_deg)}")
            roll = _signed_deg(result.roll_deg) if result.roll_defined else "undefined (the axis points backwards)"
            lines.append(f"Roll about body {axis}: {roll}")
        for c in result.criteria:
            verdict = "within" if c.passed else "exceeds"
            lines.append(f"• {c.name}: {_deg(c.value_deg)} {verdict} its tolerance {_deg(c.tolerance_deg)}, "
                         f"margin {_signed_deg(c.margin_deg)}")
        lines.extend(result.notes)
        self.details.setText("\n".join(lines))

    @staticmethod
    def _position_words(offset, nominal, measured, settings) -> str:
        if offset is None:
            if settings.position_tolerance_mm is None:
                return ""
            missing = " and ".join(m for m, mount in (("nominal", nominal), ("measured", measured))
                                   if mount.position is None)
            return f"Position not judged: the {missing} mount has no position."
        x, y, z = (f"{v + 0.0:+.3f}".replace("-", "−") for v in offset.along_nominal_mm)
        along = f"along the nominal body axes x {x}, y {y}, z {z} mm"
        if offset.tolerance_mm is None:
            return f"Position offset {offset.distance_mm:.3f} mm, {along} (not judged: no position tolerance)."
        word = "within" if offset.passed else "exceeds"
        margin = f"{offset.margin_mm + 0.0:+.3f}".replace("-", "−")
        return (f"Position {'PASS' if offset.passed else 'FAIL'}: offset {offset.distance_mm:.3f} mm {word} "
                f"{offset.tolerance_mm:.3f} mm (margin {margin} mm), {along}.")

    def _idle(self, text: str) -> None:
        self.position_result.setText("")
        self.verdict.setText("—")
        self.verdict.setStyleSheet(IDLE_STYLE)
        self.margin_label.setText("")
        self.details.setText(text)

    # for tests and the window: the text a person reads
    def verdict_text(self) -> str:
        return self.verdict.text()
