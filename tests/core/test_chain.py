"""Mount chains: composition, intermediate frames, edits as new values, and the session-file form.

Check values come from SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library) and
from the hand-worked bracket-and-plate example written out below."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import FramewrightError, InvalidInputError, Orientation
from core.chain import Chain, ChainStep
from tests.core.sampling import random_quaternions

# Hand-worked: a bracket turned 90° about the reference Z, then a plate turned 90° about the bracket's X.
#   Rz(90) = [[0,-1,0],[1,0,0],[0,0,1]],  Rx(90) = [[1,0,0],[0,0,-1],[0,1,0]]
#   R = Rz(90) · Rx(90) = [[0,0,1],[1,0,0],[0,1,0]]
# Read by columns: plate X -> reference Y (the bracket's X, which Rz(90) put on Y; the turn about X keeps
# it), plate Y -> reference Z, plate Z -> reference X. This is also the 120° turn about (1,1,1)/√3 that
# maps x -> y -> z -> x (common practice).
BRACKET = Orientation.from_axis_angle([0, 0, 1], 90)
PLATE = Orientation.from_axis_angle([1, 0, 0], 90)
HAND_WORKED_PRODUCT = np.array([[0.0, 0.0, 1.0], [1.0, 0.0, 0.0], [0.0, 1.0, 0.0]])


def bracket_and_plate():
    return Chain((ChainStep("bracket", BRACKET), ChainStep("plate", PLATE)), name="sensor mast")


def test_bracket_then_plate_composes_as_worked_by_hand():
    product = bracket_and_plate().product()
    np.testing.assert_allclose(product.as_matrix(), HAND_WORKED_PRODUCT, atol=1e-15)
    # The same value seen as 120° about (1,1,1)/√3 (common practice).
    axis, angle = product.as_axis_angle()
    assert angle == pytest.approx(120.0, abs=1e-12)
    np.testing.assert_allclose(axis, np.ones(3) / np.sqrt(3), atol=1e-15)


def test_intermediate_frames_are_the_cumulative_products():
    frames = bracket_and_plate().frames()
    assert [(f.index, f.name) for f in frames] == [(0, "bracket"), (1, "plate")]
    np.testing.assert_allclose(frames[0].orientation.as_matrix(), [[0, -1, 0], [1, 0, 0], [0, 0, 1]],
                               atol=1e-15)
    np.testing.assert_allclose(frames[1].orientation.as_matrix(), HAND_WORKED_PRODUCT, atol=1e-15)


def test_order_matters_and_reordering_matches_scipy():
    swapped = bracket_and_plate().reordered((1, 0))
    # SciPy, a general-purpose reference library: Rx(90) · Rz(90) as a matrix product.
    expected = (Rotation.from_euler("x", 90, degrees=True) * Rotation.from_euler("z", 90, degrees=True))
    np.testing.assert_allclose(swapped.product().as_matrix(), expected.as_matrix(), atol=1e-15)
    assert not np.allclose(swapped.product().as_matrix(), HAND_WORKED_PRODUCT)


def test_inverting_a_step_uses_its_transpose():
    chain = bracket_and_plate().with_inverted(1)
    assert chain.steps[1].inverted
    # SciPy: Rz(90) · Rx(90)⁻¹
    expected = Rotation.from_euler("z", 90, degrees=True) * Rotation.from_euler("x", 90, degrees=True).inv()
    np.testing.assert_allclose(chain.product().as_matrix(), expected.as_matrix(), atol=1e-15)
    assert not chain.with_inverted(1).steps[1].inverted     # toggles back


def test_a_disabled_step_contributes_nothing_and_has_no_frame():
    chain = bracket_and_plate().with_enabled(0, False)
    np.testing.assert_allclose(chain.product().as_matrix(), PLATE.as_matrix(), atol=1e-15)
    assert [f.name for f in chain.frames()] == ["plate"]
    assert Chain().product() == Orientation.identity()
    assert Chain().frames() == ()


def test_edits_return_new_chains_and_leave_the_original_alone():
    original = bracket_and_plate()
    spacer = ChainStep("spacer", Orientation.from_axis_angle([0, 1, 0], 3))
    edited = original.with_step(spacer, at=1).moved(0, 2).with_enabled(0, False).without_step(1)
    assert [s.name for s in original.steps] == ["bracket", "plate"]
    assert original.steps[0].enabled and not original.steps[1].inverted
    assert [s.name for s in edited.steps] == ["spacer", "bracket"]
    assert not edited.steps[0].enabled
    with pytest.raises(AttributeError):
        original.name = "other"


def test_random_chains_against_scipy():
    rng = np.random.default_rng(11)
    q = random_quaternions(200, seed=5)
    for trial in range(40):
        count = int(rng.integers(1, 6))
        picks = q[trial * 5: trial * 5 + count]
        inverted = rng.random(count) < 0.4
        enabled = rng.random(count) < 0.8
        chain = Chain(tuple(ChainStep(f"step {i}", Orientation.from_quaternion(picks[i]), bool(inverted[i]),
                                      bool(enabled[i])) for i in range(count)))
        # SciPy, a general-purpose reference library: the product of the enabled steps, inverted where asked.
        expected = Rotation.identity()
        cumulative = []
        for i in range(count):
            if enabled[i]:
                step = Rotation.from_quat(picks[i], scalar_first=True)
                expected = expected * (step.inv() if inverted[i] else step)
                cumulative.append(expected.as_matrix())
        np.testing.assert_allclose(chain.product().as_matrix(), expected.as_matrix(), atol=1e-14)
        frames = chain.frames()
        assert len(frames) == len(cumulative)
        for frame, matrix in zip(frames, cumulative):
            np.testing.assert_allclose(frame.orientation.as_matrix(), matrix, atol=1e-14)


def test_session_form_round_trips_exactly_through_json():
    chain = bracket_and_plate().with_inverted(0).with_enabled(1, False).with_step(
        ChainStep("adapter", Orientation.from_quaternion(random_quaternions(1, seed=3)[0])))
    text = json.dumps(chain.to_dict())
    back = Chain.from_dict(json.loads(text))
    assert back == chain
    assert json.loads(text)["steps"][0] == {
        "name": "bracket", "orientation": {"quaternion_wxyz": list(BRACKET.quaternion)},
        "inverted": True, "enabled": True}


@pytest.mark.parametrize("data, words", [
    ({"steps": [{"orientation": {"quaternion_wxyz": [1, 0, 0, 0]}}]}, "missing 'name'"),
    ({"steps": [{"name": "a", "orientation": [1, 0, 0, 0]}]}, "quaternion_wxyz"),
    ({"steps": [{"name": "a", "orientation": {"quaternion_wxyz": [0, 0, 0, 0]}}]}, "zero length"),
    ({"steps": [{"name": "a", "orientation": {"quaternion_wxyz": [1, 0, 0, 0]}, "enabled": "yes"}]},
     "true or false"),
    ({"steps": "none"}, "must be a list"),
])
def test_damaged_session_entries_are_refused_with_the_step_named(data, words):
    with pytest.raises(FramewrightError, match=words) as caught:
        Chain.from_dict(data)
    if "steps" in data and isinstance(data["steps"], list):
        assert "step 0" in str(caught.value)


def test_bad_indices_and_orders_are_refused():
    chain = bracket_and_plate()
    with pytest.raises(InvalidInputError, match="expected an index from 0 to 1"):
        chain.with_inverted(2)
    with pytest.raises(InvalidInputError, match="not a permutation"):
        chain.reordered((0, 0))
    with pytest.raises(InvalidInputError, match="expected an Orientation"):
        ChainStep("bad", np.eye(3))
