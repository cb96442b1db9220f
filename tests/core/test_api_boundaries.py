"""The Python API at its edges: keyword flags take True or False only (None, 0, 1, "yes" are refused by
name, since their truth value would silently pick a convention), every from_* refuses NaN, infinity,
wrong shapes and 2x2 matrices with a message, and huge or tiny components are scaled before any norm,
so nothing overflows to inf, underflows to a silent zero, or comes back as NaN.

Check values: SciPy's Rotation (a general-purpose reference library) for the orientations that large or
small inputs must still give; the rest are refusals, checked by the words of their messages."""

import math
import warnings

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import FlagTypeError, FramewrightError, InvalidInputError, Orientation
from core.check import axis_vector
from core.sequences import best_conditioned_sequence, gimbal_margin, spelled_sequence

NOT_BOOLEANS = [None, 0, 1, 1.0, "yes", "", "False", [True], np.int64(1)]
Q = Orientation.from_axis_angle([1, 2, 3], 40)


@pytest.fixture(autouse=True)
def warnings_are_errors():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        yield


FLAG_CALLS = {
    "from_quaternion scalar_last": ("scalar_last", lambda v: Orientation.from_quaternion([1, 0, 0, 0], scalar_last=v)),
    "as_quaternion scalar_last": ("scalar_last", lambda v: Q.as_quaternion(scalar_last=v)),
    "from_matrix transposed": ("transposed", lambda v: Orientation.from_matrix(np.eye(3), transposed=v)),
    "as_matrix transposed": ("transposed", lambda v: Q.as_matrix(transposed=v)),
    "from_axis_angle degrees": ("degrees", lambda v: Orientation.from_axis_angle([0, 0, 1], 90, degrees=v)),
    "as_axis_angle degrees": ("degrees", lambda v: Q.as_axis_angle(degrees=v)),
    "from_rotation_vector degrees": ("degrees", lambda v: Orientation.from_rotation_vector([0, 0, 1], degrees=v)),
    "as_rotation_vector degrees": ("degrees", lambda v: Q.as_rotation_vector(degrees=v)),
    "from_angles intrinsic": ("intrinsic", lambda v: Orientation.from_angles("ZYX", [1, 2, 3], intrinsic=v)),
    "from_angles degrees": ("degrees", lambda v: Orientation.from_angles("ZYX", [1, 2, 3], degrees=v)),
    "as_angles intrinsic": ("intrinsic", lambda v: Q.as_angles("ZYX", intrinsic=v)),
    "as_angles degrees": ("degrees", lambda v: Q.as_angles("ZYX", degrees=v)),
    "angle_to degrees": ("degrees", lambda v: Q.angle_to(Orientation.identity(), degrees=v)),
    "gimbal_margin intrinsic": ("intrinsic", lambda v: gimbal_margin(Q, "ZYX", intrinsic=v)),
    "best_conditioned_sequence intrinsic": ("intrinsic", lambda v: best_conditioned_sequence(Q, intrinsic=v)),
    "spelled_sequence intrinsic": ("intrinsic", lambda v: spelled_sequence("ZYX", v)),
    "spelled_sequence ascii": ("ascii", lambda v: spelled_sequence("ZYX", True, ascii=v)),
}


@pytest.mark.parametrize("value", NOT_BOOLEANS, ids=repr)
@pytest.mark.parametrize("name", FLAG_CALLS)
def test_flags_refuse_anything_but_true_or_false_naming_the_keyword(name, value):
    keyword, call = FLAG_CALLS[name]
    with pytest.raises(FlagTypeError, match=f"^{keyword}=.*expected True or False") as caught:
        call(value)
    # one error type serves both ways of catching it
    assert isinstance(caught.value, TypeError) and isinstance(caught.value, FramewrightError)


@pytest.mark.parametrize("name", FLAG_CALLS)
def test_flags_accept_python_and_numpy_booleans(name):
    _, call = FLAG_CALLS[name]
    for value in (True, False, np.bool_(True), np.bool_(False)):
        call(value)


def test_degrees_none_no_longer_means_radians():
    # It used to turn 90 into 90 radians silently.
    with pytest.raises(FlagTypeError, match="degrees=None"):
        Orientation.from_axis_angle([0, 0, 1], 90, degrees=None)


NON_FINITE = [math.nan, math.inf, -math.inf]


