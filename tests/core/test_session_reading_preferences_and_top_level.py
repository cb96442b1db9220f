"""A session file's display preferences and its top-level fields as the loader reads them: the default
each missing key takes, each bound accepted on one side and refused on the other, and every refusal word
for word.

Check values: the refusal words are the loader's own (core/session_reading.py); the bounds are the ones
core/session_values.py documents (3 to 17 significant digits, margins 0 < red < amber <= 90 degrees); the
unit quaternion (0.5, 0.5, 0.5, 0.5) is worked by hand (norm 1)."""

import json

import pytest

from core.session import Preferences, SessionFileError, session_from_dict

IDENTITY = {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]}


def document(**top):
    """An invented two-mount session file with the given top-level keys added (None: key removed)."""
    data = {"format": "framewright-session", "version": 2,
            "mounts": [{"name": "nominal", "orientation": IDENTITY},
                       {"name": "measured", "orientation": {"quaternion_wxyz": [0.5, 0.5, 0.5, 0.5]}}]}
    for key, value in top.items():
        if value is None:
            data.pop(key, None)
        else:
            data[key] = value
    return json.loads(json.dumps(data))


def refusal(data) -> str:
    with pytest.raises(SessionFileError) as refused:
        session_from_dict(data)
    assert not refused.value.unexpected
    return str(refused.value)


def preferences(**keys) -> Preferences:
    return session_from_dict(document(preferences=keys)).preferences


# --- preferences ------------------------------------------------------------------------------------------

def test_missing_preferences_and_missing_keys_take_the_defaults():
    assert session_from_dict(document()).preferences == Preferences()
    assert preferences() == Preferences()
    p = preferences(angle_units="rad")
    assert (p.angle_units, p.quaternion_order, p.matrix_meaning, p.sequence, p.intrinsic, p.significant_digits,
            p.amber_margin_deg, p.red_margin_deg) == ("rad", "wxyz", "body_to_reference", "ZYX", True, 9, 10.0, 1.0)


def test_every_preference_is_read_as_stored():
    p = preferences(angle_units="gon", quaternion_order="xyzw", matrix_meaning="reference_to_body",
                    sequence="ZXZ", intrinsic=False, significant_digits=12, amber_margin_deg=20.0,
                    red_margin_deg=5.0)
    assert (p.angle_units, p.quaternion_order, p.matrix_meaning, p.sequence, p.intrinsic, p.significant_digits,
            p.amber_margin_deg, p.red_margin_deg) == ("gon", "xyzw", "reference_to_body", "ZXZ", False, 12, 20.0,
                                                      5.0)


def test_an_unknown_preference_key_is_ignored():
    assert preferences(theme="dark") == Preferences()


@pytest.mark.parametrize("digits", [3, 17])
def test_significant_digits_at_either_end_are_read(digits):
    assert preferences(significant_digits=digits).significant_digits == digits


@pytest.mark.parametrize("amber, red", [(0.5, 0.25), (0.002, 0.001), (90, 89.5), (90, 0.5), (1, 0.999)])
def test_margins_anywhere_from_0_to_90_degrees_are_read(amber, red):
    p = preferences(amber_margin_deg=amber, red_margin_deg=red)
    assert (p.amber_margin_deg, p.red_margin_deg) == (amber, red)


