"""The Scene, rendered offscreen on software OpenGL (Mesa llvmpipe under Xvfb) and checked by its pixels:
points are projected with the view's own projection and view matrices, and the colours drawn there are
compared with what belongs there. Never whole screenshots byte for byte."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from app.scene.scene_widget import SceneWidget
from core.orientation import Orientation

W, H = 800, 600
SHAFT = 0.8  # a point on the body axis shaft, short of the arrowhead (0.89..1.0) and its label (1.16)


@pytest.fixture
def scene(qtbot):
    widget = SceneWidget()
    qtbot.addWidget(widget)
    widget.resize(1000, 749)  # a view of 1000 x 660 under the three-row toolbar, as these checks were made at
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def _near(image, pixel, radius=5):
    x, y = int(round(pixel[0])), int(round(pixel[1]))
    assert 0 <= x < image.shape[1] and 0 <= y < image.shape[0], f"{pixel} is outside the image"
    return image[max(0, y - radius): y + radius + 1, max(0, x - radius): x + radius + 1, :3].astype(int)


def red_dominant(image, pixel, radius=5):
    """Some pixel near `pixel` is clearly red: bright red and well above green and blue (the orange
    boresight face and the amber axis are not)."""
    patch = _near(image, pixel, radius)
    r, g, b = patch[..., 0], patch[..., 1], patch[..., 2]
    return bool(np.any((r > 150) & (r > 1.8 * g) & (r > 1.8 * b)))


def cyan_tint(image, pixel, radius=3):
    """How much green and blue exceed red on average near `pixel` (the cone is see-through cyan)."""
    patch = _near(image, pixel, radius)
    return float(np.mean(np.minimum(patch[..., 1], patch[..., 2]) - patch[..., 0]))


# Orientation, and where body +X must point in the reference frame. The direction is taken from SciPy's
# Rotation (first column of the matrix); "90° about z puts body X on reference Y" is common practice.
KNOWN = [
    ("identity", Rotation.identity()),
    ("90 about z", Rotation.from_euler("z", 90, degrees=True)),
    ("180 about z", Rotation.from_euler("z", 180, degrees=True)),
    ("-90 about y", Rotation.from_euler("y", -90, degrees=True)),
    ("90 about y", Rotation.from_euler("y", 90, degrees=True)),
    ("120 about (1,1,1)", Rotation.from_rotvec(np.radians(120) * np.ones(3) / np.sqrt(3))),
]


@pytest.mark.parametrize("name, rotation", KNOWN, ids=[k[0] for k in KNOWN])
def test_body_x_axis_is_drawn_red_where_the_orientation_puts_it(scene, name, rotation):
    scene.set_orientation(Orientation.from_quaternion(rotation.as_quat(scalar_first=True)))
    image = scene.render_image(W, H)
    expected = rotation.as_matrix()[:, 0]
    assert red_dominant(image, scene.project(SHAFT * expected, (W, H))), f"{name}: no red at body X"
    # ...and not where the identity would have put it (unless that is the same place)
    if not np.allclose(expected, [1, 0, 0]):
        assert not red_dominant(image, scene.project(SHAFT * np.array([1.0, 0, 0]), (W, H)))


def test_90_about_z_puts_body_x_on_the_reference_y_axis_in_the_top_view(scene):
    scene.set_view("-Z")  # from above: reference +X to the right, +Y up the screen
    scene.set_orientation(Orientation.from_axis_angle((0, 0, 1), 90))
    image = scene.render_image(W, H)
    tip = scene.project(SHAFT * np.array([0.0, 1.0, 0.0]), (W, H))
    centre = scene.project(np.zeros(3), (W, H))
    assert abs(tip[0] - centre[0]) < 2 and tip[1] < centre[1] - 100  # straight up the screen
    assert red_dominant(image, tip)


def test_cone_sector_lies_on_the_side_the_rotation_turns_towards(scene):
    # 120° about +Z, tracking r = (1, 0, 1)/√2 (α = 45°): r sweeps from azimuth 0° towards +120°
    # (right-hand rule, CONVENTIONS.md), never through negative azimuths.
    scene.set_view("-Z")
    scene.set_tracked_vector((1.0, 0.0, 1.0))
    scene.set_orientation(Orientation.from_axis_angle((0, 0, 1), 120))
    image = scene.render_image(W, H)
    slant = 0.9 * 1.25 / np.sqrt(2)  # a point 90% of the way up the cone's slant (r is drawn 1.25 long)

    def on_cone(azimuth_deg):
        a = np.radians(azimuth_deg)
        return scene.project(np.array([slant * np.cos(a), slant * np.sin(a), slant]), (W, H))

    inside = [cyan_tint(image, on_cone(a)) for a in (40, 60, 80)]
    outside = [cyan_tint(image, on_cone(a)) for a in (-40, -60, -80, 200)]
    assert min(inside) > 25, inside
    assert max(outside) < 10, outside


def test_sweep_at_zero_shows_the_body_frame_on_the_reference_frame_without_changing_the_model(scene):
    o = Orientation.from_axis_angle((0, 0, 1), 90)
    scene.set_orientation(o)
    scene.set_sweep(0.0)
    image = scene.render_image(W, H)
    assert red_dominant(image, scene.project(SHAFT * np.array([1.0, 0, 0]), (W, H)))
    assert not red_dominant(image, scene.project(SHAFT * np.array([0.0, 1.0, 0]), (W, H)))
    assert scene.orientation() == o


def test_sweep_halfway_shows_the_body_halfway_along_the_rotation(scene):
    scene.set_orientation(Orientation.from_axis_angle((0, 0, 1), 90))
    scene.set_sweep(0.5)
    image = scene.render_image(W, H)
    halfway = np.array([np.cos(np.radians(45)), np.sin(np.radians(45)), 0.0])
    assert red_dominant(image, scene.project(SHAFT * halfway, (W, H)))
    assert not red_dominant(image, scene.project(SHAFT * np.array([0.0, 1.0, 0]), (W, H)))


def test_an_stl_written_by_the_test_loads_and_draws(scene, tmp_path):
    from app.scene.stl_reader import write_stl_binary

    # A flat plate 40 x 40 x 1 mm (wider in y than the default box), top face on +Z, the boresight face.
    lo, hi = np.array([-20.0, -20.0, 0.0]), np.array([20.0, 20.0, 1.0])
    corners = np.array([[x, y, z] for x in (lo[0], hi[0]) for y in (lo[1], hi[1]) for z in (lo[2], hi[2])])
    quads = [(0, 1, 3, 2), (4, 6, 7, 5), (0, 4, 5, 1), (2, 3, 7, 6), (0, 2, 6, 4), (1, 5, 7, 3)]
    triangles = np.array([[corners[a], corners[b], corners[c]] for a, b, c, d in quads] +
                         [[corners[a], corners[c], corners[d]] for a, b, c, d in quads])
    path = tmp_path / "plate.stl"
    write_stl_binary(path, triangles)

    spot = np.array([0.15, 0.40, 0.0])  # on the plate's top (drawn size), outside the default box (y ≤ 0.3)
    before = scene.render_image(W, H)
    assert scene.load_part_stl(path) == 12
    after = scene.render_image(W, H)
    pixel = scene.project(spot * [1, 1, 1] + [0, 0, 0.0225], (W, H))

    def orange(image):
        patch = _near(image, pixel, 2)
        return float(np.mean(patch[..., 0] - patch[..., 2]))

    assert orange(after) > 60  # the boresight-facing top of the plate, orange
    assert orange(before) < 20


def test_bad_part_and_stl_input_keep_the_last_good_part(scene, tmp_path):
    scene.set_part((50, 40, 30), {"+X": "connector"}, "+X")
    with pytest.raises(ValueError, match="positive"):
        scene.set_part((50, -1, 30))
    with pytest.raises(ValueError, match="unknown face"):
        scene.set_part((50, 40, 30), {}, "+W")
    junk = tmp_path / "junk.stl"
    junk.write_bytes(b"this is not an STL file at all")
    from app.scene.stl_reader import StlError

    with pytest.raises(StlError, match="neither a binary STL"):
        scene.load_part_stl(junk)
    assert scene.part.source == "box"
    assert list(scene.part.size) == [50, 40, 30]
    assert scene.part.face_label_text("+X") == "+X connector \u25ce boresight"


def test_view_presets_look_along_the_named_axis(scene):
    centre = scene.project(np.zeros(3), (W, H))
    scene.set_view("-Z")  # looking down: +X right, +Y up
    x, y = scene.project(np.array([1.0, 0, 0]), (W, H)), scene.project(np.array([0, 1.0, 0]), (W, H))
    assert x[0] > centre[0] + 100 and abs(x[1] - centre[1]) < 1
    assert y[1] < centre[1] - 100 and abs(y[0] - centre[0]) < 1
    scene.set_view("+X")  # looking along +X with Z up: +Y is to the left (right = X × Z = −Y)
    assert scene.project(np.array([0, 1.0, 0]), (W, H))[0] < centre[0] - 100
    assert scene.project(np.array([0, 0, 1.0]), (W, H))[1] < centre[1] - 100
    scene.set_orientation(Orientation.from_angles("ZYX", (30, -20, 10)))
    scene.set_view("boresight")  # a point on the boresight axis lands on the image centre
    boresight = scene.orientation().apply(np.array([0, 0, 1.0]))
    np.testing.assert_allclose(scene.project(boresight, (W, H)), centre, atol=0.5)


def test_overlay_words_follow_the_frame_preset(scene):
    scene.set_orientation(Orientation.from_axis_angle((0, 0, 1), 90))
    scene.set_frame_preset("ned")
    lines = [text for text, _ in scene.labels.panels["orientation"].lines]
    assert "  +X \u2192 +Y (east), exact" in lines  # NED: y is east (CONVENTIONS.md)
    scene.set_overlay_representation("quaternion")
    lines = [text for text, _ in scene.labels.panels["orientation"].lines]
    # 90° about z: (w, x, y, z) = (√½, 0, 0, √½) (common practice)
    assert "  q (w, x, y, z) (0.707107, 0.000000, 0.000000, 0.707107)" in lines


def test_tracked_vector_typed_badly_gets_a_message_and_keeps_the_last_vector(scene):
    scene.set_tracked_vector("+Y")
    with pytest.raises(ValueError, match="not all zero"):
        scene.set_tracked_vector((0, 0, 0))
    scene._tracked_from_toolbar("typed", "1, two, 3")
    assert "kept the last good vector" in scene.toolbar.message.text()
    np.testing.assert_allclose(scene._tracked_body, [0, 1, 0])


def test_export_png_has_the_chosen_size(scene, tmp_path):
    from PySide6.QtGui import QImage

    path = tmp_path / "scene.png"
    scene.export_png(path, 640, 400)
    image = QImage(str(path))
    assert (image.width(), image.height()) == (640, 400)


def test_play_replays_the_sweep_from_the_reference_and_stops_at_the_current_orientation(scene, qtbot):
    scene.set_orientation(Orientation.from_axis_angle((0, 0, 1), 90))
    seen = []
    scene.sweep_changed.connect(seen.append)
    scene.toolbar.play.setChecked(True)
    qtbot.waitUntil(lambda: not scene.toolbar.play.isChecked(), timeout=10_000)
    assert seen[0] == 0.0 and seen[-1] == 1.0
    assert all(a <= b for a, b in zip(seen, seen[1:]))
    assert scene.sweep() == 1.0


# With the tracked vector along the rotation axis (the boresight +Z, 90° about z: common practice) there is
# no cone, and the box part, which culls its back faces, is the last item drawn before the texts.
@pytest.mark.parametrize("name, rotation", [("60 about x: cone drawn", Rotation.from_euler("x", 60, degrees=True)),
                                            ("90 about z: r along n", Rotation.from_euler("z", 90, degrees=True))],
                         ids=["cone", "no cone"])
def test_the_overlay_panel_keeps_its_dark_box_whatever_is_drawn_before_it(scene, name, rotation):
    from app.scene import palette

    scene.set_orientation(Orientation.from_quaternion(rotation.as_quat(scalar_first=True)))
    image = scene.render_image(W, H)
    rect = scene.labels.drawn_panels["orientation"]
    # the panel's left margin holds no text: only its box over the background
    strip = image[int(rect.top()) + 3: int(rect.bottom()) - 3, int(rect.left()) + 1: int(rect.left()) + 4, :3]
    *box, alpha = palette.OVERLAY_BOX_RGBA
    expected = np.array(box) * alpha / 255 + np.array(palette.BACKGROUND) * (1 - alpha / 255)
    assert np.all(np.abs(np.median(strip.reshape(-1, 3), axis=0) - expected) <= 3), (name, np.median(strip, axis=(0, 1)))
