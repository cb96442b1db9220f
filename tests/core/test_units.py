"""core/units.py against the definitions of the units, round trips through every unit, text with unit
marks, and hostile text."""

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from core import units
from core.errors import InvalidInputError

# What one degree is in each unit, from the definitions:
# - SI Brochure, 9th edition (BIPM 2019), Table 4: 1° = (π/180) rad, 1′ = (1/60)°, 1″ = (1/60)′.
# - milliradian: 1 mrad = 10⁻³ rad (SI prefix milli, same brochure, Table 7).
# - gon: 1 gon = (π/200) rad, so 400 gon make a turn (ISO 80000-3, from memory; 1 gon = 0.9° as the issue says).
# - NATO mil: 6400 to a turn (common practice in artillery and optics; STANAG 2952 from memory).
ONE_DEGREE_IN = {
    "deg": 1.0,
    "dms": 1.0,
    "rad": math.pi / 180.0,
    "mrad": 1e3 * math.pi / 180.0,
    "arcmin": 60.0,
    "arcsec": 3600.0,
    "gon": 1.0 / 0.9,
    "mil": 6400.0 / 360.0,
}


@pytest.mark.parametrize("key", sorted(ONE_DEGREE_IN))
def test_one_degree_in_every_angle_unit_matches_its_definition(key):
    assert units.degrees_to(1.0, key) == pytest.approx(ONE_DEGREE_IN[key], rel=1e-15)
    assert units.to_degrees(ONE_DEGREE_IN[key], key) == pytest.approx(1.0, rel=1e-15)


def test_a_turn_in_each_unit():
    # 360° = 2π rad = 400 gon = 6400 NATO mils = 21 600′ = 1 296 000″ (the definitions above)
    turn = {"rad": 2 * math.pi, "gon": 400.0, "mil": 6400.0, "arcmin": 21600.0, "arcsec": 1296000.0,
            "mrad": 2000 * math.pi}
    for key, value in turn.items():
        assert units.degrees_to(360.0, key) == pytest.approx(value, rel=1e-15), key


def test_radians_agree_with_numpy():
    angles = np.linspace(-720, 720, 97)
    np.testing.assert_allclose(units.degrees_to(angles, "rad"), np.deg2rad(angles), rtol=1e-15, atol=0)


@pytest.mark.parametrize("key", sorted(units.ANGLE_UNITS))
@given(st.floats(min_value=-1e6, max_value=1e6, allow_nan=False).filter(lambda v: abs(v) > 1e-9))
def test_every_angle_unit_round_trips_to_1e_12(key, degrees):
    back = units.to_degrees(units.degrees_to(degrees, key), key)
    assert abs(back - degrees) <= 1e-12 * abs(degrees)


@pytest.mark.parametrize("key", sorted(units.LENGTH_UNITS))
@given(st.floats(min_value=-1e9, max_value=1e9, allow_nan=False).filter(lambda v: abs(v) > 1e-9))
def test_every_length_unit_round_trips_to_1e_12(key, millimetres):
    back = units.to_millimetres(units.millimetres_to(millimetres, key), key)
    assert abs(back - millimetres) <= 1e-12 * abs(millimetres)


def test_lengths_match_the_international_inch():
    # 1 in = 25.4 mm exactly (International Yard and Pound Agreement, 1959); 1 thou = 0.001 in.
    assert units.to_millimetres(1.0, "in") == pytest.approx(25.4, rel=1e-15)
    assert units.to_millimetres(1.0, "thou") == pytest.approx(0.0254, rel=1e-15)
    assert units.to_millimetres(1.0, "m") == pytest.approx(1000.0, rel=1e-15)
    assert units.read_length("3 thou") == (pytest.approx(0.0762, rel=1e-15), "thou")
    assert units.read_length('2"') == (pytest.approx(50.8, rel=1e-15), "in")
    assert units.read_length("4", "in") == (pytest.approx(101.6, rel=1e-15), "in")


def test_the_thou_and_the_nato_mil_say_which_they_are():
    assert "not the angular" in units.LENGTH_UNITS["thou"].note
    assert "6400" in units.ANGLE_UNITS["mil"].note and "inch" in units.ANGLE_UNITS["mil"].note


