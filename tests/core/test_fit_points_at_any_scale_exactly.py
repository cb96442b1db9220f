"""A point fit at a scale where the fit divides the points by a power of two first (beyond 1e50 and
below 1e-50) gives every figure exactly the power of two times the fit of the same points at an ordinary
scale: translation, residuals, distances, RMS and the flag threshold, with the same flags, notes and
rotation. Multiplying by a power of two is exact in binary floating point (common practice), so the
figures are compared bit for bit. The point sets are invented."""

import numpy as np
import pytest

from core.fit import fit_points

RNG = np.random.default_rng(2024)
NOMINAL = RNG.uniform(-100, 100, size=(7, 3))
# An invented part turned and shifted, with probe noise and one point far off.
_TURN = np.linalg.qr(RNG.normal(size=(3, 3)))[0]
_TURN *= np.sign(np.linalg.det(_TURN))
MEASURED = NOMINAL @ _TURN.T + [40.0, -25.0, 12.0] + RNG.normal(scale=0.02, size=(7, 3))
MEASURED[3] += [0.0, 0.0, 4.0]


@pytest.mark.parametrize("power", [200, 400, -200, -400])
@pytest.mark.parametrize("count", [7, 4])
def test_every_figure_scales_exactly_by_the_power_of_two(power, count):
    plain = fit_points(NOMINAL[:count], MEASURED[:count])
    factor = 2.0 ** power
    scaled = fit_points(NOMINAL[:count] * factor, MEASURED[:count] * factor)
    np.testing.assert_array_equal(scaled.orientation.quaternion, plain.orientation.quaternion)
    np.testing.assert_array_equal(scaled.translation, plain.translation * factor)
    np.testing.assert_array_equal(scaled.residuals, plain.residuals * factor)
    np.testing.assert_array_equal(scaled.distances, plain.distances * factor)
    assert scaled.rms == plain.rms * factor and type(scaled.rms) is float
    assert scaled.flagged == plain.flagged and scaled.worst_index == plain.worst_index
    assert scaled.spread_ratio == plain.spread_ratio and scaled.notes == plain.notes
    if count >= 5:
        assert scaled.flag_threshold == plain.flag_threshold * factor and type(scaled.flag_threshold) is float
        assert plain.flagged == (3,)
    else:
        assert scaled.flag_threshold is None and plain.flag_threshold is None


def test_weighted_fits_scale_the_same_way():
    weights = [1.0, 2.0, 0.5, 0.0, 1.0, 3.0, 1.0]
    plain = fit_points(NOMINAL, MEASURED, weights)
    factor = 2.0 ** 300
    scaled = fit_points(NOMINAL * factor, MEASURED * factor, weights)
    np.testing.assert_array_equal(scaled.translation, plain.translation * factor)
    assert scaled.rms == plain.rms * factor
    # Weights themselves may be of any size: only their ratios count.
    heavy = fit_points(NOMINAL, MEASURED, np.array(weights) * 2.0 ** 600)
    np.testing.assert_array_equal(heavy.translation, plain.translation)
