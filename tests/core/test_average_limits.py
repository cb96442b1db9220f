"""core/average.py at its limits: the mean, scatter, covariance and flags against SciPy's Rotation and
Rotation.mean (Markley, Cheng, Crassidis & Oshman 2007, "Averaging quaternions"), the leave-one-out flags
against a leave-one-out done here with SciPy, and every refusal word for word from both sides of its limit.
The first comparisons with SciPy are in test_average_and_decision.py."""

import math
import warnings

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.average import MAX_MEASUREMENTS, OUTLIER_SCATTERS, average, mean_orientation
from core.errors import InvalidInputError
from core.orientation import Orientation

RNG = np.random.default_rng(2024)


def _measurements(count, scatter_deg=0.02, seed=11):
    base = Rotation.random(random_state=seed)
    noise = np.random.default_rng(seed).normal(scale=math.radians(scatter_deg), size=(count, 3))
    return base * Rotation.from_rotvec(noise)


def _w_first(rotations):
    return rotations.as_quat(scalar_first=True)


def _orientation(rotation):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


def _refused(words, function, *args):
    with pytest.raises(InvalidInputError) as caught:
        function(*args)
    assert str(caught.value) == words


def _scatter_covariance(rotations, weights):
    """Σ wᵢ δᵢ δᵢᵀ / W / (n − 1) over the measurements of weight above 0, δᵢ the rotation vector of
    Mᵢ M⁻¹ (reference frame) about SciPy's weighted mean M: the Bessel-corrected scatter over n (common
    practice), as the Average docstring states it."""
    w = np.asarray(weights, dtype=float)
    mean = rotations.mean(weights=w)
    delta = (rotations * mean.inv()).as_rotvec()
    used = np.count_nonzero(w)
    return (delta * w[:, None]).T @ delta / w.sum() / (used - 1)


# ---- the figures against SciPy ----------------------------------------------------------------------------

@pytest.mark.parametrize("weights", [None, [1.0, 2.0, 0.5, 1.5, 3.0, 0.25, 1.0], [4, 1, 1, 1, 1, 1, 1]])
def test_the_covariance_and_uncertainty_of_the_mean_are_the_scatters_over_n(weights):
    rotations = _measurements(7, scatter_deg=0.3)
    w = np.ones(7) if weights is None else np.asarray(weights, dtype=float)
    result = average(_w_first(rotations), weights)
    want = _scatter_covariance(rotations, w)
    assert np.allclose(result.covariance_rad2, want, rtol=1e-8, atol=1e-14)
    assert result.standard_uncertainty_deg == pytest.approx(math.degrees(math.sqrt(np.trace(want) / 3)), rel=1e-8)
    mean = rotations.mean(weights=w)                                  # SciPy
    assert result.mean.angle_to(_orientation(mean)) < 1e-12
    angles = np.degrees((mean.inv() * rotations).magnitude())
    assert np.allclose(result.angles_deg, angles, rtol=1e-8, atol=1e-12)
    assert result.rms_deg == pytest.approx(math.sqrt(float(w @ angles ** 2) / w.sum()), rel=1e-8)
    assert result.max_deg == pytest.approx(angles.max(), rel=1e-8)
    assert result.count == 7 and len(result.angles_deg) == 7


def test_a_measurement_of_weight_zero_leaves_the_uncertainty_as_if_it_were_not_there():
    # it used to count in the n − 1 of the Bessel correction, shrinking the uncertainty of the mean
    rotations = _measurements(4, scatter_deg=0.3)
    without = average(_w_first(rotations[:3]), [1.0, 2.0, 1.0])
    far = _w_first(rotations[:3] * Rotation.identity()).tolist() + [_w_first(Rotation.from_euler("x", 40, degrees=True))
                                                                     .tolist()]
    result = average(far, [1.0, 2.0, 1.0, 0.0])
    assert result.mean.angle_to(without.mean) < 1e-12
    assert np.allclose(result.covariance_rad2, without.covariance_rad2, rtol=1e-9, atol=0)
    assert result.standard_uncertainty_deg == pytest.approx(without.standard_uncertainty_deg, rel=1e-9)
    assert result.rms_deg == pytest.approx(without.rms_deg, rel=1e-9)
    assert result.count == 4 and result.flagged == ()


