"""Level panel: what a digital level or an inclinometer would read on each face of the selected mount's
part, and the elevation of each body axis above the horizontal, so a mount can be checked with a hand
tool (core/level.py). Above them, where each axis points in words and the nearest right angle.

Gravity points along a chosen reference direction: −Z by default (the reference Z is up), +Z for NED.
"""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtWidgets import (QComboBox, QFormLayout, QGroupBox, QHBoxLayout, QHeaderView, QLabel,
                               QTableWidget, QTableWidgetItem, QVBoxLayout)

from app.model import MOUNTS, ORIENTATION, SELECTION, WORDS, Change, SessionModel
from app.panels.base import Panel
from app.panels.level_slopes import SlopeChoices, level_angle
from app.panels.level_words import WordsBox
from app.text import degrees, vector
from app.widgets.number_field import parse_number
from app.widgets.with_tips import line_field
from core import axes, describe
from core.errors import FramewrightError
from core.level import DEFAULT_IN_FACE, FACES, inclinometer_reading, level_readings

TYPED = "typed"
# The gravity directions offered: first the ones the frame presets call down, with a note, then the rest.
_GRAVITY_NOTES = {"-Z": " (Z up, as ENU)", "+Z": " (Z down, as NED)", "+Y": " (Y down, camera optical)"}
GRAVITY_CHOICES = tuple((axes.display(name) + _GRAVITY_NOTES.get(name, ""), tuple(axes.unit_vector(name).tolist()))
                        for name in (*_GRAVITY_NOTES, "-Y", "+X", "-X"))
FACE_COLUMNS = ("Face", "Name", "Tilt from\nlevel", "Off\nplumb", "Faces", "Level\nreads")
READS_COLUMN = 5
FACE_TIPS = (
    "The face, named by its outward normal in body axes.",
    "The part's own name for the face (from the mount's part).",
    "Tilt in degrees of the face plane from level (0..90), the same as the tilt of its normal from vertical: "
    "what a digital level laid on the face (or held under it) shows as its total tilt.",
    "Departure in degrees of the face from vertical (90 − tilt): what a level held against a side face shows.",
    "Whether the face looks up, down or to the side: up or down when its normal is within 45° of straight "
    "up or down (the angle of the normal from straight up is in the tooltip of its tilt).",
    "What a level laid on the face shows, in the unit chosen below (or as the chosen instrument shows it): "
    "the tilt from level of an up or down face, the lean from plumb of a side face; the rise over the shim "
    "base is in each cell's tooltip.",
)


