"""A pasted matrix whose rows do not span three directions (determinant exactly 0) is refused with words
that say so, whichever way it comes in; a reflection (determinant −1) gets its own words.

Check values: the determinants worked by hand (a zero row, or two equal rows, give 0; diag(1, 1, −1)
gives −1), as is the rule that a rotation has determinant +1 (common practice)."""

import numpy as np
import pytest

from core import MatrixRefusedError, Orientation
from core.nearest import checked_orthogonality_report, orthogonality_report

SINGULAR = [np.diag([1.0, 1.0, 0.0]),                                   # a zero row
            np.array([[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [1.0, 0.0, 0.0]]),  # two equal rows
            np.zeros((3, 3))]


@pytest.mark.parametrize("m", SINGULAR)
@pytest.mark.parametrize("report", [orthogonality_report, checked_orthogonality_report])
def test_a_singular_matrix_is_refused_as_singular(m, report):
    r = report(m)
    assert r.band == "refused" and r.det == 0.0
    assert "refused: determinant 0 means the matrix is singular (the rows do not span three directions); " \
           "it is never corrected" in r.message


@pytest.mark.parametrize("m", SINGULAR)
def test_a_singular_matrix_typed_in_names_the_problem(m):
    with pytest.raises(MatrixRefusedError) as caught:
        Orientation.from_matrix(m)
    assert "singular (the rows do not span three directions)" in str(caught.value)


def test_a_reflection_gets_its_own_words():
    r = checked_orthogonality_report(np.diag([1.0, 1.0, -1.0]))
    assert r.band == "refused" and r.det == pytest.approx(-1.0, abs=1e-15)
    assert "a reflection (left-handed" in r.message and "singular" not in r.message
