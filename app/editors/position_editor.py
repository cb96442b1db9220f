"""Position: where the selected mount's body origin is in the reference frame (x, y, z and the unit they
are shown in), beside the orientation editors. All three fields empty means the mount has no position.

Typed numbers are checked as they are typed (a red frame and the note say why a field is not used) and
sent to the model only when all three are good, on Enter or when focus leaves the editor: one undo step
per commit. The editor renders from the model and ignores the change it made itself."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QApplication, QFrame, QGridLayout, QLabel, QVBoxLayout

from app.editors.base import EditorBase, focus_left
from app.text import significant
from app.widgets.number_field import NumberField
from app.widgets.with_tips import length_choice
from app.model import MOUNTS, POSITION, PREFERENCES, SELECTION, Change, SessionModel
from core.errors import FramewrightError
from core.position import DEFAULT_UNIT, LENGTH_UNITS, Position, position_problem

_TIP = ("{axis} of the body origin in the reference frame, in the unit chosen beside the fields. "
        "Leave all three empty for a mount without a position.")


class PositionEditor(QFrame):
    """A title with the unit, then x, y, z one per line and a note under them: it sits under the Mounts
    list (a position belongs to the selected mount), so the pose's other half takes no height from the Scene."""

    def __init__(self, model: SessionModel, parent=None):
        super().__init__(parent)
        self.setFrameShape(QFrame.Shape.StyledPanel)
        self.model = model
        self._editing = False
        self.fields = [NumberField(_TIP.format(axis=a), steppable=False) for a in ("X", "Y", "Z")]
        self.unit_box = length_choice("Unit of the position shown and typed (mm, m, in, or thou: a thousandth of "
                                      "an inch, 0.0254 mm, not an angular mil). Changing it keeps the same place; "
                                      "the session stores metres and the unit shown.", tuple(LENGTH_UNITS))
        self.note = EditorBase.note_label(lines=1)
        self.note.hide()            # shown only when it has something to say, so it costs no height
        self.note.setAlignment(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter)
        title = QLabel("Position")
        title.setToolTip("Where the body origin is in the reference frame (with the orientation, a pose). "
                         "Enter or leaving the fields sets it; Ctrl+Z takes it back. Empty: no position.")
        layout = QVBoxLayout(self)
        grid = QGridLayout()
        grid.addWidget(title, 0, 0, 1, 2)
        grid.addWidget(self.unit_box, 0, 2)
        for row, (axis, field) in enumerate(zip("xyz", self.fields), start=1):
            grid.addWidget(QLabel(axis), row, 0)
            grid.addWidget(field, row, 1, 1, 2)
        grid.setColumnStretch(1, 1)
        layout.addLayout(grid)
        layout.addWidget(self.note)
        for field in self.fields:
            field.edited.connect(self._on_typed)
            field.committed.connect(self.commit)
            field.fit_digits(6)
        self.unit_box.activated.connect(self._unit_chosen)
        model.changed.connect(self._on_model_changed)
        app = QApplication.instance()
        if app is not None:
            app.focusChanged.connect(self._on_focus_changed)
        self.render()

    # ---- model -> fields -------------------------------------------------------------------------
    def _on_model_changed(self, change: Change) -> None:
        if change.made_by(self):
            return          # our own commit: the fields already show it
        if change.touches(POSITION, SELECTION, MOUNTS, PREFERENCES):
            self._editing = False
            self.render()

    def render(self) -> None:
        position = self.model.current_mount().position
        unit = position.unit if position is not None else self.unit_box.currentData() or DEFAULT_UNIT
        self.unit_box.setCurrentIndex(list(LENGTH_UNITS).index(unit))
        digits = self.model.preferences.significant_digits
        values = position.shown() if position is not None else ("", "", "")
        for field, value in zip(self.fields, values):
            field.set_text(value if value == "" else significant(value, digits))
        for field in self.fields:
            field.lineEdit().setPlaceholderText("none")
        self._say("")

    # ---- fields -> model -------------------------------------------------------------------------
    def _unit(self) -> str:
        return self.unit_box.currentData()

    def read_position(self):
        """(ok, Position or None): what the fields spell now, marking the bad fields and saying why."""
        texts = [f.text().strip() for f in self.fields]
        if not any(texts):
            for field in self.fields:
                field.set_problem(None)
            return True, None
        values, problem = [], None
        for axis, field, text in zip("xyz", self.fields, texts):
            try:
                values.append(field.value())
                field.set_problem(None)
            except ValueError as exc:
                why = "empty: type all three, or clear all three for no position" if not text else str(exc)
                field.set_problem(why)
                problem = problem or f"{axis}: {why}"
        if problem is None:
            problem = position_problem(values, self._unit())
            if problem is not None and problem[:2] in ("x:", "y:", "z:"):
                self.fields["xyz".index(problem[0])].set_problem(problem[3:])
        if problem is not None:
            self._say(f"Not used: {problem}. The last good position stays in use.")
            return False, None
        return True, Position.from_shown(values, self._unit())

    def _on_typed(self, _text: str = "") -> None:
        self._editing = True
        ok, _ = self.read_position()
        if ok:
            self._say("")

    def commit(self) -> None:
        """Enter or focus out: send the position when all three fields are good (or all empty)."""
        if not self._editing:
            return
        ok, position = self.read_position()
        if not ok:
            return          # the note says why; the model keeps the last good position
        self._editing = False
        try:
            self.model.set_position(position, origin=self)
        except FramewrightError as exc:
            self._say(f"Not used: {exc}. The last good position stays in use.")
            return
        self.render()

    def _say(self, text: str) -> None:
        self.note.setText(text)
        self.note.setVisible(bool(text))

    def _unit_chosen(self, _index: int) -> None:
        position = self.model.current_mount().position
        if self._editing:
            self._on_typed()           # the typed numbers are now read in the new unit
        elif position is not None and position.unit != self._unit():
            self.model.set_position(position.in_unit(self._unit()), origin=self,
                                    text=f"Show the position in {self._unit()}")
            self.render()

    def _on_focus_changed(self, old, new) -> None:
        if self._editing and focus_left(self, old, new):
            self.commit()