class LevelPanel(Panel):
    watches = frozenset({ORIENTATION, SELECTION, MOUNTS, WORDS})

    def __init__(self, model: SessionModel, parent=None):
        super().__init__(model, parent)
        self._down = np.array(describe.gravity_direction(model.reference_frame))

        self.words = WordsBox(model)

        self.gravity_box = QComboBox()
        for label, down in GRAVITY_CHOICES:
            self.gravity_box.addItem(label, down)
        self.gravity_box.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        self.gravity_box.setMinimumContentsLength(16)
        self.gravity_box.addItem("typed (x, y, z)", TYPED)
        self.gravity_box.setToolTip("The reference direction gravity points along (straight down). −Z when the "
                                    "reference Z is up (a bench, ENU); +Z in NED.")
        self.gravity_field = line_field("Gravity as a reference-frame direction x, y, z (any length; '.' is the "
                                        "decimal point); Enter to use it.", placeholder="x, y, z")
        self.gravity_field.setEnabled(False)

        self.faces = QTableWidget(len(FACES), len(FACE_COLUMNS))
        self.faces.setHorizontalHeaderLabels(FACE_COLUMNS)
        for k, tip in enumerate(FACE_TIPS):
            self.faces.horizontalHeaderItem(k).setToolTip(tip)
        self.faces.verticalHeader().setVisible(False)
        self.faces.setEditTriggers(QTableWidget.EditTrigger.NoEditTriggers)
        self.faces.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        self.faces.horizontalHeader().setSectionResizeMode(1, QHeaderView.ResizeMode.Stretch)
        self.faces.setTextElideMode(Qt.TextElideMode.ElideRight)
        self.faces.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        self.faces.setToolTip("Readings per face of the part; hover the column titles for what each means.")
        self.slopes = SlopeChoices()
        self.up_label = QLabel()
        self.up_label.setToolTip("The faces nearest straight up and straight down.")
        self.rise_label = QLabel()
        self.rise_label.setWordWrap(True)
        self.rise_label.setToolTip("The rise of the up face over the shim base: the shim that levels it over "
                                   "that length (each face's is in the tooltip of its level reading).")
        self.elevations = QLabel()
        self.elevations.setToolTip("Angle of each body axis above the horizontal plane, −90..90 degrees, "
                                   "positive upwards.")

        self.face_box = QComboBox()
        for name in FACES:
            self.face_box.addItem(axes.display(name), name)
        self.face_box.setToolTip("The face the inclinometer's base sits on (its z along the face's outward "
                                 "normal). Until you choose one it follows the face that is up.")
        self._face_chosen = False
        self.direction_box = QComboBox()
        self.direction_box.setToolTip("The body axis, lying in the face, along which the inclinometer's x mark "
                                      "points; its y is normal × x.")
        self.incline_label = QLabel()
        self.incline_label.setWordWrap(True)
        self.incline_label.setToolTip("Each reading is the elevation of that instrument axis above the horizontal "
                                      "(positive when it rises). Check the instrument's manual for its own sign "
                                      "and axis marks.")

        gravity = QGroupBox("Gravity")
        g_layout = QHBoxLayout(gravity)
        g_layout.addWidget(QLabel("Down is"))
        g_layout.addWidget(self.gravity_box, 1)
        g_layout.addWidget(self.gravity_field)
        faces = QGroupBox("Level on each face")
        f_layout = QVBoxLayout(faces)
        f_layout.addWidget(self.faces)
        f_layout.addWidget(self.slopes)
        f_layout.addWidget(self.up_label)
        f_layout.addWidget(self.rise_label)
        f_layout.addWidget(QLabel("Elevation of each body axis above the horizontal:"))
        f_layout.addWidget(self.elevations)
        incline = QGroupBox("Two-axis inclinometer")
        i_form = QFormLayout(incline)
        i_form.addRow("On face", self.face_box)
        i_form.addRow("x mark along", self.direction_box)
        i_form.addRow(self.incline_label)

        layout = QVBoxLayout(self)
        layout.addWidget(self.words)
        layout.addWidget(gravity)
        layout.addWidget(self.message)
        layout.addWidget(faces)
        layout.addWidget(incline)
        layout.addStretch(1)

        self.gravity_box.activated.connect(self._gravity_chosen)
        self.gravity_field.returnPressed.connect(self._gravity_typed)
        self.face_box.activated.connect(self._face_picked)
        self.direction_box.activated.connect(lambda *_: self.render())
        self.slopes.changed.connect(self.render)
        self.face_box.setCurrentIndex(self.face_box.findData("+Z"))
        self._fill_directions()
        self._size_table()
        self.set_down(self._down)   # shows the reference frame's gravity in the choice too, and renders

    # ---- choices -----------------------------------------------------------------------------------
    @property
    def down(self) -> np.ndarray:
        """Gravity's direction in the reference frame, as the panel uses it."""
        return self._down.copy()

    def set_down(self, down) -> None:
        self._take_down(down)
        self.render_when_seen()

    def _take_down(self, down) -> None:
        direction = np.asarray(down, dtype=float)
        if direction.shape != (3,) or not np.all(np.isfinite(direction)) or np.linalg.norm(direction) == 0:
            raise ValueError("gravity needs three finite numbers, not all zero")
        self._down = direction / np.linalg.norm(direction)
        for i in range(self.gravity_box.count()):
            data = self.gravity_box.itemData(i)
            if data != TYPED and np.allclose(data, self._down, atol=0, rtol=0):
                self.gravity_box.setCurrentIndex(i)
                break
        else:
            self.gravity_box.setCurrentIndex(self.gravity_box.findData(TYPED))
            self.gravity_field.setText(", ".join(f"{c:g}" for c in self._down))
        self.gravity_field.setEnabled(self.gravity_box.currentData() == TYPED)

    def _gravity_chosen(self, index: int) -> None:
        data = self.gravity_box.itemData(index)
        self.gravity_field.setEnabled(data == TYPED)
        if data == TYPED:
            self.gravity_field.setFocus()
            return
        self.say("")
        self.set_down(data)

    def _gravity_typed(self) -> None:
        text = self.gravity_field.text()
        parts = [p for p in text.replace(",", " ").split() if p]
        try:
            if len(parts) != 3:
                raise ValueError(f"type three numbers x, y, z for gravity; got “{text.strip()}”")
            self.set_down([parse_number(p) for p in parts])
        except ValueError as exc:
            self.say(f"{exc} (kept the last good direction)", problem=True)
            return
        self.say("")

    def _face_picked(self, *_) -> None:
        self._face_chosen = True
        self._fill_directions()
        self.render()

    def _fill_directions(self) -> None:
        face = self.face_box.currentData()
        current = self.direction_box.currentData()
        self.direction_box.clear()
        default = DEFAULT_IN_FACE[face[1]]
        for name in axes.SIGNED_AXES:
            if name[1] != face[1]:
                self.direction_box.addItem(axes.display(name), name)
        index = self.direction_box.findData(current if current and current[1] != face[1] else default)
        self.direction_box.setCurrentIndex(index)

    def _size_table(self) -> None:
        self.faces.resizeRowsToContents()
        height = self.faces.horizontalHeader().sizeHint().height() + sum(self.faces.rowHeight(r) for r in range(len(FACES)))
        self.faces.setFixedHeight(height + 2 * self.faces.frameWidth() + 2)

    # ---- model -> view -----------------------------------------------------------------------------
    def follow(self, change: Change) -> None:
        if change.touches(WORDS):   # the reference frame was named anew: gravity is its "down"
            self._take_down(describe.gravity_direction(self.model.reference_frame))

    def render(self) -> None:
        mount = self.model.current_mount()
        try:
            report = level_readings(mount.orientation, self._down)
        except FramewrightError as exc:  # cannot happen with a checked direction; never a blank panel
            self.say(f"{exc}", problem=True)
            return
        names = mount.part.face_names
        if self.slopes.problem:
            self.say(self.slopes.problem, problem=True)
        elif self.message.text().startswith("Base:"):
            self.say("")
        for row, reading in enumerate(report.faces):
            shown = level_angle(reading)
            cells = (axes.display(reading.face), names.get(reading.face, ""), degrees(reading.tilt_deg),
                     degrees(reading.off_plumb_deg), reading.facing, self.slopes.reading_text(shown))
            for column, text in enumerate(cells):
                item = self.faces.item(row, column)
                if item is None:
                    item = QTableWidgetItem()
                    if column not in (1, 4):
                        item.setTextAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
                    self.faces.setItem(row, column, item)
                item.setText(text)
                tip = FACE_TIPS[column]
                if column == 2:
                    tip += f"\nNormal {degrees(reading.from_up_deg)} from straight up."
                elif column == READS_COLUMN:
                    where = "plumb" if reading.facing == "side" else "level"
                    tip = (self.slopes.reading_tip(shown) + "\n"
                           + self.slopes.rise_words(axes.display(reading.face), shown, where))
                item.setToolTip(tip)
        up = next(r for r in report.faces if r.face == report.up_face)
        self.up_label.setText(f"Up: face {axes.display(report.up_face)}; down: face {axes.display(report.down_face)}.")
        self.rise_label.setText(self.slopes.rise_words(axes.display(up.face), level_angle(up), "level"))
        self.elevations.setText("    ".join(f"{axes.display(a.axis)}  {degrees(a.elevation_deg)}" for a in report.axes))
        if not self._face_chosen and self.face_box.currentData() != report.up_face:
            self.face_box.setCurrentIndex(self.face_box.findData(report.up_face))
            self._fill_directions()
        reading = inclinometer_reading(mount.orientation, self.face_box.currentData(),
                                       self.direction_box.currentData(), self._down)
        x, y = reading.direction, reading.cross_direction
        self.incline_label.setText(
            f"x along body {_vec(x)}: {degrees(reading.along_deg)}\n"
            f"y along body {_vec(y)}: {degrees(reading.across_deg)}\n"
            f"face {axes.display(reading.face)}: normal {degrees(reading.tilt_deg)} from straight up"
            + "".join(f"\n{n}" for n in reading.notes))


def _vec(v) -> str:
    """A body axis name when the vector is one, else its numbers."""
    name = axes.name_of_vector(v, atol=1e-12, rtol=1e-5)   # near enough: v comes out of a projection
    if name:
        return axes.display(name)
    return vector(v, 3)
