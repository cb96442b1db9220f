"""The selected mount's repeated measurements as undo steps: what each step is called, the weight and the
source kept with a measurement, a refused weight or number that changes nothing, and using the average as
one named step whose result is SciPy's weighted mean.

Check values: the model's documented rules (app/model.py, core/operations.py), worked by hand; the average
against SciPy's Rotation.mean (a reference library)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from app.model import MEASUREMENTS, ORIENTATION, SessionModel
from core.errors import FramewrightError
from core.orientation import Orientation
from core.session import Mount, Session

ROTATIONS = Rotation.from_euler("ZYX", [[30.0, 2.0, -1.0], [31.0, 1.5, -0.5], [29.5, 2.5, -1.5]], degrees=True)


def _orientation(rotation):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


@pytest.fixture
def model():
    return SessionModel(Session((Mount("Boom camera"), Mount("Mast unit")), selected=0))


@pytest.fixture
def seen(model):
    changes = []
    model.changed.connect(changes.append)
    return changes


def keep(model, weights, source="measured"):
    """Measure each of ROTATIONS in turn, as the Adjust tab does: set the orientation, keep it."""
    for rotation, weight in zip(ROTATIONS, weights):
        model.set_orientation(_orientation(rotation))
        model.add_measurement(source, weight=weight, origin="repeats box")


def test_a_measurement_keeps_its_orientation_weight_and_source(model, seen):
    keep(model, [2.5], source="fit")
    (kept,) = model.current_mount().measurements
    assert kept.orientation == _orientation(ROTATIONS[0])
    assert kept.weight == 2.5 and kept.source == "fit"
    assert seen[-1].what == {MEASUREMENTS} and seen[-1].origin == "repeats box"
    assert model.undo_stack.undoText() == "Add measurement 1 to “Boom camera”"
    model.add_measurement()                           # the defaults: typed, weight 1
    assert model.current_mount().measurements[1].source == "typed"
    assert model.current_mount().measurements[1].weight == 1.0
    assert model.undo_stack.undoText() == "Add measurement 2 to “Boom camera”"


def test_removing_names_the_measurement_by_its_number_from_one(model):
    keep(model, [1.0, 1.0, 1.0])
    model.remove_measurement(1, origin="repeats box")
    assert model.undo_stack.undoText() == "Remove measurement 2 of “Boom camera”"
    assert [m.orientation for m in model.current_mount().measurements] == \
        [_orientation(ROTATIONS[0]), _orientation(ROTATIONS[2])]
    model.undo()
    assert [m.orientation for m in model.current_mount().measurements] == [_orientation(r) for r in ROTATIONS]


def test_clearing_is_one_named_step_and_undo_brings_them_all_back(model, seen):
    keep(model, [1.0, 2.0])
    before = model.current_mount().measurements
    model.clear_measurements(origin="repeats box")
    assert model.current_mount().measurements == () and seen[-1].origin == "repeats box"
    assert model.undo_stack.undoText() == "Clear the measurements of “Boom camera”"
    model.undo()
    assert model.current_mount().measurements == before


@pytest.mark.parametrize("weight", [-1.0, float("nan"), float("inf"), 1e13, True, "2"])
def test_a_refused_weight_keeps_the_last_good_list(model, seen, weight):
    keep(model, [1.0])
    count, before = model.undo_stack.count(), model.current_mount().measurements
    seen.clear()
    with pytest.raises(FramewrightError, match="measurement weight"):
        model.add_measurement(weight=weight)
    assert model.current_mount().measurements == before and model.undo_stack.count() == count and seen == []


@pytest.mark.parametrize("number", [-1, 2])
def test_removing_a_measurement_that_is_not_there_changes_nothing(model, number):
    keep(model, [1.0, 1.0])
    with pytest.raises(IndexError, match=f"measurement {number + 1} is not one of the 2 kept"):
        model.remove_measurement(number)
    assert len(model.current_mount().measurements) == 2 and model.undo_stack.count() == 4


def test_using_the_weighted_average_is_one_named_step(model, seen):
    weights = [1.0, 4.0, 0.5]
    keep(model, weights)
    result = model.current_average()
    assert result.count == 3
    expected = ROTATIONS.mean(weights=weights)                     # SciPy: the weighted mean
    got = Rotation.from_quat(result.mean.as_quaternion(), scalar_first=True)
    assert (got.inv() * expected).magnitude() < 1e-12
    model.use_average(origin="repeats box")
    assert model.current_orientation() == result.mean
    assert model.undo_stack.undoText() == "Use the average of 3 measurements of “Boom camera”"
    assert seen[-1].what == {ORIENTATION} and seen[-1].origin == "repeats box"
    assert len(model.current_mount().measurements) == 3            # kept: the average does not use them up
    model.undo()
    assert model.current_orientation() == _orientation(ROTATIONS[2])


def test_a_zero_weight_leaves_a_measurement_out_of_the_average(model):
    keep(model, [1.0, 0.0, 1.0])
    expected = ROTATIONS[[0, 2]].mean()                            # SciPy: the two that count
    got = Rotation.from_quat(model.current_average().mean.as_quaternion(), scalar_first=True)
    assert (got.inv() * expected).magnitude() < 1e-12


def test_the_measurements_belong_to_the_selected_mount(model):
    keep(model, [1.0])
    model.select(1)
    assert model.current_mount().measurements == () and model.current_average() is None
    model.add_measurement(weight=3.0)
    assert model.undo_stack.undoText() == "Add measurement 1 to “Mast unit”"
    assert len(model.mounts[0].measurements) == 1 and model.mounts[1].measurements[0].weight == 3.0
    np.testing.assert_array_equal(model.mounts[1].measurements[0].orientation.as_quaternion(), [1, 0, 0, 0])


def test_removing_one_of_two_equal_measurements_names_the_one_removed(model, seen):
    model.add_measurement()
    model.add_measurement()                           # two equal measurements, then another
    model.set_orientation(_orientation(ROTATIONS[1]))
    model.add_measurement()
    model.remove_measurement(0, origin="repeats box")
    assert model.undo_stack.undoText() == "Remove measurement 1 of “Boom camera”"
    assert seen[-1].what == {MEASUREMENTS} and seen[-1].origin == "repeats box"
    assert [m.orientation for m in model.current_mount().measurements] == \
        [Orientation.identity(), _orientation(ROTATIONS[1])]
