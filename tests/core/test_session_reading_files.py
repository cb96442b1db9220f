"""Reading a session from a file: a file that cannot be read, bytes that are not JSON, and a value the
field checks let through but a constructor refuses; each is a SessionFileError that starts with the
file's name, and only the last is marked `unexpected` (a gap in the field checks, not a named refusal).

Check values: the refusal words are the loader's own (core/session_reading.py) and the JSON reader's
(core/bounded_json.py); the 2,000-character cap on an unexpected refusal is the loader's own, the shortening of a long
refusal core/errors.py's."""

import json

import pytest

from core import session_reading
from core.session import SessionFileError, load_session
from core.session_reading import load_session_and_bytes

MINIMAL = {"format": "framewright-session", "version": 2,
           "mounts": [{"name": "camera", "orientation": {"quaternion_wxyz": [1, 0, 0, 0]}}]}


@pytest.fixture(params=[load_session, lambda path: load_session_and_bytes(path)[0]], ids=["load", "load_and_bytes"])
def load(request):
    return request.param


def test_a_readable_file_loads_through_either_reader(tmp_path, load):
    path = tmp_path / "rig.fwsession.json"
    path.write_text(json.dumps(MINIMAL), encoding="utf-8")
    assert load(path).mounts[0].name == "camera"


def test_a_missing_file_and_a_folder_are_refused_naming_the_path(tmp_path, load):
    missing = tmp_path / "gone.fwsession.json"
    with pytest.raises(SessionFileError) as refused:
        load(missing)
    assert str(refused.value).startswith(f"{missing}: cannot be read (") and not refused.value.unexpected
    with pytest.raises(SessionFileError) as refused:
        load(tmp_path)
    assert str(refused.value).startswith(f"{tmp_path}: ") and not refused.value.unexpected


def test_bytes_that_are_not_utf8_or_not_json_are_refused_naming_the_file(tmp_path, load):
    path = tmp_path / "bad.fwsession.json"
    path.write_bytes(b'{"format": "\xff"}')
    with pytest.raises(SessionFileError) as refused:
        load(path)
    assert str(refused.value) == (f"{path}: not a text file in UTF-8 (byte 12); it may be damaged or not a "
                                  "session file")
    assert not refused.value.unexpected
    path.write_text('{"format": ', encoding="utf-8")
    with pytest.raises(SessionFileError) as refused:
        load(path)
    assert str(refused.value).startswith(f"{path}: ") and not refused.value.unexpected


def test_a_named_refusal_inside_the_file_starts_with_the_file_name(tmp_path, load):
    path = tmp_path / "rig.fwsession.json"
    path.write_text(json.dumps(dict(MINIMAL, selected=3)), encoding="utf-8")
    with pytest.raises(SessionFileError) as refused:
        load(path)
    assert str(refused.value) == f"{path}: selected: expected a mount index 0..0, got 3"
    assert not refused.value.unexpected


@pytest.mark.parametrize("error", [ValueError("bad value"), TypeError("bad type"), KeyError("key"),
                                   OverflowError("too big"), ZeroDivisionError("zero"), IndexError("index"),
                                   AttributeError("attribute"), RecursionError("deep"), MemoryError("memory")])
def test_a_constructor_failing_past_the_field_checks_is_still_a_refusal_marked_unexpected(tmp_path, monkeypatch,
                                                                                         load, error):
    # Stands in for a gap in the field checks: the loader's own checks pass, then building fails.
    def failing(data, source="session"):
        raise error

    monkeypatch.setattr(session_reading, "session_from_dict", failing)
    path = tmp_path / "rig.fwsession.json"
    path.write_text(json.dumps(MINIMAL), encoding="utf-8")
    with pytest.raises(SessionFileError) as refused:
        load(path)
    assert str(refused.value) == f"{path}: not a valid session ({error})"
    assert refused.value.unexpected is True


def test_an_unexpected_refusal_is_cut_to_2000_characters(tmp_path, monkeypatch):
    def failing(data, source="session"):
        raise ValueError("x" * 5000)

    monkeypatch.setattr(session_reading, "session_from_dict", failing)
    path = tmp_path / "rig.fwsession.json"
    path.write_text(json.dumps(MINIMAL), encoding="utf-8")
    with pytest.raises(SessionFileError) as refused:
        load_session(path)
    # Cut to 2,000 characters, then shortened as every refusal is (core/errors.py keeps its first 360 and
    # last 200 characters around a note of how many were left out): 2,000 - 560 = 1,440, worked by hand.
    message = str(refused.value)
    assert message.startswith(f"{path}: not a valid session (xxx")
    assert "[1,440 characters left out]" in message and message.endswith(" " + "x" * 200)


def test_a_named_refusal_raised_past_the_checks_is_passed_on_unchanged(tmp_path, monkeypatch):
    def refusing(data, source="session"):
        raise SessionFileError(f"{source}: mounts[0]: as named")

    monkeypatch.setattr(session_reading, "session_from_dict", refusing)
    path = tmp_path / "rig.fwsession.json"
    path.write_text(json.dumps(MINIMAL), encoding="utf-8")
    with pytest.raises(SessionFileError) as refused:
        load_session(path)
    assert str(refused.value) == f"{path}: mounts[0]: as named" and not refused.value.unexpected
