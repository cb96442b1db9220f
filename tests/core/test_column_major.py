"""Matrices the text says are column-major (issue 11 item 1: row-major unless the text says otherwise).

Before, a keyed 4x4 or 3x3 (`T: [...]  # column-major`, a `rows/cols/data` block under a column-major
comment) was read row-major anyway: the transpose, 180° off for a quarter turn, with exit 0. The expected
matrices are assembled by numpy's `reshape(..., order="F")` (Fortran order, numpy's documented name for
column-major) and compared through SciPy's `Rotation`. All values invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

QUARTER = [0, 1, 0, 0, -1, 0, 0, 0, 0, 0, 1, 0, 0.5, 0.2, 0.1, 1]      # +90° about z, columns one after another
QUARTER_NO_T = QUARTER[:12] + [0, 0, 0, 1]
R9 = [0, 1, 0, -1, 0, 0, 0, 0, 1]


def _listed(values) -> str:
    return "[" + ", ".join(f"{v:g}" for v in values) + "]"


def _expected(values) -> tuple[Rotation, np.ndarray | None]:
    n = 4 if len(values) == 16 else 3
    m = np.array(values, dtype=float).reshape(n, n, order="F")                # numpy: order="F" is column-major
    return Rotation.from_matrix(m[:3, :3]), (m[:3, 3] if n == 4 else None)


def _off(expected: Rotation, reading) -> float:
    found = Rotation.from_quat(np.asarray(reading.orientation.as_quaternion()), scalar_first=True)
    return float(np.degrees((expected.inv() * found).magnitude()))


CASES = [
    ("keyed-trailing-comment", f"T_base_cam: {_listed(QUARTER)}  # column-major", QUARTER),
    ("keyed-order-key", f"order: column-major\nT: {_listed(QUARTER)}", QUARTER),
    ("shaped-under-comment", f"T:  # column-major\n  rows: 4\n  cols: 4\n  data: {_listed(QUARTER_NO_T)}",
     QUARTER_NO_T),
    ("keyed-r-beside-t", f"R: {_listed(R9)}  # column-major\nT: [1, 2, 3]", R9),
    ("bare-one-line-16", f"model matrix (column-major): {' '.join(f'{v:g}' for v in QUARTER_NO_T)}", QUARTER_NO_T),
    ("bare-one-line-9", f"R (column-major): {' '.join(f'{v:g}' for v in R9)}", R9),
    ("bare-lines-are-columns", "T (column-major):\n0 1 0 0\n-1 0 0 0\n0 0 1 0\n0.5 0.2 0.1 1", QUARTER),
]


@pytest.mark.parametrize("text, values", [c[1:] for c in CASES], ids=[c[0] for c in CASES])
def test_column_major_text_is_read_column_after_column(text, values):
    top = decode(text)[0]
    expected, translation = _expected(values)
    # Source: numpy reshape(order="F") of the numbers, then SciPy Rotation.from_matrix
    assert _off(expected, top) < 1e-9, f"best reading {top.label!r} is {_off(expected, top):.3f} deg off"
    if translation is not None and top.translation is not None:
        assert np.allclose(top.translation, translation, rtol=0, atol=0)
    assert any("column" in n for n in top.notes) or "column-major" in top.why


def test_rows_laid_out_under_a_column_major_word_are_read_as_rows_when_the_last_line_is_0001():
    # 'column-major' here says how a program stores it; the printed lines are rows (the last is 0 0 0 1)
    top = decode("T (column-major storage):\n0 -1 0 0.5\n1 0 0 0.2\n0 0 1 0.1\n0 0 0 1")[0]
    expected = Rotation.from_matrix([[0, -1, 0], [1, 0, 0], [0, 0, 1]])          # SciPy, the rows as printed
    assert _off(expected, top) < 1e-9
    assert top.translation == (0.5, 0.2, 0.1)


@pytest.mark.parametrize("text", [
    "T (column-major):\n0 1 0 0\n-1 0 0 0\n0 0 1 0\n0 0 0 1",                       # rows or columns? no t to tell
    "column-major\nT: [[0, 1, 0, 0], [-1, 0, 0, 0], [0, 0, 1, 0], [0, 0, 0, 1]]",
    "column-major\nR: [[0, 1, 0], [-1, 0, 0], [0, 0, 1]]\nT: [1, 2, 3]",
    "Tr (column-major): 1 0 0 0.1 0 1 0 0.2 0 0 1 0.3",                            # 3 columns of 4 or 4 of 3?
])
def test_a_layout_that_cannot_tell_rows_from_columns_is_refused(text):
    with pytest.raises(DecodeError, match="column-major"):
        decode(text)
