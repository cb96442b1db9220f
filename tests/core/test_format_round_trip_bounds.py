"""printed_precision_deg's bounds, worked by hand from its docstring: a number printed to d decimals is
off by at most step = 0.5e-d; JSON and the report decode by their quaternion (8 steps, in radians, as
degrees) whatever representation is chosen; angles printed in degrees by the other formats 4 steps in
degrees plus 4 in radians as degrees; exact printing 0."""

import math

import pytest

from core.formats import FormatOptions, printed_precision_deg

STEP = 0.5e-3                        # three decimals
QUATERNION_BOUND = 0.229183118052329  # worked by hand: 8 * 0.0005 rad = 0.004 rad = 0.2291831 deg
ANGLE_BOUND = 0.116591559026165       # worked by hand: 4 * 0.0005 deg + 0.002 rad (0.1145916 deg)


def test_the_hand_worked_bounds_are_what_they_say():
    # the two constants above from their formulas (180/pi degrees to a radian, common practice)
    assert QUATERNION_BOUND == pytest.approx(8 * STEP * 180 / math.pi, rel=1e-14)
    assert ANGLE_BOUND == pytest.approx(4 * STEP + 4 * STEP * 180 / math.pi, rel=1e-14)


@pytest.mark.parametrize("fmt", ["json", "report"])
def test_json_and_the_report_take_the_quaternion_bound_even_for_angles(fmt):
    options = FormatOptions(representation="angles", decimals=3)
    assert printed_precision_deg(fmt, options) == pytest.approx(QUATERNION_BOUND, rel=1e-12)


@pytest.mark.parametrize("fmt", ["text", "csv", "python"])
def test_angles_in_degrees_take_the_angle_bound_elsewhere(fmt):
    options = FormatOptions(representation="angles", decimals=3)
    assert printed_precision_deg(fmt, options) == pytest.approx(ANGLE_BOUND, rel=1e-12)
    assert printed_precision_deg(fmt, FormatOptions(representation="angles", decimals=3, degrees=False)) == \
        pytest.approx(QUATERNION_BOUND, rel=1e-12)
    assert printed_precision_deg(fmt, FormatOptions(representation="matrix", decimals=3)) == \
        pytest.approx(QUATERNION_BOUND, rel=1e-12)


def test_exact_printing_has_no_bound():
    assert printed_precision_deg("text", FormatOptions(representation="angles")) == 0.0
