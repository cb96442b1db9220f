"""The Rodrigues kernels row by row in mixed batches, the choice of shadow at |p| = 1 from both sides, and
the unit length of the quaternions they make (core/kernels/rodrigues.py).

Check values: SciPy's Rotation.from_mrp (each row read alone); the shadow set p_s = −p / |p|² of Schaub &
Junkins, "Analytical Mechanics of Space Systems" (the MRP shadow set); the Gibbs vector's quaternion
(1, g) / sqrt(1 + |g|²) of Shuster, "A Survey of Attitude Representations" (1993), worked by hand for the
rows below; and the spacing of doubles at 1 (2.22e-16, IEEE 754 double precision: common practice), the
most a vector normalised in double precision is off unit length."""

import warnings

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.kernels import rodrigues

ULP_AT_ONE = np.spacing(1.0)            # 2.22e-16


def same_rotation(q, want_xyzw):
    """q (w first, canonical) against SciPy's quaternion (x, y, z, w), either sign."""
    want = np.roll(np.asarray(want_xyzw, dtype=float), 1)
    return min(np.abs(q - want).max(), np.abs(q + want).max()) < 1e-14


# a zero row, rows far below and far above 1, either side of |p| = 1 and on it, in one batch
MIXED = np.array([
    [0.0, 0.0, 0.0],
    [1e-200, 0.0, 0.0],
    [0.1, -0.2, 0.3],
    [1.0, 0.0, 0.0],
    [0.0, 0.6, 0.8],
    [1.5, 0.0, 0.0],
    [0.9, 0.9, 0.0],
    [-2.0, 1.0, 0.5],
    [1e300, 0.0, 0.0],
])


def test_each_row_of_a_mixed_batch_reads_as_scipy_reads_it_alone():
    with warnings.catch_warnings():
        warnings.simplefilter("error")            # no overflow or 0/0 on the way
        q = rodrigues.mrps_to_quaternions(MIXED)
    assert q.shape == (len(MIXED), 4) and np.all(np.isfinite(q))
    for row, p in zip(q, MIXED):
        # SciPy's from_mrp, read one row at a time (1e300 is kept below SciPy's own overflow)
        assert same_rotation(row, Rotation.from_mrp(np.clip(p, -1e150, 1e150)).as_quat()), p
    assert np.all(q[:, 0] >= 0)                 # canonical: w not negative


def test_a_batch_reads_the_same_as_its_rows_one_by_one():
    one_by_one = np.array([rodrigues.mrps_to_quaternions(p) for p in MIXED])
    np.testing.assert_array_equal(rodrigues.mrps_to_quaternions(MIXED), one_by_one)


def test_a_batch_of_a_huge_gibbs_vector_beside_small_ones_reads_each_row_alone():
    g = np.array([[0.5, 0.0, 0.0], [0.0, 0.0, 0.0], [1e300, 0.0, 0.0], [0.0, 1.0, -1.0]])
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        q = rodrigues.gibbs_to_quaternions(g)
    # (1, g) / sqrt(1 + |g|²), Shuster (1993), worked by hand: 1 + 0.25 = 1.25; 1 + 0 = 1; 1 + 2 = 3;
    # 1e300 is a half turn about x to within 1e-300 rad
    want = np.array([[1, 0.5, 0, 0] / np.sqrt(1.25), [1, 0, 0, 0], [0, 1, 0, 0], [1, 0, 1, -1] / np.sqrt(3)])
    np.testing.assert_allclose(q, want, atol=1e-15, rtol=0)
    np.testing.assert_array_equal(q, np.array([rodrigues.gibbs_to_quaternions(row) for row in g]))


@pytest.mark.parametrize("p", [[1.0, 0.0, 0.0], [0.0, -1.0, 0.0], [0.0, 0.6, 0.8], [-0.8, 0.0, 0.6]])
def test_a_set_of_length_one_is_kept_as_it_is(p):
    # |p| = 1 is a half turn, where the set and its shadow −p are the same length: the set is kept
    assert np.dot(p, p) == 1.0                  # exactly, in doubles
    np.testing.assert_array_equal(rodrigues.mrp_shadows_if_long(np.array(p)), p)


@pytest.mark.parametrize("p", [[1.0, 0.0, 0.0], [0.0, 0.6, 0.8], [0.5, 0.5, 0.5], [0.0, 0.0, -0.25]])
def test_a_set_just_beyond_length_one_is_replaced_by_its_shadow(p):
    longer = np.array(p) * 1.0000001 / np.linalg.norm(p)
    got = rodrigues.mrp_shadows_if_long(longer)
    # the shadow −p/|p|² (Schaub & Junkins), just inside length one
    np.testing.assert_allclose(got, -longer / np.dot(longer, longer), rtol=1e-15, atol=0)
    assert np.linalg.norm(got) < 1.0


@pytest.mark.parametrize("p", [[1.5, 0.0, 0.0], [2.0, 0.0, 0.0], [0.0, -1.25, 0.0], [0.9, 0.9, 0.0],
                               [0.7, -0.7, 0.7], [-2.0, 1.0, 0.5], [3.0, 4.0, 0.0]])
def test_every_long_set_is_replaced_by_its_shadow(p):
    # a component above 1 (but at most 2) and sets whose components are all at most 1 but whose length is
    # not: each is long, so each is replaced by −p/|p|² (Schaub & Junkins)
    p = np.array(p)
    got = rodrigues.mrp_shadows_if_long(p)
    np.testing.assert_allclose(got, -p / np.dot(p, p), rtol=1e-15, atol=0)
    # and both read as the same rotation (SciPy's from_mrp reads either set)
    assert same_rotation(rodrigues.mrps_to_quaternions(p), Rotation.from_mrp(p).as_quat())


def test_short_and_long_sets_in_one_batch_are_each_treated_on_their_own():
    got = rodrigues.mrp_shadows_if_long(MIXED[:-1])
    lengths = np.einsum("ij,ij->i", MIXED[:-1], MIXED[:-1])
    for row, p, length in zip(got, MIXED[:-1], lengths):
        if length > 1:
            np.testing.assert_allclose(row, -p / length, rtol=1e-15, atol=0)
        else:
            np.testing.assert_array_equal(row, p)


def test_integer_input_gives_float_sets_short_or_long():
    for p in ([0, 0, 0], [0, 1, 0], [[0, 0, 1], [2, 0, 0]]):
        got = rodrigues.mrp_shadows_if_long(np.array(p))
        assert got.dtype == np.float64, p


def _typed_sets():
    """Invented sets as a person might type them: 30,000 with each component anywhere in [-1, 1] (seeded)."""
    return np.random.default_rng(1).uniform(-1.0, 1.0, (30000, 3))


@pytest.mark.parametrize("source", ["scipy", "scipy shadows", "typed"])
def test_quaternions_from_mrps_are_unit_to_one_spacing_of_doubles(source):
    # a normalised double vector is off unit length by about one spacing at 1 (common practice); the last
    # step of the kernel is that normalisation. Sets from SciPy's as_mrp, their shadows, and typed sets.
    p = _typed_sets() if source == "typed" else Rotation.random(3000, random_state=7).as_mrp()
    if source == "scipy shadows":
        p = rodrigues.mrp_shadows(p)
    q = rodrigues.mrps_to_quaternions(p)
    assert np.abs(np.linalg.norm(q, axis=-1) - 1.0).max() <= ULP_AT_ONE