@pytest.mark.parametrize("bad", NON_FINITE)
@pytest.mark.parametrize("call", [
    lambda b: Orientation.from_quaternion([1, 0, b, 0]),
    lambda b: Orientation([1, 0, b, 0]),
    lambda b: Orientation.from_matrix([[1, 0, 0], [0, 1, 0], [0, 0, b]]),
    lambda b: Orientation.from_axis_angle([0, b, 1], 10),
    lambda b: Orientation.from_axis_angle([0, 0, 1], b),
    lambda b: Orientation.from_rotation_vector([0, b, 1]),
    lambda b: Orientation.from_angles("ZYX", [0, b, 1]),
    lambda b: Q.apply([0, b, 1]),
    lambda b: axis_vector([0, b, 1]),
])
def test_every_constructor_refuses_nan_and_infinity(call, bad):
    with pytest.raises(InvalidInputError, match="NaN or infinity"):
        call(bad)


@pytest.mark.parametrize("shape", [(2, 2), (3,), (9,), (3, 2), (2, 3), (4, 4), (1, 3, 3), (3, 3, 1)])
def test_a_matrix_of_any_other_shape_is_never_read_as_an_orientation(shape):
    with pytest.raises(InvalidInputError, match="shape"):
        Orientation.from_matrix(np.ones(shape))


def test_the_2x2_identity_is_refused():
    with pytest.raises(InvalidInputError, match=r"expected shape \(\.\.\., 3, 3\), got \(2, 2\)"):
        Orientation.from_matrix([[1, 0], [0, 1]])
    with pytest.raises(InvalidInputError):
        Orientation.from_matrix([[1, 0], [0, 1, 0], [0, 0, 1]])   # ragged


@pytest.mark.parametrize("components", [
    [1e308, 1e308, 1e308, 1e308], [1.797e308, 0, 0, 1.797e308], [1e200, 2e200, -3e200, 4e200],
    [1e154, 1e154, 0, 0], [1e-200, 2e-200, -3e-200, 4e-200], [5e-324, 0, 0, 5e-324],
])
def test_quaternions_of_extreme_size_give_the_scipy_orientation(components):
    for make in (Orientation.from_quaternion, Orientation):
        o = make(components)
        assert np.all(np.isfinite(o.quaternion)) and abs(np.linalg.norm(o.quaternion) - 1) <= 4e-16
        # Reference: SciPy normalises the same direction (given at unit scale, which it can take).
        unit = np.asarray(components) / np.abs(components).max()
        reference = Rotation.from_quat(unit, scalar_first=True).as_quat(scalar_first=True, canonical=True)
        assert o.isclose(Orientation(reference), atol=1e-15)


def test_a_huge_quaternion_says_it_was_normalised_with_a_finite_norm():
    o = Orientation.from_quaternion([1e200, 0, 0, 0])
    assert o.notes == ("normalised from norm 1e+200",)


@pytest.mark.parametrize("axis", [[1e308, 1e308, 1e308], [5e-324, 5e-324, 5e-324], [1e-300, 1e-300, 1e-300]])
def test_axes_of_extreme_length_keep_their_direction(axis):
    o = Orientation.from_axis_angle(axis, 120)
    reference = Rotation.from_rotvec(np.full(3, 1 / math.sqrt(3)) * math.radians(120))   # SciPy
    assert o.isclose(Orientation(reference.as_quat(scalar_first=True)), atol=1e-15)


@pytest.mark.parametrize("vector", [[1e308, 0, 0], [1e-310, 0, 0], [0, 1e200, 0], [3e307, 3e307, 3e307]])
def test_apply_to_huge_or_tiny_vectors_gives_scipy_values_and_never_nan(vector):
    turned = Q.apply(vector)
    reference = Rotation.from_quat(Q.as_quaternion(), scalar_first=True)   # SciPy, at unit scale
    scale = np.abs(vector).max()
    np.testing.assert_allclose(turned / scale, reference.apply(np.asarray(vector) / scale), atol=1e-15)


def test_apply_to_a_vector_too_long_to_rotate_is_refused():
    # |v| is 1.7e308 * sqrt(3): turned towards an axis it cannot be written in a double
    with pytest.raises(InvalidInputError, match="too long to rotate"):
        Orientation.from_axis_angle([1, -1, 0], 54.735610317245346).apply([1.7e308, 1.7e308, 1.7e308])


@pytest.mark.parametrize("vector", [[1e200, 0, 0], [1e-200, 0, 0], [1.797e308, -1.797e308, 0], [5e-324, 0, 0]])
def test_axis_vector_scales_before_the_norm(vector):
    direction = axis_vector(vector)
    expected = np.sign(vector) * (np.abs(vector) > 0) / math.sqrt(np.count_nonzero(vector))
    np.testing.assert_allclose(direction, expected, atol=1e-16)


