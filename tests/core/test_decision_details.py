"""The decision's words, its refusals at each input's limit (both sides), and the coverage factor carried
through a check's lines. The zones follow ISO 14253-1 as the module states it: conforms when d <= T - U,
does not conform when d > T + U, cannot decide between; the numbers are hand-worked cases of our own."""

from types import SimpleNamespace

import pytest

from core.check import Criterion
from core.decision import (CANNOT_DECIDE, CONFORMS, DOES_NOT_CONFORM, check_lines, decide, decide_check,
                           overall_outcome)
from core.errors import InvalidInputError


def _result(value_deg, tolerance_deg=1.0):
    criteria = (Criterion("total deviation", value_deg, tolerance_deg),)
    return SimpleNamespace(criteria=criteria, passed=all(c.passed for c in criteria))


def test_without_an_uncertainty_the_words_say_within_or_outside():
    assert decide(0.5, 1.0).words() == "within the tolerance (no measurement uncertainty was given)"
    assert decide(1.5, 1.0).words() == "outside the tolerance (no measurement uncertainty was given)"


def test_without_an_uncertainty_the_decision_keeps_the_figures_it_was_given():
    decision = decide(0.5, 1.0, coverage=3)
    assert (decision.value_deg, decision.tolerance_deg, decision.coverage) == (0.5, 1.0, 3.0)
    assert decision.standard_uncertainty_deg is None and decision.expanded_deg is None


def test_with_an_uncertainty_the_decision_keeps_it():
    # hand-worked: u = 0.1°, k = 2 -> U = 0.2°
    decision = decide(0.5, 1.0, 0.1)
    assert decision.standard_uncertainty_deg == 0.1
    assert decision.expanded_deg == pytest.approx(0.2)


# Several figures: every one conforms -> conforms; one does not conform -> does not conform; else cannot decide.
@pytest.mark.parametrize("outcomes, overall", [
    ([CONFORMS, CONFORMS], CONFORMS),
    ([CONFORMS, CANNOT_DECIDE], CANNOT_DECIDE),
    ([CONFORMS, DOES_NOT_CONFORM], DOES_NOT_CONFORM),
    ([CONFORMS, CANNOT_DECIDE, DOES_NOT_CONFORM], DOES_NOT_CONFORM)])
def test_the_overall_outcome_of_several_figures(outcomes, overall):
    assert overall_outcome(outcomes) == overall


@pytest.mark.parametrize("outcomes", [[], ["maybe"], [CONFORMS, "maybe"]])
def test_an_empty_or_unknown_outcome_is_refused_by_name(outcomes):
    with pytest.raises(InvalidInputError) as raised:
        overall_outcome(outcomes)
    assert str(raised.value) == "decisions: expected some of conforms, does not conform, cannot decide"


def test_the_coverage_factor_reaches_every_figure_of_a_check():
    # hand-worked: d = 0.85°, T = 1°, u = 0.1°: k = 1 -> T - U = 0.9, conforms; k = 2 -> T - U = 0.8, cannot decide
    decisions, overall = decide_check(_result(0.85), 0.1, coverage=1)
    assert overall == CONFORMS and decisions[0][1].coverage == 1.0
    lines = check_lines(_result(0.85), 0.1, coverage=1)
    assert lines[-1] == "ISO 14253-1 decision: conforms"
    assert check_lines(_result(0.85), 0.1)[-1] == "ISO 14253-1 decision: cannot decide"


def test_the_check_lines_name_the_verdict_and_say_when_there_is_no_uncertainty():
    assert check_lines(_result(0.5)) == [
        "Check verdict: PASS",
        "  total deviation 0.5000 deg against 1.0000 deg: within the tolerance (no measurement uncertainty was given)",
        "ISO 14253-1 decision: none (no measurement uncertainty was given)"]
    assert check_lines(_result(1.5))[0] == "Check verdict: FAIL"


# Each input's upper limit is accepted and a little above it refused, with the input named and the limit said.
@pytest.mark.parametrize("args, words", [
    ((1, 180.5), "tolerance: expected a finite number of 0 or more up to 180, got 180.5"),
    ((1, 1, 180.5), "standard uncertainty: expected a finite number of 0 or more up to 180, got 180.5"),
    ((1, 1, 0.1, 10.5), "coverage factor: expected a finite number of 0 or more up to 10, got 10.5"),
    ((-1, 1), "checked figure: expected a finite number of 0 or more, got -1"),
    (("abc", 1), "checked figure: expected a number, got 'abc'"),
    ((None, 1), "checked figure: expected a number, got None"),
    ((1, 1, 0.1, 0), "coverage factor: expected a number above 0 (usually 2)")])
def test_a_refusal_names_the_input_and_its_limit(args, words):
    with pytest.raises(InvalidInputError) as raised:
        decide(*args)
    assert str(raised.value) == words


def test_each_upper_limit_itself_is_accepted():
    assert decide(1, 180).tolerance_deg == 180
    assert decide(1, 1, 180).standard_uncertainty_deg == 180
    assert decide(1, 1, 0.1, 10).coverage == 10
