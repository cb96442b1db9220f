"""A transform printout block whose representations disagree (issue 11 item 2: read them all and report
their agreement). Agreement within what the printed digits allow is reported; a block whose quaternion
and angles are further apart than rounding can explain contradicts itself and is refused: before, a
quaternion of 90° beside RPY of 57.3° was read with exit 0 and a note.

The printouts below are made from SciPy's Rotation (as_quat scalar last, as_euler('xyz') for roll,
pitch, yaw about fixed X, Y, Z, as_matrix), rounded to 3 decimals as the echo tool prints them by default
(from memory), for random rotations; the rounding must never be taken for a contradiction."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def _printout(rotation: Rotation, t=(0.1, -0.2, 0.3), digits=3, matrix=True) -> str:
    f = lambda values: "[" + ", ".join(f"{v:.{digits}f}" for v in values) + "]"
    m = np.eye(4)
    m[:3, :3], m[:3, 3] = rotation.as_matrix(), t
    text = (f"At time 1700000000.000\n- Translation: {f(t)}\n"
            f"- Rotation: in Quaternion {f(rotation.as_quat())}\n"
            f"            in RPY (radian) {f(rotation.as_euler('xyz'))}\n"
            f"            in RPY (degree) {f(rotation.as_euler('xyz', degrees=True))}\n")
    if matrix:
        text += "- Matrix:\n" + "".join("  " + " ".join(f"{v:{digits + 4}.{digits}f}" for v in row) + "\n" for row in m)
    return text


@pytest.mark.parametrize("seed", range(40))
def test_rounding_to_the_printed_digits_is_never_taken_for_a_contradiction(seed):
    rotation = Rotation.random(random_state=seed)
    top = decode(_printout(rotation))[0]
    found = Rotation.from_quat(np.asarray(top.orientation.as_quaternion()), scalar_first=True)
    assert np.degrees((rotation.inv() * found).magnitude()) < 0.2          # 3 decimals of degrees and radians
    assert any("agree within" in n for n in top.notes)


@pytest.mark.parametrize("digits", [2, 4, 6])
def test_other_precisions_are_judged_by_their_own_digits(digits):
    for seed in range(10):
        decode(_printout(Rotation.random(random_state=100 + seed), digits=digits))


def test_a_quaternion_and_angles_that_contradict_each_other_are_refused_naming_both():
    text = ("At time 0.0\n- Translation: [1.000, 2.000, 3.000]\n"
            "- Rotation: in Quaternion [0.000, 0.000, 0.707, 0.707]\n"      # 90° about z
            "            in RPY (radian) [0.000, 0.000, 1.000]\n"          # 57.3° about z
            "            in RPY (degree) [0.000, 0.000, 57.296]")
    with pytest.raises(DecodeError) as refused:
        decode(text)
    message = str(refused.value)
    assert "quaternion" in message and "RPY" in message and "apart" in message


def test_a_matrix_that_disagrees_with_the_quaternion_by_one_degree_is_refused():
    good = Rotation.from_euler("xyz", [0, 0, 30], degrees=True)
    text = _printout(good, matrix=False)
    off = Rotation.from_euler("xyz", [0, 0, 31], degrees=True).as_matrix()    # SciPy: 1° further
    text += "- Matrix:\n" + "".join("  " + " ".join(f"{v:7.3f}" for v in list(row) + [t]) + "\n"
                                    for row, t in zip(off, (0.1, -0.2, 0.3)))
    text += "  0.000 0.000 0.000 1.000\n"
    with pytest.raises(DecodeError, match="matrix"):
        decode(text)
