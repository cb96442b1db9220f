"""The fits at the edge of the numbers: huge, tiny, non-finite and degenerate input is either fitted
right at unit scale or refused with a FitRefusedError / InvalidInputError that says why; never a hang,
a LinAlgError, a RuntimeWarning or a NaN in the result.

Check values: SciPy's Rotation (a general-purpose reference library) makes the rotations, and the fit of
scaled points is compared with the fit of the same points at ordinary scale (a rotation does not change
when every coordinate is multiplied by the same power of two, common practice of floating-point
arithmetic: such a product is exact)."""

import subprocess
import sys
import warnings
from pathlib import Path

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import FramewrightError, InvalidInputError, Orientation
from core.direction_fit import fit_directions, triad
from core.fit import FitRefusedError, fit_points, frame_from_three_points

ROOT = Path(__file__).resolve().parents[2]


def case(n=8, seed=3):
    rng = np.random.default_rng(seed)
    rotation = Rotation.random(rng=rng)
    nominal = rng.uniform(-100, 100, (n, 3))
    measured = rotation.apply(nominal) + rng.uniform(-500, 500, 3) + rng.normal(0, 0.01, (n, 3))
    return rotation, nominal, measured


@pytest.fixture(autouse=True)
def warnings_are_errors():
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        yield


def assert_finite(fit):
    for value in (fit.translation, fit.residuals, fit.distances, fit.rms):
        assert np.all(np.isfinite(value))
    assert fit.flag_threshold is None or np.isfinite(fit.flag_threshold)


def test_a_coordinate_of_the_largest_double_is_refused_in_a_separate_process_within_a_minute():
    # Hang guard (a generous timeout, not a time assertion): this input used to keep the SVD running.
    code = ("import numpy as np\n"
            "from core.fit import fit_points\n"
            "p = np.array([[0,0,0],[100,0,0],[0,50,0],[0,0,30],[10,20,5.]])\n"
            "q = p.copy(); q[1, 0] = 1.797e308\n"
            "try:\n    fit_points(p, q)\nexcept Exception as e:\n    print(type(e).__name__, e)\n")
    result = subprocess.run([sys.executable, "-W", "error", "-c", code], capture_output=True, text=True,
                            cwd=ROOT, timeout=60)
    assert result.returncode == 0 and result.stderr == ""
    assert result.stdout.startswith("FitRefusedError ")
    assert "measured point 2, x = 1.797e+308" in result.stdout


@pytest.mark.parametrize("value", [1.797e308, -1.797e308, 1e200, 1e154, 1e20])
def test_one_huge_measured_coordinate_is_refused_naming_the_point(value):
    _, nominal, measured = case(6)
    measured[3, 2] = value
    with pytest.raises(FitRefusedError) as caught:
        fit_points(nominal, measured)
    assert caught.value.reason in ("range", "collinear")
    assert "measured point 4" in str(caught.value)


@pytest.mark.parametrize("power", [-1070, -900, -300, -60, 60, 300, 900, 1010])
def test_points_scaled_by_any_power_of_two_give_the_same_rotation(power):
    rotation, nominal, measured = case(10)
    plain = fit_points(nominal, measured)
    factor = 2.0 ** power if power < 1000 else 2.0 ** 1000 * 2.0 ** (power - 1000)
    if power < -1000:   # keep the points normal numbers: 2^-1070 times 100 would be subnormal
        factor = 2.0 ** -1000
    scaled = fit_points(nominal * factor, measured * factor)
    assert_finite(scaled)
    assert scaled.orientation.isclose(plain.orientation, atol=1e-14)
    np.testing.assert_allclose(scaled.translation, plain.translation * factor, rtol=1e-12)
    assert scaled.rms == pytest.approx(plain.rms * factor, rel=1e-9)
    # and the rotation is the one SciPy made, to the noise
    made = Orientation.from_quaternion(rotation.as_quat(scalar_first=True))
    assert scaled.orientation.angle_to(made) < 0.05


def test_a_huge_common_offset_with_a_small_spread_is_refused_as_not_resolvable():
    _, nominal, measured = case(6)
    with pytest.raises(FitRefusedError, match="cannot resolve") as caught:
        fit_points(nominal, measured + 1e250)
    assert caught.value.reason == "range"


