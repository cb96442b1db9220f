"""Decode, four numbers: when the angle-first layout is offered (the values: only the last three are a unit
axis; or the hint), how an order hint narrows the readings, and which texts say 'quaternion' or name an
order, word for word. Check values: SciPy's Rotation; the numbers are invented demo values (0.6, 0.8, 0 is
a unit axis, worked by hand)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode

ANGLE_FIRST = ("angle in radians, then axis (x, y, z)", "angle in degrees, then axis (x, y, z)")


def labels(text, hints=None):
    return [r.label for r in decode(text, hints)]


@pytest.mark.parametrize("text", ["0.5 0.5 0.5 0.5", "0 0 0 1", "0.6 0.8 0 0.6", "0.5 0.6 0.1 0.2"])
def test_no_angle_first_reading_unless_only_the_last_three_are_a_unit_axis(text):
    assert not set(labels(text)) & set(ANGLE_FIRST)


def test_a_unit_axis_in_the_last_three_puts_the_angle_first():
    first = decode("1.2 0.6 0.8 0")[0]
    assert first.label == "angle in radians, then axis (x, y, z)"
    assert np.allclose(first.orientation.as_matrix(), Rotation.from_rotvec(1.2 * np.array([0.6, 0.8, 0])).as_matrix(),
                       atol=1e-12)


def test_the_angle_first_hint_offers_it_for_any_values():
    readings = decode("90 0 0 2", {"order": "angle-first"})
    assert [r.label for r in readings] == ["angle in degrees, then axis (x, y, z)"]
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_rotvec([0, 0, math.radians(90)]).as_matrix(), atol=1e-12)


def test_the_angle_first_hint_keeps_the_reason_the_values_give():
    readings = decode("0.785398 0 0 1", {"order": "angle-first"})
    assert len(readings) == 2
    for r in readings:
        assert r.why.endswith("; the last three numbers have unit length and the first three do not: likely the angle,"
                              " then the axis")


def test_the_axis_first_hint_keeps_only_axis_first_readings():
    readings = decode("0 0 1 90", {"order": "axis-first"})
    assert [r.label for r in readings] == ["axis (x, y, z) and angle in degrees"]
    readings = decode("0.785398 0 0 1", {"order": "axis-first"})
    assert readings and all(r.conventions["order"] == "axis, angle" for r in readings)


def test_first_largest_compares_with_every_other_number():
    # 0.5 is not larger than 0.6: no 'likely w first', the default speaks instead
    r = [r for r in decode("0.5 0.6 0.1 0.2") if r.label == "quaternion (w, x, y, z), Hamilton"][0]
    assert r.why == "norm 0.812404 is far from 1; w first is the default order"


def test_an_angle_just_beyond_one_by_a_billionth_is_not_beyond():
    r = [r for r in decode("0 0 1 1.000000001") if r.label == "axis (x, y, z) and angle in radians"][0]
    assert "beyond ±1" not in r.why
    r = [r for r in decode("0 0 1 1.000000002") if r.label == "axis (x, y, z) and angle in radians"][0]
    assert "the angle (1) is beyond ±1" in r.why      # printed with :g, six significant digits


def test_a_caption_naming_the_order_and_the_word_quaternion():
    readings = decode("quaternion (w, x, y, z): 0.9238795 0 0 0.3826834")
    assert readings[0].why == ("norm 1: a unit quaternion; the first number is the largest in magnitude: likely w"
                               " first; the text names this order; the text says quaternion")
    other = [r for r in readings if r.label == "quaternion (x, y, z, w), Hamilton"][0]
    assert other.why == "norm 1: a unit quaternion; the text says quaternion"
    plain = [r for r in decode("0.9238795 0 0 0.3826834") if r.label == "quaternion (x, y, z, w), Hamilton"][0]
    assert other.score > plain.score
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_quat([0, 0, 0.3826834, 0.9238795]).as_matrix(), atol=1e-6)


def test_naming_the_order_adds_the_order_points_to_the_hamilton_reading():
    from core.decode.candidates import POINTS
    named = decode("quaternion (w, x, y, z): 0.9238795 0 0 0.3826834")[0]
    unnamed = [r for r in decode("quaternion: 0.9238795 0 0 0.3826834") if r.label == named.label][0]
    assert named.score - unnamed.score == pytest.approx(POINTS["order named"])


@pytest.mark.parametrize("text", ["0 0 0 5", "0 0 0 1", "0 0 0 0.5"])
def test_a_zero_axis_with_a_turn_is_no_axis_and_angle(text):
    assert all(r.kind != "axis-angle" for r in decode(text))


def test_four_zeros_are_the_identity_as_an_axis_and_no_turn():
    readings = decode("0 0 0 0")
    assert [r.label for r in readings] == ["axis (x, y, z) and angle in degrees", "axis (x, y, z) and angle in radians"]
    assert all(np.allclose(r.orientation.as_matrix(), np.eye(3)) for r in readings)


def test_asked_for_an_axis_and_angle_a_zero_axis_with_a_turn_fits_no_hint():
    from core.errors import DecodeError
    with pytest.raises(DecodeError) as err:
        decode("0 0 0 5", {"kind": "axis-angle"})
    assert str(err.value) == "cannot read the 4 numbers: no reading fits the hints given"
