"""Level panel: readings for known tilts appear in the table, the elevations and the inclinometer line;
the gravity choice (reference −Z by default, +Z for NED) changes them as worked out by hand.

Hand-worked case: the part turned 10° about the reference X (right hand), gravity along −Z. Body +Y then
points along (0, cos 10°, sin 10°): 10° above the horizontal; body +Z along (0, −sin 10°, cos 10°): 80°
above it. So the top face +Z is tilted 10° from level, the side faces ±Y 80° (10° off plumb), ±X stay
vertical (tilt 90°, 0° off plumb). SciPy's Rotation gives the same directions (checked below)."""

import numpy as np
import pytest
from PySide6.QtCore import Qt
from scipy.spatial.transform import Rotation

from app.panels.level_panel import FACE_COLUMNS, LevelPanel
from core.level import FACES
from core.orientation import Orientation

TILT_DEG = 10.0


@pytest.fixture
def tilted(model):
    model.set_reference_frame("enu")   # the hand-worked case has Z up (gravity −Z); the demo session is NED
    model.set_orientation(Orientation.from_axis_angle((1, 0, 0), TILT_DEG))
    return model


def test_gravity_follows_the_sessions_reference_frame(qtbot, model):
    # CONVENTIONS.md: gravity along −Z of the reference by default, +Z in NED. The demo session's
    # reference frame is the mast frame, x north, y east, z down: NED.
    assert model.reference_frame == "ned"
    widget = LevelPanel(model)
    qtbot.addWidget(widget)
    assert tuple(widget.down) == (0.0, 0.0, 1.0)
    assert tuple(widget.gravity_box.currentData()) == (0.0, 0.0, 1.0)   # the choice shown says so too
    model.set_reference_frame("enu")
    assert tuple(widget.down) == (0.0, 0.0, -1.0)
    assert tuple(widget.gravity_box.currentData()) == (0.0, 0.0, -1.0)


@pytest.fixture
def panel(qtbot, tilted):
    widget = LevelPanel(tilted)
    qtbot.addWidget(widget)
    widget.resize(420, 900)
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def cell(panel, face, title):
    text = panel.faces.item(FACES.index(face), FACE_COLUMNS.index(title)).text()
    return text


def number(text):
    return float(text.replace("\u2212", "-").rstrip("\u00b0"))


def test_the_hand_worked_tilt_appears_in_the_table(panel):
    # SciPy: where body +Y and +Z point after the 10° turn about X (the same as worked by hand)
    r = Rotation.from_rotvec([np.radians(TILT_DEG), 0, 0])
    np.testing.assert_allclose(r.apply([0, 1, 0]), [0, np.cos(np.radians(10)), np.sin(np.radians(10))], atol=1e-15)
    tilt, plumb = "Tilt from\nlevel", "Off\nplumb"
    assert number(cell(panel, "+Z", tilt)) == pytest.approx(10.0, abs=5e-4)
    assert cell(panel, "+Z", "Faces") == "up" and cell(panel, "-Z", "Faces") == "down"
    assert number(cell(panel, "+Y", tilt)) == pytest.approx(80.0, abs=5e-4)
    assert number(cell(panel, "+Y", plumb)) == pytest.approx(10.0, abs=5e-4)
    assert number(cell(panel, "+X", tilt)) == pytest.approx(90.0, abs=5e-4)
    assert number(cell(panel, "+X", plumb)) == pytest.approx(0.0, abs=5e-4)
    assert panel.up_label.text() == "Up: face +Z; down: face \u2212Z."
    assert panel.elevations.text().split() == ["+X", "0.000°", "+Y", "10.000°", "+Z", "80.000°"]


def test_the_inclinometer_on_the_top_face_reads_the_tilt_across(panel):
    # on face +Z with its x mark along +X: x stays horizontal (0), y along +Y rises 10°
    assert panel.face_box.currentData() == "+Z" and panel.direction_box.currentData() == "+X"
    lines = panel.incline_label.text().splitlines()
    assert lines[0] == "x along body +X: 0.000°"
    assert lines[1] == "y along body +Y: 10.000°"
    # x mark along +Y instead: x rises 10°, y = normal × x = −X stays level
    index = panel.direction_box.findData("+Y")
    panel.direction_box.setCurrentIndex(index)
    panel.direction_box.activated.emit(index)
    lines = panel.incline_label.text().splitlines()
    assert lines[0] == "x along body +Y: 10.000°" and lines[1] == "y along body \u2212X: 0.000°"


def test_ned_gravity_turns_the_readings_upside_down(qtbot, panel):
    index = panel.gravity_box.findText("+Z (Z down, as NED)")
    panel.gravity_box.setCurrentIndex(index)
    panel.gravity_box.activated.emit(index)
    np.testing.assert_array_equal(panel.down, [0, 0, 1])
    # with gravity along +Z, the face that looked up now looks down and every elevation changes sign
    assert panel.up_label.text() == "Up: face \u2212Z; down: face +Z."
    assert panel.elevations.text().split() == ["+X", "0.000°", "+Y", "\u221210.000°", "+Z", "\u221280.000°"]
    # the inclinometer follows the face that is up until one is chosen
    assert panel.face_box.currentData() == "-Z"


def test_typed_gravity_is_read_and_bad_text_refused(qtbot, panel):
    index = panel.gravity_box.findData("typed")
    panel.gravity_box.setCurrentIndex(index)
    panel.gravity_box.activated.emit(index)
    panel.gravity_field.setFocus()
    qtbot.keyClicks(panel.gravity_field, "0, 0, ")
    qtbot.keyClick(panel.gravity_field, Qt.Key.Key_Return)
    assert "three numbers" in panel.message.text()
    np.testing.assert_array_equal(panel.down, [0, 0, -1])              # kept the last good direction
    panel.gravity_field.clear()
    qtbot.keyClicks(panel.gravity_field, "0 -1 0")
    qtbot.keyClick(panel.gravity_field, Qt.Key.Key_Return)
    np.testing.assert_array_equal(panel.down, [0, -1, 0])
    # gravity along −Y makes +Y up: body +Y (0, cos 10°, sin 10°) rises 80° above the horizontal
    assert panel.elevations.text().split()[3] == "80.000°"


def test_readings_follow_the_selected_mount(qtbot, panel, tilted):
    tilted.set_orientation(Orientation.from_axis_angle((0, 1, 0), 5.0))  # nose down 5° about Y
    # hand: body +X goes to (cos 5°, 0, −sin 5°): 5° below the horizontal
    assert panel.elevations.text().split()[1] == "\u22125.000°"


def test_a_level_panel_in_a_background_tab_catches_up_when_shown(qtbot, window):
    # It does no work on the edit's path while hidden, yet never shows an old orientation.
    tabs = window.side_tabs
    tabs.setCurrentIndex([tabs.tabText(i) for i in range(tabs.count())].index("Decode"))
    panel = window.level_panel
    window.model.set_reference_frame("enu")
    window.model.set_orientation(Orientation.from_axis_angle((1, 0, 0), TILT_DEG))
    assert panel._stale
    tabs.setCurrentIndex([tabs.tabText(i) for i in range(tabs.count())].index("Level"))
    qtbot.waitUntil(lambda: not panel._stale, timeout=2000)
    assert number(cell(panel, "+Z", "Tilt from\nlevel")) == pytest.approx(10.0, abs=5e-4)
