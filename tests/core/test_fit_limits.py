"""Fit at its limits: the minimum number of points before any is flagged, the flag threshold worked by
hand, the RMS with weights against its formula, and nearly collinear points just inside and just outside
the refusal and the note thresholds.

Check values: the modified z-score rule of Iglewicz & Hoaglin (1993, from memory) worked by hand on
small sets of distances; SciPy's Rotation.align_vectors (a general-purpose reference library) for the
weighted best fit; the spread ratio of a cross of points worked by hand."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.fit import COLLINEAR_NOTE, COLLINEAR_REFUSE, FLAG_MIN_POINTS, FitRefusedError, _flag, fit_points

ROTATION = Rotation.from_euler("ZYX", [40, -25, 70], degrees=True)
SHIFT = np.array([120.0, -35.0, 8.0])


def test_flagging_starts_at_five_points():
    assert FLAG_MIN_POINTS == 5
    # By hand: four equal distances and one far out: median 1, MAD 0, threshold max(1, 1e-9 size) = 1.
    assert _flag(np.array([1.0, 1.0, 1.0, 1.0, 100.0]), 10.0) == ((4,), 1.0)
    assert _flag(np.array([1.0, 1.0, 1.0, 100.0]), 10.0) == ((), None)


def test_flag_threshold_by_hand():
    # By hand: d = 1, 2, 3, 4, 100: median 3, |d − 3| = 2, 1, 0, 1, 97 so MAD = 1; threshold
    # 3 + 3.5 · 1 / 0.6745 = 8.1890...; only the 100 is above it.
    flagged, threshold = _flag(np.array([1.0, 2.0, 3.0, 4.0, 100.0]), 10.0)
    assert flagged == (4,)
    assert threshold == pytest.approx(3 + 3.5 / 0.6745, rel=1e-12)
    # Even count, by hand: d = 1, 2, 3, 4, 5, 50: median 3.5, deviations 2.5 1.5 .5 .5 1.5 46.5, MAD 1.5;
    # threshold 3.5 + 3.5 · 1.5 / 0.6745 = 11.28...
    flagged, threshold = _flag(np.array([1.0, 2.0, 3.0, 4.0, 5.0, 50.0]), 10.0)
    assert flagged == (5,) and threshold == pytest.approx(3.5 + 3.5 * 1.5 / 0.6745, rel=1e-12)
    # The floor: round-off sized residuals are never flagged (threshold 1e-9 of the size).
    flagged, threshold = _flag(np.array([0.0, 0.0, 0.0, 0.0, 1e-12]), 100.0)
    assert flagged == () and threshold == pytest.approx(1e-7)


@pytest.mark.parametrize("n", [4, 5])
def test_fit_applies_the_rule_from_five_points_on(n):
    nominal = np.random.default_rng(3).uniform(-100, 100, size=(n, 3))
    fit = fit_points(nominal, ROTATION.apply(nominal) + SHIFT)
    if n < FLAG_MIN_POINTS:
        assert fit.flag_threshold is None and any("no point is flagged" in note for note in fit.notes)
    else:
        assert fit.flag_threshold is not None and not any("no point is flagged" in note for note in fit.notes)


def test_weighted_rms_follows_its_formula():
    rng = np.random.default_rng(12)
    nominal = rng.uniform(-100, 100, size=(15, 3))
    measured = ROTATION.apply(nominal) + SHIFT + rng.normal(scale=0.3, size=(15, 3))
    weights = rng.uniform(0.2, 4.0, size=15)
    fit = fit_points(nominal, measured, weights)
    # SciPy's weighted fit about the weighted centroids gives the residuals ...
    p_mean = weights @ nominal / weights.sum()
    q_mean = weights @ measured / weights.sum()
    rotation, _ = Rotation.align_vectors(measured - q_mean, nominal - p_mean, weights=weights)
    residuals = measured - (rotation.apply(nominal - p_mean) + q_mean)
    d2 = np.sum(residuals ** 2, axis=1)
    # ... and the RMS is sqrt(Σ w d² / Σ w) (the PointFit docstring; by hand).
    assert fit.rms == pytest.approx(np.sqrt(weights @ d2 / weights.sum()), rel=1e-10)
    assert fit.rms != pytest.approx(np.sqrt(d2.mean()), rel=1e-6)      # weights change the figure
    np.testing.assert_allclose(fit.distances, np.sqrt(d2), rtol=1e-9)
    np.testing.assert_allclose(fit.residuals, residuals, atol=1e-9)
    # Scaling every weight leaves everything the same.
    scaled = fit_points(nominal, measured, 7.0 * weights)
    assert scaled.rms == pytest.approx(fit.rms, rel=1e-12)


def cross(ratio):
    """Five points: (±100, 0, 0), (0, ±100·ratio, 0) and the origin. By hand the scatter is
    diag(2·100²/5, 2·(100·ratio)²/5, 0), so the off-line over along-line spread is exactly `ratio`."""
    b = 100.0 * ratio
    return np.array([[100.0, 0, 0], [-100.0, 0, 0], [0, b, 0], [0, -b, 0], [0, 0, 0]])


@pytest.mark.parametrize("factor", [0.99, 0.5])
def test_just_inside_the_collinear_limit_is_refused(factor):
    nominal = cross(COLLINEAR_REFUSE * factor)
    with pytest.raises(FitRefusedError, match="lie on one line") as caught:
        fit_points(nominal, ROTATION.apply(nominal) + SHIFT)
    assert caught.value.reason == "collinear"


@pytest.mark.parametrize("factor", [1.01, 2.0])
def test_just_outside_the_collinear_limit_fits_with_a_note(factor):
    nominal = cross(COLLINEAR_REFUSE * factor)
    fit = fit_points(nominal, ROTATION.apply(nominal) + SHIFT)
    assert fit.spread_ratio == pytest.approx(COLLINEAR_REFUSE * factor, rel=1e-9)
    assert any("nearly collinear" in note for note in fit.notes)
    np.testing.assert_allclose(fit.orientation.as_matrix(), ROTATION.as_matrix(), atol=1e-9)


@pytest.mark.parametrize("factor, noted", [(0.99, True), (1.01, False)])
def test_the_note_threshold_from_both_sides(factor, noted):
    nominal = cross(COLLINEAR_NOTE * factor)
    fit = fit_points(nominal, ROTATION.apply(nominal) + SHIFT)
    assert any("nearly collinear" in note for note in fit.notes) is noted
    np.testing.assert_allclose(fit.orientation.as_matrix(), ROTATION.as_matrix(), atol=1e-12)
