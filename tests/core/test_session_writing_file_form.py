"""The bytes a session save writes (core.session_writing): UTF-8 JSON indented by two spaces, non-ASCII
text kept as itself, one newline at the end; every part of a session lands under its key and reads back;
kept unknown keys never override the file's own; and each kind of refusal names the file given and the
problem (a field the loader would refuse, a NaN by its place, an object JSON cannot hold, a very long
reason shortened as every refusal is), with nothing written. Sessions are invented; the expected key layout
is the module's own file form."""

import json

import pytest

from core.chain import Chain
from core.orientation import Orientation
from core.session import Mount, Session, SessionFileError, load_session, save_session
from core.session_reading import session_from_dict
from core.session_values import SavedCheck
from core.session_writing import session_file_bytes, session_to_dict


def _refusal(session, source="bench/rig.fwsession.json") -> str:
    with pytest.raises(SessionFileError) as caught:
        session_file_bytes(session, source=source)
    return str(caught.value)


def test_the_file_is_utf8_json_indented_by_two_spaces_with_one_final_newline():
    raw = session_file_bytes(Session((Mount("Kamera für Öl", Orientation.from_axis_angle((0, 0, 1), 90)),)))
    text = raw.decode("utf-8")
    assert text.startswith('{\n  "format": "framewright-session",\n  "version": ')
    assert text.endswith("\n}\n") and not text.endswith("\n\n")
    assert '"name": "Kamera für Öl"' in text and "\\u00fc" not in text      # kept as itself, not escaped
    assert '\n  "preferences": {\n    "angle_units": ' in text           # two more spaces a level
    assert json.loads(raw) == session_to_dict(session_from_dict(json.loads(raw), source="bytes"))


def test_every_part_of_a_session_is_written_under_its_key_and_reads_back(tmp_path):
    session = Session((Mount("A", Orientation.from_axis_angle((1, 0, 0), 30), notes="invented rig"),
                       Mount("B")), selected=1, description="bench", reference_frame="ned",
                      chains=(Chain(name="arm"),), checks=(SavedCheck("A", "B", name="level"),),
                      extra={"kept": {"x": [1, 2]}})
    data = json.loads(session_file_bytes(session))
    assert list(data) == ["format", "version", "description", "reference_frame", "selected", "preferences",
                          "mounts", "chains", "checks", "kept"]
    assert (data["description"], data["reference_frame"], data["selected"]) == ("bench", "ned", 1)
    assert data["chains"][0]["name"] == "arm" and data["checks"][0]["name"] == "level"
    assert data["kept"] == {"x": [1, 2]}
    assert list(data["mounts"][0]) == ["name", "orientation", "part", "notes"]
    assert list(data["mounts"][0]["part"]) == ["box_size_mm", "face_names", "boresight"]
    path = tmp_path / "rig.fwsession.json"
    save_session(session, path)
    assert load_session(path) == session


def test_no_chains_or_checks_means_no_key_at_all():
    data = json.loads(session_file_bytes(Session((Mount("A"),))))
    assert "chains" not in data and "checks" not in data


def test_a_kept_key_never_overrides_the_files_own():
    session = Session((Mount("A"),), extra={"format": "someone else's", "version": 99})
    data = json.loads(session_file_bytes(session))
    assert data["format"] == "framewright-session" and data["version"] != 99


def test_a_field_the_loader_would_refuse_is_refused_by_the_file_name_and_place(tmp_path):
    session = Session((Mount("A"),), chains=(Chain(name="bell\x07"),))
    assert _refusal(session) == ("bench/rig.fwsession.json: chains[0].name: the name holds a control "
                                 "character U+0007 at character 5; expected plain text")
    path = tmp_path / "rig.fwsession.json"
    with pytest.raises(SessionFileError, match="^" + str(path).replace(".", r"\.") + ": chains"):
        save_session(session, path)                  # the save names the path it was given
    assert list(tmp_path.iterdir()) == []


def test_a_nan_among_kept_data_is_refused_by_its_place():
    assert _refusal(Session((Mount("A"),), extra={"kept": {"x": float("nan")}})) == (
        "bench/rig.fwsession.json: kept.x: nan is not a finite number (JSON has no NaN or infinity; the file "
        "may be damaged)")


def test_a_lone_surrogate_is_refused_by_its_place():
    assert _refusal(Session((Mount("A"),), chains=(Chain(name="lone \ud800"),))) == (
        "bench/rig.fwsession.json: chains[0].name: holds a lone surrogate U+D800 at character 6, which is "
        "not valid Unicode text (the file may be damaged)")


def test_an_object_json_cannot_hold_is_refused_in_words():
    assert _refusal(Session((Mount("A"),), extra={"kept": object()})) == (
        "bench/rig.fwsession.json: cannot be written as a session file (Object of type object is not JSON "
        "serializable)")


def test_a_very_long_reason_is_shortened_and_keeps_its_start_and_end():
    odd = type("Odd" * 1000, (), {})()               # a class name of 3,000 characters in the reason
    words = _refusal(Session((Mount("A"),), extra={"kept": odd}))
    # Every refusal is kept to core.errors.MESSAGE_LIMIT characters (600), the middle left out.
    assert len(words) <= 600 and words.startswith("bench/rig.fwsession.json: cannot be written as a "
                                                  "session file (Object of type OddOdd")
    assert words.endswith("OddOdd is not JSON serializable)")
