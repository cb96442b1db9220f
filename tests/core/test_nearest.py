"""Pasted matrices that are not quite rotations: the bands of CONVENTIONS.md."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import MatrixRefusedError, Orientation
from core.nearest import nearest_rotation, orthogonality_report


def test_exact_rotation_is_exact():
    m = Rotation.from_euler("ZYX", [10, 20, 30], degrees=True).as_matrix()
    r = orthogonality_report(m)
    assert r.band == "exact" and r.error < 1e-15 and r.det == pytest.approx(1.0, abs=1e-15)
    assert Orientation.from_matrix(m).notes == ()


def test_nearest_rotation_is_the_polar_factor():
    # Reference: the orthogonal polar factor is U Vᵀ of the SVD (numpy.linalg.svd) — N. J. Higham (1986).
    rng = np.random.default_rng(21)
    for _ in range(200):
        m = Rotation.random(rng=rng).as_matrix() + rng.normal(scale=2e-2, size=(3, 3))
        u, _, vt = np.linalg.svd(m)
        if np.linalg.det(u @ vt) < 0:
            continue
        assert np.abs(nearest_rotation(m) - u @ vt).max() <= 1e-12


def test_small_noise_is_corrected_with_the_size_of_the_change():
    m = Rotation.from_euler("x", 30, degrees=True).as_matrix()
    m[0, 1] += 1e-3
    r = orthogonality_report(m)
    assert r.band == "corrected"
    assert r.max_change == pytest.approx(np.abs(r.nearest - m).max())
    assert "largest element change" in r.message


def test_larger_noise_is_accepted_with_a_strong_warning():
    m = Rotation.from_euler("y", 30, degrees=True).as_matrix()
    m[2, 2] *= 1.02
    r = orthogonality_report(m)
    assert r.band == "warning" and "WARNING" in r.message
    o = Orientation.from_matrix(m)
    assert "WARNING" in o.notes[0]


def test_typo_is_refused_naming_the_row_and_column():
    m = Rotation.from_euler("z", 30, degrees=True).as_matrix()
    m[1, 0] = 0.9   # a mistyped element in row 2, column 1
    with pytest.raises(MatrixRefusedError) as caught:
        Orientation.from_matrix(m)
    message = str(caught.value)
    assert "row 2" in message and "column 1" in message
    assert caught.value.report.band == "refused"


def test_reflection_is_refused_never_fixed():
    m = np.diag([1.0, 1.0, -1.0])
    with pytest.raises(MatrixRefusedError, match="reflection"):
        Orientation.from_matrix(m)
    # Also when it is otherwise perfectly orthonormal and only a column sign is wrong.
    m = Rotation.from_euler("z", 40, degrees=True).as_matrix()
    m[:, 1] *= -1
    with pytest.raises(MatrixRefusedError, match="left-handed"):
        Orientation.from_matrix(m)


def test_band_limits():
    # CONVENTIONS.md: e <= 1e-9 exact; <= 5e-3 accepted with notice; <= 5e-2 strong warning; else refused.
    base = np.eye(3)
    for scale, band in [(0.9e-9, "exact"), (4.9e-3, "corrected"), (4.9e-2, "warning"), (5.2e-2, "refused")]:
        m = base.copy()
        m[0, 0] = np.sqrt(1.0 + scale)   # makes (MᵀM − I)[0, 0] exactly `scale`
        assert orthogonality_report(m).band == band, scale


def test_huge_elements_are_refused_naming_the_element():
    m = np.eye(3)
    m[1, 2] = 1e200
    r = orthogonality_report(m)
    assert r.band == "refused" and "row 2, column 3" in r.message
    with pytest.raises(MatrixRefusedError, match="row 2, column 3"):
        Orientation.from_matrix(m)
