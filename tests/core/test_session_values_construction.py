"""The session's values built in code, as the app's panels build them: each one's defaults, the copies it
keeps of what it was given (so a caller's later edit cannot change it), and each refusal word for word.

Check values: the refusal words are the values' own (core/session_values.py); the bounds are the ones it
documents (box sides 0.001 to 1e6 mm, 3 to 17 significant digits, margins 0 < red < amber <= 90 degrees);
the unit quaternion (0.5, 0.5, 0.5, 0.5) is worked by hand (norm 1)."""

import pytest

from core.adjustment_setup import AdjustmentSetup
from core.chain import Chain
from core.check import CheckSettings
from core.errors import FramewrightError
from core.measurement import Measurement
from core.orientation import Orientation
from core.session import Mount, PartProperties, Preferences, SavedCheck, Session

QUARTER = Orientation.from_quaternion((0.5, 0.5, 0.5, 0.5))


def refusal(build) -> str:
    with pytest.raises(FramewrightError) as refused:
        build()
    return str(refused.value)


# --- PartProperties ---------------------------------------------------------------------------------------

def test_a_part_has_a_default_box_no_face_names_and_points_with_plus_z():
    part = PartProperties()
    assert part.box_size_mm == (100.0, 60.0, 40.0) and dict(part.face_names) == {} and part.boresight == "+Z"


def test_a_part_keeps_its_own_copy_of_the_face_names_and_floats_for_the_sizes():
    names = {"+Z": "lens"}
    part = PartProperties([10, 20, 30], names, "-X")
    names["+Z"] = "changed after"
    names["-Y"] = "added after"
    assert dict(part.face_names) == {"+Z": "lens"} and type(part.face_names) is dict
    assert part.box_size_mm == (10.0, 20.0, 30.0) and all(type(v) is float for v in part.box_size_mm)
    assert part.boresight == "-X"


@pytest.mark.parametrize("size", [(1e-3, 1e-3, 1e-3), (1e6, 1e6, 1e6), (1e-3, 5.0, 1e6)])
def test_box_sides_at_either_bound_are_kept(size):
    assert PartProperties(size).box_size_mm == size


@pytest.mark.parametrize("size", [(0.99e-3, 1, 1), (1, 1.01e6, 1), (1, 1, 0), (1, 1, -5), (1, 1), (1, 1, 1, 1)])
def test_a_box_side_outside_the_bounds_or_a_wrong_count_is_refused(size):
    assert refusal(lambda: PartProperties(size)) == \
        f"box size must be three positive numbers from 0.001 to 1e+06 mm, got {size!r}"


def test_a_face_name_on_an_unknown_face_or_a_bad_name_is_refused():
    assert refusal(lambda: PartProperties(face_names={"Z": "lens"})) == \
        "face name key 'Z' is not one of +X, -X, +Y, -Y, +Z, -Z"
    assert refusal(lambda: PartProperties(face_names={"+Y": "a\tb"})) == \
        "face +Y name: the name holds a control character U+0009 at character 2; expected plain text"
    assert PartProperties(face_names={"+Y": ""}).face_names == {"+Y": ""}      # an empty face name is allowed


def test_an_unknown_boresight_is_refused():
    assert refusal(lambda: PartProperties(boresight="Z")) == "boresight 'Z' is not one of +X, -X, +Y, -Y, +Z, -Z"


# --- Mount ------------------------------------------------------------------------------------------------

def test_a_mount_has_identity_a_default_part_no_notes_position_or_measurements():
    mount = Mount("camera")
    assert mount.orientation == Orientation.identity() and mount.part == PartProperties()
    assert (mount.notes, mount.position, mount.measurements) == ("", None, ())


def test_measurements_given_as_a_list_are_kept_as_a_tuple():
    one = Measurement(QUARTER, 2.0, "typed")
    given = [one]
    mount = Mount("camera", measurements=given)
    given.append(one)
    assert type(mount.measurements) is tuple and mount.measurements == (one,)
    assert mount == Mount("camera", measurements=(one,))
    assert mount.with_measurements([one, one]).measurements == (one, one)


