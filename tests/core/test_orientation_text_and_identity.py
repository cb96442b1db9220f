"""What an Orientation says of itself (str, repr), how two are the same (==, hash), notes, and the
Gibbs vector's refusals word for word. Check values: SciPy's Rotation where one is computed."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.errors import InvalidInputError
from core.orientation import Orientation


def test_str_names_the_angle_and_axis_and_the_identity_by_name():
    assert str(Orientation.identity()) == "Orientation(identity)"
    assert str(Orientation.from_axis_angle([0, 0, 1], 90)) == "Orientation(90° about [0, 0, 1])"
    # SciPy: from_rotvec of 30° about (1, 1, 0)/√2 -> axis components 0.707107 to 6 significant digits
    turn = Rotation.from_rotvec(np.radians(30) * np.array([1, 1, 0]) / np.sqrt(2))
    assert str(Orientation.from_quaternion(turn.as_quat(scalar_first=True))) == \
        "Orientation(30° about [0.707107, 0.707107, 0])"
    # a negative component keeps its sign
    assert str(Orientation.from_axis_angle([0, -1, 0], 45)) == "Orientation(45° about [0, -1, 0])"


def test_str_reads_rounding_dust_below_1e_12_as_zero_and_keeps_what_is_above():
    assert str(Orientation.from_axis_angle([1e-13, 0, 1], 90)) == "Orientation(90° about [0, 0, 1])"
    assert str(Orientation.from_axis_angle([-1e-13, 0, 1], 90)) == "Orientation(90° about [0, 0, 1])"   # no −0
    assert str(Orientation.from_axis_angle([2e-12, 0, 1], 90)) == "Orientation(90° about [2e-12, 0, 1])"


def test_repr_is_the_exact_quaternion_and_reads_back_to_the_same_value():
    o = Orientation.from_quaternion(Rotation.from_euler("ZYX", [10, 20, 30], degrees=True).as_quat(
        scalar_first=True))
    w, x, y, z = (float(v) for v in o.quaternion)
    assert repr(o) == f"Orientation.from_quaternion([{w!r}, {x!r}, {y!r}, {z!r}])"   # plain floats, no np.float64(…)
    assert "np." not in repr(o)
    assert eval(repr(o), {"Orientation": Orientation}) == o          # noqa: S307 (our own repr, no user text)


def test_equal_values_hash_alike_and_a_set_keeps_one_of_them():
    a = Orientation.from_axis_angle([0, 0, 1], 90)
    b = Orientation.from_quaternion(a.quaternion.copy())
    c = Orientation.from_axis_angle([0, 0, 1], 91)
    assert a == b and hash(a) == hash(b)
    assert len({a, b, c}) == 2
    assert a != c and (a == "not an orientation") is False


def test_with_notes_carries_the_new_notes_and_leaves_the_original_alone():
    a = Orientation.from_quaternion([2, 0, 0, 0])            # normalised, with a note saying so
    assert a.notes and "normalised" in a.notes[0]
    b = a.with_notes(["read from the drawing"])
    assert b.notes == ("read from the drawing",) and a.notes[0].startswith("normalised")
    assert np.array_equal(b.quaternion, a.quaternion)


def test_an_angle_set_iterates_over_its_three_angles_as_scipy_gives_them():
    rotation = Rotation.from_euler("ZYX", [40, -25, 70], degrees=True)
    angles = Orientation.from_quaternion(rotation.as_quat(scalar_first=True)).as_angles("ZYX")
    yaw, pitch, roll = angles
    assert [yaw, pitch, roll] == pytest.approx(rotation.as_euler("ZYX", degrees=True), abs=1e-12)   # SciPy


@pytest.mark.parametrize("gibbs, message", [
    ([1, 2], "Gibbs vector: expected shape (..., 3), got (2,)"),
    ([[1, 2, 3], [4, 5, 6]], "Gibbs vector: expected 3 numbers, got shape (2, 3)"),
    ([np.nan, 0, 0], "Gibbs vector: contains NaN or infinity; expected finite numbers"),
])
def test_a_gibbs_vector_that_is_not_three_finite_numbers_is_refused_word_for_word(gibbs, message):
    with pytest.raises(InvalidInputError) as refused:
        Orientation.from_gibbs(gibbs)
    assert str(refused.value) == message


def test_the_identity_is_w_1_and_one_shared_value():
    # The identity rotation is the quaternion (1, 0, 0, 0) (Hamilton, w first; SciPy's Rotation.identity()
    # as_quat is (0, 0, 0, 1) scalar last). Asked twice it is the very same immutable value.
    from scipy.spatial.transform import Rotation as R
    first = Orientation.identity()
    assert first.quaternion.tolist() == [1.0, 0.0, 0.0, 0.0]
    assert first.as_quaternion(scalar_last=True).tolist() == R.identity().as_quat().tolist()
    assert Orientation.identity() is first
