"""Predicted level and inclinometer readings for known tilts.

Check values: hand-worked tilts written out beside each test, the yaw–pitch–roll matrix of the aircraft
NED convention (common practice; its third row [−sinθ, sinφ cosθ, cosφ cosθ] as in Diebel 2006), and
SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library) for random orientations."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import InvalidInputError, Orientation
from core.level import DOWN_NED, FACES, inclinometer_reading, level_readings
from tests.core.sampling import random_quaternions


def test_upright_part_on_a_z_up_bench():
    report = level_readings(Orientation.identity())
    assert report.up_face == "+Z" and report.down_face == "-Z"
    top, bottom, side = report.face("+Z"), report.face("-Z"), report.face("+X")
    assert (top.from_up_deg, top.tilt_deg, top.facing) == (0.0, 0.0, "up")
    assert (bottom.from_up_deg, bottom.tilt_deg, bottom.facing) == (180.0, 0.0, "down")
    assert (side.from_up_deg, side.tilt_deg, side.off_plumb_deg, side.facing) == (90.0, 90.0, 0.0, "side")
    assert [a.elevation_deg for a in report.axes] == [0.0, 0.0, 90.0]


def test_ned_gravity_makes_minus_z_the_top_face():
    report = level_readings(Orientation.identity(), down=DOWN_NED)
    assert report.up_face == "-Z"
    assert report.axes[2].elevation_deg == -90.0


def test_five_degrees_about_y():
    # Hand-worked: Ry(5°) takes body +Z to (sin5°, 0, cos5°) and body +X to (cos5°, 0, −sin5°).
    # The top face is tilted 5° from level, the +X end dips 5° below the horizontal, +Y stays level, and
    # the +X face (normal pointing 5° below horizontal) is 5° off plumb.
    report = level_readings(Orientation.from_axis_angle([0, 1, 0], 5))
    assert report.face("+Z").tilt_deg == pytest.approx(5.0, abs=1e-12)
    assert report.face("+X").off_plumb_deg == pytest.approx(5.0, abs=1e-12)
    assert report.face("+X").from_up_deg == pytest.approx(95.0, abs=1e-12)
    elevations = [a.elevation_deg for a in report.axes]
    np.testing.assert_allclose(elevations, [-5.0, 0.0, 85.0], atol=1e-12)
    reading = inclinometer_reading(Orientation.from_axis_angle([0, 1, 0], 5), "+Z", "+X")
    assert reading.along_deg == pytest.approx(-5.0, abs=1e-12)
    assert reading.across_deg == pytest.approx(0.0, abs=1e-12)
    assert reading.tilt_deg == pytest.approx(5.0, abs=1e-12)


@pytest.mark.parametrize("pitch, roll", [(3.0, -2.0), (10.0, 25.0), (-40.0, 60.0)])
def test_aircraft_pitch_and_roll_in_ned(pitch, roll):
    # Common practice: with yaw–pitch–roll (intrinsic ZYX) in NED, the body x elevation is the pitch θ and
    # the body y (right wing) elevation is −asin(sinφ cosθ), from the third row of the matrix. An
    # inclinometer on the top face (−Z in NED) with its x forward has its y = (−z) × x = −y (left wing).
    part = Orientation.from_angles("ZYX", [37.0, pitch, roll])
    report = level_readings(part, down=DOWN_NED)
    expected_y = -np.degrees(np.arcsin(np.sin(np.radians(roll)) * np.cos(np.radians(pitch))))
    assert report.axes[0].elevation_deg == pytest.approx(pitch, abs=1e-12)
    assert report.axes[1].elevation_deg == pytest.approx(expected_y, abs=1e-12)
    reading = inclinometer_reading(part, "-Z", "+X", down=DOWN_NED)
    assert reading.along_deg == pytest.approx(pitch, abs=1e-12)
    assert reading.across_deg == pytest.approx(-expected_y, abs=1e-12)
    np.testing.assert_allclose(reading.cross_direction, [0, -1, 0], atol=1e-15)


def test_random_orientations_against_scipy():
    q = random_quaternions(200, seed=31)
    up = np.array([0.0, 0.0, 1.0])
    for quaternion in q:
        report = level_readings(Orientation(quaternion))
        rotation = Rotation.from_quat(quaternion, scalar_first=True)   # SciPy reference
        for reading in report.faces:
            normal = rotation.apply(np.array({"X": [1, 0, 0], "Y": [0, 1, 0], "Z": [0, 0, 1]}[reading.face[1]])
                                    * (1 if reading.face[0] == "+" else -1))
            from_up = np.degrees(np.arccos(np.clip(normal @ up, -1, 1)))
            assert reading.from_up_deg == pytest.approx(from_up, abs=1e-6)   # arccos loses digits near 0/180
            assert reading.tilt_deg == pytest.approx(min(from_up, 180 - from_up), abs=1e-6)
        assert report.up_face == FACES[int(np.argmin([r.from_up_deg for r in report.faces]))]
        for i, axis in enumerate(report.axes):
            z = rotation.as_matrix()[2, i]
            assert axis.elevation_deg == pytest.approx(np.degrees(np.arcsin(z)), abs=1e-6)


def test_two_axis_readings_compose_to_the_face_tilt():
    # Geometry (common practice): "up" written in the instrument's axes is (sin a, sin b, cos t), a unit
    # vector, so sin²(along) + sin²(across) = sin²(tilt).
    q = random_quaternions(100, seed=32)
    rng = np.random.default_rng(4)
    for quaternion in q:
        face = FACES[int(rng.integers(6))]
        direction = rng.normal(size=3)
        reading = inclinometer_reading(Orientation(quaternion), face, tuple(direction))
        s = np.sin(np.radians([reading.along_deg, reading.across_deg, reading.tilt_deg]))
        assert s[0] ** 2 + s[1] ** 2 == pytest.approx(s[2] ** 2, abs=1e-12)
        assert reading.direction @ reading.cross_direction == pytest.approx(0.0, abs=1e-15)


def test_direction_out_of_the_face_is_projected_or_refused():
    reading = inclinometer_reading(Orientation.identity(), "+Z", (1.0, 0.0, 0.1))
    np.testing.assert_allclose(reading.direction, [1, 0, 0], atol=1e-15)
    assert reading.notes and "projected" in reading.notes[0]
    assert inclinometer_reading(Orientation.identity(), "+Y").direction.tolist() == [0.0, 0.0, 1.0]
    with pytest.raises(InvalidInputError, match="perpendicular to face"):
        inclinometer_reading(Orientation.identity(), "+Z", "-Z")
    with pytest.raises(InvalidInputError, match="expected one of"):
        inclinometer_reading(Orientation.identity(), "top")
    with pytest.raises(InvalidInputError, match="zero-length"):
        level_readings(Orientation.identity(), down=(0, 0, 0))
