"""The Check and Adjust panels write their figures in the display unit the preference names (the toolbar's
"Angles in"), while every judgement stays in degrees. The case is the hand-worked 0.5° shim of
test_check_panel.py (a 0.5° turn about body Y: a 0.5° total deviation); the factors are the definitions
(SI Brochure Table 4: 1 mrad = 1e-3 rad; 1° = 60′ = 3600″; 400 gon to a turn)."""

import math

import numpy as np

import pytest

from app.panels.adjust_panel import AdjustPanel
from core import operations
from core.session import SavedCheck
from tests.app.test_check_panel import SHIM_DEG, choose, panel, shimmed  # noqa: F401  (fixtures)

MRAD = math.radians(SHIM_DEG) * 1000


@pytest.mark.parametrize("unit, words", [
    ("deg", "Total deviation: 0.500°"),
    ("mrad", f"Total deviation: {MRAD:.3f} mrad"),                    # 8.727 mrad
    ("arcsec", "Total deviation: 1800.0″"),
    ("arcmin", "Total deviation: 30.00′"),
    ("gon", f"Total deviation: {SHIM_DEG / 0.9:.4f} gon"),
])
def test_the_check_figures_follow_the_display_unit_and_the_verdict_does_not(panel, shimmed, unit, words):
    nominal, measured, _, _ = shimmed
    choose(panel.nominal_box, nominal)
    choose(panel.measured_box, measured)
    verdict = panel.verdict_text()
    panel.model.set_preferences(angle_units=unit)           # what the toolbar's "Angles in" sends
    assert words in panel.details.text(), panel.details.text()
    assert panel.verdict_text() == verdict
    if unit != "deg":
        assert "°" not in panel.margin_label.text() + panel.details.text()


def test_the_adjust_figures_follow_the_display_unit(qtbot, model, shimmed):
    nominal, measured, _, _ = shimmed
    model.apply(operations.set_check, SavedCheck(nominal, measured))
    widget = AdjustPanel(model)
    qtbot.addWidget(widget)
    widget.show()
    assert "0.5000° about" in widget.correction_label.text()
    model.set_preferences(angle_units="mrad")
    text = widget.correction_label.text()
    assert f"{MRAD:.3f} mrad about" in text and "Small turns about body X, Y, Z: (" in text and "mrad" in text
    assert "°" not in widget.correction_label.text()


def test_the_meter_and_the_overlay_write_angles_in_the_display_unit(window):
    from app.scene import overlay_text
    from core.orientation import Orientation
    window.model.set_orientation(Orientation.from_angles("ZYX", (20.0, 80.0, -15.0)))   # 10° from lock
    window.model.set_preferences(angle_units="mrad")
    assert window.meter.margin_label.text() == f"{math.radians(10.0) * 1000:.3g} mrad from lock"   # 175 mrad
    # the overlay's axis-angle and angle lines, against SciPy's rotation vector and Euler angles
    from scipy.spatial.transform import Rotation
    rotation = Rotation.from_euler("ZYX", [20.0, 80.0, -15.0], degrees=True)
    orientation = window.model.current_orientation()
    angle_mrad = np.linalg.norm(rotation.as_rotvec()) * 1000
    lines = overlay_text.representation_lines(orientation, "axis-angle", angle_unit="mrad")
    assert lines[1] == f"angle \u03c6 {angle_mrad:.3f} mrad"
    lines = overlay_text.representation_lines(orientation, "angles", "ZYX", True, angle_unit="arcmin")
    assert "80" in lines[1] and f"{80 * 60:.2f}′" in lines[1] and "°" not in lines[1]
    assert window.scene.angle_unit() == "mrad"               # the Scene follows the preference
    shown = "\n".join(overlay_text.orientation_panel(orientation, "axis-angle", "ZYX", True,
                                                     window.scene.frame_preset(), "mrad"))
    assert f"{angle_mrad:.3f} mrad" in shown


def test_the_scenes_angle_labels_follow_the_display_unit(window):
    from core.orientation import Orientation
    window.model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 30.0))
    assert window.scene.labels.labels["phi"].text == "\u03c6 30.0\u00b0"
    window.model.set_preferences(angle_units="mrad")
    assert window.scene.labels.labels["phi"].text == f"\u03c6 {math.radians(30.0) * 1000:.4g} mrad"   # 523.6
    window.model.set_preferences(angle_units="arcmin")
    assert window.scene.labels.labels["phi"].text == "\u03c6 1800\u2032"                              # 30 · 60


@pytest.mark.parametrize("unit", ["deg", "rad", "mrad", "arcmin", "arcsec", "gon", "mil"])
def test_at_1280_the_editors_and_the_meter_keep_one_row_in_every_unit(qtbot, window, unit):
    # the demo's first mount is 87.5° from lock in its best sequence: the meter's longest figure
    # (1527 mrad, 5250′) must break inside the meter rather than push it onto a second row
    from app.editor_rows import EditorRows
    window.resize(1280, 800)
    window.model.select(0)
    window.model.set_preferences(angle_units=unit)
    layout = window.meter.parentWidget().layout()
    assert isinstance(layout, EditorRows)
    qtbot.waitUntil(lambda: layout.geometry().width() > 1200, timeout=2000)
    rows = layout.rows(layout.geometry().width())
    assert len(rows) == 1, [[item.widget().__class__.__name__ for item in row] for row in rows]
    assert window.meter.margin_label.text().endswith("from lock")
