"""Undo steps of the model: each data edit is exactly one step, undo and redo give back exactly the session
and the selection before and after it, the change signal says who made an edit (and nobody for undo and
redo), the view choices make no step, and a continuous run merges until a pause, a commit or undo ends it.

Check values: the model's documented rules (app/model.py, DEVELOPERS.md "The data path of one edit"),
worked by hand per case."""

from dataclasses import replace

import pytest

from app.model import (CHAIN, MERGE_IDLE_MS, MOUNTS, ORIENTATION, PREFERENCES, SELECTION, WORDS, SessionModel)
from core import operations
from core.chain import Chain, ChainStep
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, PartProperties, Session

TURN = Orientation.from_angles("ZYX", (20.0, -10.0, 5.0))
CHAIN_OF_TWO = Chain((ChainStep("bracket", Orientation.from_axis_angle((0, 0, 1), 90.0)),
                      ChainStep("", Orientation.from_axis_angle((1, 0, 0), 90.0))), name="mast")


@pytest.fixture
def model():
    mounts = (Mount("A", Orientation.from_axis_angle((0, 1, 0), 40.0)), Mount("B"), Mount("C"))
    return SessionModel(Session(mounts, selected=1))


@pytest.fixture
def seen(model):
    changes = []
    model.changed.connect(changes.append)
    return changes


# Each data edit, as a caller makes it, with its origin.
EDITS = {
    "orientation": lambda m: m.set_orientation(TURN, origin="who"),
    "position": lambda m: m.set_position(Position.from_shown((1.0, 2.0, 3.0)), origin="who"),
    "pose": lambda m: m.apply_pose(TURN, Position.from_shown((1.0, 2.0, 3.0)), "Pose", origin="who"),
    "add measurement": lambda m: m.add_measurement("typed", origin="who"),
    "add mount": lambda m: m.add_mount("D", TURN, origin="who"),
    "duplicate": lambda m: m.duplicate_mount(0, origin="who"),
    "rename": lambda m: m.rename_mount(2, "Z", origin="who"),
    "part": lambda m: m.set_part(PartProperties(boresight="-Y"), origin="who"),
    "delete": lambda m: m.delete_mount(0, origin="who"),
    "snap": lambda m: m.snap_to_right_angle(origin="who"),
    "chain": lambda m: m.apply(operations.set_chain, CHAIN_OF_TWO, origin="who"),
}


MOUNT_EDITS = set(EDITS) - {"chain"}      # an edit of the mounts brings back the mount it was made on


@pytest.mark.parametrize("edit", EDITS)
def test_each_edit_is_one_step_with_its_origin_and_undo_redo_restore_it_exactly(model, seen, edit):
    if edit == "snap":
        model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 80.0))
        model.undo_stack.clear()
    before = model.session()
    EDITS[edit](model)
    after = model.session()
    assert after != before and model.undo_stack.count() == 1
    assert seen[-1].origin == "who" and seen[-1].what
    model.select(0 if model.selected_index else 1)     # the user looks at another mount meanwhile
    looked_at = model.selected_index
    model.undo()
    assert seen[-1].origin is None
    if edit in MOUNT_EDITS:
        assert model.session() == before                   # mounts, selection, everything
    else:                                                  # the selection is the user's, not the edit's
        assert model.session() == replace(before, selected=looked_at)
    model.select(0 if model.selected_index else 1)
    looked_at = model.selected_index
    model.redo()
    assert seen[-1].origin is None
    assert model.session() == (after if edit in MOUNT_EDITS else replace(after, selected=looked_at))


def test_an_edit_that_changes_nothing_is_no_step_and_no_signal(model, seen):
    model.set_orientation(model.current_orientation(), origin="who")
    model.apply(operations.set_chain, CHAIN_OF_TWO)
    seen.clear()
    model.apply(operations.set_chain, CHAIN_OF_TWO, origin="who")
    model.clear_measurements()
    assert model.undo_stack.count() == 1 and seen == []


@pytest.mark.parametrize("change, kinds", [
    (lambda m: m.select(2, origin="who"), {SELECTION, ORIENTATION}),
    (lambda m: m.set_preferences(origin="who", angle_units="rad"), {PREFERENCES}),
    (lambda m: m.set_reference_frame("ned", origin="who"), {WORDS}),
    (lambda m: m.set_show_chain_frames(False, origin="who"), {CHAIN}),
])
def test_view_choices_are_announced_with_their_origin_but_make_no_step(model, seen, change, kinds):
    change(model)
    assert model.undo_stack.count() == 0
    assert len(seen) == 1 and kinds <= seen[-1].what and seen[-1].origin == "who"