@pytest.mark.parametrize("key", sorted(units.SLOPE_UNITS))
@given(st.floats(min_value=-89.0, max_value=89.0, allow_nan=False))
def test_every_slope_unit_round_trips(key, tilt):
    back = units.slope_to_tilt(units.tilt_to_slope(tilt, key), key)
    assert abs(back - tilt) <= 1e-12 * max(abs(tilt), 1e-3)


def test_slopes_against_hand_worked_values():
    # tan(θ) per unit length: 1 mm over 1 m is atan(0.001) (hand-worked); 100 % grade is 45° (common
    # practice); 1/8 in per ft is atan(0.125/12).
    assert units.slope_to_tilt(1.0, "mm/m") == pytest.approx(math.degrees(math.atan(1e-3)), rel=1e-15)
    assert units.slope_to_tilt(100.0, "percent") == pytest.approx(45.0, rel=1e-15)
    assert units.slope_to_tilt(0.125, "in/ft") == pytest.approx(math.degrees(math.atan(0.125 / 12)), rel=1e-15)
    assert units.tilt_to_slope(units.slope_to_tilt(20.0, "um/m"), "mm/m") == pytest.approx(0.02, rel=1e-12)
    # A precision machinist's level reads 0.02 mm/m a division (common practice): about 4.1″.
    # Hand-worked: 0.02 mm/m = 2e-5 rad, times 206 264.806″ per radian (180·3600/π) = 4.12530″.
    assert units.degrees_to(units.slope_to_tilt(0.02, "mm/m"), "arcsec") == pytest.approx(4.12530, rel=1e-6)
    # A shim per 100 mm of base for a 1 mm/m slope is 0.1 mm (hand-worked).
    assert units.rise_over(units.slope_to_tilt(1.0, "mm/m"), 100.0) == pytest.approx(0.1, rel=1e-12)


@pytest.mark.parametrize("text, degrees, unit", [
    ("0.5 mrad", 0.5e-3 * 180 / math.pi, "mrad"),
    ("0.5mrad", 0.5e-3 * 180 / math.pi, "mrad"),
    ("30″", 30 / 3600, "arcsec"),
    ('30"', 30 / 3600, "arcsec"),
    ("30''", 30 / 3600, "arcsec"),
    ("12 arcsec", 12 / 3600, "arcsec"),
    ("1′30″", 1.5 / 60, "dms"),
    ("1'30\"", 1.5 / 60, "dms"),
    ("1°30′15″", 1 + 30 / 60 + 15 / 3600, "dms"),
    ("−1°30′", -1.5, "dms"),
    ("-0°30′", -0.5, "dms"),
    ("2 gon", 1.8, "gon"),
    ("2 grad", 1.8, "gon"),
    ("100 mil", 100 * 360 / 6400, "mil"),
    ("1e-3 rad", 1e-3 * 180 / math.pi, "rad"),
    ("45 arcmin", 0.75, "arcmin"),
    ("45′", 0.75, "arcmin"),
    ("  3 deg ", 3.0, "deg"),
    ("3°", 3.0, "deg"),
    ("1.5", 1.5, "deg"),
])
def test_angles_with_unit_marks_are_read(text, degrees, unit):
    read = units.read_angle(text)
    assert read.degrees == pytest.approx(degrees, rel=1e-14, abs=1e-300)
    assert read.unit == unit
    assert read.said                        # what was understood, for the person to confirm


def test_a_bare_number_takes_the_fields_own_unit():
    read = units.read_angle("0.5", "mrad")
    assert read.degrees == pytest.approx(0.5e-3 * 180 / math.pi, rel=1e-15) and read.unit == "mrad"
    assert units.read_angle("2 gon", "mrad").unit == "gon"       # a mark wins over the field's unit


