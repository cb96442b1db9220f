"""Four bare numbers written angle first (issue 11: `0.785398 0 0 1`, angle then axis, as some C++
libraries print an angle-axis, was read axis first: 1° about (1, 0, 0) or a quaternion far from unit norm).
When the last three numbers have unit length and the first three do not, the angle-first reading is
offered and ranks first; `order='angle-first'` / `'axis-first'` picks one. Expected rotations: SciPy's
`Rotation.from_rotvec` of the axis times the angle the numbers give."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def _off(expected: Rotation, reading) -> float:
    found = Rotation.from_quat(np.asarray(reading.orientation.as_quaternion()), scalar_first=True)
    return float((expected.inv() * found).magnitude())


def _angle_axis(angle, axis, degrees=False) -> Rotation:
    axis = np.array(axis, dtype=float)
    return Rotation.from_rotvec(axis / np.linalg.norm(axis) * angle, degrees=degrees)   # SciPy from_rotvec


@pytest.mark.parametrize("text, expected", [
    ("0.785398 0 0 1", _angle_axis(0.785398, [0, 0, 1])),
    ("2.0944 0.57735 0.57735 0.57735", _angle_axis(2.0944, [0.57735] * 3)),
    ("1.5708, 0, 1, 0", _angle_axis(1.5708, [0, 1, 0])),
    ("-0.5 0.6 0 0.8", _angle_axis(-0.5, [0.6, 0, 0.8])),
])
def test_bare_numbers_whose_last_three_are_a_unit_axis_read_angle_first(text, expected):
    top = decode(text)[0]
    assert top.kind == "axis-angle" and top.conventions["order"] == "angle, axis", top.label
    assert _off(expected, top) < 1e-9


@pytest.mark.parametrize("text, kind, order", [
    ("0 0 0.3826834 0.9238795", "quaternion", "xyzw"),     # a unit quaternion: its last three are unit too
    ("0.9238795 0 0 0.3826834", "quaternion", "wxyz"),
    ("0 0 1 90", "axis-angle", "axis, angle"),
    ("0 0 1 0.785398", "axis-angle", "axis, angle"),
])
def test_numbers_that_do_not_look_angle_first_keep_their_reading(text, kind, order):
    top = decode(text)[0]
    assert top.kind == kind and top.conventions["order"] == order, top.label


def test_with_every_hint_there_is_one_reading_and_the_order_hint_picks_the_layout():
    first = decode("0.785398 0 0 1", {"kind": "axis-angle", "units": "rad", "order": "angle-first"})
    assert len(first) == 1 and _off(_angle_axis(0.785398, [0, 0, 1]), first[0]) < 1e-9
    last = decode("0.785398 0 0 1", {"kind": "axis-angle", "units": "deg", "order": "axis-first"})
    assert len(last) == 1 and _off(_angle_axis(1, [1, 0, 0], degrees=True), last[0]) < 1e-9
    # the hint alone is enough to offer the angle first, even when the values do not suggest it
    hinted = decode("0.5 0 0.6 0.8", {"order": "angle-first", "units": "rad"})
    assert {r.conventions["order"] for r in hinted} == {"angle, axis"}
    assert _off(_angle_axis(0.5, [0, 0.6, 0.8]), hinted[0]) < 1e-9


def test_an_axis_angle_order_hint_on_a_quaternion_only_text_is_refused():
    with pytest.raises(DecodeError):
        decode("q = [0, 0, 0.3826834, 0.9238795]", {"kind": "quaternion", "order": "angle-first"})


def test_an_unknown_order_hint_names_both_families():
    with pytest.raises(DecodeError, match="angle-first"):
        decode("0 0 0 1", {"order": "first-angle"})


def test_the_angle_first_reading_says_why_it_ranks_first():
    top = decode("0.785398 0 0 1")[0]
    assert "unit length" in top.why and math.isclose(top.orientation.as_axis_angle()[1], 45, abs_tol=1e-4)
