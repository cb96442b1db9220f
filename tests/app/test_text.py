"""app/text.py on hostile values: not-a-number, infinities, negative zero, the largest and the tiniest
doubles. Nothing prints '-0', nothing huge is written out digit by digit, nothing non-finite passes for
a number."""

import math
import random
import re

import pytest

from app import text

MINUS = "\u2212"
HOSTILE = (math.nan, math.inf, -math.inf, -0.0, 0.0, 1e300, -1e300, 1e-300, -1e-300, 5e-324, 1.7976931348623157e308)


def test_negative_zero_and_tiny_values_never_print_a_signed_zero():
    for value in (-0.0, -1e-300, -5e-324, -4e-4):
        assert text.fixed(value, 3) == "0.000"
        assert text.degrees(value) == "0.000\u00b0"
        assert text.degrees(value, signed=True) == "0.000\u00b0"    # zero carries no sign, not even '+'
    assert text.significant(-0.0, 6) == "0" and text.significant(-1e-300, 6) == "0"
    assert text.compact(-0.0) == "0"
    assert text.vector((-0.0, -1e-300, 0.0)) == "(0.0000, 0.0000, 0.0000)"


def test_tiny_values_are_dust_for_a_field_but_kept_for_reading():
    assert text.significant(1e-300, 6) == "0"                 # below 1e-9: round-off of a zero
    assert text.significant(1e-300, 6, dust=0.0) == "1e-300"
    assert text.compact(1e-300) == f"1e{MINUS}300"            # compact takes no dust off
    assert text.compact(-2.5e-7, 3) == f"{MINUS}2.5e{MINUS}07"


def test_huge_values_are_written_with_an_exponent_not_three_hundred_digits():
    assert text.fixed(1e300, 3) == "1.000e+300"
    assert text.fixed(-1e300, 3) == f"{MINUS}1.000e+300"
    assert text.degrees(1e300, signed=True) == "+1.000e+300\u00b0"
    assert text.significant(1e300, 6) == "1e+300"
    assert text.vector((1e300, -1e300, 1.0), 2) == f"(1.00e+300, {MINUS}1.00e+300, 1.00)"
    # just below the switch a figure is still written in full, as before
    assert text.fixed(123456789012345.0, 1) == "123456789012345.0"


def test_non_finite_values_are_spelled_and_never_look_like_numbers():
    assert text.fixed(math.nan, 3) == "nan" and text.degrees(math.nan) == "nan\u00b0"
    assert text.fixed(math.inf, 3) == "inf" and text.fixed(-math.inf, 3) == f"{MINUS}inf"
    assert text.fixed(math.inf, 3, signed=True) == "+inf"
    assert text.significant(math.nan, 6) == "nan" and text.significant(-math.inf, 6) == "-inf"
    assert text.compact(-math.inf) == f"{MINUS}inf"
    assert text.numbers((math.nan, 1.0), 6) == "nan, 1"


@pytest.mark.parametrize("value", HOSTILE)
def test_no_hostile_value_makes_a_long_line(value):
    for shown in (text.fixed(value, 6), text.fixed(value, 6, signed=True), text.degrees(value, 6),
                  text.significant(value, 17), text.compact(value, 17)):
        assert len(shown) <= 25, shown
        assert re.fullmatch(f"[-+{MINUS}]0(\\.0*)?\u00b0?", shown) is None, shown   # no signed zero


def test_the_width_is_kept_when_the_sign_of_a_zero_is_dropped():
    # the overlay's matrix rows line up in columns of seven characters
    assert text.fixed(-1e-9, 4, width=7) == " 0.0000"
    assert text.fixed(-0.5, 4, width=7) == f"{MINUS}0.5000"
    assert text.fixed(0.25, 4, width=7) == " 0.2500"


def test_signed_figures_and_the_typographic_minus():
    assert text.degrees(0.2, signed=True) == "+0.200\u00b0"
    assert text.degrees(-0.2, signed=True) == f"{MINUS}0.200\u00b0"
    assert text.fixed(-0.0004, 3, signed=True) == "0.000"      # rounds to zero: no sign
    assert text.significant(-12.5, 6) == "-12.5"                # a field's text stays ASCII: it is typed again


def test_seventeen_significant_digits_read_back_as_the_same_double():
    # common practice (IEEE 754): 17 significant decimal digits identify every double
    rng = random.Random(7)
    for _ in range(2000):
        value = rng.uniform(-1, 1) * 10.0 ** rng.uniform(-8, 8)
        assert float(text.significant(value, 17)) == value
