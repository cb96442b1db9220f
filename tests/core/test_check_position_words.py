"""The position figure's line for a person, word for word on both sides of its tolerance, and the refusal
of what is not an Orientation and two Position values. Numbers: a 0.3, 0.4, 0 mm offset is 0.5 mm
(the 3-4-5 right triangle, hand-worked); the nominal is the identity, so body and reference axes agree."""

import pytest

from core.check import check_position
from core.errors import InvalidInputError
from core.orientation import Orientation
from core.position import Position

NOMINAL = Orientation.from_quaternion((1.0, 0.0, 0.0, 0.0))
AT = Position.from_shown((10.0, 20.0, 30.0), "mm")
MOVED = Position.from_shown((10.3, 20.4, 30.0), "mm")
AXES = "(x +0.300, y +0.400, z +0.000 mm along the nominal body axes)"


def test_a_position_within_its_tolerance_says_pass_within_and_the_margin():
    assert check_position(NOMINAL, AT, MOVED, 0.6).summary() == \
        f"PASS: position offset 0.500 mm within 0.600 mm (margin +0.100 mm) {AXES}"


def test_a_position_outside_its_tolerance_says_fail_exceeds_and_the_margin():
    assert check_position(NOMINAL, AT, MOVED, 0.4).summary() == \
        f"FAIL: position offset 0.500 mm exceeds 0.400 mm (margin -0.100 mm) {AXES}"


def test_a_position_without_a_tolerance_is_said_not_judged():
    assert check_position(NOMINAL, AT, MOVED).summary() == \
        f"position offset 0.500 mm {AXES}, not judged (no position tolerance)"


@pytest.mark.parametrize("args", [(NOMINAL, (0.01, 0.02, 0.03), MOVED), (NOMINAL, AT, "here"),
                                  ((1.0, 0.0, 0.0, 0.0), AT, MOVED)])
def test_what_is_not_an_orientation_and_two_positions_is_refused_by_name(args):
    with pytest.raises(InvalidInputError) as raised:
        check_position(*args)
    assert str(raised.value) == "check_position: expected an Orientation and two Position values"
