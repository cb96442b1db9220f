"""Quaternions written as a sum w + xi + yj + zk, the Hamilton notation (common practice): the term
without i, j or k is the scalar, and a term left out is zero. Checked against SciPy's from_quat with
scalar_first=True (SciPy documentation)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


@pytest.mark.parametrize("text, wxyz", [
    ("0.7071068 + 0i + 0.7071068j + 0k", (0.7071068, 0, 0.7071068, 0)),
    ("0.7071068 + 0.7071068k", (0.7071068, 0, 0, 0.7071068)),
    ("q = 0.5 - 0.5i + 0.5j - 0.5k", (0.5, -0.5, 0.5, -0.5)),
    ("0.9238795 + 0.3826834*i", (0.9238795, 0.3826834, 0, 0)),
    ("0.3826834j + 0.9238795", (0.9238795, 0, 0.3826834, 0)),
])
def test_a_sum_is_read_with_its_missing_terms_as_zero(text, wxyz):
    reading = decode(text)[0]
    want = Rotation.from_quat(np.array(wxyz, dtype=float), scalar_first=True)
    got = Rotation.from_quat(reading.orientation.as_quaternion(), scalar_first=True)
    assert (want.inv() * got).magnitude() < 1e-12
    left_out = sum(c in text for c in "ijk") < 3
    assert any("terms not written are zero" in n for n in reading.notes) == left_out


@pytest.mark.parametrize("text, named", [
    ("0.5 + 0.5i + 0.5i + 0.5k", "i twice"),
    ("0.7071 2**3 + 0i + 0j + 0.7071k", "more than a quaternion"),
])
def test_a_sum_that_cannot_be_one_quaternion_is_refused(text, named):
    with pytest.raises(DecodeError, match=named):
        decode(text)
