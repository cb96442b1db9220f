"""A session file's saved checks and mount chains as the loader reads them: what a file may leave out (and
the default it then gets), and each damaged field refused word for word by its place in the file, with a
value on each side of every bound.

Check values: the refusal words are the loader's own (core/session_reading.py); the tolerance bounds are
the ones core/check.py documents (angles 0 to 180 degrees, a position tolerance 0 to 1e9 mm, that is the
1,000 km reach of a position); the unit quaternion (0.5, 0.5, 0.5, 0.5) is worked by hand (norm 1)."""

import json

import pytest

from core.session import SessionFileError, session_from_dict, session_to_dict

IDENTITY = {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]}


def document(version=2, **top):
    """An invented two-mount session file, with the given top-level keys added."""
    data = {"format": "framewright-session", "version": version,
            "mounts": [{"name": "nominal", "orientation": IDENTITY},
                       {"name": "measured", "orientation": {"quaternion_wxyz": [0.5, 0.5, 0.5, 0.5]}}]}
    data.update(top)
    return json.loads(json.dumps(data))


def refusal(data) -> str:
    with pytest.raises(SessionFileError) as refused:
        session_from_dict(data)
    assert not refused.value.unexpected
    return str(refused.value)


def check_with(settings=None, version=2, **fields):
    entry = dict(fields)
    if settings is not None:
        entry["settings"] = settings
    return document(version, checks=[entry])


# --- checks -----------------------------------------------------------------------------------------------

def test_a_check_with_no_fields_reads_with_every_default():
    check = session_from_dict(check_with()).checks[0]
    assert check.name == "check" and check.nominal is None and check.measured is None
    settings = check.settings
    assert (settings.mode, settings.total_tolerance_deg, settings.pointing_tolerance_deg,
            settings.roll_tolerance_deg, settings.body_axis, settings.position_tolerance_mm,
            settings.tolerance_units) == ("total", 0.5, 0.5, 1.0, None, None, ())


def test_a_full_check_reads_every_field_it_holds():
    check = session_from_dict(check_with(
        {"mode": "pointing_and_roll", "total_tolerance_deg": 0.25, "pointing_tolerance_deg": 0.1,
         "roll_tolerance_deg": 2.0, "body_axis": "-Y", "position_tolerance_mm": 1.5,
         "tolerance_units": {"pointing": "mrad", "roll": "arcmin"}},
        name="mast check", nominal="nominal", measured="measured")).checks[0]
    assert (check.name, check.nominal, check.measured) == ("mast check", "nominal", "measured")
    s = check.settings
    assert (s.mode, s.total_tolerance_deg, s.pointing_tolerance_deg, s.roll_tolerance_deg) == \
        ("pointing_and_roll", 0.25, 0.1, 2.0)
    assert s.body_axis == "-Y" and s.position_tolerance_mm == 1.5
    assert s.unit_of("pointing") == "mrad" and s.unit_of("roll") == "arcmin" and s.unit_of("total") == "deg"


@pytest.mark.parametrize("units", [{"total": "mrad"}, {"pointing": "gon"}, {"roll": "arcsec"},
                                   {"total": "deg"}, {"total": "dms"}, {}])
def test_every_tolerance_may_state_its_unit(units):
    settings = session_from_dict(check_with({"tolerance_units": units})).checks[0].settings
    for name, unit in units.items():
        assert settings.unit_of(name) == unit


def test_a_check_saves_and_reads_back_with_its_units_and_its_axis_of_three_numbers():
    data = check_with({"mode": "pointing_and_roll", "body_axis": [0.0, 0.6, 0.8],
                       "tolerance_units": {"total": "mil"}}, nominal="nominal")
    session = session_from_dict(data)
    assert session.checks[0].settings.body_axis == (0.0, 0.6, 0.8)
    assert session_from_dict(json.loads(json.dumps(session_to_dict(session)))) == session


