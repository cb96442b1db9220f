"""core/uncertainty.py figure by figure and limit by limit: each covariance against a second computation
done here with numpy (the Gauss–Newton covariance of the whole six-parameter point fit; the QUEST information
matrix built from cross-product matrices), hand-worked geometries, SciPy's Rotation for the orientations, and
every refusal word for word from both sides of its limit. The Monte Carlo checks are in test_uncertainty.py."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.errors import InvalidInputError
from core.orientation import Orientation
from core.uncertainty import (direction_fit_covariance, direction_fit_uncertainty, point_fit_covariance,
                              point_fit_uncertainty)

TURNED = Orientation.from_angles("ZYX", [33.0, -17.0, 61.0])     # a general orientation: no zero in its matrix
COLLINEAR_WORDS = "point fit covariance: the nominal points do not fix the rotation (collinear or nearly so)"
PARALLEL_WORDS = ("direction fit covariance: the directions are parallel or nearly so; the turn about them is "
                  "not determined")


def _refused(words, function, *args, **kwargs):
    with pytest.raises(InvalidInputError) as caught:
        function(*args, **kwargs)
    assert str(caught.value) == words
    return caught.value


def _skew(v):
    """[v]× with [v]× u = v × u (common practice)."""
    return np.array([[0.0, -v[2], v[1]], [v[2], 0.0, -v[0]], [-v[1], v[0], 0.0]])


def _gauss_newton_covariance(points, orientation, residuals, weights=None):
    """A second computation of Cov(δ): the Gauss–Newton covariance σ² (Jᵀ W J)⁻¹ of the whole least-squares
    fit in its six parameters (δ, t), common practice for least squares, with the uncentred points; the
    rotation block of the inverse. The residual qᵢ − (exp([δ]×) R pᵢ + t) changes by [R pᵢ]× δ − t."""
    p = np.asarray(points, dtype=float)
    w = np.ones(len(p)) if weights is None else np.asarray(weights, dtype=float)
    turned = Rotation.from_quat(orientation.as_quaternion(), scalar_first=True).apply(p)     # SciPy turns them
    jacobian = np.vstack([np.hstack([_skew(a), -np.eye(3)]) for a in turned])
    normal = jacobian.T @ (np.repeat(w, 3)[:, None] * jacobian)
    used = np.count_nonzero(w)
    sigma2 = float(np.sum(w * np.sum(np.asarray(residuals) ** 2, axis=1))) / (3 * used - 6)
    return sigma2 * np.linalg.inv(normal)[:3, :3]


# ---- degenerate geometry: collinear points, parallel directions ----------------------------------------

@pytest.mark.parametrize("orientation", [Orientation.identity(), TURNED])
def test_collinear_points_are_refused_however_the_fit_is_turned(orientation):
    # Worked here: points on one line leave H = Σ(|c|² I − c cᵀ) with a zero eigenvalue along the line. Turned
    # by a general orientation the zero comes out as about ±1e-13 and its inverse was a huge, indefinite
    # matrix; its largest eigenvalue then passed for a 0.02° uncertainty.
    points = np.array([[0, 0, 0], [100, 0, 0], [200, 0, 0], [300, 0, 0]], dtype=float)
    residuals = np.random.default_rng(1).normal(scale=0.1, size=points.shape)
    _refused(COLLINEAR_WORDS, point_fit_covariance, points, orientation, residuals)
    _refused(COLLINEAR_WORDS, point_fit_uncertainty, points, orientation, residuals)


def _cross_points(s, length=100.0):
    """(±L, 0, 0) and (0, ±sL, 0): worked here, H = L² diag(2s², 2, 2 + 2s²), so the ratio of its smallest
    to its largest eigenvalue is s² / (1 + s²): 1e-9 at s = 3.1623e-5."""
    return length * np.array([[1, 0, 0], [-1, 0, 0], [0, s, 0], [0, -s, 0]], dtype=float)


RESIDUALS_4 = 0.01 * np.array([[1, 2, -1], [0, -1, 2], [-2, 1, 0], [1, -2, -1]], dtype=float)


@pytest.mark.parametrize("s", [3.15e-5, 1e-7, 0.0])
def test_points_nearly_on_a_line_below_the_limit_are_refused(s):
    _refused(COLLINEAR_WORDS, point_fit_covariance, _cross_points(s), TURNED, RESIDUALS_4)


@pytest.mark.parametrize("s", [3.17e-5, 1e-3, 0.5])
def test_points_nearly_on_a_line_above_the_limit_get_the_hand_worked_covariance(s):
    length = 100.0
    got = point_fit_covariance(_cross_points(s, length), TURNED, RESIDUALS_4)
    # hand-worked (see _cross_points): in body axes Cov = σ² H⁻¹, σ² = Σ|r|² / (3·4 − 6), turned into the
    # reference frame by R (SciPy's matrix)
    sigma2 = float(np.sum(RESIDUALS_4 ** 2)) / 6
    body = sigma2 * np.diag([1 / (2 * s * s), 1 / 2, 1 / (2 + 2 * s * s)]) / length ** 2
    m = Rotation.from_quat(TURNED.as_quaternion(), scalar_first=True).as_matrix()
    want = m @ body @ m.T
    # conditioning 1e9 at the limit leaves about 1e-7 of relative rounding in the small entries
    assert np.allclose(got, want, rtol=1e-6, atol=1e-6 * np.abs(want).max())
    assert np.allclose(got, _gauss_newton_covariance(_cross_points(s, length), TURNED, RESIDUALS_4),
                       rtol=1e-6, atol=1e-6 * np.abs(want).max())


def test_a_fit_just_inside_its_own_collinearity_limit_gets_a_covariance():
    # The fit refuses an off-line spread below 1e-3 of the along-line spread (core/fit.py); just above it the
    # covariance must still be given, and it is the Gauss–Newton one.
    from core.fit import COLLINEAR_REFUSE, fit_points
    s = 1.02 * COLLINEAR_REFUSE
    points = _cross_points(s)
    measured = TURNED.apply(points) + [5.0, -3.0, 2.0] + RESIDUALS_4
    fit = fit_points(points, measured)
    got = point_fit_covariance(points, fit.orientation, fit.residuals)
    want = _gauss_newton_covariance(points, fit.orientation, fit.residuals)
    assert np.allclose(got, want, rtol=1e-8, atol=1e-10 * np.abs(want).max())


def _fan(s):
    """x and (c, ±s, 0): worked here, Σ(I − r rᵀ) = diag(2s², 3 − 2s², 3), a ratio of 2s² / 3 between its
    smallest and largest eigenvalue: 1e-9 at s = 3.873e-5."""
    c = math.sqrt(1 - s * s)
    return np.array([[1, 0, 0], [c, s, 0], [c, -s, 0]], dtype=float)


RESIDUAL_ANGLES = [0.02, 0.05, 0.03]


@pytest.mark.parametrize("s", [3.85e-5, 1e-9, 0.0])
def test_directions_nearly_parallel_below_the_limit_are_refused(s):
    turned = TURNED.apply(_fan(s))
    _refused(PARALLEL_WORDS, direction_fit_covariance, turned, TURNED, RESIDUAL_ANGLES)
    _refused(PARALLEL_WORDS, direction_fit_uncertainty, turned, TURNED, RESIDUAL_ANGLES)


def test_parallel_and_opposite_directions_are_refused_however_they_are_turned():
    # x, x and −x: Σ(I − r rᵀ) = 3 diag(0, 1, 1) (worked here); turned, the zero is rounding, and its inverse
    # was a covariance with negative variances of 1e10
    directions = Rotation.from_euler("z", 33, degrees=True).apply([[1, 0, 0], [1, 0, 0], [-1, 0, 0]])
    _refused(PARALLEL_WORDS, direction_fit_covariance, directions, TURNED, RESIDUAL_ANGLES)
    _refused(PARALLEL_WORDS, direction_fit_covariance, directions[:2], TURNED, direction_uncertainty_deg=0.1)


@pytest.mark.parametrize("s", [3.9e-5, 0.01, 0.7])
def test_directions_nearly_parallel_above_the_limit_get_the_hand_worked_covariance(s):
    got = direction_fit_covariance(TURNED.apply(_fan(s)), TURNED, RESIDUAL_ANGLES)
    # σ² = Σ θ² / (2·3 − 3) (radians), Cov = σ² diag(1/(2s²), 1/(3 − 2s²), 1/3) in the fan's axes (see _fan),
    # turned into the reference frame by R (SciPy's matrix)
    sigma2 = float(np.sum(np.radians(RESIDUAL_ANGLES) ** 2)) / 3
    m = Rotation.from_quat(TURNED.as_quaternion(), scalar_first=True).as_matrix()
    want = m @ (sigma2 * np.diag([1 / (2 * s * s), 1 / (3 - 2 * s * s), 1 / 3])) @ m.T
    assert np.allclose(got, want, rtol=1e-6, atol=1e-6 * np.abs(want).max())


# ---- weights ---------------------------------------------------------------------------------------------

@pytest.mark.parametrize("weight, shown", [(-1, "-1.0"), (-1e-300, "-1e-300"), (float("nan"), "nan"),
                                           (float("inf"), "inf")])
def test_a_fits_bad_weight_is_named_as_a_plain_number(weight, shown):
    # the weight as a person typed it, not numpy's np.float64(-1.0)
    from core.fit import fit_points
    points = _cross_points(0.5)
    _refused(f"weights: weight 2 is {shown}; expected a finite number >= 0", fit_points, points, points,
             [1, weight, 1, 1])


BRACKET = np.array([[150, 60, 40], [-150, 60, 40], [-150, -60, 40], [150, -60, -40], [0, 0, 40], [120, -60, 0]],
                   dtype=float)     # an invented bracket's points (mm), off its centre, not symmetric
BRACKET_RESIDUALS = np.random.default_rng(29).normal(scale=0.05, size=BRACKET.shape)


@pytest.mark.parametrize("function, what", [(point_fit_covariance, "point fit covariance"),
                                            (point_fit_uncertainty, "point fit covariance")])
@pytest.mark.parametrize("weight, shown", [(-1, "-1.0"), (-1e-300, "-1e-300"), (float("nan"), "nan"),
                                           (float("-inf"), "-inf")])
def test_a_point_fits_negative_or_non_finite_weight_is_refused_by_its_number(function, what, weight, shown):
    # a negative weight used to pass, and gave an indefinite H (worked: 1, 1, 1, −1 on four points)
    weights = [1, 1, 1, weight, 1, 1]
    _refused(f"{what}: weights: weight 4 is {shown}; expected a finite number >= 0", function, BRACKET, TURNED,
             BRACKET_RESIDUALS, weights)


def test_a_point_fits_weights_must_be_one_per_point():
    _refused("point fit covariance: weights: expected 6 numbers (one per point), got shape (5,)",
             point_fit_covariance, BRACKET, TURNED, BRACKET_RESIDUALS, [1, 1, 1, 1, 1])


def test_unequal_weights_give_the_gauss_newton_covariance():
    weights = np.array([1.0, 0.25, 3.0, 0.5, 2.0, 1.5])
    want = _gauss_newton_covariance(BRACKET, TURNED, BRACKET_RESIDUALS, weights)
    got = point_fit_covariance(BRACKET, TURNED, BRACKET_RESIDUALS, weights)
    assert np.allclose(got, want, rtol=1e-10, atol=1e-14 * np.abs(want).max())
    largest, per_axis, covariance = point_fit_uncertainty(BRACKET, TURNED, BRACKET_RESIDUALS, weights)
    assert np.allclose(covariance, want, rtol=1e-10, atol=1e-14 * np.abs(want).max())
    # the figures in degrees: the square roots of numpy's largest eigenvalue and of the diagonal
    assert largest == pytest.approx(math.degrees(math.sqrt(np.linalg.eigvalsh(want)[-1])), rel=1e-10)
    assert per_axis == pytest.approx(tuple(np.degrees(np.sqrt(np.diag(want)))), rel=1e-10)
    # and unweighted, the same computation with equal weights
    plain = _gauss_newton_covariance(BRACKET, TURNED, BRACKET_RESIDUALS)
    assert np.allclose(point_fit_covariance(BRACKET, TURNED, BRACKET_RESIDUALS), plain, rtol=1e-10,
                       atol=1e-14 * np.abs(plain).max())


@pytest.mark.parametrize("scale", [1e-300, 1e306])
def test_only_the_ratios_of_the_weights_count(scale):
    # Cov = σ² H⁻¹ with both σ² and H proportional to the weights (worked here): 1e306 must not overflow
    weights = np.array([1.0, 0.25, 3.0, 0.5, 2.0, 1.5])
    want = point_fit_covariance(BRACKET, TURNED, BRACKET_RESIDUALS, weights)
    got = point_fit_covariance(BRACKET, TURNED, BRACKET_RESIDUALS, weights * scale)
    assert np.allclose(got, want, rtol=1e-12, atol=0)


def test_a_point_of_weight_zero_counts_as_if_it_were_not_there():
    # its residual, its place (the weighted centre) and the count of 3n − 6 all leave it out
    far = np.vstack([BRACKET, [[5000.0, -7000.0, 900.0]]])
    residuals = np.vstack([BRACKET_RESIDUALS, [[40.0, -30.0, 20.0]]])
    weights = [2, 1, 1, 0.5, 1, 3, 0]
    want = point_fit_covariance(BRACKET, TURNED, BRACKET_RESIDUALS, weights[:-1])
    assert np.allclose(point_fit_covariance(far, TURNED, residuals, weights), want, rtol=1e-12, atol=0)
    assert np.allclose(point_fit_uncertainty(far, TURNED, residuals, weights)[2], want, rtol=1e-9, atol=0)


def test_three_points_with_weight_are_enough_and_two_are_not():
    # three points leave 3·3 − 6 = 3 degrees of freedom (the module's docstring); the fourth's weight is 0
    points, residuals = BRACKET[:4], BRACKET_RESIDUALS[:4]
    want = _gauss_newton_covariance(points[:3], TURNED, residuals[:3])
    got = point_fit_covariance(points, TURNED, residuals, [1, 1, 1, 0])
    assert np.allclose(got, want, rtol=1e-10, atol=1e-14 * np.abs(want).max())
    words = "point fit covariance: expected at least 3 points with weight above zero"
    _refused(words, point_fit_covariance, points, TURNED, residuals, [1, 0, 1, 0])
    _refused(words, point_fit_covariance, points[:2], TURNED, residuals[:2])
    _refused(words, point_fit_uncertainty, points, TURNED, residuals, [0, 0, 0, 1e-300 * 0])


# ---- what the point fit's covariance refuses ---------------------------------------------------------------

ROWS_WORDS = "expected nominal points and residuals as matching (N, 3) rows"


@pytest.mark.parametrize("points, residuals", [
    (BRACKET[:, :2], BRACKET_RESIDUALS[:, :2]),                 # two columns
    (BRACKET[:, :, None], BRACKET_RESIDUALS[:, :, None]),       # three dimensions
    (BRACKET, BRACKET_RESIDUALS[:5]),                           # one residual short
    (BRACKET[0], BRACKET_RESIDUALS[0]),                         # one row, flat
])
def test_points_and_residuals_of_the_wrong_shape_are_refused(points, residuals):
    _refused("point fit covariance: " + ROWS_WORDS, point_fit_covariance, points, TURNED, residuals)
    _refused("point fit uncertainty: " + ROWS_WORDS, point_fit_uncertainty, points, TURNED, residuals)


def test_no_points_are_refused():
    _refused("point fit uncertainty: " + ROWS_WORDS, point_fit_uncertainty, np.empty((0, 3)), TURNED,
             np.empty((0, 3)))


@pytest.mark.parametrize("where", ["points", "residuals"])
@pytest.mark.parametrize("bad", [float("nan"), float("inf"), -float("inf")])
def test_a_non_finite_point_or_residual_is_refused(where, bad):
    points, residuals = BRACKET.copy(), BRACKET_RESIDUALS.copy()
    (points if where == "points" else residuals)[2, 1] = bad
    words = "expected finite numbers in the nominal points and residuals"
    _refused("point fit covariance: " + words, point_fit_covariance, points, TURNED, residuals)
    _refused("point fit uncertainty: " + words, point_fit_uncertainty, points, TURNED, residuals)


def test_coincident_points_are_refused_as_such():
    words = "point fit uncertainty: all nominal points coincide; the rotation is not determined"
    _refused(words, point_fit_uncertainty, np.tile([3.0, -4.0, 5.0], (4, 1)), TURNED, RESIDUALS_4)
    _refused(words, point_fit_uncertainty, np.zeros((4, 3)), TURNED, RESIDUALS_4)


@pytest.mark.parametrize("factor, refused", [(1e99, False), (1e101, True), (1e300, True)])
def test_residuals_out_of_all_proportion_to_the_points_are_refused(factor, refused):
    # the points' largest spread from their mean is 150 mm (worked here); residuals up to 1e100 times that
    # are carried through (their squares stay in range), beyond they are refused
    spread = float(np.abs(BRACKET - BRACKET.mean(axis=0)).max())
    residuals = np.zeros_like(BRACKET)
    residuals[0] = [factor * spread, 0.0, 0.0]
    if refused:
        _refused("point fit uncertainty: the residuals are out of all proportion to the points' spread (more "
                 "than 1e100 times it); expected residuals and points in one unit", point_fit_uncertainty, BRACKET,
                 TURNED, residuals)
    else:
        # scaled by one length the covariance is σ²/L² H⁻¹ of the scaled points: proportional to factor²
        got = point_fit_uncertainty(BRACKET, TURNED, residuals)[0]
        small = point_fit_uncertainty(BRACKET, TURNED, residuals / factor)[0]
        assert got == pytest.approx(math.degrees(math.radians(small) * factor), rel=1e-12)


@pytest.mark.parametrize("factor", [1e-300, 1e300])
def test_points_of_1e300_or_1e_minus_300_have_the_covariance_of_the_same_points_in_mm(factor):
    want = point_fit_uncertainty(BRACKET, TURNED, BRACKET_RESIDUALS)
    got = point_fit_uncertainty(BRACKET * factor, TURNED, BRACKET_RESIDUALS * factor)
    assert got[0] == pytest.approx(want[0], rel=1e-12)
    assert got[1] == pytest.approx(want[1], rel=1e-12)
    assert np.allclose(got[2], want[2], rtol=1e-12, atol=0)


def test_the_standard_uncertainty_pair_is_the_largest_and_the_per_axis_figures():
    from core.uncertainty import point_fit_standard_uncertainty
    largest, per_axis, _ = point_fit_uncertainty(BRACKET, TURNED, BRACKET_RESIDUALS, [1, 2, 1, 2, 1, 2])
    assert point_fit_standard_uncertainty(BRACKET, TURNED, BRACKET_RESIDUALS, [1, 2, 1, 2, 1, 2]) == (largest,
                                                                                                     per_axis)


# ---- the direction fit's covariance ------------------------------------------------------------------------

# an invented bench: gravity, a boresight and two tracker directions, in the reference frame (not unit on purpose)
DIRECTIONS = np.array([[0.0, 0.0, -9.81], [1.0, 0.2, 0.0], [0.3, 0.9, 0.1], [-0.5, 0.4, 0.7]])
ANGLES = np.array([0.03, 0.01, 0.05, 0.02])       # residual angles, degrees


def _quest_covariance(directions, angles_deg, weights=None, sigma_deg=None):
    """A second computation of the QUEST covariance (Shuster & Oh 1981, from memory): the information
    Σ wᵢ [rᵢ]×ᵀ [rᵢ]× built from cross-product matrices (for a unit r, [r]×ᵀ[r]× = I − r rᵀ), σ² from the
    residual angles over 2n − 3 degrees of freedom or as given."""
    r = np.asarray(directions, dtype=float)
    r = r / np.sqrt(np.sum(r * r, axis=1))[:, None]
    w = np.ones(len(r)) if weights is None else np.asarray(weights, dtype=float)
    information = sum(wi * _skew(ri).T @ _skew(ri) for wi, ri in zip(w, r))
    if sigma_deg is None:
        sigma2 = float(np.sum(w * np.radians(angles_deg) ** 2)) / (2 * np.count_nonzero(w) - 3)
    else:
        sigma2 = math.radians(sigma_deg) ** 2
    return sigma2 * np.linalg.solve(information, np.eye(3))


def test_three_square_directions_give_the_hand_worked_covariance():
    # Worked here: x, y, z give Σ(I − r rᵀ) = 3I − I = 2I; residuals of 0.1° each give σ² = 3 (0.1°)² / 3,
    # so Cov = (0.1°)² / 2 on every axis: u = 0.1° / √2, the largest and each axis alike.
    largest, per_axis, covariance = direction_fit_uncertainty(np.eye(3), TURNED, [0.1, 0.1, 0.1])
    assert largest == pytest.approx(0.1 / math.sqrt(2), rel=1e-12)
    assert per_axis == pytest.approx((0.1 / math.sqrt(2),) * 3, rel=1e-12)
    assert np.allclose(covariance, np.eye(3) * math.radians(0.1) ** 2 / 2, rtol=1e-12, atol=0)


@pytest.mark.parametrize("weights", [None, [1.0, 0.5, 2.0, 0.25], [3.0, 1.0, 1.0, 1.0]])
def test_the_direction_covariance_is_the_quest_covariance(weights):
    want = _quest_covariance(DIRECTIONS, ANGLES, weights)
    assert np.allclose(direction_fit_covariance(DIRECTIONS, TURNED, ANGLES, weights), want, rtol=1e-12, atol=0)
    largest, per_axis, covariance = direction_fit_uncertainty(DIRECTIONS, TURNED, ANGLES, weights)
    assert np.allclose(covariance, want, rtol=1e-12, atol=0)
    assert largest == pytest.approx(math.degrees(math.sqrt(np.linalg.eigvalsh(want)[-1])), rel=1e-12)
    assert per_axis == pytest.approx(tuple(np.degrees(np.sqrt(np.diag(want)))), rel=1e-12)


@pytest.mark.parametrize("sigma", [0.0, 0.02, 180.0])
def test_a_given_direction_uncertainty_replaces_the_residuals(sigma):
    want = _quest_covariance(DIRECTIONS, None, [1, 2, 1, 2], sigma_deg=sigma)
    got = direction_fit_covariance(DIRECTIONS, TURNED, ANGLES * 100, [1, 2, 1, 2], direction_uncertainty_deg=sigma)
    assert np.allclose(got, want, rtol=1e-12, atol=0)
    # two directions are enough then (no degrees of freedom needed)
    assert np.allclose(direction_fit_covariance(DIRECTIONS[:2], TURNED, direction_uncertainty_deg=sigma),
                       _quest_covariance(DIRECTIONS[:2], None, sigma_deg=sigma), rtol=1e-12, atol=0)


@pytest.mark.parametrize("sigma, shown", [(-1e-9, "-1e-09"), (180.000001, "180.000001"), (float("nan"), "nan"),
                                          (float("inf"), "inf"), ("a lot", "'a lot'"), (None, None)])
def test_a_direction_uncertainty_outside_0_to_180_degrees_is_refused(sigma, shown):
    if sigma is None:     # neither the uncertainty nor the residuals
        _refused("direction fit covariance: give the directions' uncertainty or the residuals",
                 direction_fit_covariance, DIRECTIONS, TURNED)
        return
    what = "direction fit covariance: the directions' uncertainty"
    words = f"{what}: expected a number of degrees, got {shown}" if isinstance(sigma, str) else \
        f"{what}: expected 0 to 180 degrees, got {shown}"
    _refused(words, direction_fit_covariance, DIRECTIONS, TURNED, direction_uncertainty_deg=sigma)


def test_a_direction_uncertainty_of_true_is_refused():
    _refused("direction fit covariance: the directions' uncertainty: expected a number of degrees",
             direction_fit_covariance, DIRECTIONS, TURNED, direction_uncertainty_deg=True)


@pytest.mark.parametrize("angles", [[0.03, 0.01, 0.05], [0.03, 0.01, 0.05, 0.02, 0.0], [0.03, -1e-9, 0.05, 0.02],
                                    [0.03, 180.0000001, 0.05, 0.02], [0.03, float("nan"), 0.05, 0.02],
                                    [0.03, float("inf"), 0.05, 0.02], [[0.03, 0.01, 0.05, 0.02]]])
def test_residual_angles_must_be_one_per_direction_and_0_to_180_degrees(angles):
    words = "direction fit covariance: expected 4 residual angles, one per direction, each 0 to 180 degrees"
    _refused(words, direction_fit_covariance, DIRECTIONS, TURNED, angles)
    _refused(words, direction_fit_uncertainty, DIRECTIONS, TURNED, angles)


def test_residual_angles_of_0_and_180_degrees_are_taken():
    got = direction_fit_covariance(DIRECTIONS, TURNED, [0.0, 180.0, 0.0, 0.0])
    assert np.allclose(got, _quest_covariance(DIRECTIONS, [0.0, 180.0, 0.0, 0.0]), rtol=1e-12, atol=0)


def test_three_directions_with_weight_are_enough_for_their_scatter_and_two_are_not():
    words = ("direction fit uncertainty: expected 3 or more directions with weight, so that the residuals show "
             "their spread")
    want = _quest_covariance(DIRECTIONS[:3], ANGLES[:3])
    assert np.allclose(direction_fit_uncertainty(DIRECTIONS, TURNED, ANGLES, [1, 1, 1, 0])[2], want, rtol=1e-12,
                       atol=0)
    assert np.allclose(direction_fit_uncertainty(DIRECTIONS[:3], TURNED, ANGLES[:3])[2], want, rtol=1e-12, atol=0)
    _refused(words, direction_fit_uncertainty, DIRECTIONS, TURNED, ANGLES, [1, 0, 1, 0])
    _refused(words, direction_fit_uncertainty, DIRECTIONS[:2], TURNED, ANGLES[:2])
    # the covariance alone takes two (one degree of freedom, 2·2 − 3)
    assert np.allclose(direction_fit_covariance(DIRECTIONS[:2], TURNED, ANGLES[:2]),
                       _quest_covariance(DIRECTIONS[:2], ANGLES[:2]), rtol=1e-12, atol=0)


def test_a_direction_of_weight_zero_counts_as_if_it_were_not_there():
    want = direction_fit_covariance(DIRECTIONS[[0, 1, 3]], TURNED, ANGLES[[0, 1, 3]], [2, 1, 0.5])
    got = direction_fit_covariance(DIRECTIONS, TURNED, [0.03, 0.01, 170.0, 0.02], [2, 1, 0, 0.5])
    assert np.allclose(got, want, rtol=1e-12, atol=0)


@pytest.mark.parametrize("function, what", [(direction_fit_covariance, "direction fit covariance"),
                                            (direction_fit_uncertainty, "direction fit uncertainty")])
@pytest.mark.parametrize("weight, shown", [(-1, "-1.0"), (float("nan"), "nan"), (float("inf"), "inf")])
def test_a_directions_negative_or_non_finite_weight_is_refused_by_its_number(function, what, weight, shown):
    _refused(f"{what}: weights: weight 3 is {shown}; expected a finite number >= 0", function, DIRECTIONS,
             TURNED, ANGLES, [1, 1, weight, 1])


def test_a_directions_weights_must_be_one_per_direction():
    _refused("direction fit uncertainty: weights: expected 4 numbers (one per point), got shape (3,)",
             direction_fit_uncertainty, DIRECTIONS, TURNED, ANGLES, [1, 1, 1])


@pytest.mark.parametrize("scale", [1e-300, 1e300])
def test_directions_and_weights_of_1e300_or_1e_minus_300_count_by_direction_and_ratio_only(scale):
    want = direction_fit_covariance(DIRECTIONS, TURNED, ANGLES, [1, 2, 3, 4])
    got = direction_fit_covariance(DIRECTIONS * scale, TURNED, ANGLES, np.array([1, 2, 3, 4]) * scale)
    assert np.allclose(got, want, rtol=1e-12, atol=0)


@pytest.mark.parametrize("directions, words", [
    (DIRECTIONS[:1], "direction fit covariance: expected two or more measured directions"),
    (DIRECTIONS[:, :2], "direction fit covariance: expected two or more measured directions"),
    (DIRECTIONS[0], "direction fit covariance: expected two or more measured directions"),
    (DIRECTIONS[:, :, None], "direction fit covariance: expected two or more measured directions"),
    ([[0, 0, 1], [0, 0, 0], [1, 0, 0]], "direction fit covariance: direction 2 has zero length; expected a non-zero "
                                        "(x, y, z)"),
    ([[0, 0, 1], [0, float("nan"), 0], [1, 0, 0]], "direction fit covariance: expected finite numbers in the "
                                                  "directions"),
    ([[0, 0, float("inf")], [0, 1, 0], [1, 0, 0]], "direction fit covariance: expected finite numbers in the "
                                                  "directions"),
])
def test_directions_that_are_not_directions_are_refused(directions, words):
    _refused(words, direction_fit_covariance, directions, TURNED, [0.1, 0.1, 0.1])
    _refused(words, direction_fit_uncertainty, directions, TURNED, [0.1, 0.1, 0.1])


# ---- a typed uncertainty ------------------------------------------------------------------------------------

@pytest.mark.parametrize("u", [0, -0.0, 1e-300, 0.05, 180, "0.05", np.float64(3.5)])
def test_a_typed_uncertainty_is_the_same_variance_on_every_axis(u):
    from core.uncertainty import isotropic
    want = (float(u) * math.pi / 180) ** 2          # degrees to radians, squared
    got = isotropic(u)
    assert got.shape == (3, 3) and got.dtype == np.float64
    assert np.array_equal(got, np.diag([want] * 3))


@pytest.mark.parametrize("u, words", [
    (-1e-300, "expected 0 to 180 degrees, got -1e-300"),
    (float(np.nextafter(180.0, 200.0)), "expected 0 to 180 degrees, got 180.00000000000003"),
    (float("nan"), "expected 0 to 180 degrees, got nan"), (float("inf"), "expected 0 to 180 degrees, got inf"),
    ("181", "expected 0 to 180 degrees, got '181'"), ("a tenth", "expected a number of degrees, got 'a tenth'"),
    (None, "expected a number of degrees, got None"), ([0.1], "expected a number of degrees, got [0.1]"),
    (True, "expected a number of degrees"), (False, "expected a number of degrees"),
])
def test_a_typed_uncertainty_is_refused_word_for_word(u, words):
    from core.uncertainty import isotropic
    error = _refused("standard uncertainty: " + words, isotropic, u)
    if "got" in words and "number" in words:
        assert error.__suppress_context__          # no chained traceback from float()


# ---- figures of a check: against numerical derivatives ---------------------------------------------------

NOMINAL = Orientation.from_angles("ZYX", [40.0, 10.0, -5.0])
# a covariance with unequal spreads and correlations (an invented case), radians²
_A = np.random.default_rng(41).normal(size=(3, 3))
COVARIANCE = _A @ _A.T * math.radians(0.05) ** 2


def _scipy(o):
    return Rotation.from_quat(o.as_quaternion(), scalar_first=True)


def _figures_after(nominal, measured, body_axis, delta):
    """(total, pointing, roll) in radians of the check with measured turned by exp([δ]×) (reference frame),
    computed with SciPy: total |log D|, D = Nᵀ M; pointing the angle between N b and M b; roll the twist of D
    about b by the swing–twist split, 2 atan2(v · b, w) of D's quaternion (common practice)."""
    n, m = _scipy(nominal), Rotation.from_rotvec(delta) * _scipy(measured)
    d = n.inv() * m
    out = [d.magnitude()]
    if body_axis is not None:
        b = np.asarray(body_axis, dtype=float) / np.abs(body_axis).max()      # 3e-200 squared would underflow
        b /= np.linalg.norm(b)
        nb, mb = n.apply(b), m.apply(b)
        out.append(math.atan2(np.linalg.norm(np.cross(nb, mb)), nb @ mb))
        w, *v = d.as_quat(scalar_first=True)
        out.append(2 * math.atan2(np.dot(v, b), w))
    return np.array(out)


