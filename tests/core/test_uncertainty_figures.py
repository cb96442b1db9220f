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
