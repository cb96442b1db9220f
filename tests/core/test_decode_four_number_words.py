"""Decode: four numbers read as a quaternion or an axis and an angle, the names and reasons a user reads,
and the ranking of an angle written before its unit axis.

Check values: SciPy's Rotation (from_quat scalar last; from_rotvec); the Hamilton convention named
"Hamilton" and the JPL convention offered last (common practice of this decoder's documented ranking);
|(0, 0, 1)| = 1 and |(0.3, 0, 0)| = 0.3 (worked by hand)."""

import numpy as np
from scipy.spatial.transform import Rotation

from core.decode import decode

S = 0.7071068            # sin 45° to 7 places (worked by hand)


def test_named_components_read_as_hamilton_by_that_name():
    readings = decode(f"w: {S} x: 0 y: 0 z: {S}")
    assert [r.conventions for r in readings] == [
        {"order": "wxyz", "convention": "Hamilton", "named": True},
        {"order": "wxyz", "convention": "JPL", "named": True}]
    assert readings[0].label == "quaternion by named components, Hamilton"
    # SciPy (scalar last): 90° about z.
    np.testing.assert_allclose(readings[0].orientation.as_matrix(),
                               Rotation.from_quat([0, 0, S, S]).as_matrix(), atol=1e-6)


def test_names_lift_the_hamilton_reading_never_the_jpl_one():
    named = {r.conventions["convention"]: r.score for r in decode(f"w: {S} x: 0 y: 0 z: {S}")}
    bare = {r.conventions["convention"]: r.score for r in decode(f"0 0 {S} {S}") if r.kind == "quaternion"}
    assert named["JPL"] == bare["JPL"]
    assert named["Hamilton"] > bare["JPL"] + 3


def test_an_order_named_in_the_text_says_so():
    readings = decode(f"quaternion (w, x, y, z): {S} 0 0 {S}")
    best = readings[0]
    assert best.conventions == {"order": "wxyz", "convention": "Hamilton"}
    assert "the text names this order" in best.why.split("; ")
    assert all("the text names this order" not in r.why for r in readings[1:])
    # SciPy (w first given as scalar_first): 90° about x.
    np.testing.assert_allclose(best.orientation.as_matrix(),
                               Rotation.from_quat([S, 0, 0, S], scalar_first=True).as_matrix(), atol=1e-6)


def test_an_angle_before_a_unit_axis_ranks_first_in_both_units():
    readings = decode("0.3 0 0 1")
    top = [(r.kind, r.conventions.get("order"), r.conventions.get("units")) for r in readings[:3]]
    assert top == [("axis-angle", "angle, axis", "rad"), ("axis-angle", "angle, axis", "deg"),
                   ("quaternion", "xyzw", None)]
    assert readings[0].why.endswith("the last three numbers have unit length and the first three do not:"
                                    " likely the angle, then the axis")
    # SciPy: 0.3 rad about z.
    np.testing.assert_allclose(readings[0].orientation.as_matrix(),
                               Rotation.from_rotvec([0, 0, 0.3]).as_matrix(), atol=1e-12)


def test_axis_and_angle_named_in_the_text_says_so():
    best = decode("axis and angle: 0 0 1 90")[0]
    assert best.kind == "axis-angle" and best.conventions == {"order": "axis, angle", "units": "deg"}
    assert best.why.endswith("the text says axis and angle")
    # SciPy: 90° about z.
    np.testing.assert_allclose(best.orientation.as_matrix(),
                               Rotation.from_rotvec([0, 0, 90], degrees=True).as_matrix(), atol=1e-12)
