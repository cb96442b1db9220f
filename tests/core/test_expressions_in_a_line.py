"""Expressions inside a line of pasted text: `substitute` puts each value in place of what was written,
keeps the rest of the line as it was, notes each evaluation in the words written, and refuses (with the
line number) what it will not read: a function, two slashes without pi, a broken wrapper.

Check values: Python's math module (repr of the float, as the module writes it); the refusal and note
words are the module's own."""

import math

import pytest

from core.decode.expressions import substitute
from core.errors import DecodeError


class Notes:
    def __init__(self):
        self.said = []

    def add(self, text):
        self.said.append(text)


def read(line, line_no=3):
    notes = Notes()
    return substitute(line, line_no, notes), notes.said


def refusal(line, line_no=3):
    with pytest.raises(DecodeError) as err:
        substitute(line, line_no, Notes())
    return str(err.value)


def v(x):
    return f" {x!r} "


HALF_PI = math.pi / 2


# (line, what was written, its value by Python's math module): the value takes the place of the writing
@pytest.mark.parametrize("line, written, value", [
    ("0 0 pi", "pi", math.pi),
    ("0 0 Pi", "Pi", math.pi),
    ("0 0 PI", "PI", math.pi),
    ("0 0 M_PI", "M_PI", math.pi),
    ("0 0 π", "π", math.pi),
    ("x = M_PI", "M_PI", math.pi),
    ("0 0 2*3", "2*3", 6.0),
    ("0 0 1/2", "1/2", 0.5),
    ("0 0 10 / 4", "10 / 4", 2.5),
    ("yaw: pi/2 rad", "pi/2", HALF_PI),
    ("x -pi/2", "-pi/2", -HALF_PI),
    ("a = pi/2+", "pi/2", HALF_PI),
    ("(pi/2)", "(pi/2)", HALF_PI),
    ("((pi/2)", "(pi/2)", HALF_PI),
    ("(pi/2, 0)", "pi/2", HALF_PI),
    ("[0, pi/2)", "pi/2", HALF_PI),
    ("-(pi/2))", "-(pi/2)", -HALF_PI),
    ("0 0 pi/2/2", "pi/2/2", math.pi / 2 / 2),
    ("v: .5*pi", ".5*pi", 0.5 * math.pi),
    ("0 0 3*-pi/4", "3*-pi/4", 3 * -math.pi / 4),
])
def test_one_expression_is_replaced_in_place(line, written, value):
    got, notes = read(line)
    at = line.rindex(written)
    assert got == line[:at] + v(value) + line[at + len(written):]
    assert notes == [f"line 3: evaluated '{written}' as {value:.12g}"]


def test_several_spellings_of_pi_on_one_line_keep_their_own_words():
    got, notes = read("a: M_PI/2, b: Pi/4, c: PI", 8)
    assert got == "a: " + v(math.pi / 2) + ", b: " + v(math.pi / 4) + ", c: " + v(math.pi)
    assert notes == ["line 8: evaluated 'M_PI/2' as 1.57079632679", "line 8: evaluated 'Pi/4' as 0.785398163397",
                     "line 8: evaluated 'PI' as 3.14159265359"]


def test_a_wrapper_is_replaced_and_noted_as_written():
    got, notes = read('rpy="0 0 ${-M_PI/2}"', 7)
    assert got == 'rpy="0 0 ' + v(-HALF_PI) + '"'
    assert notes == ["line 7: evaluated '${-M_PI/2}' as -1.57079632679"]


def test_a_long_wrapper_is_shortened_in_its_note():
    wrapper = "${" + "0" * 50 + "+1}"
    got, notes = read(f"0 0 {wrapper}", 2)
    assert got == "0 0 " + v(1.0)
    assert notes == [f"line 2: evaluated '{wrapper[:39]}…' as 1"]


@pytest.mark.parametrize("line, message", [
    ("0 0 ${1/0}", "line 4: '${1/0}' divides by zero"),
    ("0 0 ${}", "line 4: an empty expression has no value"),
    ("0 0 ${x}", "line 4: 'x' is a name Framewright does not evaluate; only numbers, pi, + - * / and"
                 " parentheses are"),
    ("0 0 pi/0", "line 4: 'pi/0' divides by zero"),
    ("0 0 pi/(2", "line 4: 'pi/(2': a '(' has no closing ')'"),
    ("0 0 1e308*10", "line 4: '1e308*10' has no finite value"),
    ("12/03/2024 1 2", "line 4: '12/03/2024' holds two slashes (a date or a list?); Framewright will not read"
                       " it as a division: write the values apart"),
    ("0 0 SIN(1)*2", "line 4: 'SIN' is a function; Framewright evaluates only numbers, pi, + - * / and"
                     " parentheses (an expression): paste the value"),
    ("0 0 atan2 (1, 2)/2", "line 4: 'atan2' is a function; Framewright evaluates only numbers, pi, + - * / and"
                           " parentheses (an expression): paste the value"),
    ("0 0 1**2", "line 4: '1**2': '**' (a power) is not evaluated; Framewright evaluates numbers, pi, + - * / and"
                 " parentheses only"),
])
def test_refusals_name_the_line(line, message):
    assert refusal(line, 4) == message


def test_one_slash_without_pi_is_a_division_two_are_refused():
    assert read("1/2")[0] == v(0.5)
    assert "two slashes" in refusal("1/2/4")
    assert read("pi/2/4")[0] == v(math.pi / 2 / 4)       # with pi, two slashes are arithmetic


@pytest.mark.parametrize("line", ["1 2 3", "roll 10 pitch 20", "Pitch 0 0", "x_pi/2", "a.pi/2", "epi 1",
                                  "n/a 1 2", "0 0 2pi", "sqrt(2)", ""])
def test_lines_without_an_expression_are_left_as_they_are(line):
    assert read(line) == (line, [])
