"""The replace-session undo command (app/commands.py) on its own: its text, the fields it restores, its
merge id, which runs merge, a run that ends where it began, and that only its first redo carries the
origin of the editor that made it.

Check values: the command's documented rules (app/commands.py, DEVELOPERS.md "The data path of one edit"),
worked by hand per case; the rounding limit is the module's RETURNED_TO_START_RAD (1e-13 rad)."""

from dataclasses import replace

import pytest
from PySide6.QtGui import QUndoCommand

from app.commands import CONTINUOUS_ID, ReplaceSessionCommand
from app.model import MOUNTS, ORIENTATION, SELECTION, SessionModel
from core import operations
from core.orientation import Orientation
from core.session import Mount, Session

START = Orientation.from_axis_angle((0, 0, 1), 30.0)


def _session(selected=0):
    return Session((Mount("A", START), Mount("B"), Mount("C")), selected=selected)


@pytest.fixture
def model():
    return SessionModel(_session())


@pytest.fixture
def seen(model):
    changes = []
    model.changed.connect(changes.append)
    return changes


def _turned(session, degrees, index=None):
    return operations.set_orientation(session, Orientation.from_axis_angle((1, 0, 0), degrees), index)


def _off_start_by(radians):
    """START followed by a turn of `radians` about +Y: that far from START, and not equal to it."""
    return START @ Orientation.from_axis_angle((0, 1, 0), radians, degrees=False)


def test_the_text_given_wins_else_the_diff_names_the_edit(model):
    old = model.session()
    new = operations.rename_mount(old, 1, "Spare")
    assert ReplaceSessionCommand(model, old, new, None, "My words").text() == "My words"
    assert ReplaceSessionCommand(model, old, new, None).text() == "Rename mount to “Spare”"
    assert ReplaceSessionCommand(model, old, new, None, "").text() == "Rename mount to “Spare”"
    assert ReplaceSessionCommand(model, old, _turned(old, 5), None).text() == "Edit orientation"


def test_fields_are_the_session_fields_the_edit_changed(model):
    old = model.session()
    assert ReplaceSessionCommand(model, old, _turned(old, 5), None).fields == {"mounts"}
    both = replace(_turned(old, 5), description="bench 3")
    assert ReplaceSessionCommand(model, old, both, None).fields == {"mounts", "description"}


def test_only_a_continuous_edit_has_the_merge_id(model):
    old = model.session()
    new = _turned(old, 5)
    assert ReplaceSessionCommand(model, old, new, None).id() == -1              # Qt: -1 never merges
    assert ReplaceSessionCommand(model, old, new, None, continuous_key="drag").id() == CONTINUOUS_ID == 1001
    assert ReplaceSessionCommand(model, old, new, None, continuous_key=0).id() == CONTINUOUS_ID   # 0 is a key


def test_a_merge_takes_the_later_end_and_keeps_the_first_start(model):
    s0 = model.session()
    s1 = _turned(s0, 5)
    s2 = _turned(s1, 6)
    first = ReplaceSessionCommand(model, s0, s1, None, continuous_key="drag", merge_token=7)
    later = ReplaceSessionCommand(model, s1, s2, None, continuous_key="drag", merge_token=7)
    assert first.mergeWith(later) is True
    assert first.old == s0 and first.new == s2 and not first.isObsolete()


@pytest.mark.parametrize("key, token, starts_at", [
    ("wheel", 7, "s1"),        # another control's run
    ("drag", 8, "s1"),         # the run was ended (a pause, a commit, undo) in between
    ("drag", 7, "s0"),         # something else changed the session in between
])
def test_no_merge_across_keys_tokens_or_an_edit_in_between(model, key, token, starts_at):
    s0 = model.session()
    s1 = _turned(s0, 5)
    s2 = _turned(s1, 6)
    first = ReplaceSessionCommand(model, s0, s1, None, continuous_key="drag", merge_token=7)
    later = ReplaceSessionCommand(model, {"s0": s0, "s1": s1}[starts_at], s2, None, continuous_key=key,
                                  merge_token=token)
    assert first.mergeWith(later) is False
    assert first.old == s0 and first.new == s1


def test_a_command_of_another_kind_never_merges(model):
    s0 = model.session()
    first = ReplaceSessionCommand(model, s0, _turned(s0, 5), None, continuous_key="drag")
    assert first.mergeWith(QUndoCommand("not ours")) is False


def test_only_the_first_redo_carries_the_origin(model, seen):
    old = model.session()
    new = _turned(old, 5)
    command = ReplaceSessionCommand(model, old, new, "quaternion editor")
    command.redo()
    assert model.session() == new
    assert seen[-1].what == {ORIENTATION} and seen[-1].origin == "quaternion editor"
    command.undo()
    assert model.session() == old and seen[-1].origin is None
    command.redo()                                     # a redo from the menu is nobody's typing
    assert model.session() == new and seen[-1].origin is None


