"""The pose line's header word for word, in both quaternion orders: the order it names must be the order
the numbers are written in. Check values: the header's wording (CONVENTIONS.md "Poses") and the numbers
against SciPy's Rotation.as_quat."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.orientation import Orientation
from core.pose_formats import render_pose
from core.position import Position

ROTATION = Rotation.from_euler("ZYX", [123.4, -41.0, 7.25], degrees=True)
ORIENTATION = Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True))
POSITION = Position.from_shown((250.0, -12.5, 1001.75), "mm")


@pytest.mark.parametrize("scalar_last, order, scalar, columns", [
    (False, "w, x, y, z", "scalar first", "qw qx qy qz"),
    (True, "x, y, z, w", "scalar last", "qx qy qz qw"),
])
def test_the_pose_line_header_names_the_order_the_numbers_are_in(scalar_last, order, scalar, columns):
    first, second, numbers = render_pose(ORIENTATION, POSITION, "pose-line", scalar_last).splitlines()
    assert first == (f"# Pose: position x, y, z in mm, then quaternion {order} (Hamilton, {scalar}); "
                     "p_ref = R p_body + t, body -> reference")
    assert second == f"# x_mm y_mm z_mm {columns}"
    values = np.array([float(v) for v in numbers.split(",")])
    np.testing.assert_allclose(values[:3], [250.0, -12.5, 1001.75], atol=1e-12)
    q = ROTATION.as_quat(scalar_first=not scalar_last)          # SciPy, sign made w >= 0 as we print it
    q = q if q[0 if not scalar_last else 3] >= 0 else -q
    np.testing.assert_allclose(values[3:], q, atol=1e-12)
