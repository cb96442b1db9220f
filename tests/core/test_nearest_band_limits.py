"""Every band limit of core/nearest.py probed from both sides, with the message of each band checked, and
the refusal naming the worst row or column.

Check values: the bands of CONVENTIONS.md (exact ≤ 1e-9, notice ≤ 5e-3, warning ≤ 5e-2, else refused);
numpy's SVD for the nearest rotation (U Vᵀ, N. J. Higham 1986, from memory); row and column lengths
and dot products worked by hand beside each case."""

import re

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import MatrixRefusedError, Orientation
from core.nearest import EXACT_LIMIT, NOTICE_LIMIT, WARNING_LIMIT, orthogonality_report


def stretched(error, base=None):
    """A rotation with its first column lengthened so that (MᵀM − I)[0, 0] is `error` (by hand)."""
    m = np.eye(3) if base is None else base.copy()
    m[:, 0] *= np.sqrt(1.0 + error)
    return m


BASE = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True).as_matrix()


@pytest.mark.parametrize("limit, below, above", [(EXACT_LIMIT, "exact", "corrected"),
                                                 (NOTICE_LIMIT, "corrected", "warning"),
                                                 (WARNING_LIMIT, "warning", "refused")])
@pytest.mark.parametrize("base", [None, BASE])
def test_each_limit_from_both_sides(limit, below, above, base):
    under = orthogonality_report(stretched(limit * (1 - 1e-3), base))
    over = orthogonality_report(stretched(limit * (1 + 1e-3), base))
    assert under.error == pytest.approx(limit * (1 - 1e-3), rel=1e-6)
    assert over.error == pytest.approx(limit * (1 + 1e-3), rel=1e-6)
    assert (under.band, over.band) == (below, above)


def test_the_limits_are_those_of_the_conventions():
    assert (EXACT_LIMIT, NOTICE_LIMIT, WARNING_LIMIT) == (1e-9, 5e-3, 5e-2)   # CONVENTIONS.md


def svd_nearest(m):
    u, _, vt = np.linalg.svd(m)
    return u @ vt


def test_message_of_each_band():
    exact = orthogonality_report(BASE)
    assert exact.band == "exact" and exact.accepted and exact.problem is None
    assert exact.message.startswith("a rotation (orthogonality error")

    m = stretched(1e-3, BASE)
    corrected = orthogonality_report(m)
    change = np.abs(svd_nearest(m) - m).max()
    assert corrected.band == "corrected" and corrected.accepted and corrected.problem is None
    assert corrected.max_change == pytest.approx(change, rel=1e-9)
    assert f"error {corrected.error:.1e}" in corrected.message and f"change {change:.1e}" in corrected.message
    assert "WARNING" not in corrected.message
    np.testing.assert_allclose(corrected.nearest, svd_nearest(m), atol=1e-12)

    m = stretched(2e-2, BASE)
    warning = orthogonality_report(m)
    change = np.abs(svd_nearest(m) - m).max()
    assert warning.band == "warning" and warning.accepted and warning.problem is None
    assert warning.message.startswith("WARNING: far from orthonormal")
    assert f"error {warning.error:.2g}" in warning.message and f"change {change:.2g}" in warning.message
    np.testing.assert_allclose(warning.nearest, svd_nearest(m), atol=1e-12)
    assert Orientation.from_matrix(m).notes[0] == warning.message


def test_refusal_names_the_worse_row_before_the_column():
    # By hand: a 30° turn about z with row 2 stretched to 1.3 leaves row 2 of length 1.3 (badness
    # 1.69 − 1 = 0.69) and column 2 = (−sin 30°, 1.3 cos 30°, 0) of length √1.5175 ≈ 1.232 (badness 0.5175).
    m = Rotation.from_euler("z", 30, degrees=True).as_matrix()
    m[1] *= 1.3
    r = orthogonality_report(m)
    assert r.band == "refused" and not r.accepted
    assert r.problem == "row 2 has length 1.3 (expected 1); column 2 has length 1.232 (expected 1)"
    assert r.message.endswith(r.problem) and "limit 0.05" in r.message


