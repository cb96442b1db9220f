"""Adjust panel through typing and clicks: the demo's radar antenna measured 0.5° off about its body Y.

Check values: SciPy's Rotation for the correction and the angles about the mount's axes; the shims are a
hand-worked case (a 0.5° turn about body Y tilts the 200 mm tall connector face, so the feet at one end
need 200 mm · sin 0.5°); the decision zones are ISO 14253-1's definitions."""

import math

import numpy as np
import pytest
from PySide6.QtCore import Qt
from scipy.spatial.transform import Rotation

from app.panels.adjust_panel import AdjustPanel
from core import operations
from core.session import SavedCheck
from tests.app.test_check_panel import orientation_of
from tests.app.window_driver import focus, scipy_rotation

TURN_DEG = 0.5


@pytest.fixture
def checked(model):
    nominal_index = 3
    model.select(nominal_index)
    model.duplicate_mount()
    model.rename_mount(nominal_index + 1, "Radar antenna, as measured")
    nominal = scipy_rotation(model.mounts[nominal_index].orientation)
    measured = nominal * Rotation.from_rotvec([0, math.radians(TURN_DEG), 0])      # about body Y
    model.set_orientation(orientation_of(measured))
    model.apply(operations.set_check, SavedCheck(model.mounts[nominal_index].name, "Radar antenna, as measured"))
    return nominal, measured


@pytest.fixture
def panel(qtbot, model, checked):
    widget = AdjustPanel(model)
    qtbot.addWidget(widget)
    widget.resize(460, 1000)
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def type_and_enter(qtbot, line, text):
    focus(qtbot, line)
    line.selectAll()
    qtbot.keyClicks(line, text)
    qtbot.keyClick(line, Qt.Key.Key_Return)


def test_the_correction_is_shown_in_body_axes_as_scipy_computes_it(panel, checked):
    nominal, measured = checked
    expected = (measured.inv() * nominal).as_rotvec(degrees=True)      # SciPy: C = Mᵀ N
    assert np.allclose(expected, [0, -TURN_DEG, 0], atol=1e-12)
    assert "0.5000° about (0.0000, −1.0000, 0.0000) in body axes" in panel.correction_label.text()


def test_typed_adjustment_axes_give_scipys_angles_and_a_bad_axis_is_refused(qtbot, panel, model, checked):
    nominal, measured = checked
    type_and_enter(qtbot, panel.axes_field, "+Z; +Y; +X")
    angles = (measured.inv() * nominal).as_euler("ZYX", degrees=True)   # SciPy: about Z, Y', X''
    text = panel.angles_label.text()
    assert f"2. about (0.000, 1.000, 0.000): {angles[1]:.4f}°".replace("-", "−") in text
    assert "exactly" in text and model.check.adjustment.axes == "+Z; +Y; +X"
    before = model.check
    type_and_enter(qtbot, panel.axes_field, "+X; +X")
    assert "parallel" in panel.message.text() and model.check == before


def test_the_corners_of_the_connector_face_get_the_hand_worked_shims(qtbot, panel, model):
    qtbot.mouseClick(panel.corners_button, Qt.MouseButton.LeftButton)
    feet = model.check.adjustment.footprint
    assert feet == ((-300.0, 40.0, 100.0), (-300.0, -40.0, 100.0), (-300.0, -40.0, -100.0), (-300.0, 40.0, -100.0))
    lift = 200 * math.sin(math.radians(TURN_DEG))
    text = panel.shims_label.text()
    assert "Foot 1 at (−300.0, 40.0, 100.0): 0.000 mm" in text
    assert f"Foot 3 at (−300.0, −40.0, −100.0): {lift:.3f} mm" in text
    type_and_enter(qtbot, panel.pitch_field, "0.5")
    assert f"{lift / 0.5:.3f} turns" in panel.shims_label.text()


def test_an_uncertainty_makes_the_decision_by_the_guard_band_and_undo_takes_it_back(qtbot, panel, model):
    # total deviation 0.5° against the default tolerance 0.5°: without an uncertainty it is within
    assert "no measurement uncertainty was given" in panel.decision_label.text()
    type_and_enter(qtbot, panel.uncertainty_field, "0.1")
    assert panel.decision_label.text().startswith("Cannot decide")          # 0.3° < 0.5° <= 0.7°
    type_and_enter(qtbot, panel.uncertainty_field, "1,5")
    assert "'.'" in panel.message.text() and model.check.adjustment.uncertainty_deg == 0.1
    model.undo_stack.undo()
    assert model.check.adjustment.uncertainty_deg is None
    assert "no measurement uncertainty was given" in panel.decision_label.text()


def test_every_label_with_numbers_or_names_is_plain_text(panel):
    for label in (panel.correction_label, panel.angles_label, panel.shims_label, panel.decision_label,
                  panel.message):
        assert label.textFormat() == Qt.TextFormat.PlainText


def _bar_colours(qtbot, decision, width=400):
    """The colour the decision bar paints at each figure (degrees), read from its picture mid-height."""
    from app.panels.adjust_panel import DecisionBar
    bar = DecisionBar()
    qtbot.addWidget(bar)
    bar.resize(width, 26)
    bar.show_decision(decision)
    image = bar.grab().toImage()
    top = max(decision.non_conformance_limit_deg, decision.value_deg) * 1.15

    def at(value):
        return image.pixelColor(int(1 + (width - 2) * value / top), 13).name()
    return at


def test_the_decision_bar_draws_the_zone_the_guard_bands_and_the_measured_value_where_the_standard_puts_them(qtbot):
    from core.decision import decide
    # ISO 14253-1 zones; our case: T = 1°, u = 0.1°, k = 2, so U = 0.2°: conforms to 0.8°, guard band to 1.2°
    at = _bar_colours(qtbot, decide(1.1, 1.0, 0.1))
    green, amber, red, black = "#2e7d32", "#f9a825", "#c62828", "#000000"
    assert [at(v) for v in (0.05, 0.4, 0.78)] == [green] * 3
    assert [at(v) for v in (0.83, 0.95, 1.05, 1.18)] == [amber] * 4
    assert at(1.1) == black                                         # the measured value
    assert [at(v) for v in (1.23, 1.3)] == [red] * 2
    # without an uncertainty there is no guard band: green to the tolerance, red beyond it
    plain = _bar_colours(qtbot, decide(0.5, 1.0))
    assert plain(0.9) == green and plain(1.05) == red and plain(0.5) == black


def test_the_panels_bar_shows_the_figure_closest_to_failing(qtbot, panel, model):
    type_and_enter(qtbot, panel.uncertainty_field, "0.1")
    shown = panel.decision_bar.decision
    # total deviation 0.5° against the default 0.5°: the only figure judged, with U = 0.2°
    assert shown.value_deg == pytest.approx(TURN_DEG, abs=1e-12) and shown.expanded_deg == pytest.approx(0.2)
    assert shown.tolerance_deg == pytest.approx(0.5)