def test_a_translation_beyond_the_largest_double_is_refused():
    # Nominal points near -1.6e308 and the measured ones turned a half turn about Z and moved back near
    # -1.6e308: every coordinate is finite, but the translation along x and y would be -3.2e308.
    _, spread, _ = case(6)
    nominal = spread * 1e305 - 1.6e308
    measured = nominal.copy()
    measured[:, :2] = (-nominal[:, :2] - 1.6e308) - 1.6e308
    assert np.all(np.isfinite(measured))
    with pytest.raises(FitRefusedError, match="largest number a double holds") as caught:
        fit_points(nominal, measured)
    assert caught.value.reason == "range"


@pytest.mark.parametrize("bad", [np.nan, np.inf, -np.inf])
def test_non_finite_points_are_refused_naming_the_point(bad):
    _, nominal, measured = case(5)
    measured[2, 1] = bad
    with pytest.raises(InvalidInputError, match="point 3 has NaN or infinity"):
        fit_points(nominal, measured)


@pytest.mark.parametrize("shape", [(5,), (5, 2), (5, 4), (2, 5, 3)])
def test_wrong_shapes_are_refused(shape):
    with pytest.raises(InvalidInputError, match="shape"):
        fit_points(np.ones(shape), np.ones(shape))


def test_measured_points_at_one_place_are_refused():
    _, nominal, _ = case(5)
    with pytest.raises(FitRefusedError, match="all measured points coincide"):
        fit_points(nominal, np.tile([10.0, 20.0, 30.0], (5, 1)))


def test_measured_points_on_one_line_are_refused_naming_the_farthest():
    _, nominal, _ = case(6)
    measured = np.outer(np.arange(6.0), [1.0, 2.0, 3.0])   # on a line; row 6 farthest from the centre
    measured[5] *= 3
    with pytest.raises(FitRefusedError, match="measured points lie on one line.*measured point 6") as caught:
        fit_points(nominal, measured)
    assert caught.value.reason == "collinear"


def test_one_far_off_point_is_still_fitted_and_flagged():
    _, nominal, measured = case(8)
    measured[4] += [1e6, 0, 0]
    fit = fit_points(nominal, measured)
    assert_finite(fit)
    assert fit.flagged == (4,)


@pytest.mark.parametrize("weights", [[1e308] * 6, [5e-324] * 6, [1e308, 1e307, 1e306, 1e305, 1e304, 1e303]])
def test_extreme_weights_keep_their_ratios(weights):
    _, nominal, measured = case(6)
    fit = fit_points(nominal, measured, weights)
    assert_finite(fit)
    ratio = np.asarray(weights) / max(weights)
    reference = fit_points(nominal, measured, ratio)
    assert fit.orientation.isclose(reference.orientation, atol=1e-15)


@pytest.mark.parametrize("weights", [[1, 1, np.nan, 1, 1, 1], [1, 1, np.inf, 1, 1, 1], [1, 1, -1, 1, 1, 1]])
def test_bad_weights_are_refused(weights):
    _, nominal, measured = case(6)
    with pytest.raises(InvalidInputError, match="weight 3 is"):
        fit_points(nominal, measured, weights)


def test_linear_algebra_failures_come_back_as_the_fits_own_refusal(monkeypatch):
    _, nominal, measured = case(6)

    def fails(*args, **kwargs):
        raise np.linalg.LinAlgError("SVD did not converge")

    monkeypatch.setattr(np.linalg, "svd", fails)
    with pytest.raises(FitRefusedError, match="did not converge") as caught:
        fit_points(nominal, measured)
    assert caught.value.reason == "numerical"
    with pytest.raises(FitRefusedError, match="did not converge"):
        fit_directions([[1, 0, 0], [0, 1, 0], [0, 0, 1]], [[1, 0, 0], [0, 1, 0], [0, 0, 1]])


def test_eigenvalue_failures_come_back_as_the_fits_own_refusal(monkeypatch):
    _, nominal, measured = case(6)
    monkeypatch.setattr(np.linalg, "eigvalsh", lambda *a: (_ for _ in ()).throw(np.linalg.LinAlgError("x")))
    with pytest.raises(FitRefusedError, match="spread of the points could not be computed"):
        fit_points(nominal, measured)


# --- three datum points ------------------------------------------------------------------------------

@pytest.mark.parametrize("factor", [2.0 ** -1000, 1e-150, 1.0, 1e150, 1e300])
def test_three_points_at_any_scale_give_the_same_frame(factor):
    o, a, b = np.array([1.0, 2.0, 3.0]), np.array([11.0, 2.0, 3.0]), np.array([4.0, 9.0, 3.0])
    plain = frame_from_three_points(o, a, b)
    scaled = frame_from_three_points(o * factor, a * factor, b * factor)
    assert scaled.orientation.isclose(plain.orientation, atol=1e-15)
    assert scaled.x_distance == pytest.approx(10.0 * factor, rel=1e-14)
    assert scaled.off_axis_distance == pytest.approx(7.0 * factor, rel=1e-14)


