"""Keyed pose blocks: a shape written as rows/cols must be one whole number each, from 1 to 16. Two numbers
under 'rows' (or 'cols') or none at all are refused with the message that names the rule, never read by
their first number.

Check values: the 1..16 rule and its message are ours; the quarter turn about z comes from SciPy's
Rotation.from_rotvec([0, 0, pi/2]) (rows 0 -1 0 / 1 0 0 / 0 0 1)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

ROWS_3X3 = "[0, -1, 0, 1, 0, 0, 0, 0, 1]"
RULE = "rows and cols must be whole numbers from 1 to 16"


@pytest.mark.parametrize("rows, cols", [("[3, 3]", "3"), ("3", "[3, 3]"), ("[]", "3"), ("3", "[]"),
                                        ("[3, 1]", "3")])
def test_a_shape_with_other_than_one_number_is_refused(rows, cols):
    text = f'{{"R": {{"rows": {rows}, "cols": {cols}, "data": {ROWS_3X3}}}}}'
    with pytest.raises(DecodeError, match=RULE):
        decode(text)


def test_two_numbers_under_rows_in_keyed_text_are_refused_with_the_line():
    text = f"R:\n  rows: 3 3\n  cols: 3\n  data: {ROWS_3X3}\n"
    with pytest.raises(DecodeError) as err:
        decode(text)
    assert str(err.value) == f"line 2: {RULE}"


def test_one_whole_number_each_is_read():
    # the other side of the rule
    first = decode(f'{{"R": {{"rows": 3, "cols": 3, "data": {ROWS_3X3}}}}}')[0]
    want = Rotation.from_rotvec([0.0, 0.0, np.pi / 2]).as_matrix()     # SciPy
    got = np.asarray(first.orientation.as_matrix())
    assert np.allclose(got, want, atol=1e-12) or np.allclose(got, want.T, atol=1e-12)
    assert first.name == "R"
