"""The pose copies: a 4×4 homogeneous matrix and a pose line (position, then quaternion) with a header
that names the order, units and convention; each is read back before it is called verified, and a copy
changed by one digit, a wrong last row or a missing unit is caught.

Check values: CONVENTIONS.md "Poses" (p_ref = R · p_body + t, [[R, t], [0 0 0 1]]); the 4×4 is compared
with one built by numpy from SciPy's Rotation (a general-purpose reference library), and used on a point
against SciPy's apply plus t; the quaternion against SciPy's as_quat."""

import re

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.errors import FramewrightError
from core.orientation import Orientation
from core.pose_formats import pose_round_trip, read_pose, render_pose
from core.position import Position

ROTATION = Rotation.from_euler("ZYX", [123.4, -41.0, 7.25], degrees=True)
ORIENTATION = Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True))
POSITION = Position.from_shown((250.0, -12.5, 1001.75), "mm")


def _numbers(text):
    return np.array([[float(v) for v in line.replace(",", " ").split()] for line in text.splitlines()[1:]])


def test_the_4x4_copy_is_the_homogeneous_matrix_numpy_builds_from_scipy():
    text = render_pose(ORIENTATION, POSITION, "pose-matrix")
    assert text.startswith("# Pose as a 4x4 homogeneous matrix [[R, t], [0, 0, 0, 1]], p_ref = R p_body + t")
    assert "t in mm" in text.splitlines()[0]
    h = _numbers(text)
    want = np.eye(4)
    want[:3, :3] = ROTATION.as_matrix()
    want[:3, 3] = (250.0, -12.5, 1001.75)
    np.testing.assert_allclose(h, want, atol=1e-12)
    # Used on a body point it moves it as SciPy's rotation plus the translation does (mm).
    point = np.array([10.0, -3.0, 4.5])
    np.testing.assert_allclose((h @ np.append(point, 1.0))[:3], ROTATION.apply(point) + want[:3, 3], atol=1e-9)


@pytest.mark.parametrize("scalar_last", [False, True])
def test_the_pose_line_names_its_order_and_holds_position_then_quaternion(scalar_last):
    text = render_pose(ORIENTATION, POSITION.in_unit("m"), "pose-line", scalar_last)
    header, columns, line = text.splitlines()
    assert "position x, y, z in m" in header
    assert columns == "# x_m y_m z_m " + ("qx qy qz qw" if scalar_last else "qw qx qy qz")
    assert ("x, y, z, w" if scalar_last else "w, x, y, z") in header
    values = [float(v) for v in line.split(",")]
    np.testing.assert_allclose(values[:3], (0.25, -0.0125, 1.00175), atol=1e-15)
    q = ROTATION.as_quat(scalar_first=not scalar_last)
    assert abs(abs(np.dot(values[3:], q)) - 1.0) < 1e-15        # q and −q are one orientation


@pytest.mark.parametrize("fmt", ["pose-matrix", "pose-line"])
@pytest.mark.parametrize("unit", ["mm", "m", "in", "thou"])
@pytest.mark.parametrize("scalar_last", [False, True])
def test_every_pose_copy_reads_back_exactly(fmt, unit, scalar_last):
    # Scalar last was refused on its way back: the header's named columns were put in w, x, y, z order
    # and then said to conflict with the 'x, y, z, w' the copy was asked for.
    position = POSITION.in_unit(unit)
    text = render_pose(ORIENTATION, position, fmt, scalar_last)
    angle, distance = pose_round_trip(ORIENTATION, position, text, fmt, scalar_last)
    assert angle < 1e-9 and distance < 1e-12


@pytest.mark.parametrize("scalar_last", [False, True])
def test_a_pose_line_reads_back_as_scipys_rotation_in_either_order(scalar_last):
    text = render_pose(ORIENTATION, POSITION, "pose-line", scalar_last)
    back, metres = read_pose(text, "pose-line", scalar_last)
    # SciPy's Rotation gives the check: the angle between the two is ~0 (q and −q alike).
    assert (Rotation.from_quat(back.as_quaternion(scalar_last=True)) * ROTATION.inv()).magnitude() < 1e-12
    np.testing.assert_allclose(metres, (0.25, -0.0125, 1.00175), atol=1e-15)


