"""Decode: the reasons a user reads beside 3- and 9-number readings, where a refused matrix was written,
units named with the numbers, and the ranking of radian middle angles and multiples of 15°.

Check values: SciPy's Rotation for orientations; 2.0 rad = 114.59° and 1.5 rad = 85.94° (worked by hand,
180/π = 57.2958); 7π/12 = 1.8325957 rad = 105° and π/12 = 0.2617994 rad = 15° (worked by hand); a
Tait-Bryan middle angle lies within ±90° (common practice)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def _same(orientation, rotation):
    q = orientation.as_quaternion()
    expected = rotation.as_quat(scalar_first=True)
    assert min(np.abs(q - expected).max(), np.abs(q + expected).max()) < 1e-12


def _reading(readings, **conventions):
    return next(r for r in readings if all(r.conventions.get(k) == v for k, v in conventions.items()))


def test_a_refused_matrix_on_three_lines_names_the_lines():
    # row 2 has length 2 (worked by hand): not a rotation
    with pytest.raises(DecodeError) as err:
        decode("1 0 0\n0 2 0\n0 0 1")
    assert str(err.value).endswith("(rows as written: lines 1, 2, 3)")


def test_a_refused_matrix_on_one_line_names_no_lines():
    with pytest.raises(DecodeError) as err:
        decode("1 0 0 0 2 0 0 0 1")
    message = str(err.value)
    assert message.endswith("(rows and columns as written)")
    assert "lines" not in message


def test_a_radian_middle_angle_beyond_90_degrees_is_called_unusual():
    # 2.0 rad = 114.59° (worked by hand): beyond ±90°, unusual for Tait-Bryan angles; as degrees it is 2°
    readings = decode("0.1 2.0 0.3")
    rad = _reading(readings, sequence="ZYX", intrinsic=True, units="rad")
    deg = _reading(readings, sequence="ZYX", intrinsic=True, units="deg")
    assert "middle angle beyond ±90°" in rad.why
    assert "middle angle beyond" not in deg.why
    _same(rad.orientation, Rotation.from_euler("ZYX", [0.1, 2.0, 0.3]))


def test_a_radian_middle_angle_within_90_degrees_is_not_called_unusual():
    # 1.5 rad = 85.94° (worked by hand): within ±90°
    readings = decode("0.1 1.5 0.3")
    rad = _reading(readings, sequence="ZYX", intrinsic=True, units="rad")
    assert "middle angle" not in rad.why


def test_a_radian_proper_euler_middle_angle_beyond_180_degrees_is_called_unusual():
    # 3.5 rad = 200.5° (worked by hand): outside 0..180°, unusual for proper Euler angles
    readings = decode("zxz 0.1 3.5 0.3")
    rad = _reading(readings, sequence="ZXZ", intrinsic=True, units="rad")
    assert "middle angle outside 0..180°" in rad.why
    # 3.0 rad = 171.9° (worked by hand): within 0..180°
    rad = _reading(decode("zxz 0.1 3.0 0.3"), sequence="ZXZ", intrinsic=True, units="rad")
    assert "middle angle" not in rad.why


def test_the_text_naming_a_rotation_vector_says_so_in_the_reason():
    best = decode("rotation vector 0.1 0.2 0.3")[0]
    assert best.kind == "rotation-vector"
    assert "the text says rotation vector" in best.why
    _same(best.orientation, Rotation.from_rotvec([0.1, 0.2, 0.3]))
    assert "the text says rotation vector" not in decode("0.1 0.2 0.3")[0].why


@pytest.mark.parametrize("text, units", [
    ("yaw_deg=0.1 pitch_deg=0.2 roll_deg=0.3", "deg"),
    ("yaw_rad=10 pitch_rad=20 roll_rad=30", "rad"),
])
def test_units_named_with_the_angles_are_the_only_units_read(text, units):
    # decimals within 2π would suggest radians, whole numbers beyond 2π degrees: the names decide instead
    readings = decode(text)
    assert [r.conventions["units"] for r in readings] == [units]
    assert "units named with the numbers" in readings[0].why
    values = [0.1, 0.2, 0.3] if units == "deg" else [10, 20, 30]
    _same(readings[0].orientation, Rotation.from_euler("ZYX", values, degrees=(units == "deg")))


@pytest.mark.parametrize("multiple", ["0.2617994", "1.8325957", "2.3561945"])   # π/12, 7π/12, 9π/12
def test_multiples_of_15_degrees_in_radians_rank_alike(multiple):
    # k·π/12 in radians is a multiple of 15° (worked by hand): it earns the same lift for every k,
    # more than a decimal that is no such multiple (1.8 rad)
    lifted = _reading(decode(f"{multiple} 0 0"), sequence="ZYX", intrinsic=True, units="rad").score
    first = _reading(decode("0.2617994 0 0"), sequence="ZYX", intrinsic=True, units="rad").score
    plain = _reading(decode("1.8 0 0"), sequence="ZYX", intrinsic=True, units="rad").score
    assert lifted == pytest.approx(first)
    assert lifted > plain
