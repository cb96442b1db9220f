"""Decode: an angle written as arithmetic ('pi/2', '${-M_PI/2}') is evaluated only within a small subset;
what lies outside it is refused with words that say what and why, and nesting has a limit on both sides.

Check values: worked by hand (31 minus signs negate 1 an odd number of times: -1; nested parentheses keep
the value); the limit of 32 nested parentheses or signs is this module's documented limit."""

import pytest

from core.decode.expressions import evaluate
from core.errors import DecodeError


def refusal(text):
    with pytest.raises(DecodeError) as err:
        evaluate(text)
    return str(err.value)


@pytest.mark.parametrize("text", ["", "   ", "${}", "${ }"])
def test_an_empty_expression_is_refused(text):
    assert refusal(text) == "an empty expression has no value"


def test_a_power_is_refused_naming_what_is_evaluated():
    assert refusal("2**3") == ("'2**3': '**' (a power) is not evaluated; Framewright evaluates numbers,"
                               " pi, + - * / and parentheses only")


@pytest.mark.parametrize("text, what", [
    ("sin(1)", "'sin' in 'sin(1)' is a function"),
    ("sin (1)", "'sin' in 'sin (1)' is a function"),
    ("math.pi", "'math' in 'math.pi' is an attribute"),
    ("foo", "'foo' is a name"),
])
def test_a_name_is_refused_saying_what_it_is(text, what):
    assert refusal(text) == (f"{what} Framewright does not evaluate; only numbers, pi, + - * / and parentheses"
                             " are")


def test_signs_nest_up_to_the_limit():
    assert evaluate("-" * 31 + "1") == -1.0          # worked by hand: an odd count of minus signs
    assert evaluate("-" * 30 + "1") == 1.0
    for n in (32, 33, 60):
        message = refusal("-" * n + "1")
        assert message.endswith("nests more than 32 deep; write the value instead"), n


def test_parentheses_nest_up_to_the_limit():
    assert evaluate("(" * 31 + "1.5" + ")" * 31) == 1.5
    assert "nests more than 32 deep" in refusal("(" * 32 + "1.5" + ")" * 32)
    # Depth is counted per nesting, not per factor: many side-by-side groups are fine.
    assert evaluate("+".join(["(1)"] * 40)) == 40.0
