"""SessionModel's repeated measurements: each command one undo step carrying its origin, undo on another
mount shows that mount again, the limit refused with a message, and the average as SciPy's Rotation.mean
computes it (the same weights)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from app.model import MEASUREMENTS, ORIENTATION, SELECTION
from core import operations
from core.measurement import MAX_MEASUREMENTS_PER_MOUNT, Measurement
from core.orientation import Orientation


def _orientation(rotation):
    x, y, z, w = rotation.as_quat()                  # SciPy: scalar last
    return Orientation.from_quaternion((w, x, y, z))


def test_add_remove_and_clear_are_one_step_each_with_their_origin(model, changes):
    first = model.current_orientation()
    model.add_measurement("decoded", origin="box")
    assert changes[-1].what == frozenset({MEASUREMENTS}) and changes[-1].origin == "box"
    second = Orientation.from_angles("ZYX", (10, 2, -3))
    model.set_orientation(second)
    model.add_measurement(origin="box")
    assert [(m.orientation, m.source) for m in model.current_mount().measurements] == \
        [(first, "decoded"), (second, "typed")]
    model.remove_measurement(0, origin="box")
    assert [m.orientation for m in model.current_mount().measurements] == [second]
    model.clear_measurements(origin="box")
    assert model.current_mount().measurements == () and model.undo_stack.count() == 5
    model.clear_measurements(origin="box")           # nothing to clear: no empty undo step
    assert model.undo_stack.count() == 5
    model.undo()
    assert changes[-1].origin is None and [m.orientation for m in model.current_mount().measurements] == [second]
    with pytest.raises(IndexError, match="measurement 2 is not one of the 1 kept"):
        model.remove_measurement(1)


def test_undo_on_another_mount_shows_that_mount_again(model, changes):
    model.select(1)
    model.add_measurement()
    model.select(2)
    model.undo()
    assert model.selected_index == 1 and model.current_mount().measurements == ()
    assert {MEASUREMENTS, SELECTION, ORIENTATION} <= changes[-1].what


def test_the_weighted_average_is_scipys_mean_and_using_it_is_one_step(model):
    rotations = Rotation.from_euler("XYZ", [[1, 2, 3], [1.5, 2.2, 2.6], [0.7, 1.9, 3.3]], degrees=True)
    weights = [1.0, 3.0, 0.5]
    kept = tuple(Measurement(_orientation(r), w, "fit") for r, w in zip(rotations, weights))
    model._put(operations.set_measurements(model.session(), kept), None)
    expected = rotations.mean(weights=weights)                       # SciPy: Markley's weighted mean
    result = model.current_average()
    assert (Rotation.from_quat(np.roll(result.mean.as_quaternion(), -1)).inv() * expected).magnitude() < 1e-12
    count = model.undo_stack.count()
    model.use_average(origin="box")
    assert model.undo_stack.count() == count + 1 and model.current_orientation() == result.mean


def test_a_mount_keeps_at_most_the_limit_and_says_so(model):
    one = Measurement(model.current_orientation())
    model._put(operations.set_measurements(model.session(), (one,) * MAX_MEASUREMENTS_PER_MOUNT), None)
    with pytest.raises(ValueError, match="already keeps 1,000 measurements"):
        model.add_measurement()
    assert len(model.current_mount().measurements) == MAX_MEASUREMENTS_PER_MOUNT


def test_no_average_without_measurements_or_with_every_weight_zero(model):
    with pytest.raises(ValueError, match="no average"):
        model.use_average()
    model._put(operations.set_measurements(model.session(), (Measurement(model.current_orientation(), 0.0),)), None)
    assert model.current_average() is None
    with pytest.raises(ValueError, match="no average"):
        model.use_average()
