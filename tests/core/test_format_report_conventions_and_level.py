"""Two report lines that used to come out wrong (core/format_report.py):

- with a number of decimals chosen, the conventions line lost its start, "Conventions: v_ref = R v_body
  (the columns of R are the body axes in reference coordinates);": the report no longer said what its
  matrix means (the string pieces before the condition were taken as its first branch alone);
- an axis left horizontal by rounding dust (−1.3e-14° after a 90° turn) printed as −0.000.

Expected words are the module's own; the elevations of a 90° turn about X are worked by hand (body Y
points up, body X and Z lie in the horizontal plane)."""

import math

import pytest

from core.formats import FormatOptions, render
from core.orientation import Orientation

QUARTER_ABOUT_X = Orientation.from_quaternion((math.sqrt(0.5), math.sqrt(0.5), 0.0, 0.0))
START = ("Conventions: v_ref = R v_body (the columns of R are the body axes in reference coordinates);"
         " Hamilton quaternion, w first, w not negative; angles in degrees;")


def line(text, start):
    found = [x for x in text.splitlines() if x.startswith(start)]
    assert len(found) == 1, text
    return found[0]


@pytest.mark.parametrize("decimals", [0, 3, 17])
def test_the_conventions_line_says_what_the_matrix_means_whatever_the_decimals(decimals):
    text = render(QUARTER_ABOUT_X, "report", FormatOptions(decimals=decimals))
    assert line(text, "Conventions:") == START + f" numbers printed to {decimals} decimals."
    assert not any(x.startswith(" ") and "Hamilton" in x for x in text.splitlines())


def test_the_conventions_line_with_the_default_decimals():
    text = render(QUARTER_ABOUT_X, "report")
    assert line(text, "Conventions:") == START + " the quaternion is printed exactly, other numbers to 10 decimals."


@pytest.mark.parametrize("down, words", [
    ((0, 0, -1), "+X 0.000, +Y 90.000, +Z 0.000"),
    ((0, 0, 1), "+X 0.000, +Y \u221290.000, +Z 0.000"),
])
def test_an_axis_horizontal_to_rounding_dust_reads_zero_without_a_minus(down, words):
    text = render(QUARTER_ABOUT_X, "report", FormatOptions(gravity_down=down))
    assert line(text, "    elevation above the horizontal: ") == "    elevation above the horizontal: " + words
