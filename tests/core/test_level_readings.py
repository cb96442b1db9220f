"""core/level.py reading by reading and limit by limit: every face, axis and inclinometer figure against
SciPy's Rotation with the angle between two vectors taken as atan2(|a × b|, a · b) (common practice: exact
near 0 and 180°), hand-worked tilts at the 45° and 135° facing limits, and every refusal word for word from
both sides of its limit. The first known-tilt checks are in test_level.py."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.errors import InvalidInputError
from core.level import DOWN_NED, FACES, inclinometer_reading, level_readings
from core.orientation import Orientation

FACE_LIST = "+X, -X, +Y, -Y, +Z, -Z"
SIGNED = {"+X": (1, 0, 0), "-X": (-1, 0, 0), "+Y": (0, 1, 0), "-Y": (0, -1, 0), "+Z": (0, 0, 1), "-Z": (0, 0, -1)}
ROTATIONS = Rotation.random(24, random_state=77)
DOWNS = [(0, 0, -1), (0, 0, 1), (0.3, -0.2, -0.9), (0, 0, -1e-200), (1e200, 2e200, 0), "-Y"]


def _refused(words, function, *args, **kwargs):
    with pytest.raises(InvalidInputError) as caught:
        function(*args, **kwargs)
    assert str(caught.value) == words


def _angle_deg(a, b):
    return math.degrees(math.atan2(np.linalg.norm(np.cross(a, b)), float(np.dot(a, b))))


def _up(down):
    if isinstance(down, str):
        down = np.array(SIGNED[down], dtype=float)
    d = np.asarray(down, dtype=float)
    d = d / np.abs(d).max()
    return -d / np.linalg.norm(d)


def _orientation(rotation):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


@pytest.mark.parametrize("down", DOWNS)
def test_every_face_and_axis_against_scipy(down):
    up = _up(down)
    for rotation in ROTATIONS:
        report = level_readings(_orientation(rotation), down=down)
        assert np.allclose(report.down, -up, rtol=0, atol=1e-15)
        assert [f.face for f in report.faces] == list(FACES)
        for reading in report.faces:
            normal = rotation.apply(SIGNED[reading.face])                       # SciPy
            from_up = _angle_deg(normal, up)
            assert np.allclose(reading.normal, normal, rtol=0, atol=1e-15)
            assert reading.from_up_deg == pytest.approx(from_up, abs=1e-12)
            assert reading.tilt_deg == pytest.approx(min(from_up, 180 - from_up), abs=1e-12)
            assert reading.off_plumb_deg == pytest.approx(90 - min(from_up, 180 - from_up), abs=1e-12)
            assert reading.facing == ("up" if from_up < 45 else "down" if from_up > 135 else "side")
        from_ups = [_angle_deg(rotation.apply(SIGNED[f]), up) for f in FACES]
        assert report.up_face == FACES[int(np.argmin(from_ups))]
        assert report.down_face == FACES[int(np.argmax(from_ups))]
        assert [a.axis for a in report.axes] == ["+X", "+Y", "+Z"]
        for axis in report.axes:
            direction = rotation.apply(SIGNED[axis.axis])
            assert np.allclose(axis.direction, direction, rtol=0, atol=1e-15)
            assert axis.elevation_deg == pytest.approx(90 - _angle_deg(direction, up), abs=1e-12)


@pytest.mark.parametrize("turn, top, bottom", [(45.0, "side", "side"), (45 - 1e-7, "up", "down"),
                                               (45 + 1e-7, "side", "side"), (135 - 1e-7, "side", "side"),
                                               (135 + 1e-7, "down", "up"), (135.0, "side", "side")])
def test_a_face_is_up_below_45_degrees_from_up_and_down_beyond_135(turn, top, bottom):
    # Worked here: turning about X by a tips the top face (+Z) a from straight up and the underside (−Z)
    # 180 − a; at exactly 45 and 135 a face is on its side.
    report = level_readings(Orientation.from_axis_angle((1, 0, 0), turn))
    from_up = min(turn, 360 - turn)
    assert report.face("+Z").from_up_deg == pytest.approx(from_up, abs=1e-12)
    assert report.face("-Z").from_up_deg == pytest.approx(180 - from_up, abs=1e-12)
    assert (report.face("+Z").facing, report.face("-Z").facing) == (top, bottom)


def test_at_exactly_45_degrees_the_readings_are_exact():
    report = level_readings(Orientation.from_axis_angle((1, 0, 0), 45.0))
    assert (report.face("+Z").from_up_deg, report.face("-Z").from_up_deg) == (45.0, 135.0)
    assert report.face("+Z").tilt_deg == report.face("+Z").off_plumb_deg == 45.0


def test_faces_are_found_by_any_spelling_and_unknown_ones_are_refused():
    report = level_readings(Orientation.from_angles("ZYX", [10, 20, 30]))
    assert report.face("z") is report.faces[4] and report.face(" −x ") is report.faces[1]
    assert report.face("+y") is report.faces[2]
    _refused(f"no face 'top'; expected one of {FACE_LIST}", report.face, "top")
    _refused(f"no face None; expected one of {FACE_LIST}", report.face, None)


@pytest.mark.parametrize("down, words", [
    ((0, 0, 0), "gravity direction: zero-length direction; expected a non-zero (x, y, z)"),
    ((0, 0, float("nan")), "gravity direction: contains NaN or infinity; expected finite numbers"),
    ("sideways", f"gravity direction: cannot read 'sideways'; expected one of {FACE_LIST} or three numbers"),
    ((1, 2), "gravity direction: expected shape (..., 3), got (2,)"),
])
def test_a_gravity_direction_that_is_not_one_is_refused(down, words):
    _refused(words, level_readings, Orientation.identity(), down=down)
    _refused(words, inclinometer_reading, Orientation.identity(), "+Z", down=down)


@pytest.mark.parametrize("not_an_orientation", [[1, 0, 0, 0], np.eye(3), None])
def test_readings_need_an_orientation(not_an_orientation):
    _refused("level readings: expected an Orientation", level_readings, not_an_orientation)
    _refused("inclinometer reading: expected an Orientation", inclinometer_reading, not_an_orientation, "+Z")


def test_named_gravity_directions_are_the_vectors():
    part = Orientation.from_angles("ZYX", [10, 20, 30])
    for name, vector in (("+z", DOWN_NED), ("-Z", (0.0, 0.0, -1.0))):
        named, given = level_readings(part, down=name), level_readings(part, down=vector)
        assert [f.from_up_deg for f in named.faces] == [f.from_up_deg for f in given.faces]
        assert (named.up_face, named.down_face) == (given.up_face, given.down_face)
    assert level_readings(part, down="+Z").up_face == level_readings(part, down=(0, 0, 1)).up_face


# ---- the two-axis inclinometer ------------------------------------------------------------------------

def _instrument_readings(rotation, face, direction, down):
    """(along, across, tilt) worked with SciPy: the instrument's z is the face's outward normal n, its x the
    direction projected into the face, its y = n × x (core/level.py's stated choice); each reading is 90°
    less the angle of that axis from straight up."""
    n = np.array(SIGNED[face], dtype=float)
    d = np.array(SIGNED[direction] if isinstance(direction, str) else direction, dtype=float)
    d = d / np.abs(d).max()
    x = d - (d @ n) * n
    x /= np.linalg.norm(x)
    y = np.cross(n, x)
    up = _up(down)
    along, across, normal = (_angle_deg(rotation.apply(v), up) for v in (x, y, n))
    return 90 - along, 90 - across, normal, x, y


@pytest.mark.parametrize("down", DOWNS[:4])
def test_inclinometer_readings_against_scipy(down):
    rng = np.random.default_rng(9)
    for rotation in ROTATIONS:
        face = FACES[int(rng.integers(6))]
        direction = tuple(rng.normal(size=3))
        reading = inclinometer_reading(_orientation(rotation), face, direction, down=down)
        along, across, tilt, x, y = _instrument_readings(rotation, face, direction, down)
        assert reading.face == face
        assert reading.along_deg == pytest.approx(along, abs=1e-12)
        assert reading.across_deg == pytest.approx(across, abs=1e-12)
        assert reading.tilt_deg == pytest.approx(tilt, abs=1e-12)
        assert np.allclose(reading.direction, x, rtol=0, atol=1e-15)
        assert np.allclose(reading.cross_direction, y, rtol=0, atol=1e-15)


@pytest.mark.parametrize("face, along, across", [("+X", "+Y", "+Z"), ("-X", "+Y", "-Z"), ("+Y", "+Z", "+X"),
                                                 ("-Y", "+Z", "-X"), ("+Z", "+X", "+Y"), ("-Z", "+X", "-Y")])
def test_without_a_direction_the_instrument_lies_along_the_next_axis_round(face, along, across):
    # the next body axis round X → Y → Z → X; its y = n × x (worked here for each face)
    rotation = ROTATIONS[3]
    reading = inclinometer_reading(_orientation(rotation), face.lower())
    assert reading.face == face and reading.notes == ()
    assert reading.direction.tolist() == list(SIGNED[along])
    assert np.allclose(reading.cross_direction, SIGNED[across], rtol=0, atol=0)
    want = _instrument_readings(rotation, face, along, (0, 0, -1))
    assert (reading.along_deg, reading.across_deg, reading.tilt_deg) == pytest.approx(want[:3], abs=1e-12)


@pytest.mark.parametrize("lift, note", [(1e-7, None), (2e-6, 0.000115), (0.1, 5.71), (9e5, 90.0)])
def test_a_direction_out_of_the_face_is_projected_with_a_note_from_1e_minus_12_of_length_lost(lift, note):
    # (1, 0, lift) on the top face: the part out of the plane is lost; a length below 1 − 1e-12 is noted with
    # its angle out of the plane, atan2(lift, 1) (worked here), to three digits
    reading = inclinometer_reading(Orientation.identity(), "+Z", (1.0, 0.0, lift))
    assert reading.direction.tolist() == [1.0, 0.0, 0.0]
    if note is None:
        assert reading.notes == ()
    else:
        angle = math.degrees(math.atan2(lift, 1.0))
        assert f"{angle:.3g}" == f"{note:.3g}"
        assert reading.notes == (f"the chosen direction was {angle:.3g}° out of the face plane; it was projected "
                                 "onto the face",)


@pytest.mark.parametrize("direction", [(0.9e-6, 0.0, 1.0), (0.0, 0.0, 1.0), "-Z", "z", (0, 1e-7, -5)])
def test_a_direction_within_1e_minus_6_of_the_normal_is_refused(direction):
    _refused(f"in-face direction {direction!r} is perpendicular to face +Z; expected a direction lying in the "
             "face, such as +X", inclinometer_reading, Orientation.identity(), "+Z", direction)


def test_a_direction_just_beyond_1e_minus_6_of_the_normal_is_taken():
    reading = inclinometer_reading(Orientation.identity(), "+Z", (1.1e-6, 0.0, 1.0))
    assert np.allclose(reading.direction, [1, 0, 0], rtol=0, atol=1e-15)
    assert reading.notes == ("the chosen direction was 90° out of the face plane; it was projected onto the face",)


@pytest.mark.parametrize("direction", [(1e200, 1e200, 0.0), (1e-200, -1e-200, 0.0), "-y"])
def test_huge_tiny_and_named_directions_keep_their_direction(direction):
    rotation = ROTATIONS[5]
    reading = inclinometer_reading(_orientation(rotation), "+Z", direction)
    want = _instrument_readings(rotation, "+Z", direction.upper() if isinstance(direction, str) else direction,
                                (0, 0, -1))
    assert (reading.along_deg, reading.across_deg, reading.tilt_deg) == pytest.approx(want[:3], abs=1e-12)
    assert reading.notes == ()


@pytest.mark.parametrize("face, words", [("top", f"face 'top' is unknown; expected one of {FACE_LIST}"),
                                         (3, f"face 3 is unknown; expected one of {FACE_LIST}"),
                                         ("+W", f"face '+W' is unknown; expected one of {FACE_LIST}")])
def test_an_unknown_face_is_refused(face, words):
    _refused(words, inclinometer_reading, Orientation.identity(), face)


@pytest.mark.parametrize("direction, words", [
    ("along", f"in-face direction: cannot read 'along'; expected one of {FACE_LIST} or three numbers"),
    ((0, 0, 0), "in-face direction: zero-length direction; expected a non-zero (x, y, z)"),
    ((1, float("inf"), 0), "in-face direction: contains NaN or infinity; expected finite numbers"),
])
def test_an_in_face_direction_that_is_not_one_is_refused(direction, words):
    _refused(words, inclinometer_reading, Orientation.identity(), "+Z", direction)


def test_an_in_face_part_of_exactly_1e_minus_6_is_taken():
    # (1.0000000000005e-6, 0, 1) made unit leaves an in-face part of exactly 1e-6 (found by search, checked here
    # the module's way: axis_vector, then the part across the normal): at the limit, not beyond it
    from core.check import axis_vector
    direction = (1.0000000000005e-06, 0.0, 1.0)
    unit = axis_vector(direction)
    assert float(np.linalg.norm(unit - unit[2] * np.array([0, 0, 1.0]))) == 1e-6
    reading = inclinometer_reading(Orientation.identity(), "+Z", direction)
    assert reading.direction.tolist() == [1.0, 0.0, 0.0]


def test_an_in_face_part_of_exactly_1_minus_1e_minus_12_has_no_note():
    # found by search and checked the module's way, as above: a length of exactly 1 − 1e-12 is not noted
    from core.check import axis_vector
    direction = (1.0, 0.31024187555895566, 1.480784388677447e-06)
    unit = axis_vector(direction)
    assert float(np.linalg.norm(unit - unit[2] * np.array([0, 0, 1.0]))) == 1.0 - 1e-12
    assert inclinometer_reading(Orientation.identity(), "+Z", direction).notes == ()
