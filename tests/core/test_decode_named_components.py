"""Decode: numbers named by their keys (q0..q3, q1..q4, x y z w, ax ay az angle, heading pitch roll,
rv_x (rad), r11..r33) are put in place by name, keep the unit their names carry, and say which order
they were written in.

Check values: SciPy's Rotation (from_quat scalar last, from_rotvec, from_euler, from_matrix); q0 or q4
as the scalar part and r<row><column> element names (common practice); sin 45° = 0.7071068 to 7 places
(worked by hand)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode

S = 0.7071068
Z90 = Rotation.from_quat([0, 0, S, S]).as_matrix()        # SciPy, scalar last: 90° about z


@pytest.mark.parametrize("text, written, note", [
    (f"q0={S} q1=0 q2=0 q3={S}", "wxyz", "read by their names (q0, q1, q2, q3) and put in the order w, x, y, z"),
    (f"q1=0 q2=0 q3={S} q0={S}", "xyzw", "read by their names (q1, q2, q3, q0) and put in the order w, x, y, z"),
    (f"q1=0 q2=0 q3={S} q4={S}", "xyzw", "read by their names (q1, q2, q3, q4) and put in the order w, x, y, z;"
                                         " q4 taken as the scalar part"),
    (f"w: {S} x: 0 y: 0 z: {S}", "wxyz", "read by their names (w, x, y, z) and put in the order w, x, y, z"),
    (f"x: 0 y: 0 z: {S} w: {S}", "xyzw", "read by their names (x, y, z, w) and put in the order w, x, y, z"),
    (f"x: 0 y: 0 w: {S} z: {S}", "by name", "read by their names (x, y, w, z) and put in the order w, x, y, z"),
])
def test_quaternion_components_are_placed_by_name(text, written, note):
    best = decode(text)[0]
    assert best.conventions == {"order": written, "convention": "Hamilton", "named": True}
    assert note in best.notes
    np.testing.assert_allclose(best.orientation.as_matrix(), Z90, atol=1e-6)


def test_an_axis_named_by_components_and_an_angle():
    readings = decode("ax: 0 ay: 0 az: 1 angle: 90")
    assert [r.kind for r in readings] == ["axis-angle"]
    assert "read by their names as an axis and an angle" in readings[0].notes
    np.testing.assert_allclose(readings[0].orientation.as_matrix(),
                               Rotation.from_rotvec([0, 0, 90], degrees=True).as_matrix(), atol=1e-12)


def test_a_unit_in_the_angle_name_decides_the_unit():
    # A whole number would be read as degrees; the name says radians.
    readings = decode("axis_x: 0, axis_y: 0, axis_z: 1, angle (rad): 2")
    assert [r.conventions for r in readings] == [{"order": "axis, angle", "units": "rad"}]
    np.testing.assert_allclose(readings[0].orientation.as_matrix(),
                               Rotation.from_rotvec([0, 0, 2]).as_matrix(), atol=1e-12)


def test_heading_is_read_as_yaw():
    readings = decode("heading: 10 pitch: 20 roll: 30")
    assert [r.conventions for r in readings] == [{"sequence": "ZYX", "intrinsic": True, "units": "deg"}]
    assert "read by their names as yaw, pitch, roll (intrinsic Z-Y'-X'')" in readings[0].notes
    np.testing.assert_allclose(readings[0].orientation.as_matrix(),
                               Rotation.from_euler("ZYX", [10, 20, 30], degrees=True).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("text, units", [("rv_x (rad): 0, rv_y (rad): 0, rv_z (rad): 2", "rad"),
                                         ("rv_x_deg: 0, rv_y_deg: 0, rv_z_deg: 2", "deg")])
def test_rotation_vector_components_keep_the_unit_of_their_names(text, units):
    readings = decode(text)
    assert [r.conventions for r in readings] == [{"units": units}]
    assert "read by their names as a rotation vector" in readings[0].notes
    np.testing.assert_allclose(readings[0].orientation.as_matrix(),
                               Rotation.from_rotvec([0, 0, 2], degrees=units == "deg").as_matrix(), atol=1e-12)


def test_matrix_elements_written_column_after_column_are_placed_by_name():
    # r<row><col> written down the columns; as placed, the matrix is 90° about x (rows 1 0 0 / 0 0 -1 / 0 1 0).
    text = "r11=1 r21=0 r31=0 r12=0 r22=0 r32=1 r13=0 r23=-1 r33=0"
    best = decode(text)[0]
    assert "placed by their element names (row, column)" in best.notes
    assert best.numbers == (1.0, 0.0, 0.0, 0.0, 0.0, -1.0, 0.0, 1.0, 0.0)
    want = {"body-to-reference": np.array([[1, 0, 0], [0, 0, -1], [0, 1, 0]], dtype=float)}
    want["reference-to-body"] = want["body-to-reference"].T
    np.testing.assert_allclose(best.orientation.as_matrix(),
                               Rotation.from_matrix(want[best.conventions["matrix"]]).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("text, kind, want", [
    ("degrees or radians?\nrv_x_rad: 0, rv_y_rad: 0, rv_z_rad: 2", "rotation-vector", [0, 0, 2]),
    ("degrees or radians?\naxis_x: 0, axis_y: 0, axis_z: 1, angle_rad: 2", "axis-angle", [0, 0, 2]),
])
def test_a_unit_in_the_names_decides_when_the_words_say_both(text, kind, want):
    # The words name both units, so only the '_rad' in the names can tell: whole numbers must not fall
    # back to degrees.
    readings = decode(text)
    assert [(r.kind, r.conventions["units"]) for r in readings] == [(kind, "rad")]
    np.testing.assert_allclose(readings[0].orientation.as_matrix(), Rotation.from_rotvec(want).as_matrix(),
                               atol=1e-12)
