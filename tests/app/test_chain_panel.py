"""Chain panel, driven through real clicks and typing: steps from pasted text and from the editors,
invert, switch off, reorder, delete, the product made a mount, undo, and the frames in the Scene.

Check values: the bracket-and-plate product worked out by hand below, and SciPy's Rotation (a reference
library) for every product."""

import numpy as np
import pytest
from PySide6.QtCore import QPoint, Qt
from scipy.spatial.transform import Rotation

from app.panels.chain_panel import ChainPanel
from core.orientation import Orientation
from tests.app.window_driver import canonical_wxyz

# Hand-worked: a bracket turned 90° about the reference Z, then a plate turned 90° about the bracket's X.
# Rz(90) = [[0,-1,0],[1,0,0],[0,0,1]], Rx(90) = [[1,0,0],[0,0,-1],[0,1,0]]; their product by rows:
# [0,-1,0]·cols = (0, 0, 1); [1,0,0]·cols = (1, 0, 0); [0,0,1]·cols = (0, 1, 0).
HAND_PRODUCT = np.array([[0.0, 0.0, 1.0], [1.0, 0.0, 0.0], [0.0, 1.0, 0.0]])
# SciPy: the same two turns as rotation vectors (radians), composed parent first (A * B applies B first).
SCIPY_BRACKET = Rotation.from_rotvec([0, 0, np.pi / 2])
SCIPY_PLATE = Rotation.from_rotvec([np.pi / 2, 0, 0])


@pytest.fixture
def panel(qtbot, model):
    widget = ChainPanel(model)
    qtbot.addWidget(widget)
    widget.resize(420, 900)
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def click(qtbot, button):
    assert button.isEnabled(), button.text()
    qtbot.mouseClick(button, Qt.MouseButton.LeftButton)


def add_from_text(qtbot, panel, name, text):
    _paste(qtbot, panel, name, text)
    assert panel.pasted.reading_box.currentText().startswith("1. axis-angle"), panel.pasted.reading_box.currentText()
    click(qtbot, panel.add_from_text)


def matrix(o):
    return o.as_matrix()


def bracket_and_plate(qtbot, panel):
    add_from_text(qtbot, panel, "bracket", "axis 0 0 1 angle 90")
    add_from_text(qtbot, panel, "plate", "axis 1 0 0 angle 90")


def test_bracket_then_plate_composes_to_the_hand_worked_matrix_and_becomes_a_mount(qtbot, panel, model):
    bracket_and_plate(qtbot, panel)
    chain = model.chain
    assert [s.name for s in chain.steps] == ["bracket", "plate"]
    assert panel.table.rowCount() == 2 and panel.table.item(1, 2).text() == "plate"
    product = chain.product()
    np.testing.assert_allclose(matrix(product), HAND_PRODUCT, atol=1e-15)
    np.testing.assert_allclose(matrix(product), (SCIPY_BRACKET * SCIPY_PLATE).as_matrix(), atol=1e-15)
    assert "Product" in panel.product_label.text() and "120° about (0.577" in panel.product_label.text()

    count = len(model.mounts)
    steps_before = model.undo_stack.count()
    click(qtbot, panel.make_mount_button)
    assert len(model.mounts) == count + 1
    assert model.current_mount().name == "Chain product"
    np.testing.assert_allclose(model.current_orientation().as_matrix(), HAND_PRODUCT, atol=1e-15)
    assert model.undo_stack.count() == steps_before + 1
    model.undo()
    assert len(model.mounts) == count
    assert len(model.chain) == 2  # undoing the mount leaves the chain


def test_invert_switch_off_and_reorder_change_the_product_as_the_chain_says(qtbot, panel, model):
    bracket_and_plate(qtbot, panel)
    panel.select_row(1)
    click(qtbot, panel.invert_button)                              # plate given the other way round
    assert model.chain.steps[1].inverted and panel.table.item(1, 4).checkState() == Qt.CheckState.Checked
    want = (SCIPY_BRACKET * SCIPY_PLATE.inv()).as_matrix()
    np.testing.assert_allclose(model.chain.product().as_matrix(), want, atol=1e-15)

    click(qtbot, panel.invert_button)                              # and back
    click(qtbot, panel.enable_button)                              # plate not fitted
    assert panel.enable_button.text() == "Switch on"
    np.testing.assert_allclose(model.chain.product().as_matrix(), SCIPY_BRACKET.as_matrix(), atol=1e-15)
    click(qtbot, panel.enable_button)

    click(qtbot, panel.up_button)                                  # plate first, then bracket
    assert [s.name for s in model.chain.steps] == ["plate", "bracket"]
    assert panel.selected_row() == 0
    np.testing.assert_allclose(model.chain.product().as_matrix(), (SCIPY_PLATE * SCIPY_BRACKET).as_matrix(),
                               atol=1e-15)
    click(qtbot, panel.delete_button)
    assert [s.name for s in model.chain.steps] == ["bracket"]

    # every edit was one undo step: six edits, six undos back to the two steps as entered
    flags = lambda: [(s.name, s.inverted, s.enabled) for s in model.chain.steps]      # noqa: E731
    model.undo()
    assert flags() == [("plate", False, True), ("bracket", False, True)]
    model.undo()
    model.undo()
    assert flags() == [("bracket", False, True), ("plate", False, False)]
    model.undo()
    model.undo()
    assert flags() == [("bracket", False, True), ("plate", True, True)]
    model.undo()
    assert flags() == [("bracket", False, True), ("plate", False, True)]
    np.testing.assert_allclose(model.chain.product().as_matrix(), HAND_PRODUCT, atol=1e-15)


