"""Is a pasted 3x3 matrix a rotation? Orthogonality report, nearest rotation and the bands of
CONVENTIONS.md: exact, corrected with a notice, accepted with a strong warning, or refused."""

from dataclasses import dataclass

import numpy as np

from core import kernels

EXACT_LIMIT = 1e-9
NOTICE_LIMIT = 5e-3
WARNING_LIMIT = 5e-2
_LARGEST_ELEMENT = 10.0


@dataclass(frozen=True)
class OrthogonalityReport:
    """error: max |MᵀM − I| of the numbers as given; det: their determinant; nearest: the orthogonal
    polar factor (the least-squares closest rotation); max_change: the largest change of any element
    that taking `nearest` makes; band: 'exact', 'corrected', 'warning' or 'refused'; message: one
    sentence for a person; problem: for a refused matrix, which row or column is wrong."""

    error: float
    det: float
    nearest: np.ndarray
    max_change: float
    band: str
    message: str
    problem: str | None = None

    @property
    def accepted(self):
        return self.band != "refused"


def nearest_rotation(matrix):
    """The orthogonal polar factor of one 3x3 matrix."""
    m = kernels.check_array(matrix, (3, 3), "matrix")
    return kernels.nearest_rotations(m)[0]


def _worst_line(vectors, kind):
    """Which row or column breaks unit length or perpendicularity most, as (badness, words)."""
    worst = (0.0, "")
    for i in range(3):
        length = float(np.linalg.norm(vectors[i]))
        badness = abs(length * length - 1.0)
        if badness > worst[0]:
            worst = (badness, f"{kind} {i + 1} has length {length:.4g} (expected 1)")
        for j in range(i + 1, 3):
            dot = float(vectors[i] @ vectors[j])
            if abs(dot) > worst[0]:
                worst = (abs(dot), f"{kind}s {i + 1} and {j + 1} are not perpendicular "
                                   f"(dot product {dot:.4g}, expected 0)")
    return worst


def _locate_problem(m):
    column = _worst_line(m.T, "column")
    row = _worst_line(m, "row")
    parts = [text for badness, text in sorted([column, row], reverse=True) if badness > NOTICE_LIMIT]
    return "; ".join(parts) if parts else None


def orthogonality_report(matrix):
    return checked_orthogonality_report(kernels.check_array(matrix, (3, 3), "matrix"))


def checked_orthogonality_report(m):
    """orthogonality_report of a matrix check_array has already accepted (Orientation.from_matrix, on
    the path of every edit, checks it once)."""
    entries = m.ravel().tolist()
    if max(map(abs, entries)) > _LARGEST_ELEMENT:
        r, c = np.unravel_index(np.argmax(np.abs(m)), m.shape)
        # A rotation's elements lie in [−1, 1]; far outside, the products would overflow, and the
        # element itself is the clearest thing to point at.
        problem = f"row {r + 1}, column {c + 1} is {m[r, c]:.4g}; a rotation's elements lie between −1 and 1"
        return OrthogonalityReport(float("inf"), float("nan"), np.eye(3), float("inf"), "refused",
                                   f"refused: not a rotation: {problem}", problem)
    nearest, error, det = kernels.nearest_rotations(m)
    error, det = float(error), float(det)
    max_change = max(abs(a - b) for a, b in zip(nearest.ravel().tolist(), entries))
    if det <= 0:
        handed = "a reflection (left-handed: a sign or an axis convention is wrong)" if det < 0 \
            else "singular (the rows do not span three directions)"
        return OrthogonalityReport(
            error, det, nearest, max_change, "refused",
            f"refused: determinant {det:.4g} means the matrix is {handed}; it is never corrected",
            "determinant is not positive",
        )
    if error <= EXACT_LIMIT:
        return OrthogonalityReport(error, det, nearest, max_change, "exact",
                                   f"a rotation (orthogonality error {error:.1e})")
    if error <= NOTICE_LIMIT:
        return OrthogonalityReport(
            error, det, nearest, max_change, "corrected",
            f"not exactly orthonormal (error {error:.1e}): using the nearest rotation, "
            f"largest element change {max_change:.1e}")
    if error <= WARNING_LIMIT:
        return OrthogonalityReport(
            error, det, nearest, max_change, "warning",
            f"WARNING: far from orthonormal (error {error:.2g}): likely low precision or a typo; "
            f"using the nearest rotation, largest element change {max_change:.2g}")
    problem = _locate_problem(m)
    return OrthogonalityReport(
        error, det, nearest, max_change, "refused",
        f"refused: not a rotation (orthogonality error {error:.2g}, limit {WARNING_LIMIT:g}): {problem}",
        problem,
    )
