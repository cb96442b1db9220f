"""Unit marks: a number marked with an angle unit is an angle, so no reading may take it for a matrix or a
quaternion entry, named or not (before this was pinned, 'w: 1°, x: 0, y: 0, z: 0' was read as a
quaternion); each refusal in the module's own words. Check values: SciPy's Rotation for the angles that are
read; the texts are invented demo values."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def refusal(text):
    with pytest.raises(DecodeError) as err:
        decode(text)
    return str(err.value)


@pytest.mark.parametrize("text, shown", [
    ("w: 1°, x: 0, y: 0, z: 0", "1°"),
    ("qw: 0.7071 qx: 0 qy: 0 qz: 0.7071 rad", "0.7071 rad"),
    ("q0: 0.7071°, q1: 0, q2: 0, q3: 0.7071", "0.7071°"),
])
def test_a_named_quaternion_part_with_an_angle_unit_is_refused(text, shown):
    assert refusal(text) == f"cannot read the 4 numbers: '{shown}' carries an angle unit, so it is no quaternion entry"


def test_named_quaternion_parts_without_a_unit_are_read():
    first = decode("w: 0.9238795, x: 0, y: 0, z: 0.3826834")[0]
    assert np.allclose(first.orientation.as_matrix(), Rotation.from_quat([0, 0, 0.3826834, 0.9238795]).as_matrix(),
                       atol=1e-6)


def test_named_angles_with_marks_keep_their_own_rules():
    first = decode("roll: 10°, pitch: 20°, yaw: 30°")[0]
    assert first.conventions == {"sequence": "ZYX", "intrinsic": True, "units": "deg"}
    assert np.allclose(first.orientation.as_matrix(),
                       Rotation.from_euler("ZYX", [30, 20, 10], degrees=True).as_matrix(), atol=1e-12)


def test_a_marked_matrix_entry_is_refused():
    assert refusal("1° 0 0 0 1 0 0 0 1") == "cannot read the 9 numbers: '1°' carries an angle unit, so it is no matrix entry"


def test_a_converted_mark_beside_unmarked_angles_is_refused():
    assert refusal("0.5 mrad, 1, 0") == (
        "cannot read the 3 numbers: only some numbers carry the unit mark of '0.5 mrad' (mrad), and '1' on line 1"
        " carries none: mark every angle or none; Framewright will not guess which numbers the mark belongs to")


def test_a_unit_named_in_words_without_marks_is_refused():
    assert refusal("angles in mrad: 1 2 3") == (
        "the text names 'mrad' but its numbers carry no unit mark: mark each angle (0.5 mrad, 30″, 2 gon) or"
        " convert them to degrees; Framewright will not guess which numbers are in that unit")
