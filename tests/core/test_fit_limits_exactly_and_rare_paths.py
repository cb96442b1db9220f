"""Limits of the fits taken exactly at their value and with distances other than 1 (so a limit that is a
fraction of the larger distance is told from one divided by it), the datum points' input words, the
median of an even and an odd count of residuals behind the flag threshold, the spread lost to underflow
named as the nominal points', and the reason of a failed eigenvalue computation.

Check values: worked by hand (the limits 1e-12 and 1e-9 of the larger distance, 1.5 in the cases
below), numpy's median for the flag rule 0.6745 (d − median)/MAD > 3.5, and the module's own words."""

import numpy as np
import pytest

from core import InvalidInputError
from core import fit as fit_module
from core.fit import FitRefusedError, fit_points, frame_from_three_points


def frame_refusal(*points):
    with pytest.raises(FitRefusedError) as caught:
        frame_from_three_points(*points)
    return caught.value


def test_an_x_point_at_exactly_1e_minus_12_of_the_xy_distance_is_refused():
    # |a − o| = 1e-12 and |b − o| = 1: at the limit, which is refused ("at or below").
    assert "coincides with the origin" in str(frame_refusal((0, 0, 0), (1e-12, 0, 0), (0, 1, 0)))


def test_the_x_point_limit_is_a_fraction_of_the_larger_distance_not_divided_by_it():
    # Larger distance 1.5: the limit is 1.5e-12, so 1e-12 along X is refused (worked by hand).
    assert "coincides with the origin" in str(frame_refusal((0, 0, 0), (1e-12, 0, 0), (0, 1.5, 0)))


def test_an_xy_point_at_exactly_1e_minus_9_off_the_axis_is_refused():
    # Off the X axis by 1e-9 with distances of 1: at the limit, refused.
    assert "lies on the X axis" in str(frame_refusal((0, 0, 0), (1, 0, 0), (1, 1e-9, 0)))


def test_the_off_axis_limit_is_a_fraction_of_the_larger_distance_not_divided_by_it():
    # Larger distance 1.5: the limit is 1.5e-9, so 1e-9 off the axis is refused (worked by hand).
    assert "lies on the X axis" in str(frame_refusal((0, 0, 0), (1.5, 0, 0), (1.5, 1e-9, 0)))


def test_datum_points_that_are_not_finite_or_not_three_numbers_are_refused_in_words():
    with pytest.raises(InvalidInputError) as caught:
        frame_from_three_points((0, 0, 0), (1, float("nan"), 0), (0, 1, 0))
    assert str(caught.value) == "three datum points: point 2 has NaN or infinity; expected finite numbers"
    with pytest.raises(InvalidInputError) as caught:
        frame_from_three_points((0, 0, 0), (1, 0), (0, 1, 0))
    assert str(caught.value).startswith("three datum points: expected rows of three numbers, got ")


@pytest.mark.parametrize("count", [5, 6, 8, 9, 10])
def test_the_flag_threshold_follows_the_median_of_even_and_odd_counts(count):
    rng = np.random.default_rng(count)
    nominal = rng.uniform(-100, 100, size=(count, 3))
    measured = nominal + rng.normal(scale=0.05, size=(count, 3))
    fit = fit_points(nominal, measured)
    median = np.median(fit.distances)                          # numpy's median as the check
    mad = np.median(np.abs(fit.distances - median))
    assert fit.flag_threshold == pytest.approx(median + 3.5 * mad / 0.6745, rel=1e-12)


def test_a_nominal_spread_lost_to_underflow_is_refused_naming_the_nominal_points():
    # Offsets of 1e-170 square to 1e-340, below the smallest double: the spread is lost (worked by hand).
    nominal = np.array([[0, 0, 0], [1e-170, 0, 0], [0, 1e-170, 0], [0, 0, 1e-170]])
    with pytest.raises(FitRefusedError) as caught:
        fit_points(nominal, nominal + [1.0, 0.0, 0.0])
    assert caught.value.reason == "range"
    assert str(caught.value).startswith("measured point 1, x = 1 is out of all proportion to the spread of the "
                                        "nominal points, 7.5e-171 (a ratio of 7.5e-171)")


