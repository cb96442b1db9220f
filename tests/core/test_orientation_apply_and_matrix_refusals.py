"""Refusals of Orientation.apply and Orientation.from_matrix, word for word: the name of the input that is
wrong, and for a vector too long to rotate, the limit of a double (about 1.8e308, IEEE 754 binary64,
common practice)."""

import numpy as np
import pytest

from core.errors import InvalidInputError
from core.orientation import Orientation


@pytest.mark.parametrize("vectors, words", [
    ([1.0, 2.0], "vectors: expected shape (..., 3), got (2,)"),
    ([1.0, np.nan, 0.0], "vectors: contains NaN or infinity; expected finite numbers"),
    ([[1.0, "a", 0.0]], "vectors: expected numbers, got "),
])
def test_apply_names_the_vectors_it_refuses(vectors, words):
    with pytest.raises(InvalidInputError) as refused:
        Orientation.identity().apply(vectors)
    assert str(refused.value).startswith(words)


def test_a_vector_longer_than_a_double_holds_is_refused_after_a_turn_that_would_overflow():
    # Worked by hand: 45° about Z takes (a, a, 0) to (0, a·√2, 0); for a = 1.5e308 that is 2.1e308, beyond
    # the largest double (1.797e308, common practice). Just below, a = 1.2e308 gives 1.70e308, still finite.
    turn = Orientation.from_axis_angle([0, 0, 1], 45)
    with pytest.raises(InvalidInputError) as refused:
        turn.apply([1.5e308, 1.5e308, 0.0])
    assert str(refused.value) == ("vectors: a vector is too long to rotate (its length exceeds the largest "
                                  "number a double holds); expected components below about 1e308")
    rotated = turn.apply([1.2e308, 1.2e308, 0.0])
    np.testing.assert_allclose(rotated, [0.0, 1.2e308 * np.sqrt(2.0), 0.0], rtol=1e-12, atol=1e293)


@pytest.mark.parametrize("matrix, words", [
    ([[1, 0, 0], [0, 1, 0]], "matrix: expected shape (..., 3, 3), got (2, 3)"),
    ([[1, 0, 0], [0, 1, 0], [0, 0, np.inf]], "matrix: contains NaN or infinity; expected finite numbers"),
    ([[1, 0, 0], [0, 1, 0], [0, 0, "one"]], "matrix: expected numbers, got "),
])
def test_from_matrix_names_the_matrix_it_refuses(matrix, words):
    with pytest.raises(InvalidInputError) as refused:
        Orientation.from_matrix(matrix)
    assert str(refused.value).startswith(words)
