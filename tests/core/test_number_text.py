"""One typed number: what is accepted, and what is refused rather than silently misread."""

import pytest

from core.number_text import parse_number


@pytest.mark.parametrize("text, value", [
    ("1.5", 1.5), (" 3.0 ", 3.0), ("\u00a02.5\u2009", 2.5), ("\u22121.25", -1.25), ("\u20130.5", -0.5),
    ("+4", 4.0), ("6.123e-17", 6.123e-17), ("\t7\t", 7.0),
])
def test_accepted(text, value):
    assert parse_number(text) == value


@pytest.mark.parametrize("text, words", [
    ("1 2", "space inside"), ("0 1", "space inside"), ("1\u00a0000", "space inside"),
    ("1,5", "decimal point"), ("1_000", "plain number"), ("\uff11\uff12", "plain number"),
    ("", "empty"), ("abc", "not a number"), ("inf", "finite"), ("1e999", "finite"),
])
def test_refused_with_a_message(text, words):
    with pytest.raises(ValueError, match=words):
        parse_number(text)