def test_choosing_what_is_already_chosen_announces_nothing(model, seen):
    model.select(1)
    model.set_preferences(angle_units="deg")
    model.set_reference_frame(model.reference_frame)
    model.set_show_chain_frames(True)
    assert seen == []


def test_the_selection_and_the_frames_switch(model, seen):
    model.select(0)
    assert model.selected_index == 0 and model.current_mount().name == "A"
    with pytest.raises(IndexError, match="mount 3 is outside 0..2"):
        model.select(3)
    assert model.selected_index == 0
    model.set_show_chain_frames(False)
    assert model.show_chain_frames is False
    model.set_show_chain_frames(0)                     # a falsy value is "off" too: no change
    assert model.show_chain_frames is False and len(seen) == 2
    model.set_show_chain_frames(1)
    assert model.show_chain_frames is True and len(seen) == 3


def test_selecting_ends_a_run(model):
    model.set_orientation(TURN, continuous_key="drag")
    model.select(0)
    model.select(1)
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 3.0), continuous_key="drag")
    assert model.undo_stack.count() == 2


@pytest.mark.parametrize("end", ["undo", "redo", "end", "plain edit", "load"])
def test_a_run_is_ended_by_undo_redo_a_commit_a_plain_edit_or_loading(model, end):
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 1.0), continuous_key="drag")
    token = model.merge_token
    if end == "undo":
        model.undo()
    elif end == "redo":
        model.redo()
    elif end == "end":
        model.end_continuous()
    elif end == "plain edit":
        model.rename_mount(0, "A2")
    else:
        model.load_session(model.session())
    assert model.merge_token == token + 1 if end != "plain edit" else model.merge_token > token
    steps = model.undo_stack.index()
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 2.0), continuous_key="drag")
    assert model.undo_stack.index() == steps + 1       # a step of its own


def test_a_run_goes_on_across_its_own_edits(model):
    for degrees in (1.0, 2.0, 3.0):
        model.set_orientation(Orientation.from_axis_angle((0, 0, 1), degrees), continuous_key="drag")
    token = model.merge_token
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 4.0), continuous_key="drag",
                          pause_ends_run=False)
    assert model.merge_token == token and model.undo_stack.count() == 1
    model.undo()
    assert model.current_orientation() == Orientation.identity()


def test_a_pause_ends_a_drag_but_not_a_typing_run(model):
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 1.0), continuous_key="drag")
    assert model._idle.isActive() and model._idle.interval() == MERGE_IDLE_MS == 1200
    assert model._idle.isSingleShot()
    token = model.merge_token
    model._idle.timeout.emit()                          # the pause (its clock is Qt's; not waited for here)
    assert model.merge_token == token + 1 and not model._idle.isActive()
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 2.0), continuous_key="drag")
    assert model.undo_stack.count() == 2
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 3.0), continuous_key="typing",
                          pause_ends_run=False)
    assert not model._idle.isActive()                  # typing ends when the field commits, not on a pause
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 4.0), continuous_key="typing",
                          pause_ends_run=False)
    assert model.undo_stack.count() == 3


def test_a_plain_edit_stops_the_pause_clock(model):
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 1.0), continuous_key="drag")
    model.rename_mount(0, "A2")
    assert not model._idle.isActive()


def test_a_texts_given_name_the_step(model):
    model.set_orientation(TURN, text="Paste from the drawing")
    assert model.undo_stack.undoText() == "Paste from the drawing"
    model.set_orientation(Orientation.identity())
    assert model.undo_stack.undoText() == "Edit orientation"


def test_the_session_snapshot_and_readers_follow_the_edits(model):
    model.set_orientation(TURN)
    assert model.session().mounts[1].orientation == TURN == model.current_orientation()
    assert model.mounts is model.session().mounts and model.preferences is model.session().preferences
    assert model.chains == () and model.chain == Chain()
    model.apply(operations.set_chain, CHAIN_OF_TWO)
    assert model.chains == (CHAIN_OF_TWO,) and model.chain is model.chains[0]


