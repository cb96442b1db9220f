"""A sign standing apart from an expression ('0, - pi/2, 0') keeps it negative, as it does for a plain
number ('- 0.5'); before a bracket ('- (pi/2)', '- (1, 2, 3)') it may be a sign or a bullet, and is refused.
Before this was pinned, '- pi/2' and '- (0.5)' lost their minus sign: a wrong angle with no refusal.

Check values: Python's math module; the note and refusal words are the module's own."""

import math

import pytest

from core.decode import parse_numbers
from core.errors import DecodeError

JOINED = "line 1: a sign separated from its number by a space was read as its sign"


@pytest.mark.parametrize("text, values", [
    ("0, - pi/2, 0", [0.0, -math.pi / 2, 0.0]),
    ("0, + pi/2, 0", [0.0, math.pi / 2, 0.0]),
    ("0, - M_PI, 0", [0.0, -math.pi, 0.0]),
    ("0, - π/2, 0", [0.0, -math.pi / 2, 0.0]),
    ("0, - PI/4, 0", [0.0, -math.pi / 4, 0.0]),
    ("yaw = - Pi", [-math.pi]),
    ("a = - 0.5", [-0.5]),
])
def test_a_detached_sign_stays_with_its_value(text, values):
    parsed = parse_numbers(text)
    assert [n.value for n in parsed.numbers] == values
    assert JOINED in parsed.notes


@pytest.mark.parametrize("text", ["0, -pi/2, 0", "0 -(pi/2) 0"])
def test_an_attached_sign_needs_no_note(text):
    parsed = parse_numbers(text)
    assert [n.value for n in parsed.numbers] == [0.0, -math.pi / 2, 0.0]
    assert JOINED not in parsed.notes


@pytest.mark.parametrize("text", ["0 - pitch 0", "roll - pitch 1 2 3", "x - pi_offset 1 2"])
def test_a_dash_before_a_word_is_not_a_sign(text):
    parsed = parse_numbers(text)
    assert all(n.value >= 0 for n in parsed.numbers)
    assert JOINED not in parsed.notes


@pytest.mark.parametrize("text, shown, sign", [
    ("0, - (pi/2), 0", "- (pi", "-"),
    ("0, - (0.5), 0", "- (0", "-"),
    ("- (1, 2, 3)", "- (1", "-"),
    ("0, + ((2*pi)), 0", "+ ((2", "+"),
])
def test_a_detached_sign_before_a_bracket_is_refused(text, shown, sign):
    with pytest.raises(DecodeError) as err:
        parse_numbers(text)
    assert str(err.value) == (f"line 1: '{shown}': a '{sign}' stands apart before a bracket; Framewright will not"
                              " guess whether it is the value's sign: write it against the value or leave it out")


def test_a_dash_before_a_bracket_of_words_is_left_alone():
    assert [n.value for n in parse_numbers("- (front) 1 2 3").numbers] == [1.0, 2.0, 3.0]


SPACED = ("has a + or - between spaces next to an expression; Framewright will not guess whether it is arithmetic or"
          " two values: write it without spaces ('pi/2-0.1') or paste the values")


@pytest.mark.parametrize("text, shown", [
    ("pi/2 + 1, 0, 0", "pi/2 + 1, 0, 0"),          # was read as four numbers: a quaternion
    ("0 0 pi/2 - 0.1", "0 0 pi/2 - 0.1"),
    ("1 - pi/2, 0, 0", "1 - pi/2, 0,"),
    ("(pi/2) - 1 0 0", "(pi/2) - 1 0 0"),
    ("1 + 2*3 0 0", "1 + 2*3 0 0"),
    ("0 - M_PI 0", "0 - M_PI 0"),                  # arithmetic (0 - pi) or a list (0, -pi)?
])
def test_a_spaced_sign_beside_an_expression_is_refused(text, shown):
    with pytest.raises(DecodeError) as err:
        parse_numbers(text)
    assert str(err.value) == f"line 1: '{shown}' {SPACED}"


@pytest.mark.parametrize("text, values", [
    ("pi/2 +1, 0, 0", [math.pi / 2, 1.0, 0.0, 0.0]),       # a sign against its number: a list
    ("M_PI/2 -M_PI/2 0", [math.pi / 2, -math.pi / 2, 0.0]),
    ("1 - 2, 3", [1.0, -2.0, 3.0]),                        # no expression: the plain-number rule
    ("x (m) - 1.5 0 0", [-1.5, 0.0, 0.0]),
    ('rpy="${-pi/2 + pi/4} 0 0"', [-math.pi / 2 + math.pi / 4, 0.0, 0.0]),   # inside the wrapper it is arithmetic
])
def test_what_is_not_a_spaced_sign_beside_an_expression(text, values):
    assert [n.value for n in parse_numbers(text).numbers] == values
