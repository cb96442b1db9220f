"""What a pose reading says about itself: how many transforms the text holds, whose word fixed a
convention, how a one-line matrix was laid out, where stray numbers are, and the name a JSON pose takes.
Values are invented."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def test_two_unnamed_transforms_are_counted_with_no_list_of_names():
    text = json.dumps([{"position": [1, 2, 3], "orientation": [0, 0, 0, 1]},
                       {"position": [4, 5, 6], "orientation": [0, 0, 0, 1]}])
    readings = decode(text)
    assert {r.translation for r in readings} == {(1.0, 2.0, 3.0), (4.0, 5.0, 6.0)}
    counted = [n for n in readings[0].notes if n.startswith("the text holds 2 transforms")]
    assert counted == ["the text holds 2 transforms"]


def test_two_named_transforms_are_counted_with_their_names():
    readings = decode("R0_rect: [0, -1, 0, 1, 0, 0, 0, 0, 1]\nTr: [0, -1, 0, 1, 1, 0, 0, 2, 0, 0, 1, 3]\n")
    assert "the text holds 2 transforms (R0_rect, Tr)" in readings[0].notes


def test_a_hint_that_agrees_with_the_format_is_credited_to_the_user():
    first = decode("translation: [1, 2, 3]\nrpy: [0.3, -0.2, 0.5]", {"units": "rad"})[0]
    assert "units given" in first.why and "units fixed by" not in first.why
    assert "sequence fixed by the pose" in first.why        # the user did not give the sequence
    # fixed-axis roll, pitch, yaw = SciPy's extrinsic 'xyz', radians (common practice)
    assert np.allclose(_matrix(first), Rotation.from_euler("xyz", [0.3, -0.2, 0.5]).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("count, shape", [(16, "4x4"), (12, "3x4")])
def test_numbers_on_one_line_say_which_matrix_they_were_read_as(count, shape):
    values = [0, -1, 0, 1, 1, 0, 0, 2, 0, 0, 1, 3, 0, 0, 0, 1][:count]
    first = decode(" ".join(map(str, values)))[0]
    assert f"{count} numbers on one line read as a {shape} matrix, row after row" in first.notes
    assert first.translation == (1.0, 2.0, 3.0)
    # a quarter turn about z: SciPy's Rotation.from_rotvec([0, 0, pi/2])
    assert np.allclose(_matrix(first), Rotation.from_rotvec([0, 0, np.pi / 2]).as_matrix(), atol=1e-12)


def test_numbers_under_no_key_are_refused_at_their_line():
    with pytest.raises(DecodeError, match=r"^line 3: '0\.5 0\.6' holds numbers under no key of the pose"):
        decode("translation: [1, 2, 3]\nrpy: [0.3, -0.2, 0.5]\n0.5 0.6\n")


def test_a_json_pose_at_the_top_takes_no_name():
    first = decode(json.dumps({"position": [1, 2, 3], "orientation": [0.1, 0.2, 0.3, 0.927]}))[0]
    assert first.name is None and first.translation == (1.0, 2.0, 3.0)
    # SciPy's from_quat is x, y, z, w (scalar last)
    assert np.allclose(_matrix(first), Rotation.from_quat([0.1, 0.2, 0.3, 0.927]).as_matrix(), atol=1e-12)
