"""Expressions: what each accepted text evaluates to and the exact words of every refusal, with the limits
(length, the '${...}' wrapper, division by zero, overflow) tested from both sides.

Check values: Python's math module and plain float arithmetic (usual precedence, left to right: common
practice); the refusal words are the module's own; the 200-character limit is its documented limit."""

import math

import pytest

from core.decode.expressions import evaluate
from core.errors import DecodeError

ONLY = "only numbers, pi, + - * / and parentheses are"


def refusal(text):
    with pytest.raises(DecodeError) as err:
        evaluate(text)
    return str(err.value)


@pytest.mark.parametrize("text, value", [
    ("Pi", math.pi), ("Pi/2", math.pi / 2), ("+2", 2.0), ("-+-2", 2.0), ("2*-3", -6.0), ("--1", 1.0),
    ("1.", 1.0), (".5", 0.5), ("1E+3", 1000.0), ("1e-3", 0.001), ("2-3+4", 3.0), ("2/4*3", 1.5),
    ("6/3/2", 1.0), ("1+2*3-4/2", 5.0), ("  ${  pi / 4 }  ", math.pi / 4), ("1/1e-300", 1 / 1e-300),
    ("3*-pi/4", -3 * math.pi / 4), ("2*π", 2 * math.pi),
])
def test_values(text, value):
    assert evaluate(text) == value        # exact: same float operations in the same order


def test_two_hundred_characters_are_read_and_two_hundred_and_one_refused():
    assert evaluate("0" * 199 + "1") == 1.0
    assert evaluate("${" + "0" * 199 + "1}") == 1.0          # the wrapper does not count
    assert evaluate("   " + "0" * 199 + "1   ") == 1.0       # nor the spaces around
    assert refusal("0" * 200 + "1") == "an expression of 201 characters is too long to be an angle (at most 200)"
    assert refusal("${" + "0" * 200 + "1}") == ("an expression of 201 characters is too long to be an angle"
                                                " (at most 200)")


@pytest.mark.parametrize("bad, name", [(3, "int"), (None, "NoneType"), (b"pi", "bytes")])
def test_text_that_is_not_a_string(bad, name):
    assert refusal(bad) == f"expected an expression as text, got {name}"


def test_a_wrapper_without_its_closing_brace():
    assert refusal("${pi") == "'${pi': the '${' has no closing '}'"
    assert refusal("  ${-pi/2 ") == "'${-pi/2': the '${' has no closing '}'"


@pytest.mark.parametrize("text, message", [
    ("foo", f"'foo' is a name Framewright does not evaluate; {ONLY}"),
    ("foo + 1", f"'foo' in 'foo + 1' is a name Framewright does not evaluate; {ONLY}"),
    ("foo.", f"'foo' in 'foo.' is an attribute Framewright does not evaluate; {ONLY}"),
    ("2*f (1)", f"'f' in '2*f (1)' is a function Framewright does not evaluate; {ONLY}"),
    ("pI", f"'pI' is a name Framewright does not evaluate; {ONLY}"),
    ("1e", f"'e' in '1e' is a name Framewright does not evaluate; {ONLY}"),
    ("a" * 30, f"'{'a' * 23}…' is a name Framewright does not evaluate; {ONLY}"),
    ("x+" + "1" * 45, f"'x' in '{('x+' + '1' * 45)[:39]}…' is a name Framewright does not evaluate; {ONLY}"),
])
def test_names_are_refused_saying_what_they_are(text, message):
    assert refusal(text) == message


@pytest.mark.parametrize("text, token", [("1 @ 2", "@"), ("1,5", ","), ("$", "$"), ("[1]", "[")])
def test_a_character_outside_the_arithmetic(text, token):
    assert refusal(text) == (f"'{token}' in '{text}' is not part of the arithmetic Framewright evaluates"
                             " (numbers, pi, + - * / and parentheses)")


def test_a_power_in_a_long_text_is_named_with_the_text_shortened():
    text = "2**" + "1" * 50
    assert refusal(text) == (f"'{text[:39]}…': '**' (a power) is not evaluated; Framewright evaluates numbers,"
                             " pi, + - * / and parentheses only")


@pytest.mark.parametrize("text, message", [
    ("1 2", "'1 2': unexpected '2'"),
    ("1)", "'1)': unexpected ')' (a ')' without its '(')"),
    ("(1))", "'(1))': unexpected ')' (a ')' without its '(')"),
    ("(1)(2)", "'(1)(2)': unexpected '('"),
    ("1+", "'1+' ends where a number is expected"),
    ("(", "'(' ends where a number is expected"),
    ("-", "'-' ends where a number is expected"),
    ("()", "'()' has empty parentheses"),
    ("(1", "'(1': a '(' has no closing ')'"),
    ("((1)", "'((1)': a '(' has no closing ')'"),
    ("*2", "'*2': '*' where a number is expected"),
    (")", "')': ')' where a number is expected"),
    ("1/0", "'1/0' divides by zero"),
    ("1/-0.0", "'1/-0.0' divides by zero"),
    ("${1/(2-2)}", "'${1/(2-2)}' divides by zero"),
    ("1e308*10", "'1e308*10' has no finite value"),
    ("${1e308*10}", "'${1e308*10}' has no finite value"),
    ("-1e308-1e308", "'-1e308-1e308' has no finite value"),
    ("1/1e-309", "'1/1e-309' has no finite value"),
])
def test_malformed_arithmetic(text, message):
    assert refusal(text) == message


def test_zero_is_refused_as_a_divisor_only():
    assert evaluate("0/5") == 0.0
    assert evaluate("0*5") == 0.0
    assert evaluate("5*0") == 0.0
    assert evaluate("5/1e-300") == 5 / 1e-300


def test_a_long_text_is_shortened_in_the_refusal():
    text = "1+" * 30 + "1)"
    assert refusal(text) == f"'{text[:39]}…': unexpected ')' (a ')' without its '(')"


def test_the_depth_limit_counts_open_groups_after_a_flat_run_too():
    # 31 open groups around a number are within the limit of 32 (the number is the 32nd), however many
    # numbers were read and closed on the way in; 32 groups are refused (worked by hand: 13 terms of 1)
    ones = "1+" * 12
    assert evaluate("(" * 16 + ones + "(" * 15 + "1" + ")" * 31) == 13.0
    message = refusal("(" * 16 + ones + "(" * 16 + "1" + ")" * 32)
    assert message.endswith("nests more than 32 deep; write the value instead")
    assert evaluate("-" * 10 + "(" * 10 + ones + "(" * 11 + "1" + ")" * 21) == 13.0
    assert "nests more than 32 deep" in refusal("-" * 10 + "(" * 10 + ones + "(" * 12 + "1" + ")" * 22)
