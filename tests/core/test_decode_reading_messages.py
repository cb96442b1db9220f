"""Decode: the messages and notes of the ranking step: a title line set aside, a 2x2 block, numbers too
large, angles beyond ten turns, a count that is not read, and the gimbal-lock note on a matrix.

Check values: SciPy's Rotation (the matrix Rz(90°)·Ry(90°) and its intrinsic Z-Y'-X'' middle angle of
90°, its extrinsic z-y-x middle angle of 0°); 62 rad = 3552.3° and 63 rad = 3609.6° (worked by hand:
180/π × 62 and × 63) on either side of the ten-turn (3600°) limit."""

import warnings

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def refusal(text, hints=None):
    with pytest.raises(DecodeError) as err:
        decode(text, hints)
    return str(err.value)


def test_a_title_line_is_set_aside_and_the_reading_says_so():
    readings = decode("Mount 7 rotation:\n10 20 30")
    best = readings[0]
    assert best.numbers == (10.0, 20.0, 30.0)
    assert best.why.endswith("; reads the text without its title line")
    assert "line 1 ('Mount rotation:') was taken for a title: its number 7 was not read" in best.notes
    # SciPy: intrinsic Z-Y'-X'' in degrees.
    want = Rotation.from_euler("ZYX", [10, 20, 30], degrees=True).as_matrix()
    np.testing.assert_allclose(best.orientation.as_matrix(), want, atol=1e-12)
    # The four numbers with the title's 7 are still offered, below.
    assert any(r.numbers == (7.0, 10.0, 20.0, 30.0) for r in readings[1:])


def test_a_title_line_with_two_numbers_says_were():
    readings = decode("Mount 7 rev 2 rotation:\n1 0 0\n0 0 -1\n0 1 0")
    assert readings[0].kind == "matrix"
    assert "line 1 ('Mount rev rotation:') was taken for a title: its numbers 7, 2 were not read" in readings[0].notes


@pytest.mark.parametrize("text, where", [("1 0\n0 1", "lines 1, 2"), ("[1 0; 0 1]", "line 1")])
def test_two_rows_of_two_are_refused_as_a_square_matrix(text, where):
    assert refusal(text) == (f"the 4 numbers are written as 2 rows of 2 (a 2x2 matrix, {where}); an orientation"
                             " needs a 3x3 matrix, or a quaternion or axis and angle written as one row")


def test_a_number_too_large_is_refused_naming_its_line():
    assert refusal("0 0 1e10") == "line 1: 1e10 is too large for any part of an orientation"


def test_radians_are_held_to_ten_turns_in_degrees():
    assert decode("62 0 0", {"units": "rad"})[0].conventions["units"] == "rad"
    message = refusal("63 0 0", {"units": "rad"})
    assert "an angle of 63 radians is more than ten turns (a lost decimal point?)" in message
    # In degrees the same numbers are well within ten turns.
    assert decode("63 0 0", {"units": "deg"})[0].conventions["units"] == "deg"


def test_six_numbers_are_refused_pointing_at_a_pose():
    message = refusal("1 2 3 4 5 6")
    assert message.startswith("found 6 numbers (line 1: 6); Framewright reads 9 (a matrix)")
    assert message.endswith(", or a pose (4x4, 3x4, keyed, or a line under a header naming its columns such as"
                            " '# x y z qx qy qz qw'): name the columns so their order is not guessed")


def test_a_matrix_in_gimbal_lock_for_yaw_pitch_roll_says_so():
    m = Rotation.from_euler("ZYX", [90, 90, 0], degrees=True).as_matrix().round(12)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")      # SciPy warns of the lock it is asked about
        assert Rotation.from_matrix(m).as_euler("ZYX", degrees=True)[1] == pytest.approx(90)
        assert Rotation.from_matrix(m).as_euler("zyx", degrees=True)[1] == pytest.approx(0, abs=1e-9)
    text = "body to reference\n" + "\n".join(" ".join(f"{x:g}" for x in row) for row in m + 0.0)
    best = decode(text)[0]
    assert best.conventions == {"matrix": "body-to-reference"}
    assert ("gimbal lock in intrinsic ZYX: only the sum or difference of the first and third angles is determined"
            in best.notes)
