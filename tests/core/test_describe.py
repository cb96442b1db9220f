"""Words for orientations and the 24 right-angle orientations (core/describe.py)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import describe

ROT_Z_90 = np.array([[0.0, -1.0, 0.0], [1.0, 0.0, 0.0], [0.0, 0.0, 1.0]])  # common practice


def test_exactly_24_right_angle_orientations_are_enumerated_and_all_distinct():
    mats = describe.RIGHT_ANGLE_MATRICES
    assert mats.shape == (24, 3, 3)
    keys = {tuple(m.astype(int).ravel()) for m in mats}
    assert len(keys) == 24
    for m in mats:
        np.testing.assert_allclose(m.T @ m, np.eye(3), atol=0)
        assert np.linalg.det(m) == pytest.approx(1.0)


def test_the_24_are_the_rotation_group_of_the_cube_as_scipy_builds_it():
    # SciPy's Rotation.create_group('O') is the octahedral (cube) rotation group of 24 elements.
    scipy_set = {tuple(np.rint(m).astype(int).ravel()) for m in Rotation.create_group("O").as_matrix()}
    ours = {tuple(m.astype(int).ravel()) for m in describe.RIGHT_ANGLE_MATRICES}
    assert ours == scipy_set


@pytest.mark.parametrize("index", range(24))
def test_each_right_angle_orientation_is_its_own_nearest_with_zero_residual(index):
    m = describe.RIGHT_ANGLE_MATRICES[index]
    near = describe.nearest_right_angle(m)
    assert near.right_angle.index == index
    assert near.residual_deg == 0.0


@pytest.mark.parametrize("index", [0, 5, 9, 12, 21])
@pytest.mark.parametrize("perturbation_deg", [0.3, 7.5, 30.0])
def test_a_perturbed_right_angle_orientation_is_recognised_with_the_right_residual(index, perturbation_deg):
    rng = np.random.default_rng(index)
    axis = rng.normal(size=3)
    axis /= np.linalg.norm(axis)
    base = Rotation.from_matrix(describe.RIGHT_ANGLE_MATRICES[index])
    perturbed = base * Rotation.from_rotvec(np.radians(perturbation_deg) * axis)
    near = describe.nearest_right_angle(perturbed.as_matrix())
    assert near.right_angle.index == index
    # Check value from SciPy's Rotation: the magnitude of base⁻¹ · perturbed, and the brute-force minimum
    # over SciPy's own 24-element cube group.
    expected = np.degrees((base.inv() * perturbed).magnitude())
    assert near.residual_deg == pytest.approx(expected, abs=1e-10)
    group = Rotation.create_group("O")
    assert near.residual_deg == pytest.approx(np.degrees(np.min((group.inv() * perturbed).magnitude())), abs=1e-10)


def test_nearest_right_angle_is_vectorised_and_agrees_with_scipy_on_random_orientations():
    rots = Rotation.random(500, random_state=3)
    index, residual = describe.nearest_right_angle_indices(rots.as_matrix())
    group = Rotation.create_group("O")
    # SciPy's Rotation: for each random rotation, the magnitude to every group element; the least wins.
    magnitudes = np.degrees(np.stack([(g.inv() * rots).magnitude() for g in group], axis=-1))
    np.testing.assert_allclose(residual, magnitudes.min(axis=-1), atol=1e-9)
    assert residual.max() < 63.0  # no rotation is farther than about 62.8° from the cube group (from memory)


def test_90_degrees_about_z_puts_body_x_on_reference_y():
    # 90° about z: body +X → reference +Y (common practice).
    lines = describe.describe_axes(ROT_Z_90, "enu")
    assert lines[0] == "+X \u2192 +Y (north), exact"
    assert lines[1] == "+Y \u2192 \u2212X (west), exact"
    assert lines[2] == "+Z \u2192 +Z (up), exact"
    near = describe.nearest_right_angle(ROT_Z_90)
    assert near.right_angle.rotation_words == "90\u00b0 about +Z"


def test_180_about_x_turns_body_z_down_in_enu_and_up_in_ned():
    # 180° about x: R = diag(1, −1, −1) (transforms3d doctest); presets only rename, R is unchanged.
    m = np.diag([1.0, -1.0, -1.0])
    assert describe.describe_axes(m, "enu")[2] == "+Z \u2192 \u2212Z (down), exact"
    assert describe.describe_axes(m, "ned")[2] == "+Z \u2192 \u2212Z (up), exact"
    assert describe.nearest_right_angle(m).right_angle.rotation_words == "180\u00b0 about +X"


def test_a_small_tilt_is_reported_with_its_angle_off():
    # Body X pitched 0.3° out of the horizontal plane: the pointing error of +X is 0.3° by construction
    # (checked against SciPy's Rotation about y).
    m = Rotation.from_euler("y", 0.3, degrees=True).as_matrix()
    pointing = describe.axis_pointing(m)
    assert pointing[0].off_deg == pytest.approx(0.3, abs=1e-12)
    assert describe.describe_axes(m, "vehicle")[0] == "+X \u2192 +X (forward), 0.30\u00b0 off"


def test_camera_optical_preset_names_directions_of_the_optical_frame():
    # camera optical: z forward, x right, y down (CONVENTIONS.md); identity keeps every axis on its own.
    lines = describe.describe_axes(np.eye(3), "camera")
    assert lines == ["+X \u2192 +X (right), exact", "+Y \u2192 +Y (down), exact", "+Z \u2192 +Z (forward), exact"]


def test_an_axis_halfway_between_two_directions_names_both():
    m = Rotation.from_euler("z", 45, degrees=True).as_matrix()
    line = describe.describe_axes(m, "aircraft")[0]
    assert line == "+X \u2192 +X or +Y (forward or right), 45.0\u00b0 off"


def test_orientation_object_is_accepted_like_its_matrix():
    from core.orientation import Orientation

    o = Orientation.from_matrix(ROT_Z_90)
    assert describe.describe_orientation(o) == describe.describe_orientation(ROT_Z_90)


def test_bad_input_gets_a_clear_message():
    with pytest.raises(ValueError, match="unknown frame preset"):
        describe.frame_preset("north-west-up")
    with pytest.raises(ValueError, match="shape"):
        describe.describe_axes(np.eye(2))
    with pytest.raises(ValueError, match="NaN"):
        describe.describe_axes(np.full((3, 3), np.nan))