def _propagated_deg(nominal, measured, body_axis, covariance, step=1e-7):
    """Standard deviations (degrees) of the figures, σ² = J C Jᵀ, J by central differences (common practice)."""
    columns = [(_figures_after(nominal, measured, body_axis, step * e) -
                _figures_after(nominal, measured, body_axis, -step * e)) / (2 * step) for e in np.eye(3)]
    jacobian = np.column_stack(columns)
    return np.degrees(np.sqrt(np.diag(jacobian @ covariance @ jacobian.T)))


@pytest.mark.parametrize("turn", [((1, 2, 2), 1.5), ((0, 0, 1), 30.0), ((3, -1, 0.5), 150.0)])
def test_the_total_deviations_uncertainty_is_its_derivatives(turn):
    from core.uncertainty import figure_uncertainties
    measured = NOMINAL @ Orientation.from_axis_angle(*turn)
    got = figure_uncertainties(NOMINAL, measured, COVARIANCE)
    assert set(got) == {"total_deg"}
    assert got["total_deg"] == pytest.approx(_propagated_deg(NOMINAL, measured, None, COVARIANCE)[0], rel=1e-6)


@pytest.mark.parametrize("body_axis", [(1, 0, 0), (0, 0, 1), (1, 2, -2), (0, -3e-200, 0)])
def test_the_pointing_errors_uncertainty_is_its_derivatives(body_axis):
    from core.uncertainty import figure_uncertainties
    measured = NOMINAL @ Orientation.from_axis_angle((1, -2, 0.5), 2.0)
    got = figure_uncertainties(NOMINAL, measured, COVARIANCE, body_axis)
    assert set(got) == {"total_deg", "pointing_deg", "roll_deg"}
    total, pointing, roll = _propagated_deg(NOMINAL, measured, body_axis, COVARIANCE)
    assert got["total_deg"] == pytest.approx(total, rel=1e-6)
    assert got["pointing_deg"] == pytest.approx(pointing, rel=1e-6)
    # the roll's first-order figure, (M b) · δ, neglects terms of the order of the deviation (2° = 0.035 rad)
    assert got["roll_deg"] == pytest.approx(roll, rel=0.05)


