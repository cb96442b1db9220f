"""At launch the window paints first and builds the Scene just after (MainWindow.build_scene): the Scene
built late sits where an early one sits, at the same size, and follows the model the same way."""

import pytest
from PySide6.QtCore import QPoint

from app import window as window_module
from core.orientation import Orientation


def _open(qtbot, scene_later, size=(1280, 800)):
    win = window_module.make_window(scene_later=scene_later)
    win.resize(*size)
    win.show()
    qtbot.waitExposed(win)
    qtbot.waitUntil(lambda: win.scene is not None and win.scene.view.frames_drawn > 0, timeout=10000)
    qtbot.wait(50)   # the editors' row settles its height (_fit_editors)
    return win


def _close(win):
    win.model.undo_stack.setClean()
    win.close()
    win.deleteLater()


def test_the_scene_is_built_after_the_first_paint_without_being_asked(qtbot, isolated_settings):
    win = window_module.make_window(scene_later=True)
    assert win.scene is None            # nothing of pyqtgraph is needed before the window paints
    win.show()
    qtbot.waitUntil(lambda: win.scene is not None, timeout=10000)
    assert win.splitter.widget(1) is win.scene
    _close(win)


@pytest.mark.parametrize("size", [(1280, 800), (1920, 1080)])
def test_a_scene_built_late_has_the_place_and_size_of_one_built_at_once(qtbot, isolated_settings, size):
    early = _open(qtbot, scene_later=False, size=size)
    early_sizes, early_centre = early.splitter.sizes(), early.centre.sizes()
    early_origin = early.scene.mapTo(early, QPoint(0, 0))
    _close(early)
    late = _open(qtbot, scene_later=True, size=size)
    assert late.splitter.sizes() == early_sizes and late.centre.sizes() == early_centre
    assert late.scene.mapTo(late, QPoint(0, 0)) == early_origin
    assert not late.splitter.isCollapsible(1)   # the Scene still never folds away
    _close(late)


def test_a_scene_built_late_follows_the_model_and_shows_its_current_state(qtbot, isolated_settings):
    win = window_module.make_window(scene_later=True)
    # an edit made before the Scene exists is what it shows when it comes
    turned = Orientation.from_axis_angle((0, 0, 1), 30.0)
    win.model.set_orientation(turned, origin=None)
    win.show()
    qtbot.waitUntil(lambda: win.scene is not None, timeout=10000)
    assert win.scene.orientation().angle_to(turned) < 1e-12
    again = Orientation.from_axis_angle((1, 0, 0), 45.0)
    win.model.set_orientation(again, origin=None)
    assert win.scene.orientation().angle_to(again) < 1e-12
    _close(win)


@pytest.mark.parametrize("size", [(1280, 800), (1920, 1080)])
def test_nothing_moves_when_the_scene_replaces_its_stand_in(qtbot, isolated_settings, size):
    win = window_module.make_window(scene_later=True)
    win.resize(*size)
    seen = {}
    original = win.build_scene

    def build_and_compare():
        if win.scene is None:
            seen["before"] = (win.splitter.sizes(), win.centre.sizes())
        original()
    win.build_scene = build_and_compare
    win.show()
    qtbot.waitUntil(lambda: win.scene is not None, timeout=10000)
    qtbot.wait(50)
    assert seen["before"] == (win.splitter.sizes(), win.centre.sizes())
    _close(win)
