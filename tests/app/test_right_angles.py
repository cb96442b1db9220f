"""Right angles and words: the nearest of the 24 right-angle orientations shown before snapping, snapping
as one undo step that lands exactly on it, and the report's words and level readings, which still decode
back exactly.

The 24 come from SciPy: Rotation.create_group("O"), the rotation group of the cube (a reference library);
the hand-worked report values are written out beside their checks."""

import numpy as np
import pytest
from PySide6.QtCore import Qt
from scipy.spatial.transform import Rotation

from app import copy_as
from app.panels.level_words import WordsBox
from core import describe, formats
from core.orientation import Orientation
from tests.app.window_driver import canonical_wxyz

CUBE_GROUP = Rotation.create_group("O")          # SciPy: the 24 rotations that map the cube onto itself


def orientation_of(rotation):
    return Orientation.from_quaternion(canonical_wxyz(rotation))


@pytest.fixture
def words(qtbot, model):
    widget = WordsBox(model)
    qtbot.addWidget(widget)
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def test_scipy_gives_24_and_each_is_recognised_and_snapped_to_from_a_few_degrees_off(model):
    assert len(CUBE_GROUP) == 24
    wobble = Rotation.from_rotvec(np.radians([2.0, -3.0, 1.5]))       # 3.9° off: well inside half of 90°
    seen = set()
    for k in range(24):
        exact = CUBE_GROUP[k]
        model.set_orientation(orientation_of(exact * wobble))
        near = describe.nearest_right_angle(model.current_orientation())
        assert near.residual_deg == pytest.approx(np.degrees(wobble.magnitude()), abs=1e-9)
        seen.add(near.right_angle.index)
        steps = model.undo_stack.count()
        model.snap_to_right_angle()
        assert model.undo_stack.count() == steps + 1                     # one undo step
        np.testing.assert_allclose(model.current_orientation().as_matrix(), exact.as_matrix(), atol=1e-15)
        assert describe.nearest_right_angle(model.current_orientation()).residual_deg < 1e-12
    assert len(seen) == 24                                               # each of the 24 told apart


def test_the_words_box_shows_the_nearest_and_its_residual_before_snapping(qtbot, words, model):
    # 90° about Z, then 0.3° about the body X: nearest is 90° about +Z, 0.3° off (hand-worked)
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 90) @ Orientation.from_axis_angle((1, 0, 0), 0.3))
    assert "Nearest right angle: 90° about +Z (X→+Y, Y→−X, Z→+Z); residual 0.300°" in words.nearest_label.text()
    lines = words.axes_label.text().splitlines()
    # The demo session's reference frame is NED (x north, y east, z down), so +Y is east, −X south.
    assert lines[0] == "+X → +Y (east), exact"
    assert lines[1].startswith("+Y → −X (south), 0.30° off")
    start = model.current_orientation()
    qtbot.mouseClick(words.snap_button, Qt.MouseButton.LeftButton)
    np.testing.assert_allclose(model.current_orientation().as_matrix(),
                               Rotation.from_rotvec([0, 0, np.pi / 2]).as_matrix(), atol=1e-15)  # SciPy
    assert "residual none" in words.nearest_label.text() and not words.snap_button.isEnabled()
    model.undo()
    assert model.current_orientation() == start                          # undo restores it exactly
    index = words.preset_box.findData("ned")
    words.preset_box.setCurrentIndex(index)
    words.preset_box.activated.emit(index)
    assert words.axes_label.text().splitlines()[0] == "+X → +Y (east), exact"


def test_snap_from_the_edit_menu_is_one_undo_step(window):
    model = window.model
    model.select(1)                                       # the inertial unit, nominally aligned: 0.6° off
    start = model.current_orientation()
    steps = model.undo_stack.count()
    window.snap_action.trigger()
    assert model.undo_stack.count() == steps + 1
    assert model.current_orientation().isclose(Orientation.identity(), atol=1e-15)
    assert "Snap to nearest right angle" in window.undo_action.text()
    model.undo()
    assert model.current_orientation() == start


def test_the_report_has_the_words_and_level_readings_and_still_round_trips():
    # Hand-worked: 10° about the reference X, gravity along −Z (Z up): body +Y rises 10°, +Z stands 80°
    # above the horizontal; the top face +Z is 10° from level, ±Y are 10° off plumb.
    o = Orientation.from_axis_angle((1, 0, 0), 10)
    text = formats.render(o, "report")
    for line in ("Where the body axes point (reference directions named as ENU (x east, y north, z up)):",
                 "    +X → +X (east), exact",
                 "    +Y → +Y (north), 10.0° off",
                 "    nearest right angle: identity (X→+X, Y→+Y, Z→+Z), 10.0° off",
                 "Level readings, gravity along reference −Z (Z up); degrees to three decimals:",
                 "    face +Z: tilt from level 10.000, off plumb 80.000, normal 10.000 from straight up, facing up",
                 "    face −Y: tilt from level 80.000, off plumb 10.000, normal 100.000 from straight up, "
                 "facing side",
                 "    up: face +Z; down: face −Z",
                 "    elevation above the horizontal: +X 0.000, +Y 10.000, +Z 80.000"):
        assert line in text.splitlines(), line
    assert formats.round_trip_error(o, text, "report") <= 1e-12
    ned = formats.render(o, "report", {"gravity_down": (0, 0, 1), "reference_frame": "ned"})
    assert "    elevation above the horizontal: +X 0.000, +Y −10.000, +Z −80.000" in ned.splitlines()
    assert "    +Y → +Y (east), 10.0° off" in ned.splitlines()


@pytest.mark.parametrize("k", range(0, 24, 5))
def test_reports_of_many_orientations_round_trip_through_the_window_copy(model, k):
    rotation = CUBE_GROUP[k] * Rotation.from_rotvec([0.01 * k, -0.2, 0.05])
    model.set_orientation(orientation_of(rotation))
    text, _, error = copy_as.render_copy(model, "report")
    assert "Level readings" in text and "Where the body axes point" in text
    assert error <= copy_as.VERIFIED_LIMIT_DEG
