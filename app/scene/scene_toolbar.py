"""The Scene's own small controls: view presets, grid and ghost toggles, the sweep slider and play button,
the tracked vector, what the overlay shows, and PNG export. It only emits signals; SceneWidget acts."""

from __future__ import annotations

from PySide6 import QtCore, QtWidgets

from app.scene.overlay_text import REPRESENTATION_TITLES
from core import axes
from core.describe import FRAME_PRESETS

VIEW_BUTTONS = (*((axes.display(name), f"Look along {axes.display(name)} of the reference")
                  for name in axes.SIGNED_AXES),
                ("Boresight", "Look along the body's boresight axis"),
                ("Isometric", "Isometric view from above, on the +X +Y side (above: the frame's up)"),
                ("Reset", "Back to the isometric view at the standard distance"))
TRACKED_CHOICES = ("boresight", *axes.POSITIVE_AXES, *axes.NEGATIVE_AXES, "typed")
SLIDER_STEPS = 1000


def _tight(layout):
    layout.setContentsMargins(4, 2, 4, 2)
    layout.setSpacing(4)
    return layout


class SceneToolbar(QtWidgets.QWidget):
    view_requested = QtCore.Signal(str)  # '+X', '-X', ..., 'boresight', 'iso', 'reset'
    grid_toggled = QtCore.Signal(bool)
    ghost_toggled = QtCore.Signal(bool)
    sweep_moved = QtCore.Signal(float)
    play_toggled = QtCore.Signal(bool)
    tracked_chosen = QtCore.Signal(str, str)  # choice, typed text
    representation_chosen = QtCore.Signal(str)
    preset_chosen = QtCore.Signal(str)
    export_requested = QtCore.Signal()
    stl_requested = QtCore.Signal()

    def __init__(self, parent=None):
        super().__init__(parent)
        rows = _tight(QtWidgets.QVBoxLayout(self))
        # Three short rows (views; sweep and files; what is drawn), so the Scene fits a laptop's width.
        top, middle, bottom = (_tight(QtWidgets.QHBoxLayout()) for _ in range(3))
        rows.addLayout(top)
        rows.addLayout(middle)
        rows.addLayout(bottom)

        top.addWidget(QtWidgets.QLabel("Look along:"))
        for text, tip in VIEW_BUTTONS:
            button = QtWidgets.QToolButton(text=text, toolTip=tip)
            button.clicked.connect(lambda _=False, t=text: self.view_requested.emit(axes.axis_name(t) or t.lower()))
            top.addWidget(button)
        top.addSpacing(12)
        self.grid = QtWidgets.QCheckBox("Grid", checked=True, toolTip="Grid in the reference XY plane")
        self.grid.toggled.connect(self.grid_toggled)
        self.ghost = QtWidgets.QCheckBox("Ghost", checked=True,
                                         toolTip="Faint outline of the reference or of a second Mount")
        self.ghost.toggled.connect(self.ghost_toggled)
        top.addWidget(self.grid)
        top.addWidget(self.ghost)
        top.addStretch(1)
        stl = QtWidgets.QPushButton("Part from STL\u2026", toolTip="Draw an STL file (binary or ASCII) as the part")
        stl.clicked.connect(self.stl_requested)
        export = QtWidgets.QPushButton("Export PNG\u2026", toolTip="Save the scene as a PNG at a chosen size")
        export.clicked.connect(self.export_requested)

        self.play = QtWidgets.QToolButton(text="\u25b6 Play", checkable=True,
                                          toolTip="Replay the rotation from the reference about n")
        self.play.toggled.connect(self.play_toggled)
        self.slider = QtWidgets.QSlider(QtCore.Qt.Orientation.Horizontal, minimum=0, maximum=SLIDER_STEPS,
                                        value=SLIDER_STEPS, toolTip="Sweep: the body at t \u00d7 the angle about n")
        self.slider.setMinimumWidth(100)
        self.slider.valueChanged.connect(lambda v: self.sweep_moved.emit(v / SLIDER_STEPS))
        self.sweep_value = QtWidgets.QLabel("t = 1.00")
        self.sweep_value.setMinimumWidth(60)
        middle.addWidget(QtWidgets.QLabel("Sweep:"))
        middle.addWidget(self.play)
        middle.addWidget(self.slider, 1)
        middle.addWidget(self.sweep_value)
        middle.addSpacing(8)
        middle.addWidget(stl)
        middle.addWidget(export)

        bottom.addWidget(QtWidgets.QLabel("Track r:"))
        self.tracked = QtWidgets.QComboBox(toolTip="The vector whose swept cone is drawn")
        for choice in TRACKED_CHOICES:
            self.tracked.addItem(axes.display(choice), choice)
        self.typed = QtWidgets.QLineEdit(placeholderText="x, y, z", toolTip="A body-frame vector, e.g. 1, 1, 0")
        self.typed.setMaximumWidth(110)
        self.typed.setEnabled(False)
        self.tracked.currentIndexChanged.connect(self._tracked_changed)
        self.typed.editingFinished.connect(self._tracked_changed)
        bottom.addWidget(self.tracked)
        bottom.addWidget(self.typed)

        bottom.addSpacing(8)
        bottom.addWidget(QtWidgets.QLabel("Show:"))
        self.representation = QtWidgets.QComboBox(toolTip="How the overlay writes the orientation")
        for key, title in REPRESENTATION_TITLES.items():
            self.representation.addItem(title, key)
        self.representation.currentIndexChanged.connect(
            lambda _: self.representation_chosen.emit(self.representation.currentData()))
        bottom.addWidget(self.representation)
        self.preset = QtWidgets.QComboBox(toolTip="Names for the reference directions in the words")
        for key, preset in FRAME_PRESETS.items():
            self.preset.addItem(preset.title.split(" (")[0], key)
        self.preset.currentIndexChanged.connect(lambda _: self.preset_chosen.emit(self.preset.currentData()))
        bottom.addWidget(QtWidgets.QLabel("Direction names:"))
        bottom.addWidget(self.preset)
        bottom.addStretch(1)

        self.message = QtWidgets.QLabel("")
        self.message.setStyleSheet("color: #c0392b;")
        self.message.setWordWrap(True)
        rows.addWidget(self.message)
        self.message.hide()

    def _tracked_changed(self, *_):
        choice = self.tracked.currentData()
        self.typed.setEnabled(choice == "typed")
        if choice != "typed" or self.typed.text().strip():
            self.tracked_chosen.emit(choice, self.typed.text())

    def show_message(self, text):
        self.message.setText(text)
        self.message.setVisible(bool(text))

    def show_sweep(self, t):
        blocked = self.slider.blockSignals(True)
        self.slider.setValue(round(t * SLIDER_STEPS))
        self.slider.blockSignals(blocked)
        self.sweep_value.setText(f"t = {t:.2f}")

    def select(self, combo, data):
        index = combo.findData(data)
        if index >= 0:
            blocked = combo.blockSignals(True)
            combo.setCurrentIndex(index)
            combo.blockSignals(blocked)
