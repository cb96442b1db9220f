"""Gimbal margin meter: how far the Angles editor's sequence is from gimbal lock for the current
orientation, how much small changes are amplified in θ1 and θ3, and the best-conditioned sequence here."""

from __future__ import annotations

import math

from PySide6.QtCore import QRectF, QSize, Qt
from PySide6.QtGui import QColor, QPainter, QPen
from PySide6.QtWidgets import QGroupBox, QLabel, QPushButton, QSizePolicy, QVBoxLayout, QWidget

from core import units
from core.sequences import preset_names, spelled_sequence
from app.model import Change, SessionModel
from core.orientation import Orientation
from core.sequences import best_conditioned_sequence, gimbal_margin

BAND_COLOURS = {"green": QColor("#2e7d32"), "amber": QColor("#f9a825"), "red": QColor("#c62828")}
BAND_WORDS = {"green": "Clear of lock", "amber": "Near lock", "red": "At or very near lock"}
SCALE_TICKS = (0, 1, 10, 30, 90)


def band_for(margin_deg: float, locked: bool, amber_deg: float, red_deg: float) -> str:
    if locked or margin_deg < red_deg:
        return "red"
    if margin_deg < amber_deg:
        return "amber"
    return "green"


def scale_position(margin_deg: float) -> float:
    """0..1 along the bar; logarithmic so the 1° and 10° bands are wide enough to see."""
    return math.log10(1.0 + max(0.0, min(90.0, margin_deg))) / math.log10(91.0)


def coupled_angles(orientation: Orientation, sequence: str, intrinsic: bool, angles) -> str:
    """In lock only θ1 + θ3 or θ1 − θ3 is determined; find which by trying both."""
    t1, t2, _ = (float(a) for a in angles)
    delta = 20.0
    same_sum = Orientation.from_angles(sequence, (t1 + delta, t2, -delta), intrinsic=intrinsic)
    return "sum" if same_sum.isclose(orientation, atol=1e-6) else "difference"


