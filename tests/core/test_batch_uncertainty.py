"""Batch files with an uncertainty_deg column: each row decided by ISO 14253-1 (ISO 14253-1:2017,
decision rules for verifying conformity: conforms when the value is within the tolerance reduced by the
expanded uncertainty U = k·u, does not conform when it is beyond the tolerance increased by U, otherwise
no decision). The cases are our own; a deviation is made as a yaw about Z from a yaw of 10°, so the total
deviation is the yaw difference (a rotation about one axis composes by adding angles: common practice)."""

import numpy as np
import pytest

from core.batch import run_batch
from core.check import CheckSettings
from core.decision import CANNOT_DECIDE, CONFORMS, DOES_NOT_CONFORM

HEADER = "name,nominal_yaw[deg],nominal_pitch,nominal_roll,measured_yaw[deg],measured_pitch,measured_roll,uncertainty_deg"


def _file(rows):
    return "\n".join([HEADER] + [f"{name},10,0,0,{10 + float(d)!r},0,0,{float(u)!r}" for name, d, u in rows]) + "\n"


def _decide(rows, tolerance=0.5, coverage=2.0):
    result, text = run_batch(_file(rows), CheckSettings(total_tolerance_deg=tolerance), coverage=coverage)
    return result, text


@pytest.mark.parametrize("deviation, u, outcome", [
    (0.10, 0.05, CONFORMS),           # margin 0.40 >= U 0.10
    (0.39, 0.05, CONFORMS),           # margin 0.11, just above U
    (0.41, 0.05, CANNOT_DECIDE),      # margin 0.09, just below U
    (0.59, 0.05, CANNOT_DECIDE),      # margin -0.09, just above -U
    (0.61, 0.05, DOES_NOT_CONFORM),   # margin -0.11, just below -U
    (0.45, 0.0, CONFORMS),            # no uncertainty: the plain comparison
    (0.55, 0.0, DOES_NOT_CONFORM),
])
def test_each_row_is_decided_by_its_margin_against_the_expanded_uncertainty(deviation, u, outcome):
    result, _ = _decide([("m", deviation, u)])
    assert result.total_deg[0] == pytest.approx(deviation, abs=1e-9)
    assert result.decision == (outcome,)


def test_the_coverage_factor_widens_the_guard_band():
    rows = [("m", 0.35, 0.05)]                    # margin 0.15
    assert _decide(rows, coverage=2.0)[0].decision == (CONFORMS,)        # U = 0.10
    assert _decide(rows, coverage=3.5)[0].decision == (CANNOT_DECIDE,)   # U = 0.175


def test_the_results_file_carries_the_uncertainty_and_the_decision():
    _, text = _decide([("a", 0.1, 0.05), ("b", 0.45, 0.05), ("c", 0.7, 0.05)])
    lines = text.splitlines()
    header = lines[0].split(",")
    assert header[-3:] == ["uncertainty_deg", "decision", "problem"]
    decisions = [line.split(",")[header.index("decision")] for line in lines[1:]]
    assert decisions == [CONFORMS, CANNOT_DECIDE, DOES_NOT_CONFORM]
    assert [float(line.split(",")[header.index("uncertainty_deg")]) for line in lines[1:]] == [0.05] * 3


@pytest.mark.parametrize("bad", ["-0.01", "180.5", "nan", "inf", "abc", ""])
def test_an_unusable_uncertainty_makes_an_error_row_never_a_decision(bad):
    text = HEADER + "\ngood,10,0,0,10.1,0,0,0.05\nbad,10,0,0,10.1,0,0," + bad + "\n"
    result, out = run_batch(text, CheckSettings(total_tolerance_deg=0.5))
    assert result.error_count == 1 and result.problems[0].row == 1
    assert "uncertainty_deg" in result.problems[0].message
    assert result.decision == (CONFORMS, "")
    header = out.splitlines()[0].split(",")
    assert out.splitlines()[2].split(",")[header.index("result")] == "error"


def test_a_file_without_the_column_has_no_decision():
    text = HEADER.rsplit(",", 1)[0] + "\nm,10,0,0,10.1,0,0\n"
    result, out = run_batch(text, CheckSettings(total_tolerance_deg=0.5))
    assert result.decision is None and "decision" not in out.splitlines()[0]


@pytest.mark.parametrize("k", [0.5, 11, float("nan"), True])
def test_a_coverage_factor_outside_1_to_10_is_refused(k):
    from core.errors import InvalidInputError
    with pytest.raises(InvalidInputError, match="coverage"):
        _decide([("m", 0.1, 0.05)], coverage=k)


def test_a_large_file_is_decided_in_one_pass():
    rng = np.random.default_rng(7)
    deviations = rng.uniform(0, 1, 20_000)
    result, _ = _decide([(f"m{i}", d, 0.05) for i, d in enumerate(deviations)])
    margin = 0.5 - result.total_deg
    want = np.where(margin >= 0.1, CONFORMS, np.where(margin < -0.1, DOES_NOT_CONFORM, CANNOT_DECIDE))
    near = np.isclose(np.abs(margin), 0.1, atol=1e-9)      # the rounding allowance decides exact ties
    assert np.array_equal(np.array(result.decision)[~near], want[~near])
