"""Poses written on lines (core/decode/pose_lines.py), as a user pastes them: what each decodes to, the
notes that say how it was read, the line each note or refusal points at, and the headers that are no
pose. Rotations are checked against SciPy's Rotation; note and refusal words are the module's own.
All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def test_transform_arguments_say_their_units_are_assumed():
    first = decode("0 0 0 0 0 0 1 map odom")[0]
    assert first.notes[0] == ("transform arguments are in radians; their lengths are metres (common practice),"
                              " but the text does not say so")
    assert "arguments x y z qx qy qz qw: the quaternion is written w last" in first.notes
    assert first.conventions["order"] == "xyzw"


def test_transform_arguments_with_a_period_name_it_and_read_yaw_pitch_roll():
    first = decode("0.5 -1 2 0.1 0.2 0.3 map odom 100")[0]
    assert first.translation == (0.5, -1.0, 2.0) and first.name == "map -> odom"
    assert "the last argument (100) is the publishing period, not part of the pose" in first.notes
    assert "arguments x y z yaw pitch roll: yaw-pitch-roll, intrinsic Z-Y'-X''" in first.notes
    # yaw, pitch, roll = SciPy's intrinsic 'ZYX' (common practice for these arguments)
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)
    assert "sequence fixed by the transform arguments" in first.why


def test_a_pose_element_is_read_with_its_notes_and_no_name():
    first = decode("<pose>1 2 3 0.1 0.2 0.3</pose>")[0]
    assert first.name is None and first.translation == (1.0, 2.0, 3.0)
    assert first.notes == ("a <pose> element: x y z, then roll, pitch, yaw about fixed X, Y, Z in radians",)
    # roll, pitch, yaw about fixed X, Y, Z = SciPy's extrinsic 'xyz' (common practice for description files)
    assert np.allclose(_matrix(first), Rotation.from_euler("xyz", [0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)


def test_a_pose_element_in_degrees_relative_to_a_frame_says_so():
    first = decode('<pose degrees="true" relative_to="base">1 2 3 10 20 30</pose>')[0]
    assert first.notes == ("a <pose> element: x y z, then roll, pitch, yaw about fixed X, Y, Z in degrees"
                           " (the element says degrees)", "relative to 'base'")
    # SciPy's extrinsic 'xyz' in degrees
    assert np.allclose(_matrix(first), Rotation.from_euler("xyz", [10, 20, 30], degrees=True).as_matrix(),
                       atol=1e-12)


@pytest.mark.parametrize("body, count", [("1 2 3 10 20", 5), ("1 2 3 10 20 30 40", 7)])
def test_a_pose_element_with_other_than_six_numbers_is_refused_at_its_line(body, count):
    with pytest.raises(DecodeError, match=rf"^line 2: a <pose> holds {count} numbers; it needs x y z roll pitch yaw"):
        decode(f"<model>\n<pose>{body}</pose>\n</model>")


def test_a_quaternion_sum_says_which_term_is_the_scalar():
    first = decode("0.5 - 0.5i + 0.5j - 0.5k")[0]
    assert first.notes == ("written as w + xi + yj + zk: the term without i, j or k is the scalar part",)
    # SciPy's from_quat with scalar_first=True: the signs of the written terms are kept
    expected = Rotation.from_quat([0.5, -0.5, 0.5, -0.5], scalar_first=True).as_matrix()
    assert np.allclose(_matrix(first), expected, atol=1e-12)


def test_a_quaternion_sum_with_terms_left_out_names_them_as_zero():
    first = decode("0.6 + 0.8k")[0]
    assert "terms not written are zero: x, y" in first.notes
    # SciPy: w = 0.6, z = 0.8 is a turn about Z by 2 acos(0.6)
    expected = Rotation.from_quat([0.6, 0, 0, 0.8], scalar_first=True).as_matrix()
    assert np.allclose(_matrix(first), expected, atol=1e-12)


def test_a_quaternion_sum_naming_a_unit_twice_is_refused():
    with pytest.raises(DecodeError, match=r"^the quaternion '1 \+ 0i \+ 0i' names i twice"):
        decode("1 + 0i + 0i")


def test_an_inline_header_note_names_its_own_line():
    first = decode("note\npose [x, y, z, qx, qy, qz, qw] = [1, 2, 3, 0, 0, 0, 1]")[0]
    assert first.notes[0] == "columns named by the header on line 2: x y z qx qy qz qw"
    assert first.translation == (1.0, 2.0, 3.0) and first.conventions["order"] == "xyzw"


def test_bare_names_before_their_numbers_name_their_line():
    first = decode("pose of the camera\n\nx y z qw qx qy qz: 1 2 3 1 0 0 0")[0]
    assert first.notes[0] == "columns named by the header on line 3: x y z qw qx qy qz"


@pytest.mark.parametrize("text, line", [("# timestamp tx ty tz qx qy qz qw\n1 2 3 4 0 0 0 1", 1),
                                        ("log of the arm\n\n# timestamp tx ty tz qx qy qz qw\n1 2 3 4 0 0 0 1", 3)])
def test_a_header_row_note_names_the_header_line(text, line):
    first = decode(text)[0]
    assert first.notes[0] == f"columns named by the header on line {line}: timestamp tx ty tz qx qy qz qw"
    assert "the time column (1) was set aside" in first.notes
    assert first.translation == (2.0, 3.0, 4.0)


def test_several_pose_lines_read_the_last_and_say_so():
    first = decode("# t x y z qw qx qy qz\n0 1 2 3 1 0 0 0\n1 4 5 6 0 1 0 0")[0]
    assert first.translation == (4.0, 5.0, 6.0)
    assert "the text holds 2 pose lines; read the last (line 3)" in first.notes
    # w, x, y, z = 0, 1, 0, 0: a half turn about X (SciPy, scalar first)
    assert np.allclose(_matrix(first), Rotation.from_quat([0, 1, 0, 0], scalar_first=True).as_matrix(), atol=1e-12)


def test_shuffled_quaternion_columns_are_put_in_order_by_name():
    first = decode("# t x y z qx qw qz qy\n0 1 2 3 0.6 0.8 0 0")[0]
    assert "the quaternion's columns are named; read as w, x, y, z" in first.notes
    # qx = 0.6, qw = 0.8 by name (SciPy, scalar last)
    assert np.allclose(_matrix(first), Rotation.from_quat([0.6, 0, 0, 0.8]).as_matrix(), atol=1e-12)


def test_a_header_row_with_too_few_numbers_under_it_is_refused_at_the_data_line():
    with pytest.raises(DecodeError, match=r"^line 2: 6 numbers under a header of 7 columns"):
        decode("# x y z qx qy qz qw\n1 2 3 0 0 0")


def test_roll_pitch_yaw_columns_without_a_position_are_no_pose_line():
    # time, roll, pitch, yaw and two unknown columns: no position, so no pose header; six bare numbers
    # are then refused rather than read as angles with the time set aside
    with pytest.raises(DecodeError, match=r"found 6 numbers"):
        decode("time,roll,pitch,yaw,foo,bar\n0,0.1,0.2,0.3,5,6")


def test_a_header_of_position_and_angles_reads_them_by_name():
    first = decode("x,y,z,roll,pitch,yaw\n1,2,3,0.1,0.2,0.3")[0]
    assert first.translation == (1.0, 2.0, 3.0)
    assert first.conventions["units"] == "rad"
    # roll 0.1, pitch 0.2, yaw 0.3 = SciPy's intrinsic 'ZYX' with (yaw, pitch, roll)
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [0.3, 0.2, 0.1]).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("text, wxyz, missing", [
    ("0.6 + 0.8*k", (0.6, 0, 0, 0.8), "x, y"),
    ("q = 0.5+0.5i+0.5j+0.5k", (0.5, 0.5, 0.5, 0.5), None),
    ("attitude\n-0.5 + 0.5 i - 0.5 j + 0.5 k", (-0.5, 0.5, -0.5, 0.5), None),
    ("0.6i + 0.8", (0.8, 0.6, 0, 0), "y, z"),
    ("1e-1 + 9.9499e-1j", (0.1, 0, 0.99499, 0), "x, z"),
])
def test_each_way_of_writing_a_quaternion_sum_reads_its_parts(text, wxyz, missing):
    readings = decode(text)
    assert len(readings) == 1 and readings[0].label.startswith("quaternion written as a sum: ")
    assert readings[0].numbers == tuple(float(v) for v in wxyz)
    assert (f"terms not written are zero: {missing}" in readings[0].notes) == (missing is not None)
    # SciPy, scalar first (normalised, as SciPy does)
    expected = Rotation.from_quat(list(wxyz), scalar_first=True).as_matrix()
    assert np.allclose(_matrix(readings[0]), expected, atol=1e-9)


def test_two_numbers_without_imaginary_units_are_no_quaternion_sum():
    with pytest.raises(DecodeError, match=r"^found 2 numbers"):
        decode("0.5 - 0.5")
