"""A mount's stored position read from a session file: its default unit, its refusals word for word, and
load_session_and_bytes handing back exactly the bytes it read. Check values: the file layout of
core/session_values.py (version 2 added positions) and Python's hashlib for the bytes."""

import hashlib
import json

import pytest

from core.session import SessionFileError, load_session, session_from_dict
from core.session_reading import load_session_and_bytes
from tests.core.test_session_versions_and_norms import file_with


def _with_position(position, version=2):
    document = file_with(version=version)
    document["mounts"][0]["position"] = position
    return document


@pytest.mark.parametrize("stored, unit", [({"metres": [0.1, 0.2, 0.3]}, "mm"),
                                          ({"metres": [0.1, 0.2, 0.3], "unit": "m"}, "m"),
                                          ({"metres": [0.1, 0.2, 0.3], "unit": "thou"}, "thou")])
def test_a_stored_position_keeps_its_metres_and_its_unit_and_millimetres_when_none_is_given(stored, unit):
    position = session_from_dict(_with_position(stored)).mounts[0].position
    assert position.metres == (0.1, 0.2, 0.3) and position.unit == unit


@pytest.mark.parametrize("stored, version, message", [
    ({"metres": [0.1, 0.2, 0.3]}, 1,
     "session: mounts[0].position: a position needs format version 2; this file says version 1 (the file may "
     "have been edited by hand)"),
    ({"unit": "mm"}, 2, 'session: mounts[0].position: expected {"metres": [x, y, z], "unit": "mm"}'),
    ([1, 2, 3], 2,
     'session: mounts[0].position: expected an object {"metres": [x, y, z], "unit": "mm"}, got a list'),
    ({"metres": [0, 0, 0], "unit": "MM"}, 2,
     "session: mounts[0].position.unit: expected one of mm, m, in, thou, got 'MM'"),
])
def test_a_damaged_position_is_refused_word_for_word(stored, version, message):
    with pytest.raises(SessionFileError) as refused:
        session_from_dict(_with_position(stored, version))
    assert str(refused.value) == message


def test_load_session_and_bytes_reads_the_same_session_and_returns_the_bytes_read(tmp_path):
    path = tmp_path / "bench.fwsession.json"
    raw = json.dumps(_with_position({"metres": [0.5, 0, -0.25], "unit": "m"}), indent=1).encode("utf-8")
    path.write_bytes(raw)
    session, read = load_session_and_bytes(path)
    assert read == raw and hashlib.sha256(read).hexdigest() == hashlib.sha256(raw).hexdigest()
    assert session == load_session(path)
    assert session.mounts[0].position.metres == (0.5, 0.0, -0.25)


def test_load_session_and_bytes_names_the_file_when_it_cannot_be_read(tmp_path):
    missing = tmp_path / "nowhere.fwsession.json"
    with pytest.raises(SessionFileError) as refused:
        load_session_and_bytes(missing)
    assert str(refused.value).startswith(f"{missing}: ")
