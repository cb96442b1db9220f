"""A key a session file's mount, part, chain or chain step does not have is refused by its place, never
dropped: a misspelt "boresite" read as the default +Z, or a step's "invert" read as not inverted, would
silently point the part another way. The known keys still read, and what the program saves reads back.

Check values: the refusal words are the loader's own (core/session_reading.py); the known keys are the
ones core/session_writing.py and core/chain.py write."""

import copy
import json

import pytest

from core.session import SessionFileError, session_from_dict, session_to_dict

IDENTITY = {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]}
FULL = {"format": "framewright-session", "version": 2,
        "mounts": [{"name": "camera", "orientation": IDENTITY, "notes": "",
                    "part": {"box_size_mm": [10, 20, 30], "face_names": {"+Z": "lens"}, "boresight": "-X"},
                    "position": {"metres": [0, 0, 1], "unit": "m"},
                    "measurements": [{"orientation": IDENTITY, "weight": 1.0, "source": "typed"}]}],
        "chains": [{"name": "mast", "steps": [{"name": "bracket", "orientation": IDENTITY, "inverted": True,
                                              "enabled": False, "position": {"metres": [0, 0, 0.5]}}]}]}


def changed(change):
    data = copy.deepcopy(FULL)
    change(data)
    return json.loads(json.dumps(data))


def test_every_known_key_reads_and_a_saved_session_reads_back():
    session = session_from_dict(changed(lambda d: None))
    assert session.mounts[0].part.boresight == "-X" and session.chains[0].steps[0].inverted is True
    assert session_from_dict(json.loads(json.dumps(session_to_dict(session)))) == session


@pytest.mark.parametrize("change, message", [
    (lambda d: d["mounts"][0].__setitem__("positon", {"metres": [1, 2, 3]}),
     "session: mounts[0]: expected only name, orientation, part, notes, position, measurements, found also "
     "['positon']"),
    (lambda d: d["mounts"][0]["part"].__setitem__("boresite", "+Y"),
     "session: mounts[0].part: expected only box_size_mm, face_names, boresight, found also ['boresite']"),
    (lambda d: d["mounts"][0]["part"].update({"box_size": [1, 2, 3], "colour": "red"}),
     "session: mounts[0].part: expected only box_size_mm, face_names, boresight, found also ['box_size', 'colour']"),
    (lambda d: d["chains"][0].__setitem__("step", []),
     "session: chains[0]: expected only name, steps, found also ['step']"),
    (lambda d: d["chains"][0]["steps"][0].__setitem__("invert", True),
     "session: chains[0].steps[0]: expected only name, orientation, position, inverted, enabled, found also "
     "['invert']"),
])
def test_a_key_the_format_does_not_have_is_refused_by_its_place(change, message):
    with pytest.raises(SessionFileError) as refused:
        session_from_dict(changed(change))
    assert str(refused.value) == message and not refused.value.unexpected


def test_unknown_top_level_keys_are_still_kept_as_read():
    session = session_from_dict(changed(lambda d: d.__setitem__("added_later", [1, "two"])))
    assert dict(session.extra) == {"added_later": [1, "two"]}
