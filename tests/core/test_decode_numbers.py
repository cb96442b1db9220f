"""parse_numbers: the numbers people paste, and what is set aside. Expected values are the numbers as
written (common practice: what the text says), so each check is against the text itself."""

import math

import pytest

from core.decode import MAX_INPUT_BYTES, DecodeError, extract_numbers, parse_numbers


@pytest.mark.parametrize("text, expected", [
    ("1 2 3", [1, 2, 3]),
    ("1.5, -2.25, .5", [1.5, -2.25, 0.5]),
    ("6.123e-17 1E3 -2.5e+2", [6.123e-17, 1000.0, -250.0]),
    ("+1 +0.5 +2e1", [1, 0.5, 20]),
    ("\u22120.5 \u22121", [-0.5, -1]),                       # Unicode minus
    ("\u20130.5 \u20131", [-0.5, -1]),                       # en dash used as minus
    ("1\u00a02\u20093\u202f4", [1, 2, 3, 4]),                # non-breaking, thin, narrow no-break spaces
    ("1\t2;3|4,5\n6", [1, 2, 3, 4, 5, 6]),                   # every separator
    ("[[1,[2]],{3},(4)]", [1, 2, 3, 4]),                     # brackets of any nesting
    ("30° 45 deg 0.5 rad 2degrees", [30, 45, 0.5, 2]),
    ("1.0f, 2.5F", [1.0, 2.5]),                              # C float suffix
    ("1.0D-3 2d0", [1e-3, 2.0]),                             # Fortran exponents
    ("6.1×10⁻¹⁷ 2 x 10^3", [6.1e-17, 2000.0]),               # times-ten notation
    ("0.5-0.5", [0.5, -0.5]),                                # glued columns
    ("a = - 0.5", [-0.5]),                                   # a sign separated by a space keeps its number
    ("12°30'", [12.5]),                                      # degrees and minutes
    ("-12°30'36\"", [-12.51]),                               # degrees, minutes, seconds
])
def test_numbers_are_read_as_written(text, expected):
    assert extract_numbers(text) == pytest.approx(expected, rel=1e-15, abs=0)


def test_decimal_point_is_a_point_whatever_the_locale():
    # "0,5" is two numbers: the comma is a separator (CONVENTIONS.md: decimal point is '.')
    assert extract_numbers("0,5") == [0.0, 5.0]


@pytest.mark.parametrize("text", ["IMU2", "q0", "3x3", "2D", "3rd", "v1.2.3", "float64", "IMU-2", "M8"])
def test_numbers_inside_names_are_not_numbers(text):
    parsed = parse_numbers(f"{text} 1 2 3")
    assert list(parsed.values) == [1, 2, 3]
    assert any("ignored" in note for note in parsed.notes)


def test_lines_without_numbers_are_ignored_with_a_note():
    parsed = parse_numbers("Rotation matrix:\n1 0 0\n0 1 0\n0 0 1\nunits: none")
    assert len(parsed.numbers) == 9
    assert any("Rotation matrix" in note and "ignored" in note for note in parsed.notes)


def test_rows_follow_lines_semicolons_latex_breaks_and_brackets():
    for text in ("1 2 3\n4 5 6", "[1 2 3; 4 5 6]", "1 & 2 & 3 \\\\ 4 & 5 & 6", "[[1,2,3],[4,5,6]]"):
        assert parse_numbers(text).rows == ((1, 2, 3), (4, 5, 6)), text


def test_labels_and_units_are_kept_with_their_numbers():
    parsed = parse_numbers("w = 0.5, \"qx\": 0.1\nangle (deg): 90°")
    assert [n.label for n in parsed.numbers] == ["w", "qx", "angle (deg)"]
    assert [n.unit for n in parsed.numbers] == [None, None, "deg"]
    assert [(n.line, n.column) for n in parsed.numbers] == [(1, 5), (1, 16), (2, 14)]


def test_comments_lend_words_but_not_numbers():
    parsed = parse_numbers("R = [1 0 0; 0 1 0; 0 0 1]  % 45 deg body -> reference\n// 7 more\n# 8")
    assert len(parsed.numbers) == 9
    assert "body -> reference" in parsed.words


def test_c_array_sizes_and_template_arguments_are_not_numbers():
    assert extract_numbers("double q[4] = {1, 0, 0, 0};") == [1, 0, 0, 0]
    assert extract_numbers("std::array<double, 3> v{1, 2, 3};") == [1, 2, 3]


@pytest.mark.parametrize("text", ["1/√2, 0, 0, 1/√2", "sqrt(2)/2 0 0 sqrt(2)/2", "cos(30) 1 2",
                                  "\\frac{1}{2} 0 0"])
def test_expressions_outside_the_evaluated_arithmetic_are_refused_rather_than_misread(text):
    with pytest.raises(DecodeError, match="expression"):
        parse_numbers(text)


# The values are Python's math module's; the spellings are those of description files and launch
# arguments (common practice).
@pytest.mark.parametrize("text, values", [
    ("pi/2 0 0", [math.pi / 2, 0, 0]),
    ("PI/2 0 0", [math.pi / 2, 0, 0]),
    ("${-M_PI/2} 0 0", [-math.pi / 2, 0, 0]),
    ('<origin xyz="0 0 0" rpy="0 ${pi/4} ${-pi}"/>', [0, 0, 0, 0, math.pi / 4, -math.pi]),
    ("0 0 π", [0, 0, math.pi]),
    ("yaw: Pi", [math.pi]),
    ("3*pi / 4, -0.5, 1", [3 * math.pi / 4, -0.5, 1]),
    ("/base_link base/imu 0 0 pi/2", [0, 0, math.pi / 2]),
    ("cam0/imu 1 2 3", [1, 2, 3]),
])
def test_the_small_arithmetic_is_evaluated_and_said(text, values):
    parsed = parse_numbers(text)
    assert [n.value for n in parsed.numbers] == pytest.approx(values, abs=1e-15)
    if any(w in text for w in ("pi", "PI", "Pi", "π")):
        assert any("evaluated" in note for note in parsed.notes)


def test_text_over_100_kB_is_refused_with_a_message():
    with pytest.raises(DecodeError, match="bytes"):
        parse_numbers("1 " * (MAX_INPUT_BYTES // 2 + 1))


def test_minutes_of_60_are_refused():
    with pytest.raises(DecodeError, match="minutes"):
        parse_numbers("10°60'")


def test_an_overflowing_number_is_refused_not_infinite():
    with pytest.raises(DecodeError):
        parse_numbers("1e999 0 0")
    with pytest.raises(DecodeError):
        parse_numbers("9.9e308 0 0")