@pytest.mark.parametrize("weights", [[1.0, 0.0], [0.0, 0.0, 3.0], [0.0, 1e-300, 0.0, 0.0]])
def test_one_measurement_of_weight_above_zero_has_no_uncertainty(weights):
    # one reading tells nothing of the scatter: no uncertainty, where 0.0 (known exactly) was given before
    rotations = _measurements(len(weights), scatter_deg=0.5)
    result = average(_w_first(rotations), weights)
    assert result.standard_uncertainty_deg is None and result.covariance_rad2 is None
    assert result.mean.angle_to(_orientation(rotations[int(np.argmax(weights))])) < 1e-12
    assert result.flagged == () and result.rms_deg < 1e-12       # degrees: the others count for nothing


def test_one_measurement_is_its_own_average_with_no_scatter():
    rotation = _measurements(1)
    result = average([_orientation(rotation[0])])
    assert result.mean.angle_to(_orientation(rotation[0])) < 1e-12          # degrees, rounding only
    assert result.rms_deg == result.max_deg < 1e-12
    assert (result.count, result.standard_uncertainty_deg, result.covariance_rad2, result.flagged) == \
        (1, None, None, ())


def test_identical_measurements_have_no_scatter_and_flag_none():
    q = np.tile(_w_first(_measurements(1))[0], (5, 1))
    result = average(q)
    assert result.rms_deg < 1e-12 and result.max_deg < 1e-12 and result.standard_uncertainty_deg < 1e-12
    assert result.flagged == ()


def test_two_measurements_are_two_scatters_apart_and_flag_none():
    # two measurements a angle apart: the mean halves it (SciPy's mean), each is a / 2 from it; with n = 2 the
    # uncertainty of the mean is the scatter over √(3 · 1) (the Average docstring, equal weights); no flags
    # below three measurements
    for seed in range(20):
        pair = _measurements(2, scatter_deg=0.5, seed=seed)
        apart = math.degrees((pair[0].inv() * pair[1]).magnitude())
        result = average(_w_first(pair))
        assert np.allclose(result.angles_deg, [apart / 2, apart / 2], rtol=1e-7)
        assert result.standard_uncertainty_deg == pytest.approx(result.rms_deg / math.sqrt(3), rel=1e-6)
        assert result.flagged == ()


def test_a_mean_near_a_half_turn_is_canonical_and_scipys():
    # around 180° about x the eigenvector's w is near 0 and its sign is numpy's: the canonical form has w >= 0
    # and, at w = 0, the first non-zero of x, y, z positive (CONVENTIONS.md)
    base = Rotation.from_rotvec([math.pi, 0, 0])
    for seed in range(10):
        rotations = base * Rotation.from_rotvec(np.random.default_rng(seed).normal(scale=0.01, size=(5, 3)))
        q = _w_first(rotations) * np.where(np.arange(5) % 2, -1.0, 1.0)[:, None]
        mean = average(q).mean
        assert mean.quaternion[0] >= 0
        assert mean.angle_to(_orientation(rotations.mean())) < 1e-12          # SciPy
    assert mean_orientation([[0.0, -1.0, 0.0, 0.0], [0.0, 1.0, 0.0, 0.0]]).quaternion.tolist() == [0, 1, 0, 0]
    assert mean_orientation([[0.0, 0.0, -1.0, 0.0]]).quaternion.tolist() == [0, 0, 1, 0]


@pytest.mark.parametrize("seed", range(6))
def test_the_mean_is_canonical_whatever_sign_the_eigenvector_takes(seed):
    rotations = Rotation.random(4, random_state=seed)
    mean = mean_orientation(_w_first(rotations))
    assert mean.quaternion[0] > 0
    assert mean.angle_to(_orientation(rotations.mean())) < 1e-12          # SciPy
    assert mean.isclose(average(_w_first(rotations)).mean, 1e-15)


def test_orientations_and_quaternion_rows_mix():
    rotations = _measurements(3)
    mixed = [_orientation(rotations[0]), list(_w_first(rotations[1])), tuple(-_w_first(rotations[2]))]
    assert average(mixed).mean.isclose(average(_w_first(rotations)).mean, 1e-15)