@pytest.mark.parametrize("entry, message", [
    ("check", "session: checks[0]: expected an object, got text"),
    ({"name": ""}, "session: checks[0].name: expected a non-empty name"),
    ({"name": 7}, "session: checks[0].name: expected a name (text), got a number"),
    ({"nominal": 3}, "session: checks[0].nominal: expected a name (text), got a number"),
    ({"measured": ["a"]}, "session: checks[0].measured: expected a name (text), got a list"),
    ({"measured": "bell\x07"},
     "session: checks[0].measured: the name holds a control character U+0007 at character 5; expected plain "
     "text"),
    ({"settings": []}, "session: checks[0].settings: expected an object, got a list"),
    ({"settings": {"mode": "both"}},
     "session: checks[0].settings.mode: expected one of total, pointing_and_roll, got 'both'"),
    ({"settings": {"mode": None}},
     "session: checks[0].settings.mode: expected one of total, pointing_and_roll, got null"),
    ({"settings": {"total_tolerance_deg": -1e-9}},
     "session: checks[0].settings.total_tolerance_deg: expected a tolerance in degrees of at least 0, got -1e-09"),
    ({"settings": {"pointing_tolerance_deg": "0.1"}},
     "session: checks[0].settings.pointing_tolerance_deg: expected a tolerance in degrees, got text"),
    ({"settings": {"roll_tolerance_deg": True}},
     "session: checks[0].settings.roll_tolerance_deg: expected a tolerance in degrees, got true"),
    ({"settings": {"position_tolerance_mm": -0.5}},
     "session: checks[0].settings.position_tolerance_mm: expected a tolerance in mm from 0 to 1e+09, got -0.5"),
    ({"settings": {"position_tolerance_mm": 1.0000001e9}},
     "session: checks[0].settings.position_tolerance_mm: expected a tolerance in mm from 0 to 1e+09, "
     "got 1000000100.0"),
    ({"settings": {"position_tolerance_mm": "1"}},
     "session: checks[0].settings.position_tolerance_mm: expected a tolerance in mm, got text"),
    ({"settings": {"tolerance_units": ["total", "mrad"]}},
     "session: checks[0].settings.tolerance_units: expected an object, got a list"),
    ({"settings": {"tolerance_units": {"yaw": "mrad"}}},
     "session: checks[0].settings.tolerance_units: expected one of total, pointing, roll, got 'yaw'"),
    ({"settings": {"tolerance_units": {"roll": "furlong"}}},
     "session: checks[0].settings.tolerance_units.roll: expected one of deg, dms, rad, mrad, arcmin, arcsec, gon, "
     "mil, got 'furlong'"),
    ({"settings": {"tolerance_units": {"roll": 3}}},
     "session: checks[0].settings.tolerance_units.roll: expected one of deg, dms, rad, mrad, arcmin, arcsec, gon, "
     "mil, got a number"),
    ({"settings": {"body_axis": [0, 0]}}, "session: checks[0].settings.body_axis: expected a list of 3 numbers"),
    ({"settings": {"body_axis": [0, "1", 0]}},
     "session: checks[0].settings.body_axis[1]: expected a number, got text"),
    ({"settings": {"body_axis": 3}}, "session: checks[0].settings.body_axis: expected a list of 3 numbers"),
    ({"settings": {"body_axis": ""}}, "session: checks[0].settings.body_axis: expected a non-empty name"),
    ({"settings": {"body_axis": "+Z\x1b"}},
     "session: checks[0].settings.body_axis: the name holds a control character U+001B at character 3; expected "
     "plain text"),
])
def test_a_damaged_check_is_refused_word_for_word(entry, message):
    assert refusal(document(checks=[entry])) == message


def test_the_second_damaged_check_is_named_by_its_own_index():
    data = document(checks=[{"name": "fine"}, {"settings": {"mode": "both"}}])
    assert refusal(data).startswith("session: checks[1].settings.mode: ")


@pytest.mark.parametrize("key", ["total_tolerance_deg", "pointing_tolerance_deg", "roll_tolerance_deg"])
@pytest.mark.parametrize("value", [0, 0.0, 180, 45.5])
def test_an_angle_tolerance_from_0_to_180_degrees_reads(key, value):
    assert getattr(session_from_dict(check_with({key: value})).checks[0].settings, key) == value


@pytest.mark.parametrize("value", [0, 0.0, 1e9, 12.5])
def test_a_position_tolerance_from_0_to_a_thousand_km_reads(value):
    assert session_from_dict(check_with({"position_tolerance_mm": value})).checks[0].settings \
        .position_tolerance_mm == value


def test_a_null_position_tolerance_reads_as_none_in_either_version():
    for version in (1, 2):
        settings = session_from_dict(check_with({"position_tolerance_mm": None}, version)).checks[0].settings
        assert settings.position_tolerance_mm is None


def test_a_position_tolerance_in_a_version_1_file_is_refused_as_newer_than_the_file():
    assert refusal(check_with({"position_tolerance_mm": 2.0}, version=1)) == (
        "session: checks[0].settings.position_tolerance_mm: a position tolerance needs format version 2; this "
        "file says version 1")


def test_a_named_body_axis_and_a_null_one_read():
    assert session_from_dict(check_with({"body_axis": "+X"})).checks[0].settings.body_axis == "+X"
    assert session_from_dict(check_with({"body_axis": None})).checks[0].settings.body_axis is None


