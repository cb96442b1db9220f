"""A mount's repeated measurements in the session file: saved and read back exactly, absent from files
that have none (older files open as before), and every damaged entry refused by its place.

The measured values are small turns about known axes around a nominal, made with SciPy's Rotation."""

import json
import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.errors import FramewrightError
from core.measurement import MAX_MEASUREMENTS_PER_MOUNT, Measurement
from core.orientation import Orientation
from core.session import FORMAT_VERSION, Mount, Session, SessionFileError, load_session, save_session


def _orientation(rotation: Rotation) -> Orientation:
    x, y, z, w = rotation.as_quat()                  # SciPy: scalar last
    return Orientation.from_quaternion((w, x, y, z))


NOMINAL = Rotation.from_euler("ZYX", [30, -12, 4], degrees=True)
REPEATS = [NOMINAL * Rotation.from_rotvec(np.radians(0.02) * np.array(axis)) for axis in
           ((1, 0, 0), (0, 1, 0), (0, 0, -1))]


def _session_with_measurements():
    measured = (Measurement(_orientation(REPEATS[0]), 1.0, "typed"),
                Measurement(_orientation(REPEATS[1]), 2.5, "decoded"),
                Measurement(_orientation(REPEATS[2]), 0.0, "fit"))
    return Session((Mount("Camera", _orientation(NOMINAL), measurements=measured), Mount("Bracket")))


def test_measurements_are_saved_and_read_back_exactly(tmp_path):
    path = tmp_path / "repeats.fwsession.json"
    session = _session_with_measurements()
    save_session(session, path)
    loaded = load_session(path)
    assert loaded == session                         # exact: JSON keeps every bit of a float
    kept = loaded.mounts[0].measurements
    assert [m.source for m in kept] == ["typed", "decoded", "fit"] and [m.weight for m in kept] == [1, 2.5, 0]
    for measurement, rotation in zip(kept, REPEATS):
        # SciPy: the angle between the stored and the made rotation
        assert (Rotation.from_quat(np.roll(measurement.orientation.as_quaternion(), -1)).inv()
                * rotation).magnitude() < 1e-15
    data = json.loads(path.read_text(encoding="utf-8"))
    assert data["version"] == FORMAT_VERSION == 2    # an optional key: no new version
    assert "measurements" not in data["mounts"][1]   # a mount without any writes no key


def test_a_file_without_measurements_opens_with_none(tmp_path):
    path = tmp_path / "old.fwsession.json"
    path.write_text(json.dumps({"format": "framewright-session", "version": 1,
                                "mounts": [{"name": "A", "orientation": {"quaternion_wxyz": [1, 0, 0, 0]}}]}))
    assert load_session(path).mounts[0].measurements == ()


def _damaged(tmp_path, change):
    path = tmp_path / "bad.fwsession.json"
    save_session(_session_with_measurements(), path)
    data = json.loads(path.read_text(encoding="utf-8"))
    change(data["mounts"][0])
    path.write_text(json.dumps(data, allow_nan=True), encoding="utf-8")
    with pytest.raises(SessionFileError) as caught:
        load_session(path)
    assert not caught.value.unexpected               # refused by the named field check, not a constructor
    return str(caught.value)


@pytest.mark.parametrize("change, field, words", [
    (lambda m: m["measurements"][1]["orientation"].__setitem__("quaternion_wxyz", [2, 0, 0, 0]),
     "mounts[0].measurements[1].orientation.quaternion_wxyz", "unit quaternion, its norm is 2"),
    (lambda m: m["measurements"][2].__setitem__("weight", -0.5), "mounts[0].measurements[2].weight",
     "a weight from 0 to 1e+12, got -0.5"),
    (lambda m: m["measurements"][0].__setitem__("weight", float("nan")), "mounts[0].measurements[0]",
     "finite"),
    (lambda m: m["measurements"][0].__setitem__("weight", float("inf")), "mounts[0].measurements[0]",
     "finite"),
    (lambda m: m["measurements"][0].__setitem__("weight", "1"), "mounts[0].measurements[0].weight",
     "expected a weight, got text"),
    (lambda m: m["measurements"][0].__setitem__("weight", True), "mounts[0].measurements[0].weight",
     "got true"),
    (lambda m: m["measurements"][1].__setitem__("source", "x" * 41), "mounts[0].measurements[1].source",
     "at most 40"),
    (lambda m: m["measurements"][1].__setitem__("source", "two\nlines"), "mounts[0].measurements[1].source",
     "control character U+000A"),
    (lambda m: m["measurements"][1].__setitem__("when", "today"), "mounts[0].measurements[1]",
     "found also ['when']"),
    (lambda m: m["measurements"][2].pop("orientation"), "mounts[0].measurements[2]", "missing its orientation"),
    (lambda m: m["measurements"].__setitem__(0, [1, 0, 0, 0]), "mounts[0].measurements[0]", "got a list"),
    (lambda m: m.__setitem__("measurements", {"a": 1}), "mounts[0].measurements", "expected a list"),
    (lambda m: m.__setitem__("measurements", m["measurements"][:1] * (MAX_MEASUREMENTS_PER_MOUNT + 1)),
     "mounts[0].measurements", "1,001 measurements; a mount keeps at most 1,000"),
])
def test_a_damaged_measurement_is_refused_by_its_place(tmp_path, change, field, words):
    message = _damaged(tmp_path, change)
    assert field in message and words in message, message


def test_a_thousand_measurements_are_kept(tmp_path):
    path = tmp_path / "many.fwsession.json"
    one = Measurement(_orientation(REPEATS[0]))
    session = Session((Mount("A", measurements=(one,) * MAX_MEASUREMENTS_PER_MOUNT),))
    save_session(session, path)
    assert len(load_session(path).mounts[0].measurements) == MAX_MEASUREMENTS_PER_MOUNT


@pytest.mark.parametrize("weight", [-1e-300, math.nan, math.inf, 1e13, "2", None, True])
def test_a_measurement_refuses_a_bad_weight(weight):
    with pytest.raises(FramewrightError, match="weight"):
        Measurement(Orientation.identity(), weight)


def test_a_mount_refuses_too_many_measurements_or_values_of_another_kind():
    with pytest.raises(FramewrightError, match="at most 1,000"):
        Mount("A", measurements=(Measurement(Orientation.identity()),) * (MAX_MEASUREMENTS_PER_MOUNT + 1))
    with pytest.raises(FramewrightError, match="tuple of Measurement"):
        Mount("A", measurements=(Orientation.identity(),))
    with pytest.raises(FramewrightError, match="source"):
        Measurement(Orientation.identity(), 1.0, "bell\x07")
