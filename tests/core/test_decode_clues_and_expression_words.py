"""Decode: the reasons that come from the words (radian marks, a direction cosine matrix), the notes and
refusal of a 4x4 said to be column-major, and the small arithmetic's unary plus, brackets and refusals.

Check values: SciPy's Rotation for orientations; π/2 = 1.5707963267948966 (math.pi / 2); a direction
cosine matrix maps reference to body (common practice); unary plus leaves a value unchanged (common
practice of arithmetic); the last row of a homogeneous transform is 0 0 0 1 (common practice)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.decode.column_major import transform_grid
from core.decode.expressions import evaluate, substitute
from core.errors import DecodeError


def _same(orientation, rotation):
    q = orientation.as_quaternion()
    expected = rotation.as_quat(scalar_first=True)
    assert min(np.abs(q - expected).max(), np.abs(q + expected).max()) < 1e-12


@pytest.mark.parametrize("text, word", [("0.1 rad, 0.2 rad, 0.3 rad", "radians"),
                                        ("10°, 20°, 30°", "degrees")])
def test_marked_numbers_say_which_unit_they_are_marked_in(text, word):
    best = decode(text)[0]
    assert f"the numbers are marked in {word}" in best.why
    other = "degrees" if word == "radians" else "radians"
    assert f"marked in {other}" not in best.why
    values = [0.1, 0.2, 0.3] if word == "radians" else [10, 20, 30]
    _same(best.orientation, Rotation.from_euler("ZYX", values, degrees=(word == "degrees")))


def test_a_direction_cosine_matrix_says_why_it_is_read_reference_to_body():
    # a 90° turn about z (SciPy) written as a DCM: read first as reference -> body
    m = Rotation.from_euler("z", 90, degrees=True).as_matrix()
    text = "DCM\n" + "\n".join(" ".join(f"{x:.0f}" for x in row) for row in m)
    readings = decode(text)
    assert readings[0].conventions == {"matrix": "reference-to-body"}
    assert readings[0].why == "the text calls it a direction cosine matrix, usually reference -> body"
    assert readings[1].why.startswith("the other direction: the text calls it a direction cosine matrix")
    _same(readings[0].orientation, Rotation.from_matrix(m.T))


def test_a_column_major_grid_ending_in_0001_is_read_as_rows_and_says_so():
    rows = [[1, 0, 0, 5], [0, 1, 0, 6], [0, 0, 1, 7], [0, 0, 0, 1]]
    got, notes = transform_grid(sum(rows, []), True, 3)
    assert got == rows
    assert notes == ["the text says column-major, but the last written line is 0 0 0 1: each written"
                     " line is a row, read as laid out"]


def test_a_column_major_grid_whose_lines_could_be_rows_or_columns_is_refused():
    # a 90° turn about z with no translation: rows and columns both end in 0, and it is not symmetric
    written = [0, -1, 0, 0, 1, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1]
    with pytest.raises(DecodeError) as err:
        transform_grid(written, True, 3)
    message = str(err.value)
    assert message.startswith("line 3: the text says column-major, but the numbers are laid out in lines")
    assert "whether the lines are rows or columns cannot be told" in message
    assert message.endswith("write the matrix row after row")


@pytest.mark.parametrize("text, value", [("+1", 1.0), ("+pi/2", math.pi / 2), ("2*+3", 6.0),
                                         ("-+2", -2.0), ("+-2", -2.0), ("-1", -1.0)])
def test_unary_plus_keeps_the_value_and_unary_minus_negates_it(text, value):
    assert evaluate(text) == pytest.approx(value, abs=1e-15)


@pytest.mark.parametrize("line, left", [("(pi/2, 0, 0)", "("), ("(-pi/2, 0, 0)", "("), ("[0, pi/2)", "[0, ")])
def test_an_expression_inside_brackets_is_evaluated_without_them(line, left):
    notes = set()
    out = substitute(line, 1, notes)
    assert out.startswith(left)
    numbers = [float(t) for t in out.replace("(", " ").replace(")", " ").replace("[", " ")
               .replace(",", " ").split()]
    sign = -1 if "-pi" in line else 1
    assert sign * math.pi / 2 in numbers       # math.pi / 2
    assert any("evaluated '" + ("-" if sign < 0 else "") + "pi/2'" in n for n in notes)


def test_a_bracketed_expression_decodes_to_its_angle():
    best = decode("(pi/2, 0, 0)")[0]
    _same(best.orientation, Rotation.from_euler("ZYX", [math.pi / 2, 0, 0]))


@pytest.mark.parametrize("text, what", [("foo(2)", "a function"), ("foo (1)", "a function"),
                                        ("foo.bar", "an attribute"), ("foo", "a name"), ("foo + 1", "a name")])
def test_a_name_in_an_expression_is_refused_as_what_it_is(text, what):
    with pytest.raises(DecodeError) as err:
        evaluate(text)
    assert "'foo'" in str(err.value)
    assert f" is {what} Framewright does not evaluate" in str(err.value)
