"""Point fits near the mirror refusal and the words of a range refusal.

- A flat plate measured with micrometre probe noise that happens to come out mirrored through the plate
  is fitted as a rotation: the mirror through a plane is only round-off away from a rotation, so it is
  never refused as a reflection.
- A point set whose best orthogonal fit is a reflection, but whose mirror fit is not clearly better than
  the best rotation, is fitted (its large residuals tell the story), not refused; a true mirror image is.
- A refusal for a coordinate out of all proportion names the point set and the point as a person reads
  them ("nominal point 4, x = ...").

Check values: SciPy's Rotation (a reference library) for the rotations; the Kabsch (1976) solution
worked by hand for the axis-aligned set (h = k/3 · diag(9, 4, −1): best rotation the identity, residual
energies differ by 4 s3, see core/fit.py's rule)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.fit import FitRefusedError, fit_points

TURN = Rotation.from_euler("ZYX", [35, -10, 20], degrees=True)
SHIFT = np.array([250.0, -40.0, 12.0])


def test_a_flat_plate_whose_probe_noise_comes_out_mirrored_is_fitted_not_refused():
    # A 100 mm plate: corners and mid-edges at z = ±1 µm (0.001 mm) in alternation, measured with the
    # off-plane part flipped (a mirror through the plate itself), then turned and shifted.
    xy = np.array([[0, 0], [100, 0], [100, 100], [0, 100], [50, 0], [100, 50], [50, 100], [0, 50]], float)
    z = 0.001 * np.array([1, -1, 1, -1, -1, 1, -1, 1], float)
    nominal = np.column_stack([xy, z])
    measured = TURN.apply(np.column_stack([xy, -z])) + SHIFT
    fit = fit_points(nominal, measured)
    found = Rotation.from_quat(fit.orientation.as_quaternion(), scalar_first=True)
    assert np.degrees((found * TURN.inv()).magnitude()) < 1e-5        # SciPy's turn, to a micro-degree
    assert fit.rms == pytest.approx(0.002, rel=1e-6)                   # by hand: each point off by 2 µm
    assert fit.translation == pytest.approx(SHIFT, abs=1e-9)


def _axis_aligned_set(k):
    # ±3 x, ±2 y, ±1 z, measured as the mirror through XY shrunk by k (centroids both at the origin)
    p = np.array([[3, 0, 0], [-3, 0, 0], [0, 2, 0], [0, -2, 0], [0, 0, 1], [0, 0, -1]], float)
    return p, k * (p * [1, 1, -1])


def test_a_set_that_leans_to_a_mirror_but_is_not_explained_by_one_is_fitted():
    # By hand, k = 0.3: s = (0.9, 0.4, 0.1); energies 14/3 + 0.42; mirror residual 2.2867 > 4 s3 = 0.4,
    # so the mirror does not fit clearly better: the best rotation (the identity) is returned.
    nominal, measured = _axis_aligned_set(0.3)
    fit = fit_points(nominal, measured)
    assert fit.orientation.as_quaternion() == pytest.approx([1, 0, 0, 0], abs=1e-12)
    # residual q − p: x points 2.1, y points 1.4, z points 1.3; RMS² = (2·4.41 + 2·1.96 + 2·1.69) / 6
    assert fit.rms == pytest.approx(np.sqrt((2 * 4.41 + 2 * 1.96 + 2 * 1.69) / 6), rel=1e-12)


def test_a_true_mirror_image_of_the_same_set_is_refused():
    nominal, measured = _axis_aligned_set(1.0)       # mirror residual 0 < 4 s3 = 4/3: refused
    with pytest.raises(FitRefusedError, match="mirror image") as caught:
        fit_points(nominal, measured)
    assert caught.value.reason == "reflection"


def test_a_huge_nominal_coordinate_is_named_by_set_point_and_axis():
    # Nominal points typed 1e120 times too large (a mistyped exponent): the measured spread is lost
    # against them, and the refusal points at the nominal coordinate that is out of proportion.
    measured = np.array([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1]], float)
    with pytest.raises(FitRefusedError) as caught:
        fit_points(measured * 1e120, measured)
    assert str(caught.value).startswith("nominal point 2, x = 1e+120 is out of all proportion to the "
                                        "spread of the measured points")
    assert caught.value.reason == "range"
