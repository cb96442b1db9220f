"""Gimbal margin meter: bands at their thresholds, amplification, the best-conditioned sequence with one
click, and which angles are coupled in lock."""

import math

import pytest
from PySide6.QtCore import Qt
from scipy.spatial.transform import Rotation

from app.panels.gimbal_meter import band_for
from core.orientation import Orientation


def show_pitch(window, pitch_deg, yaw=20.0, roll=-15.0):
    window.model.set_orientation(Orientation.from_angles("ZYX", (yaw, pitch_deg, roll)))


@pytest.mark.parametrize("margin, band", [(90, "green"), (10.0, "green"), (9.999999, "amber"),
                                          (1.0, "amber"), (0.999999, "red"), (0.0, "red")])
def test_band_rule_at_the_thresholds(margin, band):
    # amber under 10°, red under 1° (the defaults): exactly 10° is still green, exactly 1° amber.
    assert band_for(margin, False, 10.0, 1.0) == band


@pytest.mark.parametrize("pitch, band", [(79.9999, "green"), (80.0001, "amber"), (88.9999, "amber"),
                                         (89.0001, "red"), (-89.5, "red"), (30.0, "green")])
def test_meter_band_for_orientations_either_side_of_the_thresholds(window, pitch, band):
    show_pitch(window, pitch)
    assert window.meter.band == band
    assert window.meter.margin.margin_deg == pytest.approx(90 - abs(pitch), abs=1e-6)
    assert {"green": "Clear", "amber": "Near", "red": "At or very near"}[band] in window.meter.band_label.text()


def test_thresholds_are_preferences(window):
    show_pitch(window, 75.0)
    assert window.meter.band == "green"
    window.model.set_preferences(amber_margin_deg=20.0, red_margin_deg=16.0)
    assert window.meter.band == "red"
    assert "amber under 20°" in window.meter.band_label.text()


def test_amplification_is_one_over_sine_of_margin(window):
    show_pitch(window, 60.0)
    expected = 1.0 / math.sin(math.radians(30.0))  # CONVENTIONS.md: about 1/sin(margin)
    assert f"×{expected:.3g}" in window.meter.amplification_label.text()


def test_best_sequence_is_offered_and_one_click_switches_to_it(qtbot, window):
    show_pitch(window, 88.0)
    before = window.model.current_orientation()
    button = window.meter.switch_button
    assert button.isEnabled()
    best = window.meter._best.sequence
    qtbot.mouseClick(button, Qt.MouseButton.LeftButton)
    assert window.model.preferences.sequence == best
    assert window.model.current_orientation() == before  # only the spelling changes
    assert window.angles.sequence_box.currentData() == best
    assert window.meter.margin.margin_deg > 45.0
    assert not window.meter.switch_button.isEnabled()


def _coupling_from_scipy(pitch):
    """Which combination of yaw and roll SciPy's Rotation says is determined at ZYX lock."""
    base = Rotation.from_euler("ZYX", [30, pitch, 0], degrees=True)
    same_sum = Rotation.from_euler("ZYX", [50, pitch, -20], degrees=True)
    return "+" if (same_sum * base.inv()).magnitude() < 1e-9 else "−"


@pytest.mark.parametrize("pitch", [90.0, -90.0])
def test_in_lock_the_meter_says_which_angles_are_coupled(window, pitch):
    window.model.set_orientation(Orientation.from_angles("ZYX", (30.0, pitch, 0.0)))
    assert window.meter.band == "red"
    text = window.meter.lock_label.text()
    assert window.meter.lock_label.isVisibleTo(window.meter)
    assert "yaw and roll are coupled" in text
    assert f"only yaw {_coupling_from_scipy(pitch)} roll" in text
    assert "∞" in window.meter.amplification_label.text()
