"""Editing the list of mounts through the model: add, duplicate, rename, change the part, delete, snap to a
right angle and make a mount from the chain. Each is one undo step whose text names the change, each
selects what the user expects, carries who made it on its change signal, and undo brings back the mounts
and the selection exactly.

Check values: the model's documented rules (app/model.py, core/operations.py), worked by hand per case;
the right-angle snap against SciPy's Rotation (a reference library)."""

from dataclasses import replace

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from app.model import MOUNTS, ORIENTATION, SELECTION, SessionModel
from core import operations
from core.chain import Chain, ChainStep
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, PartProperties, SavedCheck, Session

TURNS = [Orientation.from_axis_angle((0, 0, 1), 10.0 * (i + 1)) for i in range(3)]


@pytest.fixture
def model():
    return SessionModel(Session(tuple(Mount(n, o) for n, o in zip("ABC", TURNS)), selected=1))


@pytest.fixture
def seen(model):
    changes = []
    model.changed.connect(changes.append)
    return changes


def names(model):
    return [m.name for m in model.mounts]


def test_adding_a_mount_with_a_name_and_orientation_selects_it(model, seen):
    turn = Orientation.from_angles("ZYX", (5.0, -4.0, 3.0))
    model.add_mount("Spare", turn, origin="mounts list")
    assert names(model) == ["A", "B", "C", "Spare"] and model.selected_index == 3
    assert model.current_orientation() == turn
    assert model.undo_stack.count() == 1 and model.undo_stack.undoText() == "Add mount “Spare”"
    assert {MOUNTS, SELECTION} <= seen[-1].what and seen[-1].origin == "mounts list"
    model.undo()
    assert names(model) == ["A", "B", "C"] and model.selected_index == 1 and seen[-1].origin is None
    model.redo()
    assert names(model) == ["A", "B", "C", "Spare"] and model.selected_index == 3


def test_a_mount_added_without_a_name_gets_one_of_its_own_at_identity(model):
    model.add_mount()
    model.add_mount()
    assert names(model)[3:] == ["Mount", "Mount 2"]
    assert model.current_orientation() == Orientation.identity()
    assert model.unused_name("Mount") == "Mount 3" and model.unused_name("Z") == "Z"


def test_duplicating_copies_the_selected_mount_right_after_it(model, seen):
    model.duplicate_mount(origin="menu")
    assert names(model) == ["A", "B", "B copy", "C"] and model.selected_index == 2
    assert model.current_orientation() == TURNS[1]
    assert model.undo_stack.undoText() == "Duplicate mount “B”" and seen[-1].origin == "menu"
    model.undo()
    assert names(model) == ["A", "B", "C"] and model.selected_index == 1


def test_duplicating_another_mount_names_that_one(model):
    model.duplicate_mount(2)
    assert names(model) == ["A", "B", "C", "C copy"] and model.selected_index == 3
    assert model.current_orientation() == TURNS[2]
    assert model.undo_stack.undoText() == "Duplicate mount “C”"
    model.duplicate_mount(0)
    assert names(model)[:2] == ["A", "A copy"] and model.undo_stack.undoText() == "Duplicate mount “A”"


def test_renaming_is_one_step_and_renames_the_check_with_it(model, seen):
    model.apply(operations.set_check, SavedCheck("A", "C"))
    model.rename_mount(2, "  Measured  ", origin="mounts list")
    assert names(model) == ["A", "B", "Measured"] and model.check.measured == "Measured"
    assert model.selected_index == 1                              # renaming selects nothing else
    assert model.undo_stack.undoText() == "Rename mount to “Measured”" and seen[-1].origin == "mounts list"
    model.undo()
    assert names(model) == ["A", "B", "C"] and model.check.measured == "C"


def test_a_refused_name_keeps_the_old_one_and_makes_no_step(model, seen):
    for bad in ("", "   "):
        with pytest.raises(ValueError, match="needs a name; the old one is kept"):
            model.rename_mount(0, bad)
    assert names(model) == ["A", "B", "C"] and model.undo_stack.count() == 0 and seen == []


def test_changing_the_part_of_a_mount_names_that_mount(model, seen):
    part = PartProperties(box_size_mm=(50.0, 40.0, 30.0), boresight="-X")
    model.set_part(part, 2, origin="part dialog")
    assert model.mounts[2].part == part and model.mounts[1].part == PartProperties()
    assert model.undo_stack.undoText() == "Edit the part of “C”" and seen[-1].origin == "part dialog"
    model.set_part(part)                                          # the selected one
    assert model.mounts[1].part == part and model.undo_stack.undoText() == "Edit the part of “B”"
    model.undo()
    model.undo()
    assert all(m.part == PartProperties() for m in model.mounts)