@pytest.mark.parametrize("body_axis", [(1, 0, 0), (0, 1, 0), (2, -1, 2)])
def test_the_rolls_uncertainty_is_its_derivative_for_a_pure_roll_and_near_it_for_a_small_deviation(body_axis):
    from core.uncertainty import figure_uncertainties
    # a turn about the body axis itself: the twist's derivative is exactly b · ε (worked here)
    measured = NOMINAL @ Orientation.from_axis_angle(body_axis, 3.0)
    got = figure_uncertainties(NOMINAL, measured, COVARIANCE, body_axis)
    assert got["roll_deg"] == pytest.approx(_propagated_deg(NOMINAL, measured, body_axis, COVARIANCE)[2], rel=1e-6)
    # a deviation of 0.01°: first order to about 2e-4
    small = NOMINAL @ Orientation.from_axis_angle((1, -2, 0.5), 0.01)
    got = figure_uncertainties(NOMINAL, small, COVARIANCE, body_axis)
    assert got["roll_deg"] == pytest.approx(_propagated_deg(NOMINAL, small, body_axis, COVARIANCE)[2], rel=1e-3)


def _largest_across(direction, covariance):
    """The largest variance across a unit direction: the larger eigenvalue of the 2×2 covariance in two
    directions across it, (a + c) / 2 + √(((a − c) / 2)² + b²) (closed form, common practice)."""
    u = np.cross(direction, [1.0, 0, 0] if abs(direction[0]) < 0.9 else [0, 1.0, 0])
    u /= np.linalg.norm(u)
    v = np.cross(direction, u)
    a, b, c = u @ covariance @ u, u @ covariance @ v, v @ covariance @ v
    return (a + c) / 2 + math.sqrt(((a - c) / 2) ** 2 + b * b)