def test_refusal_names_columns_that_are_not_perpendicular():
    # By hand: identity with 0.3 in row 1, column 3: columns 1 and 3 have dot product 0.3 (badness 0.3,
    # above column 3's length² − 1 = 0.09); the rows 1 and 3 likewise.
    m = np.eye(3)
    m[0, 2] = 0.3
    r = orthogonality_report(m)
    assert r.band == "refused"
    assert "columns 1 and 3 are not perpendicular (dot product 0.3, expected 0)" in r.problem
    assert "rows 1 and 3 are not perpendicular (dot product 0.3, expected 0)" in r.problem
    with pytest.raises(MatrixRefusedError, match="columns 1 and 3"):
        Orientation.from_matrix(m)


@pytest.mark.parametrize("row, column", [(0, 0), (1, 2), (2, 1)])
def test_refusal_points_at_the_line_that_breaks(row, column):
    # By hand: one element of the identity set to 0.5 (off the diagonal) or 1.5 (on it).
    m = np.eye(3)
    m[row, column] = 1.5 if row == column else 0.5
    problem = orthogonality_report(m).problem
    if row == column:
        assert f"row {row + 1} has length 1.5" in problem and f"column {column + 1} has length 1.5" in problem
    else:
        pair = sorted((row + 1, column + 1))
        assert f"columns {pair[0]} and {pair[1]} are not perpendicular" in problem
        assert re.search(rf"rows {pair[0]} and {pair[1]} are not perpendicular", problem)


def test_largest_element_limit_from_both_sides():
    m = np.eye(3)
    m[1, 2] = 10.0              # at the limit: refused by its orthogonality, naming lines
    r = orthogonality_report(m)
    # by hand: row 2 = (0, 1, 10) and column 3 = (0, 10, 1), each of length √101 ≈ 10.05
    assert r.band == "refused" and r.problem == "row 2 has length 10.05 (expected 1); column 3 has length 10.05 (expected 1)"
    assert r.error == pytest.approx(100.0)
    m[1, 2] = 10.001           # just beyond: refused by the element itself
    r = orthogonality_report(m)
    assert r.band == "refused" and r.problem.startswith("row 2, column 3 is 10")
    assert r.error == float("inf")


def test_determinant_zero_and_negative_are_refused_with_their_own_words():
    singular = np.diag([1.0, 1.0, 0.0])
    r = orthogonality_report(singular)
    assert r.band == "refused" and "singular" in r.message and r.det == 0.0
    reflection = np.diag([1.0, 1.0, -1.0])
    r = orthogonality_report(reflection)
    assert r.band == "refused" and "reflection" in r.message and r.det == -1.0
    # A proper rotation with the tiniest positive determinant difference is still a rotation.
    assert orthogonality_report(np.diag([1.0, -1.0, -1.0])).band == "exact"


def test_nearest_rotation_names_bad_input_as_a_matrix():
    from core.nearest import nearest_rotation
    with pytest.raises(Exception, match=r"matrix: expected shape \(\.\.\., 3, 3\)"):
        nearest_rotation([[1.0, 0.0], [0.0, 1.0]])
    with pytest.raises(Exception, match="matrix: contains NaN"):
        orthogonality_report(np.full((3, 3), np.nan))
    np.testing.assert_allclose(nearest_rotation(stretched(1e-3, BASE)), svd_nearest(stretched(1e-3, BASE)),
                               atol=1e-12)


def test_of_equally_bad_lines_the_first_is_named():
    # By hand: diag(1.2, 1.2, 1): columns 1 and 2 (and rows 1 and 2) are equally long (badness 0.44).
    problem = orthogonality_report(np.diag([1.2, 1.2, 1.0])).problem
    assert problem == "row 1 has length 1.2 (expected 1); column 1 has length 1.2 (expected 1)"
    # By hand: 0.5 in row 1 of columns 2 and 3: columns 1·2 = 1·3 = 0.5 (column 2·3 = 0.25, lengths² 1.25).
    m = np.eye(3)
    m[0, 1] = m[0, 2] = 0.5
    problem = orthogonality_report(m).problem
    assert "columns 1 and 2 are not perpendicular (dot product 0.5, expected 0)" in problem
    assert "columns 1 and 3" not in problem
