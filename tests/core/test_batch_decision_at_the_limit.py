"""A batch row whose margin lands exactly on the conformance limit U − allowance conforms; the next number
below it cannot be decided. The limit is part of the verdict a user acts on, so both sides are pinned.

Check values are worked by hand from the rule in /work/shared/CONVENTIONS.md (ISO 14253-1: conforms if
d ≤ T − U) and the rounding allowance of core/check.py (ROUNDING_ALLOWANCE_DEG = 1e-9, within a
nanodegree counts as equal). Identical mounts give a deviation of exactly 0, so the margin is the
tolerance itself; U = 2 × 0.05 = 0.1 exactly in binary (doubling is exact)."""

import numpy as np
import pytest

from core.batch import run_batch
from core.check import ROUNDING_ALLOWANCE_DEG, CheckSettings
from core.decision import CANNOT_DECIDE, CONFORMS

HEADER = ("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz,"
          "uncertainty_deg")
SAME_MOUNTS = f"{HEADER}\na,1,0,0,0,1,0,0,0,0.05\n"
LIMIT = 2 * 0.05 - ROUNDING_ALLOWANCE_DEG        # worked by hand: U − allowance, the same float as the code's


def test_a_margin_exactly_on_the_conformance_limit_conforms():
    result, _ = run_batch(SAME_MOUNTS, CheckSettings(total_tolerance_deg=LIMIT))
    assert result.total_deg[0] == 0.0 and result.margin_deg[0] == LIMIT
    assert result.decision == (CONFORMS,)
    assert result.passed.tolist() == [True]


def test_the_next_number_below_the_conformance_limit_cannot_be_decided():
    below = float(np.nextafter(LIMIT, 0.0))
    result, _ = run_batch(SAME_MOUNTS, CheckSettings(total_tolerance_deg=below))
    assert result.decision == (CANNOT_DECIDE,)
    assert result.passed.tolist() == [True]      # within tolerance, but not provably so (T − U < d)


@pytest.mark.parametrize("tolerance, decision", [(LIMIT, CONFORMS), (float(np.nextafter(LIMIT, 0.0)), CANNOT_DECIDE)])
def test_the_limit_holds_row_by_row_among_other_rows(tolerance, decision):
    # the same row twice in one file: the comparison is vectorised, each row gets the same answer
    text = f"{HEADER}\na,1,0,0,0,1,0,0,0,0.05\nb,1,0,0,0,1,0,0,0,0.05\n"
    result, _ = run_batch(text, CheckSettings(total_tolerance_deg=tolerance))
    assert result.decision == (decision, decision)
