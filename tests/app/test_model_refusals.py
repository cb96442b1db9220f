"""Bad values given to the model are refused with a message that names the problem, and nothing changes:
the session keeps its last good value, no undo step is made and no change is announced. Both sides of
each limit are tried.

Check values: the limits the session's values document (core/session_values.py, core/operations.py)."""

import pytest

from app.model import SessionModel
from core.errors import FramewrightError
from core.orientation import Orientation
from core.session import Mount, Preferences, SavedCheck, Session
from core import operations


@pytest.fixture
def model():
    mounts = (Mount("A", Orientation.from_axis_angle((0, 0, 1), 15.0)), Mount("B"))
    return SessionModel(Session(mounts, selected=0))


@pytest.fixture
def seen(model):
    changes = []
    model.changed.connect(changes.append)
    return changes


def assert_unchanged(model, seen, before):
    assert model.session() == before and model.undo_stack.count() == 0 and seen == []


@pytest.mark.parametrize("call, error, words", [
    (lambda m: m.set_orientation((1.0, 0.0, 0.0, 0.0)), TypeError, "needs an Orientation"),
    (lambda m: m.set_position((1.0, 2.0, 3.0)), TypeError, "needs a Position or None"),
    (lambda m: m.set_part({"boresight": "+X"}), TypeError, "needs PartProperties"),
    (lambda m: m.apply(operations.set_check, ("A", "B")), TypeError, "needs a SavedCheck"),
    (lambda m: m.apply(operations.set_orientation, Orientation.identity(), 2), IndexError,
     "mount 2 is outside 0..1"),
    (lambda m: m.delete_mount(-1), IndexError, "mount -1 is outside 0..1"),
    (lambda m: m.duplicate_mount(-1), IndexError, "mount -1 is outside 0..1"),
    (lambda m: m.rename_mount(0, "bad\nname"), FramewrightError, "mount name"),
    (lambda m: m.add_mount("tab\there"), FramewrightError, "mount name"),
    (lambda m: m.select(True), IndexError, "mount True is outside"),
    (lambda m: m.set_reference_frame("north-east-up"), ValueError, "unknown frame preset 'north-east-up'"),
])
def test_a_refused_edit_changes_nothing(model, seen, call, error, words):
    before = model.session()
    with pytest.raises(error, match=words):
        call(model)
    assert_unchanged(model, seen, before)


def test_duplicating_a_mount_past_the_end_is_refused_by_its_number(model, seen):
    before = model.session()
    with pytest.raises(IndexError, match="mount 5 is outside 0..1"):
        model.duplicate_mount(5)
    assert_unchanged(model, seen, before)
    with pytest.raises(IndexError, match="mount -1 is outside 0..1"):   # not Python's last item
        model.duplicate_mount(-1)
    assert_unchanged(model, seen, before)


@pytest.mark.parametrize("changes, words", [
    ({"angle_units": "grad"}, "angle_units 'grad'"),
    ({"quaternion_order": "wzyx"}, "quaternion_order 'wzyx'"),
    ({"matrix_meaning": "columns"}, "matrix_meaning 'columns'"),
    ({"sequence": "XXY"}, "sequence 'XXY'"),
    ({"intrinsic": 1}, "intrinsic 1"),
    ({"significant_digits": 2}, "significant_digits 2"),
    ({"significant_digits": 18}, "significant_digits 18"),
    ({"red_margin_deg": 10.0}, "red 10.0 / amber 10.0"),
    ({"amber_margin_deg": 90.5}, "amber 90.5"),
    ({"colour": "red"}, "colour"),
])
def test_refused_preferences_keep_the_last_good_ones(model, seen, changes, words):
    before = model.session()
    with pytest.raises((FramewrightError, TypeError), match=words):
        model.set_preferences(**changes)
    assert_unchanged(model, seen, before)


@pytest.mark.parametrize("changes", [
    {"significant_digits": 3}, {"significant_digits": 17}, {"amber_margin_deg": 90.0},
    {"red_margin_deg": 9.5}, {"angle_units": "mil"}, {"sequence": "YXY", "intrinsic": False},
])
def test_preferences_just_inside_the_limits_are_taken(model, seen, changes):
    model.set_preferences(origin="settings", **changes)
    for name, value in changes.items():
        assert getattr(model.preferences, name) == value
    assert model.undo_stack.count() == 0 and seen[-1].origin == "settings"


def test_after_a_refusal_the_next_good_value_is_taken(model):
    with pytest.raises(TypeError):
        model.set_orientation("30 deg about Z")
    turn = Orientation.from_axis_angle((1, 0, 0), 30.0)
    model.set_orientation(turn)
    assert model.current_orientation() == turn and model.undo_stack.count() == 1
    model.undo()
    assert model.current_orientation() == Orientation.from_axis_angle((0, 0, 1), 15.0)


def test_a_session_is_loaded_with_the_users_preferences_and_a_new_history(model, seen):
    mine = Preferences(angle_units="mrad", quaternion_order="xyzw", significant_digits=5)
    model.set_preferences(angle_units="mrad", quaternion_order="xyzw", significant_digits=5)
    model.set_orientation(Orientation.from_axis_angle((0, 1, 0), 3.0))
    theirs = Session((Mount("P"), Mount("Q")), selected=1, preferences=Preferences(sequence="XYZ"))
    model.load_session(theirs, file_path="bench.fwsession.json")
    assert model.preferences == mine and model.session().mounts == theirs.mounts
    assert model.selected_index == 1 and model.file_path == "bench.fwsession.json"
    assert model.undo_stack.count() == 0 and model.undo_stack.isClean()
    assert seen[-1].origin is None
    model.add_mount("R")
    assert not model.undo_stack.isClean()
    model.load_session(theirs, keep_preferences=False)
    assert model.preferences == Preferences(sequence="XYZ") and model.file_path is None


def test_the_check_mounts_are_found_by_name(model):
    assert model.check_mount_indices() == (None, None)
    model.apply(operations.set_check, SavedCheck("B", "gone"))
    assert model.check_mount_indices() == (1, None)
    model.add_mount("B")                                  # two mounts of one name: the first is meant
    model.apply(operations.set_check, SavedCheck("A", "B"))
    assert model.check_mount_indices() == (0, 1)
    model.select(2)
    assert model.ghost_orientation() is None              # the measured one is mount 1, not the selected
    model.select(1)
    assert model.ghost_orientation() == model.mounts[0].orientation and model.ghost_label() == "nominal, A"