def test_a_check_the_field_checks_pass_but_the_settings_refuse_names_the_check():
    # An angle tolerance over 180 degrees passes the loader's "at least 0" but not CheckSettings.
    message = refusal(check_with({"total_tolerance_deg": 181}))
    assert message.startswith("session: checks[0]: total tolerance deg: expected an angle from 0 to 180")


def test_checks_that_are_not_a_list_are_refused():
    assert refusal(document(checks={"name": "c"})) == "session: checks: expected a list, got an object"


def test_a_file_without_checks_or_chains_has_none():
    session = session_from_dict(document())
    assert session.checks == () and session.chains == ()


# --- chains -----------------------------------------------------------------------------------------------

def step(**fields):
    entry = {"name": "bracket", "orientation": IDENTITY}
    entry.update(fields)
    return entry


def test_a_chain_without_steps_or_name_reads_as_an_empty_chain_named_chain():
    chain = session_from_dict(document(chains=[{}])).chains[0]
    assert len(chain) == 0 and chain.name == "chain"
    chain = session_from_dict(document(chains=[{"name": "mast"}])).chains[0]
    assert len(chain) == 0 and chain.name == "mast"


def test_a_chain_step_reads_its_defaults_and_its_flags():
    chain = session_from_dict(document(chains=[{"name": "mast", "steps": [
        step(), step(name="", inverted=True, enabled=False),
        step(position={"metres": [0.0, 0.0, 0.25], "unit": "m"})]}])).chains[0]
    first, second, third = chain.steps
    assert (first.name, first.inverted, first.enabled, first.position) == ("bracket", False, True, None)
    assert (second.name, second.inverted, second.enabled) == ("", True, False)
    assert third.position.metres == (0.0, 0.0, 0.25) and third.position.unit == "m"


@pytest.mark.parametrize("chain, message", [
    ([], "session: chains[0]: expected an object, got a list"),
    ({"name": ""}, "session: chains[0].name: expected a non-empty name"),
    ({"name": None}, "session: chains[0].name: expected a name (text), got null"),
    ({"steps": None}, "session: chains[0].steps: expected a list, got null"),
    ({"steps": {"name": "s"}}, "session: chains[0].steps: expected a list, got an object"),
    ({"steps": ["s"]}, "session: chains[0].steps[0]: expected an object with name and orientation, got text"),
    ({"steps": [{"orientation": IDENTITY}]}, "session: chains[0].steps[0]: missing its name"),
    ({"steps": [step(name=1)]}, "session: chains[0].steps[0].name: expected a name (text), got a number"),
    ({"steps": [{"name": "s"}]},
     'session: chains[0].steps[0]: missing its orientation {"quaternion_wxyz": [w, x, y, z]}'),
    ({"steps": [step(), step(orientation={"quaternion_wxyz": [0, 0, 0, 0]})]},
     "session: chains[0].steps[1].orientation.quaternion_wxyz: expected a unit quaternion, its norm is 0 (the file "
     "may be damaged)"),
    ({"steps": [step(position={"metres": [0, 0, 2e6]})]},
     "session: chains[0].steps[0].position.metres[2]: expected a distance in metres from -1e+06 to 1e+06, got "
     "2000000.0"),
    ({"steps": [step(inverted="no")]}, "session: chains[0].steps[0].inverted: expected true or false, got text"),
    ({"steps": [step(enabled=1)]}, "session: chains[0].steps[0].enabled: expected true or false, got a number"),
    ({"steps": [step(enabled=None)]}, "session: chains[0].steps[0].enabled: expected true or false, got null"),
])
def test_a_damaged_chain_is_refused_word_for_word(chain, message):
    assert refusal(document(chains=[chain])) == message


def test_a_step_position_in_a_version_1_file_is_refused_as_newer_than_the_file():
    data = document(version=1, chains=[{"steps": [step(position={"metres": [0, 0, 0]})]}])
    assert refusal(data) == (
        "session: chains[0].steps[0].position: a position needs format version 2; this file says version 1 (the "
        "file may have been edited by hand)")


def test_chains_that_are_not_a_list_are_refused():
    assert refusal(document(chains="mast")) == "session: chains: expected a list, got text"


def test_a_chain_the_field_checks_pass_but_the_chain_refuses_names_the_chain():
    # Two steps of 0.6e6 m each reach 1.2e6 m, past the 1e6 m a position may be from the origin.
    far = {"metres": [6e5, 0, 0], "unit": "m"}
    message = refusal(document(chains=[{"name": "long", "steps": [step(position=far), step(position=far)]}]))
    assert message.startswith("session: chains[0]: chain 'long': its steps' positions add up to 1.2e+06 m")
