"""SessionModel: one change signal with its origin, undo commands that restore exactly, merging runs."""

import pytest

from app.model import MOUNTS, ORIENTATION, PREFERENCES, SELECTION, SessionModel
from core.orientation import Orientation


def test_an_edit_is_one_undo_step_and_undo_redo_restore_exactly(model, changes):
    start = model.current_orientation()
    target = Orientation.from_angles("ZYX", (12.5, -3.25, 170.0))
    model.set_orientation(target, origin="editor-a")
    assert model.undo_stack.count() == 1
    assert changes[-1].what == frozenset({ORIENTATION}) and changes[-1].origin == "editor-a"
    model.undo()
    assert model.current_orientation() == start  # exact canonical-quaternion equality
    assert changes[-1].origin is None  # undo is nobody's typing: every editor re-renders
    model.redo()
    assert model.current_orientation() == target


def test_continuous_edits_with_one_key_merge_into_one_step(model):
    start = model.current_orientation()
    for angle in range(1, 30):
        model.set_orientation(Orientation.from_axis_angle((0, 0, 1), angle), origin="x", continuous_key="drag")
    assert model.undo_stack.count() == 1
    model.undo()
    assert model.current_orientation() == start


def test_a_run_that_returns_to_its_start_leaves_no_undo_step(model):
    start = model.current_orientation()
    model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 5), continuous_key="drag")
    model.set_orientation(start, continuous_key="drag")
    assert model.undo_stack.count() == 0
    assert model.current_orientation() == start


def test_ending_a_run_starts_a_new_step(model):
    model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 5), continuous_key="drag")
    model.end_continuous()
    model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 6), continuous_key="drag")
    assert model.undo_stack.count() == 2


def test_different_keys_do_not_merge(model):
    model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 5), continuous_key="a")
    model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 6), continuous_key="b")
    assert model.undo_stack.count() == 2


def test_undo_of_an_edit_on_another_mount_shows_that_mount_again(model, changes):
    model.select(0)
    before = model.current_orientation()
    model.set_orientation(Orientation.from_axis_angle((0, 1, 0), 33))
    model.select(3)
    model.undo()
    assert model.selected_index == 0
    assert model.current_orientation() == before
    assert SELECTION in changes[-1].what


def test_mount_add_duplicate_rename_delete_are_undoable(model):
    names = [m.name for m in model.mounts]
    model.add_mount("Spare")
    model.duplicate_mount(0)
    model.rename_mount(0, "Renamed")
    model.delete_mount(1)
    assert model.undo_stack.count() == 4
    for _ in range(4):
        model.undo()
    assert [m.name for m in model.mounts] == names
    for _ in range(4):
        model.redo()
    assert model.mounts[0].name == "Renamed"
    assert "Spare" in [m.name for m in model.mounts]


def test_duplicate_keeps_orientation_and_gets_its_own_name(model):
    model.select(2)
    model.duplicate_mount()
    copy = model.mounts[3]
    assert copy.orientation == model.mounts[2].orientation
    assert copy.name != model.mounts[2].name and model.selected_index == 3


def test_the_last_mount_cannot_be_deleted_and_empty_names_are_refused(model):
    while len(model.mounts) > 1:
        model.delete_mount(0)
    with pytest.raises(ValueError, match="at least one mount"):
        model.delete_mount(0)
    with pytest.raises(ValueError, match="name"):
        model.rename_mount(0, "   ")


def test_preferences_change_is_announced_and_validated(model, changes):
    model.set_preferences(quaternion_order="xyzw", origin="w")
    assert changes[-1].what == frozenset({PREFERENCES}) and changes[-1].origin == "w"
    with pytest.raises(ValueError):
        model.set_preferences(sequence="XXY")
    assert model.preferences.sequence == "ZYX"


def test_scene_adapter_methods_exist(model):
    assert model.current_orientation() == model.mounts[model.selected_index].orientation
    assert model.ghost_orientation() is None


def test_loading_a_session_clears_history_and_announces_everything(model, changes, demo_session):
    model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 5))
    model.load_session(demo_session)
    assert model.undo_stack.count() == 0
    assert {ORIENTATION, MOUNTS, SELECTION, PREFERENCES} <= changes[-1].what


def test_model_session_snapshot_holds_the_edits(model):
    target = Orientation.from_axis_angle((0, 0, 1), 42)
    model.set_orientation(target)
    assert model.session().mounts[model.selected_index].orientation == target
