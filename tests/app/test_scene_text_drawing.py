"""The Scene's texts drawn as textures of one atlas (app/scene/image_quads.py): each label shows its own
text in its own colour where it was placed, an unchanged image is copied into the atlas once, and a full
atlas starts afresh without two images sharing a texel. Rendered offscreen on software OpenGL (Mesa
llvmpipe under Xvfb) and checked by pixels, never whole screenshots byte for byte."""

import numpy as np
import pytest
from PySide6 import QtGui
from scipy.spatial.transform import Rotation

from app.scene import palette
from app.scene.image_quads import ImageQuads
from app.scene.scene_widget import SceneWidget
from core.orientation import Orientation
from tests.app.test_scene import scene  # noqa: F401  (the same Scene fixture, 1000 x 660 view)

W, H = 800, 600


def _orientation(rotation):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


@pytest.mark.parametrize("key, rgb", [("body0", palette.AXIS_RGB[0]), ("body1", palette.AXIS_RGB[1]),
                                      ("body2", palette.AXIS_RGB[2])])
def test_each_axis_label_shows_its_axis_colour_inside_its_box(scene, key, rgb):
    # SciPy builds the orientation; the colours are the palette's own (X red, Y green, Z blue: common practice)
    scene.set_orientation(_orientation(Rotation.from_euler("zyx", [30, 20, 10], degrees=True)))
    image = scene.render_image(W, H).astype(int)
    rect = scene.labels.drawn_labels[key]
    inside = image[int(rect.top()) + 1: int(rect.bottom()) - 1, int(rect.left()) + 1: int(rect.right()) - 1, :3]
    distance = np.abs(inside - np.array(rgb)).max(axis=2)
    # the text's strokes carry the label colour (antialiased edges blend it with the box); a texture read
    # with the wrong layout or byte order shows other colours there
    assert np.count_nonzero(distance <= 40) >= 5, (key, rgb, inside.reshape(-1, 3).max(axis=0))
    # and its box, darker than the text, fills the rest
    assert np.median(inside.reshape(-1, 3), axis=0).max() < 100


def test_the_overlay_text_shows_the_numbers_of_the_orientation_at_hand(scene):
    # Two orientations, two overlay images: the second frame shows its own numbers, not the first one's
    # (an atlas spot reused for a new image would show the old text). Compared with the image the Scene
    # drew for its panel, pixel for pixel: the panel's box is opaque enough that only its own pixels count.
    for degrees in (20.0, 65.0):
        scene.set_orientation(_orientation(Rotation.from_euler("x", degrees, degrees=True)))
        image = scene.render_image(W, H).astype(int)
        rect = scene.labels.drawn_panels["orientation"]
        lines = scene.labels.panels["orientation"].lines
        assert any(f"{degrees:.3f}" in text for text, _ in lines)
        drawn = [img for key, img in scene.labels.images._kept.items() if key[0] == "panel" and
                 key[1] == tuple((t, tuple(c)) for t, c in lines)]
        assert len(drawn) == 1
        panel = drawn[0].convertToFormat(QtGui.QImage.Format.Format_RGBA8888)
        w, h = panel.width(), panel.height()
        rgba = np.frombuffer(panel.constBits(), np.uint8).reshape(h, panel.bytesPerLine() // 4, 4)[:, :w].astype(int)
        alpha = rgba[..., 3:] / 255.0
        # the image is premultiplied once converted to straight RGBA: over the background it gives
        expected = rgba[..., :3] * alpha + np.array(palette.BACKGROUND) * (1 - alpha)
        left, top = round(rect.left()), round(rect.top())
        seen = image[top: top + h, left: left + w, :3]
        # the top-left corner of the view holds nothing 3D in this view but the grid's faint lines
        assert np.median(np.abs(seen - expected)) <= 2, degrees
        assert np.mean(np.abs(seen - expected) <= 12) > 0.97, degrees


def test_an_unchanged_scene_copies_no_image_again(scene):
    scene.set_orientation(_orientation(Rotation.from_euler("y", 40, degrees=True)))
    scene.render_image(W, H)
    uploads = scene.labels.quads.uploads
    assert uploads > 0
    scene.render_image(W, H)
    assert scene.labels.quads.uploads == uploads
    scene.set_orientation(_orientation(Rotation.from_euler("y", 41, degrees=True)))
    scene.render_image(W, H)
    # the overlay's numbers changed and the angle's label: a few new images, not all of them again
    assert 0 < scene.labels.quads.uploads - uploads < len(scene.labels.drawn_labels)


def _images(sizes):
    out = []
    for w, h in sizes:
        image = QtGui.QImage(w, h, QtGui.QImage.Format.Format_ARGB32_Premultiplied)
        image.fill(0)
        out.append(image)
    return out


def _overlap(a, b):
    ax, ay, aw, ah = a
    bx, by, bw, bh = b
    return ax < bx + bw and bx < ax + aw and ay < by + bh and by < ay + ah


def test_spots_in_the_atlas_never_overlap_and_a_full_atlas_says_so():
    quads = ImageQuads()
    quads._side, quads._spots, quads._shelf = 64, {}, (1, 0, 1)   # texel (0, 0) kept for the lines
    images = _images([(20, 10), (30, 12), (10, 30), (25, 8), (40, 5)])
    assert quads._fit({i.cacheKey(): i for i in images})
    spots = list(quads._spots.values())
    assert all(x + w <= 64 and y + h <= 64 for x, y, w, h in spots)
    assert not any(_overlap(a, b) for i, a in enumerate(spots) for b in spots[i + 1:])
    assert not any(_overlap((0, 0, 1, 1), s) for s in spots)
    before = dict(quads._spots), quads._shelf
    too_many = _images([(60, 30)] * 3)
    assert not quads._fit({i.cacheKey(): i for i in too_many})
    assert (dict(quads._spots), quads._shelf) == before      # nothing taken when they do not all fit
    assert not quads._fit({i.cacheKey(): i for i in _images([(65, 1)])})    # wider than the atlas