def test_a_mount_refuses_a_bad_name_bad_measurements_a_bad_position_and_bad_notes():
    assert refusal(lambda: Mount("")) == "mount name: expected a non-empty name"
    assert refusal(lambda: Mount(None)) == "mount name: expected a name (text), got null"
    assert refusal(lambda: Mount("cam", measurements=("m",))) == \
        "mount 'cam' measurements: expected a tuple of Measurement"
    assert refusal(lambda: Mount("cam", measurements=[QUARTER])) == \
        "mount 'cam' measurements: expected a tuple of Measurement"
    assert refusal(lambda: Mount("cam", position=(0.0, 0.0, 0.0))) == \
        "mount 'cam' position: expected a Position or none"
    assert refusal(lambda: Mount("cam", notes="ring\x07")) == \
        "mount 'cam' notes: the text holds a control character U+0007 at character 5; expected plain text"
    assert Mount("cam", notes="two\nlines\tand a tab").notes == "two\nlines\tand a tab"


def test_a_mount_is_changed_only_into_a_new_one():
    mount = Mount("cam")
    assert mount.renamed("lens").name == "lens" and mount.name == "cam"
    assert mount.with_orientation(QUARTER).orientation == QUARTER and mount.orientation == Orientation.identity()


# --- Preferences ------------------------------------------------------------------------------------------

def test_preferences_defaults_and_their_dict():
    assert Preferences().to_dict() == {"angle_units": "deg", "quaternion_order": "wxyz",
                                       "matrix_meaning": "body_to_reference", "sequence": "ZYX", "intrinsic": True,
                                       "significant_digits": 9, "amber_margin_deg": 10.0, "red_margin_deg": 1.0}
    assert Preferences.from_dict({"sequence": "XYZ", "unknown": 1}) == Preferences(sequence="XYZ")


@pytest.mark.parametrize("digits", [3, 17])
def test_significant_digits_at_either_end_are_kept(digits):
    assert Preferences(significant_digits=digits).significant_digits == digits


@pytest.mark.parametrize("red, amber", [(1e-9, 2e-9), (89.9, 90), (0.5, 90)])
def test_margins_just_inside_their_bounds_are_kept(red, amber):
    assert (Preferences(red_margin_deg=red, amber_margin_deg=amber).red_margin_deg) == red


@pytest.mark.parametrize("keys, problem", [
    ({"angle_units": "dms"},
     "angle_units 'dms' (expected one of ('deg', 'rad', 'mrad', 'arcmin', 'arcsec', 'gon', 'mil'))"),
    ({"quaternion_order": "wzyx"}, "quaternion_order 'wzyx' (expected one of ('wxyz', 'xyzw'))"),
    ({"matrix_meaning": "either"},
     "matrix_meaning 'either' (expected one of ('body_to_reference', 'reference_to_body'))"),
    ({"sequence": "ZZZ"}, "sequence 'ZZZ' (expected one of the 12, e.g. 'ZYX')"),
    ({"intrinsic": 1}, "intrinsic 1 (expected true or false)"),
    ({"significant_digits": 2}, "significant_digits 2 (expected a whole number 3..17)"),
    ({"significant_digits": 18}, "significant_digits 18 (expected a whole number 3..17)"),
    ({"significant_digits": 9.0}, "significant_digits 9.0 (expected a whole number 3..17)"),
    ({"red_margin_deg": 0}, "margin thresholds red 0.0 / amber 10.0 (expected 0 < red < amber <= 90)"),
    ({"red_margin_deg": 10}, "margin thresholds red 10.0 / amber 10.0 (expected 0 < red < amber <= 90)"),
    ({"amber_margin_deg": 90.5}, "margin thresholds red 1.0 / amber 90.5 (expected 0 < red < amber <= 90)"),
    ({"amber_margin_deg": "ten"}, "margin thresholds must be numbers of degrees"),
    ({"red_margin_deg": None}, "margin thresholds must be numbers of degrees"),
])
def test_a_bad_preference_is_refused_word_for_word(keys, problem):
    assert refusal(lambda: Preferences(**keys)) == "preferences not valid: " + problem


def test_every_bad_preference_is_named_in_one_refusal():
    assert refusal(lambda: Preferences(quaternion_order="q", sequence="Q", significant_digits=1)) == (
        "preferences not valid: quaternion_order 'q' (expected one of ('wxyz', 'xyzw')); sequence 'Q' (expected "
        "one of the 12, e.g. 'ZYX'); significant_digits 1 (expected a whole number 3..17)")


