"""Transform flags (core/decode/pose_flags.py): the transform's name from the frame flags (each spelling
of parent and child), and the words of the readings. Rotations are checked against SciPy's Rotation;
words are the module's own. All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode


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
