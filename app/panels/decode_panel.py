"""Decode panel: paste any text, see every plausible reading ranked, apply the one that matches the part."""

from __future__ import annotations

from PySide6.QtCore import QObject, QRunnable, Qt, QThreadPool, QTimer, Signal
from PySide6.QtGui import QGuiApplication, QPalette
from PySide6.QtWidgets import QComboBox, QHBoxLayout, QListWidget, QListWidgetItem, QPlainTextEdit, QVBoxLayout, QWidget

from app import plain_text
from app.model import PREFERENCES, SessionModel
from app.panels.base import Panel
from app.panels import reading_rows
from app.text import numbers
from app.widgets.with_tips import button
from core.errors import FramewrightError
from core.position import LENGTH_UNITS, Position, position_as_stated

# Text up to this length decodes in a few milliseconds and is read at once; longer text (up to the
# decoder's 100 kB, which can take a few hundred ms) is read on a worker thread so a paste never freezes
# the window.
_READ_AT_ONCE_CHARS = 2_000


class _Relay(QObject):
    """Carries a worker's result back to the GUI thread (a queued signal)."""
    done = Signal(int, object)


class _DecodeJob(QRunnable):
    def __init__(self, text: str, generation: int, relay: _Relay):
        super().__init__()
        self.text, self.generation, self.relay = text, generation, relay

    def run(self) -> None:
        result = _decode_or_error(self.text)
        try:
            self.relay.done.emit(self.generation, result)
        except RuntimeError:            # the window closed while this was read: nobody to tell
            pass


def _decode_or_error(text: str):
    """The readings, or the exception that refused the text (shown as a message, never raised)."""
    from core.decode import decode  # late: the decoder is only needed here
    try:
        return list(decode(text))  # no hints: every plausible reading, side by side
    except Exception as exc:  # noqa: BLE001  (a worker must hand every outcome back)
        return exc


