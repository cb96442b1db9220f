"""A kind hint beside an R/T pair: a hint that agrees with the pair (in any case) reads the same transform,
one that disagrees is refused with words naming both. Values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

# a quarter turn about z: SciPy's Rotation.from_rotvec([0, 0, pi/2]) gives rows (0 -1 0), (1 0 0), (0 0 1)
QUARTER_Z = Rotation.from_rotvec([0.0, 0.0, np.pi / 2]).as_matrix()
PAIR = "R_00: [0, -1, 0, 1, 0, 0, 0, 0, 1]\nT_00: [1, 2, 3]\n"


@pytest.mark.parametrize("kind", ["matrix", "Matrix", "MATRIX"])
def test_a_kind_hint_that_agrees_with_an_r_t_pair_reads_the_same_transform(kind):
    first = decode(PAIR, {"kind": kind})[0]
    assert first.kind == "matrix"
    assert first.label.startswith("rotation R with translation T: matrix as written")
    assert first.translation == (1.0, 2.0, 3.0) and first.name == "00"
    assert np.allclose(np.asarray(first.orientation.as_matrix()), QUARTER_Z, atol=1e-12)


def test_a_kind_hint_that_disagrees_with_an_r_t_pair_is_refused_naming_both():
    with pytest.raises(DecodeError) as refused:
        decode(PAIR, {"kind": "quaternion"})
    words = str(refused.value)
    assert "rotation R with translation T" in words
    assert "kind is 'matrix'" in words and "kind hint says 'quaternion'" in words