def test_nearly_unit_rows_are_taken_as_the_unit_rows_they_round_to():
    rotations = _measurements(5, scatter_deg=0.2)
    q = _w_first(rotations)
    stretched = q * np.array([1 + 9e-7, 1 - 9e-7, 1 + 1e-9, 1.0, 1 - 3e-7])[:, None]
    exact, result = average(q), average(stretched)
    assert result.mean.angle_to(exact.mean) < 1e-12                     # degrees
    assert np.allclose(result.angles_deg, exact.angles_deg, rtol=1e-9, atol=1e-13)
    assert result.rms_deg == pytest.approx(exact.rms_deg, rel=1e-9)


# ---- refusals, word for word --------------------------------------------------------------------------

@pytest.mark.parametrize("function", [average, mean_orientation])
def test_no_measurements_are_refused(function):
    _refused("average: expected at least one measurement, got none", function, [])
    _refused("average: expected at least one measurement, got none", function, iter(()))
    _refused("average: expected 1 to 1000000 measurements, got 0", function, np.empty((0, 4)))


@pytest.mark.parametrize("values, shape", [(np.array([1.0, 0, 0, 0]), "(4,)"), (np.zeros((2, 3)), "(2, 3)"),
                                           (np.zeros((2, 4, 1)), "(2, 4, 1)"), ([[1.0, 0, 0]], "(1, 3)"),
                                           ([[1.0, 0, 0, 0, 0]], "(1, 5)")])
def test_rows_that_are_not_quaternions_are_refused_by_shape(values, shape):
    _refused(f"average: expected quaternions (w, x, y, z), got shape {shape}", average, values)


def test_a_million_measurements_are_taken_and_one_more_is_refused():
    q = np.tile([0.5, 0.5, 0.5, 0.5], (MAX_MEASUREMENTS, 1))
    # 120° about (1, 1, 1) (common practice)
    assert mean_orientation(q).angle_to(Orientation.from_axis_angle((1, 1, 1), 120)) < 1e-12
    _refused("average: expected 1 to 1000000 measurements, got 1000001", mean_orientation,
             np.zeros((MAX_MEASUREMENTS + 1, 4)))


@pytest.mark.parametrize("square", [1 + 1.9e-6, 1 - 1.9e-6])
def test_a_squared_norm_within_2e_minus_6_of_one_is_taken(square):
    result = average([[math.sqrt(square), 0.0, 0.0, 0.0]])
    assert result.mean.quaternion.tolist() == [1.0, 0.0, 0.0, 0.0]


@pytest.mark.parametrize("square", [1 + 2.1e-6, 1 - 2.1e-6, 4.0, 0.0])
def test_a_squared_norm_beyond_2e_minus_6_of_one_is_refused_by_its_number(square):
    q = _w_first(_measurements(4))
    q[2] = [0.0, 0.0, math.sqrt(square), 0.0]
    _refused(f"average: measurement 3 has norm {math.sqrt(square):.9g}; expected unit quaternions", average, q)


@pytest.mark.parametrize("big, words", [
    (1e150, "average: measurement 2 has norm 1e+150; expected unit quaternions"),
    (1.01e150, "average: every quaternion must hold finite numbers"),
    (1e200, "average: every quaternion must hold finite numbers"),
    (float("inf"), "average: every quaternion must hold finite numbers"),
    (float("nan"), "average: every quaternion must hold finite numbers"),
])
def test_huge_or_non_finite_numbers_are_refused_as_not_finite(big, words):
    # up to 1e150 the norm is a number worth naming; beyond, its square is near overflow: not finite
    q = [[1.0, 0.0, 0.0, 0.0], [0.0, big, 0.0, 0.0]]
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        _refused(words, average, q)
        _refused(words, mean_orientation, q)


WEIGHT_WORDS = "average: expected 3 finite weights, 0 or more and not all 0"


@pytest.mark.parametrize("weights", [[0, 0, 0], [1, -1e-300, 1], [1, float("nan"), 1], [1, float("inf"), 1],
                                     [1, 2], [1, 2, 3, 4], [1, 1.01e150, 1], [[1, 2, 3, 4]]])
