"""Point fit: the reason and the words of each refusal a person reads (coincident nominal points,
measured points on one line, a mirror image, a spread lost against a huge coordinate, a translation
beyond a double), the collinearity note exactly at its limit, and the translation as the summary shows it.

Check values: the profile matrix and spread ratios of a cross of points worked by hand; the fitted
rotation and translation from SciPy's Rotation.align_vectors (a general-purpose reference library); the
largest double, about 1.8e308 (IEEE 754, common practice)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.fit import COLLINEAR_NOTE, FitRefusedError, fit_points

ROTATION = Rotation.from_euler("ZYX", [40, -25, 70], degrees=True)
SHIFT = np.array([120.0, -35.0, 8.0])
CUBE = np.array([[x, y, z] for x in (-1.0, 1.0) for y in (-1.0, 1.0) for z in (-1.0, 1.0)]) \
    * np.array([30.0, 20.0, 10.0])


def refusal(nominal, measured):
    with pytest.raises(FitRefusedError) as caught:
        fit_points(nominal, measured)
    return caught.value


def test_coincident_nominal_points_are_refused_as_collinear():
    error = refusal([[1.0, 2.0, 3.0]] * 4, CUBE[:4])
    assert error.reason == "collinear"
    assert "all nominal points coincide; expected points spread over the part" in str(error)


def test_measured_points_on_a_line_state_the_ratio_of_their_spreads():
    # Worked by hand: nominal (±100, 0, 0), (0, ±100, 0); measured the same but (0, ±1e-5, 0). Both
    # centroids are 0, so H = Σ q pᵀ / 4 = diag(2·100·100, 2·1e-5·100, 0) / 4 = diag(5000, 5e-4, 0):
    # the second spread is 5e-4 / 5000 = 1e-7 of the first, at or below the 1e-6 limit.
    nominal = np.array([[100.0, 0, 0], [-100.0, 0, 0], [0, 100.0, 0], [0, -100.0, 0]])
    measured = np.array([[100.0, 0, 0], [-100.0, 0, 0], [0, 1e-5, 0], [0, -1e-5, 0]])
    error = refusal(nominal, measured)
    assert error.reason == "collinear"
    assert "the measured points lie on one line (their second spread is 1e-07 of the first, limit 1e-06)" \
        in str(error)


def test_a_mirror_image_is_refused_with_the_likely_cause():
    nominal = ROTATION.apply(CUBE)
    measured = nominal * np.array([1.0, 1.0, -1.0])     # z negated: a reflection (by hand, det −1)
    error = refusal(nominal, measured)
    assert error.reason == "reflection"
    message = str(error)
    assert "mirror image" in message
    assert "a sign or an axis convention is wrong (a left-handed frame?); expected both point sets in " \
           "right-handed frames" in message


def test_a_spread_lost_against_a_huge_coordinate_is_refused():
    # Nominal points spread 3e-71 about the origin (the box's largest half-side, 30e-72), measured ones
    # at 1e40: by hand a ratio of 3e-111, below the 1e-100 floor, although 1e40 itself needs no scaling.
    # The largest coordinate is the first point with x = +1e40 + 3e26: point 5.
    nominal = CUBE * 1e-72
    measured = CUBE * 1e25 + np.array([1e40, 0.0, 0.0])
    error = refusal(nominal, measured)
    assert error.reason == "range"
    message = str(error)
    assert "measured point 5, x = 1e+40 is out of all proportion to the spread of the nominal points, 3e-71 " \
        "(a ratio of 3e-111)" in message
    assert "double precision cannot resolve the rotation" in message


def test_a_spread_just_kept_against_a_large_coordinate_is_fitted():
    # The other side of the floor: nominal spread 1e-30 of a 1e40 coordinate (far above 1e-100) is
    # fitted, and the rotation matches SciPy's align_vectors about the centroids.
    nominal = CUBE * 1e10
    measured = ROTATION.apply(nominal) + np.array([1e40, 0.0, 0.0])
    measured_centred = measured - measured.mean(axis=0)
    fit = fit_points(nominal, measured)
    reference, _ = Rotation.align_vectors(measured_centred, nominal - nominal.mean(axis=0))
    np.testing.assert_allclose(fit.orientation.as_matrix(), reference.as_matrix(), atol=1e-6)


def test_a_translation_beyond_a_double_is_refused_and_named():
    # Nominal points about x = −1e308 and the same points about x = +1e308: identity rotation and a
    # translation of 2e308 (by hand), above the largest double.
    offset = np.array([1e308, 0.0, 0.0])
    points = CUBE * 1e305
    error = refusal(points - offset, points + offset)
    assert error.reason == "range"
    assert str(error).startswith("the fitted translation or residuals exceed the largest number a double "
                                 "holds (about 1.8e308)")


def cross(b):
    """Five points (±100, 0, 0), (0, ±b, 0) and the origin: off-line over along-line spread b / 100."""
    return np.array([[100.0, 0, 0], [-100.0, 0, 0], [0, b, 0], [0, -b, 0], [0, 0, 0]])


def collinear_notes(b):
    nominal = cross(b)
    fit = fit_points(nominal, ROTATION.apply(nominal) + SHIFT)
    return fit.spread_ratio, [n for n in fit.notes if "nearly collinear" in n]


def test_the_collinearity_note_starts_below_its_limit():
    # By hand: scatter diag(2·100²/5, 2·5²/5, 0) = diag(4000, 10, 0), ratio sqrt(10 / 4000) = 0.05 exactly
    # the limit (it comes out as the same double): no note there, a note just below it.
    ratio, notes = collinear_notes(5.0)
    assert ratio == COLLINEAR_NOTE and notes == []
    ratio, notes = collinear_notes(4.99)
    assert ratio == pytest.approx(0.0499, rel=1e-12) and len(notes) == 1
    assert "off-line spread 0.05 of the along-line spread" in notes[0]


def test_summary_shows_the_translation_in_x_y_z_order():
    rng = np.random.default_rng(5)
    nominal = rng.uniform(-100, 100, size=(8, 3))
    fit = fit_points(nominal, ROTATION.apply(nominal) + SHIFT)
    # SciPy applied the rotation; the shift was added by hand, so the fit finds it back.
    assert "translation [120.0000, -35.0000, 8.0000] mm" in fit.summary()
    assert "translation [120.0000, -35.0000, 8.0000] in" in fit.summary("in")
