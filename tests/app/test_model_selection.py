"""SessionModel: loading a session with and without keeping the user's preferences, and deleting the
selected mount (first, middle and last), with undo restoring mounts and selection exactly.

Check values: the model's documented rules (app/model.py), worked by hand for each case."""

import pytest

from app.model import MOUNTS, ORIENTATION, PREFERENCES, SELECTION, SessionModel
from core.orientation import Orientation
from core.session import Mount, Preferences, Session

THEIRS = Preferences(angle_units="rad", quaternion_order="xyzw", matrix_meaning="reference_to_body",
                     sequence="XYZ", intrinsic=False, significant_digits=12)
MINE = Preferences(angle_units="deg", quaternion_order="wxyz", sequence="ZXZ", significant_digits=6)


def session_of(names, selected=0, preferences=THEIRS):
    mounts = tuple(Mount(n, Orientation.from_axis_angle([0, 0, 1], 10.0 * (i + 1))) for i, n in enumerate(names))
    return Session(mounts, selected=selected, preferences=preferences)


@pytest.fixture
def model():
    m = SessionModel(session_of(["A", "B"], preferences=MINE))
    seen = []
    m.changed.connect(seen.append)
    m.seen = seen
    return m


def test_loading_keeps_the_users_preferences_by_default(model):
    model.set_orientation(Orientation.from_axis_angle([1, 0, 0], 5.0))
    assert model.undo_stack.count() == 1
    loaded = session_of(["P", "Q", "R"], selected=2)
    model.load_session(loaded, file_path="/tmp/x.fwsession.json")
    assert model.preferences == MINE                      # the user's own, not the file's
    assert [m.name for m in model.mounts] == ["P", "Q", "R"] and model.selected_index == 2
    assert model.current_orientation() == loaded.mounts[2].orientation
    assert model.undo_stack.count() == 0 and model.undo_stack.isClean()   # a new history
    assert model.file_path == "/tmp/x.fwsession.json"
    assert model.seen[-1].what >= {ORIENTATION, MOUNTS, SELECTION, PREFERENCES} and model.seen[-1].origin is None
    # Saved again, the session carries the user's preferences.
    assert model.session().preferences == MINE


def test_loading_without_keeping_takes_the_files_preferences(model):
    model.load_session(session_of(["P"]), keep_preferences=False)
    assert model.preferences == THEIRS
    assert model.session().preferences == THEIRS


@pytest.mark.parametrize("names, selected, after_names, after_selected", [
    (["A", "B", "C"], 0, ["B", "C"], 0),      # the first: the next one (now first) is selected
    (["A", "B", "C"], 1, ["A", "C"], 1),      # a middle one: the next one takes its place
    (["A", "B", "C"], 2, ["A", "B"], 1),      # the last: the one before it
    (["A", "B"], 1, ["A"], 0),
])
def test_deleting_the_selected_mount(names, selected, after_names, after_selected):
    model = SessionModel(session_of(names, selected=selected))
    seen = []
    model.changed.connect(seen.append)
    before = model.mounts
    model.delete_mount()                                   # the selected one
    assert [m.name for m in model.mounts] == after_names
    assert model.selected_index == after_selected
    assert model.current_mount().name == after_names[after_selected]
    assert seen[-1].what >= {MOUNTS, SELECTION, ORIENTATION}
    model.undo()
    assert model.mounts == before and model.selected_index == selected
    model.redo()
    assert [m.name for m in model.mounts] == after_names and model.selected_index == after_selected


def test_deleting_another_mount_keeps_the_selection_on_the_same_mount():
    model = SessionModel(session_of(["A", "B", "C"], selected=2))
    model.delete_mount(0)
    assert model.current_mount().name == "C" and model.selected_index == 1
    model = SessionModel(session_of(["A", "B", "C"], selected=0))
    model.delete_mount(2)
    assert model.current_mount().name == "A" and model.selected_index == 0


def test_the_last_mount_cannot_be_deleted():
    model = SessionModel(session_of(["A"]))
    with pytest.raises(ValueError, match="at least one mount"):
        model.delete_mount()
    assert [m.name for m in model.mounts] == ["A"] and model.undo_stack.count() == 0
