"""Batch verdicts at their edges: a flip that leaves the roll undefined is judged as a roll of 180°
(as core/check.py does), the ISO 14253-1 zones meet at ±U with the nanodegree rounding allowance on the
right side of each, and the result keeps its settings and says when no row is in error.

Check values: SciPy's Rotation gives the turn (a reference library); the rest is hand-worked from the
rules the modules state (ROUNDING_ALLOWANCE_DEG = 1e-9: within a nanodegree counts as equal)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.batch import run_batch, write_results
from core.check import CheckSettings
from core.decision import CANNOT_DECIDE, CONFORMS, DOES_NOT_CONFORM

HEADER = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz"


def test_a_flip_that_leaves_the_roll_undefined_is_judged_as_a_roll_of_180_degrees():
    # A half turn about +X points +Z backwards: pointing error 180°, the roll cannot be told.
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=180,
                             roll_tolerance_deg=1)
    result, _ = run_batch(f"{HEADER}\na,1,0,0,0,0,1,0,0\n", settings)
    assert result.pointing_deg[0] == pytest.approx(180.0)
    assert result.margin_deg[0] == pytest.approx(1.0 - 180.0)      # min(180 − 180, 1 − 180)
    assert not result.passed[0]
    assert result.settings == settings and result.error is None


TURN = (0.9961946980917455, 0.08715574274765817, 0.0, 0.0)          # 10° about +X (cos 5°, sin 5°)


@pytest.mark.parametrize("offset, outcome", [
    (-0.5e-9, CONFORMS),          # margin U − 0.5e-9: within the allowance of U, conforms
    (-2e-9, CANNOT_DECIDE)])      # margin U − 2e-9: below it
def test_the_conformance_limit_takes_the_rounding_allowance_on_the_conforming_side(offset, outcome):
    # identical mounts: total 0, so the margin is the tolerance itself; U = 2 × 0.05 = 0.1
    text = f"{HEADER},uncertainty_deg\na,1,0,0,0,1,0,0,0,0.05\n"
    result, _ = run_batch(text, CheckSettings(total_tolerance_deg=0.1 + offset))
    assert result.decision == (outcome,)


@pytest.mark.parametrize("offset, outcome", [(-0.5e-9, CANNOT_DECIDE), (-2e-9, DOES_NOT_CONFORM)])
def test_the_non_conformance_limit_takes_the_rounding_allowance_on_the_undecided_side(offset, outcome):
    angle = Rotation.from_quat(TURN, scalar_first=True).magnitude() * 180 / 3.141592653589793
    text = f"{HEADER},uncertainty_deg\na,1,0,0,0,{','.join(map(repr, TURN))},0.05\n"
    result, _ = run_batch(text, CheckSettings(total_tolerance_deg=angle - 0.1 + offset))
    assert result.decision == (outcome,)


def test_the_results_are_written_with_nine_decimals_unless_asked_and_no_negative_zero():
    result, _ = run_batch(f"{HEADER},uncertainty_deg\na,1,0,0,0,1,0,0,0,-0\n", CheckSettings(total_tolerance_deg=1))
    row = write_results(result).splitlines()[1].split(",")
    assert row[1:5] == ["0.000000000"] * 4 and row[7] == "0.000000000"
    assert write_results(result, decimals=3).splitlines()[1].split(",")[1] == "0.000"


def test_a_table_built_by_hand_with_a_nan_row_gets_an_error_not_a_verdict():
    """The guard in compute_deviations that text cannot reach (read_mounts refuses such rows first): a
    MountTable made by a caller with NaN in a row it names no problem for."""
    from core.batch import MountTable, compute_deviations, read_mounts
    header = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz"
    read = read_mounts(f"{header}\na,1,0,0,0,1,0,0,0\nb,1,0,0,0,1,0,0,0\n")
    measured = read.measured.copy()
    measured[1] = np.nan
    table = MountTable(read.names, read.nominal, measured, read.sets)
    result = compute_deviations(table)
    assert result.passed.tolist() == [True, False]
    assert [(p.row, p.message) for p in result.problems] == [
        (1, "row 2 (mount 'b'): the deviation could not be computed as a finite number; expected finite, "
            "in-range numbers")]
    assert np.isnan(result.total_deg[1]) and result.total_deg[0] == 0