def test_the_chain_frames_are_shown_while_the_chain_is_worked_on(model):
    model.apply(operations.set_chain, CHAIN_OF_TWO)
    assert model.scene_frames() == []                  # panel not in view, mount is not the product
    assert model.set_chain_in_view(True) is True
    assert model.set_chain_in_view(1) is False         # already in view
    frames = model.scene_frames()
    assert [label for _, label in frames] == ["1 bracket", "2 = product"]
    assert frames[0][0] == Orientation.from_axis_angle((0, 0, 1), 90.0)
    assert frames[1][0] == CHAIN_OF_TWO.product()
    model.set_show_chain_frames(False)
    assert model.scene_frames() == []
    model.set_show_chain_frames(True)
    assert model.set_chain_in_view(False) is True and model.scene_frames() == []


def test_the_chain_frames_are_shown_beside_a_mount_made_from_the_chain(model):
    model.apply(operations.set_chain, CHAIN_OF_TWO)
    model.make_chain_mount()
    assert [label for _, label in model.scene_frames()] == ["1 bracket", "2 = product"]
    # 1e-9° is the limit: a mount turned by a micro-degree is no longer the product
    model.set_orientation(model.current_orientation() @ Orientation.from_axis_angle((0, 0, 1), 2e-9))
    assert model.scene_frames() == []
    model.undo()
    model.set_orientation(model.current_orientation() @ Orientation.from_axis_angle((0, 0, 1), 0.5e-9))
    assert len(model.scene_frames()) == 2


def test_no_chain_means_no_frames_even_on_the_identity(model):
    model.select(1)                                    # B is at the identity, the empty chain's product
    assert model.current_orientation() == Orientation.identity()
    assert model.scene_frames() == []
    model.set_chain_in_view(True)
    assert model.scene_frames() == []


def test_undo_of_a_mounts_edit_announces_the_list(model, seen):
    model.add_mount("D")
    model.undo()
    assert {MOUNTS, SELECTION} <= seen[-1].what
    model.redo()
    assert model.current_mount().name == "D" and {MOUNTS, SELECTION} <= seen[-1].what


def test_undo_restores_a_description_edit_and_nothing_else(model):
    model.apply(lambda s: replace(s, description="bench 3"))
    model.set_preferences(significant_digits=5)
    model.undo()
    assert model.session().description == "" and model.preferences.significant_digits == 5


def test_a_new_model_holds_one_mount_no_file_and_nothing_to_undo():
    from PySide6.QtCore import QObject

    owner = QObject()
    model = SessionModel(parent=owner)
    assert model.parent() is owner
    assert model.session() == Session.single() and len(model.mounts) == 1
    assert model.file_path is None and model.undo_stack.count() == 0
    assert model.show_chain_frames is True
    assert model.set_chain_in_view(False) is False      # not in view to begin with
    # the stack and the pause clock belong to the model (freed and stopped with it)
    assert model.undo_stack.parent() is model and model._idle.parent() is model


def test_a_continuous_edit_through_apply_waits_for_a_pause_unless_told(model):
    model.apply(operations.set_orientation, TURN, continuous_key="wheel")
    assert model._idle.isActive()
    model.apply(operations.set_orientation, Orientation.identity(), continuous_key="typing", pause_ends_run=False)
    assert not model._idle.isActive()


def test_every_end_of_a_run_starts_a_new_step(model):
    for degrees in (1.0, 2.0, 3.0, 4.0):
        model.set_orientation(Orientation.from_axis_angle((0, 0, 1), degrees), continuous_key="drag")
        model.set_orientation(Orientation.from_axis_angle((0, 0, 1), degrees + 0.5), continuous_key="drag")
        model.end_continuous()
    assert model.undo_stack.count() == 4
    model.undo()
    assert model.current_orientation() == Orientation.from_axis_angle((0, 0, 1), 3.5)


def test_the_frames_of_a_one_step_chain_are_shown_beside_its_mount(model):
    one = Chain((ChainStep("bracket", Orientation.from_axis_angle((0, 0, 1), 90.0)),), name="mast")
    model.apply(operations.set_chain, one)
    model.make_chain_mount()
    assert [label for _, label in model.scene_frames()] == ["1 bracket = product"]


def test_no_ghost_when_the_checks_nominal_is_not_a_mount(model):
    from core.session import SavedCheck

    model.apply(operations.set_check, SavedCheck("gone", "B"))
    assert model.check_mount_indices() == (None, 1) and model.selected_index == 1
    assert model.ghost_orientation() is None and model.ghost_label() is None