# --- SavedCheck -------------------------------------------------------------------------------------------

def test_a_saved_check_has_no_mounts_default_settings_and_is_named_check():
    check = SavedCheck()
    assert (check.nominal, check.measured, check.settings, check.name, check.adjustment) == \
        (None, None, CheckSettings(), "check", AdjustmentSetup())
    assert check.to_dict() == {"name": "check", "nominal": None, "measured": None,
                               "settings": CheckSettings().to_dict()}


def test_a_saved_check_writes_its_adjustment_only_when_there_is_one_and_reads_it_back():
    check = SavedCheck("a", "b", CheckSettings(total_tolerance_deg=0.1), "mast", AdjustmentSetup(pivot=0, coverage=3.0))
    data = check.to_dict()
    assert data["adjustment"] == AdjustmentSetup(coverage=3.0).to_dict()
    assert SavedCheck.from_dict(data) == check
    assert SavedCheck.from_dict({}) == SavedCheck()


def test_a_saved_check_refuses_what_it_cannot_hold():
    assert refusal(lambda: SavedCheck(nominal=3)) == "check nominal: expected a mount name or null, got 3"
    assert refusal(lambda: SavedCheck(measured=["b"])) == "check measured: expected a mount name or null, got ['b']"
    assert refusal(lambda: SavedCheck(name="")) == "check name: expected a non-empty name"
    assert refusal(lambda: SavedCheck(settings={})) == "check settings: expected CheckSettings"
    assert refusal(lambda: SavedCheck(adjustment={})) == "check adjustment: expected AdjustmentSetup"
    assert refusal(lambda: SavedCheck.from_dict([])) == "expected a JSON object, got list"
    assert refusal(lambda: SavedCheck.from_dict({"nominal": "a", "tolerance": 1, "axis": 2})) == \
        "unknown key(s) axis, tolerance; expected name, nominal, measured, settings, adjustment"
    assert refusal(lambda: SavedCheck.from_dict({"name": 5})) == "name: expected text, got 5"


# --- Session ----------------------------------------------------------------------------------------------

def test_a_single_mount_session_and_its_defaults():
    session = Session.single()
    assert [m.name for m in session.mounts] == ["Mount 1"] and Session.single("rig").mounts[0].name == "rig"
    assert (session.selected, session.preferences, session.description, dict(session.extra),
            session.reference_frame, session.chains, session.checks) == \
        (0, Preferences(), "", {}, "enu", (), ())
    assert session.current_mount.name == "Mount 1"
    assert session.chain == Chain() and session.check == SavedCheck()


def test_a_session_keeps_tuples_and_shows_its_first_chain_and_check_and_its_selected_mount():
    chains = [Chain(name="first"), Chain(name="second")]
    checks = [SavedCheck(name="one"), SavedCheck(name="two")]
    session = Session([Mount("a"), Mount("b")], selected=1, chains=chains, checks=checks)
    assert type(session.mounts) is tuple and type(session.chains) is tuple and type(session.checks) is tuple
    assert session.current_mount.name == "b" and session.chain.name == "first" and session.check.name == "one"


@pytest.mark.parametrize("selected", [-1, 2])
def test_a_selection_outside_the_mounts_is_refused(selected):
    assert refusal(lambda: Session((Mount("a"), Mount("b")), selected=selected)) == \
        f"selected mount {selected} is outside 0..1"


def test_a_session_refuses_what_it_cannot_hold():
    assert refusal(lambda: Session(())) == "a session needs at least one mount"
    assert refusal(lambda: Session(("a",))) == "a session's mounts must each be a Mount"
    assert refusal(lambda: Session((Mount("a"),), reference_frame="up")) == \
        "reference frame 'up' is unknown; expected one of enu, ned, vehicle, aircraft, camera"
    assert refusal(lambda: Session((Mount("a"),), chains=({"name": "c"},))) == \
        "a session's chains must each be a Chain"
    assert refusal(lambda: Session((Mount("a"),), checks=(Chain(),))) == \
        "a session's checks must each be a SavedCheck"
    assert refusal(lambda: Session((Mount("a"),), extra={"checks": [], "chains": [], "kept": 1})) == \
        "chains, checks are fields of the session, not kept keys"
    assert refusal(lambda: Session((Mount("a"),), extra={"checks": []})) == \
        "checks are fields of the session, not kept keys"