@pytest.mark.parametrize("selected, deleted, after, now_selected", [
    (1, None, ["A", "C"], 1),     # the selected one: its next neighbour takes its place
    (2, None, ["A", "B"], 1),     # the selected last one: the one before it
    (0, None, ["B", "C"], 0),     # the selected first one: the next, now first
    (2, 0, ["B", "C"], 1),        # one before the selected: the selection stays on the same mount
    (0, 2, ["A", "B"], 0),        # one after the selected: nothing moves
])
def test_deleting_a_mount_and_what_becomes_selected(selected, deleted, after, now_selected):
    model = SessionModel(Session(tuple(Mount(n, o) for n, o in zip("ABC", TURNS)), selected=selected))
    seen = []
    model.changed.connect(seen.append)
    gone = "ABC"[selected if deleted is None else deleted]
    model.delete_mount(deleted, origin="mounts list")
    assert names(model) == after and model.selected_index == now_selected
    assert model.undo_stack.undoText() == f"Delete mount “{gone}”"
    assert MOUNTS in seen[-1].what and seen[-1].origin == "mounts list"
    model.undo()
    assert names(model) == ["A", "B", "C"] and model.selected_index == selected
    assert [m.orientation for m in model.mounts] == TURNS
    model.redo()
    assert names(model) == after and model.selected_index == now_selected


def test_the_last_mount_is_kept(seen):
    model = SessionModel(Session((Mount("Only"),)))
    with pytest.raises(ValueError, match="at least one mount"):
        model.delete_mount()
    assert names(model) == ["Only"] and model.undo_stack.count() == 0


def test_snapping_to_the_nearest_right_angle_is_one_named_step(model, seen):
    # 88° about +Z, 1° about +X: nearest of the 24 is 90° about +Z
    model.set_orientation(Orientation.from_quaternion(
        Rotation.from_euler("ZX", [88.0, 1.0], degrees=True).as_quat(scalar_first=True)))
    model.snap_to_right_angle(origin="menu")
    want = Rotation.from_euler("Z", 90.0, degrees=True)                 # SciPy
    np.testing.assert_allclose(model.current_orientation().as_matrix(), want.as_matrix(), atol=1e-15)
    assert model.undo_stack.undoText() == "Snap to nearest right angle (90° about +Z)"
    assert seen[-1].what == {ORIENTATION} and seen[-1].origin == "menu"
    model.undo()
    assert model.current_orientation().angle_to(Orientation.from_axis_angle((0, 0, 1), 90.0)) > 0.5


def test_the_chain_product_becomes_a_selected_mount_named_after_the_chain(model, seen):
    chain = Chain((ChainStep("bracket", Orientation.from_axis_angle((0, 0, 1), 90.0),
                             position=Position.from_shown((10.0, 0.0, 0.0))),
                   ChainStep("plate", Orientation.from_axis_angle((1, 0, 0), 90.0))), name="mast")
    model.apply(operations.set_chain, chain)
    model.make_chain_mount(origin="chain panel")
    assert names(model) == ["A", "B", "C", "mast product"] and model.selected_index == 3
    # SciPy: intrinsic z then x, the chain's steps composed reference side first
    want = Rotation.from_euler("ZX", [90.0, 90.0], degrees=True)
    np.testing.assert_allclose(model.current_orientation().as_matrix(), want.as_matrix(), atol=1e-15)
    assert model.current_mount().position.shown() == pytest.approx((10.0, 0.0, 0.0), abs=1e-12)
    assert model.undo_stack.undoText() == "Add mount “mast product”" and seen[-1].origin == "chain panel"
    model.undo()
    assert names(model) == ["A", "B", "C"] and model.selected_index == 1


def test_positions_set_on_a_chosen_mount_and_cleared(model, seen):
    where = Position.from_shown((1.5, -2.0, 3.0), "mm")
    model.set_position(where, origin="position editor", index=0, text="Type a position")
    assert model.mounts[0].position == where and model.mounts[1].position is None
    assert model.undo_stack.undoText() == "Type a position" and seen[-1].origin == "position editor"
    assert seen[-1].what == {MOUNTS}                                # another mount than the selected one
    model.set_position(where)
    assert model.current_mount().position == where and model.undo_stack.undoText() == "Set the position of “B”"
    model.set_position(None)
    assert model.current_mount().position is None and model.undo_stack.undoText() == "Clear the position of “B”"
    model.undo()
    model.undo()
    model.undo()
    assert all(m.position is None for m in model.mounts)


def test_a_pose_sets_orientation_and_position_in_one_step(model, seen):
    turn = Orientation.from_axis_angle((0, 1, 0), 12.0)
    where = Position.from_shown((0.0, 0.25, 0.0), "m")
    model.apply_pose(turn, where, "Use the decoded pose", origin="decode panel")
    assert model.current_orientation() == turn and model.current_mount().position == where
    assert model.undo_stack.count() == 1 and model.undo_stack.undoText() == "Use the decoded pose"
    assert seen[-1].origin == "decode panel"
    model.undo()
    assert model.current_mount() == Mount("B", TURNS[1])


def test_an_edit_of_another_mounts_part_keeps_its_own_values(model):
    before = model.mounts[0]
    model.set_part(replace(before.part, face_names={"+Z": "lens"}), 0)
    assert model.mounts[0].orientation == before.orientation and model.mounts[0].name == "A"
    assert model.mounts[0].part.face_names == {"+Z": "lens"}
