"""Decode: the names, reasons and refusals a user reads for matrix, angle and parameter-set readings, and
how the units rule of thumb ranks them.

Check values: SciPy's Rotation for orientations; the dot product of rows 2 and 3 of the refused matrix
worked by hand ((0, 0, -1) . (0, 1, 0.5) = -0.5); kπ/12 are the multiples of 15° (worked by hand);
"whole numbers above 2π are degrees" and "a unit named in the text applies to every kind alike" (common
practice of the rule of thumb this decoder documents)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def test_a_degrees_hint_against_pi_is_refused_with_the_way_out():
    with pytest.raises(DecodeError) as err:
        decode("pi/2 0 0", {"units": "deg"})
    message = str(err.value)
    assert message.startswith("'pi/2' is an angle in radians (π is half a turn); the degrees hint contradicts it")
    assert message.endswith("drop the hint or write the value in degrees")


def test_a_unit_named_in_the_text_favours_no_kind():
    # 0.6 0 0.8 0 is a unit quaternion; 'degrees' must not lift the axis-angle reading past the
    # two Hamilton quaternion readings (it applies to the axis-angle reading only).
    readings = decode("degrees: 0.6 0 0.8 0")
    kinds = [(r.kind, r.conventions.get("order")) for r in readings]
    assert kinds[:2] == [("quaternion", "wxyz"), ("quaternion", "xyzw")]
    assert readings[1].score > readings[2].score
    # The same numbers without a unit word rank the same way.
    bare = decode("0.6 0 0.8 0")
    assert [(r.kind, r.conventions.get("order")) for r in bare[:2]] == kinds[:2]


def test_whole_numbers_beyond_two_pi_say_why_they_are_degrees():
    best = decode("zyx 10 20 30")[0]
    assert best.conventions["units"] == "deg"
    assert "a value beyond ±2π: degrees" in best.why


def test_a_multiple_of_fifteen_degrees_in_radians_ranks_higher_than_other_decimals():
    other = decode("1.5 0 0")[0]
    for k in (1, 6, 7, 9, 12):                     # 15°, 90°, 105°, 135°, 180°
        multiple = decode(f"{k * math.pi / 12:.7f} 0 0")[0]
        assert multiple.conventions["units"] == other.conventions["units"] == "rad"
        assert multiple.score > other.score, k
        # Just off a multiple of π/12 is an ordinary decimal again.
        assert decode(f"{k * math.pi / 12 + 0.01:.7f} 0 0")[0].score == other.score, k


@pytest.mark.parametrize("text, where", [
    ("1 0 0\n0 0 -1\n0 1 0.5", "(rows as written: lines 1, 2, 3)"),
    ("1 0 0 0\n0 -1 0 1\n0.5", "(rows and columns as written)"),
    ("1 0 0 0 0 -1 0 1 0.5", "(rows and columns as written)"),
])
def test_a_refused_matrix_says_where_its_rows_are(text, where):
    with pytest.raises(DecodeError) as err:
        decode(text)
    message = str(err.value)
    assert message.startswith("matrix refused: not a rotation")
    assert "dot product -0.5" in message
    assert message.endswith(where)


def test_matrix_readings_are_named_for_a_person():
    labels = {r.conventions["matrix"]: r.label for r in decode("1 0 0\n0 0 -1\n0 1 0")}
    assert labels == {"body-to-reference": "matrix as written (body -> reference: columns are the body axes)",
                      "reference-to-body": "matrix transposed (reference -> body: rows are the body axes)"}


def test_yaw_pitch_roll_names_against_a_sequence_option_are_refused():
    with pytest.raises(DecodeError) as err:
        decode("yaw: 10\npitch: 20\nroll: 30", {"sequence": "XYZ"})
    assert str(err.value) == ("the text names yaw, pitch and roll (intrinsic Z-Y'-X''), which the sequence"
                              " options contradict; drop the options or the names")


def test_angle_readings_spell_the_sequence_and_say_the_text_named_angles():
    readings = decode("angles: 10 20 30")
    best = readings[0]
    assert best.label == "angles Z-Y'-X'' intrinsic, degrees"
    assert best.why.endswith("the text says angles")
    assert readings[1].label == "angles X-Y-Z extrinsic, degrees"
    # SciPy: intrinsic Z-Y'-X'' in degrees.
    want = Rotation.from_euler("ZYX", [10, 20, 30], degrees=True).as_matrix()
    np.testing.assert_allclose(best.orientation.as_matrix(), want, atol=1e-12)


def test_a_parameter_set_given_as_a_hint_says_so():
    readings = decode("0.1 0.2 0.3", {"kind": "gibbs"})
    assert [r.label for r in readings] == ["Gibbs vector"]
    assert readings[0].why == "the only reading: kind given"
