"""Mount chain edits the user makes one at a time (rename, toggle a step on and off, insert at the body
end) and the refusal of step indices that are not whole numbers in range, with the words a user reads.

Check values: hand-worked compositions of quarter turns about the reference axes (worked by hand below)."""

import numpy as np
import pytest

from core import InvalidInputError, Orientation
from core.chain import Chain, ChainStep

# Worked by hand: Rz(90) = [[0,-1,0],[1,0,0],[0,0,1]], Rx(90) = [[1,0,0],[0,0,-1],[0,1,0]].
RZ90 = np.array([[0.0, -1.0, 0.0], [1.0, 0.0, 0.0], [0.0, 0.0, 1.0]])
RX90 = np.array([[1.0, 0.0, 0.0], [0.0, 0.0, -1.0], [0.0, 1.0, 0.0]])


def _two_steps():
    return Chain((ChainStep("bracket", Orientation.from_axis_angle([0, 0, 1], 90)),
                  ChainStep("plate", Orientation.from_axis_angle([1, 0, 0], 90))), name="sensor mast")


def test_renaming_a_chain_keeps_its_steps_and_leaves_the_original_alone():
    chain = _two_steps()
    renamed = chain.renamed("camera arm")
    assert renamed.name == "camera arm" and chain.name == "sensor mast"
    assert renamed.steps == chain.steps


def test_toggling_a_step_turns_it_off_then_on_again():
    chain = _two_steps()
    off = chain.with_enabled(1)                       # toggled: the plate was on
    assert off.steps[1].enabled is False and chain.steps[1].enabled is True
    np.testing.assert_allclose(off.product().as_matrix(), RZ90, atol=1e-15)   # only the bracket counts
    on = off.with_enabled(1)
    assert on.steps[1].enabled is True
    np.testing.assert_allclose(on.product().as_matrix(), RZ90 @ RX90, atol=1e-15)
    # an explicit flag sets, not toggles
    assert chain.with_enabled(0, True).steps[0].enabled is True
    assert chain.with_enabled(0, False).with_enabled(0, False).steps[0].enabled is False


def test_a_step_can_be_inserted_at_the_body_end_index_but_not_past_it():
    chain = _two_steps()
    extra = ChainStep("lens", Orientation.identity())
    at_end = chain.with_step(extra, at=2)             # index len(steps): the body end
    assert [s.name for s in at_end.steps] == ["bracket", "plate", "lens"]
    at_start = chain.with_step(extra, at=0)
    assert [s.name for s in at_start.steps] == ["lens", "bracket", "plate"]
    with pytest.raises(InvalidInputError, match=r"no step at index 3.*from 0 to 2"):
        chain.with_step(extra, at=3)
    with pytest.raises(InvalidInputError, match=r"no step at index -1"):
        chain.with_step(extra, at=-1)


@pytest.mark.parametrize("index", [True, False, 1.0, "1", None])
def test_an_index_that_is_not_a_whole_number_is_refused_with_a_clear_message(index):
    chain = _two_steps()
    with pytest.raises(InvalidInputError, match=r"no step at index .*the chain has 2 step\(s\), expected an "
                                                r"index from 0 to 1"):
        chain.without_step(index)
    with pytest.raises(InvalidInputError, match=r"no step at index"):
        chain.with_enabled(index)


def test_the_last_step_index_is_accepted_and_one_past_it_refused():
    chain = _two_steps()
    assert [s.name for s in chain.without_step(1).steps] == ["bracket"]
    with pytest.raises(InvalidInputError, match=r"no step at index 2; the chain has 2 step\(s\)"):
        chain.without_step(2)
