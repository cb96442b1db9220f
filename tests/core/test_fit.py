"""Orientation from measurements: best fit of point pairs, the 3-2-1 construction, TRIAD and the
least-squares fit of directions.

Check values: SciPy's Rotation.align_vectors (a general-purpose reference library, solving the same
weighted least-squares problem), the TRIAD construction of H. D. Black (1964), "A passive system for
determining the attitude of a satellite", AIAA J. 2(7), 1350–1351, on a case worked by hand below, and
exact recovery of rotations made with SciPy."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import InvalidInputError, Orientation
from core.direction_fit import fit_directions, triad
from core.fit import FitRefusedError, fit_points, frame_from_three_points

RNG_SEED = 41


def random_case(n, noise, seed, planar=False):
    rng = np.random.default_rng(seed)
    rotation = Rotation.random(rng=rng)
    translation = rng.uniform(-500, 500, size=3)
    nominal = rng.uniform(-100, 100, size=(n, 3))
    if planar:
        nominal[:, 2] = 0.0
    measured = rotation.apply(nominal) + translation + rng.normal(scale=noise, size=(n, 3))
    return rotation, translation, nominal, measured


def scipy_fit(nominal, measured, weights=None):
    """SciPy reference: remove the (weighted) centroids, then align_vectors(measured, nominal)."""
    w = np.ones(len(nominal)) if weights is None else np.asarray(weights, dtype=float)
    p_mean = w @ nominal / w.sum()
    q_mean = w @ measured / w.sum()
    rotation, _ = Rotation.align_vectors(measured - q_mean, nominal - p_mean, weights=w)
    return rotation, q_mean - rotation.apply(p_mean)


def test_noise_free_points_are_recovered_exactly():
    for seed in range(20):
        rotation, translation, nominal, measured = random_case(6, 0.0, seed)
        fit = fit_points(nominal, measured)
        assert fit.orientation.isclose(Orientation.from_quaternion(rotation.as_quat(scalar_first=True)),
                                       atol=1e-12)
        np.testing.assert_allclose(fit.translation, translation, atol=1e-9)
        assert fit.rms < 1e-10 and fit.flagged == ()


@pytest.mark.parametrize("n, noise", [(4, 0.05), (10, 0.02), (200, 0.1), (1000, 1.0)])
def test_noisy_points_agree_with_scipy_align_vectors(n, noise):
    for seed in range(5):
        _, _, nominal, measured = random_case(n, noise, RNG_SEED + seed)
        fit = fit_points(nominal, measured)
        reference, translation = scipy_fit(nominal, measured)
        ours = fit.orientation.as_matrix()
        np.testing.assert_allclose(ours, reference.as_matrix(), atol=1e-12)
        np.testing.assert_allclose(fit.translation, translation, atol=1e-9)
        residuals = measured - reference.apply(nominal) - translation
        assert fit.rms == pytest.approx(np.sqrt(np.mean(np.sum(residuals ** 2, axis=1))), rel=1e-9)
        assert fit.worst_index == int(np.argmax(np.linalg.norm(residuals, axis=1)))


def test_weights_are_honoured():
    _, _, nominal, measured = random_case(30, 0.2, 7)
    weights = np.random.default_rng(9).uniform(0.1, 5.0, size=30)
    fit = fit_points(nominal, measured, weights)
    reference, translation = scipy_fit(nominal, measured, weights)    # SciPy with the same weights
    np.testing.assert_allclose(fit.orientation.as_matrix(), reference.as_matrix(), atol=1e-12)
    np.testing.assert_allclose(fit.translation, translation, atol=1e-9)
    unweighted = fit_points(nominal, measured)
    assert not np.allclose(unweighted.orientation.as_matrix(), fit.orientation.as_matrix(), atol=1e-9)
    # A zero weight is the same as leaving the point out of the fit (its residual is still reported).
    measured[3] += 50.0
    zero = np.ones(30)
    zero[3] = 0.0
    without = fit_points(np.delete(nominal, 3, axis=0), np.delete(measured, 3, axis=0))
    with_zero = fit_points(nominal, measured, zero)
    assert with_zero.orientation.isclose(without.orientation, atol=1e-12)
    assert with_zero.distances[3] > 40.0


def test_one_displaced_point_is_flagged():
    _, _, nominal, measured = random_case(12, 0.01, 13)
    measured[5] += np.array([0.6, -0.5, 0.4])       # about 0.9 mm out, the rest are at the 0.01 mm level
    fit = fit_points(nominal, measured)
    assert fit.flagged == (5,)
    assert fit.worst_index == 5
    assert fit.flag_threshold < fit.distances[5]
    assert "median" in fit.flag_rule


def test_clean_points_have_no_flags():
    _, _, nominal, measured = random_case(40, 0.01, 14)
    assert fit_points(nominal, measured).flagged == ()


def test_coplanar_nominal_points_fit_without_being_called_a_reflection():
    rotation, _, nominal, measured = random_case(8, 0.02, 15, planar=True)
    fit = fit_points(nominal, measured)
    reference, _ = scipy_fit(nominal, measured)
    np.testing.assert_allclose(fit.orientation.as_matrix(), reference.as_matrix(), atol=1e-12)


def test_mirrored_points_are_refused():
    _, _, nominal, measured = random_case(8, 0.01, 16)
    mirrored = measured * np.array([-1.0, 1.0, 1.0])     # one axis flipped: a left-handed measurement
    with pytest.raises(FitRefusedError, match="mirror image") as caught:
        fit_points(nominal, mirrored)
    assert caught.value.reason == "reflection"


def test_collinear_points_are_refused_and_nearly_collinear_noted():
    rng = np.random.default_rng(17)
    t = rng.uniform(-100, 100, size=(6, 1))
    line = t * np.array([[1.0, 2.0, 0.5]])
    with pytest.raises(FitRefusedError, match="lie on one line.*rotation about that line is not determined") \
            as caught:
        fit_points(line, line + 3.0)
    assert caught.value.reason == "collinear"
    nearly = line + rng.normal(scale=1.0, size=line.shape)       # about 1% off the line
    fit = fit_points(nearly, nearly + 3.0)
    assert any("nearly collinear" in note for note in fit.notes)


def test_too_few_and_mismatched_points_are_refused():
    with pytest.raises(FitRefusedError, match="expected at least 3"):
        fit_points([[0, 0, 0], [1, 0, 0]], [[0, 0, 0], [1, 0, 0]])
    with pytest.raises(InvalidInputError, match="differ in number"):
        fit_points(np.eye(3), np.eye(4)[:, :3])
    with pytest.raises(InvalidInputError, match="point 2 has NaN"):
        fit_points([[0, 0, 0], [np.nan, 0, 0], [0, 1, 0]], np.eye(3))
    with pytest.raises(InvalidInputError, match="weight 1 is"):
        fit_points(np.eye(3), np.eye(3), weights=[-1, 1, 1])


def test_three_datum_points_give_the_frame_directly():
    # Hand-worked: a part turned 90° about Z with its origin at (1, 2, 3): body X runs along reference +Y,
    # body Y along reference −X. Its X-axis point 10 along body X is at (1, 12, 3); a point in its XY plane
    # at body (4, 3, 0) is at (1 − 3, 2 + 4, 3) = (−2, 6, 3). Expected R = Rz(90°).
    frame = frame_from_three_points((1, 2, 3), (1, 12, 3), (-2, 6, 3))
    np.testing.assert_allclose(frame.orientation.as_matrix(), [[0, -1, 0], [1, 0, 0], [0, 0, 1]], atol=1e-15)
    np.testing.assert_allclose(frame.origin, [1, 2, 3])
    assert frame.x_distance == pytest.approx(10.0) and frame.off_axis_distance == pytest.approx(3.0)
    # The same three points through the least-squares fit give the same frame (noise-free, so exact).
    fit = fit_points([[0, 0, 0], [10, 0, 0], [4, 3, 0]], [[1, 2, 3], [1, 12, 3], [-2, 6, 3]])
    assert fit.orientation.isclose(frame.orientation, atol=1e-12)
    with pytest.raises(FitRefusedError, match="coincides with the origin"):
        frame_from_three_points((1, 2, 3), (1, 2, 3), (0, 0, 0))
    with pytest.raises(FitRefusedError, match="lies on the X axis"):
        frame_from_three_points((0, 0, 0), (10, 0, 0), (25, 0, 0))


def test_triad_on_a_hand_worked_pair():
    # Hand-worked TRIAD (Black 1964): body b1 = (0,0,1), b2 = (1,0,0); the part is turned 30° about X, so
    # the measurements are r1 = (0, −1/2, √3/2), r2 = (1, 0, 0).
    #   body triad:      s1 = b1, s2 = b1 × b2 = (0,1,0), s3 = s1 × s2 = (−1,0,0)
    #   reference triad: t1 = r1, t2 = r1 × r2 = (0, √3/2, 1/2), t3 = t1 × t2 = (−1, 0, 0)
    #   R = Σ t_k s_kᵀ:  R x = −t3 = (1,0,0), R y = t2, R z = t1, i.e. R = Rx(30°).
    c = np.sqrt(3) / 2
    result = triad((0, 0, 1), (1, 0, 0), (0, -0.5, c), (1, 0, 0))
    np.testing.assert_allclose(result.orientation.as_matrix(), [[1, 0, 0], [0, c, -0.5], [0, 0.5, c]],
                               atol=1e-15)
    assert result.pair_angle_deg == pytest.approx(90.0) and result.mismatch_deg == pytest.approx(0.0, abs=1e-12)
    assert result.method == "TRIAD"


def test_triad_matches_the_first_direction_exactly_like_scipy_primary_secondary():
    # SciPy's align_vectors with an infinite first weight aligns the first pair exactly and the second as
    # well as possible about it: the same answer as TRIAD.
    rng = np.random.default_rng(23)
    for _ in range(50):
        rotation = Rotation.random(rng=rng)
        body = rng.normal(size=(2, 3))
        body /= np.linalg.norm(body, axis=1, keepdims=True)
        measured = rotation.apply(body) + rng.normal(scale=0.01, size=(2, 3))
        result = triad(body[0], body[1], measured[0], measured[1])
        reference, _ = Rotation.align_vectors(measured, body, weights=[np.inf, 1.0])
        np.testing.assert_allclose(result.orientation.as_matrix(), reference.as_matrix(), atol=1e-12)
        assert result.residual_angles_deg[0] == pytest.approx(0.0, abs=1e-9)


def test_least_squares_directions_agree_with_scipy():
    rng = np.random.default_rng(29)
    for count in (2, 3, 7):
        rotation = Rotation.random(rng=rng)
        body = rng.normal(size=(count, 3))
        body /= np.linalg.norm(body, axis=1, keepdims=True)
        measured = rotation.apply(body) + rng.normal(scale=0.005, size=(count, 3))
        measured /= np.linalg.norm(measured, axis=1, keepdims=True)
        weights = rng.uniform(0.5, 3.0, size=count)
        result = fit_directions(body, measured, weights)
        reference, _ = Rotation.align_vectors(measured, body, weights=weights)   # SciPy, unit vectors
        np.testing.assert_allclose(result.orientation.as_matrix(), reference.as_matrix(), atol=1e-12)
        fitted = reference.apply(body)
        angles = np.degrees(np.arccos(np.clip(np.sum(fitted * measured, axis=1), -1, 1)))
        np.testing.assert_allclose(result.residual_angles_deg, angles, atol=1e-6)


def test_noise_free_directions_recover_the_rotation():
    rotation = Rotation.from_euler("ZYX", [40, -25, 70], degrees=True)     # SciPy-made rotation
    body = np.array([[0.0, 0.0, -1.0], [1.0, 0.2, 0.0]])
    measured = rotation.apply(body)
    truth = Orientation.from_quaternion(rotation.as_quat(scalar_first=True))
    assert triad(*body, *measured).orientation.isclose(truth, atol=1e-12)
    assert fit_directions(body, measured).orientation.isclose(truth, atol=1e-12)


def test_nearly_parallel_directions_are_refused():
    b2 = Rotation.from_euler("y", 1.0, degrees=True).apply([0, 0, 1])
    with pytest.raises(FitRefusedError, match="nearly parallel") as caught:
        triad((0, 0, 1), b2, (0, 0, 1), b2)
    assert caught.value.reason == "parallel"
    with pytest.raises(FitRefusedError, match="nearly parallel"):
        fit_directions([(0, 0, 1), -b2, (0, 0, -1)], [(0, 0, 1), -b2, (0, 0, -1)])
    weak = Rotation.from_euler("y", 8.0, degrees=True).apply([0, 0, 1])
    assert "magnified" in triad((0, 0, 1), weak, (0, 0, 1), weak).notes[0]


def test_pair_angle_quality_figure():
    # Hand-worked: directions 60° apart report 60°; for three or more the spread angle arccos(λ1 − λ2) of
    # their scatter is used, which is 90° for the three body axes (λ = 1/3 each) and the folded pair angle
    # (here 180° − 150° = 30°) for two directions given as a list.
    b = np.array([[1.0, 0.0, 0.0], [0.5, np.sqrt(3) / 2, 0.0]])
    assert fit_directions(b, b).pair_angle_deg == pytest.approx(60.0, abs=1e-12)
    assert fit_directions(np.eye(3), np.eye(3)).pair_angle_deg == pytest.approx(90.0, abs=1e-12)
    wide = np.array([[1.0, 0.0, 0.0], [-np.sqrt(3) / 2, 0.5, 0.0]])
    assert triad(*wide, *wide).pair_angle_deg == pytest.approx(150.0, abs=1e-12)
    three = np.vstack([wide, wide[0]])
    # Hand-worked: x, x and u = (cos150°, sin150°, 0). In the xy-plane the scatter is
    # (1/3)[[2 + 3/4, −√3/4], [−√3/4, 1/4]]: trace 1, determinant 1/18, so
    # λ1 − λ2 = √(1 − 4/18) = √7/3 and the figure is arccos(√7/3) = 28.1255°.
    assert fit_directions(three, three).pair_angle_deg == pytest.approx(np.degrees(np.arccos(np.sqrt(7) / 3)),
                                                                       abs=1e-12)


def test_summaries_name_the_figures():
    _, _, nominal, measured = random_case(12, 0.01, 13)
    measured[5] += np.array([0.6, -0.5, 0.4])
    text = fit_points(nominal, measured).summary()
    assert "best fit of 12 points" in text and "worst point 6" in text and "point(s) 6" in text
    c = np.sqrt(3) / 2
    text = triad((0, 0, 1), (1, 0, 0), (0, -0.5, c), (1, 0, 0)).summary()
    assert text.startswith("TRIAD: 30.0000° about [1.00000, 0.00000, 0.00000]")
    assert "90.00° apart" in text