def test_ticking_the_table_boxes_switches_off_and_inverts(qtbot, panel, model):
    bracket_and_plate(qtbot, panel)
    rect = panel.table.visualItemRect(panel.table.item(0, 1))
    qtbot.mouseClick(panel.table.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    qtbot.waitUntil(lambda: not model.chain.steps[0].enabled, timeout=2000)
    np.testing.assert_allclose(model.chain.product().as_matrix(), SCIPY_PLATE.as_matrix(), atol=1e-15)


def test_a_step_from_the_editors_takes_the_selected_mounts_orientation(qtbot, panel, model):
    rotation = Rotation.from_euler("ZYX", [20, -5, 3], degrees=True)        # SciPy builds the known value
    model.set_orientation(Orientation.from_quaternion(canonical_wxyz(rotation)))
    click(qtbot, panel.add_from_editors)
    np.testing.assert_allclose(model.chain.steps[0].orientation.as_matrix(), rotation.as_matrix(), atol=1e-15)
    # and 'Set from the editors' replaces the chosen step's value
    other = Rotation.from_rotvec([0, 0.2, 0])
    model.set_orientation(Orientation.from_quaternion(canonical_wxyz(other)))
    panel.select_row(0)
    click(qtbot, panel.set_from_editors)
    assert len(model.chain) == 1
    np.testing.assert_allclose(model.chain.steps[0].orientation.as_matrix(), other.as_matrix(), atol=1e-15)


def test_pasted_junk_says_why_and_adds_nothing(qtbot, panel, model):
    panel.pasted.text_box.setFocus()
    qtbot.keyClicks(panel.pasted.text_box, "bracket 12")
    assert "Cannot read" in panel.pasted.message.text()
    assert not panel.add_from_text.isEnabled()
    assert len(model.chain) == 0


def test_the_scene_shows_every_intermediate_frame_labelled(qtbot, window):
    panel = window.chain_panel
    window.side_tabs.setCurrentIndex(window.side_tabs.indexOf(panel.parent().parent()))
    bracket_and_plate(qtbot, panel)
    frames = window.scene.chain_frames
    assert frames.count == 2
    labels = window.scene.labels.labels
    assert labels["chain0"].text == "1 bracket" and labels["chain0"].visible
    assert labels["chain1"].text == "2 plate = product"
    # each small frame carries its frame's orientation: the first is the bracket's (SciPy), the second the
    # product (hand-worked)
    group0, group1 = frames._groups[:2]
    m0 = np.array(group0.transform().data()).reshape(4, 4).T[:3, :3]
    m1 = np.array(group1.transform().data()).reshape(4, 4).T[:3, :3]
    np.testing.assert_allclose(m0, SCIPY_BRACKET.as_matrix(), atol=1e-6)        # QMatrix4x4 holds floats
    np.testing.assert_allclose(m1, HAND_PRODUCT, atol=1e-6)
    # click on the box itself (a wide check box only reacts on its box and text, as for a person)
    box = panel.frames_box
    qtbot.mouseClick(box, Qt.MouseButton.LeftButton, pos=QPoint(8, box.height() // 2))
    assert not window.model.show_chain_frames and frames.count == 0
    assert not labels["chain0"].visible


def _paste(qtbot, panel, name, text):
    panel.step_name.setFocus()
    qtbot.keyClicks(panel.step_name, name)
    panel.pasted.text_box.setFocus()
    panel.pasted.text_box.selectAll()
    qtbot.keyClicks(panel.pasted.text_box, text)


def test_a_pose_pasted_with_its_unit_keeps_its_origin_and_one_without_says_so(qtbot, panel, model):
    # a 4x4 whose caption names millimetres (a layout of tests/core/pose_corpus.py, invented values):
    # rotation +90° about z ([[0,-1,0],[1,0,0],[0,0,1]], the hand-worked Rz(90) above), origin (120, 35.5, 410) mm
    _paste(qtbot, panel, "camera", "T (translation in mm) = [[0, -1, 0, 120.0], [1, 0, 0, 35.5], "
                                   "[0, 0, 1, 410.0], [0, 0, 0, 1]]")
    click(qtbot, panel.add_from_text)
    step = model.chain.steps[-1]
    assert step.position is not None and step.position.unit == "mm"
    assert np.allclose(step.position.metres, (0.120, 0.0355, 0.410), rtol=1e-15, atol=0)
    assert np.allclose(step.orientation.as_matrix(), SCIPY_BRACKET.as_matrix(), atol=1e-15)
    assert "kept, in mm" in panel.pasted.message.text()
    # the same pose with no unit: the rotation only, and the message says why (no guess between mm and m)
    _paste(qtbot, panel, "unknown", "1 0 0 0.1  0 0 -1 0.2  0 1 0 0.3  0 0 0 1")      # 16 on one line
    click(qtbot, panel.add_from_text)
    assert model.chain.steps[-1].position is None
    assert "without a unit" in panel.pasted.message.text()
