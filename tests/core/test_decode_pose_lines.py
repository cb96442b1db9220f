"""Poses written on lines: a description file's joints, transform arguments, quaternions written as a
sum and pose lines under a header naming their columns. What a user relies on: which origin is read,
the notes that say what was read, the line a refusal points at, and the header's limits. Values are
invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

DESCRIPTION = """<robot name="r">
<joint name="cam_joint" type="fixed">
<origin xyz="0.1 0.2 0.3" rpy="0.3 -0.2 0.5"/>
<parent link="base"/>
<child link="cam"/>
</joint>
<link name="cam">
<visual>
<origin xyz="1 1 1" rpy="0 0 1"/>
</visual>
</link>
</robot>"""


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def test_a_joints_origin_is_read_and_a_links_visual_origin_is_set_aside():
    readings = decode(DESCRIPTION)
    assert len(readings) == 1
    first = readings[0]
    assert first.name == "cam_joint" and first.translation == (0.1, 0.2, 0.3)
    # rpy about fixed X, Y, Z = SciPy's extrinsic 'xyz' in radians (common practice for description files)
    assert np.allclose(_matrix(first), Rotation.from_euler("xyz", [0.3, -0.2, 0.5]).as_matrix(), atol=1e-12)
    assert "joint 'cam_joint': base -> cam" in first.notes
    assert "1 origin(s) outside a joint (visual, collision or inertial offsets) not read" in first.notes


def test_transform_arguments_are_labelled_as_such_and_name_parent_and_child():
    first = decode("0.1 0.2 0.3 0.5 0 0 map odom")[0]
    assert first.label.startswith("transform arguments: ")
    assert first.name == "map -> odom" and first.translation == (0.1, 0.2, 0.3)
    # x y z yaw pitch roll: SciPy's intrinsic 'ZYX' with (yaw, pitch, roll)
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [0.5, 0, 0]).as_matrix(), atol=1e-12)


def test_a_stray_value_before_transform_arguments_is_refused_at_its_line():
    with pytest.raises(DecodeError, match=r"^line 2: 'nan' before the transform arguments is not one of them"):
        decode("note\n0 nan 0 0 0 0 0.7 0.7 map odom")


def test_more_than_a_quaternion_sum_on_its_line_is_refused_at_that_line():
    with pytest.raises(DecodeError, match=r"^line 2: '0\.7071 2\*\*3 \+ 0i \+ 0\.7071j \+ 0k' holds more than a"
                                          r" quaternion written as a sum"):
        decode("hello\n0.7071 2**3 + 0i + 0.7071j + 0k")


@pytest.mark.parametrize("text, line", [("x y z yaw pitch roll: 1e12 0 0.2 0.5 0 0", 1),
                                        ("first\nx y z yaw pitch roll: 1e12 0 0.2 0.5 0 0", 2)])
def test_a_bad_value_after_named_columns_is_refused_at_its_line(text, line):
    with pytest.raises(DecodeError, match=rf"^line {line}: the translation 1e\+12 is not a usable distance"):
        decode(text)


def test_one_pose_line_has_no_note_about_several_and_two_lines_read_the_last():
    one = decode("# tx ty tz qx qy qz qw\n1 2 3 0 0 0 1")[0]
    assert not any("pose lines" in n for n in one.notes)
    two = decode("# tx ty tz qx qy qz qw\n1 2 3 0 0 0 1\n4 5 6 0 0 0 1")[0]
    assert two.translation == (4.0, 5.0, 6.0)
    assert "the text holds 2 pose lines; read the last (line 3)" in two.notes


def test_roll_pitch_yaw_columns_are_read_yaw_pitch_roll_about_moving_axes():
    first = decode("# tx ty tz roll pitch yaw\n1 2 3 0.1 0.2 0.3")[0]
    assert "roll, pitch and yaw read by name (yaw-pitch-roll, intrinsic Z-Y'-X'')" in first.notes
    # SciPy's intrinsic 'ZYX' with (yaw, pitch, roll); 0.1..0.3 read as radians first
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [0.3, 0.2, 0.1]).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("length, read", [(60, True), (61, False)])
def test_a_column_name_longer_than_60_characters_names_no_column(length, read):
    name = "translation" + "_" * (length - 12) + "x"
    assert len(name) == length
    first = decode(f"# time {name} ty tz qx qy qz qw\n0 1 2 3 0 0 0 1")[0]
    if read:
        assert first.translation == (1.0, 2.0, 3.0)
    else:
        assert first.translation is None
        assert any(n.startswith("columns not read (no part of a pose): " + name) for n in first.notes)


def test_a_header_of_400_characters_is_still_a_header():
    header = "tx ty tz qx qy qz qw " + "c" * 379
    assert len(header) == 400
    first = decode(f"# {header}\n1 2 3 0 0 0 1 9")[0]
    assert first.label.startswith("pose line") and first.translation == (1.0, 2.0, 3.0)


def test_a_header_of_401_characters_is_no_header():
    header = "tx ty tz qx qy qz qw " + "c" * 380
    try:
        readings = decode(f"# {header}\n1 2 3 0 0 0 1 9")
    except DecodeError:
        return                      # refused: fine, it is not read as a pose line
    assert not any(r.label.startswith("pose line") for r in readings)