@pytest.mark.parametrize("body_axis", [(1, 0, 0), (0.3, -0.4, 0.5)])
def test_with_no_pointing_error_its_uncertainty_is_the_largest_spread_across_the_axis(body_axis):
    from core.uncertainty import figure_uncertainties
    b = np.asarray(body_axis) / np.linalg.norm(body_axis)
    measured = NOMINAL @ Orientation.from_axis_angle(body_axis, 4.0)      # roll only: M b = N b
    got = figure_uncertainties(NOMINAL, measured, COVARIANCE, body_axis)
    mb = _scipy(measured).apply(b)
    assert got["pointing_deg"] == pytest.approx(math.degrees(math.sqrt(_largest_across(mb, COVARIANCE))), rel=1e-9)
    assert got["roll_deg"] == pytest.approx(math.degrees(math.sqrt(mb @ COVARIANCE @ mb)), rel=1e-9)


@pytest.mark.parametrize("pointing_rad, defined", [(1e-8, True), (2e-9, True), (5e-10, False), (1e-11, False)])
def test_a_pointing_error_below_1e_minus_9_rad_has_no_direction_and_above_it_has_one(pointing_rad, defined):
    from core.uncertainty import figure_uncertainties
    # body +X tipped towards −Z about body +Y: the plane of N x and M x has normal N y (worked here). The
    # covariance, in the nominal body axes, spreads 4 along y and 9 along z: a defined pointing error takes the
    # spread along N y (2 units), an undefined one the largest across M x (3 units).
    m = _scipy(NOMINAL).as_matrix()
    unit = math.radians(0.01) ** 2
    covariance = m @ np.diag([1.0, 4.0, 9.0]) @ m.T * unit
    measured = NOMINAL @ Orientation.from_rotation_vector([0, pointing_rad, 0], degrees=False)
    got = figure_uncertainties(NOMINAL, measured, covariance, (1, 0, 0))
    want = 2.0 if defined else 3.0
    assert got["pointing_deg"] == pytest.approx(want * 0.01, rel=1e-6)