def test_a_failed_eigenvalue_computation_is_refused_as_numerical(monkeypatch):
    def fails(_):
        raise np.linalg.LinAlgError("did not converge")
    monkeypatch.setattr(fit_module.np.linalg, "eigvalsh", fails)
    plate = [[2, 1, 0], [-2, 1, 0], [-2, -1, 0], [0, 0, 1]]
    with pytest.raises(FitRefusedError) as caught:
        fit_points(plate, plate)
    assert caught.value.reason == "numerical"
    assert str(caught.value) == ("the spread of the points could not be computed (did not converge); expected "
                                 "ordinary coordinates")


def test_an_xy_point_exactly_0_05_of_the_x_distance_off_the_axis_gets_no_note():
    # 0.05 off an X distance of 1: at the note's limit, which notes only below it (worked by hand).
    frame = frame_from_three_points((0, 0, 0), (1, 0, 0), (0.5, 0.05, 0))
    assert frame.off_axis_distance == 0.05 and frame.notes == ()


def test_datum_points_farther_apart_than_a_double_holds_are_refused_in_words():
    # 3.4e308 from the origin to the X point: beyond the largest double, about 1.8e308 (common practice).
    refusal = frame_refusal((-1.7e308, 0, 0), (1.7e308, 0, 0), (0, 1.7e308, 0))
    assert refusal.reason == "range"
    assert str(refusal) == ("the distances between the points exceed the largest number a double holds (about "
                            "1.8e308); expected points that lie closer together than that")


def test_a_huge_coordinate_s_message_shows_the_spread_in_the_user_s_numbers():
    # The plate's spread is √3.2 = 1.79 (worked by hand) whatever the working scale inside the fit.
    plate = np.array([[2.0, 1.0, 0.0], [-2.0, 1.0, 0.0], [-2.0, -1.0, 0.0], [2.0, -1.0, 0.0], [0.0, 0.0, 1.0]])
    measured = plate.copy()
    measured[0, 0] = 1e120
    with pytest.raises(FitRefusedError) as caught:
        fit_points(plate, measured)
    assert str(caught.value).startswith("measured point 1, x = 1e+120 is out of all proportion to the spread of "
                                        "the nominal points, 1.79 (a ratio of 1.8e-120)")


def test_measured_points_exactly_on_one_line_are_refused_as_a_line_not_as_one_place():
    plate = np.array([[2.0, 1.0, 0.0], [-2.0, 1.0, 0.0], [-2.0, -1.0, 0.0], [2.0, -1.0, 0.0], [0.0, 0.0, 1.0]])
    measured = np.zeros((5, 3))
    measured[:, 0] = [1.0, 2.0, 3.0, 4.0, 6.0]          # all on the reference X axis (invented)
    with pytest.raises(FitRefusedError) as caught:
        fit_points(plate, measured)
    assert caught.value.reason == "collinear"
    assert str(caught.value).startswith("the measured points lie on one line (their second spread is 0 of the "
                                        "first, limit 1e-06)")


def test_measured_points_a_hundred_orders_too_small_are_refused_showing_their_own_spread():
    # The plate measured at 1e-105 of its size (a unit mistake): the measured spread is √3.2·1e-105 =
    # 1.79e-105 (worked by hand), against a largest coordinate of 2, a ratio of 8.9e-106.
    plate = np.array([[2.0, 1.0, 0.0], [-2.0, 1.0, 0.0], [-2.0, -1.0, 0.0], [2.0, -1.0, 0.0], [0.0, 0.0, 1.0]])
    with pytest.raises(FitRefusedError) as caught:
        fit_points(plate, plate * 1e-105)
    assert caught.value.reason == "range"
    assert str(caught.value).startswith("nominal point 1, x = 2 is out of all proportion to the spread of the "
                                        "measured points, 1.79e-105 (a ratio of 8.9e-106)")
