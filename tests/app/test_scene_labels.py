"""The Scene's texts never cover one another: the placement on its own (plain geometry), then the real
Scene at a laptop's size on every demo mount, and the Measure overlay shown only on its own mount."""

from pathlib import Path

import numpy as np
import pytest
from PySide6.QtCore import QRectF, Qt

from app.scene.label_layer import importance
from app.scene import label_placement
from app.scene.label_placement import leader_end, place_labels, stack_panels

POINTS_CSV = Path(__file__).resolve().parents[2] / "resources" / "demo_points.csv"   # invented demo points


def disjoint(rects):
    rects = list(rects)
    return all(not a.intersects(b) for i, a in enumerate(rects) for b in rects[i + 1:])


def inside(rect, width, height):
    return rect.left() >= 0 and rect.top() >= 0 and rect.right() <= width and rect.bottom() <= height


# ---- the placement on its own -------------------------------------------------------------------------
def test_two_labels_on_one_anchor_are_both_shown_apart_the_lesser_with_a_leader_line():
    places = place_labels([(200, 150), (200, 150)], [(60, 20), (90, 20)], [3, 5], 400, 300)
    first, second = places
    assert first.rect is not None and second.rect is not None
    assert not first.rect.intersects(second.rect)
    assert second.rect.contains(200, 150) and not second.leader      # the more important keeps the spot
    assert first.leader
    end = leader_end(first.rect, 200, 150)                          # the line starts on the box's edge
    assert first.rect.adjusted(-0.01, -0.01, 0.01, 0.01).contains(*end)


def test_a_label_whose_anchor_is_under_an_overlay_panel_moves_out_of_it():
    panel = QRectF(10, 10, 300, 120)
    (place,) = place_labels([(150, 100)], [(80, 22)], [3], 640, 480, obstacles=[panel])
    assert place.rect is not None and not place.rect.intersects(panel) and place.leader


def test_in_a_crowd_the_least_important_labels_are_left_out_and_none_overlap():
    rng = np.random.default_rng(7)
    importances = [int(k) for k in rng.integers(1, 6, 40)]
    places = place_labels([(150, 100)] * 40, [(70, 20)] * 40, importances, 300, 200)
    drawn = [p.rect for p in places if p.rect is not None]
    assert 5 < len(drawn) < 40
    assert disjoint(drawn) and all(inside(r, 300, 200) for r in drawn)
    shown = [i for i, p in zip(importances, places) if p.rect is not None]
    left_out = [i for i, p in zip(importances, places) if p.rect is None]
    assert min(shown) >= max(left_out)


def test_random_scenes_never_overlap_each_other_or_the_panels():
    rng = np.random.default_rng(3)
    for _ in range(50):
        width, height = int(rng.integers(240, 1400)), int(rng.integers(100, 900))
        panels = [QRectF(10, 10, rng.uniform(50, width / 2), rng.uniform(20, height / 3))]
        n = int(rng.integers(1, 25))
        anchors = list(zip(rng.uniform(-50, width + 50, n), rng.uniform(-50, height + 50, n)))
        sizes = list(zip(rng.uniform(10, 200, n), rng.uniform(12, 30, n)))
        places = place_labels(anchors, sizes, [int(k) for k in rng.integers(1, 6, n)], width, height, panels)
        drawn = [p.rect for p in places if p.rect is not None]
        assert disjoint(drawn + panels)
        assert all(inside(r, width, height) for r in drawn)


def test_boxes_that_only_touch_may_sit_side_by_side_as_qt_decides_overlap():
    # the placement works on plain tuples; Qt's QRectF.intersects is the reference for what "meets" means
    # (touching edges do not meet), so a label may sit flush against a panel's edge
    rng = np.random.default_rng(11)
    grid = rng.integers(0, 5, size=(4000, 4)).astype(float)   # small integers: many exact touches
    for l1, t1, l2, t2 in grid:
        a, b = QRectF(l1, t1, 2.0, 2.0), QRectF(l2, t2, 2.0, 1.0)
        box_a, box_b = (l1, t1, l1 + 2.0, t1 + 2.0), (l2, t2, l2 + 2.0, t2 + 1.0)
        assert label_placement._meets(box_a, box_b) == a.intersects(b)
        assert (label_placement._first_free([box_a], [box_b]) is None) == a.intersects(b)
    panel = QRectF(100, 50, 100, 40)
    # a 40 x 20 label centred on (150, 100) spans y 90..110: flush against the panel's lower edge (y 90)
    (place,) = place_labels([(150, 100)], [(40, 20)], [3], 400, 300, obstacles=[panel])
    assert place.rect == QRectF(130, 90, 40, 20) and not place.leader
    # one pixel higher it would cover the panel's last row, so it moves off its anchor
    (place,) = place_labels([(150, 99)], [(40, 20)], [3], 400, 300, obstacles=[panel])
    assert place.rect != QRectF(130, 89, 40, 20) and not place.rect.intersects(panel)


def test_a_label_too_big_for_the_view_is_left_out_rather_than_clipped():
    (place,) = place_labels([(50, 50)], [(500, 20)], [5], 300, 200)
    assert place.rect is None


