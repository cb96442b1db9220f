"""Decode: small whole numbers without a unit rank as degrees, never as radians; the JPL reading of four
numbers checked on rotations that are not their own inverse.

Check values: the JPL rotation matrix of J. Solà (2017), "Quaternion kinematics for the error-state
Kalman filter", arXiv:1711.02508, for q = (qv, q4) scalar last: R = (2 q4² − 1) I − 2 q4 [qv]× + 2 qv qvᵀ
(written from memory), which is the transpose of the Hamilton matrix of the same numbers; SciPy's
Rotation for the Hamilton reading; the rule of thumb "whole numbers are degrees" (common practice)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode

WHOLE = ["0 0 1 90", "0 0 1", "0, 0, 1", "0 0 1 3", "0 0 1 1", "1 2 3", "0 0 90", "1 0 0 2", "0 1 0 -2",
         "[0 0 1]", "0 0 -1 6"]


@pytest.mark.parametrize("text", WHOLE)
def test_small_whole_numbers_without_a_unit_rank_as_degrees(text):
    readings = decode(text)
    with_units = [r for r in readings if "units" in r.conventions]
    assert with_units and with_units[0].conventions["units"] == "deg", [r.label for r in readings[:3]]
    best_with_units = readings.index(with_units[0])
    # Every radian reading ranks below the degree reading of the same kind and conventions.
    for i, r in enumerate(readings):
        if r.conventions.get("units") != "rad":
            continue
        same = {**r.conventions, "units": "deg"}
        twins = [j for j, o in enumerate(readings) if o.kind == r.kind and o.conventions == same]
        assert twins and twins[0] < i and readings[twins[0]].score > r.score, (text, r.label)
    assert best_with_units == min(i for i, r in enumerate(readings) if "units" in r.conventions)


def test_whole_numbers_read_as_degrees_give_the_degree_rotation():
    # SciPy: a 90° turn about z (rotation vector in degrees).
    best = decode("0 0 1 90")[0]
    assert best.kind == "axis-angle"
    want = Rotation.from_rotvec([0, 0, 90], degrees=True).as_matrix()
    np.testing.assert_allclose(best.orientation.as_matrix(), want, atol=1e-15)
    best = decode("0 0 3")[0]
    assert best.conventions["units"] == "deg"


def test_decimals_within_two_pi_may_still_be_radians():
    # The other side of the rule: decimal numbers within ±2π are offered as radians, ranked first.
    readings = decode("0 0 1 1.5707963")
    assert readings[0].conventions == {"order": "axis, angle", "units": "rad"}


def jpl_matrix(q):
    """Solà (2017) JPL rotation matrix of q = (x, y, z, w) (from memory; see the module docstring)."""
    v, w = np.asarray(q[:3], dtype=float), float(q[3])
    cross = np.array([[0, -v[2], v[1]], [v[2], 0, -v[0]], [-v[1], v[0], 0]])
    return (2 * w * w - 1) * np.eye(3) - 2 * w * cross + 2 * np.outer(v, v)


NOT_SELF_INVERSE = [np.array([0.0, 0.0, np.sqrt(0.5), np.sqrt(0.5)]),            # 90° about z
                    np.array([0.1, 0.2, 0.3, 0.9]) / np.linalg.norm([0.1, 0.2, 0.3, 0.9]),
                    np.array([-0.5, 0.5, -0.5, 0.5])]                             # 120° about (−1, 1, −1)


@pytest.mark.parametrize("q", NOT_SELF_INVERSE)
def test_the_jpl_reading_is_the_inverse_hamilton_rotation(q):
    hamilton = Rotation.from_quat(q).as_matrix()               # SciPy reads x, y, z, w as Hamilton
    assert np.abs(hamilton - hamilton.T).max() > 0.5            # not its own inverse: the check can fail
    np.testing.assert_allclose(jpl_matrix(q), hamilton.T, atol=1e-15)
    text = " ".join(repr(float(v)) for v in q)
    readings = decode(text, {"order": "jpl"})
    assert len(readings) == 1 and readings[0].conventions["convention"] == "JPL"
    np.testing.assert_allclose(readings[0].orientation.as_matrix(), jpl_matrix(q), atol=1e-15)
    # Unhinted, the JPL reading is offered but never first.
    all_readings = decode(text)
    jpl = [r for r in all_readings if r.conventions.get("convention") == "JPL"]
    assert len(jpl) == 1 and all_readings[0].conventions.get("convention") != "JPL"
    np.testing.assert_allclose(jpl[0].orientation.as_matrix(), jpl_matrix(q), atol=1e-15)
    hamilton_xyzw = [r for r in all_readings if r.conventions == {"order": "xyzw", "convention": "Hamilton"}]
    np.testing.assert_allclose(hamilton_xyzw[0].orientation.as_matrix(), hamilton, atol=1e-15)


@pytest.mark.parametrize("q", NOT_SELF_INVERSE)
def test_jpl_named_in_the_text_or_by_components(q):
    x, y, z, w = (repr(float(v)) for v in q)
    best = decode(f"JPL quaternion: {x} {y} {z} {w}")[0]
    assert best.conventions["convention"] == "JPL"
    np.testing.assert_allclose(best.orientation.as_matrix(), jpl_matrix(q), atol=1e-15)
    named = decode(f"qx = {x}, qy = {y}, qz = {z}, qw = {w}", {"order": "jpl"})
    assert len(named) == 1 and named[0].conventions["convention"] == "JPL"
    np.testing.assert_allclose(named[0].orientation.as_matrix(), jpl_matrix(q), atol=1e-15)
