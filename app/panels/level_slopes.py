"""How the Level panel shows what a level reads on a face: as an angle or a slope (mm/m, µm/m, in/ft,
percent), rounded as a chosen instrument shows it (core/level_instruments.py), and as the rise over a base
length (the shim under the far end of a base of that length; 100 mm unless typed)."""

from __future__ import annotations

import math

from PySide6.QtCore import Signal
from PySide6.QtWidgets import QFormLayout, QWidget

from app.widgets.number_field import parse_number
from app.widgets.with_tips import choice_box, line_field
from core import level_instruments, units

DEFAULT_BASE_MM = 100.0
MAX_BASE_MM = 1e6          # a kilometre of base: any bench fits below it


def level_angle(reading) -> float:
    """The angle a level laid on the face shows: its tilt from level on an up or down face, its lean from
    plumb on a side face (each at most 45°, so the slope is always finite)."""
    return reading.off_plumb_deg if reading.facing == "side" else reading.tilt_deg


class SlopeChoices(QWidget):
    """Show as [unit], Instrument [none | …], Base [100] mm. `changed` when any of them changes."""

    changed = Signal()

    def __init__(self, parent=None):
        super().__init__(parent)
        self.unit_box = choice_box("How the level reading is shown: degrees, or the slope tan(tilt) per length "
                                   "(millimetres or micrometres per metre, inches per foot, percent grade).",
                                   [(u.name, u.key) for u in units.SLOPE_UNITS.values()], least_chars=10)
        self.instrument_box = choice_box(
            "Round the reading as this instrument shows it, to its division. The resolutions are typical of "
            "each class of instrument (common practice); its own certificate governs.",
            [("exact", None)] + [(i.name, i.key) for i in level_instruments.INSTRUMENTS.values()], least_chars=12)
        self.base_field = line_field("Length of the base the shim is worked out over, mm ('.' is the decimal "
                                     "point): the rise of the face over that length, e.g. the shim under a foot "
                                     "that far from the pivot. Enter to use it.", placeholder="100")
        self.base_field.setText(f"{DEFAULT_BASE_MM:g}")
        self.base_field.setMaximumWidth(80)
        self.base_mm = DEFAULT_BASE_MM
        self.problem: str | None = None
        form = QFormLayout(self)      # one control a row: the side area is narrow at a laptop's size
        form.setContentsMargins(0, 0, 0, 0)
        form.addRow("Level reads in", self.unit_box)
        form.addRow("As shown by", self.instrument_box)
        form.addRow("Shim base (mm)", self.base_field)
        self.unit_box.activated.connect(lambda *_: self.changed.emit())
        self.instrument_box.activated.connect(self._instrument_chosen)
        self.base_field.returnPressed.connect(self._base_typed)
        self.base_field.editingFinished.connect(self._base_typed)

    def _instrument_chosen(self, *_) -> None:
        chosen = self.instrument_box.currentData()
        if chosen is not None:      # the instrument reads in its own unit
            self.unit_box.setCurrentIndex(self.unit_box.findData(level_instruments.INSTRUMENTS[chosen].unit))
        self.changed.emit()

    def _base_typed(self) -> None:
        try:
            value = parse_number(self.base_field.text())
            if not 0 < value <= MAX_BASE_MM:
                raise ValueError(f"a base of {value:g} mm; expected more than 0 and at most {MAX_BASE_MM:g} mm")
        except ValueError as error:
            self.problem = f"Base: {error} (kept {self.base_mm:g} mm)"
            self.changed.emit()
            return
        self.problem = None
        if value != self.base_mm:
            self.base_mm = value
        self.changed.emit()

    # ---- what the table shows ------------------------------------------------------------------------
    def rise_words(self, face: str, angle_deg: float, where: str) -> str:
        """'Over a 100 mm base face −Z rises 9.786 mm from level': the shim that levels (or plumbs) it."""
        return f"Over a {self.base_mm:g} mm base face {face} rises {self.rise_text(angle_deg)} from {where}."

    def reading_text(self, angle_deg: float) -> str:
        """The reading in the chosen unit, or as the chosen instrument shows it."""
        instrument = self.instrument_box.currentData()
        if instrument is not None:
            return level_instruments.read_with(angle_deg, instrument).text
        unit = self.unit_box.currentData()
        return units.format_slope(angle_deg, unit)

    def reading_tip(self, angle_deg: float) -> str:
        exact = ", ".join(units.format_slope(angle_deg, u) for u in ("deg", "mm/m", "um/m", "in/ft", "percent"))
        instrument = self.instrument_box.currentData()
        said = (f"\nAs a {level_instruments.INSTRUMENTS[instrument].name} shows it, to one division "
                f"({level_instruments.SOURCE_NOTE})." if instrument else "")
        return ("What a level laid on this face shows: its tilt from level on an up or down face, its lean "
                f"from plumb on a side face.\nExactly: {exact}.{said}")

    def rise_text(self, angle_deg: float) -> str:
        rise = float(units.rise_over(angle_deg, self.base_mm))
        return f"{rise:.3f} mm" if math.isfinite(rise) else "—"