def test_three_points_spanning_more_than_the_largest_double_are_refused():
    with pytest.raises(FitRefusedError, match="largest number a double holds") as caught:
        frame_from_three_points([-1.7e308, 0, 0], [1.7e308, 0, 0], [0, 1e308, 0])
    assert caught.value.reason == "range"


@pytest.mark.parametrize("points, words", [
    (([0, 0, 0], [0, 0, 0], [0, 1, 0]), "coincides with the origin"),
    (([0, 0, 0], [1e-300, 0, 0], [0, 1, 0]), "coincides with the origin"),
    (([0, 0, 0], [1, 0, 0], [5, 0, 0]), "lies on the X axis"),
    (([0, 0, 0], [1e300, 0, 0], [-1e300, 0, 0]), "lies on the X axis"),
])
def test_degenerate_datum_points_are_refused(points, words):
    with pytest.raises(FitRefusedError, match=words):
        frame_from_three_points(*points)


@pytest.mark.parametrize("bad", [np.nan, np.inf])
def test_non_finite_datum_points_are_refused(bad):
    with pytest.raises(InvalidInputError, match="NaN or infinity"):
        frame_from_three_points([0, 0, 0], [1, bad, 0], [0, 1, 0])


# --- directions ------------------------------------------------------------------------------------

@pytest.mark.parametrize("length", [5e-324, 1e-300, 1e-200, 1.0, 1e200, 1.797e308])
def test_directions_of_any_non_zero_length_keep_their_direction(length):
    rotation = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True)   # SciPy makes the truth
    body = np.array([[1.0, 0, 0], [0, 1.0, 0], [0, 0, 1.0]])
    reference = rotation.apply(body)
    made = Orientation.from_quaternion(rotation.as_quat(scalar_first=True))
    fit = fit_directions(body * length, reference)
    assert fit.orientation.isclose(made, atol=1e-14) and np.all(np.isfinite(fit.residual_angles_deg))
    if length >= 1e-300:   # a subnormal multiple of a general direction has lost its digits already
        pair = triad(body[0] * length, body[1], reference[0], reference[1] * length)
        assert pair.orientation.isclose(made, atol=1e-14)


@pytest.mark.parametrize("call", [
    lambda: triad([0, 0, 0], [0, 1, 0], [1, 0, 0], [0, 1, 0]),
    lambda: triad([1, 0, 0], [0, 1, 0], [1, 0, 0], [0, 0, 0]),
    lambda: fit_directions([[1, 0, 0], [0, 0, 0]], [[1, 0, 0], [0, 1, 0]]),
])
def test_zero_directions_are_refused_naming_the_direction(call):
    with pytest.raises(InvalidInputError, match="direction [12] has zero length"):
        call()


@pytest.mark.parametrize("bad", [np.nan, np.inf, -np.inf])
def test_non_finite_directions_are_refused(bad):
    with pytest.raises(InvalidInputError, match="NaN or infinity"):
        fit_directions([[1, 0, 0], [0, bad, 0]], [[1, 0, 0], [0, 1, 0]])
    with pytest.raises(InvalidInputError, match="NaN or infinity"):
        triad([1, 0, 0], [0, 1, 0], [bad, 0, 0], [0, 1, 0])


def test_direction_weights_of_any_size_keep_their_ratios():
    body = np.array([[1.0, 0, 0], [0, 1.0, 0], [0, 0, 1.0], [1.0, 1.0, 0]])
    reference = Rotation.from_rotvec([0.1, 0.2, 0.3]).apply(body) + [[0, 0, 0], [0, 0, 0.01], [0, 0, 0], [0, 0, 0]]
    plain = fit_directions(body, reference, [1.0, 2.0, 3.0, 0.5])
    huge = fit_directions(body, reference, [1e307, 2e307, 3e307, 0.5e307])
    assert huge.orientation.isclose(plain.orientation, atol=1e-15)


@pytest.mark.parametrize("values", [[[1, 0], [0, 1]], [[1, 0, 0, 0]], "1 0 0", [[1, 0, 0]]])
def test_directions_of_the_wrong_shape_or_count_are_refused(values):
    with pytest.raises(FramewrightError):
        fit_directions(values, values)
