"""Property tests: round trips through every representation, associativity of composition, the inverse,
and apply() against the matrix product, on orientations drawn by hypothesis (the example budget is the
profile's: tests/conftest.py)."""

import numpy as np
from hypothesis import given
from hypothesis import strategies as st

from core import Orientation
from core.kernels import ALL_SEQUENCES

TOL = 1e-12

finite = st.floats(min_value=-1.0, max_value=1.0, allow_nan=False, allow_infinity=False)
quaternion_numbers = st.tuples(finite, finite, finite, finite).filter(
    lambda q: np.linalg.norm(q) > 1e-3)
orientations = quaternion_numbers.map(Orientation.from_quaternion)
vectors = st.tuples(*[st.floats(-1e3, 1e3, allow_nan=False)] * 3).map(np.array)


@given(orientations)
def test_round_trip_through_every_representation(o):
    assert Orientation.from_matrix(o.as_matrix()).isclose(o, TOL)
    assert Orientation.from_matrix(o.as_matrix(transposed=True), transposed=True).isclose(o, TOL)
    assert Orientation.from_quaternion(o.as_quaternion(scalar_last=True), scalar_last=True).isclose(o, TOL)
    axis, angle = o.as_axis_angle()
    assert Orientation.from_axis_angle(axis, angle).isclose(o, TOL)
    assert Orientation.from_rotation_vector(o.as_rotation_vector()).isclose(o, TOL)
    assert Orientation.from_rotation_vector(o.as_rotation_vector(degrees=False), degrees=False).isclose(o, TOL)


@given(orientations, st.sampled_from(ALL_SEQUENCES), st.booleans())
def test_round_trip_through_angles(o, sequence, intrinsic):
    a = o.as_angles(sequence, intrinsic=intrinsic)
    assert Orientation.from_angles(sequence, a.angles, intrinsic=intrinsic).isclose(o, TOL)
    # The same orientation spelled in the other convention (CONVENTIONS.md identity).
    assert Orientation.from_angles(sequence[::-1], a.angles[::-1], intrinsic=not intrinsic).isclose(o, TOL)


@given(orientations, orientations, orientations)
def test_composition_is_associative_and_means_the_matrix_product(a, b, c):
    assert ((a @ b) @ c).isclose(a @ (b @ c), TOL)
    assert np.abs((a @ b).as_matrix() - a.as_matrix() @ b.as_matrix()).max() <= TOL


@given(orientations)
def test_inverse(o):
    assert (o @ o.inverse()).isclose(Orientation.identity(), TOL)
    assert np.abs(o.inverse().as_matrix() - o.as_matrix().T).max() <= TOL


@given(orientations, vectors)
def test_apply_equals_the_matrix_product(o, v):
    scale = max(1.0, float(np.abs(v).max()))
    assert np.abs(o.apply(v) - o.as_matrix() @ v).max() <= TOL * scale


@given(orientations, orientations)
def test_angle_to_is_symmetric_and_matches_the_relative_rotation(a, b):
    assert abs(a.angle_to(b) - b.angle_to(a)) <= 1e-10
    assert abs(a.angle_to(b) - (a.inverse() @ b).angle) <= 1e-10
