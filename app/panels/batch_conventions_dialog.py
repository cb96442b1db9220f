"""The conventions of a batch file's column sets when its header does not state them: angle unit,
sequence and intrinsic/extrinsic for three angles, and what the nine matrix numbers mean. "As the header
says" leaves a value to the file (or its default); a choice that contradicts the header is refused when
the file is read, never silently preferred."""

from __future__ import annotations

from PySide6.QtWidgets import (QComboBox, QDialog, QDialogButtonBox, QFormLayout, QGroupBox, QHBoxLayout,
                               QLabel, QVBoxLayout)

from core.batch import SetConventions
from core.kernels import ALL_SEQUENCES

FROM_FILE = "As the header says"


def _combo(choices, tooltip, current):
    combo = QComboBox()
    for label, value in choices:
        combo.addItem(label, value)
    index = next((i for i, (_, v) in enumerate(choices) if v == current), 0)
    combo.setCurrentIndex(index)
    combo.setToolTip(tooltip)
    return combo


class SetConventionsBox(QGroupBox):
    """The choices for one column set (nominal or measured)."""

    def __init__(self, title: str, conventions: SetConventions, parent=None):
        super().__init__(title, parent)
        self.degrees = _combo([(FROM_FILE + " (default degrees)", None), ("Degrees", True), ("Radians", False)],
                              "Unit of angles and rotation vectors in this set.", conventions.degrees)
        self.sequence = _combo([(FROM_FILE, None)] + [(s, s) for s in ALL_SEQUENCES],
                               "The axes of angle1, angle2, angle3, in the order written (e.g. ZYX).",
                               conventions.sequence)
        self.intrinsic = _combo([(FROM_FILE, None), ("Intrinsic (about the moving body axes)", True),
                                 ("Extrinsic (about the fixed reference axes)", False)],
                                "How the three angles turn: about the body axes as they move, or about "
                                "the fixed reference axes.", conventions.intrinsic)
        self.matrix = _combo([(FROM_FILE + " (default body → reference)", None),
                              ("Body → reference (columns are the body axes)", "body_to_reference"),
                              ("Reference → body (rows are the body axes)", "reference_to_body")],
                             "What the nine numbers r11..r33 mean.", conventions.matrix_meaning)
        form = QFormLayout(self)
        form.addRow("Angle unit:", self.degrees)
        form.addRow("Sequence:", self.sequence)
        form.addRow("Angles turn:", self.intrinsic)
        form.addRow("Matrix:", self.matrix)

    def conventions(self) -> SetConventions:
        return SetConventions(sequence=self.sequence.currentData(), intrinsic=self.intrinsic.currentData(),
                              degrees=self.degrees.currentData(), matrix_meaning=self.matrix.currentData())


class BatchConventionsDialog(QDialog):
    def __init__(self, nominal: SetConventions, measured: SetConventions, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Batch file conventions")
        self.nominal_box = SetConventionsBox("Nominal columns", nominal)
        self.measured_box = SetConventionsBox("Measured columns", measured)
        note = QLabel("For files whose header does not say. Conventions written in the header "
                      "(e.g. measured_angle1[XYZ extrinsic deg]) are used as written; a choice here that "
                      "contradicts them refuses the file.")
        note.setWordWrap(True)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        layout = QVBoxLayout(self)
        layout.addWidget(note)
        boxes = QHBoxLayout()
        boxes.addWidget(self.nominal_box)
        boxes.addWidget(self.measured_box)
        layout.addLayout(boxes)
        layout.addWidget(buttons)

    def conventions(self) -> tuple[SetConventions, SetConventions]:
        return self.nominal_box.conventions(), self.measured_box.conventions()
