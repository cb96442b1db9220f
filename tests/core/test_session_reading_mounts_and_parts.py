"""A session file's mounts as the loader reads them: each mount's orientation (a unit quaternion, read
whatever its signs and however large or small its stored numbers), its part, its position and its
measurements; the default each missing key takes, each bound accepted on one side and refused on the
other, and every refusal word for word by its place in the file.

Check values: the refusal words are the loader's own (core/session_reading.py); the bounds are the ones
core/session_values.py, core/position.py and core/measurement.py document (box sides 0.001 to 1e6 mm, a
position within 1e6 m, a weight 0 to 1e12, a source note of at most 40 characters); SciPy's Rotation
gives the rotation a stored quaternion stands for; the norms are worked by hand (0.6² + 0.8² = 1)."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.session import PartProperties, SessionFileError, session_from_dict

IDENTITY = {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]}


def document(version=2, **mount):
    """An invented one-mount session file; the mount's keys given replace or add to the minimal ones
    (None: key removed)."""
    entry = {"name": "camera", "orientation": IDENTITY}
    for key, value in mount.items():
        if value is None:
            entry.pop(key, None)
        else:
            entry[key] = value
    return json.loads(json.dumps({"format": "framewright-session", "version": version, "mounts": [entry]}))


def mount(**keys):
    return session_from_dict(document(**keys)).mounts[0]


def refusal(data) -> str:
    with pytest.raises(SessionFileError) as refused:
        session_from_dict(data)
    assert not refused.value.unexpected
    return str(refused.value)


# --- the mount and its orientation ------------------------------------------------------------------------

def test_a_minimal_mount_takes_every_default():
    m = mount()
    assert m.name == "camera" and m.notes == "" and m.position is None and m.measurements == ()
    assert m.part == PartProperties()
    assert m.part.box_size_mm == (100.0, 60.0, 40.0) and m.part.face_names == {} and m.part.boresight == "+Z"


@pytest.mark.parametrize("q", [[-1, 0, 0, 0], [0, -1, 0, 0], [0, 0, 0, -1], [0.6, -0.8, 0, 0], [0, 0, -0.6, -0.8],
                               [0.5, -0.5, 0.5, -0.5]])
def test_a_unit_quaternion_of_any_signs_is_read_as_the_rotation_it_stands_for(q):
    got = mount(orientation={"quaternion_wxyz": q}).orientation.as_matrix()
    # SciPy's Rotation for the same stored numbers (scalar first).
    np.testing.assert_allclose(got, Rotation.from_quat(q, scalar_first=True).as_matrix(), atol=1e-15)


@pytest.mark.parametrize("q, norm", [([1e200, 0, 0, 0], "1e+200"), ([0, -1e-300, 0, 0], "1e-300"),
                                     ([0, 0, 0, 0], "0"), ([1, 1, 1, 1], "2"), ([-0.6, -0.8, -1, 0], "1.41421356"),
                                     ([1e308, 1e308, 0, 0], "1.41421356e+308")])
def test_a_quaternion_off_unit_norm_is_refused_naming_its_norm_without_overflow(q, norm):
    assert refusal(document(orientation={"quaternion_wxyz": q})) == (
        f"session: mounts[0].orientation.quaternion_wxyz: expected a unit quaternion, its norm is {norm} (the file "
        "may be damaged)")


@pytest.mark.parametrize("mount_keys, message", [
    ({"orientation": [1, 0, 0, 0]},
     'session: mounts[0].orientation: expected an object {"quaternion_wxyz": [w, x, y, z]}, got a list'),
    ({"orientation": {}}, 'session: mounts[0].orientation: expected {"quaternion_wxyz": [w, x, y, z]}'),
    ({"orientation": {"quaternion_wxyz": [1, 0, 0, 0], "matrix": [], "angles": 1}},
     "session: mounts[0].orientation: expected only \"quaternion_wxyz\", found also ['angles', 'matrix']"),
    ({"orientation": {"quaternion_wxyz": [1, 0, 0]}},
     "session: mounts[0].orientation.quaternion_wxyz: expected a list of 4 numbers"),
    ({"orientation": {"quaternion_wxyz": "1 0 0 0"}},
     "session: mounts[0].orientation.quaternion_wxyz: expected a list of 4 numbers"),
    ({"orientation": {"quaternion_wxyz": [1, 0, None, 0]}},
     "session: mounts[0].orientation.quaternion_wxyz[2]: expected a number, got null"),
    ({"orientation": {"quaternion_wxyz": [True, 0, 0, 0]}},
     "session: mounts[0].orientation.quaternion_wxyz[0]: expected a number, got true"),
    ({"orientation": None}, 'session: mounts[0]: missing its orientation {"quaternion_wxyz": [w, x, y, z]}'),
    ({"name": None}, "session: mounts[0]: missing its name"),
    ({"name": " "}, "session: mounts[0].name: expected a non-empty name"),
    ({"name": "x" * 501}, "session: mounts[0].name: a name of 501 characters; expected at most 500"),
    ({"notes": ["a"]}, "session: mounts[0].notes: expected text, got a list"),
])
def test_a_damaged_mount_is_refused_word_for_word(mount_keys, message):
    assert refusal(document(**mount_keys)) == message


def test_a_mount_that_is_not_an_object_is_refused():
    data = document()
    data["mounts"] = [{"name": "a", "orientation": IDENTITY}, "b"]
    assert refusal(data) == "session: mounts[1]: expected an object with name and orientation, got text"


def test_a_mount_name_of_500_characters_and_multi_line_notes_are_read():
    m = mount(name="x" * 500, notes="first line\n\tsecond")
    assert m.name == "x" * 500 and m.notes == "first line\n\tsecond"


# --- the part ---------------------------------------------------------------------------------------------

def test_a_part_reads_its_sizes_its_face_names_and_its_boresight():
    part = mount(part={"box_size_mm": [1e-3, 25, 1e6], "face_names": {"+X": "lens", "-Z": ""},
                       "boresight": "-Y"}).part
    assert part.box_size_mm == (1e-3, 25.0, 1e6) and part.face_names == {"+X": "lens", "-Z": ""}
    assert part.boresight == "-Y"


def test_a_part_that_leaves_out_keys_takes_their_defaults():
    assert mount(part={}).part == PartProperties()
    assert mount(part={"boresight": "+X"}).part.box_size_mm == (100.0, 60.0, 40.0)
    assert mount(part={"box_size_mm": [1, 2, 3]}).part.boresight == "+Z"


@pytest.mark.parametrize("part, message", [
    ([1, 2, 3], "session: mounts[0].part: expected an object, got a list"),
    ({"box_size_mm": "1 2 3"}, "session: mounts[0].part.box_size_mm: expected a list of 3 sizes in mm, got text"),
    ({"box_size_mm": [1, 2]}, "session: mounts[0].part.box_size_mm: expected a list of 3 sizes in mm, got 2"),
    ({"box_size_mm": [1, 2, 3, 4]}, "session: mounts[0].part.box_size_mm: expected a list of 3 sizes in mm, got 4"),
    ({"box_size_mm": [1, "2", 3]}, "session: mounts[0].part.box_size_mm[1]: expected a size in mm, got text"),
    ({"box_size_mm": [0.00099, 2, 3]},
     "session: mounts[0].part.box_size_mm[0]: expected a size in mm from 0.001 to 1e+06, got 0.00099"),
    ({"box_size_mm": [1, 2, 1000000.1]},
     "session: mounts[0].part.box_size_mm[2]: expected a size in mm from 0.001 to 1e+06, got 1000000.1"),
    ({"face_names": ["+X"]}, 'session: mounts[0].part.face_names: expected an object like {"+Z": "lens"}, got a list'),
    ({"face_names": {"X": "lens"}},
     "session: mounts[0].part.face_names key: expected one of +X, -X, +Y, -Y, +Z, -Z, got 'X'"),
    ({"face_names": {"+X": 5}}, 'session: mounts[0].part.face_names["+X"]: expected a name (text), got a number'),
    ({"boresight": "up"}, "session: mounts[0].part.boresight: expected one of +X, -X, +Y, -Y, +Z, -Z, got 'up'"),
    ({"boresight": None}, "session: mounts[0].part.boresight: expected one of +X, -X, +Y, -Y, +Z, -Z, got null"),
])
def test_a_damaged_part_is_refused_word_for_word(part, message):
    assert refusal(document(part=part)) == message


# --- the position -----------------------------------------------------------------------------------------

@pytest.mark.parametrize("metres", [[1e6, -1e6, 0], [0, 0, -1e6], [0.001, 0, 0]])
def test_a_position_up_to_the_limit_on_either_side_is_read(metres):
    assert mount(position={"metres": metres, "unit": "in"}).position.metres == tuple(float(v) for v in metres)


@pytest.mark.parametrize("position, message", [
    ({"metres": [0, 0, 0], "frame": "enu"},
     "session: mounts[0].position: expected only \"metres\" and \"unit\", found also ['frame']"),
    ({"metres": [0, 0]}, "session: mounts[0].position.metres: expected a list of 3 numbers"),
    ({"metres": [0, "1", 0]}, "session: mounts[0].position.metres[1]: expected a number, got text"),
    ({"metres": [1000000.5, 0, 0]},
     "session: mounts[0].position.metres[0]: expected a distance in metres from -1e+06 to 1e+06, got 1000000.5"),
    ({"metres": [0, -1000000.5, 0]},
     "session: mounts[0].position.metres[1]: expected a distance in metres from -1e+06 to 1e+06, got -1000000.5"),
    ({"metres": [0, 0, 0], "unit": 1}, "session: mounts[0].position.unit: expected one of mm, m, in, thou, got a number"),
])
def test_a_damaged_position_is_refused_word_for_word(position, message):
    assert refusal(document(position=position)) == message


# --- the measurements -------------------------------------------------------------------------------------

def measurement(**keys):
    entry = {"orientation": {"quaternion_wxyz": [0.6, 0.8, 0, 0]}}
    entry.update(keys)
    return entry


def test_a_measurement_takes_weight_1_and_an_empty_source_when_the_file_gives_none():
    (m,) = mount(measurements=[measurement()]).measurements
    assert m.weight == 1.0 and m.source == ""
    np.testing.assert_allclose(m.orientation.as_quaternion(), [0.6, 0.8, 0, 0], atol=1e-15)


@pytest.mark.parametrize("weight", [0, 1e12, 2.5])
def test_a_weight_from_0_to_a_million_million_is_read(weight):
    assert mount(measurements=[measurement(weight=weight)]).measurements[0].weight == weight


def test_a_source_of_up_to_40_characters_is_read():
    assert mount(measurements=[measurement(source="s" * 40)]).measurements[0].source == "s" * 40
    assert mount(measurements=[]).measurements == ()


@pytest.mark.parametrize("measurements, message", [
    ({"orientation": IDENTITY}, "session: mounts[0].measurements: expected a list of measurements, got an object"),
    ([5], 'session: mounts[0].measurements[0]: expected an object {"orientation": {...}, "weight": 1, "source": '
          '"typed"}, got a number'),
    ([measurement(), measurement(when="today", by="me")],
     "session: mounts[0].measurements[1]: expected only \"orientation\", \"weight\" and \"source\", found also "
     "['by', 'when']"),
    ([{"weight": 1}], 'session: mounts[0].measurements[0]: missing its orientation {"quaternion_wxyz": [w, x, y, z]}'),
    ([measurement(orientation={"quaternion_wxyz": [0.6, 0.6, 0, 0]})],
     "session: mounts[0].measurements[0].orientation.quaternion_wxyz: expected a unit quaternion, its norm is "
     "0.848528137 (the file may be damaged)"),
    ([measurement(weight=-0.5)], "session: mounts[0].measurements[0].weight: expected a weight from 0 to 1e+12, got -0.5"),
    ([measurement(weight=1.000001e12)],
     "session: mounts[0].measurements[0].weight: expected a weight from 0 to 1e+12, got 1000001000000.0"),
    ([measurement(weight="2")], "session: mounts[0].measurements[0].weight: expected a weight, got text"),
    ([measurement(source=4)], "session: mounts[0].measurements[0].source: expected a name (text), got a number"),
    ([measurement(source="s" * 41)],
     "session: mounts[0].measurements[0].source: 41 characters; expected a short note of at most 40"),
])
def test_a_damaged_measurement_is_refused_word_for_word(measurements, message):
    assert refusal(document(measurements=measurements)) == message