def test_with_no_deviation_the_total_takes_the_largest_spread():
    from core.uncertainty import figure_uncertainties
    # eigenvalues do not change when the covariance is turned into body axes (linear algebra): numpy's largest.
    # N⁻¹ N comes out as about 7e-18 rad about some axis: that rounding once decided the figure.
    got = figure_uncertainties(NOMINAL, NOMINAL, COVARIANCE)
    assert got["total_deg"] == pytest.approx(math.degrees(math.sqrt(np.linalg.eigvalsh(COVARIANCE)[-1])), rel=1e-12)


@pytest.mark.parametrize("deviation_rad, defined", [(1e-8, True), (2e-9, True), (5e-10, False), (0.0, False)])
def test_a_deviation_below_1e_minus_9_rad_has_no_axis_and_above_it_has_one(deviation_rad, defined):
    from core.uncertainty import figure_uncertainties
    # a deviation about body y; the covariance, in the measured body axes, spreads 4 along y and 9 along z:
    # a defined deviation takes the spread along its axis (2 units), an undefined one the largest (3 units)
    measured = NOMINAL @ Orientation.from_rotation_vector([0, deviation_rad, 0], degrees=False)
    m = _scipy(measured).as_matrix()
    covariance = m @ np.diag([1.0, 4.0, 9.0]) @ m.T * math.radians(0.01) ** 2
    got = figure_uncertainties(NOMINAL, measured, covariance)
    assert got["total_deg"] == pytest.approx((2.0 if defined else 3.0) * 0.01, rel=1e-6)


