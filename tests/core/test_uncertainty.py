"""The covariance of a point fit and its propagation to the figures a check judges, each checked against a
Monte Carlo of noisy cases (the empirical spread within 10 % of the prediction); SciPy's Rotation makes the
noise rotations."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.check import CheckSettings, check
from core.errors import InvalidInputError
from core.direction_fit import fit_directions
from core.fit import fit_points
from core.orientation import Orientation
from core.uncertainty import direction_fit_covariance, figure_uncertainties, isotropic, point_fit_covariance

RNG = np.random.default_rng(1401)
# an invented bracket: eight points on a 300 × 120 × 80 mm part, not symmetric, so the covariance is not round
NOMINAL = np.array([[150, 60, 40], [-150, 60, 40], [-150, -60, 40], [150, -60, -40], [0, 0, 40], [120, -60, 0],
                    [-100, 20, -40], [60, 60, -40]], dtype=float)
TRUE = Rotation.from_euler("ZYX", [30, -12, 5], degrees=True)
SIGMA_MM = 0.05


def _noisy_fit():
    measured = TRUE.apply(NOMINAL) + np.array([1000, -200, 50]) + RNG.normal(scale=SIGMA_MM, size=NOMINAL.shape)
    return fit_points(NOMINAL, measured)


def test_a_point_fits_covariance_matches_2000_noisy_fits():
    errors, predicted = [], []
    truth = Orientation.from_quaternion(TRUE.as_quat(scalar_first=True))
    for _ in range(2000):
        fit = _noisy_fit()
        # δ with R_fit = exp([δ]×) R_true, reference frame
        errors.append((fit.orientation @ truth.inverse()).as_rotation_vector(degrees=False))
        predicted.append(point_fit_covariance(NOMINAL, fit.orientation, fit.residuals))
    empirical = np.cov(np.array(errors).T)
    expected = np.mean(predicted, axis=0)          # σ estimated from each fit's own residuals
    spread_e, spread_p = np.linalg.eigvalsh(empirical), np.linalg.eigvalsh(expected)
    assert np.allclose(spread_e, spread_p, rtol=0.10)
    # and direction by direction: the standard deviation along each principal axis of the prediction
    for axis in np.linalg.eigh(expected)[1].T:
        assert math.sqrt(axis @ empirical @ axis) == pytest.approx(math.sqrt(axis @ expected @ axis), rel=0.10)


def _perturbed(measured: Orientation, covariance, count):
    deltas = RNG.multivariate_normal(np.zeros(3), covariance, size=count)
    return [Orientation.from_rotation_vector(d, degrees=False) @ measured for d in deltas]


@pytest.mark.parametrize("body_axis", ["+X", "+Z"])
def test_figure_uncertainties_match_a_monte_carlo_of_the_check(body_axis):
    nominal = Orientation.from_angles("ZYX", [30, -12, 5])
    measured = nominal @ Orientation.from_angles("ZYX", [1.2, -0.8, 0.6])
    covariance = np.diag([0.02, 0.05, 0.03]) ** 2 * (math.pi / 180) ** 2
    covariance[0, 1] = covariance[1, 0] = 0.3 * math.sqrt(covariance[0, 0] * covariance[1, 1])
    predicted = figure_uncertainties(nominal, measured, covariance, CheckSettings(body_axis=body_axis).axis_vector())
    settings = CheckSettings(mode="pointing_and_roll", body_axis=body_axis, pointing_tolerance_deg=10,
                             roll_tolerance_deg=10, total_tolerance_deg=10)
    results = [check(nominal, m, settings) for m in _perturbed(measured, covariance, 2000)]
    assert np.std([r.total_deg for r in results]) == pytest.approx(predicted["total_deg"], rel=0.10)
    assert np.std([r.pointing_deg for r in results]) == pytest.approx(predicted["pointing_deg"], rel=0.10)
    assert np.std([r.roll_deg for r in results]) == pytest.approx(predicted["roll_deg"], rel=0.10)


def test_an_isotropic_uncertainty_gives_every_figure_the_same_uncertainty():
    nominal = Orientation.from_angles("ZYX", [10, 20, 30])
    measured = nominal @ Orientation.from_axis_angle((1, 2, 2), 2)
    figures = figure_uncertainties(nominal, measured, isotropic(0.05), (0, 0, 1))
    assert figures == pytest.approx({"total_deg": 0.05, "pointing_deg": 0.05, "roll_deg": 0.05}, rel=1e-9)


@pytest.mark.parametrize("value", [-0.1, 181, float("nan"), True, "x"])
def test_a_typed_uncertainty_outside_its_range_is_refused(value):
    with pytest.raises(InvalidInputError, match="standard uncertainty"):
        isotropic(value)


def test_a_covariance_needs_three_points_with_weight():
    fit = fit_points(NOMINAL[:4], TRUE.apply(NOMINAL[:4]))
    with pytest.raises(InvalidInputError, match="at least 3 points"):
        point_fit_covariance(NOMINAL[:4], fit.orientation, fit.residuals, weights=[1, 1, 0, 0])


def test_a_direction_fits_covariance_matches_2000_noisy_fits():
    # an invented bench: gravity from a level, a boresight from a sight and a third direction from a tracker,
    # each known to 0.02° (their noise turns each direction by a small random rotation)
    body = np.array([[0, 0, -1], [1, 0, 0], [0.3, 0.9, 0.1]], dtype=float)
    body /= np.linalg.norm(body, axis=1)[:, None]
    reference = TRUE.apply(body)
    truth = Orientation.from_quaternion(TRUE.as_quat(scalar_first=True))
    sigma = math.radians(0.02)
    errors = []
    for _ in range(2000):
        # noise perpendicular to each direction, σ per axis (two axes across it)
        noise = RNG.normal(scale=sigma, size=reference.shape)
        noise -= np.einsum("ij,ij->i", noise, reference)[:, None] * reference
        fit = fit_directions(body, reference + noise, min_angle_deg=1)
        errors.append((fit.orientation @ truth.inverse()).as_rotation_vector(degrees=False))
    empirical = np.cov(np.array(errors).T)
    expected = direction_fit_covariance(reference, truth, direction_uncertainty_deg=0.02)
    assert np.allclose(np.linalg.eigvalsh(empirical), np.linalg.eigvalsh(expected), rtol=0.10)


def test_the_fit_uncertainty_of_six_points_on_the_axes_is_the_hand_worked_value():
    # Worked here: six nominal points at ±L on the body axes give H = Σ(|c|² I − c cᵀ) = 6L² I − 2L² I = 4L² I,
    # so Cov(δ) = σ² / (4L²) I with σ² = Σ|r|² / (3n − 6). With |r_i| = 0.1 mm for every point and L = 100 mm:
    # σ² = 0.06 / 12 = 0.005 mm², and u = sqrt(0.005) / 200 rad on every axis.
    from core.uncertainty import point_fit_standard_uncertainty
    length = 100.0
    points = length * np.vstack([np.eye(3), -np.eye(3)])
    residuals = 0.1 * np.array([[0, 1, 0], [0, 0, 1], [1, 0, 0], [0, -1, 0], [0, 0, -1], [-1, 0, 0]], dtype=float)
    largest, per_axis = point_fit_standard_uncertainty(points, Orientation.identity(), residuals)
    want = math.degrees(math.sqrt(0.005) / 200.0)
    assert largest == pytest.approx(want, rel=1e-12)
    assert per_axis == pytest.approx((want, want, want), rel=1e-12)


def test_the_fit_uncertainty_is_largest_across_the_line_of_nearly_collinear_points():
    from core.uncertainty import point_fit_standard_uncertainty
    rng = np.random.default_rng(3)
    points = np.column_stack([np.linspace(-200, 200, 9), rng.normal(scale=2.0, size=9), np.zeros(9)])
    residuals = rng.normal(scale=0.05, size=points.shape)
    largest, per_axis = point_fit_standard_uncertainty(points, Orientation.identity(), residuals)
    # The turn about the line (reference X) is the weakly determined one: its spread is the largest, and
    # the largest eigen-direction lies close to X (the points leave the line by about 1 %).
    assert per_axis[0] == max(per_axis) and per_axis[0] > 10 * max(per_axis[1:])
    assert largest >= per_axis[0] and largest == pytest.approx(per_axis[0], rel=1e-3)


@pytest.mark.parametrize("factor", [1e-200, 1e200])
def test_the_fit_uncertainty_of_huge_or_tiny_points_is_that_of_the_same_points_at_millimetre_scale(factor):
    # An angle's spread is residual over lever arm: scaling both by one factor changes nothing (worked here),
    # and squares of 1e200 must not overflow into a refusal or a warning.
    import warnings
    from core.uncertainty import point_fit_standard_uncertainty
    rng = np.random.default_rng(5)
    points = rng.uniform(-100, 100, size=(8, 3))
    residuals = rng.normal(scale=0.05, size=points.shape)
    want = point_fit_standard_uncertainty(points, Orientation.identity(), residuals)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        got = point_fit_standard_uncertainty(points * factor, Orientation.identity(), residuals * factor)
    assert got[0] == pytest.approx(want[0], rel=1e-9)
    assert got[1] == pytest.approx(want[1], rel=1e-9)
