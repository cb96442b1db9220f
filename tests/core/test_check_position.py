"""The check's optional position figures: the offset of the measured origin from the nominal one, as a
distance and along the nominal body axes (Nᵀ (t_M − t_N)), judged against a tolerance in mm only when
both mounts have a position; the setting is saved only when given, so older files read as before.

Check values: the offset is recomputed with SciPy's Rotation (a general-purpose reference library) and
numpy; the Euclidean distance is common practice."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.check import CheckSettings, check_position
from core.errors import FramewrightError
from core.orientation import Orientation
from core.position import Position

N = Rotation.from_euler("ZYX", [90, 0, 0], degrees=True)
NOMINAL = Orientation.from_quaternion(N.as_quat(scalar_first=True))


def test_the_offset_is_given_in_the_nominal_body_axes_and_as_a_distance():
    nominal = Position.from_shown((100.0, 50.0, 0.0), "mm")
    measured = Position.from_shown((100.3, 50.4, -0.1), "mm")
    offset = check_position(NOMINAL, nominal, measured, tolerance_mm=0.5)
    d_ref = np.array([0.3, 0.4, -0.1])
    # SciPy: the nominal body axes see the reference offset through Nᵀ (N.inv().apply).
    np.testing.assert_allclose(offset.along_nominal_mm, N.inv().apply(d_ref), atol=1e-9)
    # 90° about z: reference +Y is the body +X, so the 0.4 mm north is +0.4 along body x (common practice).
    assert offset.along_nominal_mm[0] == pytest.approx(0.4, abs=1e-9)
    np.testing.assert_allclose(offset.along_reference_mm, d_ref, atol=1e-9)
    assert offset.distance_mm == pytest.approx(np.sqrt(0.26), abs=1e-9)
    assert offset.passed is False and offset.margin_mm == pytest.approx(0.5 - np.sqrt(0.26), abs=1e-9)
    assert offset.summary().startswith("FAIL: position offset 0.510 mm exceeds 0.500 mm")


def test_an_offset_equal_to_its_tolerance_passes_and_none_means_not_judged():
    nominal = Position.from_shown((0, 0, 0), "mm")
    measured = Position.from_shown((0, 0, 0.5), "mm")
    assert check_position(NOMINAL, nominal, measured, 0.5).passed is True
    unjudged = check_position(NOMINAL, nominal, measured)
    assert unjudged.passed is None and "not judged" in unjudged.summary()


def test_without_two_positions_there_is_no_offset():
    p = Position.from_shown((1, 2, 3), "mm")
    assert check_position(NOMINAL, None, p, 1.0) is None
    assert check_position(NOMINAL, p, None, 1.0) is None


@pytest.mark.parametrize("bad", [float("nan"), float("inf"), -0.1, 1e308, "1", True])
def test_a_hostile_position_tolerance_is_refused(bad):
    with pytest.raises(FramewrightError, match="position tolerance"):
        CheckSettings(position_tolerance_mm=bad)


def test_the_position_tolerance_is_saved_only_when_given():
    assert "position_tolerance_mm" not in CheckSettings().to_dict()
    settings = CheckSettings(position_tolerance_mm=0.25)
    assert settings.to_dict()["position_tolerance_mm"] == 0.25
    assert CheckSettings.from_dict(settings.to_dict()) == settings
    assert CheckSettings.from_dict({"mode": "total"}).position_tolerance_mm is None
