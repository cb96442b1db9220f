"""The arithmetic subset of issue 11 item 3: numbers, pi / PI / M_PI / π, unary minus, + - * /, parentheses
and the ${...} wrapper of description files, evaluated by a hand-written parser; everything else refused by
name. Expected values are computed here with Python's math module and plain float arithmetic (usual
precedence: * and / before + and -, left to right, common practice).
"""

import math
import re

import pytest

from core.decode.expressions import evaluate
from core.errors import DecodeError
from tests.plain_ids import plain_id

# (text, value computed with Python's math module)
VALUES = [
    ("0", 0.0),
    ("1.5", 1.5),
    ("-2", -2.0),
    ("1e-3", 1e-3),
    ("2.5E2", 250.0),
    ("pi", math.pi),
    ("PI", math.pi),
    ("M_PI", math.pi),
    ("π", math.pi),
    ("-pi", -math.pi),
    ("pi/2", math.pi / 2),
    ("-pi/2", -math.pi / 2),
    ("-M_PI/2", -math.pi / 2),
    ("PI/2", math.pi / 2),
    ("pi/4", math.pi / 4),
    ("π/6", math.pi / 6),
    ("2*pi", 2 * math.pi),
    ("pi*2", math.pi * 2),
    ("-pi/2 + pi/4", -math.pi / 2 + math.pi / 4),
    ("pi/180*30", math.pi / 180 * 30),
    ("30*pi/180", 30 * math.pi / 180),
    ("(pi)", math.pi),
    ("-(pi/2)", -(math.pi / 2)),
    ("-(-1)", 1.0),
    ("((1 + 2) * 3)", 9.0),
    ("1 - 2 - 3", (1 - 2) - 3),        # left to right
    ("8/4/2", (8 / 4) / 2),            # left to right
    ("2 + 3 * 4", 2 + 3 * 4),          # * before +
    ("(2 + 3) * 4", (2 + 3) * 4),
    ("0.1 + 0.05", 0.1 + 0.05),
    ("-0.2/2", -0.2 / 2),
    ("(0.5 - 0.1) * 2", (0.5 - 0.1) * 2),
    ("${pi/2}", math.pi / 2),
    ("${-M_PI/2}", -math.pi / 2),
    ("${ -M_PI / 2 }", -math.pi / 2),
    ("${0.5*pi}", 0.5 * math.pi),
    ("  pi / 3  ", math.pi / 3),
    ("3.14159", 3.14159),
    ("-0", 0.0),
    ("1/3", 1 / 3),
]


@pytest.mark.parametrize("text, value", VALUES, ids=[plain_id(t) for t, _ in VALUES])
def test_evaluates_the_subset(text, value):
    result = evaluate(text)
    assert isinstance(result, float)
    assert result == pytest.approx(value, rel=1e-15, abs=1e-15)


def test_the_value_table_is_large():
    assert len(VALUES) >= 25


# (text, what the message must name (case-insensitive, a word as a whole word; a tuple: any one of them))
REFUSED = [
    # names outside the subset
    ("x", "x"),
    ("yaw", "yaw"),
    ("tau", "tau"),
    ("e", "e"),
    ("M_PI_2", "M_PI_2"),
    ("pi2", "pi2"),
    ("camera_yaw * 2", "camera_yaw"),
    ("__import__", "__import__"),
    # calls
    ("sin(1)", "sin"),
    ("cos(0)", "cos"),
    ("sqrt(2)/2", "sqrt"),
    ("radians(30)", "radians"),
    ("__import__('os')", "__import__"),
    ("pi(2)", ("pi(", "call")),
    # powers
    ("2**3", "**"),
    ("pi**2", "**"),
    ("2^3", "^"),
    # attributes
    ("math.pi", "math.pi"),
    ("np.pi", "np.pi"),
    ("a.b", "a.b"),
    ("os.system('ls')", ("os.system", "os")),
    ("(1).real", "real"),
    # empty and unbalanced parentheses, empty input
    ("()", ("()", "empty")),
    ("pi*()", ("()", "empty")),
    ("(1+2", ("(", "parenthes")),
    ("1+2)", (")", "parenthes")),
    ("((pi)", ("(", "parenthes")),
    (")(", (")", "parenthes")),
    ("", "empty"),
    ("${}", ("${}", "empty")),
    ("${pi", ("${", "}")),
    # division by zero
    ("1/0", "zero"),
    ("pi/(1-1)", "zero"),
    ("0/0", "zero"),
    # malformed arithmetic
    ("1+", "+"),
    ("*2", "*"),
    ("1 2", "2"),
    ("1 // 2", "//"),
    ("1 % 2", "%"),
    ("1; 2", ";"),
    # non-finite values
    ("nan", "nan"),
    ("inf", "inf"),
    ("1e999", "1e999"),
    ("1e308*10", ("finite", "overflow", "range", "large")),
]


@pytest.mark.parametrize("text, named", REFUSED, ids=[plain_id(t) for t, _ in REFUSED])
def test_refuses_everything_outside_the_subset_by_name(text, named):
    with pytest.raises(DecodeError) as refused:
        evaluate(text)
    choices = named if isinstance(named, tuple) else (named,)
    assert any(_names(str(refused.value), c) for c in choices), f"{str(refused.value)!r} does not name {choices}"


def _names(message: str, token: str) -> bool:
    """A word-like token must appear as a whole word ('e' is not named by 'the'); others as written."""
    if re.fullmatch(r"\w+", token):
        return re.search(rf"(?<![\w]){re.escape(token)}(?![\w])", message, re.IGNORECASE) is not None
    return token.lower() in message.lower()


def test_ten_thousand_nested_parentheses_are_refused_not_a_recursion_error():
    # a hostile input must end in a DecodeError, never in Python's RecursionError (issue 11 item 3)
    text = "(" * 10_000 + "1" + ")" * 10_000
    with pytest.raises(DecodeError):
        evaluate(text)


def test_ten_thousand_nested_wrappers_are_refused_not_a_recursion_error():
    text = "-(" * 10_000 + "pi" + ")" * 10_000
    with pytest.raises(DecodeError):
        evaluate(text)


def test_a_long_chain_of_unary_minus_is_either_refused_or_exact():
    # 10,000 signs: an even count is +1; the parser may also refuse such depth, but never crash
    try:
        value = evaluate("-" * 10_000 + "1")
    except DecodeError:
        return
    assert value == 1.0


def test_a_long_flat_sum_is_either_refused_or_exact():
    # flat (not nested) input: 20,001 terms of 1; an iterative parser gets 20001, a capped one refuses
    try:
        value = evaluate("+".join(["1"] * 20_001))
    except DecodeError:
        return
    assert value == 20_001.0


def test_refuses_text_that_is_not_a_string():
    for bad in (None, 1.5, b"pi", ["pi"]):
        with pytest.raises(DecodeError):
            evaluate(bad)
