"""A thin editor for three pure numbers of a parameter set in core/representations.py (the Rodrigues
parameter sets): its three fields, the set's formula and a note. Each set's own editor names its
representation and what its note says."""

from __future__ import annotations

from PySide6.QtWidgets import QGridLayout, QLabel

from app.editors.base import EditorBase
from app.widgets.number_field import NumberField
from core.errors import FramewrightError


class ParametersEditor(EditorBase):
    """Subclasses set `representation` (a core.representations entry) and may refine `shown_problem`
    (why the current orientation is not shown) and `typed_problem` (why typed numbers are refused)."""

    representation = None
    component_tip = "{name}, {c} component, in the reference frame: {formula} (n the axis, \u03c6 the angle)."

    def __init__(self, model, parent=None):
        rep = self.representation
        super().__init__(model, rep.title, parent)
        self.fields = [NumberField(self.component_tip.format(name=rep.title, c=c, formula=rep.formula), step=0.01)
                       for c in "xyz"]
        self.labels = [QLabel(c) for c in "xyz"]
        self.formula_label = QLabel(f"{rep.symbol} = {rep.formula}")
        self.note = self.note_label(2)

        # One row of fields under the title, the note below: the box is short, so shown beside the others it
        # takes little of the Scene's height.
        grid = QGridLayout(self)
        grid.addWidget(self.formula_label, 0, 0)
        for i, (label, field) in enumerate(zip(self.labels, self.fields)):
            grid.addWidget(label, 0, 1 + 2 * i)
            grid.addWidget(field, 0, 2 + 2 * i)
            grid.setColumnStretch(2 + 2 * i, 1)
        grid.addWidget(self.note, 1, 0, 1, 7)
        grid.setRowStretch(2, 1)
        self.connect_fields(self.fields)
        self.render()

    # ---- what a set says about itself -------------------------------------------------------------
    def shown_problem(self, orientation) -> str | None:
        """Why the fields show no numbers for this orientation (None: they show them)."""
        return None

    def typed_problem(self, values) -> str | None:
        """Why typed numbers are refused (None: they are used)."""
        return None

    def note_words(self, orientation, values) -> str:
        return ""

    # ---- model -> fields ------------------------------------------------------------------------------
    def render_values(self) -> None:
        o = self.model.current_orientation()
        problem = self.shown_problem(o)
        for field in self.fields:
            field.setEnabled(problem is None)
        if problem is not None:
            for field in self.fields:
                field.set_text("")
                field.lineEdit().setPlaceholderText("\u221e")
            self.note.setText(problem)
            return
        values = self.representation.values(o)
        for field, v in zip(self.fields, values):
            field.lineEdit().setPlaceholderText("")
            field.set_text(self.fmt(v))
        self.note.setText(self.note_words(o, values))

    # ---- fields -> model ------------------------------------------------------------------------------
    def read_orientation(self):
        values = self.read_fields(self.fields)
        if values is None:
            return None
        problem = self.typed_problem(values)
        try:
            if problem is not None:
                raise FramewrightError(problem)
            o = self.representation.orientation(values)
        except FramewrightError as exc:
            for field in self.fields:
                field.set_problem(str(exc))
            return None
        self.note.setText(self.note_words(o, values))
        return o