def test_a_zero_body_axis_is_refused():
    from core.uncertainty import figure_uncertainties
    _refused("body axis has zero length; expected a non-zero (x, y, z)", figure_uncertainties, NOMINAL, NOMINAL,
             COVARIANCE, (0, 0, 0))


@pytest.mark.parametrize("factor", [1e-200, 1e200])
def test_a_tiny_or_huge_covariance_scales_every_figure_by_its_square_root(factor):
    from core.uncertainty import figure_uncertainties
    measured = NOMINAL @ Orientation.from_axis_angle((1, -2, 0.5), 2.0)
    want = figure_uncertainties(NOMINAL, measured, COVARIANCE, (0, 0, 1))
    got = figure_uncertainties(NOMINAL, measured, COVARIANCE * factor, (0, 0, 1))
    assert got == pytest.approx({k: v * math.sqrt(factor) for k, v in want.items()}, rel=1e-12)


def test_a_body_axis_counts_by_its_direction_only():
    from core.uncertainty import figure_uncertainties
    measured = NOMINAL @ Orientation.from_axis_angle((1, -2, 0.5), 2.0)
    assert figure_uncertainties(NOMINAL, measured, COVARIANCE, (0, 0, 5e10)) == pytest.approx(
        figure_uncertainties(NOMINAL, measured, COVARIANCE, (0, 0, 1)), rel=1e-14)


