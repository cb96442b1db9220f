"""Transform printouts: the quaternion's written order ('(wxyz)' or '(xyzw)', scalar last when not said),
the RPY unit (radian or degree, about fixed X, Y, Z), and the line a short translation is refused on.
Check values: SciPy's Rotation (from_quat scalar last; from_euler 'xyz' lower case is extrinsic); the
numbers are invented demo values (cos and sin of 22.5 degrees, worked by hand)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError

HEAD = "At time 0.0\n- Translation: [0.000, 0.000, 0.000]\n- Rotation: "
C, S = 0.9238795, 0.3826834


@pytest.mark.parametrize("line, order", [
    (f"in Quaternion (wxyz) [{C}, 0.0, 0.0, {S}]", "wxyz"),
    (f"in Quaternion (xyzw) [0.0, 0.0, {S}, {C}]", "xyzw"),
    (f"in Quaternion [0.0, 0.0, {S}, {C}]", "xyzw"),
])
def test_the_quaternion_order_written(line, order):
    first = decode(HEAD + line + "\n")[0]
    assert first.conventions == {"order": order, "convention": "Hamilton"}
    assert f"read its quaternion ({', '.join(order)}), the most precisely printed representation" in first.notes
    assert np.allclose(first.orientation.as_matrix(), Rotation.from_quat([0, 0, S, C]).as_matrix(), atol=1e-6)


@pytest.mark.parametrize("unit, values, degrees", [
    ("radian", "[0.100, 0.200, 0.785]", False),
    ("degree", "[10.000, 20.000, 45.000]", True),
])
def test_rpy_about_fixed_axes_in_the_unit_written(unit, values, degrees):
    first = decode(HEAD + f"in RPY ({unit}) {values}\n")[0]
    assert first.conventions == {"sequence": "XYZ", "intrinsic": False, "units": "deg" if degrees else "rad"}
    assert f"read its RPY ({unit}), the most precisely printed representation" in first.notes
    angles = [float(v) for v in values.strip("[]").split(",")]
    assert np.allclose(first.orientation.as_matrix(),
                       Rotation.from_euler("xyz", angles, degrees=degrees).as_matrix(), atol=1e-12)


def test_a_short_translation_is_refused_on_its_line():
    text = "\nAt time 0.0\n- Translation: [0.000, 0.000]\n- Rotation: in RPY (radian) [0.000, 0.000, 0.785]\n"
    with pytest.raises(DecodeError) as err:
        decode(text)
    assert str(err.value) == "line 3: a translation needs 3 numbers (x, y, z); found 2"


FIRST_NOTE = ("a transform printout: quaternion x, y, z, w, RPY about fixed X, Y, Z (common practice); its lengths"
              " are metres by convention, but the text does not say so")


def test_one_block_is_labelled_and_noted_without_a_spread():
    first = decode(HEAD + f"in Quaternion [0.0, 0.0, {S}, {C}]\n")[0]
    assert first.label == "transform printout: quaternion (x, y, z, w), Hamilton"
    assert first.notes[:2] == (FIRST_NOTE, "the time stamp (0.0) was set aside")
    assert not any("printout blocks" in n for n in first.notes)


def test_a_long_time_stamp_is_shown_to_32_characters():
    stamp = "1700000000." + "1" * 40
    first = decode(f"At time {stamp}\n- Translation: [0.000, 0.000, 0.000]\n- Rotation: in Quaternion [0.0, 0.0, 0.0,"
                   " 1.0]\n")[0]
    assert f"the time stamp ({stamp[:32]}) was set aside" in first.notes


def test_a_block_without_a_rotation_is_refused():
    with pytest.raises(DecodeError) as err:
        decode("\nAt time 0.0\n- Translation: [0.000, 0.000, 0.000]\n- Rotation:\n")
    assert str(err.value) == "line 3: the printout gives a translation but no rotation Framewright reads"


def test_the_spread_of_three_blocks_is_measured_from_the_last():
    def block(degrees):
        q = Rotation.from_euler("z", degrees, degrees=True).as_quat()
        return HEAD + f"in Quaternion [{', '.join(f'{x:.7f}' for x in q)}]\n"
    first = decode(block(0) + block(90) + block(30))[0]
    # from the last (30 degrees): the others are 30 and 60 degrees away; the largest is 60 (worked by hand)
    assert "the text holds 3 printout blocks; read the last; the others differ from it by up to 60° and 0 m" \
        in first.notes
    assert np.allclose(first.orientation.as_matrix(), Rotation.from_euler("z", 30, degrees=True).as_matrix(),
                       atol=1e-6)
