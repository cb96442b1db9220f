"""Weights and measurement lists handed to the fits and the average may hold entries that are not real
numbers: text, None, a complex number, an integer too large for a double. Each is refused with an
InvalidInputError that names what was wrong, never a bare ValueError, TypeError or OverflowError from the
conversion, so a caller (the window, a script) reports it and keeps the last good value.

Check values: the refusal words are the project's own; the largest double is about 1.8e308 (IEEE 754,
common practice), so an integer of 400 digits cannot become one."""

import pytest

from core import InvalidInputError, Orientation
from core.average import average, mean_orientation
from core.direction_fit import fit_directions
from core.fit import fit_points

POINTS = [[0, 0, 0], [100, 0, 0], [0, 100, 0], [0, 0, 100]]
DIRECTIONS = [[1, 0, 0], [0, 1, 0], [0, 0, 1]]
QUATERNIONS = [[1, 0, 0, 0], [1, 0, 0, 0], [1, 0, 0, 0]]

NOT_NUMBERS = [("a", 1, 1), (1j, 1, 1), (object(), 1, 1)]
BEYOND_A_DOUBLE = [(10**400, 1, 1), (1, -(10**400), 1)]


@pytest.mark.parametrize("weights", NOT_NUMBERS)
def test_weights_that_are_not_numbers_are_refused_by_name(weights):
    four = list(weights) + [1]
    for call, what in ((lambda: fit_points(POINTS, POINTS, weights=four), "weights"),
                       (lambda: fit_directions(DIRECTIONS, DIRECTIONS, weights=list(weights)), "weights"),
                       (lambda: average(QUATERNIONS, weights=list(weights)), "average: weights"),
                       (lambda: mean_orientation(QUATERNIONS, weights=list(weights)), "average: weights")):
        with pytest.raises(InvalidInputError, match=rf"^{what}: expected numbers, got \["):
            call()


@pytest.mark.parametrize("weights", BEYOND_A_DOUBLE)
def test_weights_beyond_a_double_are_refused_by_name(weights):
    four = list(weights) + [1]
    for call, what in ((lambda: fit_points(POINTS, POINTS, weights=four), "weights"),
                       (lambda: fit_directions(DIRECTIONS, DIRECTIONS, weights=list(weights)), "weights"),
                       (lambda: average(QUATERNIONS, weights=list(weights)), "average: weights")):
        with pytest.raises(InvalidInputError, match=rf"^{what}: a number is beyond the range of a double"):
            call()


@pytest.mark.parametrize("entry", ["a", None, 1j, 10**400])
def test_a_measured_quaternion_entry_that_is_not_a_number_is_refused_by_name(entry):
    measurements = [[entry, 0, 0, 0], Orientation.identity()]
    with pytest.raises(InvalidInputError, match=r"^average: "):
        average(measurements)
    with pytest.raises(InvalidInputError, match=r"^average: "):
        mean_orientation(measurements)


def test_ragged_measurements_are_refused_by_name():
    with pytest.raises(InvalidInputError, match=r"^average: expected numbers, got "):
        average([[1, 0, 0, 0], [1, 0, 0]])



def test_a_weight_of_none_is_refused_as_not_finite():
    # numpy reads None as NaN, which each checker then refuses as not a finite number.
    for call, what in ((lambda: fit_points(POINTS, POINTS, weights=[None, 1, 1, 1]), "weights"),
                       (lambda: fit_directions(DIRECTIONS, DIRECTIONS, weights=[None, 1, 1]), "weights"),
                       (lambda: average(QUATERNIONS, weights=[None, 1, 1]), "average")):
        with pytest.raises(InvalidInputError, match=rf"^{what}: "):
            call()
