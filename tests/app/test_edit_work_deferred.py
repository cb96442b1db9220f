"""An edit only records the new orientation in the Scene; its items, labels and overlay text are worked out
once before the next frame or when they are read, so a label read right after typing is the new one. An
editor that is not shown does no work until it is shown, and a label whose text is unchanged is never drawn
again. Driven by key events at a laptop's size; work is counted, never timed."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from tests.app.window_driver import focus, leave_editor, type_into


@pytest.fixture
def laptop(qtbot, window):
    window.resize(1280, 800)
    qtbot.waitUntil(lambda: (window.width(), window.height()) == (1280, 800), timeout=3000)
    qtbot.waitUntil(lambda: window.scene.view.frames_drawn > 0, timeout=3000)
    return window


def wait_for_a_frame(qtbot, window):
    before = window.scene.view.frames_drawn
    window.scene.view.update()
    qtbot.waitUntil(lambda: window.scene.view.frames_drawn > before, timeout=3000)


def test_the_rotation_angle_label_read_right_after_typing_is_the_new_angle(qtbot, laptop):
    scene = laptop.scene
    editor = laptop.quaternion
    typed = (0.9, 0.1, -0.3, 0.2)      # not unit length: the editor normalises it
    for field, value in zip(editor.fields, typed):
        type_into(qtbot, field, repr(value))
    # SciPy's Rotation (scalar last) gives the angle the label must show: its magnitude, in degrees.
    angle = np.degrees(Rotation.from_quat([*typed[1:], typed[0]]).magnitude())
    assert scene.labels.labels["phi"].text == f"\u03c6 {angle:.1f}\u00b0"
    panel = [text for text, _ in scene.labels.panels["orientation"].lines]
    assert any(line.strip().startswith("angle \u03c6") and f"{angle:.3f}" in line for line in panel), panel


def test_several_edits_before_a_frame_are_worked_out_once_when_read(qtbot, laptop):
    scene = laptop.scene
    line = laptop.axis_angle.angle_field.lineEdit()
    focus(qtbot, line)
    line.selectAll()
    wait_for_a_frame(qtbot, laptop)           # everything so far is drawn
    settled = scene.settles
    seen = []
    laptop.model.changed.connect(seen.append)
    qtbot.keyClicks(line, "123.5")            # one edit for each key that leaves a number: 1, 12, 123, 123.5
    assert len(seen) >= 3
    assert scene.settles == settled           # the edits were only recorded
    assert scene.labels.labels["phi"].text == "\u03c6 123.5\u00b0"    # typed: no outside value needed
    assert scene.settles == settled + 1       # worked out once, when read
    assert scene.labels.panels["orientation"].lines
    assert scene.settles == settled + 1       # nothing changed since: no more work


def test_a_frame_draws_the_state_of_the_last_edit(qtbot, laptop):
    scene = laptop.scene
    type_into(qtbot, laptop.axis_angle.angle_field, "75")
    wait_for_a_frame(qtbot, laptop)
    settled = scene.settles
    assert scene.labels.labels["phi"].text == "\u03c6 75.0\u00b0"
    assert scene.settles == settled            # the frame had worked it out already


def test_the_hidden_gibbs_and_mrp_editors_do_no_work_until_shown(qtbot, laptop):
    gibbs, mrp = laptop.parameter_editors
    assert not gibbs.isVisible() and not mrp.isVisible()
    renders = gibbs.renders, mrp.renders
    typed = (0.8, 0.2, 0.4, -0.1)
    for field, value in zip(laptop.quaternion.fields, typed):
        type_into(qtbot, field, repr(value))
    leave_editor(qtbot, laptop)
    assert laptop.axis_angle.renders > 0
    assert (gibbs.renders, mrp.renders) == renders      # hidden: nothing rendered
    laptop.parameters_action.trigger()                   # View ▸ Gibbs vector and MRP editors
    qtbot.waitUntil(lambda: gibbs.isVisible() and mrp.isVisible(), timeout=2000)
    assert gibbs.renders == renders[0] + 1 and mrp.renders == renders[1] + 1
    # Shown, they hold the typed orientation: the Gibbs vector is the quaternion's vector part over its
    # scalar part and the MRP its vector part over (1 + scalar) (published formulas), the quaternion
    # normalised by SciPy's Rotation.
    x, y, z, w = Rotation.from_quat([*typed[1:], typed[0]]).as_quat(canonical=True)
    shown_gibbs = [float(f.text()) for f in gibbs.fields]
    shown_mrp = [float(f.text()) for f in mrp.fields]
    digits = laptop.model.preferences.significant_digits
    assert np.allclose(shown_gibbs, np.array([x, y, z]) / w, rtol=10.0 ** (1 - digits))
    assert np.allclose(shown_mrp, np.array([x, y, z]) / (1 + w), rtol=10.0 ** (1 - digits))


def test_a_label_whose_text_is_unchanged_is_not_drawn_again(qtbot, laptop):
    scene = laptop.scene
    for view in ("+X", "iso"):                 # each view's labels (a face turned away has none)
        scene.set_view(view)
        wait_for_a_frame(qtbot, laptop)
    drawn = scene.labels.images.drawn
    for view in ("+X", "iso"):                 # the camera moves every label, no text changes
        scene.set_view(view)
        wait_for_a_frame(qtbot, laptop)
    assert scene.labels.images.drawn == drawn
    type_into(qtbot, laptop.axis_angle.angle_field, "61")
    wait_for_a_frame(qtbot, laptop)
    # new texts: the angle label, the α label maybe, the orientation panel; the axis and face names stay
    assert drawn < scene.labels.images.drawn <= drawn + 5


def test_the_scene_composed_in_its_own_native_window_reaches_the_screen(qtbot, laptop):
    from PySide6.QtGui import QGuiApplication

    from app.scene import palette

    scene = laptop.scene
    assert scene.windowHandle() is not None          # a native child: only its own area goes through GL
    type_into(qtbot, laptop.axis_angle.angle_field, "40")
    wait_for_a_frame(qtbot, laptop)
    qtbot.wait(50)
    # What the X server holds for the view (read back, not rendered again): mostly the Scene's background.
    shot = QGuiApplication.primaryScreen().grabWindow(int(scene.winId())).toImage()
    top_left = scene.view.mapTo(scene, scene.view.rect().topLeft())
    pixels = [shot.pixelColor(top_left.x() + x, top_left.y() + y).getRgb()[:3]
              for x in range(20, scene.view.width() - 20, 37) for y in range(20, scene.view.height() - 20, 29)]
    background = sum(1 for p in pixels if max(abs(a - b) for a, b in zip(p, palette.BACKGROUND)) <= 6)
    assert background > 0.4 * len(pixels), (background, len(pixels))
