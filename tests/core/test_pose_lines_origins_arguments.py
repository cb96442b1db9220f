"""Description-file origins and transform arguments (core/decode/pose_lines.py): defaults for what an origin
leaves out, which origins are read, the joints' names and links, quoted argument lists, and the refusals.
Rotations are checked against SciPy's Rotation; words are the module's own. All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

_URDF_NOTE = ("a description file's origin: rpy in radians as roll, pitch, yaw about fixed X, Y, Z; the format's"
              " lengths are metres (common practice), but the text does not say so")


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def test_an_origin_without_rpy_is_no_rotation_and_says_so():
    first = decode('<origin xyz="1 2 3"/>')[0]
    assert first.translation == (1.0, 2.0, 3.0) and first.name is None
    assert first.notes == (_URDF_NOTE, "rpy not written: 0 0 0 (the description format's default)")
    assert np.allclose(_matrix(first), np.eye(3), atol=1e-12)


def test_an_origin_without_xyz_is_at_zero_and_says_so():
    first = decode('<origin rpy="0.1 0.2 0.3"/>')[0]
    assert first.translation == (0.0, 0.0, 0.0)
    assert first.notes == (_URDF_NOTE, "xyz not written: 0 0 0 (the description format's default)")
    # rpy about fixed X, Y, Z = SciPy's extrinsic 'xyz' (common practice for description files)
    assert np.allclose(_matrix(first), Rotation.from_euler("xyz", [0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)


def test_joints_are_read_in_order_with_their_links():
    text = ('<robot>\n<joint name="a"><origin xyz="1 2 3"/><parent link="p"/><child link="c"/></joint>\n'
            '<joint name="b"><origin rpy="0 0 1"/></joint>\n</robot>')
    readings = decode(text)
    assert [r.name for r in readings] == ["a", "b"]
    a, b = readings
    assert "joint 'a': p -> c" in a.notes
    assert not any(n.startswith("joint 'b'") for n in b.notes)       # b writes no links
    assert np.allclose(_matrix(b), Rotation.from_euler("xyz", [0, 0, 1]).as_matrix(), atol=1e-12)


def test_every_link_origin_is_counted_as_set_aside():
    text = ('<robot>\n<link name="l"><visual><origin xyz="1 1 1"/></visual><collision><origin xyz="2 2 2"/>'
            '</collision></link>\n<joint name="j"><origin xyz="0 0 1"/></joint>\n</robot>')
    readings = decode(text)
    assert [r.name for r in readings] == ["j"] and readings[0].translation == (0.0, 0.0, 1.0)
    assert "2 origin(s) outside a joint (visual, collision or inertial offsets) not read" in readings[0].notes


def test_a_link_origin_alone_without_joints_is_read():
    first = decode('<link name="l"><visual><origin xyz="1 1 1" rpy="0 0 0"/></visual></link>')[0]
    assert first.translation == (1.0, 1.0, 1.0)
    assert not any("not read" in n for n in first.notes)


@pytest.mark.parametrize("rpy, count", [("0 0", 2), ("0 0 0 0", 4)])
def test_an_rpy_of_other_than_three_numbers_is_refused(rpy, count):
    with pytest.raises(DecodeError, match=rf"^line 1: rpy holds {count} numbers; it needs roll, pitch and yaw"):
        decode(f'<origin xyz="0 0 0" rpy="{rpy}"/>')


def test_a_quoted_argument_list_is_read():
    first = decode("arguments=['0', '0', '1', '0', '0', '0', 'base', 'imu']")[0]
    assert first.name == "base -> imu" and first.translation == (0.0, 0.0, 1.0)
    assert first.conventions["units"] == "rad"


def test_seven_arguments_are_a_quaternion_written_w_last():
    first = decode("1 2 3 0 0 0.6 0.8 base cam")[0]
    assert first.translation == (1.0, 2.0, 3.0) and first.conventions["order"] == "xyzw"
    assert len(decode("1 2 3 0 0 0.6 0.8 base cam")) == 1
    # qz = 0.6, qw = 0.8 (SciPy, scalar last)
    assert np.allclose(_matrix(first), Rotation.from_quat([0, 0, 0.6, 0.8]).as_matrix(), atol=1e-12)


def test_a_number_before_the_arguments_is_refused():
    with pytest.raises(DecodeError, match=r"^line 1: '5' before the transform arguments is not one of them;"
                                          r" Framewright will not guess which numbers are the pose \(remove it\)"):
        decode("publish 5 0 0 0 0 0 0.6 0.8 map odom")


def test_a_word_before_the_arguments_is_not_refused():
    first = decode("publish 0 0 0 0 0 0 map odom")[0]
    assert first.name == "map -> odom"


@pytest.mark.parametrize("text", ["0 0 0 0 0 0.1 map odom 0.5", "0 0 0 0 0 0.1 map odom 10"])
def test_a_period_after_the_names_is_named_as_no_part_of_the_pose(text):
    first = decode(text)[0]
    period = text.split()[-1]
    assert f"the last argument ({period}) is the publishing period, not part of the pose" in first.notes
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [0, 0, 0.1]).as_matrix(), atol=1e-12)


def test_a_link_after_a_joint_ends_that_joint_so_its_origins_are_set_aside():
    text = ('<robot>\n<joint name="j"><origin xyz="0 0 1"/><parent link="a"/><child link="b"/></joint>\n'
            '<link name="b"><visual><origin xyz="5 5 5" rpy="0 0 1"/></visual></link>\n</robot>')
    readings = decode(text)
    assert [r.name for r in readings] == ["j"] and readings[0].translation == (0.0, 0.0, 1.0)
    assert "1 origin(s) outside a joint (visual, collision or inertial offsets) not read" in readings[0].notes
