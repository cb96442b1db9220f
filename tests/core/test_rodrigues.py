"""The Gibbs vector and the modified Rodrigues parameters (core/kernels/rodrigues.py, Orientation.from_gibbs /
as_gibbs / from_mrp / as_mrp): against SciPy's Rotation.as_mrp / from_mrp, against the Gibbs formula
g = n·tan(φ/2) of Shuster, "A Survey of Attitude Representations", J. Astronautical Sciences 41(4), 1993
(section on the Gibbs vector), round trips, batches, and hostile input."""

import warnings

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.kernels import rodrigues
from core.errors import InvalidInputError
from core.orientation import Orientation

ROTATIONS = Rotation.random(2000, random_state=41)


def from_scipy(rotation):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


def test_mrp_batch_matches_scipy_as_mrp():
    # checked against SciPy's Rotation.as_mrp (the set with |p| <= 1)
    q = ROTATIONS.as_quat(scalar_first=True)
    p = rodrigues.quaternions_to_mrps(q)
    np.testing.assert_allclose(p, ROTATIONS.as_mrp(), atol=1e-14, rtol=0)
    assert np.all(np.linalg.norm(p, axis=-1) <= 1 + 1e-15)


def test_mrp_batch_reads_back_as_scipy_from_mrp():
    # checked against SciPy's Rotation.from_mrp, both sets: p and its shadow −p/|p|² (SciPy reads either)
    p = ROTATIONS.as_mrp()
    shadows = rodrigues.mrp_shadows(p)
    assert np.all(np.linalg.norm(shadows, axis=-1) >= 1 - 1e-15)
    for given in (p, shadows):
        q = rodrigues.mrps_to_quaternions(given)
        want = Rotation.from_mrp(given).as_quat(scalar_first=True, canonical=True)
        np.testing.assert_allclose(q, np.where(want[:, :1] < 0, -want, want), atol=1e-14, rtol=0)


@pytest.mark.parametrize("index", range(0, 2000, 97))
def test_orientation_mrp_pair_matches_scipy(index):
    r = ROTATIONS[index]
    o = from_scipy(r)
    np.testing.assert_allclose(o.as_mrp(), r.as_mrp(), atol=1e-14, rtol=0)        # SciPy's as_mrp
    assert Orientation.from_mrp(r.as_mrp()).angle_to(o) < 1e-12
    assert Orientation.from_mrp(o.as_mrp(shadow=True)).angle_to(o) < 1e-12          # the shadow set


@pytest.mark.parametrize("axis, angle_deg", [((1, 0, 0), 30.0), ((0, 0, 1), 90.0), ((1, 2, 3), 170.0),
                                             ((0.2, -0.4, 0.9), 1e-6), ((-1, 1, 0), 179.9)])
def test_gibbs_is_the_axis_times_the_tangent_of_half_the_angle(axis, angle_deg):
    # Shuster (1993), the Gibbs vector: g = n tan(φ/2), computed here from the axis and angle by hand
    n = np.array(axis, dtype=float) / np.linalg.norm(axis)
    g = Orientation.from_axis_angle(axis, angle_deg).as_gibbs()
    np.testing.assert_allclose(g, n * np.tan(np.radians(angle_deg) / 2), rtol=1e-10, atol=1e-15)
    # and p = n tan(φ/4) for the modified set (Shuster 1993, the modified Rodrigues parameters)
    p = Orientation.from_axis_angle(axis, angle_deg).as_mrp()
    np.testing.assert_allclose(p, n * np.tan(np.radians(angle_deg) / 4), rtol=1e-10, atol=1e-15)


def test_gibbs_batch_round_trips_and_agrees_with_scipy_through_the_quaternion():
    q = ROTATIONS.as_quat(scalar_first=True, canonical=True)
    g = rodrigues.quaternions_to_gibbs(q)
    # g = (x, y, z) / w with the quaternion from SciPy's as_quat; the same vector from SciPy's rotation
    # vector through g = n tan(φ/2) (Shuster 1993)
    rv = ROTATIONS.as_rotvec()
    angle = np.linalg.norm(rv, axis=-1)
    np.testing.assert_allclose(g, rv / angle[:, None] * np.tan(angle / 2)[:, None], rtol=1e-9, atol=1e-12)
    back = rodrigues.gibbs_to_quaternions(g)
    np.testing.assert_allclose(back, q, atol=1e-12, rtol=0)


def test_gibbs_is_refused_at_a_half_turn_and_huge_near_it():
    half = Orientation.from_axis_angle((0, 1, 0), 180)
    with pytest.raises(InvalidInputError, match="infinite at a half turn"):
        half.as_gibbs()
    near = Orientation.from_axis_angle((0, 1, 0), 180 - 1e-9)
    assert near.as_gibbs()[1] > 1e10
    # a Gibbs vector of 1e300 is a half turn to within 1e-300 rad: read without overflow
    o = Orientation.from_gibbs([0, 1e300, 0])
    assert o.angle_to(half) < 1e-12 and np.all(np.isfinite(o.quaternion))
    assert Orientation.from_mrp(half.as_mrp()).angle_to(half) < 1e-12
    np.testing.assert_allclose(half.as_mrp(), [0, 1, 0])                 # |p| = tan(45°) = 1 there


