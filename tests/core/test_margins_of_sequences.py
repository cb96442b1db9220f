"""The gimbal margins of several sequences in one call: the same numbers as one call per sequence, the
margin SciPy's angles give (90° − |θ2| for Tait–Bryan, min(θ2, 180° − θ2) for proper Euler), any batch
shape, and the meter's best-conditioned sequence the same as the largest of the twelve taken one by one."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import kernels
from core.errors import FlagTypeError, InvalidInputError, SequenceError
from core.orientation import Orientation
from core.sequences import ALL_SEQUENCES, best_conditioned_sequence, gimbal_margin

RNG = np.random.default_rng(2026)
QUATS = Rotation.random(400, rng=RNG).as_quat(scalar_first=True)


@pytest.mark.parametrize("intrinsic", [True, False])
def test_the_same_margins_as_one_call_per_sequence(intrinsic):
    together = kernels.gimbal_margins_of_sequences(QUATS, ALL_SEQUENCES, intrinsic)
    assert together.shape == (400, 12)
    for s, sequence in enumerate(ALL_SEQUENCES):
        alone = kernels.gimbal_margins(QUATS, sequence, intrinsic)
        np.testing.assert_allclose(together[:, s], alone, rtol=0, atol=1e-15)


@pytest.mark.parametrize("intrinsic", [True, False])
def test_the_margins_are_those_scipys_middle_angle_gives(intrinsic):
    together = np.degrees(kernels.gimbal_margins_of_sequences(QUATS, ALL_SEQUENCES, intrinsic))
    rotations = Rotation.from_quat(QUATS, scalar_first=True)
    for s, sequence in enumerate(ALL_SEQUENCES):
        # SciPy: upper case is intrinsic, lower case extrinsic (its documentation).
        middle = rotations.as_euler(sequence if intrinsic else sequence.lower(), degrees=True)[:, 1]
        proper = sequence[0] == sequence[2]
        want = np.minimum(middle, 180.0 - middle) if proper else 90.0 - np.abs(middle)
        np.testing.assert_allclose(together[:, s], want, atol=1e-7)


def test_one_quaternion_gives_one_row_and_a_grid_keeps_its_shape():
    one = kernels.gimbal_margins_of_sequences(QUATS[0], ["ZYX", "ZXZ"])
    assert one.shape == (2,)
    grid = kernels.gimbal_margins_of_sequences(QUATS[:12].reshape(3, 4, 4), ["ZYX", "ZXZ"])
    assert grid.shape == (3, 4, 2)
    np.testing.assert_array_equal(grid.reshape(12, 2)[0], one)


def test_at_lock_the_margin_is_zero_and_the_other_family_is_far():
    # 90° pitch about Y (intrinsic Z-Y'-X''): Tait–Bryan ZYX is locked (common practice); ZXZ is not.
    q = Rotation.from_euler("ZYX", [30.0, 90.0, 10.0], degrees=True).as_quat(scalar_first=True)
    zyx, zxz = kernels.gimbal_margins_of_sequences(q, ["ZYX", "ZXZ"])
    assert zyx < 1e-7 and zxz > 0.5


def test_refusals_name_the_problem_word_for_word():
    with pytest.raises(SequenceError) as empty:
        kernels.gimbal_margins_of_sequences(QUATS[0], [])
    assert str(empty.value) == "no sequences given; expected at least one, such as 'ZYX'"
    with pytest.raises(SequenceError):
        kernels.gimbal_margins_of_sequences(QUATS[0], ["ZZX"])
    with pytest.raises(FlagTypeError, match="intrinsic=1: expected True or False"):
        kernels.gimbal_margins_of_sequences(QUATS[0], ["ZYX"], 1)
    with pytest.raises(InvalidInputError) as shape:
        kernels.gimbal_margins_of_sequences([1.0, 0.0, 0.0], ["ZYX"])
    assert str(shape.value) == "quaternions: expected shape (..., 4), got (3,)"
    with pytest.raises(InvalidInputError) as nan:
        kernels.gimbal_margins_of_sequences([np.nan, 0.0, 0.0, 1.0], ["ZYX"])
    assert str(nan.value) == "quaternions: contains NaN or infinity; expected finite numbers"


@pytest.mark.parametrize("intrinsic", [True, False])
def test_the_best_conditioned_sequence_is_the_largest_margin_taken_one_by_one(intrinsic):
    for q in QUATS[:100]:
        o = Orientation.from_quaternion(q)
        margins = [gimbal_margin(o, s, intrinsic) for s in ALL_SEQUENCES]
        best = best_conditioned_sequence(o, intrinsic=intrinsic)
        top = max(m.margin_deg for m in margins)
        assert best.margin_deg == pytest.approx(top, abs=1e-12) and best.intrinsic is intrinsic
        second = sorted(m.margin_deg for m in margins)[-2]
        if top - second > 1e-9:                      # no tie: the one sequence with that margin
            assert best == max(margins, key=lambda m: m.margin_deg)


def test_the_best_of_a_shorter_list_and_the_first_of_a_tie():
    o = Orientation.from_quaternion([1.0, 0.0, 0.0, 0.0])
    # At the identity every Tait–Bryan sequence is 90° from lock and every proper Euler one locked:
    # the first Tait–Bryan one listed wins the tie.
    assert best_conditioned_sequence(o, ["ZXZ", "XYZ", "ZYX"]).sequence == "XYZ"
    assert best_conditioned_sequence(o, ["ZXZ", "YZY"]).margin_deg == 0.0
