"""Decode: four numbers named as an axis and an angle keep their named order and unit, and the reasons a
user reads beside quaternion and axis-angle readings (a norm far from 1, an axis not of unit length, the
text naming a quaternion).

Check values: SciPy's Rotation for orientations; |(1, 2, 3, 4)| = √30 = 5.47723 and |(1, 2, 3)| = √14 =
3.74166 and |(0, 0, 2)| = 2 (worked by hand)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode


def _same(orientation, rotation):
    q = orientation.as_quaternion()
    expected = rotation.as_quat(scalar_first=True)
    assert min(np.abs(q - expected).max(), np.abs(q + expected).max()) < 1e-12


@pytest.mark.parametrize("text", ["angle first: axis_x=0 axis_y=0 axis_z=1 angle=0.5",
                                  "angle, axis: angle=0.5 axis_x=0 axis_y=0 axis_z=1",
                                  "axis_x=0 axis_y=0 axis_z=1 angle=0.5"])
def test_numbers_named_as_axis_and_angle_are_never_reread_angle_first(text):
    # the names say which number is the angle; words saying 'angle first' cannot move it
    readings = decode(text)
    assert readings and all(r.conventions["order"] == "axis, angle" for r in readings)
    best = readings[0]
    assert best.conventions["units"] == "rad"
    _same(best.orientation, Rotation.from_rotvec([0, 0, 0.5]))


@pytest.mark.parametrize("text, units, angle", [
    ("axis_x=0 axis_y=0 axis_z=1 angle_deg=0.5", "deg", math.radians(0.5)),   # decimals, yet degrees
    ("axis_x=0 axis_y=0 axis_z=1 angle_rad=10", "rad", 10.0),                 # whole, beyond 2π, yet radians
])
def test_a_unit_named_on_the_angle_is_the_only_unit_read(text, units, angle):
    readings = decode(text)
    assert [r.conventions["units"] for r in readings] == [units]
    assert "units named with the numbers" in readings[0].why
    _same(readings[0].orientation, Rotation.from_rotvec([0, 0, angle]))


def test_an_axis_not_of_unit_length_says_its_length():
    readings = decode("axis_x=0 axis_y=0 axis_z=2 angle=0.5")
    assert all("the axis has length 2, not 1" in r.why for r in readings)     # |(0, 0, 2)| = 2
    _same(readings[0].orientation, Rotation.from_rotvec([0, 0, 0.5]))
    assert "the axis has length" not in decode("axis_x=0 axis_y=0 axis_z=1 angle=0.5")[0].why


def test_a_quaternion_far_from_unit_norm_says_its_norm():
    readings = decode("1 2 3 4")
    quaternions = [r for r in readings if r.kind == "quaternion"]
    assert quaternions and all("norm 5.47723 is far from 1" in r.why for r in quaternions)   # √30
    axis_angle = next(r for r in readings if r.kind == "axis-angle")
    assert "the axis has length 3.74166, not 1" in axis_angle.why                           # √14


def test_the_text_naming_a_quaternion_says_so_in_the_reason():
    best = decode("quaternion 0.5 0.5 0.5 0.5")[0]
    assert best.kind == "quaternion"
    assert "the text says quaternion" in best.why
    assert "the text says quaternion" not in decode("0.5 0.5 0.5 0.5")[0].why
    _same(best.orientation, Rotation.from_quat([0.5, 0.5, 0.5, 0.5], scalar_first=True))