@pytest.mark.parametrize("scalar_last", [False, True])
def test_a_pose_line_read_with_the_other_order_is_refused_not_read(scalar_last):
    text = render_pose(ORIENTATION, POSITION, "pose-line", scalar_last)
    written, asked = ("xyzw", "wxyz") if scalar_last else ("wxyz", "xyzw")
    with pytest.raises(FramewrightError, match=f"whose order is '{written}'; the order hint says '{asked}'"):
        read_pose(text, "pose-line", not scalar_last)


def test_a_pose_line_with_its_quaternion_columns_shuffled_is_read_by_name():
    # Columns qx qw qz qy: each number goes where its name says (SciPy's scalar-last array is the check).
    x, y, z, w = ROTATION.as_quat()
    text = f"# x_mm y_mm z_mm qx qw qz qy\n250, -12.5, 1001.75, {x!r}, {w!r}, {z!r}, {y!r}\n"
    back, _ = read_pose(text, "pose-line")
    assert (Rotation.from_quat(back.as_quaternion(scalar_last=True)) * ROTATION.inv()).magnitude() < 1e-12


def test_a_copy_changed_by_one_digit_is_caught_by_the_round_trip():
    text = render_pose(ORIENTATION, POSITION, "pose-matrix")
    changed = text.replace("1001.75", "1001.76")
    assert pose_round_trip(ORIENTATION, POSITION, changed, "pose-matrix")[1] == pytest.approx(1e-5, rel=1e-6)
    line = render_pose(ORIENTATION, POSITION, "pose-line")
    _, distance = pose_round_trip(ORIENTATION, POSITION, line.replace("250.0", "251.0"), "pose-line")
    assert distance == pytest.approx(1e-3, rel=1e-9)


@pytest.mark.parametrize("change, words", [
    (lambda t: t.replace("0.0  0.0  0.0  1.0", "0.0  0.0  0.1  1.0"), "last row"),
    (lambda t: t.replace("t in mm", "t in cubits"), "names no length unit"),
    (lambda t: t.replace("# Pose", "Pose"), "20 numbers"),          # the header's [0, 0, 0, 1] becomes data
    (lambda t: t.replace("1001.75", "1001.75 nan"), "not a finite number"),
    (lambda t: t.replace("1001.75", "1001.75 7"), "17 numbers"),
    (lambda t: t.replace("1001.75", "NaN"), "not a finite number"),
    (lambda t: "\n".join(t.splitlines()[:-1]), "not as a 4x4 transform"),
])
def test_a_damaged_4x4_copy_is_refused_not_read(change, words):
    with pytest.raises(FramewrightError, match=words):
        read_pose(change(render_pose(ORIENTATION, POSITION, "pose-matrix")), "pose-matrix")


def test_a_pose_copy_needs_a_position():
    with pytest.raises(FramewrightError, match="needs a mount with a position"):
        render_pose(ORIENTATION, None, "pose-line")


@pytest.mark.parametrize("fmt, words", [("pose-matrix", "t in inches"), ("pose-line", "# x_in y_in z_in ")])
def test_a_pose_in_inches_names_them_in_full_and_reads_back_in_inches(fmt, words):
    # 1 in = 25.4 mm exactly (international inch, common practice): 250 mm is 9.84251968503937 in.
    position = POSITION.in_unit("in")
    text = render_pose(ORIENTATION, position, fmt)
    assert words in text and not re.search(r"\bin in\b", text)
    _, metres = read_pose(text, fmt)
    np.testing.assert_allclose(metres, (0.25, -0.0125, 1.00175), atol=1e-15)


def test_a_pose_in_thou_reads_back_in_thou():
    text = render_pose(ORIENTATION, POSITION.in_unit("thou"), "pose-line")
    assert "# x_thou y_thou z_thou qw qx qy qz" in text
    _, metres = read_pose(text, "pose-line")
    np.testing.assert_allclose(metres, (0.25, -0.0125, 1.00175), atol=1e-15)
