"""Preferences dialog: units, digits and the gimbal margin thresholds (the editors hold the rest)."""

from __future__ import annotations

from PySide6.QtWidgets import QComboBox, QDialog, QDialogButtonBox, QDoubleSpinBox, QFormLayout, QSpinBox

from app.widgets.message_line import MessageLine
from core import units
from core.errors import FramewrightError
from core.session import ANGLE_UNITS


class PreferencesDialog(QDialog):
    def __init__(self, model, copy_formats: dict[str, str], default_copy: str, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Preferences")
        prefs = model.preferences
        self.model = model
        self.units = QComboBox()
        for key in ANGLE_UNITS:
            self.units.addItem(units.ANGLE_UNITS[key].name, key)
        self.units.setCurrentIndex(max(0, self.units.findData(prefs.angle_units)))
        self.units.setToolTip("The unit every angle field shows and reads (a field also reads a number with its "
                              "own unit mark, e.g. 0.5 mrad or 30″). NATO mils: 6400 to a turn.")
        self.digits = QSpinBox()
        self.digits.setRange(3, 17)
        self.digits.setValue(prefs.significant_digits)
        self.amber = QDoubleSpinBox()
        self.amber.setRange(0.1, 90.0)
        self.amber.setDecimals(2)
        self.amber.setSuffix(" °")
        self.amber.setValue(prefs.amber_margin_deg)
        self.red = QDoubleSpinBox()
        self.red.setRange(0.01, 89.0)
        self.red.setDecimals(2)
        self.red.setSuffix(" °")
        self.red.setValue(prefs.red_margin_deg)
        self.copy_default = QComboBox()
        for key, label in copy_formats.items():
            self.copy_default.addItem(label, key)
        self.copy_default.setCurrentIndex(max(0, self.copy_default.findData(default_copy)))
        self.problem = MessageLine()
        form = QFormLayout(self)
        form.addRow("Angle units", self.units)
        form.addRow("Significant digits shown", self.digits)
        form.addRow("Gimbal margin amber under", self.amber)
        form.addRow("Gimbal margin red under", self.red)
        form.addRow("Ctrl+C copies as", self.copy_default)
        form.addRow(self.problem)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self._apply)
        buttons.rejected.connect(self.reject)
        form.addRow(buttons)

    def _apply(self) -> None:
        try:
            self.model.set_preferences(
                origin=self, angle_units=self.units.currentData(), significant_digits=self.digits.value(),
                amber_margin_deg=self.amber.value(), red_margin_deg=self.red.value())
        except FramewrightError as exc:
            self.problem.problem(str(exc))
            return
        self.accept()

    @property
    def chosen_copy_default(self) -> str:
        return self.copy_default.currentData()
