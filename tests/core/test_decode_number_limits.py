"""Decode: limits of the number reader on both sides: minutes and seconds below 60, how many lines a
count message names, how many notes are kept, and a stray word right after the first number.

Check values: 10°20'59" = 10 + 20/60 + 59/3600 = 10.349722...° and 10°59' = 10.98333...° (worked by hand;
sixty minutes to the degree and sixty seconds to the minute are handbook facts)."""

import pytest

from core.decode import decode, parse_numbers
from core.errors import DecodeError


def refusal(text):
    with pytest.raises(DecodeError) as err:
        decode(text)
    return str(err.value)


def test_minutes_and_seconds_below_sixty_are_read():
    assert decode("10°20'59\" 0 0")[0].numbers[0] == pytest.approx(10 + 20 / 60 + 59 / 3600, abs=1e-12)
    assert decode("10°59' 0 0")[0].numbers[0] == pytest.approx(10 + 59 / 60, abs=1e-12)


@pytest.mark.parametrize("text, written", [("10°20'60\" 0 0", "10°20'60\""), ("10°60' 0 0", "10°60'"),
                                           ("10°20'61\" 0 0", "10°20'61\"")])
def test_minutes_or_seconds_of_sixty_are_refused(text, written):
    assert refusal(text) == f"line 1: '{written}' has minutes or seconds of 60 or more"


def test_a_count_message_names_eight_lines_in_full():
    text = "\n".join(f"{i} {i + 1}" for i in range(1, 9))
    message = refusal(text)
    assert message.startswith("found 16 numbers (line 1: 2, line 2: 2, line 3: 2, line 4: 2, line 5: 2,"
                              " line 6: 2, line 7: 2, line 8: 2); ")
    assert "more lines" not in message


def test_a_count_message_names_eight_lines_then_how_many_more():
    text = "\n".join(f"{i} {i + 1}" for i in range(1, 11))
    message = refusal(text)
    assert message.startswith("found 20 numbers (line 1: 2, line 2: 2, line 3: 2, line 4: 2, line 5: 2,"
                              " line 6: 2, line 7: 2, line 8: 2, and 2 more lines); ")


def test_notes_are_bounded_and_say_when_some_were_left_out():
    # Each evaluated expression makes a note; past twelve, one line says some were left out.
    notes = parse_numbers(" ".join(f"{k}*2" for k in range(1, 20))).notes
    assert len(notes) == 13
    assert notes[-1] == "further notes left out"
    assert notes[0] == "line 1: evaluated '1*2' as 2"
    few = parse_numbers(" ".join(f"{k}*2" for k in range(1, 12))).notes
    assert "further notes left out" not in few and len(few) == 11


@pytest.mark.parametrize("text, word", [("1?x 2 3", "?x"), ("1@x 2 3", "@x"), ("1!abc 2 3", "!abc"),
                                        ("1 ?x 2 3", "?x")])
def test_a_word_right_after_the_first_number_is_refused(text, word):
    assert refusal(text) == (f"line 1: '{word}' between numbers is not a number, key, unit or component name;"
                             " Framewright will not guess what it stands for (remove it)")
