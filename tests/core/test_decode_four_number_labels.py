"""Decode, four numbers: each quaternion reading's label and reasons, word for word, with the orientation
checked against SciPy's Rotation (from_quat is scalar last; the JPL reading is the inverse of the Hamilton
one, common practice); the norm limits (1e-3 for a unit quaternion, 0.05 for close to 1) from both sides.
The demo numbers are invented: 0.9238795 and 0.3826834 are cos and sin of 22.5 degrees (worked by hand)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode

C, S = 0.9238795, 0.3826834


def by_label(text):
    return {r.label: r for r in decode(text)}


def same(reading, rotation):
    assert np.allclose(reading.orientation.as_matrix(), rotation.as_matrix(), atol=1e-6)


def test_named_components_give_hamilton_and_its_inverse():
    got = by_label(f"w: {C} x: 0 y: 0 z: {S}")
    hamilton = got["quaternion by named components, Hamilton"]
    jpl = got["quaternion by named components, JPL convention: the inverse of the Hamilton reading"]
    same(hamilton, Rotation.from_quat([0, 0, S, C]))
    same(jpl, Rotation.from_quat([0, 0, S, C]).inv())
    assert hamilton.why == "norm 1: a unit quaternion; read by their names (w, x, y, z) and put in the order w, x, y, z"
    assert jpl.why.endswith("; the JPL convention is offered last, never assumed")
    assert hamilton.conventions == {"order": "wxyz", "convention": "Hamilton", "named": True}
    assert jpl.conventions == {"order": "wxyz", "convention": "JPL", "named": True}


def test_bare_numbers_largest_first_means_w_first():
    got = by_label(f"{C} 0 0 {S}")
    first = got["quaternion (w, x, y, z), Hamilton"]
    assert first.why == "norm 1: a unit quaternion; the first number is the largest in magnitude: likely w first"
    same(first, Rotation.from_quat([0, 0, S, C]))
    last = got["quaternion (x, y, z, w), Hamilton"]
    assert last.why == "norm 1: a unit quaternion"
    same(last, Rotation.from_quat([C, 0, 0, S]))
    jpl = got["quaternion (x, y, z, w), JPL convention: the inverse of the Hamilton reading"]
    same(jpl, Rotation.from_quat([C, 0, 0, S]).inv())
    assert decode(f"{C} 0 0 {S}")[0].label == "quaternion (w, x, y, z), Hamilton"


def test_bare_numbers_largest_last_means_w_last():
    got = by_label(f"0 0 {S} {C}")
    last = got["quaternion (x, y, z, w), Hamilton"]
    assert last.why == "norm 1: a unit quaternion; the last number is the largest in magnitude: likely w last"
    same(last, Rotation.from_quat([0, 0, S, C]))
    assert decode(f"0 0 {S} {C}")[0].label == "quaternion (x, y, z, w), Hamilton"


def test_no_single_largest_falls_back_to_w_first_by_default():
    got = by_label("0.5 0.5 0.5 0.5")
    assert got["quaternion (w, x, y, z), Hamilton"].why == "norm 1: a unit quaternion; w first is the default order"
    assert got["quaternion (x, y, z, w), Hamilton"].why == "norm 1: a unit quaternion"
    # equal first and last magnitudes: neither is "the largest" (strictly), so the default speaks
    got = by_label(f"{C} 0 0 -{C}")
    assert "likely" not in got["quaternion (w, x, y, z), Hamilton"].why


@pytest.mark.parametrize("w, said", [
    ("1.0009", "norm 1.0009: a unit quaternion"),
    ("1.0011", "norm 1.0011: close to 1"),
    ("0.9991", "norm 0.9991: a unit quaternion"),
    ("0.9989", "norm 0.9989: close to 1"),
    ("1.049", "norm 1.049: close to 1"),
    ("1.051", "norm 1.051 is far from 1"),
    ("0.951", "norm 0.951: close to 1"),
    ("0.949", "norm 0.949 is far from 1"),
])
def test_norm_limits_from_both_sides(w, said):
    reading = by_label(f"{w} 0 0 0")["quaternion (w, x, y, z), Hamilton"]
    assert reading.why.startswith(said + ";")
