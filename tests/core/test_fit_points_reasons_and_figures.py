"""The best fit of point pairs: each refusal's reason and words (the module's own), a mirror image refused
whatever the unit (points a few centimetres apart typed in metres included), the figures a fit reports
(spread ratio, RMS, worst point, the note on nearly collinear points with its figure, the note on too few
points to flag) and the summary a person reads.

Check values: SciPy's Rotation.align_vectors (the same weighted least-squares problem), rectangles and
quarter turns worked by hand, and the collinear note's figure atan(rms / (off-line spread · √n))
recomputed here with numpy's eigvalsh from the nominal points. All point sets are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import InvalidInputError, Orientation
from core.fit import FitRefusedError, fit_points

# A rectangle 4 × 2 in the body XY plane and a point above it (invented, mm).
PLATE = np.array([[2.0, 1.0, 0.0], [-2.0, 1.0, 0.0], [-2.0, -1.0, 0.0], [2.0, -1.0, 0.0], [0.0, 0.0, 1.0]])
RZ90 = np.array([[0.0, -1.0, 0.0], [1.0, 0.0, 0.0], [0.0, 0.0, 1.0]])      # worked by hand


def refused(nominal, measured, weights=None):
    with pytest.raises(FitRefusedError) as caught:
        fit_points(nominal, measured, weights)
    return str(caught.value), caught.value.reason


# --- refusals ----------------------------------------------------------------------------------------

def test_fewer_than_three_weighted_points_are_refused_as_too_few():
    assert refused(PLATE, PLATE, [1, 1, 0, 0, 0]) == (
        "2 point pair(s) with weight above zero; expected at least 3", "too few")
    assert refused(PLATE[:2], PLATE[:2]) == ("2 point pair(s) with weight above zero; expected at least 3",
                                             "too few")


def test_three_weighted_points_of_five_are_enough():
    fit = fit_points(PLATE, PLATE + 5.0, [1, 1, 1, 0, 0])
    np.testing.assert_allclose(fit.translation, [5.0, 5.0, 5.0], atol=1e-12)


def test_point_sets_of_different_lengths_are_refused_in_words():
    with pytest.raises(InvalidInputError) as caught:
        fit_points(PLATE, PLATE[:4])
    assert str(caught.value) == ("nominal and measured points differ in number (5 and 4); expected one measured "
                                 "point per nominal point")


def test_points_that_are_not_rows_of_three_are_refused_in_words():
    with pytest.raises(InvalidInputError) as caught:
        fit_points(PLATE[:, :2], PLATE[:, :2])
    assert str(caught.value) == "nominal points: expected shape (N, 3), got (5, 2)"
    with pytest.raises(InvalidInputError) as caught:
        fit_points(PLATE, [[0, 0, "x"]])
    assert str(caught.value) == "measured points: expected rows of three numbers, got [[0, 0, 'x']]"
    with pytest.raises(InvalidInputError) as caught:
        fit_points([[0, 0, "x"]] * 200, PLATE)
    message = str(caught.value)                 # what was given is echoed, shortened
    assert message.startswith("nominal points: expected rows of three numbers, got [[0, 0, 'x'], [0, 0, 'x'], ")
    assert len(message) < 600


def test_a_point_that_is_not_finite_is_refused_by_its_number_from_one():
    measured = PLATE.copy()
    measured[3, 1] = np.nan
    with pytest.raises(InvalidInputError) as caught:
        fit_points(PLATE, measured)
    assert str(caught.value) == "measured points: point 4 has NaN or infinity; expected finite numbers"


def test_weights_of_the_wrong_count_or_below_zero_are_refused_in_words():
    with pytest.raises(InvalidInputError) as caught:
        fit_points(PLATE, PLATE, [1, 1, 1])
    assert str(caught.value) == "weights: expected 5 numbers (one per point), got shape (3,)"
    with pytest.raises(InvalidInputError) as caught:
        fit_points(PLATE, PLATE, [1, -0.5, 1, 1, 1])
    assert str(caught.value) == "weights: weight 2 is -0.5; expected a finite number >= 0"


def test_coincident_nominal_points_are_refused_as_collinear():
    assert refused(np.zeros((4, 3)), PLATE[:4]) == (
        "all nominal points coincide; expected points spread over the part", "collinear")


def test_coincident_measured_points_are_refused_as_collinear():
    message, reason = refused(PLATE, np.ones((5, 3)))
    assert reason == "collinear"
    assert message == ("all measured points coincide: the rotation is not determined; expected the measured "
                       "points spread like the nominal ones")


@pytest.mark.parametrize("scale_mm", [50.0, 1.0, 0.05])
def test_a_mirror_image_is_refused_in_any_unit(scale_mm):
    # The same part in mm, and in metres (0.05: a few centimetres), mirrored through the XY plane.
    nominal = PLATE * scale_mm
    message, reason = refused(nominal, nominal * [1.0, 1.0, -1.0])
    assert reason == "reflection"
    assert message.startswith("the measured points are a mirror image of the nominal points")


def test_the_fitted_figures_of_a_refusal_of_range_carry_the_reason():
    assert refused(PLATE, PLATE + [1.7e308, 0.0, 0.0])[1] == "range"


# --- figures -----------------------------------------------------------------------------------------

def test_a_quarter_turn_and_a_shift_are_recovered_with_their_figures():
    # Worked by hand: measured = Rz(90) · nominal + (10, 20, 30), exactly.
    fit = fit_points(PLATE, PLATE @ RZ90.T + [10.0, 20.0, 30.0])
    np.testing.assert_allclose(fit.orientation.as_matrix(), RZ90, atol=1e-15)
    np.testing.assert_allclose(fit.translation, [10.0, 20.0, 30.0], atol=1e-13)
    assert fit.rms < 1e-13 and fit.flagged == () and fit.notes == ()
    # Off-line over along-line spread: the scatter's eigenvalues (ascending) are 0.16, 0.8 and 3.2 (worked by
    # hand from the 5 points: x² mean 16/5, y² mean 4/5, z centred 0.16), so the ratio is √(0.8/3.2) = 0.5.
    assert fit.spread_ratio == pytest.approx(0.5, rel=1e-12)


def test_residuals_are_measured_minus_fitted_and_the_worst_point_is_the_largest():
    measured = PLATE @ RZ90.T
    measured[2] += [0.0, 0.0, 0.5]
    fit = fit_points(PLATE, measured)
    # SciPy's align_vectors, with the centroids removed, solves the same problem.
    rotation, _ = Rotation.align_vectors(measured - measured.mean(0), PLATE - PLATE.mean(0))
    translation = measured.mean(0) - rotation.apply(PLATE.mean(0))
    residuals = measured - rotation.apply(PLATE) - translation
    np.testing.assert_allclose(fit.residuals, residuals, atol=1e-12)
    np.testing.assert_allclose(fit.distances, np.linalg.norm(residuals, axis=1), atol=1e-12)
    assert fit.rms == pytest.approx(np.sqrt(np.mean(np.sum(residuals ** 2, axis=1))), rel=1e-12)
    assert fit.worst_index == 2


def test_a_point_of_weight_zero_is_left_out_of_the_fit_but_keeps_its_residual():
    measured = PLATE + [1.0, 2.0, 3.0]
    measured[4] += [0.0, 0.0, 0.3]
    fit = fit_points(PLATE, measured, [1, 1, 1, 1, 0])
    np.testing.assert_allclose(fit.translation, [1.0, 2.0, 3.0], atol=1e-12)
    np.testing.assert_allclose(fit.residuals[4], [0.0, 0.0, 0.3], atol=1e-12)
    assert fit.rms < 1e-12          # weighted: the left-out point does not count


def test_below_five_points_there_is_a_note_and_no_threshold_and_from_five_neither():
    fit = fit_points(PLATE[:4] + [0, 0, 0], PLATE[:4])
    assert fit.flag_threshold is None and fit.flagged == ()
    assert fit.notes == ("with 4 points no point is flagged: the fit absorbs a single bad point (at least 5 are "
                         "needed)",)
    five = fit_points(PLATE, PLATE)
    assert five.notes == () and five.flag_threshold is not None


def nearly_collinear_case():
    # Off the X line by 0.2 in y at one end and 0.1 in z at the other: both off-line spreads above zero.
    nominal = np.array([[-10.0, 0.0, 0.1], [-5.0, 0.0, 0.0], [0.0, 0.0, 0.0], [5.0, 0.0, 0.0], [10.0, 0.2, 0.0]])
    noise = np.array([[0.01, -0.02, 0.015], [-0.01, 0.0, 0.02], [0.0, 0.01, -0.03], [0.02, -0.01, 0.0],
                      [-0.015, 0.02, 0.01]])                                   # invented probe noise, mm
    return nominal, nominal + [1.0, 2.0, 3.0] + noise


def test_nearly_collinear_points_get_a_note_with_the_weak_turn_in_degrees():
    nominal, measured = nearly_collinear_case()
    fit = fit_points(nominal, measured)
    centred = nominal - nominal.mean(0)
    eigen = np.linalg.eigvalsh(centred.T @ centred / len(nominal))
    assert eigen[0] > 1e-4 and eigen[1] > 1e-4
    assert fit.spread_ratio == pytest.approx(np.sqrt(eigen[1] / eigen[2]), rel=1e-9)
    weak = np.degrees(np.arctan2(fit.rms, np.sqrt(eigen[0] + eigen[1]) * np.sqrt(len(nominal))))
    assert fit.notes == (f"the nominal points are nearly collinear (off-line spread {fit.spread_ratio:.2g} of the "
                         f"along-line spread): the rotation about their line is weakly determined, about "
                         f"±{weak:.2g}° from the residuals",)


def test_the_weak_turn_counts_only_points_of_weight_above_zero():
    nominal, measured = nearly_collinear_case()
    nominal = np.vstack([nominal, [[0.0, 0.0, 0.0]]])
    measured = np.vstack([measured, [[50.0, 50.0, 50.0]]])            # left out with weight 0
    fit = fit_points(nominal, measured, [1, 1, 1, 1, 1, 0])
    centred = nominal[:5] - nominal[:5].mean(0)
    eigen = np.linalg.eigvalsh(centred.T @ centred / 5)
    weak = np.degrees(np.arctan2(fit.rms, np.sqrt(eigen[0] + eigen[1]) * np.sqrt(5)))
    assert f"about ±{weak:.2g}° from the residuals" in fit.notes[0]


@pytest.mark.parametrize("scale", [50.0, 0.05])
def test_a_weighted_mirror_image_is_refused_too(scale):
    nominal = PLATE * scale
    with pytest.raises(FitRefusedError) as caught:
        fit_points(nominal, nominal * [1.0, 1.0, -1.0], [1.0, 2.0, 1.0, 0.5, 3.0])
    assert caught.value.reason == "reflection"


def test_the_summary_reads_as_worked_by_hand():
    fit = fit_points(PLATE, PLATE @ RZ90.T + [10.0, 20.0, 30.0])
    lines = fit.summary("in").splitlines()
    assert lines[0] == ("best fit of 5 points: 90.0000° about [0.00000, 0.00000, 1.00000], translation "
                        "[10.0000, 20.0000, 30.0000] in")
    assert lines[1].startswith("RMS residual ") and lines[1].endswith(" in")
    assert len(lines) == 2


def test_the_summary_names_flagged_points_from_one():
    rng = np.random.default_rng(7)
    nominal = rng.uniform(-100, 100, size=(12, 3))
    measured = nominal + rng.normal(scale=0.01, size=(12, 3))
    measured[6] += [0.0, 0.0, 5.0]                                 # one point far off (invented)
    fit = fit_points(nominal, measured)
    assert fit.flagged == (6,) and fit.worst_index == 6
    assert fit.summary().splitlines()[2] == f"flagged (residual above {fit.flag_threshold:.4g} mm): point(s) 7"
    assert f"worst point 7 at {fit.distances[6]:.4g} mm" in fit.summary()


def test_round_off_is_never_flagged_the_threshold_stays_at_1e_minus_9_of_the_size():
    # An exact quarter turn of the plate at 100 times its size: one point keeps a round-off residual near
    # 1e-14 and the others none, so the median and the MAD are 0. The floor is 1e-9 of the size, the
    # square root of the largest scatter eigenvalue, 100·√3.2 (worked by hand above): 1.789e-7.
    fit = fit_points(PLATE * 100, PLATE * 100 @ RZ90.T + 7.0)
    assert fit.flag_threshold == pytest.approx(1e-7 * np.sqrt(3.2), rel=1e-12)
    assert fit.flagged == ()
    assert fit_points(PLATE, PLATE).flag_threshold == pytest.approx(1e-9 * np.sqrt(3.2), rel=1e-12)


def test_the_flag_rule_is_stated_with_its_numbers():
    assert fit_points(PLATE, PLATE).flag_rule == ("flagged when 0.6745·(d − median)/MAD > 3.5 (modified z-score, "
                                                  "Iglewicz & Hoaglin), with at least 5 points")


def test_the_orientation_is_a_rotation_value():
    fit = fit_points(PLATE, PLATE)
    assert isinstance(fit.orientation, Orientation) and fit.orientation.isclose(Orientation.identity(), atol=1e-15)
