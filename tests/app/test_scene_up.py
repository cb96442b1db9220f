"""The Scene's up follows the reference frame: in a frame whose +Z points down (NED, aircraft body) down is
drawn down the screen; in ENU +Z is drawn up. Checked by the pixels drawn (software OpenGL under Xvfb)."""

import numpy as np
import pytest

from app.scene.scene_widget import SceneWidget
from core.orientation import Orientation
from tests.app.test_scene import SHAFT, red_dominant

W, H = 800, 600
# Body +X turned onto reference +Z: -90° about +Y (right-hand rule; R_Y(-90°) maps (1,0,0) to (0,0,1),
# a worked example of the elementary rotation in CONVENTIONS.md).
BODY_X_ALONG_REF_Z = Orientation.from_axis_angle((0, 1, 0), -90)


@pytest.fixture
def scene(qtbot):
    widget = SceneWidget()
    qtbot.addWidget(widget)
    widget.resize(1000, 749)
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def drawn_at(scene, point):
    """Pixel of a reference point in a W x H render, and the render."""
    image = scene.render_image(W, H)
    return scene.project(np.asarray(point, dtype=float), (W, H)), scene.project(np.zeros(3), (W, H)), image


@pytest.mark.parametrize("preset", ["ned", "aircraft"])
def test_in_a_z_down_frame_a_down_pointing_vector_is_drawn_below_the_centre(scene, preset):
    scene.set_frame_preset(preset)
    scene.set_orientation(BODY_X_ALONG_REF_Z)     # body +X points along reference +Z: down in this frame
    tip, centre, image = drawn_at(scene, SHAFT * np.array([0.0, 0.0, 1.0]))
    assert tip[1] > centre[1] + 60, (tip, centre)  # below the centre (pixel y grows downwards)
    # and body X (red) is drawn there: its arrowhead, as the shaft runs behind the see-through cone
    head = scene.project(0.95 * np.array([0.0, 0.0, 1.0]), (W, H))
    assert head[1] > centre[1] + 60 and red_dominant(image, head)


@pytest.mark.parametrize("preset", ["enu", "vehicle"])
def test_in_a_z_up_frame_plus_z_is_drawn_above_the_centre(scene, preset):
    scene.set_frame_preset(preset)
    scene.set_orientation(BODY_X_ALONG_REF_Z)
    tip, centre, image = drawn_at(scene, SHAFT * np.array([0.0, 0.0, 1.0]))
    assert tip[1] < centre[1] - 60, (tip, centre)
    head = scene.project(0.95 * np.array([0.0, 0.0, 1.0]), (W, H))
    assert head[1] < centre[1] - 60 and red_dominant(image, head)


def test_the_view_presets_look_the_way_they_say_in_ned(scene):
    scene.set_frame_preset("ned")
    scene.set_view("+Z")                           # look along +Z: straight down, from above
    camera = np.array(scene.view.cameraPosition().toTuple())
    assert camera[2] < 0 and np.allclose(camera[:2], 0, atol=1e-6)   # the camera is above (at -Z)
    scene.set_view("iso")                          # isometric: from above as well
    assert np.array(scene.view.cameraPosition().toTuple())[2] < 0
    scene.set_view("+X")                           # look north, level: up the screen is up (-Z)
    up = scene.project(np.array([0.0, 0.0, -1.0]), (W, H))
    centre = scene.project(np.zeros(3), (W, H))
    assert up[1] < centre[1] - 60 and np.isclose(up[0], centre[0], atol=2)


def test_the_model_frame_turns_the_scene_in_the_window(qtbot, window):
    # the demo session's reference frame is NED (resources/README.md)
    assert window.model.reference_frame == "ned" and window.scene.view.up_z == -1
    window.model.set_reference_frame("enu")
    assert window.scene.view.up_z == 1