def test_panels_that_meet_are_stacked_and_an_optional_one_gives_way():
    # a narrow view: the top-left and top-right panels would meet in the middle; the second goes to the
    # free bottom corner of its side, not down into the middle of the picture
    rects = stack_panels([(400, 120), (300, 40)], ["top-left", "top-right"], [False, False], 600, 500, 10)
    assert all(r is not None for r in rects) and disjoint(rects)
    assert rects[1] == QRectF(600 - 300 - 10, 500 - 40 - 10, 300, 40)
    # when that corner is taken too, it moves down past the first
    rects = stack_panels([(400, 120), (300, 400), (300, 40)], ["top-left", "bottom-right", "top-right"],
                         [False, False, False], 600, 600, 10)
    assert all(r is not None for r in rects) and disjoint(rects)
    assert rects[2].top() == rects[0].bottom() + 10 and rects[2].right() == 590
    # two panels in one corner sit one under the other
    rects = stack_panels([(200, 60), (150, 50)], ["top-right", "top-right"], [False, False], 800, 500, 10)
    assert disjoint(rects) and rects[1].top() == rects[0].bottom() + 10
    # an optional panel is left out when its side would be mostly panels
    rects = stack_panels([(300, 200), (200, 150)], ["top-left", "bottom-left"], [False, True], 800, 500, 10)
    assert rects[0] is not None and rects[1] is None


def test_importance_ranks_the_axes_above_the_names_of_faces_and_the_ghost():
    assert importance("body0") > importance("ref1") > importance("face+X") > importance("ghost")
    assert importance("n") == importance("body2") and importance("chain3") == importance("face-Z")


# ---- the real Scene ------------------------------------------------------------------------------------
def painted(qtbot, window):
    view = window.scene.view
    before = view.frames_drawn
    view.update()
    qtbot.waitUntil(lambda: view.frames_drawn > before, timeout=5000)
    return window.scene.labels


def assert_nothing_overlaps(layer, view, what):
    labels, panels = list(layer.drawn_labels.values()), list(layer.drawn_panels.values())
    assert panels, f"{what}: no overlay panel drawn"
    assert disjoint(panels), f"{what}: overlay panels overlap {layer.drawn_panels}"
    assert disjoint(labels + panels), f"{what}: labels overlap {layer.drawn_labels}"
    for rect in labels + panels:
        assert inside(rect, view.width(), view.height()), f"{what}: {rect} is clipped"


@pytest.mark.parametrize("size", [(1280, 800), (1920, 1080)])
def test_on_every_demo_mount_no_scene_text_covers_another(qtbot, window, size):
    window.resize(*size)
    qtbot.waitUntil(lambda: (window.width(), window.height()) == size, timeout=3000)
    for index, mount in enumerate(window.model.mounts):
        window.model.select(index)
        layer = painted(qtbot, window)
        assert layer.drawn_labels, mount.name
        assert_nothing_overlaps(layer, window.scene.view, mount.name)
        assert {"body0", "body1", "body2"} <= set(layer.drawn_labels), f"{mount.name}: a body axis has no label"


def test_with_measured_points_and_chain_frames_no_scene_text_covers_another(qtbot, window):
    window.resize(1280, 800)
    qtbot.waitUntil(lambda: window.height() == 800, timeout=3000)
    model = window.model
    model.select(next(i for i, m in enumerate(model.mounts) if m.name.startswith("Mast-head camera")))
    window.measure_panel.set_method("points")
    window.measure_panel.import_csv(str(POINTS_CSV))
    window.measure_panel.fit()
    layer = painted(qtbot, window)
    assert "measured" in layer.drawn_panels and "orientation" in layer.drawn_panels
    assert_nothing_overlaps(layer, window.scene.view, "with the fit")


def test_measured_points_are_shown_on_their_own_mount_only(qtbot, window):
    model = window.model
    camera = next(i for i, m in enumerate(model.mounts) if m.name.startswith("Mast-head camera"))
    other = next(i for i in range(len(model.mounts)) if i != camera)
    model.select(camera)
    window.measure_panel.set_method("points")
    window.measure_panel.import_csv(str(POINTS_CSV))
    window.measure_panel.fit()
    panel = window.scene.labels.panels
    assert panel["measured"].visible
    mounts = window.mounts.list                                    # the user clicks another mount
    qtbot.mouseClick(mounts.viewport(), Qt.MouseButton.LeftButton, pos=mounts.visualItemRect(mounts.item(other)).center())
    qtbot.waitUntil(lambda: model.selected_index == other, timeout=2000)
    assert not panel["measured"].visible
    assert not any(lab.visible for key, lab in window.scene.labels.labels.items() if key.startswith("flag"))
    model.select(camera)
    assert panel["measured"].visible


def test_measured_points_of_the_last_session_are_gone_after_opening_another(qtbot, window, tmp_path):
    # The invented demo check session has a mount named like the fitted one: the points were still drawn on
    # it after File > Open (seen in a screenshot). They belong to the last session, not to a name.
    model = window.model
    model.select(next(i for i, m in enumerate(model.mounts) if m.name.startswith("Mast-head camera")))
    window.measure_panel.set_method("points")
    window.measure_panel.import_csv(str(POINTS_CSV))
    window.measure_panel.fit()
    panel = window.scene.labels.panels
    assert panel["measured"].visible
    model.undo_stack.setClean()
    assert window.open_file(str(POINTS_CSV.parent / "demo_check.fwsession.json"))
    assert model.current_mount().name.startswith("Mast-head camera")      # same name, another session
    assert not panel["measured"].visible
    assert not any(lab.visible for key, lab in window.scene.labels.labels.items() if key.startswith("flag"))
