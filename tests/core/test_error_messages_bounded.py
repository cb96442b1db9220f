"""A refusal quotes what it was given, and what it is given can be a pasted file of a megabyte. Every
refusal stays short enough to read in a status line: past MESSAGE_LIMIT characters its middle is left out
and the note says how much, while its start (which field) and its end (what was expected) stay whole.

Check values: the refusal words are the project's own; lengths are counted by hand from the limits."""

import pytest

from core import Orientation
from core.errors import MESSAGE_LIMIT, FramewrightError, InvalidInputError, SequenceError, bounded_message
from core.sequences import parse_sequence
from core.units import angle_unit, length_unit, slope_unit

HUGE = "q" * 1_000_000


@pytest.mark.parametrize("call, start, end", [
    (lambda: angle_unit(HUGE), "unknown angle unit", "expected one of deg, dms, rad, mrad, arcmin, arcsec, gon, mil"),
    (lambda: length_unit(HUGE), "unknown length unit", "expected one of mm, m, in, thou"),
    (lambda: slope_unit(HUGE), "unknown slope unit", "expected one of deg, mm/m, um/m, in/ft, percent"),
    (lambda: parse_sequence(HUGE), "cannot read 'qqq", "such as 'ZYX' or 'Z-Y′-X″'"),
    (lambda: Orientation.from_angles(HUGE, [0, 0, 0]), "cannot read 'qqq", "such as 'ZYX' or 'Z-Y′-X″'"),
])
def test_a_megabyte_of_input_gives_a_short_refusal_that_keeps_its_start_and_end(call, start, end):
    with pytest.raises(FramewrightError) as caught:
        call()
    message = str(caught.value)
    assert len(message) <= MESSAGE_LIMIT
    assert start.lower() in message[:60].lower()
    assert message.endswith(end)
    assert "characters left out" in message


def test_the_note_counts_exactly_what_was_left_out():
    message = "a" * 360 + "b" * 10_000 + "c" * 200
    # By hand: 10,560 characters, the first 360 and last 200 kept, so 10,000 left out.
    assert bounded_message(message) == "a" * 360 + " … [10,000 characters left out] … " + "c" * 200
    assert str(InvalidInputError(message)) == bounded_message(message)


def test_a_message_at_the_limit_is_kept_whole_and_one_past_it_is_shortened():
    at_limit = "x" * MESSAGE_LIMIT
    assert str(SequenceError(at_limit)) == at_limit
    past = "x" * (MESSAGE_LIMIT + 1)
    # By hand: 601 - 360 - 200 = 41 left out.
    assert str(SequenceError(past)) == "x" * 360 + " … [41 characters left out] … " + "x" * 200


def test_an_error_that_is_not_text_keeps_its_argument():
    assert InvalidInputError(42).args == (42,)
