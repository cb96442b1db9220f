"""Where a chain step's orientation comes from: the editors (the selected mount's orientation, entered in
any representation there) or text pasted from a drawing, read by the same decoder as the Decode panel,
with every plausible reading offered in a list, most plausible first."""

from __future__ import annotations

from PySide6.QtCore import Signal
from PySide6.QtWidgets import QComboBox, QPlainTextEdit, QVBoxLayout, QWidget

from app.panels.reading_rows import conventions_words
from app.text import compact
from app.widgets.message_line import MessageLine
from core.errors import FramewrightError
from core.orientation import Orientation


def axis_angle_summary(orientation: Orientation) -> str:
    """'90° about (0, 0, 1)', or 'no turn' (the axis is undefined at angle 0)."""
    axis, angle = orientation.as_axis_angle()
    if angle == 0:
        return "no turn"
    return f"{compact(angle)}° about ({', '.join(compact(v, 4) for v in axis)})"


def full_tooltip(orientation: Orientation) -> str:
    """Every representation of a step, for its tooltip."""
    q = orientation.as_quaternion()
    m = orientation.as_matrix()
    rows = "\n".join("    " + "  ".join(compact(v, 6).rjust(9) for v in row) for row in m)
    return (f"Axis and angle: {axis_angle_summary(orientation)}\n"
            f"Quaternion (w, x, y, z), Hamilton: {', '.join(compact(v, 9) for v in q)}\n"
            f"Rotation matrix, child -> parent (columns are the child axes in the parent):\n{rows}")


class PastedOrientation(QWidget):
    """A paste box and the list of its readings; `orientation()` is the chosen reading's (or None)."""

    reading_changed = Signal()

    def __init__(self, parent=None):
        super().__init__(parent)
        self.readings: list = []
        self.text_box = QPlainTextEdit()
        self.text_box.setPlaceholderText("Or paste the step's numbers as printed on the drawing: a matrix, a "
                                         "quaternion, an axis and an angle, or three angles.")
        self.text_box.setToolTip("Text read by the same decoder as the Decode panel. '.' is the decimal point; "
                                 "the Unicode minus and en dash are accepted. A matrix is read body -> "
                                 "reference first: here the step's child frame -> its parent frame.")
        # A fixed height: squeezed by a growing result, the box would shrink and the buttons below it
        # would move under the user's pointer between clicks (the scroll area scrolls instead).
        self.text_box.setFixedHeight(64)
        self.reading_box = QComboBox()
        self.reading_box.setToolTip("Which reading of the pasted text to use, most plausible first (the "
                                    "conventions of each are named).")
        self.reading_box.setSizeAdjustPolicy(QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        self.reading_box.setMinimumContentsLength(20)
        self.message = MessageLine()
        layout = QVBoxLayout(self)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.addWidget(self.text_box)
        layout.addWidget(self.reading_box)
        layout.addWidget(self.message)
        self.text_box.textChanged.connect(self.read)
        self.reading_box.currentIndexChanged.connect(lambda *_: self.reading_changed.emit())
        self.read()

    def set_text(self, text: str) -> None:
        self.text_box.setPlainText(text)

    def read(self) -> None:
        from core.decode import decode  # late, as in the Decode panel

        text = self.text_box.toPlainText()
        self.readings = []
        self.reading_box.blockSignals(True)
        self.reading_box.clear()
        if not text.strip():
            self.message.say("")
        else:
            try:
                self.readings = list(decode(text))
            except FramewrightError as exc:
                self.message.say(f"Cannot read this: {exc}", problem=True)
            else:
                if not self.readings:
                    self.message.say("No reading of this text is a valid orientation.")
                else:
                    plural = "s" if len(self.readings) > 1 else ""
                    self.message.say(f"{len(self.readings)} reading{plural}; the first is the most plausible.")
                for rank, reading in enumerate(self.readings, start=1):
                    self.reading_box.addItem(f"{rank}. {reading.kind}: {conventions_words(reading)}")
                    self.reading_box.setItemData(rank - 1, f"{full_tooltip(reading.orientation)}",
                                                 role=3)  # Qt.ToolTipRole
        self.reading_box.setEnabled(bool(self.readings))
        self.reading_box.blockSignals(False)
        self.reading_changed.emit()

    def orientation(self) -> Orientation | None:
        index = self.reading_box.currentIndex()
        if not self.readings or index < 0:
            return None
        return self.readings[index].orientation

    def position(self):
        """(Position or None, words for the message): the chosen reading's translation when the text states
        its unit; without a unit the step takes the rotation only, and the words say so (never a guess)."""
        from core.position import position_as_stated

        index = self.reading_box.currentIndex()
        if not self.readings or index < 0 or getattr(self.readings[index], "translation", None) is None:
            return None, ""
        reading = self.readings[index]
        unit = getattr(reading, "translation_unit", None)
        if not unit:
            return None, ("The text gives a translation without a unit: the step takes the rotation only. "
                          "Give its origin through the editors' Position (in its unit) and Set from the editors.")
        try:
            return position_as_stated(reading.translation, unit), f"Its origin is kept, in {unit} as the text says."
        except FramewrightError as error:
            return None, f"{error}: the step takes the rotation only."

    def reading_words(self) -> str:
        index = self.reading_box.currentIndex()
        if not self.readings or index < 0:
            return ""
        reading = self.readings[index]
        return f"{reading.kind}, {conventions_words(reading)}"
