"""The chain and the check as session state in the model: each change one undo step announced by the one
signal, the ghost rule, and a session with a chain and check settings saved and reopened identical."""

import json

import pytest

from app.model import CHAIN, CHECK, SessionModel
from core import operations
from core.chain import Chain, ChainStep
from core.check import CheckSettings
from core.errors import FramewrightError
from core.orientation import Orientation
from core.session import SavedCheck, SessionFileError, load_session, save_session


def sample_chain():
    return Chain((ChainStep("bracket", Orientation.from_axis_angle((0, 0, 1), 90)),
                  ChainStep("plate", Orientation.from_axis_angle((1, 0, 0), 90), inverted=True),
                  ChainStep("spacer", Orientation.from_axis_angle((0, 1, 0), 0.5), enabled=False)),
                 name="mast bracket")


def sample_check(model):
    return SavedCheck(model.mounts[3].name, model.mounts[4].name,
                      CheckSettings(mode="pointing_and_roll", pointing_tolerance_deg=0.3,
                                    roll_tolerance_deg=0.75, body_axis=(0.0, 0.6, 0.8)))


def test_chain_and_check_edits_are_undo_steps_with_their_own_change_kinds(model, changes):
    model.apply(operations.set_chain, sample_chain(), origin="panel", text="Add steps")
    assert changes[-1].what == frozenset({CHAIN}) and changes[-1].origin == "panel"
    model.apply(operations.set_check, sample_check(model), origin="check panel")
    assert changes[-1].what == frozenset({CHECK})
    assert model.undo_stack.count() == 2 and model.undo_stack.undoText() == "Edit check"
    model.undo()
    assert model.check == SavedCheck() and changes[-1].origin is None
    model.undo()
    assert model.chain == Chain()
    model.redo()
    assert model.chain == sample_chain()
    with pytest.raises(TypeError):
        model.apply(operations.set_chain, "bracket")


def test_ghost_rule(model):
    assert model.ghost_orientation() is None and model.ghost_label() is None
    model.apply(operations.set_check, SavedCheck(model.mounts[3].name, model.mounts[4].name))
    model.select(3)                                   # the nominal itself: no ghost
    assert model.ghost_orientation() is None
    model.select(4)                                   # the measured: the nominal is its ghost
    assert model.ghost_orientation() == model.mounts[3].orientation
    assert model.ghost_label() == f"nominal, {model.mounts[3].name}"
    model.apply(operations.set_check, SavedCheck(model.mounts[4].name, model.mounts[4].name))  # the same mount twice: none
    assert model.ghost_orientation() is None


def test_a_session_with_a_chain_and_check_saved_and_reopened_is_identical(tmp_path, model):
    model.apply(operations.set_chain, sample_chain())
    model.apply(operations.set_check, sample_check(model))
    path = tmp_path / "mast.fwsession.json"
    save_session(model.session(), path)
    reopened = SessionModel(load_session(path))
    assert reopened.chain == model.chain                       # every step, flag and quaternion bit
    assert reopened.check == model.check
    assert reopened.chain.product() == model.chain.product()
    # (the demo's mount quaternions may move by the last bit when normalised again on reading)
    assert all(a.orientation.isclose(b.orientation, atol=1e-15) for a, b in zip(reopened.mounts, model.mounts))
    again = tmp_path / "again.fwsession.json"
    save_session(reopened.session(), again)
    data = json.loads(path.read_text(encoding="utf-8"))
    data_again = json.loads(again.read_text(encoding="utf-8"))
    assert data_again["chains"] == data["chains"] and data_again["checks"] == data["checks"]  # exactly
    assert data["chains"][0]["name"] == "mast bracket"
    assert data["checks"][0]["settings"]["body_axis"] == [0.0, 0.6, 0.8]


def test_loading_a_session_replaces_the_chain_and_check_and_clears_history(tmp_path, model, demo_session):
    model.apply(operations.set_chain, sample_chain())
    model.load_session(demo_session)
    assert model.chain == Chain() and model.undo_stack.count() == 0


def test_a_damaged_chain_in_a_file_is_refused_naming_it(tmp_path, model):
    model.apply(operations.set_chain, sample_chain())
    path = tmp_path / "bad.fwsession.json"
    save_session(model.session(), path)
    data = json.loads(path.read_text(encoding="utf-8"))
    data["chains"][0]["steps"][1]["inverted"] = "yes"
    data["checks"] = [{"nominal": 3}]
    path.write_text(json.dumps(data), encoding="utf-8")
    with pytest.raises(SessionFileError, match=r"chains\[0\].*inverted"):
        load_session(path)
    data["chains"] = []
    path.write_text(json.dumps(data), encoding="utf-8")
    with pytest.raises(FramewrightError, match=r"checks\[0\].*nominal"):
        load_session(path)