def test_axis_vector_refuses_zero():
    with pytest.raises(InvalidInputError, match="zero-length"):
        axis_vector([0.0, -0.0, 0.0])


@pytest.mark.parametrize("atol", [math.nan, -1.0, math.inf, "0.1", None, True])
def test_isclose_refuses_a_tolerance_that_is_not_a_finite_number(atol):
    with pytest.raises(InvalidInputError, match="atol"):
        Q.isclose(Q, atol=atol)


def test_angle_to_refuses_what_is_not_an_orientation():
    with pytest.raises(InvalidInputError, match="expected an Orientation"):
        Q.angle_to([1, 0, 0, 0])


# --- chain steps: a stored quaternion must be unit, as a mount's is --------------------------------

def chain_data(q, name="bracket"):
    return {"name": "mast", "steps": [{"name": "base", "orientation": {"quaternion_wxyz": [1.0, 0, 0, 0]}},
                                      {"name": name, "orientation": {"quaternion_wxyz": q}}]}


@pytest.mark.parametrize("q", [[5, 0, 0, 0], [1e200, 0, 0, 0], [1e-200, 0, 0, 0], [1, 0, 0, 0.01],
                               [0.5, 0.5, 0.5, 0.5 + 2e-6]])
def test_a_chain_step_quaternion_far_from_unit_is_refused_naming_the_step(q):
    from core.chain import Chain
    with pytest.raises(InvalidInputError, match=r"chain 'mast' step 1 \('bracket'\): .*expected a unit "
                                                r"quaternion, its norm is"):
        Chain.from_dict(chain_data(q))


@pytest.mark.parametrize("q", [[1, 0, 0, 1e-7], [0.5, 0.5, 0.5, 0.5], [-1.0, 0, 0, 0]])
def test_a_chain_step_quaternion_unit_to_its_saved_digits_is_read(q):
    from core.chain import Chain
    chain = Chain.from_dict(chain_data(q))
    assert chain.steps[1].orientation.isclose(Orientation.from_quaternion(q), atol=0)


@pytest.mark.parametrize("q, words", [
    ([math.nan, 0, 0, 0], "NaN or infinity"), ([0, 0, 0, 0], "zero length"), ([1, 0, 0], "shape"),
    (["1", 0, 0, 0], "list of 4 numbers"), ([True, 0, 0, 0], "list of 4 numbers"), (1.0, "list of 4 numbers"),
    ([10 ** 400, 0, 0, 0], "beyond the range of a double"),
])
def test_a_damaged_chain_step_quaternion_is_refused_with_a_message(q, words):
    from core.chain import Chain
    with pytest.raises(InvalidInputError, match=words):
        Chain.from_dict(chain_data(q))


def test_a_long_step_name_is_shortened_in_the_message():
    from core.chain import Chain
    with pytest.raises(InvalidInputError) as caught:
        Chain.from_dict(chain_data([5, 0, 0, 0], name="x" * 100_000))
    assert len(str(caught.value)) < 300


# --- level: gravity and in-face directions of any size ------------------------------------------------

@pytest.mark.parametrize("down", [[0, 0, -1e300], [0, 0, -1e-300], [0, 0, -5e-324]])
def test_gravity_of_any_non_zero_length_is_only_a_direction(down):
    from core.level import level_readings
    report = level_readings(Q, down=down)
    reference = level_readings(Q)
    assert [f.tilt_deg for f in report.faces] == pytest.approx([f.tilt_deg for f in reference.faces], abs=1e-12)


@pytest.mark.parametrize("down, words", [([0, 0, 0], "zero-length"), ([0, math.nan, 1], "NaN"),
                                         ([0, 1], "three numbers|shape"), ("sideways", "cannot read")])
def test_bad_gravity_is_refused(down, words):
    from core.level import level_readings
    with pytest.raises(InvalidInputError, match=words):
        level_readings(Q, down=down)


def test_an_in_face_direction_of_huge_length_is_used_as_a_direction():
    from core.level import inclinometer_reading
    plain = inclinometer_reading(Q, "+Z", [1, 0, 0])
    huge = inclinometer_reading(Q, "+Z", [1e300, 0, 0])
    assert (huge.along_deg, huge.across_deg) == pytest.approx((plain.along_deg, plain.across_deg), abs=1e-12)
