"""The part of the selected mount: box size, the user's names for its faces and the boresight face. What
the Scene draws and the words name; it never changes the orientation."""

from __future__ import annotations

from PySide6.QtWidgets import (QComboBox, QDialog, QDialogButtonBox, QFormLayout, QGroupBox, QHBoxLayout,
                               QLabel, QLineEdit, QVBoxLayout)

from app import plain_text
from core import axes
from core.errors import FramewrightError
from core.number_text import parse_number
from core.session import PartProperties

ERROR_STYLE = "color: #b00020;"
# The sizes a box part can have, in mm: a micrometre to a kilometre. Smaller or larger is a typo or a unit
# mix-up, and near zero the Scene's drawing scale (1 / size) would divide by nearly nothing. The session
# loader holds saved sizes to the same range.
SMALLEST_BOX_MM, LARGEST_BOX_MM = 1e-3, 1e6
_LONGEST_SIZE_TEXT = 64


class PartDialog(QDialog):
    def __init__(self, model, parent=None):
        super().__init__(parent)
        self.model = model
        mount = model.current_mount()
        part = mount.part
        self.setWindowTitle(f"Part of “{mount.name}”")
        self.size_fields = []
        size_row = QHBoxLayout()
        for axis, value in zip("XYZ", part.box_size_mm):
            field = QLineEdit(f"{value:g}")
            field.setMaxLength(_LONGEST_SIZE_TEXT)
            field.setToolTip(f"Box size along body {axis}, in mm ('.' as the decimal point), from "
                             f"{SMALLEST_BOX_MM:g} mm to {LARGEST_BOX_MM:,.0f} mm.")
            size_row.addWidget(QLabel(f"{axis}"))
            size_row.addWidget(field)
            self.size_fields.append(field)
        size_row.addWidget(QLabel("mm"))
        self.name_fields = {}
        names = QFormLayout()
        for key in axes.SIGNED_AXES:
            field = QLineEdit(part.face_names.get(key, ""))
            field.setPlaceholderText("(no name)")
            field.setToolTip(f"Your name for the face whose outward normal is body {key}, e.g. “lens”.")
            names.addRow(f"Face {axes.display(key)}", field)
            self.name_fields[key] = field
        self.boresight_box = QComboBox()
        for key in axes.SIGNED_AXES:
            self.boresight_box.addItem(axes.display(key), key)
        self.boresight_box.setCurrentIndex(axes.SIGNED_AXES.index(part.boresight))
        self.boresight_box.setToolTip("The face the part points with: its normal is the boresight axis.")
        names.addRow("Boresight face", self.boresight_box)
        self.message = plain_text.plain_label()
        self.message.setStyleSheet(ERROR_STYLE)
        self.message.setWordWrap(True)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.apply)
        buttons.rejected.connect(self.reject)
        box = QGroupBox("Box size")
        box.setLayout(size_row)
        faces = QGroupBox("Faces")
        faces.setLayout(names)
        layout = QVBoxLayout(self)
        layout.addWidget(box)
        layout.addWidget(faces)
        layout.addWidget(self.message)
        layout.addWidget(buttons)

    def part(self) -> PartProperties:
        """The part the fields spell; raises ValueError (or our error) saying which field is wrong."""
        sizes = []
        for axis, field in zip("XYZ", self.size_fields):
            try:
                size = parse_number(field.text())
            except ValueError as exc:
                raise ValueError(f"box size {axis}: {exc}") from None
            if not SMALLEST_BOX_MM <= size <= LARGEST_BOX_MM:
                raise ValueError(f"box size {axis}: {field.text().strip()} mm is outside the sizes a part can have; "
                                 f"expected a positive size from {SMALLEST_BOX_MM:g} mm to {LARGEST_BOX_MM:,.0f} mm")
            sizes.append(size)
        names = {key: f.text().strip() for key, f in self.name_fields.items() if f.text().strip()}
        return PartProperties(tuple(sizes), names, self.boresight_box.currentData())

    def apply(self) -> None:
        """Change the part (one undo step) and close; bad fields keep the dialog open and say why."""
        try:
            part = self.part()
        except (ValueError, FramewrightError) as exc:
            self.message.setText(f"{exc}; nothing was changed.")
            return
        self.model.set_part(part, origin=self)
        self.accept()
