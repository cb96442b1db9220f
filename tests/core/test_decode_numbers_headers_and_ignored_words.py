"""parse_numbers: a line of words just above the numbers is kept as their header, and only then; words
with digits that are not numbers ('2D', '3rd') are named in a note, at most three of them. The texts are
invented demo values; the note words are the module's own."""

from core.decode import parse_numbers


def test_no_header_without_a_line_of_words_above():
    assert parse_numbers("1 2 3").headers == ()
    assert parse_numbers("1 2 3\n4 5 6").headers == ()


def test_a_line_of_words_above_is_the_header():
    parsed = parse_numbers("roll pitch yaw\n1 2 3")
    assert parsed.headers == ((2, "roll pitch yaw"),)
    assert parsed.notes == ("line 1 ('roll pitch yaw') holds no numbers and was ignored",)


def test_words_with_digits_are_named_up_to_three():
    assert parse_numbers("10 20 30 2D").notes == ("line 1: ignored '2D' (not a number)",)
    assert parse_numbers("10 20 30 2D 3rd 4th").notes == ("line 1: ignored '2D', '3rd', '4th' (not a number)",)
    parsed = parse_numbers("10 20 30 2D 3rd 4th 5th")
    assert [n.value for n in parsed.numbers] == [10.0, 20.0, 30.0]
    assert parsed.notes == ("line 1: ignored '2D', '3rd', '4th' (not a number)",)
