"""Averages of repeated measurements (against SciPy's Rotation.mean) and the ISO 14253-1 decision rule."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.average import average, mean_orientation
from core.decision import CANNOT_DECIDE, CONFORMS, DOES_NOT_CONFORM, decide
from core.errors import InvalidInputError
from core.orientation import Orientation

RNG = np.random.default_rng(7)


def _measurements(count, scatter_rad=0.01, seed=3):
    base = Rotation.random(random_state=seed)
    return base * Rotation.from_rotvec(RNG.normal(scale=scatter_rad, size=(count, 3)))


@pytest.mark.parametrize("count", [1, 2, 5, 40])
def test_the_average_is_scipys_mean_with_the_same_weights_and_q_and_minus_q_mixed(count):
    rotations = _measurements(count)
    q = rotations.as_quat(scalar_first=True)
    q[::2] *= -1                                   # the same orientations, half of them written as −q
    weights = RNG.uniform(0.1, 3.0, count)
    result = average(q, weights)
    expected = Rotation.from_quat(q, scalar_first=True).mean(weights=weights)     # SciPy, Markley et al. 2007
    assert result.mean.angle_to(Orientation.from_quaternion(expected.as_quat(scalar_first=True))) < 1e-9
    # scatter: SciPy's angle of each measurement from the mean
    angles = np.degrees((expected.inv() * Rotation.from_quat(q, scalar_first=True)).magnitude())
    assert np.allclose(result.angles_deg, angles, atol=1e-9)
    assert result.rms_deg == pytest.approx(math.sqrt((weights * angles ** 2).sum() / weights.sum()), rel=1e-9)
    assert result.max_deg == pytest.approx(angles.max(), abs=1e-9)
    if count == 1:
        assert result.standard_uncertainty_deg is None
    else:
        # per axis, the mean's covariance: for these small equal-ish scatters rms / √(3 (n − 1)) when unweighted
        assert result.standard_uncertainty_deg > 0
        plain = average(q)
        assert plain.standard_uncertainty_deg == pytest.approx(plain.rms_deg / math.sqrt(3 * (count - 1)), rel=1e-6)


@pytest.mark.parametrize("off_unit", [0.0, 3e-7, -8e-7])
def test_the_mean_alone_is_scipys_mean_for_unit_and_nearly_unit_rows(off_unit):
    """mean_orientation, what the benchmark times against SciPy's mean: the same mean as SciPy for rows
    written as q or −q, exactly unit or off by up to 1e-6 (SciPy normalises them; so must we)."""
    rotations = _measurements(200, scatter_rad=0.2, seed=5)
    q = rotations.as_quat(scalar_first=True) * (1 + off_unit * RNG.uniform(0.5, 1.0, (200, 1)))
    q[1::3] *= -1
    weights = RNG.uniform(0.0, 2.0, 200)
    for w in (None, weights):
        expected = Rotation.from_quat(q, scalar_first=True).mean(weights=w)      # SciPy, Markley et al. 2007
        mean = mean_orientation(q, w)
        assert mean.angle_to(Orientation.from_quaternion(expected.as_quat(scalar_first=True))) < 1e-12
        assert mean.quaternion[0] > 0 and abs(np.linalg.norm(mean.quaternion) - 1) < 1e-15
        # the same mean; isclose measures through a quaternion product, whose rounding leaves up to ~1e-16 rad
        # between equal values (2,000 random quaternions against themselves: 1.2e-16), so 0 cannot be the bound
        assert mean.isclose(average(q, w).mean, 1e-15)


def test_a_measurement_far_from_the_others_is_flagged_and_the_others_are_not():
    good = _measurements(6, scatter_rad=math.radians(0.02))
    bad = good[0] * Rotation.from_rotvec([math.radians(0.5), 0, 0])
    result = average(list(map(lambda r: Orientation.from_quaternion(r.as_quat(scalar_first=True)),
                              [*good, bad])))
    assert result.flagged == (6,)
    assert average(good.as_quat(scalar_first=True)).flagged == ()


@pytest.mark.parametrize("bad, words", [([], "at least one"), ([[1, 0, 0]], "shape"),
                                        ([[2, 0, 0, 0]], "norm 2"), ([[float("nan"), 0, 0, 0]], "finite")])
def test_measurements_that_are_not_unit_quaternions_are_refused(bad, words):
    for function in (average, mean_orientation):
        with pytest.raises(InvalidInputError, match=words):
            function(np.array(bad, dtype=float) if bad else [])


@pytest.mark.parametrize("row", [[1.0, 0, 0, 1e200], [float("inf"), 0, 0, 0], [1.0, float("nan"), 0, 0],
                                 [1 + 3e-6, 0, 0, 0]])
def test_one_bad_row_among_good_ones_is_refused_by_its_number(row):
    q = _measurements(5).as_quat(scalar_first=True)
    q[3] = row
    with pytest.raises(InvalidInputError, match="finite" if not np.all(np.abs(row) < 2) else "measurement 4 has norm"):
        mean_orientation(q)


def test_weights_must_be_finite_and_not_all_zero():
    q = _measurements(3).as_quat(scalar_first=True)
    for weights in ([0, 0, 0], [1, -1, 1], [1, float("inf"), 1], [1, 2]):
        with pytest.raises(InvalidInputError, match="weights"):
            average(q, weights)


# ISO 14253-1: conforms when d <= T - U, does not conform when d > T + U, otherwise cannot decide.
# The numbers are our own cases around T = 1°, u = 0.1°, k = 2 (U = 0.2°).
@pytest.mark.parametrize("value, outcome", [
    (0.0, CONFORMS), (0.8, CONFORMS), (0.8 + 1e-9, CANNOT_DECIDE), (1.0, CANNOT_DECIDE),
    (1.2, CANNOT_DECIDE), (1.2 + 1e-9, DOES_NOT_CONFORM), (5.0, DOES_NOT_CONFORM)])
def test_the_decision_zones_meet_at_the_tolerance_plus_and_minus_the_expanded_uncertainty(value, outcome):
    decision = decide(value, 1.0, 0.1)
    assert decision.outcome == outcome
    assert decision.expanded_deg == pytest.approx(0.2)
    assert decision.conformance_limit_deg == pytest.approx(0.8)
    assert decision.non_conformance_limit_deg == pytest.approx(1.2)


def test_without_an_uncertainty_the_decision_is_the_plain_comparison_and_says_so():
    assert decide(1.0, 1.0).outcome == CONFORMS
    assert decide(1.0 + 1e-9, 1.0).outcome == DOES_NOT_CONFORM
    assert "no measurement uncertainty was given" in decide(0.5, 1.0).words()


def test_the_coverage_factor_widens_the_guard_band():
    assert decide(0.85, 1.0, 0.1, coverage=2).outcome == CANNOT_DECIDE
    assert decide(0.85, 1.0, 0.1, coverage=1).outcome == CONFORMS
    assert "k = 3" in decide(0.95, 1.0, 0.1, coverage=3).words()


@pytest.mark.parametrize("args, words", [((-1, 1), "checked figure"), ((1, 200), "tolerance"),
                                         ((1, 1, float("nan")), "standard uncertainty"),
                                         ((1, 1, 0.1, 0), "coverage"), ((1, 1, True), "standard uncertainty")])
def test_decision_inputs_are_checked(args, words):
    with pytest.raises(InvalidInputError, match=words):
        decide(*args)


def test_each_figure_is_decided_by_its_own_propagated_uncertainty():
    """A covariance wholly about the measured boresight (invented: 0.1° standard deviation in roll only):
    propagated (core/uncertainty.py, its Monte Carlo tests) the pointing error has no uncertainty and the
    roll 0.1°. ISO 14253-1 then decides each figure by its own U = 2u: pointing 0.45° against 0.5° conforms,
    roll 0.9° against 1° cannot be decided (1 − 0.2 < 0.9 <= 1 + 0.2), where one u = 0.1° on both would leave the
    pointing undecided too."""
    from core.check import CheckSettings, check
    from core.decision import decide_check, setup_figure_uncertainties
    from core.adjustment_setup import AdjustmentSetup
    nominal = Orientation.from_angles("ZYX", [40, 10, -5])
    measured = nominal @ Orientation.from_axis_angle((0, 1, 0), 0.45) @ Orientation.from_axis_angle((1, 0, 0), 0.9)
    boresight = measured.apply([1.0, 0, 0])
    setup = AdjustmentSetup(uncertainty_deg=0.1, covariance_deg2=tuple(map(tuple, 0.01 * np.outer(boresight, boresight))))
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+X", pointing_tolerance_deg=0.5, roll_tolerance_deg=1.0)
    result = check(nominal, measured, settings)
    figures = setup_figure_uncertainties(nominal, measured, settings, setup)
    assert figures["pointing error"] == pytest.approx(0, abs=1e-9) and figures["roll"] == pytest.approx(0.1, rel=1e-9)
    decisions, overall = decide_check(result, 0.1, 2.0, figures)
    assert [(c.name, d.outcome) for c, d in decisions] == [("pointing error", CONFORMS), ("roll", CANNOT_DECIDE)]
    assert overall == CANNOT_DECIDE
    plain, _ = decide_check(result, 0.1, 2.0)
    assert [d.outcome for _, d in plain] == [CANNOT_DECIDE, CANNOT_DECIDE]
    # the total-deviation check takes the total's own uncertainty
    total = CheckSettings(total_tolerance_deg=1.0)
    assert set(setup_figure_uncertainties(nominal, measured, total, setup)) == {"total deviation"}
    assert setup_figure_uncertainties(nominal, measured, total, AdjustmentSetup(uncertainty_deg=0.1)) is None
