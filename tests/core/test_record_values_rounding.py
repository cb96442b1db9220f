"""How the record rounds a group of figures (core/record_values.printed_numbers): significant digits
counted from the group's largest on both sides of each power of ten, trailing zeros dropped only after a
decimal point, the sign kept on what stays non-zero. Check values: worked by hand, each named beside its
check (round half to even on the binary value, as Python's own formatting does)."""

import pytest

from core.record_values import printed_numbers


@pytest.mark.parametrize("values, digits, printed", [
    # the largest sets the decimals: 3 digits from 100 leave none, from 99.9 one
    ([100.0], 3, ("100",)),
    ([1000.0, 20.0], 3, ("1000", "20")),
    ([99.9, 0.04], 3, ("99.9", "0")),
    ([99.96], 3, ("100",)),            # 99.96 to one decimal is 100.0, then the zero is dropped
    ([10.0, 0.06], 2, ("10", "0")),    # 2 digits from 10: no decimals; 0.06 rounds to 0
    ([9.9, 0.06], 2, ("9.9", "0.1")),  # 2 digits from 9.9: one decimal
    ([0.5, 0.001234], 3, ("0.5", "0.001")),
    ([0.05, 0.001234], 3, ("0.05", "0.0012")),   # 3 digits from 0.05 (0.0500) leave four decimals
])
def test_the_decimals_follow_the_largest_figure_of_the_group(values, digits, printed):
    assert printed_numbers(values, digits) == printed


def test_the_largest_counts_by_its_size_whatever_its_sign():
    # worked by hand: 3 digits from |-250| leave no decimals
    assert printed_numbers([-250.0, 1.26], 3) == ("-250", "1")
    assert printed_numbers([-0.25, 0.125], 2) == ("-0.25", "0.12")   # 0.125 is exact in binary: half to even


def test_zeros_are_dropped_only_after_a_decimal_point():
    assert printed_numbers([120.0, 3.5], 4) == ("120", "3.5")
    assert printed_numbers([-2.50], 3) == ("-2.5",)
    assert printed_numbers([2.0, 1.0], 1) == ("2", "1")


def test_one_digit_and_many_digits():
    assert printed_numbers([0.123456789], 1) == ("0.1",)
    assert printed_numbers([1 / 3], 12) == ("0.333333333333",)
    # a figure given as an integer or as text reads as its number
    assert printed_numbers([3, "0.5"], 2) == ("3", "0.5")


def test_a_negative_that_rounds_to_zero_prints_as_plain_zero():
    assert printed_numbers([5.0, -0.04], 2) == ("5", "0")
    assert printed_numbers([5.0, -0.06], 2) == ("5", "-0.1")