@pytest.mark.parametrize("covariance", [np.eye(2), np.eye(3)[:, :, None], np.ones(9), [[1, 0, 0], [0, 1, 0]],
                                        np.diag([1, float("nan"), 1]), np.diag([1, 1, float("inf")])])
def test_a_covariance_that_is_not_a_finite_3_by_3_matrix_is_refused(covariance):
    from core.uncertainty import figure_uncertainties
    _refused("orientation covariance: expected a finite 3×3 matrix", figure_uncertainties, NOMINAL, NOMINAL,
             covariance)


def test_a_covariance_may_be_nested_lists():
    from core.uncertainty import figure_uncertainties
    assert figure_uncertainties(NOMINAL, NOMINAL, COVARIANCE.tolist()) == figure_uncertainties(NOMINAL, NOMINAL,
                                                                                                COVARIANCE)


@pytest.mark.parametrize("settings", [
    dict(total_tolerance_deg=1.0),
    dict(mode="pointing_and_roll", body_axis="+X", pointing_tolerance_deg=0.5, roll_tolerance_deg=1.0),
    dict(mode="pointing_and_roll", body_axis=(0.0, 3.0, 4.0), pointing_tolerance_deg=0.5, roll_tolerance_deg=1.0),
])
def test_every_figure_a_check_judges_gets_its_own_uncertainty(settings):
    from core.check import CheckSettings, check
    from core.uncertainty import check_figure_uncertainties, figure_uncertainties
    settings = CheckSettings(**settings)
    for measured in (NOMINAL @ Orientation.from_axis_angle((1, -2, 0.5), 2.0),          # roll defined
                     NOMINAL @ Orientation.from_axis_angle((0, 1, 0), 180.0)):          # +X turned over
        figures = check_figure_uncertainties(NOMINAL, measured, settings, COVARIANCE)
        # the names are the check's own criteria (core/check.py), each one present
        assert {c.name for c in check(NOMINAL, measured, settings).criteria} <= set(figures)
        raw = figure_uncertainties(NOMINAL, measured, COVARIANCE, settings.axis_vector())
        if settings.mode == "pointing_and_roll":
            assert figures == {"pointing error": raw["pointing_deg"], "roll": raw["roll_deg"],
                               "roll (undefined, judged as 180°)": raw["roll_deg"]}
        else:
            assert figures == {"total deviation": raw["total_deg"]}


