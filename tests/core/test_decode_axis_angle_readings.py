"""Decode, four numbers read as an axis and an angle: labels, reasons word for word, the orientation
against SciPy's Rotation (from_rotvec of the unit axis times the angle), and the limits from both sides:
an axis of unit length within 1e-3, an axis length strictly between 0.5 and 2 counted as near unit, an
angle beyond 1 (plus 1e-9) said to be no quaternion part, angle-first when only the last three are a unit
axis. The numbers are invented demo values; the points come from the module's own table."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.decode.candidates import POINTS


def axis_angle(text, label):
    found = [r for r in decode(text) if r.label == label]
    assert len(found) == 1, [r.label for r in decode(text)]
    return found[0]


def scipy(axis, angle, degrees):
    axis = np.array(axis, dtype=float) / np.linalg.norm(axis)
    return Rotation.from_rotvec(axis * (math.radians(angle) if degrees else angle))


DEG = "axis (x, y, z) and angle in degrees"


def test_a_unit_axis_and_an_angle_in_degrees():
    r = axis_angle("0 0 1 90", DEG)
    assert r.why == ("a value beyond ±2π: degrees; the axis numbers have unit length, as an axis has; the angle (90)"
                     " is beyond ±1: an angle, not a quaternion part")
    assert r.conventions == {"order": "axis, angle", "units": "deg"}
    assert r.notes == ()
    assert np.allclose(r.orientation.as_matrix(), scipy([0, 0, 1], 90, True).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("z, unit", [("1.0009", True), ("0.9991", True), ("1.0011", False), ("0.9989", False)])
def test_unit_axis_within_one_thousandth(z, unit):
    r = axis_angle(f"0 0 {z} 90", DEG)
    said = "the axis numbers have unit length, as an axis has" if unit else f"the axis has length {z}, not 1"
    assert f"; {said};" in r.why
    assert np.allclose(r.orientation.as_matrix(), scipy([0, 0, float(z)], 90, True).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("near, far", [("1.9", "2.1"), ("0.51", "0.5"), ("1.99", "2"), ("0.6", "0.49")])
def test_near_unit_axis_lengths_lie_strictly_between_half_and_two(near, far):
    a, b = axis_angle(f"0 0 {near} 90", DEG), axis_angle(f"0 0 {far} 90", DEG)
    assert f"the axis has length {near}, not 1" in a.why and f"the axis has length {far}, not 1" in b.why
    assert a.score - b.score == pytest.approx(POINTS["near unit axis"] - POINTS["far from unit axis"])
    assert a.notes == (f"axis normalised from length {near}",)


def test_an_angle_of_one_may_be_a_quaternion_part_and_beyond_one_not():
    at_one = axis_angle("0 0 1 1.0", "axis (x, y, z) and angle in radians")
    assert "beyond ±1" not in at_one.why
    beyond = axis_angle("0 0 1 1.001", "axis (x, y, z) and angle in radians")
    assert "the angle (1.001) is beyond ±1: an angle, not a quaternion part" in beyond.why
    negative = axis_angle("0 0 1 -1.001", "axis (x, y, z) and angle in radians")
    assert "the angle (-1.001) is beyond ±1: an angle, not a quaternion part" in negative.why
    assert np.allclose(beyond.orientation.as_matrix(), scipy([0, 0, 1], 1.001, False).as_matrix(), atol=1e-12)


def test_unit_norm_four_numbers_are_said_to_look_like_a_quaternion():
    r = axis_angle("0.5 0.5 0.5 0.5", "axis (x, y, z) and angle in radians")
    assert r.why.endswith("; the four numbers have unit norm, as a quaternion has")


def test_the_angle_first_when_only_the_last_three_are_a_unit_axis():
    first = decode("0.785398 0 0 1")[0]
    assert first.label == "angle in radians, then axis (x, y, z)"
    assert first.conventions == {"order": "angle, axis", "units": "rad"}
    assert first.why == ("all within ±2π with decimals: may be radians; the axis numbers have unit length, as an axis"
                         " has; the last three numbers have unit length and the first three do not: likely the angle,"
                         " then the axis")
    assert np.allclose(first.orientation.as_matrix(), scipy([0, 0, 1], 0.785398, False).as_matrix(), atol=1e-12)
    # just beyond the limit the last three are no unit axis: the axis is read first
    assert decode("0.785398 0 0 1.0011")[0].label == "axis (x, y, z) and angle in radians"


def test_angle_first_text_scales_a_long_axis_and_says_so():
    r = axis_angle("angle 90, axis 0 0 2", "angle in degrees, then axis (x, y, z)")
    assert "the axis (length 2) was scaled to unit length" in r.notes
    assert r.why.endswith("; the text says axis and angle; the text writes the angle before the axis")
    assert np.allclose(r.orientation.as_matrix(), scipy([0, 0, 1], 90, True).as_matrix(), atol=1e-12)


def test_named_axis_and_angle():
    r = decode("axis: 0 0 1, angle: 90")[0]
    assert r.label == DEG
    assert r.why.endswith("; read by their names as an axis and an angle")
    assert np.allclose(r.orientation.as_matrix(), scipy([0, 0, 1], 90, True).as_matrix(), atol=1e-12)