@pytest.mark.parametrize("bad", [[np.nan, 0, 0], [0, np.inf, 0], [0, 0, -np.inf], [1, 2], [1, 2, 3, 4], "abc",
                                 [[1, 2, 3]], [10 ** 400, 0, 0]])
def test_hostile_input_is_refused_with_a_message(bad):
    for make in (Orientation.from_gibbs, Orientation.from_mrp):
        with pytest.raises(InvalidInputError):
            make(bad)


@pytest.mark.parametrize("p", [[1e300, -1e300, 1e300], [1e-300, 0, 0], [1e154, 1e154, 0], [0, 0, 0],
                               [1.0, 0, 0], [-5e-324, 0, 0]])
def test_extreme_mrps_read_without_overflow(p):
    o = Orientation.from_mrp(p)
    assert np.all(np.isfinite(o.quaternion))
    want = Rotation.from_mrp(np.clip(p, -1e150, 1e150))     # SciPy's from_mrp, kept out of its overflow
    assert o.angle_to(from_scipy(want)) < 1e-9


def test_the_shadow_of_no_rotation_is_refused():
    with pytest.raises(InvalidInputError, match="shadow"):
        Orientation.identity().as_mrp(shadow=True)
    with pytest.raises(Exception):
        Orientation.identity().as_mrp(shadow=1)            # a flag is True or False, nothing else


def test_kernels_serve_one_orientation_and_a_shaped_batch_alike():
    q = ROTATIONS.as_quat(scalar_first=True)[:12].reshape(3, 4, 4)
    for forward, back in ((rodrigues.quaternions_to_gibbs, rodrigues.gibbs_to_quaternions),
                          (rodrigues.quaternions_to_mrps, rodrigues.mrps_to_quaternions)):
        shaped = forward(q)
        assert shaped.shape == (3, 4, 3)
        np.testing.assert_allclose(shaped[1, 2], forward(q[1, 2]), atol=0)
        assert back(shaped).shape == (3, 4, 4)


@pytest.mark.parametrize("length", [1e200, 1e308, 1.7976931348623157e308])
@pytest.mark.parametrize("direction", [(1, 0, 0), (1, 1, 1), (-3, 2, 7)])
def test_an_mrp_of_huge_length_is_read_as_the_identity_with_no_overflow_warning(length, direction):
    """The shadow of p is −p/|p|² (Schaub & Junkins, "Analytical Mechanics of Space Systems", the MRP shadow
    set): of length 1/|p|, below 1e-200 here, so the turn is the identity to far below rounding. No step may
    overflow on the way (warnings are errors here), the kernel and the Orientation alike."""
    p = np.asarray(direction, dtype=float) / np.abs(direction).max() * length
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        q = rodrigues.mrps_to_quaternions(p)
        shadows = rodrigues.mrp_shadows(p)
        o = Orientation.from_mrp(p)
    # q = (1 − |s|², 2s)/(1 + |s|²) of the shadow s: w = 1 and a vector part at most 2/|p| (same reference)
    assert q[0] == 1.0 and np.abs(q[1:]).max() <= 2 / length * (1 + 1e-12)
    assert o.angle_to(Orientation.identity()) == 0.0
    assert np.all(np.isfinite(shadows)) and np.abs(shadows).max() <= 1 / length
    # the shadow of a shadow is the set itself (same reference), where the shadow does not underflow
    if length == 1e200:
        assert np.allclose(rodrigues.mrp_shadows(shadows), p, rtol=1e-14, atol=0)


@pytest.mark.parametrize("bad", [[np.inf, 0, 0], [1e308, -np.inf, 1e308], [np.nan, 1e308, 0]])
def test_an_infinite_mrp_is_refused_without_a_warning(bad):
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        with pytest.raises(InvalidInputError, match="NaN or infinity"):
            Orientation.from_mrp(bad)


def test_a_long_mrp_is_read_as_scipy_reads_it_and_the_length_one_boundary_holds():
    # SciPy's from_mrp, for a length it squares without overflow; at |p| = 1 (a half turn) either set
    for p in ([3e10, -1e10, 2e10], [0.0, 1.0, 0.0], [0.0, 1.0 + 2e-16, 0.0], [0.6, 0.8, 0.0]):
        with warnings.catch_warnings():
            warnings.simplefilter("error")
            o = Orientation.from_mrp(p)
        assert o.angle_to(from_scipy(Rotation.from_mrp(p))) < 1e-9