def test_undo_brings_back_the_mount_the_edit_was_made_on(seen):
    model = SessionModel(_session(selected=0))
    old = model.session()
    new = _turned(old, 5)
    command = ReplaceSessionCommand(model, old, new, None)
    command.redo()
    model.select(2)
    command.undo()
    assert model.selected_index == 0 and model.current_orientation() == START
    command.redo()
    model.select(1)
    command.redo()                                     # redo shows it again as well
    assert model.selected_index == 0 and model.session() == new


def test_undo_and_redo_restore_only_the_fields_the_edit_changed(model):
    old = model.session()
    new = replace(old, description="bench 3")
    command = ReplaceSessionCommand(model, old, new, None)
    command.redo()
    model.set_preferences(angle_units="rad")          # not undoable, after the edit
    model.select(2)
    command.undo()
    assert model.session().description == ""
    assert model.preferences.angle_units == "rad" and model.selected_index == 2
    command.redo()
    assert model.session().description == "bench 3" and model.selected_index == 2


def _run(model, *sessions, key="drag"):
    """Apply each session in turn as one continuous run (as a drag does)."""
    for session in sessions:
        model.apply(lambda _s, target: target, session, continuous_key=key)


def test_a_run_back_to_its_start_within_rounding_is_dropped_and_the_start_restored_exactly(model, seen):
    s0 = model.session()
    near = _off_start_by(0.5e-13)
    assert near != START                                       # not equal, only within rounding
    _run(model, _turned(s0, 5, index=0), operations.set_orientation(s0, near, 0))
    assert model.undo_stack.count() == 0
    assert model.current_orientation() == START                # the start, not the value near it
    assert seen[-1].what == {ORIENTATION} and seen[-1].origin is None


def test_a_run_that_ends_just_beyond_rounding_stays_a_step(model):
    s0 = model.session()
    beyond = _off_start_by(5e-13)                              # above 1e-13 rad, below isclose's 1e-12
    _run(model, _turned(s0, 5, index=0), operations.set_orientation(s0, beyond, 0))
    assert model.undo_stack.count() == 1 and model.current_orientation() == beyond
    model.undo()
    assert model.current_orientation() == START


def test_a_run_back_near_its_start_that_changed_something_else_stays_a_step(model):
    s0 = model.session()
    near = _off_start_by(0.5e-13)
    renamed = operations.rename_mount(operations.set_orientation(s0, near, 0), 0, "A2")
    _run(model, _turned(s0, 5, index=0), renamed)
    assert model.undo_stack.count() == 1
    assert model.current_mount().name == "A2" and model.current_orientation() == near


def test_a_run_that_changed_another_field_than_the_mounts_stays_a_step(model):
    s0 = model.session()
    _run(model, replace(s0, description="a"), replace(s0, description="ab"))
    assert model.undo_stack.count() == 1 and model.session().description == "ab"
    model.undo()
    assert model.session().description == ""


def test_a_run_that_added_a_mount_stays_a_step(model):
    s0 = model.session()
    _run(model, _turned(s0, 5, index=0), operations.add_mount(s0, "D", START))
    assert model.undo_stack.count() == 1 and [m.name for m in model.mounts] == ["A", "B", "C", "D"]


def test_a_run_back_near_its_start_on_two_mounts_is_dropped(model):
    s0 = model.session()
    near = _off_start_by(0.5e-13)
    other = Orientation.from_axis_angle((0, 1, 0), 0.25e-13, degrees=False)   # mount B starts at identity
    moved = operations.set_orientation(_turned(s0, 5, index=0), Orientation.from_axis_angle((0, 1, 0), 3), 1)
    back = operations.set_orientation(operations.set_orientation(s0, near, 0), other, 1)
    _run(model, moved, back)
    assert model.undo_stack.count() == 0 and model.mounts == s0.mounts


def test_a_run_back_near_its_start_on_one_mount_but_not_the_next_stays_a_step(model):
    s0 = model.session()
    near = _off_start_by(0.5e-13)
    moved = operations.set_orientation(_turned(s0, 5, index=0), Orientation.from_axis_angle((0, 1, 0), 3), 1)
    half_back = operations.set_orientation(operations.set_orientation(s0, near, 0),
                                           Orientation.from_axis_angle((0, 1, 0), 3), 1)
    _run(model, moved, half_back)
    assert model.undo_stack.count() == 1
    model.undo()
    assert model.mounts == s0.mounts


def test_a_run_back_exactly_to_its_start_is_obsolete_on_its_own(model):
    s0 = model.session()
    s1 = _turned(s0, 5)
    first = ReplaceSessionCommand(model, s0, s1, None, continuous_key="drag", merge_token=1)
    back = ReplaceSessionCommand(model, s1, s0, None, continuous_key="drag", merge_token=1)
    assert first.mergeWith(back) is True and first.isObsolete() and first.new == s0


def test_a_run_is_one_undo_step_with_selection_kinds_on_undo_from_another_mount(model, seen):
    s0 = model.session()
    _run(model, _turned(s0, 5), _turned(s0, 6), _turned(s0, 7))
    assert model.undo_stack.count() == 1
    model.select(1)
    model.undo()
    assert model.selected_index == 0 and model.current_orientation() == START
    assert {SELECTION, ORIENTATION} <= seen[-1].what and MOUNTS not in seen[-1].what

