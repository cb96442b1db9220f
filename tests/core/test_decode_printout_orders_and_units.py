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
