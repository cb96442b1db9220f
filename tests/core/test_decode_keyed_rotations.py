"""A rotation under one key of keyed calibration text (YAML or JSON style): which key fixes which
convention, checked against SciPy's Rotation on angles where every axis turns (so a wrong sequence,
fixed/moving axes or quaternion order gives another matrix). Values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def test_rpy_is_one_reading_roll_pitch_yaw_about_fixed_x_y_z_in_radians():
    readings = decode("translation: [0.1, 0.2, 0.3]\nrpy: [0.3, -0.2, 0.5]")
    assert len(readings) == 1
    assert readings[0].conventions == {"sequence": "XYZ", "intrinsic": False, "units": "rad"}
    # fixed-axis roll, pitch, yaw = SciPy's extrinsic 'xyz' (lower case), radians (common practice)
    assert np.allclose(_matrix(readings[0]), Rotation.from_euler("xyz", [0.3, -0.2, 0.5]).as_matrix(), atol=1e-12)
    assert any("fixed axes X, Y, Z in radians" in n for n in readings[0].notes)


def test_ypr_is_yaw_pitch_roll_about_moving_axes():
    readings = decode("translation: [0.1, 0.2, 0.3]\nypr: [30, -20, 50]")
    assert len(readings) == 1
    assert readings[0].conventions["sequence"] == "ZYX" and readings[0].conventions["intrinsic"] is True
    # SciPy's intrinsic 'ZYX' (upper case); 30, -20, 50 read as degrees
    assert readings[0].conventions["units"] == "deg"
    assert np.allclose(_matrix(readings[0]), Rotation.from_euler("ZYX", [30, -20, 50], degrees=True).as_matrix(),
                       atol=1e-12)


Q = (0.1, 0.2, 0.3, 0.927)   # x, y, z, w of a rotation (norm 0.999..., normalised on reading)


def test_an_orientation_list_of_four_is_read_scalar_last_first():
    readings = decode(f"position: [1, 2, 3]\norientation: [{', '.join(map(str, Q))}]")
    assert readings[0].conventions == {"order": "xyzw", "convention": "Hamilton"}
    assert "orientation lists are usually x, y, z, w" in readings[0].why
    # SciPy's from_quat is scalar last, Hamilton
    assert np.allclose(_matrix(readings[0]), Rotation.from_quat(Q).as_matrix(), atol=1e-12)
    assert {r.conventions["order"] for r in readings} == {"xyzw", "wxyz"}   # the other order still offered


@pytest.mark.parametrize("key, order", [("quaternion_xyzw", "xyzw"), ("q_wxyz", "wxyz")])
def test_a_key_that_names_the_order_fixes_it(key, order):
    readings = decode(f"position: [1, 2, 3]\n{key}: [{', '.join(map(str, Q))}]")
    assert all(r.conventions["order"] == order for r in readings)
    expected = Rotation.from_quat(Q) if order == "xyzw" else Rotation.from_quat(Q, scalar_first=True)
    assert np.allclose(_matrix(readings[0]), expected.as_matrix(), atol=1e-12)


def test_a_key_of_another_count_is_refused_by_count():
    from core.decode import DecodeError
    with pytest.raises(DecodeError, match=r"'rotation' holds 5 numbers; a rotation is 9 \(a matrix\), 4 \(a "
                                          r"quaternion\) or 3 \(angles or a rotation vector\)"):
        decode("translation: [1, 2, 3]\nrotation: [1, 2, 3, 4, 5]")


@pytest.mark.parametrize("said, unit", [("unit: cm", "cm"), ('units: "in"', "in"), ("length_unit: MM", "mm"),
                                        ("unit: m", "m")])
def test_a_unit_key_beside_the_pose_names_the_translations_unit(said, unit):
    reading = decode(f"{said}\ntranslation: [1, 2, 3]\nrpy: [0.3, -0.2, 0.5]")[0]
    assert reading.translation == (1.0, 2.0, 3.0) and reading.translation_unit == unit


def test_a_unit_key_with_a_word_that_is_no_length_unit_names_none():
    reading = decode("unit: furlong\ntranslation: [1, 2, 3]\nrpy: [0.3, -0.2, 0.5]")[0]
    assert reading.translation_unit is None
