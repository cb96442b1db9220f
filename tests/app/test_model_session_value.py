"""The model holds one Session value: each edit is one replace-session undo step whose change kinds and text
come from the fields that differ, and undo restores only what its edit changed.

Check values: the model's documented rules (app/model.py, app/commands.py), worked by hand per case."""

from dataclasses import replace


from app.changes import CURRENT_MOUNT, kinds_between
from app.model import CHAIN, CHECK, MEASUREMENTS, MOUNTS, ORIENTATION, POSITION, PREFERENCES, SELECTION, WORDS
from core import operations
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, SavedCheck, Session


def test_undo_restores_only_what_its_edit_changed(model):
    start = model.current_orientation()
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 20))
    model.set_preferences(angle_units="rad")            # not undoable, made after the edit
    model.set_reference_frame("aircraft")
    model.undo()
    assert model.current_orientation() == start
    assert model.preferences.angle_units == "rad" and model.reference_frame == "aircraft"
    model.redo()
    assert model.preferences.angle_units == "rad" and model.reference_frame == "aircraft"


def test_renaming_a_checked_mount_is_one_step_and_one_change(model, changes):
    nominal, measured = model.mounts[3].name, model.mounts[4].name
    model.apply(operations.set_check, SavedCheck(nominal, measured))
    count = model.undo_stack.count()
    model.rename_mount(3, "Renamed nominal", origin="list")
    assert model.undo_stack.count() == count + 1
    assert model.undo_stack.undoText() == "Rename mount to “Renamed nominal”"
    assert model.check.nominal == "Renamed nominal" and model.check.measured == measured
    assert {MOUNTS, CHECK} <= changes[-1].what and changes[-1].origin == "list"
    model.undo()
    assert model.check.nominal == nominal and model.mounts[3].name == nominal


def test_a_pose_is_one_step_announcing_orientation_and_position(model, changes):
    count = model.undo_stack.count()
    model.apply_pose(Orientation.from_axis_angle((1, 0, 0), 4), Position((0.5, 0.0, 0.0)), "Use the pasted pose",
                     origin="decode")
    assert model.undo_stack.count() == count + 1 and model.undo_stack.undoText() == "Use the pasted pose"
    assert changes[-1].what == frozenset({ORIENTATION, POSITION}) and changes[-1].origin == "decode"


def test_an_edit_between_two_drag_events_ends_the_merge(model):
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 1), continuous_key="drag")
    model.set_preferences(quaternion_order="xyzw")      # not an undo step, but the session changed under it
    model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 2), continuous_key="drag")
    assert model.undo_stack.count() == 2
    model.undo()
    model.undo()
    assert model.preferences.quaternion_order == "xyzw"


def test_the_undo_text_comes_from_the_diff_when_the_caller_gives_none(model):
    model.add_mount("Spare")
    assert model.undo_stack.undoText() == "Add mount “Spare”"
    model.set_part(replace(model.current_mount().part, boresight="-X"))
    assert model.undo_stack.undoText() == "Edit the part of “Spare”"
    model.delete_mount()
    assert model.undo_stack.undoText() == "Delete mount “Spare”"


def _session(*mounts, selected=0):
    return Session(tuple(mounts), selected=selected)


def test_change_kinds_follow_the_fields_that_differ():
    a, b = Mount("A"), Mount("B")
    turned = Orientation.from_axis_angle((0, 1, 0), 10)
    base = _session(a, b)
    assert kinds_between(base, base) == frozenset()
    assert kinds_between(base, operations.set_orientation(base, turned)) == {ORIENTATION}
    assert kinds_between(base, operations.set_orientation(base, turned, index=1)) == {MOUNTS}   # another mount
    assert kinds_between(base, operations.select(base, 1)) == CURRENT_MOUNT
    assert kinds_between(base, operations.add_measurement(base)) == {MEASUREMENTS}
    assert kinds_between(base, operations.rename_mount(base, 1, "C")) == {MOUNTS} | CURRENT_MOUNT
    assert kinds_between(base, operations.set_chain(base, base.chain)) == {CHAIN}
    assert kinds_between(base, operations.set_reference_frame(base, "ned")) == {WORDS}
    assert kinds_between(base, operations.set_preferences(base, significant_digits=5)) == {PREFERENCES}
    assert SELECTION in kinds_between(base, operations.delete_mount(base, 0))
