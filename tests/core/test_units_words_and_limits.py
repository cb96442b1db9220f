"""Units: what is read and said back word for word, the refusals of each reader (naming the input and
the unit), the 80-character limit from both sides, and the formatters' refusals and given decimals.

Check values: 1 mrad = 180/(1000 pi)°, 1 in = 25.4 mm exactly, a NATO mil is 1/6400 of a turn and a
slope in percent is 100 tan(tilt) (handbook facts, common practice); 10° 30′ = 10.5° (hand-worked)."""

import math

import pytest

from core.errors import InvalidInputError
from core.units import (MAX_TEXT_CHARS, angle_unit, format_angle, format_dms, format_length, format_slope,
                        length_unit, read_angle, read_length, slope_unit)


@pytest.mark.parametrize("reader, key, words", [
    (angle_unit, "parsec", "unknown angle unit 'parsec'; expected one of deg, dms, rad, mrad, arcmin, arcsec, gon, mil"),
    (length_unit, "furlong", "unknown length unit 'furlong'; expected one of mm, m, in, thou"),
    (slope_unit, "x", "unknown slope unit 'x'; expected one of deg, mm/m, um/m, in/ft, percent")])
def test_an_unknown_unit_is_refused_with_the_list_of_known_ones(reader, key, words):
    with pytest.raises(InvalidInputError) as raised:
        reader(key)
    assert str(raised.value) == words


def test_what_was_read_is_said_back_plain_for_degrees_and_with_the_text_for_another_unit():
    assert read_angle("12.5").said == "12.5°"
    assert read_angle("12.5 deg").said == "12.5°"
    mrad = read_angle("1.5 mrad")
    assert mrad.degrees == pytest.approx(1.5 * 180 / (1000 * math.pi), rel=1e-15)
    assert mrad.said == "1.5 mrad = 0.085943669°"          # nine decimals, trailing zeros dropped
    assert read_angle("10° 30′").said == "10° 30′ = 10.5°"
    assert read_angle("1.5 MRAD").unit == "mrad"            # marks in any case
    mil = read_angle("2 nato  mils")                        # spaces inside a mark are one space
    assert (mil.unit, mil.degrees) == ("mil", pytest.approx(2 * 360 / 6400))


def test_an_en_dash_reads_as_a_minus():
    assert read_angle("\u20131.5 mrad").degrees == pytest.approx(-1.5 * 180 / (1000 * math.pi))


@pytest.mark.parametrize("text, words", [
    ("3 5 parsec", "'3 5 parsec': 'parsec' is not an angle unit; expected one of ° deg, rad, mrad, ′ arcmin, "
                   "″ arcsec, gon, mil"),
    ("1e999 mrad", "'1e999 mrad': 1e999 is beyond the range of a number"),
    ("1e999° 30′", "'1e999° 30′': 1e999 is beyond the range of a number"),
    ("10° 75′", "'10° 75′': 75 arcminutes is 60 or more; carry it into the degrees"),
    ("1°30′75″", "'1°30′75″': 75 arcseconds is 60 or more; carry it into the arcminutes"),
    ("10° 30′ 5 mrad", "'10° 30′ 5 mrad': mixes arcminutes and degrees and milliradians; write one angle in one "
                       "unit (only degrees, minutes and seconds combine, as 1°30′15″)"),
    ("x" * 30, f"'{'x' * 30}': cannot read '{'x' * 20}' as a number with a unit mark (e.g. 0.5 mrad, 30″, 1°30′, "
               "2 gon)"),
    (5, "expected an angle as text, got int"),
    (None, "expected an angle as text, got NoneType"),
    (" " * 77 + "1.5", None)])
def test_angle_refusals_word_for_word(text, words):
    if words is None:                                       # 80 characters: still read
        assert len(text) == MAX_TEXT_CHARS and read_angle(text).degrees == 1.5
        return
    with pytest.raises(InvalidInputError) as raised:
        read_angle(text)
    assert str(raised.value) == words


def test_an_angle_of_81_characters_is_refused_with_its_length():
    with pytest.raises(InvalidInputError) as raised:
        read_angle(" " * 78 + "1.5")
    assert str(raised.value) == "an angle of 81 characters; expected at most 80"


@pytest.mark.parametrize("text, words", [
    (5, "expected a length as text, got int"),
    ("3 furlong", "'3 furlong': 'furlong' is not a length unit; expected one of mm, m, in, thou"),
    ("1e999 mm", "'1e999 mm': 1e999 is beyond the range of a number")])
def test_length_refusals_word_for_word(text, words):
    with pytest.raises(InvalidInputError) as raised:
        read_length(text)
    assert str(raised.value) == words


def test_formatters_refuse_what_is_not_finite_by_name():
    for call, words in ((lambda: format_angle(math.nan, "deg"), "not a finite angle: nan"),
                        (lambda: format_dms(math.inf), "not a finite angle: inf"),
                        (lambda: format_length(math.nan, "mm"), "not a finite length: nan"),
                        (lambda: format_slope(math.nan, "percent"), "a tilt of nan° has no finite slope")):
        with pytest.raises(InvalidInputError) as raised:
            call()
        assert str(raised.value) == words


def test_formatters_use_the_unit_decimals_unless_given_and_the_percent_sign_sits_on_the_number():
    assert format_length(25.4, "in") == "1 in"
    assert format_length(1.5, "mm") == "1.5 mm"
    assert format_angle(10.5, "dms", decimals=0) == "10° 30′ 0″"
    assert format_slope(1.0, "percent") == f"{100 * math.tan(math.radians(1.0)):.3f}%"


def test_given_decimals_win_over_the_units_own_and_dms_shows_its_own_one_decimal_otherwise():
    assert format_length(1.23456, "mm", decimals=2) == "1.23 mm"
    assert format_angle(10.5, "dms") == "10° 30′ 0.0″"


@pytest.mark.parametrize("text, quoted", [
    ("10° + 30′", "+ 30′"), ("10° ++30′", "++30′"), ("10 - 5", "- 5"), ("1°30′ − 15″", "− 15″"),
    ("12 mrad +", "+")])
def test_text_that_cannot_be_read_is_quoted_from_where_it_goes_wrong(text, quoted):
    """A sign parted from its number is what cannot be read: the message quotes from that sign, not from
    the middle of the number before it ('0° + 30′' in '10° + 30′' was one character late)."""
    with pytest.raises(InvalidInputError) as raised:
        read_angle(text)
    assert str(raised.value) == (f"{text!r}: cannot read {quoted!r} as a number with a unit mark (e.g. 0.5 mrad, "
                                 "30″, 1°30′, 2 gon)")
