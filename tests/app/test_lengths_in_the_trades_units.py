"""Lengths in the trade's units, typed and chosen as a user does: a mount's position and the Adjust tab's
feet, screw pitch and shims in inches and thousandths of an inch, kept in SI (the position in metres, the
feet in mm) whatever unit is shown.

Check values: the inch is exactly 25.4 mm (the 1959 international yard and pound agreement); a thou is a
thousandth of an inch (common practice); the shim is the same hand-worked case as test_adjust_panel.py
(a 0.5° turn about body Y tilts the 200 mm tall connector face, so the far feet need 200 mm · sin 0.5°)."""

import json
import math

import numpy as np
import pytest
from PySide6.QtCore import Qt

from core.session import session_from_dict, session_to_dict
from tests.app.test_adjust_panel import TURN_DEG, checked, panel, type_and_enter  # noqa: F401  (fixtures)
from tests.app.window_driver import focus, type_into

INCH_MM = 25.4


def _choose(qtbot, box, key):
    focus(qtbot, box)
    while box.currentData() != key:
        index = box.currentIndex()
        qtbot.keyClick(box, Qt.Key.Key_Down)
        assert box.currentIndex() != index, f"{key!r} is not offered"
    return box


def test_a_position_typed_in_inches_is_kept_in_metres_and_shown_again_in_thou(qtbot, window):
    editor = window.position
    _choose(qtbot, editor.unit_box, "in")
    for field, text in zip(editor.fields, ("10", "-2.5", "0.125")):
        type_into(qtbot, field, text)
    qtbot.keyClick(editor.fields[2].lineEdit(), Qt.Key.Key_Return)
    position = window.model.current_mount().position
    assert position.unit == "in"
    assert position.metres == pytest.approx((0.254, -0.0635, 0.003175), rel=1e-15)      # 25.4 mm to the inch
    _choose(qtbot, editor.unit_box, "thou")
    assert [f.text() for f in editor.fields] == ["10000", "-2500", "125"]
    assert window.model.current_mount().position.metres == pytest.approx((0.254, -0.0635, 0.003175), rel=1e-15)
    tip = editor.unit_box.itemData(editor.unit_box.findData("thou"), Qt.ItemDataRole.ToolTipRole)
    assert "thousandth of an inch" in tip and "not the angular" in tip


def test_the_unit_a_position_is_shown_in_is_saved_and_reopened(qtbot, window, tmp_path):
    editor = window.position
    _choose(qtbot, editor.unit_box, "thou")
    for field, text in zip(editor.fields, ("250", "0", "-40")):
        type_into(qtbot, field, text)
    qtbot.keyClick(editor.fields[2].lineEdit(), Qt.Key.Key_Return)
    path = tmp_path / "thou.fwsession.json"
    assert window.save_file_as(str(path))
    stored = [m for m in json.loads(path.read_text())["mounts"] if "position" in m][0]["position"]
    assert stored["unit"] == "thou"
    assert stored["metres"] == pytest.approx([0.00635, 0.0, -0.001016], rel=1e-15)
    window.new_session()
    assert window.open_file(str(path))
    assert [f.text() for f in window.position.fields] == ["250", "0", "-40"]


def test_feet_typed_in_inches_get_their_shims_in_inches_and_are_kept_in_mm(qtbot, panel, model):
    _choose(qtbot, panel.length_box, "in")
    assert model.check.adjustment.length_unit == "in"
    # the connector face's corners of test_adjust_panel.py, written in inches
    corners_mm = ((-300.0, 40.0, 100.0), (-300.0, -40.0, 100.0), (-300.0, -40.0, -100.0), (-300.0, 40.0, -100.0))
    focus(qtbot, panel.footprint_field)
    for foot in corners_mm:                                        # one foot a line, Enter between them
        qtbot.keyClicks(panel.footprint_field, " ".join(f"{v / INCH_MM:.12g}" for v in foot))
        qtbot.keyClick(panel.footprint_field, Qt.Key.Key_Return)
    qtbot.mouseClick(panel.use_feet_button, Qt.MouseButton.LeftButton)
    assert np.allclose(model.check.adjustment.footprint, corners_mm, rtol=1e-11, atol=0)  # typed to 12 digits
    lift_in = 200 * math.sin(math.radians(TURN_DEG)) / INCH_MM
    text = panel.shims_label.text()
    assert f"Foot 3 at (−11.811, −1.575, −3.937): {lift_in:.4f} in" in text
    # the tilt as a slope in inches per foot: tan(0.5°) · 12 (the slope's definition)
    assert f"Tilt made by the shims: 0.5000° ({math.tan(math.radians(TURN_DEG)) * 12:.4f} in/ft)" in text
    type_and_enter(qtbot, panel.pitch_field, "0.05")              # 20 threads per inch
    assert model.check.adjustment.pitch_mm == pytest.approx(1.27, rel=1e-15)
    assert f"{lift_in / 0.05:.3f} turns" in panel.shims_label.text()
    _choose(qtbot, panel.length_box, "thou")
    assert f"{lift_in * 1000:.2f} thou" in panel.shims_label.text()
    assert panel.pitch_field.text() == "50"
    assert np.allclose(model.check.adjustment.footprint, corners_mm, rtol=1e-11, atol=0)   # the same feet


def test_the_adjust_length_unit_is_saved_only_when_not_mm(qtbot, panel, model):
    assert "length_unit" not in json.dumps(session_to_dict(model.session()))   # older files written the same way
    _choose(qtbot, panel.length_box, "thou")
    again = session_from_dict(session_to_dict(model.session()))
    assert again.check.adjustment.length_unit == "thou"
    model.undo_stack.undo()                                       # each choice passed on the way is a step
    assert model.check.adjustment.length_unit == "in"
    model.undo_stack.undo()
    assert model.check.adjustment.length_unit == "mm" and panel.length_box.currentData() == "mm"


def test_feet_shown_in_inches_and_used_untouched_stay_exactly_the_stored_mm(qtbot, panel, model):
    qtbot.mouseClick(panel.corners_button, Qt.MouseButton.LeftButton)       # the part's corners, in mm
    feet = model.check.adjustment.footprint
    _choose(qtbot, panel.length_box, "in")
    # 300, 40 and 100 mm over 25.4 mm to the inch, to six significant digits
    assert panel.footprint_field.toPlainText().splitlines()[0] == "-11.811 1.5748 3.93701"
    steps = model.undo_stack.count()
    qtbot.mouseClick(panel.use_feet_button, Qt.MouseButton.LeftButton)     # nothing typed: nothing changes
    assert model.check.adjustment.footprint == feet and model.undo_stack.count() == steps
