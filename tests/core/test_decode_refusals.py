"""Nothing dropped, nothing silently misread: each class of text that the decoder used to read another
way (a NaN or a word dropped and the rest re-read, PI/2 read as 2, a 2x2 matrix read as a quaternion) is
refused with our DecodeError naming the token and its line. The property at the end inserts a foreign
token into every valid snippet of tests/core/test_decode_snippets.py."""

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from core.decode import DecodeError, decode, parse_numbers
from tests.core.test_decode_snippets import SNIPPETS
from tests.plain_ids import plain_id

# (text, what the message must name)
REFUSED = [
    # non-finite values
    ("q = [0.7071, NaN, 0.0, 0.7071]", "line 1: 'NaN'"),
    ("q = [0.7071, nan, 0.0, 0.7071]", "line 1: 'nan'"),
    ("inf 0 0 1", "line 1: 'inf'"),
    ("0 0 1 -inf", "line 1: '-inf'"),
    ("Infinity 0 0", "line 1: 'Infinity'"),
    ("yaw: 10\npitch: NaN\nroll: 0", "line 2: 'NaN'"),
    ("1e999 0 0", "line 1: '1e999'"),
    ("0 0 -1e999", "line 1: '-1e999'"),
    ("1e99999 0 0", "line 1: '1e99999'"),
    # words between numbers that are no key, unit or component name
    ("30 abc 20 10", "line 1: 'abc'"),
    ("0.5 0.5 foo 0.5 0.5", "line 1: 'foo'"),
    ("1 0 0\n0 1 zz 0\n0 0 1", "line 2: 'zz'"),
    ("10, 20 sensor, 30", "line 1: 'sensor'"),
    ("0 0 1 2D 45", "line 1: '2D'"),
    # names and functions outside the evaluated arithmetic (numbers, pi, + - * /, parentheses)
    ("0 0 ${half_turn}", "line 1: 'half_turn'"),
    ("SQRT(2)/2 0 0 SQRT(2)/2", "SQRT"),
    ("COS(30) 0 0 1", "COS"),
    ("yaw: 2**3", "'**'"),
    ("0 0 $(arg yaw)", "line 1: '$(arg'"),
    ("2024/01/05 10 20 30", "two slashes"),
    # a 2x2 matrix is no quaternion
    ("[1 0; 0 1]", "2 rows of 2"),
    ("[[1, 0], [0, 1]]", "2 rows of 2"),
]


@pytest.mark.parametrize("text, named", REFUSED, ids=[plain_id(t) for t, _ in REFUSED])
def test_refused_naming_the_token_and_line(text, named):
    with pytest.raises(DecodeError) as caught:
        decode(text)
    assert named in str(caught.value)
    assert "\n" not in str(caught.value)


def test_non_finite_words_are_refused_in_a_points_paste_too():
    with pytest.raises(DecodeError, match="line 2: 'nan'"):
        parse_numbers("1 2 3\n4 nan 6")


# Text that is genuinely understood keeps reading (worked values in test_decode_snippets.py)
UNDERSTOOD = [
    "Mount 7 rotation:\n0 -1 0\n1 0 0\n0 0 1",                   # a title line holding a number
    "axis 0 0 1 angle 90 deg",                                     # component names between numbers
    "X: 1 0 0  Y: 0 1 0  Z: 0 0 1",                               # keys between numbers
    "yaw 12°30'00\", pitch 0°15', roll 0",
    "# checked 2026-11-30, NaN-free\n30 20 10",                    # a comment is a clue, not data
    "6.1×10⁻¹⁷ 0 0 1",
    "pitch and roll: 10 and 20, yaw 5",
]


@pytest.mark.parametrize("text", UNDERSTOOD)
def test_understood_text_still_reads(text):
    assert decode(text)


# Tokens that are no number, caption, key, unit or name we know (pi and its spellings are numbers now:
# the evaluated arithmetic reads them, with a note)
FOREIGN = st.sampled_from(["NaN", "nan", "inf", "-inf", "Infinity", "abc", "foo", "${x}", "${pi", "q9z", "1e999",
                           "zz", "NAN", "sqrt(2)", "2**3", "$(arg x)"])
def _spots(text):
    """Places right after a digit, before a space or a separator: between two numbers."""
    return [i for i in range(1, len(text)) if text[i - 1].isdigit() and text[i] in " ,\t;\n"]


VALID = [text for _, text, *_ in SNIPPETS if _spots(text)]


@st.composite
def snippet_with_foreign_token(draw):
    """A valid snippet with one foreign token put between two of its numbers, set off by spaces."""
    text = draw(st.sampled_from(VALID))
    i = draw(st.sampled_from(_spots(text)))
    return text, text[:i] + " " + draw(FOREIGN) + " " + text[i:]


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(snippet_with_foreign_token())
def test_a_foreign_token_never_changes_the_orientation(case):
    assert len(VALID) >= 60
    original, changed = case
    try:
        readings = decode(changed)
    except DecodeError as error:
        assert str(error)
        return
    # Read anyway: it must be the same orientation as the snippet without the token.
    before = decode(original)[0].orientation.as_matrix()
    after = readings[0].orientation.as_matrix()
    assert np.allclose(before, after, atol=1e-12)
