"""What every editor shares: render from the model, ignore the orientation change it made itself, keep the
user's spelling until focus leaves the editor, then show the canonical form."""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import QApplication, QGroupBox, QLabel, QWidget

from app.text import significant
from app.widgets.number_field import NumberField, quoted
from core import units
from app.model import ORIENTATION, PREFERENCES, SESSION, Change, SessionModel


# Typed angles beyond this are refused (not asked about: a question on every keystroke of a run would
# interrupt typing, and no mount is turned more than two full turns).
ANGLE_LIMIT_DEG = 720.0


def focus_left(widget: QWidget, old, new) -> bool:
    """Whether a focus change from `old` to `new` leaves `widget` (focus was inside it, now is not)."""
    return old is not None and widget.isAncestorOf(old) and not (new is not None and widget.isAncestorOf(new))


class EditorBase(QGroupBox):
    # The core/representations.py entry this editor shows (what Copy as writes when it is the one in use).
    representation = None
    renders = 0            # how often it rendered from a change of the model (tests count: hidden, none)
    _stale = False         # a change came while it was hidden in a shown window: it renders when shown
    _digits_stale = False  # the significant digits changed since the fields were last fitted to them
    _setup_stale = False   # the display preferences changed since the labels and units were last set

    def __init__(self, model: SessionModel, title: str, parent: QWidget | None = None):
        super().__init__(title, parent)
        self.model = model
        self._editing = False  # the user has typed or stepped here since the last render
        self._preview_start = None  # (orientation, key, merge token) before this run's first preview
        self._field_start = None  # (field, orientation) before the typing in that field began
        model.changed.connect(self._on_model_changed)
        app = QApplication.instance()
        if app is not None:
            app.focusChanged.connect(self._on_focus_changed)

    # ---- to implement ---------------------------------------------------------------------------
    def render(self) -> None:
        """Show the model's current orientation in this editor's canonical spelling: what the display
        preferences set up, then the numbers."""
        self.render_setup()
        self.render_values()

    def render_setup(self) -> None:
        """Titles, labels, units, tooltips, ranges and choices: what only the display preferences (and the
        editor's own toggles) decide. An edit of the orientation leaves them as they are."""

    def render_values(self) -> None:
        """The current orientation's numbers (and what they decide, such as a note)."""
        raise NotImplementedError

    def read_orientation(self):
        """The orientation the fields spell now, marking bad fields; None when they spell none."""
        raise NotImplementedError

    def after_edit(self, orientation) -> None:
        """Hook: something of the editor's own to update after an edit it sent (e.g. a slider)."""

    # ---- edits from the fields ----------------------------------------------------------------
    def connect_fields(self, fields: list[NumberField]) -> None:
        for field in fields:
            field.edited.connect(lambda text, f=field: self._on_typed(text, f))
            field.committed.connect(self._on_committed)
            field.stepped.connect(lambda value, f=field: self._on_stepped(f, value))

    def _on_typed(self, _text: str = "", field: NumberField | None = None) -> None:
        self._editing = True
        if field is not None and (self._field_start is None or self._field_start[0] is not field):
            # what this field's typing may withdraw: the orientation before its first keystroke
            self._field_start = (field, self.model.current_orientation())
        o = self.read_orientation()
        if o is not None:
            self.push(o, "typing")
            self.after_edit(o)
            understood = field.understood if field is not None else None
            note = getattr(self, "note", None)
            if understood and note is not None:
                note.setText(f"Reading {understood}.")
            return
        # Half-typed or out of range: withdraw what the run previewed, so nothing of it stays committed,
        # and say why in the note, where it can be seen without hovering.
        self._withdraw_preview()
        problem = next((f.problem for f in self.findChildren(NumberField) if f.problem), None)
        note = getattr(self, "note", None)
        if problem is not None and note is not None:
            note.setText(f"Not used yet: {problem}. The last good value stays in use.")

    def _withdraw_preview(self) -> None:
        """Back to before the bad field's typing began (other fields' good values stay previewed)."""
        start = self._preview_start
        if start is None:
            return
        orientation = self._field_start[1] if self._field_start is not None else start[0]
        _, key, token = start
        if token == self.model.merge_token and self.model.current_orientation() != orientation:
            self.push(orientation, key)  # merges into the run's step (which leaves the stack at its start)

    def _on_stepped(self, field: NumberField, value: float) -> None:
        field.set_text(self.fmt(value))
        self._editing = True
        o = self.read_orientation()
        if o is not None:
            self.push(o, f"step-{id(field)}")  # one undo step per run of steps on one field
            self.after_edit(o)

    def _on_committed(self) -> None:
        if not self._editing:  # Enter in a spin box reports itself twice
            return
        if self.read_orientation() is not None:
            self.finish_editing()

    # ---- shared behaviour -----------------------------------------------------------------------
    @property
    def digits(self) -> int:
        return self.model.preferences.significant_digits

    @property
    def degrees(self) -> bool:
        return self.model.preferences.angle_units == "deg"

    @property
    def angle_key(self) -> str:
        """The display unit of angles (core/units.py key): the one preference for every editor."""
        return self.model.preferences.angle_units

    @property
    def angle_unit(self) -> str:
        """The unit's symbol for labels: '°', 'rad', 'mrad', '′', '″', 'gon', 'mil'."""
        return units.ANGLE_UNITS[self.angle_key].symbol

    def unit_label(self, text: str) -> str:
        """A field's label with its unit: 'Angle (°)'. A unit longer than a mark ('mrad', 'gon') goes in the
        editor's title instead ('Angles, mrad'), so the editors keep to one row at a laptop's width."""
        return f"{text} ({self.angle_unit})" if len(self.angle_unit) == 1 else text

    def show_unit_in_title(self, title: str) -> None:
        self.setTitle(title if len(self.angle_unit) == 1 else f"{title}, {self.angle_unit}")

    @property
    def angle_step(self) -> float:
        """One arrow step: a whole unit, or a hundredth of a radian."""
        return 0.01 if self.angle_key == "rad" else 1.0

    def shown_angles(self, degrees):
        """Angles in degrees, in the display unit."""
        return units.degrees_to(degrees, self.angle_key)

    def angles_in_degrees(self, shown):
        """Angles typed in the display unit, in degrees."""
        return units.to_degrees(shown, self.angle_key)

    def fmt(self, value: float) -> str:
        return significant(float(value), self.digits)

    def _on_model_changed(self, change: Change) -> None:
        if change.made_by(self) and change.what == frozenset({ORIENTATION}):
            return  # our own edit: the fields already hold what the user typed
        self._editing = False
        self._preview_start = self._field_start = None
        if change.touches(PREFERENCES, SESSION):
            self._digits_stale = self._setup_stale = True
        if self.window().isVisible() and not self.isVisible():
            self._stale = True  # not shown (the Gibbs and MRP editors until View asks): drawn when shown
            return
        self._render_change()

    def _render_change(self) -> None:
        self._stale = False
        if self._digits_stale:
            self._digits_stale = False
            for field in self.findChildren(NumberField):
                field.fit_digits(self.digits)
        self.renders += 1
        if self._setup_stale:
            self._setup_stale = False
            self.render()
        else:
            self.render_values()   # the orientation (or the mount) changed: only the numbers

    def showEvent(self, event) -> None:
        super().showEvent(event)
        if self._stale:
            self._render_change()

    def _on_focus_changed(self, old, new) -> None:
        if self._editing and focus_left(self, old, new):
            self.finish_editing()

    def finish_editing(self) -> None:
        """The user is done here (Enter, or focus went elsewhere): end the undo run, show canonical. Text
        that could not be used is named in the editor's note, so leaving the editor loses nothing unsaid."""
        unused = [(f.text(), f.problem) for f in self.findChildren(NumberField) if f.problem]
        understood = [f.understood for f in self.findChildren(NumberField) if f.understood and not f.problem]
        if unused:
            self._withdraw_preview()
        self._preview_start = self._field_start = None
        self.model.end_continuous()
        self._editing = False
        self.render()
        note = getattr(self, "note", None)
        if unused and note is not None:
            text, problem = unused[0]
            note.setText(f"Not used: {quoted(text)} ({problem}); the last good value is shown.")
        elif understood and note is not None:   # a number typed with its own unit: say how it was read
            note.setText("Read " + "; ".join(understood) + ".")

    def push(self, orientation, key: str) -> None:
        """Send an edit to the model; runs of the same key merge into one undo step."""
        self._editing = True
        start = self._preview_start
        if start is None or start[1] != key or start[2] != self.model.merge_token:
            self._preview_start = (self.model.current_orientation(), key, self.model.merge_token)
        self.model.set_orientation(orientation, origin=self, continuous_key=(type(self).__name__, key),
                                   text=f"Edit {self.title().replace('&&', '&')}",
                                   pause_ends_run=not key.startswith("typing"))

    def limit_angles(self, fields: list[NumberField]) -> None:
        """Angles are refused beyond two full turns either way: no mounting needs more, and a larger
        number is a slip (an exponent, a digit too many) that would otherwise reduce to some angle. Each
        field also reads a number with its own unit mark (0.5 mrad, 30″, 1°30′) in the display unit."""
        limit = float(self.shown_angles(ANGLE_LIMIT_DEG))
        symbol = self.angle_unit
        shown = f"{limit:.6g}{symbol}" if symbol in "°′″" else f"{limit:.6g} {symbol}"
        for field in fields:
            field.set_range(-limit, limit, f"±{shown} (two full turns)")
            field.set_angle_unit(self.angle_key)

    @staticmethod
    def read_fields(fields: list[NumberField]) -> list[float] | None:
        """Parse each field, marking the bad ones; None when any is bad."""
        values, good = [], True
        for field in fields:
            try:
                values.append(field.value())
                field.set_problem(None)
            except ValueError as exc:
                field.set_problem(str(exc))
                good = False
        return values if good else None

    @staticmethod
    def narrow_combo(box, characters: int = 14) -> None:
        """Let a combo of long entries shrink to `characters` (elided); its list still shows them whole."""
        box.setSizeAdjustPolicy(box.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        box.setMinimumContentsLength(characters)

    @staticmethod
    def note_label(lines: int = 2) -> QLabel:
        """A wrapped line of notes under the fields, with room kept for `lines` lines so a note never
        arrives clipped and the layout does not jump when one appears."""
        label = QLabel("")
        label.setWordWrap(True)
        label.setObjectName("EditorNote")
        label.setStyleSheet("color: #444;")
        label.setMinimumHeight(label.fontMetrics().lineSpacing() * lines + 4)
        label.setAlignment(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignTop)
        return label