# ---- numbers of any kind, and the ends of a double ---------------------------------------------------------

def _fractions(values):
    from fractions import Fraction
    return [[Fraction(v).limit_denominator(10 ** 12) for v in row] for row in np.atleast_2d(values).tolist()]


def test_exact_fractions_are_numbers_like_any_other():
    # each input read as floats: the same covariance as for the floats the fractions stand for
    points, residuals = _fractions(BRACKET), _fractions(BRACKET_RESIDUALS)
    as_floats = np.array(points, dtype=float), np.array(residuals, dtype=float)
    want = point_fit_covariance(*as_floats[:1], TURNED, as_floats[1])
    assert np.allclose(point_fit_covariance(points, TURNED, residuals), want, rtol=1e-12, atol=0)
    assert np.allclose(point_fit_uncertainty(points, TURNED, residuals)[2], want, rtol=1e-12, atol=0)
    directions, angles, weights = _fractions(DIRECTIONS), _fractions(ANGLES)[0], _fractions([1, 2, 3, 4])[0]
    want = direction_fit_covariance(np.array(directions, dtype=float), TURNED, np.array(angles, dtype=float))
    assert np.allclose(direction_fit_covariance(directions, TURNED, angles), want, rtol=1e-12, atol=0)
    want = direction_fit_covariance(DIRECTIONS, TURNED, weights=[1, 2, 3, 4], direction_uncertainty_deg=0.1)
    got = direction_fit_covariance(DIRECTIONS, TURNED, weights=weights, direction_uncertainty_deg=0.1)
    assert np.allclose(got, want, rtol=1e-12, atol=0)
    from core.uncertainty import figure_uncertainties
    measured = NOMINAL @ Orientation.from_axis_angle((1, -2, 0.5), 2.0)
    assert figure_uncertainties(NOMINAL, measured, _fractions(COVARIANCE)) == pytest.approx(
        figure_uncertainties(NOMINAL, measured, np.array(_fractions(COVARIANCE), dtype=float)), rel=1e-12)


def test_residuals_of_exactly_1e100_times_the_spread_are_taken():
    # unit points about their mean (largest coordinate 1, spread 1: no rounding in the scaling)
    points = np.array([[1, 0, 0], [-1, 0, 0], [0, 1, 0], [0, -1, 0]], dtype=float)
    residuals = np.zeros((4, 3))
    residuals[0, 1] = 1e100
    # hand-worked: H = diag(2, 2, 4), σ² = 1e200 / 6, so the largest variance is 1e200 / 12 (about X and Y)
    largest = point_fit_uncertainty(points, TURNED, residuals)[0]
    assert largest == pytest.approx(math.degrees(math.sqrt(1e200 / 12)), rel=1e-12)
    residuals[0, 1] = float(np.nextafter(1e100, 1e101))
    with pytest.raises(InvalidInputError, match="out of all proportion"):
        point_fit_uncertainty(points, TURNED, residuals)


def test_residuals_that_overflow_when_scaled_are_refused_without_a_warning():
    # points 1e-300 apart with residuals of 1e100: scaled to the points' spread they pass 1e308
    _refused("point fit uncertainty: the residuals are out of all proportion to the points' spread (more than "
             "1e100 times it); expected residuals and points in one unit", point_fit_uncertainty, BRACKET * 1e-300,
             TURNED, np.full_like(BRACKET, 1e100))


OVERFLOW_WORDS = ("the covariance is beyond the largest number a double holds; expected residuals and weights in "
                  "proportion to the spread of the points or directions")


def test_a_covariance_beyond_a_double_is_refused_and_not_returned_as_infinity():
    # three points of weight 1e-60 apart (a tiny triangle) next to one of weight 0 a whole unit away: the
    # weighted spread is 1e-60 of the scale, so σ²/spread² passes 1e308 with residuals of 1e95
    points = np.array([[1e-60, 0, 0], [0, 1e-60, 0], [0, 0, 1e-60], [-1e-60, 0, 0], [1, 0, 0]])
    residuals = np.zeros((5, 3))
    residuals[:4, 0] = [1e95, -1e95, 1e95, -1e95]
    _refused("point fit covariance: " + OVERFLOW_WORDS, point_fit_uncertainty, points, TURNED, residuals,
             [1, 1, 1, 1, 0])
    # a given direction uncertainty with weights of the smallest double: an information of 1e-323
    _refused("direction fit covariance: " + OVERFLOW_WORDS, direction_fit_covariance, np.eye(3), TURNED,
             weights=[5e-324] * 3, direction_uncertainty_deg=1.0)
    # and with an uncertainty of 0: 0 times that infinite inverse is no number either (refused, no warning)
    _refused("direction fit covariance: " + OVERFLOW_WORDS, direction_fit_covariance, np.eye(3), TURNED,
             weights=[5e-324] * 3, direction_uncertainty_deg=0.0)


def test_an_information_of_zeros_is_refused_as_undetermined():
    _refused(COLLINEAR_WORDS, point_fit_covariance, np.tile([1.0, 2.0, 3.0], (4, 1)), TURNED, RESIDUALS_4)
    _refused(PARALLEL_WORDS, direction_fit_covariance, np.eye(3), TURNED, weights=[0, 0, 0],
             direction_uncertainty_deg=1.0)


def test_a_total_deviation_check_with_a_body_axis_set_judges_the_total_only():
    from core.check import CheckSettings
    from core.uncertainty import check_figure_uncertainties, figure_uncertainties
    measured = NOMINAL @ Orientation.from_axis_angle((1, -2, 0.5), 2.0)
    settings = CheckSettings(total_tolerance_deg=1.0, body_axis="+Z")
    assert check_figure_uncertainties(NOMINAL, measured, settings, COVARIANCE) == {
        "total deviation": figure_uncertainties(NOMINAL, measured, COVARIANCE)["total_deg"]}
