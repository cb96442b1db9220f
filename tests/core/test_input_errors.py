"""Bad input raises our own ValueError subclasses with messages saying what was wrong and what was
expected."""

import math

import numpy as np
import pytest

from core import FramewrightError, InvalidInputError, Orientation, SequenceError
from core.sequences import parse_sequence


@pytest.mark.parametrize("call, words", [
    (lambda: Orientation.from_quaternion([math.nan, 0, 0, 1]), "NaN"),
    (lambda: Orientation.from_quaternion([math.inf, 0, 0, 1]), "infinity"),
    (lambda: Orientation.from_quaternion([0, 0, 0, 0]), "zero length"),
    (lambda: Orientation.from_quaternion([1, 0, 0]), "shape"),
    (lambda: Orientation.from_axis_angle([0, 0, 0], 10), "zero length"),
    (lambda: Orientation.from_axis_angle([1, 0], 10), "shape"),
    (lambda: Orientation.from_matrix(np.eye(2)), "3, 3"),
    (lambda: Orientation.from_matrix([[1, 0, 0], [0, 1, 0], [0, 0, "x"]]), "numbers"),
    (lambda: Orientation.from_rotation_vector([1, 2, math.nan]), "NaN"),
    (lambda: Orientation.from_angles("ZYX", [1, 2]), "shape"),
])
def test_bad_values_are_refused_with_a_message(call, words):
    with pytest.raises(InvalidInputError, match=words):
        call()


@pytest.mark.parametrize("name", ["ZZX", "XYY", "ABC", "ZY", "ZYXZ", "", "Z-Z-X"])
def test_bad_sequence_names_are_refused(name):
    with pytest.raises(SequenceError, match="expected"):
        Orientation.from_angles(name, [1, 2, 3])


@pytest.mark.parametrize("text, expected", [
    ("ZYX", "ZYX"), ("zyx", "ZYX"), ("Z-Y-X", "ZYX"), ("Z-Y′-X″", "ZYX"), ("Z-Y'-X''", "ZYX"),
    ("z y x", "ZYX"), ("z,x,z", "ZXZ"),
])
def test_sequence_spellings(text, expected):
    assert parse_sequence(text) == expected


def test_all_our_errors_are_value_errors():
    assert issubclass(FramewrightError, ValueError)
    with pytest.raises(ValueError):
        Orientation.from_quaternion([0, 0, 0, 0])


def test_zero_axis_with_zero_angle_is_the_identity():
    assert Orientation.from_axis_angle([0, 0, 0], 0) == Orientation.identity()


def test_orientation_is_immutable():
    o = Orientation.identity()
    with pytest.raises(AttributeError):
        o.anything = 1
    with pytest.raises(ValueError):
        o.quaternion[0] = 2.0


def test_rotation_vector_of_many_turns_gives_a_unit_quaternion():
    # 7e6 degrees is about 19,444 turns: cos and sinc see arguments that have lost low bits.
    import numpy as np
    o = Orientation.from_rotation_vector([7e6, -3e6, 2e6])
    assert abs(np.linalg.norm(o.quaternion) - 1.0) <= 4e-16


@pytest.mark.parametrize("call", [
    lambda: Orientation.from_quaternion([1e200, 0, 0, 0]),
    lambda: Orientation.from_quaternion([1e-200, 1e-200, 0, 0]),
    lambda: Orientation.from_axis_angle([1e200, 1e200, 0], 30),
])
def test_extreme_magnitudes_still_give_a_unit_quaternion(call):
    import numpy as np
    o = call()
    assert np.all(np.isfinite(o.quaternion)) and abs(np.linalg.norm(o.quaternion) - 1) <= 4e-16


def test_axis_of_huge_length_keeps_its_direction():
    import numpy as np
    axis, angle = Orientation.from_axis_angle([1e200, 1e200, 0], 30).as_axis_angle()
    assert np.allclose(axis, [np.sqrt(0.5), np.sqrt(0.5), 0], atol=1e-15) and abs(angle - 30) < 1e-12


@pytest.mark.parametrize("call", [
    lambda: Orientation.from_rotation_vector([1e200, 0, 0]),
    lambda: Orientation.from_angles("ZYX", [1e12, 0, 0]),
    lambda: Orientation.from_axis_angle([0, 0, 1], 4e8),
])
def test_angles_of_more_than_a_million_turns_are_refused(call):
    with pytest.raises(InvalidInputError, match="million turns"):
        call()


def test_normalising_a_unit_quaternion_again_changes_no_bit():
    import numpy as np
    from tests.core.sampling import random_quaternions
    for q in random_quaternions(2000, seed=41):
        once = Orientation.from_quaternion(q)
        assert Orientation.from_quaternion(once.quaternion) == once