@pytest.mark.parametrize("text, says", [
    ("1° 2 gon", "mixes"),
    ("1 mrad 30″", "mixes"),
    ("1′ 2′", "twice"),
    ("1″30′", "out of order"),
    ("1° 75′", "60 or more"),
    ("1° 30′ 60″", "60 or more"),
    ("1°−30′", "only the first part"),
    ("30 abc", "not an angle unit"),
    ("1 2", "needs its mark"),
    ("1,5", "decimal comma"),
    ("nan", "not a finite"),
    ("inf deg", "not a finite"),
    ("-Infinity", "not a finite"),
    ("1e400", "beyond the range"),
    ("", "nothing"),
    ("   ", "nothing"),
    ("′30", "cannot read"),
    ("1" * 200, "characters"),
    ("30\x00″", "not an angle unit"),
    ("30 mm", "not an angle unit"),
])
def test_bad_angle_text_is_refused_with_the_reason(text, says):
    with pytest.raises(InvalidInputError, match=says):
        units.read_angle(text)


def test_not_text_and_unknown_units_are_refused():
    with pytest.raises(InvalidInputError, match="as text"):
        units.read_angle(0.5)
    for call in (lambda: units.degrees_to(1.0, "furlong"), lambda: units.read_angle("1", "furlong"),
                 lambda: units.format_length(1.0, "cubit"), lambda: units.tilt_to_slope(1.0, "mm")):
        with pytest.raises(InvalidInputError, match="unknown"):
            call()
    with pytest.raises(InvalidInputError, match="not a length unit"):
        units.read_length("2 gon")
    with pytest.raises(InvalidInputError, match="one number"):
        units.read_length("2 in 3 mm")
    with pytest.raises(InvalidInputError):
        units.format_angle(float("nan"), "deg")


@pytest.mark.parametrize("degrees, shown", [
    (1.5041666666666667, "1° 30′ 15.0″"),
    (-1.5, "−1° 30′ 0.0″"),
    (0.999999, "1° 0′ 0.0″"),             # 59.9964″ rounds up and carries into the degree
    (59.99999 / 3600, "0° 1′ 0.0″"),
    (-1e-9, "0° 0′ 0.0″"),               # rounds to zero: no sign
    (0.0, "0° 0′ 0.0″"),
])
def test_degrees_minutes_seconds_carry_on_rounding(degrees, shown):
    assert units.format_dms(degrees) == shown


@given(st.floats(min_value=-1000, max_value=1000, allow_nan=False))
def test_dms_shown_reads_back_within_half_the_last_digit(degrees):
    back = units.read_angle(units.format_dms(degrees, 2).replace(" ", "")).degrees
    assert abs(back - degrees) <= 0.005 / 3600 * 1.0000001


@pytest.mark.parametrize("key", sorted(units.ANGLE_UNITS))
def test_every_shown_angle_reads_back_in_its_unit(key):
    degrees = 0.123456789
    shown = units.format_angle(degrees, key, decimals=12)
    read = units.read_angle(shown)
    assert read.degrees == pytest.approx(degrees, rel=1e-9)
    assert read.unit == key


def test_formatting_uses_the_unicode_minus_and_never_minus_zero():
    assert units.format_angle(-0.5, "deg") == "−0.5°"
    assert units.format_angle(-1e-12, "mrad") == "0 mrad"
    assert units.format_slope(0.05, "mm/m") == "0.873 mm/m"
    assert units.format_length(-25.4, "in") == "−1 in"


def test_positions_take_their_lengths_from_the_one_table_and_keep_metres():
    # the inch is exactly 25.4 mm (1959 international agreement); a thou is a thousandth of it (common practice)
    from core.position import LENGTH_UNITS as METRES_PER_UNIT, Position
    assert METRES_PER_UNIT == {"mm": 1e-3, "m": 1.0, "in": 0.0254, "thou": 0.0000254}
    place = Position.from_shown((10.0, -2.5, 0.125), "in")
    assert place.metres == pytest.approx((0.254, -0.0635, 0.003175), rel=1e-15)
    assert place.shown("thou") == pytest.approx((10000.0, -2500.0, 125.0), rel=1e-14)
    assert Position.from_dict(place.to_dict()) == place and place.to_dict()["unit"] == "in"