def test_weights_are_refused_word_for_word(weights):
    q = _w_first(_measurements(3))
    _refused(WEIGHT_WORDS, average, q, weights)
    _refused(WEIGHT_WORDS, mean_orientation, q, weights)


@pytest.mark.parametrize("weights", [[1, 0, 1], [[1], [2], [3]], [1e150, 1, 1], [1e-300, 1e-300, 2e-300]])
def test_weights_at_their_limits_are_taken(weights):
    rotations = _measurements(3, scatter_deg=0.3)
    flat = np.asarray(weights, dtype=float).reshape(-1)
    want = rotations.mean(weights=flat)                         # SciPy
    assert mean_orientation(_w_first(rotations), weights).angle_to(_orientation(want)) < 1e-12


@pytest.mark.parametrize("scale", [1e-300, 1e100, 1e149])
def test_only_the_ratios_of_the_weights_count(scale):
    # every figure divides by the total weight (the Average docstring): scaled weights change nothing, and
    # squares of 1e149 or 1e-300 must neither overflow nor underflow (an outlier is still flagged)
    rotations = _measurements(7, scatter_deg=0.02)
    q = _w_first(rotations)
    q[6] = _w_first(rotations[6] * Rotation.from_rotvec([math.radians(0.5), 0, 0]))
    weights = np.array([1.0, 2.0, 0.5, 1.5, 1.0, 2.5, 1.0])
    want = average(q, weights)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        got = average(q, weights * scale)
    assert want.flagged == (6,) and got.flagged == (6,)
    assert got.mean.isclose(want.mean, 1e-15)
    assert got.rms_deg == pytest.approx(want.rms_deg, rel=1e-12)
    assert got.standard_uncertainty_deg == pytest.approx(want.standard_uncertainty_deg, rel=1e-12)
    assert np.allclose(got.covariance_rad2, want.covariance_rad2, rtol=1e-12, atol=0)


# ---- the leave-one-out flags ----------------------------------------------------------------------------

def _scatters_from_the_others(rotations, weights, i):
    """Measurement i's angle from SciPy's weighted mean of the others, over the others' weighted RMS angle
    about that mean: the leave-one-out done in full (the module computes it to first order)."""
    keep = np.arange(len(rotations)) != i
    others, w = rotations[keep], weights[keep]
    mean = others.mean(weights=w)
    rms = math.sqrt(float(w @ (mean.inv() * others).magnitude() ** 2) / w.sum())
    return (mean.inv() * rotations[i]).magnitude() / rms


@pytest.mark.parametrize("weighted", [False, True])
def test_the_flags_are_those_of_a_full_leave_one_out_on_both_sides_of_three_scatters(weighted):
    base = _measurements(6, scatter_deg=0.02, seed=5)
    direction = np.array([0.6, -0.48, 0.64])
    weights = np.array([1.0, 2.0, 0.5, 1.5, 1.0, 0.8, 1.2]) if weighted else np.ones(7)
    judged = {True: 0, False: 0}
    for k in np.linspace(0.04, 0.1, 25):           # the outlier's distance, degrees: about 2 to 5 scatters
        rotations = Rotation.concatenate([base, base[0] * Rotation.from_rotvec(math.radians(k) * direction)])
        flagged = average(_w_first(rotations), weights if weighted else None).flagged
        for i in range(7):
            ratio = _scatters_from_the_others(rotations, weights, i)
            if abs(ratio - OUTLIER_SCATTERS) < 0.01 * OUTLIER_SCATTERS:
                continue                           # first order and full differ by about 1e-4 of the ratio
            assert (i in flagged) == (ratio > OUTLIER_SCATTERS), (k, i, ratio)
            judged[i in flagged] += 1
    assert judged[True] >= 5 and judged[False] >= 50      # both sides were seen


def test_three_measurements_are_enough_to_flag_one():
    pair = _measurements(2, scatter_deg=0.02, seed=8)
    far = pair[0] * Rotation.from_rotvec([0, math.radians(0.5), 0])
    rotations = Rotation.concatenate([pair, far])
    assert _scatters_from_the_others(rotations, np.ones(3), 2) > 5 * OUTLIER_SCATTERS
    assert average(_w_first(rotations)).flagged == (2,)


