"""The Level panel's readings as slopes, as an instrument shows them, and the shim over a base, through the
controls a person uses, at a laptop's size. Check values: SciPy's Rotation for the face normals; the slope
is 1000·tan(tilt) mm/m by definition; the 0.02 mm/m division of a machinist's level is common practice."""

import math

import numpy as np
import pytest
from PySide6.QtCore import Qt
from scipy.spatial.transform import Rotation

from tests.app.window_driver import click_side_tab, focus


def _pick(box, data):
    index = box.findData(data)
    assert index >= 0, data
    box.setCurrentIndex(index)
    box.activated.emit(index)      # what a pick from the list sends


@pytest.fixture
def level(qtbot, window):
    window.resize(1280, 800)
    model = window.model
    model.select(next(i for i, m in enumerate(model.mounts) if m.name.startswith("Radar antenna")))
    click_side_tab(qtbot, window, "Level")
    return window.level_panel


def _expected_up_tilt(window):
    # SciPy: the body's faces' normals in the reference; gravity along the reference frame's down
    from core import describe
    q = window.model.current_orientation().as_quaternion()
    r = Rotation.from_quat(q, scalar_first=True)
    up = -np.asarray(describe.gravity_direction(window.model.reference_frame), dtype=float)
    normals = r.apply(np.vstack([np.eye(3), -np.eye(3)]))
    from_up = np.degrees(np.arccos(np.clip(normals @ up, -1, 1)))
    return float(from_up.min())                # the up face's tilt from level


def test_the_up_face_reads_in_mm_per_metre_and_as_a_machinists_level_shows_it(qtbot, window, level):
    tilt = _expected_up_tilt(window)
    _pick(level.slopes.unit_box, "mm/m")
    row = next(r for r in range(level.faces.rowCount()) if level.faces.item(r, 4).text() == "up")
    exact = 1000 * math.tan(math.radians(tilt))
    shown = level.faces.item(row, 5).text()
    assert shown.endswith(" mm/m") and float(shown.split()[0]) == pytest.approx(exact, abs=5e-4)
    _pick(level.slopes.instrument_box, "machinist")
    shown = level.faces.item(row, 5).text()
    assert float(shown.split()[0]) == pytest.approx(round(exact / 0.02) * 0.02, abs=1e-9)
    assert len(shown.split()[0].split(".")[1]) == 2            # never a finer digit than its division
    assert "common practice" in level.faces.item(row, 5).toolTip()


def test_the_shim_over_a_typed_base(qtbot, window, level):
    tilt = _expected_up_tilt(window)
    field = level.slopes.base_field
    focus(qtbot, field)
    field.selectAll()
    qtbot.keyClicks(field, "250")
    qtbot.keyClick(field, Qt.Key.Key_Return)
    rise = 250 * math.tan(math.radians(tilt))                 # hand-worked: base · tan(tilt)
    assert "Over a 250 mm base" in level.rise_label.text()
    assert f"{rise:.3f} mm" in level.rise_label.text()
    focus(qtbot, field)
    field.selectAll()
    qtbot.keyClicks(field, "-5")
    qtbot.keyClick(field, Qt.Key.Key_Return)
    assert "kept 250 mm" in level.message.text()               # refused, the last good base kept
    assert f"{rise:.3f} mm" in level.rise_label.text()


@pytest.mark.parametrize("unit, per_tan, mark", [("um/m", 1e6, "µm/m"), ("in/ft", 12.0, "in/ft"),
                                                  ("percent", 100.0, "%"), ("deg", None, "°")])
def test_every_slope_unit_is_offered(qtbot, window, level, unit, per_tan, mark):
    tilt = _expected_up_tilt(window)
    _pick(level.slopes.unit_box, unit)
    row = next(r for r in range(level.faces.rowCount()) if level.faces.item(r, 4).text() == "up")
    text = level.faces.item(row, 5).text()
    assert text.endswith(mark)
    number = float(text.replace(mark, "").strip())
    expected = tilt if per_tan is None else per_tan * math.tan(math.radians(tilt))
    assert number == pytest.approx(expected, rel=2e-3)
