"""The number of decimals an export asks for: a whole number from 0 to 17, both ends accepted, one past
each end refused with words that name the limit."""

import pytest

from core.errors import FramewrightError
from core.format_options import FormatOptions


@pytest.mark.parametrize("decimals", [0, 1, 16, 17, None])
def test_decimals_from_0_to_17_or_none_are_accepted(decimals):
    assert FormatOptions(decimals=decimals).checked().decimals == decimals


@pytest.mark.parametrize("decimals", [-1, 18, 2.0, "3", True, False])   # a bool is an int to Python: refused by name
def test_decimals_outside_0_to_17_or_not_whole_are_refused(decimals):
    with pytest.raises(FramewrightError, match=r"decimals must be a whole number from 0 to 17, got "):
        FormatOptions(decimals=decimals).checked()