def test_a_measurement_of_weight_zero_is_not_flagged_however_far():
    good = _measurements(5, scatter_deg=0.02)
    far = good[0] * Rotation.from_rotvec([math.radians(5.0), 0, 0])
    result = average(_w_first(Rotation.concatenate([good, far])), [1, 1, 1, 1, 1, 0])
    assert result.flagged == ()
    assert result.angles_deg[5] > 4.9


def test_all_the_weight_on_one_measurement_flags_none_and_divides_by_no_zero():
    rotations = _measurements(4, scatter_deg=1.0)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        result = average(_w_first(rotations), [0, 3, 0, 0])
    assert result.flagged == () and result.standard_uncertainty_deg is None


def test_exact_fractions_are_numbers_like_any_other():
    from fractions import Fraction
    rows = [[Fraction(3, 5), Fraction(4, 5), 0, 0], [Fraction(3, 5), 0, Fraction(4, 5), 0], [1, 0, 0, 0]]
    weights = [Fraction(1, 3), Fraction(2, 3), 1]
    want = average(np.array(rows, dtype=float), [1 / 3, 2 / 3, 1])
    for given in (rows, np.array(rows, dtype=object)):
        got = average(given, weights)
        assert got.mean.isclose(want.mean, 1e-15) and got.rms_deg == pytest.approx(want.rms_deg, rel=1e-15)
        assert mean_orientation(given, np.array(weights, dtype=object)).isclose(want.mean, 1e-15)


def test_a_far_measurement_of_the_largest_weight_is_flagged():
    # the three others weigh 0.3 each, less than it together (a leave-one-out with SciPy: far beyond 3)
    good = _measurements(3, scatter_deg=0.02, seed=21)
    rotations = Rotation.concatenate([good, good[0] * Rotation.from_rotvec([0, 0, math.radians(0.4)])])
    weights = np.array([0.3, 0.3, 0.3, 1.0])
    assert _scatters_from_the_others(rotations, weights, 3) > 2 * OUTLIER_SCATTERS
    assert average(_w_first(rotations), weights).flagged == (3,)


def test_others_with_no_scatter_cannot_judge_one_that_differs():
    # three identical readings and one 0.57° off: the others' scatter is zero, so "three scatters" means
    # nothing and none is flagged (the rule asks for a scatter above zero)
    a = Rotation.from_euler("ZYX", [10, 20, 30], degrees=True)
    rows = np.array([_w_first(a)] * 3 + [_w_first(a * Rotation.from_rotvec([0.01, 0, 0]))])
    assert average(rows).flagged == ()


@pytest.mark.parametrize("row, canonical", [([0.6, -0.8, 0.0, 0.0], [0.6, -0.8, 0.0, 0.0]),
                                            ([-0.6, 0.0, 0.0, 0.8], [0.6, 0.0, 0.0, -0.8]),
                                            ([0.8, 0.0, 0.6, 0.0], [0.8, 0.0, 0.6, 0.0])])
def test_the_mean_has_no_minus_zero(row, canonical):
    # eigh returned −0.0 in the zero components of these (numpy 2.4): the canonical quaternion (w >= 0,
    # CONVENTIONS.md) with plain zeros, so nothing prints as "-0"
    for q in (mean_orientation([row]).quaternion, average([row, row]).mean.quaternion):
        assert np.allclose(q, canonical, rtol=0, atol=1e-15)
        assert not np.any(np.signbit(q) & (q == 0)) and np.count_nonzero(q == 0) == 2


def test_counted_is_the_number_of_measurements_of_weight_above_0():
    # count is every measurement given; counted those that move the mean (weight above 0), by hand.
    q = Rotation.from_rotvec(np.radians([[0.1, 0, 0], [0, 0.2, 0], [0, 0, 0.3], [0.2, 0.2, 0]])).as_quat(
        scalar_first=True)
    assert (average(q).count, average(q).counted) == (4, 4)
    assert (average(q, [1, 0, 2, 0]).count, average(q, [1, 0, 2, 0]).counted) == (4, 2)
    assert average(q[:1]).counted == 1
