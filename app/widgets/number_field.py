"""One number field: free text the user owns, '.' as the decimal point whatever the locale, arrows and
wheel stepping, and a red frame with a tooltip saying why when the text is not a number.

The field never rewrites its own text while the user types; the editor decides when to render.
"""

from __future__ import annotations

import re

from PySide6.QtCore import QEvent, QRectF, Qt, Signal
from PySide6.QtGui import QColor, QKeySequence, QPainter, QPen, QValidator
from PySide6.QtWidgets import QAbstractSpinBox

from core.number_text import parse_number, quoted  # noqa: F401  (one reader for every cell; re-exported)


INVALID_COLOUR = QColor("#c62828")
# A number followed by a unit mark or word: '0.5 mrad', '30″', "1'30", '2gon'
_MARKED = re.compile(r"\d[\d.]*\s*(?![eE][+\-\d])[A-Za-z°′″'\"]")

# Keys a field leaves to the window, so undo and redo reach the model's undo stack from any field rather
# than the line edit's private history (which would undo keystrokes the model already holds).
_WINDOW_KEYS = (QKeySequence.StandardKey.Undo, QKeySequence.StandardKey.Redo)
_WINDOW_KEY_COMBOS = ("Ctrl+Y", "Ctrl+Shift+Z")


def is_undo_or_redo_key(event) -> bool:
    if any(event.matches(key) for key in _WINDOW_KEYS):
        return True
    pressed = QKeySequence(event.keyCombination())
    return any(pressed.matches(QKeySequence(combo)) == QKeySequence.SequenceMatch.ExactMatch
               for combo in _WINDOW_KEY_COMBOS)


