"""A mount chain's steps as a person and a session file give them: each refusal's exact words (the
module's own, naming the step and the chain), the stored quaternion's unit tolerance on both sides, the
reach limit of the steps' positions at its edge, what a disabled or inverted step adds, and the edits'
results step by step.

Check values: quarter turns worked by hand (Rz(90) = [[0,-1,0],[1,0,0],[0,0,1]]), SciPy's Rotation for
an inverted step's translation, and the 1e6 m limit and 1e-6 tolerance the modules state. All chains
and step names are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import FramewrightError, InvalidInputError, Orientation
from core.chain import Chain, ChainStep
from core.position import Position

RZ90 = Orientation.from_axis_angle([0, 0, 1], 90)
RX90 = Orientation.from_axis_angle([1, 0, 0], 90)
UNIT = {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]}


def words(call, *args, kind=FramewrightError, **kwargs):
    with pytest.raises(kind) as caught:
        call(*args, **kwargs)
    return str(caught.value)


# --- one step ----------------------------------------------------------------------------------------

def test_a_step_name_that_is_not_text_is_refused_with_what_was_given():
    assert words(ChainStep, 7, RZ90, kind=InvalidInputError) == "step name: expected text, got 7"


def test_a_step_without_an_orientation_or_with_a_bad_position_is_refused_by_name():
    assert words(ChainStep, "plate", np.eye(3), kind=InvalidInputError) == \
        "step 'plate': expected an Orientation, got ndarray"
    assert words(ChainStep, "plate", RZ90, position=(1, 2, 3), kind=InvalidInputError) == \
        "step 'plate': expected a Position or none, got tuple"


@pytest.mark.parametrize("flag", ["inverted", "enabled"])
def test_a_flag_that_is_not_true_or_false_is_refused_by_name(flag):
    assert words(ChainStep, "plate", RZ90, **{flag: 1}, kind=InvalidInputError) == \
        f"step 'plate': {flag} must be true or false, got 1"


def test_a_step_is_enabled_and_not_inverted_unless_told():
    step = ChainStep("plate", RZ90)
    assert step.enabled is True and step.inverted is False and step.position is None


def test_what_a_step_adds_to_the_translation():
    t_m = (0.1, 0.2, 0.3)
    step = ChainStep("plate", RZ90, position=Position(t_m))
    np.testing.assert_array_equal(step.translation, t_m)
    # Inverted: −Rᵀ t, from SciPy's Rotation (the inverse's rotation of −t).
    want = -Rotation.from_euler("z", 90, degrees=True).inv().apply(t_m)
    np.testing.assert_allclose(ChainStep("plate", RZ90, inverted=True, position=Position(t_m)).translation, want,
                               atol=1e-16)
    np.testing.assert_array_equal(ChainStep("plate", RZ90, enabled=False, position=Position(t_m)).translation,
                                  np.zeros(3))
    np.testing.assert_array_equal(ChainStep("plate", RZ90).translation, np.zeros(3))


def test_a_disabled_step_contributes_the_identity_even_when_inverted():
    assert ChainStep("plate", RZ90, inverted=True, enabled=False).contribution == Orientation.identity()
    assert ChainStep("plate", RZ90, inverted=True).contribution == RZ90.inverse()


def test_the_file_form_of_a_step_names_every_field():
    step = ChainStep("plate", Orientation.identity(), inverted=True, enabled=False,
                     position=Position((0.001, 0.0, 0.0), "mm"))
    assert step.to_dict() == {"name": "plate", "orientation": {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]},
                              "inverted": True, "enabled": False,
                              "position": {"metres": [0.001, 0.0, 0.0], "unit": "mm"}}
    assert ChainStep.from_dict(step.to_dict()) == step
    assert "position" not in ChainStep("plate", RZ90).to_dict()


# --- a step read from a file -------------------------------------------------------------------------

@pytest.mark.parametrize("data, kind", [([], "list"), ("plate", "str"), (None, "NoneType")])
def test_a_step_entry_that_is_not_an_object_is_refused_as_a_step(data, kind):
    assert words(ChainStep.from_dict, data) == f"step: expected a JSON object, got {kind}"


@pytest.mark.parametrize("key", ["name", "orientation"])
def test_a_step_entry_missing_a_key_is_refused_listing_the_keys(key):
    data = {"name": "plate", "orientation": UNIT}
    del data[key]
    assert words(ChainStep.from_dict, data) == \
        f"step: missing {key!r}; expected keys name, orientation, position, inverted, enabled"


@pytest.mark.parametrize("orientation", [[1, 0, 0, 0], {"matrix": [[1, 0, 0], [0, 1, 0], [0, 0, 1]]}])
def test_an_orientation_not_in_the_file_form_is_refused_showing_it(orientation):
    assert words(ChainStep.from_dict, {"name": "plate", "orientation": orientation}) == \
        f"step: orientation must be {{\"quaternion_wxyz\": [w, x, y, z]}}, got {orientation!r}"


def test_a_step_read_from_a_file_is_enabled_and_not_inverted_unless_the_file_says():
    step = ChainStep.from_dict({"name": "plate", "orientation": UNIT})
    assert step == ChainStep("plate", Orientation.identity())
    assert step.enabled is True and step.inverted is False and step.position is None


def test_a_damaged_step_is_named_and_keeps_the_kind_of_error():
    data = {"name": "plate", "orientation": {"quaternion_wxyz": [1.1, 0, 0, 0]}}
    message = words(ChainStep.from_dict, data, kind=InvalidInputError)
    assert message == ("step ('plate'): quaternion_wxyz: expected a unit quaternion, its norm is 1.1 "
                       "(the file may be damaged; limit 1 ± 1e-06)")


def test_a_long_step_name_is_shortened_to_40_characters_with_a_mark_and_a_40_character_one_is_not():
    bad = {"quaternion_wxyz": [0, 0, 0, 0]}
    forty = "n" * 40
    assert words(ChainStep.from_dict, {"name": forty, "orientation": bad}).startswith(f"step ({forty!r}): ")
    message = words(ChainStep.from_dict, {"name": forty + "X", "orientation": bad})
    assert message.startswith(f"step ({forty!r}…): quaternion of zero length")


def test_a_step_name_that_is_not_text_is_refused_where_it_is_found():
    assert words(ChainStep.from_dict, {"name": 5, "orientation": UNIT}, where="chain 'mast' step 2") == \
        "chain 'mast' step 2: step name: expected text, got 5"


def test_a_bad_position_in_a_step_entry_is_refused_naming_the_step():
    data = {"name": "plate", "orientation": UNIT, "position": [1, 2, 3]}
    assert words(ChainStep.from_dict, data).startswith("step ('plate'): position: expected {\"metres\"")


# --- the stored quaternion ---------------------------------------------------------------------------

@pytest.mark.parametrize("norm", [1 + 0.9e-6, 1 - 0.9e-6])
def test_a_stored_quaternion_within_1e_minus_6_of_unit_is_taken(norm):
    step = ChainStep.from_dict({"name": "p", "orientation": {"quaternion_wxyz": [norm, 0.0, 0.0, 0.0]}})
    assert step.orientation == Orientation.identity()


@pytest.mark.parametrize("norm", [1 + 1.1e-6, 1 - 1.1e-6])
def test_a_stored_quaternion_beyond_1e_minus_6_of_unit_is_refused(norm):
    message = words(ChainStep.from_dict, {"name": "p", "orientation": {"quaternion_wxyz": [0, norm, 0, 0]}})
    assert message == (f"step ('p'): quaternion_wxyz: expected a unit quaternion, its norm is {norm:.9g} "
                       "(the file may be damaged; limit 1 ± 1e-06)")


def test_a_huge_stored_quaternion_is_refused_with_its_norm_and_not_overflowed():
    # The norm of (1e308, 1e308, 0, 0) is √2·1e308 (worked by hand), beyond a double if squared directly.
    message = words(ChainStep.from_dict, {"name": "p", "orientation": {"quaternion_wxyz": [1e308, 1e308, 0, 0]}})
    assert "its norm is 1.41421356e+308" in message


@pytest.mark.parametrize("value", [True, "1 0 0 0", 1.0, [1, 0, 0, True], [1, 0, 0, "0"], [[1, 0, 0, 0]]])
def test_a_stored_quaternion_that_is_not_a_list_of_numbers_is_refused(value):
    message = words(ChainStep.from_dict, {"name": "p", "orientation": {"quaternion_wxyz": value}})
    assert message == f"step ('p'): quaternion_wxyz: expected a list of 4 numbers, got {value!r}"


def test_a_stored_quaternion_of_zero_length_is_refused():
    message = words(ChainStep.from_dict, {"name": "p", "orientation": {"quaternion_wxyz": [0, 0, 0, 0]}})
    assert message == "step ('p'): quaternion of zero length; expected a unit (w, x, y, z)"


def test_a_stored_quaternion_as_a_tuple_is_read_like_a_list():
    step = ChainStep.from_dict({"name": "p", "orientation": {"quaternion_wxyz": (0.0, 0.0, 0.0, 1.0)}})
    assert step.orientation == Orientation.from_axis_angle([0, 0, 1], 180)


# --- the chain ---------------------------------------------------------------------------------------

def test_a_chain_of_something_other_than_steps_is_refused_naming_the_place():
    assert words(Chain, (ChainStep("a", RZ90), "b"), kind=InvalidInputError) == \
        "chain step 1: expected a ChainStep, got str"
    assert words(Chain, (), 5, kind=InvalidInputError) == "chain name: expected text, got 5"


def test_a_chain_keeps_its_steps_as_a_tuple():
    chain = Chain([ChainStep("a", RZ90)])
    assert isinstance(chain.steps, tuple) and len(chain) == 1


def test_positions_reaching_exactly_1e6_m_are_taken_and_just_beyond_refused():
    # 3-4-5: (3e5, 4e5, 0) m is 5e5 m from its parent (worked by hand); two of them reach 1e6 m exactly.
    half = Position((3e5, 4e5, 0.0), "m")
    Chain((ChainStep("a", RZ90, position=half), ChainStep("b", RZ90, position=half)))
    beyond = Position((3e5, 4e5, 1.0), "m")
    message = words(Chain, (ChainStep("a", RZ90, position=half), ChainStep("b", RZ90, position=beyond)),
                    name="mast", kind=InvalidInputError)
    assert message == ("chain 'mast': its steps' positions add up to 1e+06 m, farther than 1e+06 m from the "
                       "reference; expected mounting distances")


def test_a_disabled_step_s_position_counts_toward_the_reach():
    # It can be enabled again at any time, so the chain is refused as a whole.
    far = Position((6e5, 0.0, 0.0), "m")
    with pytest.raises(InvalidInputError, match="add up to 1.2e"):
        Chain((ChainStep("a", RZ90, position=far), ChainStep("b", RZ90, enabled=False, position=far)))


def test_the_position_unit_is_that_of_the_first_enabled_step_with_a_position():
    steps = (ChainStep("off", RZ90, enabled=False, position=Position((0.0, 0.0, 1.0), "in")),
             ChainStep("bare", RZ90),
             ChainStep("placed", RX90, position=Position((0.0, 0.0, 1.0), "thou")),
             ChainStep("later", RX90, position=Position((0.0, 0.0, 1.0), "m")))
    chain = Chain(steps)
    assert chain.position_unit() == "thou" and chain.has_position()
    assert Chain(steps[:2]).position_unit() == "mm" and not Chain(steps[:2]).has_position()
    frames = chain.frames()
    assert [f.index for f in frames] == [1, 2, 3]
    assert frames[0].position is None
    assert frames[1].position.unit == "thou"
    # Worked by hand: Rz(90) takes the plate's (0, 0, 1) m along Z to itself.
    np.testing.assert_allclose(frames[1].position.metres, (0.0, 0.0, 1.0), atol=1e-15)


def test_a_chain_with_every_step_disabled_is_the_identity_without_a_position():
    chain = Chain((ChainStep("a", RZ90, enabled=False, position=Position((1.0, 0.0, 0.0))),))
    assert chain.frames() == ()
    assert chain.pose_product() == (Orientation.identity(), None)
    orientation, position = Chain((ChainStep("a", RZ90, position=Position((1.0, 0.0, 0.0))),)).pose_product()
    assert orientation == RZ90 and position == Position((1.0, 0.0, 0.0))


# --- edits -------------------------------------------------------------------------------------------

def three():
    return Chain(tuple(ChainStep(n, RZ90) for n in ("a", "b", "c")), name="mast")


def names(chain):
    return [s.name for s in chain.steps]


def test_a_step_moves_to_the_index_given_both_ways():
    assert names(three().moved(0, 2)) == ["b", "c", "a"]
    assert names(three().moved(2, 0)) == ["c", "a", "b"]
    assert names(three().moved(1, 1)) == ["a", "b", "c"]
    assert words(three().moved, 0, 3, kind=InvalidInputError) == \
        "no step at index 3; the chain has 3 step(s), expected an index from 0 to 2"


def test_a_step_is_replaced_in_place_and_inserted_at_the_end_by_default():
    new = ChainStep("new", RX90)
    assert names(three().with_step_replaced(1, new)) == ["a", "new", "c"]
    assert names(three().with_step(new)) == ["a", "b", "c", "new"]
    assert names(three().without_step(0)) == ["b", "c"]
    assert three().with_step(new).name == "mast"


def test_a_reorder_that_is_not_a_permutation_is_refused_in_words():
    assert words(three().reordered, (0, 1), kind=InvalidInputError) == \
        "reorder: (0, 1) is not a permutation of 0..2; expected each step index exactly once"
    assert names(three().reordered([2, 0, 1])) == ["c", "a", "b"]


def test_an_explicit_inverted_flag_sets_and_does_not_toggle():
    chain = three().with_inverted(1, True)
    assert chain.with_inverted(1, True).steps[1].inverted is True
    assert chain.with_inverted(1, False).steps[1].inverted is False
    assert [s.inverted for s in chain.with_inverted(1).steps] == [False, False, False]


# --- a chain read from a file ------------------------------------------------------------------------

@pytest.mark.parametrize("data, kind", [([], "list"), ("mast", "str")])
def test_a_chain_entry_that_is_not_an_object_is_refused(data, kind):
    assert words(Chain.from_dict, data) == f"chain: expected a JSON object, got {kind}"


def test_a_chain_entry_whose_steps_are_not_a_list_is_refused():
    assert words(Chain.from_dict, {"steps": {"a": 1}}) == "chain: 'steps' must be a list, got dict"


def test_an_empty_chain_entry_reads_as_an_empty_chain_named_chain():
    assert Chain.from_dict({}) == Chain((), "chain")
    assert Chain().to_dict() == {"name": "chain", "steps": []}


def test_a_damaged_step_in_a_chain_entry_is_named_by_chain_and_place():
    data = {"name": "mast", "steps": [{"name": "a", "orientation": UNIT}, {"name": "b", "orientation": [1]}]}
    assert words(Chain.from_dict, data) == \
        "chain 'mast' step 1: orientation must be {\"quaternion_wxyz\": [w, x, y, z]}, got [1]"


def test_a_chain_entry_reads_back_its_name_and_steps():
    chain = Chain((ChainStep("a", RZ90, inverted=True), ChainStep("b", RX90, enabled=False)), name="mast")
    assert Chain.from_dict(chain.to_dict()) == chain


@pytest.mark.parametrize("value, expected", [
    ([1.0, 0.0, 0.0], "quaternion_wxyz: expected shape (..., 4), got (3,)"),
    ([], "quaternion_wxyz: expected shape (..., 4), got (0,)"),
    ([1.0, 0.0, float("nan"), 0.0], "quaternion_wxyz: contains NaN or infinity; expected finite numbers")])
def test_a_stored_quaternion_of_the_wrong_length_or_not_finite_is_refused_by_its_key(value, expected):
    message = words(ChainStep.from_dict, {"name": "p", "orientation": {"quaternion_wxyz": value}})
    assert message == f"step ('p'): {expected}"