@pytest.mark.parametrize("keys, message", [
    ({"angle_units": "degrees"},
     "session: preferences.angle_units: expected one of deg, rad, mrad, arcmin, arcsec, gon, mil, got 'degrees'"),
    ({"angle_units": "dms"},
     "session: preferences.angle_units: expected one of deg, rad, mrad, arcmin, arcsec, gon, mil, got 'dms'"),
    ({"quaternion_order": "zyxw"}, "session: preferences.quaternion_order: expected one of wxyz, xyzw, got 'zyxw'"),
    ({"quaternion_order": 4}, "session: preferences.quaternion_order: expected one of wxyz, xyzw, got a number"),
    ({"matrix_meaning": "body"},
     "session: preferences.matrix_meaning: expected one of body_to_reference, reference_to_body, got 'body'"),
    ({"sequence": "ZZY"},
     "session: preferences.sequence: expected one of XYZ, XZY, YXZ, YZX, ZXY, ZYX, XYX, XZX, YXY, YZY, ZXZ, ZYZ, "
     "got 'ZZY'"),
    ({"intrinsic": 1}, "session: preferences.intrinsic: expected true or false, got a number"),
    ({"intrinsic": None}, "session: preferences.intrinsic: expected true or false, got null"),
    ({"significant_digits": 2}, "session: preferences.significant_digits: expected a whole number from 3 to 17, got 2"),
    ({"significant_digits": 18},
     "session: preferences.significant_digits: expected a whole number from 3 to 17, got 18"),
    ({"significant_digits": 9.0},
     "session: preferences.significant_digits: expected a whole number from 3 to 17, got 9.0"),
    ({"significant_digits": True},
     "session: preferences.significant_digits: expected a whole number from 3 to 17, got true"),
    ({"significant_digits": "9"},
     "session: preferences.significant_digits: expected a whole number from 3 to 17, got text"),
    ({"amber_margin_deg": -0.5},
     "session: preferences.amber_margin_deg: expected an angle in degrees from 0 to 90, got -0.5"),
    ({"amber_margin_deg": 90.5},
     "session: preferences.amber_margin_deg: expected an angle in degrees from 0 to 90, got 90.5"),
    ({"amber_margin_deg": "10"}, "session: preferences.amber_margin_deg: expected an angle in degrees, got text"),
    ({"red_margin_deg": -1e-300},
     "session: preferences.red_margin_deg: expected an angle in degrees from 0 to 90, got -1e-300"),
    ({"red_margin_deg": 91}, "session: preferences.red_margin_deg: expected an angle in degrees from 0 to 90, got 91.0"),
    ({"red_margin_deg": False}, "session: preferences.red_margin_deg: expected an angle in degrees, got false"),
    # Each margin within 0 to 90 on its own, but not red < amber: Preferences refuses, the loader names it.
    ({"amber_margin_deg": 5, "red_margin_deg": 5},
     "session: preferences: preferences not valid: margin thresholds red 5.0 / amber 5.0 (expected 0 < red < "
     "amber <= 90)"),
    ({"red_margin_deg": 0},
     "session: preferences: preferences not valid: margin thresholds red 0.0 / amber 10.0 (expected 0 < red < "
     "amber <= 90)"),
])
def test_a_damaged_preference_is_refused_word_for_word(keys, message):
    assert refusal(document(preferences=keys)) == message


def test_preferences_that_are_not_an_object_are_refused():
    assert refusal(document(preferences=["deg"])) == "session: preferences: expected an object, got a list"


# --- the top level ----------------------------------------------------------------------------------------

def test_a_minimal_file_takes_the_top_level_defaults():
    session = session_from_dict(document())
    assert session.selected == 0 and session.description == "" and session.reference_frame == "enu"
    assert dict(session.extra) == {} and [m.name for m in session.mounts] == ["nominal", "measured"]


def test_the_top_level_fields_are_read_as_stored_and_unknown_keys_kept():
    session = session_from_dict(document(selected=1, description="bench A\n\tsecond line", reference_frame="ned",
                                         added_later={"kept": [1, "two"]}))
    assert session.selected == 1 and session.description == "bench A\n\tsecond line"
    assert session.reference_frame == "ned" and dict(session.extra) == {"added_later": {"kept": [1, "two"]}}


@pytest.mark.parametrize("top, message", [
    ({"format": None}, "session: not a Framewright session (its \"format\" is null, expected 'framewright-session')"),
    ({"format": 3}, "session: not a Framewright session (its \"format\" is a number, expected 'framewright-session')"),
    ({"format": "x" * 99},
     f"session: not a Framewright session (its \"format\" is '{'x' * 99}', expected 'framewright-session')"),
    ({"format": "x" * 100},
     "session: not a Framewright session (its \"format\" is text, expected 'framewright-session')"),
    ({"version": None}, 'session: "version" is missing or not a whole number'),
    ({"version": 3}, "session: written by a newer Framewright (format version 3; this one reads up to 2)"),
    ({"version": 0}, "session: format version 0 is not valid"),
    ({"mounts": None}, "session: mounts: expected a list of at least one mount"),
    ({"mounts": []}, "session: mounts: expected a list of at least one mount"),
    ({"mounts": {"name": "a"}}, "session: mounts: expected a list of at least one mount"),
    ({"selected": 2}, "session: selected: expected a mount index 0..1, got 2"),
    ({"selected": -1}, "session: selected: expected a mount index 0..1, got -1"),
    ({"selected": 1.0}, "session: selected: expected a mount index 0..1, got 1.0"),
    ({"selected": "1"}, "session: selected: expected a mount index 0..1, got text"),
    ({"description": 5}, "session: description: expected text, got a number"),
    ({"description": "a\x00b"},
     "session: description: the text holds a control character U+0000 at character 2; expected plain text"),
    ({"reference_frame": "NED"},
     "session: reference_frame: expected one of enu, ned, vehicle, aircraft, camera, got 'NED'"),
])
def test_a_damaged_top_level_field_is_refused_word_for_word(top, message):
    assert refusal(document(**top)) == message


def test_a_top_level_that_is_not_an_object_is_refused():
    assert refusal([document()]) == "session: expected a JSON object at the top level"


def test_the_refusal_names_the_source_it_was_given():
    with pytest.raises(SessionFileError) as refused:
        session_from_dict(document(selected=5), source="bench.fwsession.json")
    assert str(refused.value) == "bench.fwsession.json: selected: expected a mount index 0..1, got 5"