class NumberField(QAbstractSpinBox):
    """Signals: ``edited(text)`` while the user types; ``stepped(value)`` for each arrow, wheel or
    up/down-key step; ``committed()`` on Enter."""

    edited = Signal(str)
    stepped = Signal(float)
    committed = Signal()

    def __init__(self, convention_tooltip: str, step: float = 1.0, parent=None, steppable: bool = True):
        super().__init__(parent)
        self._base_tooltip = convention_tooltip
        self._step = step
        self._steppable = steppable
        self._problem: str | None = None
        self._range: tuple[float, float, bool, str] | None = None  # low, high, low excluded, why
        self._angle_unit: str | None = None   # an angle field: its display unit, and it reads unit marks
        self.understood: str | None = None    # what a number with a unit mark was read as, for the note
        self.setToolTip(convention_tooltip)
        self.setAccelerated(True)
        self.setKeyboardTracking(True)
        self.setCorrectionMode(QAbstractSpinBox.CorrectionMode.CorrectToPreviousValue)
        self.setAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
        if not steppable:
            self.setButtonSymbols(QAbstractSpinBox.ButtonSymbols.NoButtons)
        self.lineEdit().textEdited.connect(self.edited)
        self.lineEdit().returnPressed.connect(self.committed)
        self.fit_digits(9)
        self.setObjectName("NumberField")
        self.installEventFilter(self)
        self.lineEdit().installEventFilter(self)

    def eventFilter(self, watched, event) -> bool:
        # Not claiming the shortcut (the event stays ignored) lets the window's Undo and Redo take it; a key
        # press that still arrives (nothing to undo) never reaches the line edit's own history.
        if event.type() in (QEvent.Type.ShortcutOverride, QEvent.Type.KeyPress) and is_undo_or_redo_key(event):
            event.ignore()
            return True
        return super().eventFilter(watched, event)

    # ---- text the editor renders ----------------------------------------------------------------
    def set_text(self, text: str) -> None:
        """Replace the text (a render from the model); clears any problem."""
        if self.lineEdit().text() != text:
            self.lineEdit().setText(text)
        self.set_problem(None)
        self.understood = None

    def text(self) -> str:  # noqa: D401 - the field's current text
        return self.lineEdit().text()

    def set_angle_unit(self, key: str | None) -> None:
        """Make this an angle field shown in `key` (core/units.py): it also reads '0.5 mrad', '30″',
        '1°30′', '2 gon' and converts them to its unit. None: a plain number field."""
        self._angle_unit = key

    def value(self) -> float:
        """The number typed, when it is complete and inside the field's range; ValueError saying why not."""
        self.understood = None
        try:
            value = parse_number(self.text())
        except ValueError:
            if self._angle_unit is None or not _MARKED.search(self.text()):
                raise                       # no unit mark typed: the plain number's reason says most
            value = self._angle_with_mark()
        if self._range is not None:
            low, high, low_excluded, why = self._range
            if value > high or value < low or (low_excluded and value == low):
                raise ValueError(f"{quoted(self.text())} is outside {why}")
        return value

    def _angle_with_mark(self) -> float:
        """The typed angle with its unit mark, in this field's unit (ValueError saying why not)."""
        from core import units
        from core.errors import FramewrightError

        try:
            read = units.read_angle(self.text(), self._angle_unit)
        except FramewrightError as error:
            raise ValueError(str(error)) from None
        value = float(units.degrees_to(read.degrees, self._angle_unit))
        self.understood = f"{read.said} = {units.format_angle(read.degrees, self._angle_unit, decimals=9)}" \
            if self._angle_unit != "deg" else read.said
        return value

    def set_range(self, low: float, high: float, why: str, low_excluded: bool = False) -> None:
        """Values this field accepts; `why` names the range for the message (e.g. "±720°: ...")."""
        self._range = (low, high, low_excluded, why)

    def clear_range(self) -> None:
        self._range = None

    def fit_digits(self, digits: int) -> None:
        """Wide enough for a signed number with this many significant digits, never clipped."""
        sample = "-0.0" + "8" * digits  # a signed fraction; wider text scrolls rather than widening all
        self.setMinimumWidth(self.fontMetrics().horizontalAdvance(sample) + (38 if self._steppable else 16))

    def set_step(self, step: float) -> None:
        self._step = step

    # ---- problems -------------------------------------------------------------------------------
    def set_problem(self, problem: str | None) -> None:
        if problem == self._problem:
            return
        self._problem = problem
        self.setProperty("invalid", problem is not None)
        if problem is None:
            self.setToolTip(self._base_tooltip)
        else:
            self.setToolTip(f"Not used: {problem}\n\n{self._base_tooltip}")
        self.update()  # the red frame is painted in paintEvent

    @property
    def problem(self) -> str | None:
        return self._problem

    def set_convention_tooltip(self, text: str) -> None:
        if text == self._base_tooltip:
            return                      # every edit renders it again; Qt's setToolTip is not free
        self._base_tooltip = text
        if self._problem is None:
            self.setToolTip(text)
        else:
            self.setToolTip(f"Not used: {self._problem}\n\n{text}")

    def paintEvent(self, event) -> None:
        super().paintEvent(event)
        if self._problem is not None:
            # Painted, not a style sheet: a style sheet on a spin box upsets the layout of its parts.
            painter = QPainter(self)
            painter.setPen(QPen(INVALID_COLOUR, 2))
            painter.drawRect(QRectF(self.rect()).adjusted(1, 1, -1, -1))
            painter.end()

    # ---- QAbstractSpinBox hooks -----------------------------------------------------------------
    def validate(self, text, pos):
        # Accept any text: a bad entry is shown (red frame, tooltip), never blocked or silently fixed.
        return QValidator.State.Acceptable, text, pos

    def fixup(self, text):
        return text

    def stepEnabled(self):
        if not self._steppable:
            return QAbstractSpinBox.StepEnabledFlag.StepNone
        return QAbstractSpinBox.StepEnabledFlag.StepUpEnabled | QAbstractSpinBox.StepEnabledFlag.StepDownEnabled

    def stepBy(self, steps: int) -> None:
        try:
            start = self.value()
        except ValueError:
            return  # nothing good to step from; the red frame already says why
        self.stepped.emit(start + steps * self._step)
