"""Where each body axis of the selected mount points, in words, and the nearest of the 24 right-angle
orientations with the residual angle; "Snap to nearest right angle" sets the mount to it (one undo step)."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QComboBox, QGroupBox, QHBoxLayout, QLabel, QPushButton, QVBoxLayout

from app.model import ORIENTATION, SELECTION, WORDS, SessionModel
from app.panels.base import FollowsModel
from core import describe


def residual_text(residual_deg: float) -> str:
    """Enough digits that a small residual is visible, and 'none' when it is zero in practice."""
    if residual_deg < 5e-10:
        return "none (it is a right angle)"
    if residual_deg < 0.01:
        return f"{residual_deg:.3g}\u00b0"
    return f"{residual_deg:.3f}\u00b0"


class WordsBox(FollowsModel, QGroupBox):
    watches = frozenset({ORIENTATION, SELECTION, WORDS})

    def __init__(self, model: SessionModel, parent=None):
        super().__init__("Where the axes point", parent)
        self.follow_model(model)
        self.preset_box = QComboBox()
        for key, preset in describe.FRAME_PRESETS.items():
            self.preset_box.addItem(preset.title, key)
        self.preset_box.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        self.preset_box.setMinimumContentsLength(16)
        self.preset_box.setToolTip("Names for the reference directions in every description (Chain and Level "
                                   "panels). It only names directions; it never changes the orientation.")
        self.axes_label = QLabel()
        self.axes_label.setTextInteractionFlags(Qt.TextInteractionFlag.TextSelectableByMouse)
        self.axes_label.setToolTip("For each body axis of the selected mount: the nearest reference direction "
                                   "and how far off it the axis points.")
        self.nearest_label = QLabel()
        self.nearest_label.setWordWrap(True)
        self.nearest_label.setToolTip("The nearest of the 24 orientations whose axes all lie along reference axes, "
                                      "and the angle of the turn from it to the selected mount (the residual).")
        self.snap_button = QPushButton("Snap to nearest right angle")
        self.snap_button.setToolTip("Set the selected mount to the nearest right-angle orientation shown above "
                                    "(one undo step).")
        layout = QVBoxLayout(self)
        row = QHBoxLayout()
        row.addWidget(QLabel("Directions named as"))
        row.addWidget(self.preset_box, 1)
        layout.addLayout(row)
        layout.addWidget(self.axes_label)
        layout.addWidget(self.nearest_label)
        snap_row = QHBoxLayout()
        snap_row.addStretch(1)
        snap_row.addWidget(self.snap_button)
        layout.addLayout(snap_row)

        self.preset_box.activated.connect(
            lambda i: self.model.set_reference_frame(self.preset_box.itemData(i), origin=self))
        self.snap_button.clicked.connect(lambda: self.model.snap_to_right_angle(origin=self))
        self.render()

    def render(self) -> None:
        orientation = self.model.current_orientation()
        preset = self.model.reference_frame
        self.preset_box.setCurrentIndex(self.preset_box.findData(preset))
        self.axes_label.setText("\n".join(describe.describe_axes(orientation, preset)))
        near = describe.nearest_right_angle(orientation)
        ra = near.right_angle
        self.nearest_label.setText(f"Nearest right angle: {ra.rotation_words} ({ra.mapping_words}); "
                                   f"residual {residual_text(near.residual_deg)}")
        self.snap_button.setEnabled(near.residual_deg >= 5e-10)