class DecodePanel(Panel):
    watches = frozenset({PREFERENCES})   # new digits, angle unit or sequence: the readings are spelled again

    def __init__(self, model: SessionModel, parent=None):
        super().__init__(model, parent)
        self.readings: list = []
        self._shared_notes: list[str] = []     # notes every reading carries: said once, in the message
        self.paste_box = QPlainTextEdit()
        self.paste_box.setPlaceholderText("Paste a matrix, quaternion, axis and angle or three angles here, "
                                          "as printed on the drawing or written in the file.")
        self.paste_box.setToolTip("Text to decode. '.' is the decimal point; the Unicode minus, en dash and "
                                  "non-breaking spaces are accepted.")
        self.paste_box.setMaximumHeight(120)
        self.read_button = button("Read", "List every plausible reading of the text, most likely first.")
        self.paste_button = button("Paste", "Replace the text with the clipboard and read it.")
        self.list = QListWidget()
        self.list.setWordWrap(True)
        self.list.setSpacing(2)
        self.list.setAlternatingRowColors(True)
        self.list.setToolTip("Readings of the text, most plausible first. Double-click or Apply to use one "
                             "(undo takes it back).")
        self.apply_button = button("Apply reading", "Set the selected mount's orientation to the chosen reading "
                                                    "(undoable).")
        self.apply_button.setEnabled(False)
        # A translation without a unit in the text: the person says which unit it is before Apply.
        self.unit_label = plain_text.plain_label()
        self.unit_label.setWordWrap(True)
        self.unit_box = QComboBox()
        self.unit_box.addItem("choose the unit…", None)
        for unit in LENGTH_UNITS:
            self.unit_box.addItem(f"read it as {unit}", unit)
        self.unit_box.setToolTip("The text gives the translation without a unit. Say which unit it is; "
                                 "Framewright does not guess.")
        self.unit_row = QWidget()
        unit_layout = QHBoxLayout(self.unit_row)
        unit_layout.setContentsMargins(0, 0, 0, 0)
        unit_layout.addWidget(self.unit_label, 1)
        unit_layout.addWidget(self.unit_box)
        self.unit_row.hide()

        layout = QVBoxLayout(self)
        layout.addWidget(self.paste_box)
        row = QHBoxLayout()
        row.addWidget(self.paste_button)
        row.addWidget(self.read_button)
        row.addStretch(1)
        layout.addLayout(row)
        layout.addWidget(self.message)
        layout.addWidget(self.list, 1)
        layout.addWidget(self.unit_row)
        layout.addWidget(self.apply_button)

        self._generation = 0            # a newer read makes an older worker's result stale
        self._relay = _Relay()          # no parent: each job holds it, so it outlives a closed panel
        self._relay.done.connect(self._show)
        self._debounce = QTimer(self)
        self._debounce.setSingleShot(True)
        self._debounce.setInterval(250)
        self._debounce.timeout.connect(self.read)
        self.paste_box.textChanged.connect(self._debounce.start)
        self.read_button.clicked.connect(self.read)
        self.paste_button.clicked.connect(self.paste_from_clipboard)
        self.apply_button.clicked.connect(self.apply_selected)
        self.list.itemActivated.connect(lambda *_: self.apply_selected())  # Enter
        self.list.itemDoubleClicked.connect(lambda *_: self.apply_selected())
        self.list.currentItemChanged.connect(lambda *_: self._reading_chosen())
        self.unit_box.activated.connect(lambda *_: self._reading_chosen())

    def paste_from_clipboard(self) -> None:
        self.set_text(QGuiApplication.clipboard().text())

    def set_text(self, text: str) -> None:
        self.paste_box.setPlainText(text)
        self.read()

    def read(self) -> None:
        self._debounce.stop()
        text = self.paste_box.toPlainText()
        self.list.clear()
        self.readings, self._shared_notes = [], []
        self.message.setToolTip("")
        self.apply_button.setEnabled(False)
        self._generation += 1
        if not text.strip():
            self.say("")
            return
        if len(text) <= _READ_AT_ONCE_CHARS:
            self._show(self._generation, _decode_or_error(text))
            return
        self.say("Reading…")
        QThreadPool.globalInstance().start(_DecodeJob(text, self._generation, self._relay))

    def _show(self, generation: int, result) -> None:
        if generation != self._generation:
            return                      # the text changed while this was read
        if isinstance(result, FramewrightError):
            self.say(f"Cannot read this: {result}", problem=True)
            return
        if isinstance(result, Exception):
            self.say(f"Cannot read this: an internal error ({type(result).__name__})",
                     problem=True)
            return
        self.readings = result
        if not self.readings:
            self.say("No reading of this text is a valid orientation.")
            return
        plural = "s" if len(self.readings) != 1 else ""
        names = len({r.name for r in self.readings if r.name is not None})
        found = f" of {names} transforms" if names > 1 else ""
        self._shared_notes = reading_rows.shared_notes(self.readings)
        # the message wraps: a note about the whole text may take two lines there before it is cut
        about = "".join(f"\n{reading_rows.elided(note, 2 * reading_rows.NOTE_CHARS)}" for note in self._shared_notes)
        self.say(f"{len(self.readings)} reading{plural}{found}, most plausible first.{about}")
        self.message.setToolTip(plain_text.plain_tip("\n".join(self._shared_notes)) if self._shared_notes else "")
        self._render_list()
        self._select_reading(0)

    def _render_list(self) -> None:
        """One row per reading with its result, under a header per transform (or per kind when long)."""
        self.list.clear()
        preferences = self.model.preferences
        best: dict = {}
        for i, reading in enumerate(self.readings):
            best.setdefault(reading.name, i)
        groups = reading_rows.groups(self.readings)
        by_name = len({r.name for r in self.readings}) > 1       # grouped by name: the headers name them
        for group in groups:
            if group.header is not None:
                self.list.addItem(self._header_item(group.header))
            for i in group.members:
                reading = self.readings[i]
                first = best[reading.name]
                lines = reading_rows.reading_lines(reading, i + 1, self.readings[first], first + 1, preferences,
                                                   show_name=not by_name, said_above=self._shared_notes)
                item = QListWidgetItem("\n".join(lines))
                item.setData(Qt.ItemDataRole.UserRole, i)
                item.setToolTip(plain_text.plain_tip(reading_rows.reading_tip(reading, lines)))
                self.list.addItem(item)

    def _header_item(self, text: str) -> QListWidgetItem:
        """A group's title: not a reading, so it cannot be chosen (the arrow keys pass over it)."""
        item = QListWidgetItem(text)
        item.setToolTip("The readings under this title, the most plausible first. A title is not a reading: it "
                        "cannot be applied.")
        item.setFlags(Qt.ItemFlag.NoItemFlags)
        font = item.font()
        font.setBold(True)
        item.setFont(font)
        item.setForeground(self.palette().brush(QPalette.ColorGroup.Active, QPalette.ColorRole.WindowText))
        item.setBackground(self.palette().brush(QPalette.ColorGroup.Active, QPalette.ColorRole.Window))
        return item

    def _select_reading(self, index: int) -> None:
        for row in range(self.list.count()):
            if self.list.item(row).data(Qt.ItemDataRole.UserRole) == index:
                self.list.setCurrentRow(row)
                return

    def render(self) -> None:
        if self.readings:
            reading = self._current_reading()
            self._render_list()
            self._select_reading(self.readings.index(reading) if reading is not None else 0)

    def _current_reading(self):
        item = self.list.currentItem()
        index = None if item is None else item.data(Qt.ItemDataRole.UserRole)
        return None if index is None else self.readings[index]

    def _needs_unit(self, reading) -> bool:
        return getattr(reading, "translation", None) is not None and not getattr(reading, "translation_unit", None)

    def _reading_chosen(self) -> None:
        """Apply is offered for the chosen reading; one with a translation but no unit waits for the unit."""
        reading = self._current_reading()
        needs_unit = reading is not None and self._needs_unit(reading)
        if needs_unit:
            spelled = reading_rows.translation_words(reading, self.model.preferences.significant_digits)
            plain_text.say(self.unit_label, f"Translation {spelled}: the text gives no unit.")
        else:
            self.unit_box.setCurrentIndex(0)
        self.unit_row.setVisible(needs_unit)
        self.apply_button.setEnabled(reading is not None and (not needs_unit or self.unit_box.currentData() is not None))

    def _position_of(self, reading):
        """(Position or None, words saying how its unit was known); FramewrightError when unusable."""
        t = getattr(reading, "translation", None)
        if t is None:
            return None, ""
        unit = getattr(reading, "translation_unit", None)
        if unit:
            return position_as_stated(t, unit), f"in {unit}, as the text says"
        unit = self.unit_box.currentData()
        if unit is None:
            raise FramewrightError("the text gives the translation without a unit: choose its unit first")
        return Position.from_shown(t, unit), f"read as {unit} (you chose it: the text gives no unit)"

    def apply_selected(self) -> None:
        reading = self._current_reading()
        if reading is None:
            return
        text = f"Apply decoded reading ({reading.kind})"
        try:
            position, how = self._position_of(reading)
        except FramewrightError as exc:
            self.say(f"Not applied: {exc}. The mount is unchanged.", problem=True)
            return
        if position is None:
            self.model.set_orientation(reading.orientation, origin=self, text=text)
            self.say(f"Applied: {reading.label}.")
            return
        self.model.apply_pose(reading.orientation, position, text=text, origin=self)
        spelled = numbers(reading.translation, self.model.preferences.significant_digits)
        self.say(f"Applied: {reading.label}; translation {spelled} {how}.")
