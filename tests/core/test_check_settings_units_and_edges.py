"""Check settings' tolerance units (read, kept, changed, saved), the refusals of a body axis and of the
position tolerance word for word and at both ends of its range, and the deviation's axis and roll at the
edges: a negative scalar part, a roll of exactly a half turn, the zone where the roll cannot be told."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.check import (POSITION_TOLERANCE_LIMIT_MM, ROLL_UNDEFINED_RAD, CheckSettings, axis_vector,
                        deviation_axes, swing_twist_angles)
from core.errors import InvalidInputError


def test_a_tolerance_unit_is_kept_and_degrees_are_left_out():
    settings = CheckSettings(tolerance_units={"pointing": "mrad", "total": "deg"})
    assert settings.tolerance_units == (("pointing", "mrad"),)
    assert (settings.unit_of("pointing"), settings.unit_of("roll"), settings.unit_of("total")) == ("mrad", "deg", "deg")
    assert CheckSettings(tolerance_units=[("roll", "arcmin")]).unit_of("roll") == "arcmin"


def test_changing_one_tolerance_unit_keeps_the_others_and_degrees_remove_it():
    settings = CheckSettings(total_tolerance_deg=0.25, tolerance_units={"roll": "arcmin"})
    changed = settings.with_unit("pointing", "mrad")
    assert changed.tolerance_units == (("pointing", "mrad"), ("roll", "arcmin"))
    assert changed.total_tolerance_deg == 0.25
    assert changed.with_unit("pointing", "gon").tolerance_units == (("pointing", "gon"), ("roll", "arcmin"))
    assert changed.with_unit("roll", "deg").tolerance_units == (("pointing", "mrad"),)


def test_the_tolerance_units_are_saved_and_read_back():
    settings = CheckSettings(tolerance_units={"pointing": "mrad", "roll": "arcsec"})
    data = settings.to_dict()
    assert data["tolerance_units"] == {"pointing": "mrad", "roll": "arcsec"}
    assert CheckSettings.from_dict(data) == settings
    assert "tolerance_units" not in CheckSettings().to_dict()


@pytest.mark.parametrize("units, words", [
    ({"foo": "mrad"}, "tolerance units: 'foo' is no tolerance; expected total, pointing, roll"),
    ({"total": "parsec"}, "tolerance units: 'parsec' is no angle unit; expected one of deg, dms, rad, mrad, "
                          "arcmin, arcsec, gon, mil"),
    ([("total", "mrad"), ("total", "deg")], "tolerance units: a tolerance is named twice"),
    (5, "tolerance units: expected pairs of a tolerance and a unit, got 5")])
def test_tolerance_units_are_refused_word_for_word(units, words):
    with pytest.raises(InvalidInputError) as raised:
        CheckSettings(tolerance_units=units)
    assert str(raised.value) == words


def test_a_long_unreadable_tolerance_unit_is_cut_to_200_characters_in_the_message():
    with pytest.raises(InvalidInputError) as raised:
        CheckSettings(tolerance_units="x" * 300)
    assert len(str(raised.value)) == 200
    assert str(raised.value).startswith("tolerance units: expected pairs of a tolerance and a unit, got 'xxx")


@pytest.mark.parametrize("spec, words", [
    ("Q", "body axis: cannot read 'Q'; expected one of +X, -X, +Y, -Y, +Z, -Z or three numbers"),
    ([1, 2], "body axis: expected shape (..., 3), got (2,)")])
def test_a_body_axis_is_refused_word_for_word(spec, words):
    with pytest.raises(InvalidInputError) as raised:
        axis_vector(spec)
    assert str(raised.value) == words


def test_the_position_tolerance_range_includes_both_ends():
    assert CheckSettings(position_tolerance_mm=0).position_tolerance_mm == 0.0
    assert CheckSettings(position_tolerance_mm=POSITION_TOLERANCE_LIMIT_MM).position_tolerance_mm == 1e9
    for outside in (-1e-9, POSITION_TOLERANCE_LIMIT_MM * (1 + 1e-12)):
        with pytest.raises(InvalidInputError, match="position tolerance: expected a distance from 0 to 1e"):
            CheckSettings(position_tolerance_mm=outside)
    with pytest.raises(InvalidInputError) as raised:
        CheckSettings(position_tolerance_mm=[1])
    assert str(raised.value) == "position tolerance: expected a number of mm, got [1]"


def test_the_deviation_axis_of_a_negative_scalar_quaternion_is_scipys_rotation_vector_direction():
    # q and -q are one rotation; SciPy's as_rotvec takes the angle in [0, pi], the axis that goes with it.
    d = np.array([-0.8, 0.0, -0.36, -0.48])                       # (w, x, y, z), unit
    rotvec = Rotation.from_quat(d, scalar_first=True).as_rotvec()
    np.testing.assert_allclose(deviation_axes(d), rotvec / np.linalg.norm(rotvec), atol=1e-15)
    assert not np.signbit(deviation_axes(d)).any()               # no "-0" in the x of (0, 0.6, 0.8)


def test_a_half_turn_deviation_axis_keeps_its_sign():
    # w = 0: a half turn, SciPy's rotation vector is pi times the vector part as given.
    d = np.array([0.0, 0.6, 0.0, 0.8])
    rotvec = Rotation.from_quat(d, scalar_first=True).as_rotvec()
    np.testing.assert_allclose(deviation_axes(d), rotvec / np.pi, atol=1e-15)


@pytest.mark.parametrize("d", [(0.0, 0.0, 0.0, -1.0), (0.0, 0.0, 0.0, 1.0)])
def test_a_roll_of_a_half_turn_either_way_is_plus_180_degrees(d):
    # The roll is reported in (-180°, 180°] (common practice for a signed angle); SciPy gives the
    # magnitude of the rotation about +Z: pi.
    swing, twist, defined = swing_twist_angles(np.array(d), np.array([0.0, 0.0, 1.0]))
    assert Rotation.from_quat(d, scalar_first=True).magnitude() == pytest.approx(np.pi)
    assert twist == np.pi and swing == 0.0 and defined


def test_a_roll_of_nothing_from_a_negative_scalar_quaternion_is_a_plain_zero():
    _, twist, _ = swing_twist_angles(np.array([-1.0, 0.0, 0.0, 0.0]), np.array([0.0, 0.0, 1.0]))
    assert twist == 0.0 and not np.signbit(twist)


def test_the_roll_cannot_be_told_within_the_limit_of_a_flip_and_can_just_outside_it():
    # The rule the module states: the roll is defined when hypot(w, v·a) > ROLL_UNDEFINED_RAD / 2.
    axis = np.array([0.0, 0.0, 1.0])
    at = 0.5 * ROLL_UNDEFINED_RAD
    for along, told in ((at, False), (at * (1 + 1e-6), True)):
        d = np.array([along, np.sqrt(1 - along * along), 0.0, 0.0])
        assert bool(swing_twist_angles(d, axis)[2]) is told


def test_a_position_tolerance_given_as_a_numpy_number_is_kept_as_a_plain_float_that_saves_as_json():
    import json
    settings = CheckSettings(position_tolerance_mm=np.float32(0.5))
    assert type(settings.position_tolerance_mm) is float
    assert json.loads(json.dumps(settings.to_dict()))["position_tolerance_mm"] == 0.5


def test_pointing_and_roll_without_a_body_axis_is_refused_word_for_word():
    with pytest.raises(InvalidInputError) as raised:
        CheckSettings(mode="pointing_and_roll")
    assert str(raised.value) == "check mode 'pointing_and_roll' needs a body axis; expected body_axis such as '+Z'"