class MarginBar(QWidget):
    """The bar: green / amber / red bands on a logarithmic 0–90° scale and a marker at the margin."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.margin = 90.0
        self.amber = 10.0
        self.red = 1.0
        self.setMinimumHeight(44)
        self.setSizePolicy(QSizePolicy.Policy.Expanding, QSizePolicy.Policy.Fixed)

    def sizeHint(self):
        return QSize(260, 44)

    def set_values(self, margin: float, amber: float, red: float) -> None:
        self.margin, self.amber, self.red = margin, amber, red
        self.update()

    def paintEvent(self, _event):
        p = QPainter(self)
        p.setRenderHint(QPainter.RenderHint.Antialiasing)
        left, right = 8.0, self.width() - 8.0
        top, height = 4.0, 16.0
        width = right - left

        def x_at(margin):
            return left + width * scale_position(margin)

        for start, end, band in ((0, self.red, "red"), (self.red, self.amber, "amber"), (self.amber, 90, "green")):
            colour = QColor(BAND_COLOURS[band])
            colour.setAlpha(110)
            p.fillRect(QRectF(x_at(start), top, x_at(end) - x_at(start), height), colour)
        p.setPen(QPen(QColor("#555"), 1))
        p.drawRect(QRectF(left, top, width, height))
        font = p.font()
        font.setPointSizeF(max(7.0, font.pointSizeF() * 0.85))
        p.setFont(font)
        for tick in SCALE_TICKS:
            x = x_at(tick)
            p.drawLine(int(x), int(top + height), int(x), int(top + height + 4))
            label = f"{tick}°"
            w = p.fontMetrics().horizontalAdvance(label)
            p.drawText(int(min(max(x - w / 2, 0), self.width() - w)), int(top + height + 5 + p.fontMetrics().ascent()), label)
        x = x_at(self.margin)
        p.setPen(QPen(QColor("#111"), 3))
        p.drawLine(int(x), int(top - 3), int(x), int(top + height + 3))
        p.end()


class GimbalMeter(QGroupBox):
    def __init__(self, model: SessionModel, parent=None):
        super().__init__("Gimbal margin", parent)
        self.model = model
        self.setToolTip("Distance of the middle angle from its singular value (90° − |θ2| for Tait–Bryan, "
                        "min(θ2, 180° − θ2) for proper Euler). Near lock, small orientation changes swing "
                        "θ1 and θ3 by about 1 / sin(margin) times as much.")
        self.sequence_label = QLabel()
        self.margin_label = QLabel()
        font = self.margin_label.font()
        font.setPointSizeF(font.pointSizeF() * 1.4)
        font.setBold(True)
        self.margin_label.setFont(font)
        self.margin_label.setWordWrap(True)    # '1527 mrad from lock' breaks before it widens the editors' row
        self.band_label = QLabel()
        self.band_label.setWordWrap(True)  # so the meter can be narrow on a laptop
        self.bar = MarginBar()
        self.amplification_label = QLabel()
        self.amplification_label.setWordWrap(True)
        self.lock_label = QLabel()
        self.lock_label.setWordWrap(True)
        self.best_label = QLabel()
        self.best_label.setWordWrap(True)
        self.switch_button = QPushButton()
        self.switch_button.setToolTip("Show the Angles editor in the best-conditioned sequence for this "
                                      "orientation (the orientation itself does not change).")
        self.switch_button.clicked.connect(self._switch)
        self._best = None

        layout = QVBoxLayout(self)
        for widget in (self.sequence_label, self.margin_label, self.band_label, self.bar,
                       self.amplification_label, self.lock_label, self.best_label, self.switch_button):
            layout.addWidget(widget)
        layout.addStretch(1)
        model.changed.connect(self._on_model_changed)
        self.render()

    def _on_model_changed(self, _change: Change) -> None:
        self.render()  # the meter edits nothing, so every change is someone else's

    def render(self) -> None:
        prefs = self.model.preferences
        o = self.model.current_orientation()
        seq, intr = prefs.sequence, prefs.intrinsic
        m = gimbal_margin(o, seq, intrinsic=intr)
        band = band_for(m.margin_deg, m.locked, prefs.amber_margin_deg, prefs.red_margin_deg)
        self.band = band
        self.margin = m
        self.sequence_label.setText(f"For {spelled_sequence(seq, intr)} {'intrinsic' if intr else 'extrinsic'}")
        self.margin_label.setText(_margin_words(m.margin_deg, prefs.angle_units) + " from lock")
        colour = BAND_COLOURS[band].name()
        self.band_label.setText(f"<span style='color:{colour}; font-weight:600'>■ {BAND_WORDS[band]}</span>"
                                f"  (amber under {prefs.amber_margin_deg:g}°, red under {prefs.red_margin_deg:g}°)")
        self.bar.set_values(m.margin_deg, prefs.amber_margin_deg, prefs.red_margin_deg)
        if m.locked:
            self.amplification_label.setText("Amplification ∞: θ1 and θ3 cannot be told apart.")
        else:
            self.amplification_label.setText(
                f"Amplification ×{m.amplification:.3g}: a small change of orientation moves θ1 and θ3 "
                f"about {m.amplification:.3g} times as much.")
        if m.locked:
            angles = o.as_angles(seq, intrinsic=intr).angles
            which = coupled_angles(o, seq, intr, angles)
            names = preset_names(seq, intr)
            first, third = (names[0], names[2]) if names else ("θ1", "θ3")
            sign = "+" if which == "sum" else "−"
            self.lock_label.setText(f"Gimbal lock: {first} and {third} are coupled; only {first} {sign} {third} "
                                    f"is determined; written out, {third} is 0 and {first} carries the "
                                    "whole coupled turn.")
            self.lock_label.show()
        else:
            self.lock_label.hide()
        best = best_conditioned_sequence(o, intrinsic=intr)
        self._best = best
        if best.sequence == seq:
            self.best_label.setText("This is the best-conditioned sequence for this orientation.")
            self.switch_button.setText("Already the best")
            self.switch_button.setEnabled(False)
        else:
            self.best_label.setText(f"Best-conditioned here: {spelled_sequence(best.sequence, intr)} "
                                    f"({_margin_words(best.margin_deg, prefs.angle_units)} from lock).")
            self.switch_button.setText(f"Show the angles in {'-'.join(best.sequence)}")
            self.switch_button.setEnabled(True)

    def _switch(self) -> None:
        if self._best is not None:
            self.model.set_preferences(origin=self, sequence=self._best.sequence)


def _margin_words(margin_deg: float, unit: str) -> str:
    """The distance from lock in the display unit, to three significant digits (an exponent when tiny)."""
    value = float(units.degrees_to(margin_deg, unit))
    # three significant digits, whole numbers past a thousand (1483 mrad, not 1.48e+03), an exponent when tiny
    shown = f"{value:.0f}" if value >= 1000 else f"{value:.3g}" if margin_deg >= 0.01 or margin_deg == 0 \
        else f"{value:.2e}"
    return units.with_symbol(shown, unit)
