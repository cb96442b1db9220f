"""Transform flags (core/decode/pose_flags.py): the transform's name from the frame flags (each spelling
of parent and child), and the words of the readings. Rotations are checked against SciPy's Rotation;
words are the module's own. All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


@pytest.mark.parametrize("parent, child", [("--frame-id", "--child-frame-id"), ("--parent", "--child"),
                                           ("--parent-frame", "--child-frame")])
def test_the_frame_flags_name_the_transform(parent, child):
    first = decode(f"--x 1 --y 2 --z 3 --yaw 0.5 {parent} base {child} cam")[0]
    assert first.name == "base -> cam" and first.translation == (1.0, 2.0, 3.0)
    # yaw only: SciPy's intrinsic 'ZYX' (yaw, pitch, roll)
    expected = Rotation.from_euler("ZYX", [0.5, 0, 0]).as_matrix()
    assert np.allclose(np.asarray(first.orientation.as_matrix()), expected, atol=1e-12)


@pytest.mark.parametrize("frames", ["--frame-id base", "--child-frame-id cam", ""])
def test_one_frame_flag_alone_names_nothing(frames):
    assert decode(f"--x 1 --y 2 --z 3 --yaw 0.5 {frames}")[0].name is None


def test_the_frame_flags_are_not_named_as_set_aside():
    first = decode("--x 1 --y 2 --z 3 --qw 1 --frame-id base --child-frame-id cam --rate 10")[0]
    assert "flags that are no part of the pose were set aside: --rate" in first.notes


def test_the_reading_says_the_flags_fix_the_sequence_and_units():
    first = decode("--x 1 --y 2 --z 3 --yaw 0.5")[0]
    assert "sequence fixed by the transform flags" in first.why
    assert "units fixed by the transform flags" in first.why


def test_the_notes_of_quaternion_flags_are_in_order_and_in_full():
    first = decode("--x 1 --qz 0.6 --qw 0.8")[0]
    assert first.notes == ("flags --qx --qy --qz --qw read as a quaternion",
                           "not given, so taken as the named-flag form's default: --y 0, --z 0",
                           "not given, so taken as the named-flag form's default: --qx 0, --qy 0",
                           "transform arguments' lengths are metres (common practice), but the text does not say so")
    assert first.conventions["order"] == "wxyz"
    # qz = 0.6, qw = 0.8 (SciPy, scalar last)
    assert np.allclose(np.asarray(first.orientation.as_matrix()), Rotation.from_quat([0, 0, 0.6, 0.8]).as_matrix(),
                       atol=1e-12)


def test_a_left_out_qw_is_one_and_says_so():
    first = decode("--x 0 --y 0 --z 0 --qx 0 --qy 0 --qz 0")[0]
    assert "not given, so taken as the named-flag form's default: --qw 1" in first.notes
    assert np.allclose(np.asarray(first.orientation.as_matrix()), np.eye(3), atol=1e-12)


def test_both_rotations_in_flags_are_refused_in_full():
    with pytest.raises(DecodeError, match=r"^line 1: the flags give both a quaternion \(--qz\) and angles \(--yaw\);"
                                          r" a pose has one rotation: drop one set$"):
        decode("--x 1 --qz 0.6 --yaw 1")


def test_a_flag_given_twice_is_refused_at_the_second():
    with pytest.raises(DecodeError, match=r"^line 2: the flag --x is given twice; which one is meant\?$"):
        decode("--x 1 --yaw 1\n--x 2")


def test_a_flag_holding_two_numbers_is_refused_naming_the_flag():
    with pytest.raises(DecodeError, match=r"^line 1: '--x' should hold one number; found 2"):
        decode("--x 1,2 --yaw 1")


def test_a_non_pose_flag_given_twice_is_not_refused():
    first = decode("--x 1 --yaw 1 --rate 2 --rate 3")[0]
    assert first.translation == (1.0, 0.0, 0.0)
