"""The decision of a check when the measurement has an uncertainty (ISO 14253-1, decision rules for proving
conformity or non-conformity with specifications).

For an upper tolerance T on a figure d ≥ 0 and expanded uncertainty U = k · u (k = 2 unless stated):
conforms when d ≤ T − U; does not conform when d > T + U; otherwise the measurement cannot decide. The
guard band is U wide on each side of T. Without an uncertainty there is no guard band and the decision is
the plain comparison, said to be made without an uncertainty.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core.errors import InvalidInputError

CONFORMS, DOES_NOT_CONFORM, CANNOT_DECIDE = "conforms", "does not conform", "cannot decide"
DEFAULT_COVERAGE = 2.0


@dataclass(frozen=True)
class Decision:
    """outcome: one of CONFORMS, DOES_NOT_CONFORM, CANNOT_DECIDE; expanded_deg: U (None without an
    uncertainty); conformance_limit_deg = T − U and non_conformance_limit_deg = T + U."""
    outcome: str
    value_deg: float
    tolerance_deg: float
    standard_uncertainty_deg: float | None
    coverage: float
    expanded_deg: float | None

    @property
    def conformance_limit_deg(self) -> float:
        return self.tolerance_deg - (self.expanded_deg or 0.0)

    @property
    def non_conformance_limit_deg(self) -> float:
        return self.tolerance_deg + (self.expanded_deg or 0.0)

    def words(self) -> str:
        if self.expanded_deg is None:
            judged = "within the tolerance" if self.outcome == CONFORMS else "outside the tolerance"
            return f"{judged} (no measurement uncertainty was given)"
        if self.outcome == CANNOT_DECIDE:
            return (f"cannot decide within the measurement uncertainty: {self.value_deg:.6g}° lies between "
                    f"{self.conformance_limit_deg:.6g}° and {self.non_conformance_limit_deg:.6g}° "
                    f"(U = {self.expanded_deg:.3g}°, k = {self.coverage:g})")
        return f"{self.outcome} (U = {self.expanded_deg:.3g}°, k = {self.coverage:g})"


def overall_outcome(outcomes) -> str:
    """The decision of a check judged on several figures: it conforms when every figure conforms; one
    figure that does not conform decides; otherwise the measurement cannot decide."""
    outcomes = set(outcomes)
    if not outcomes or not outcomes <= {CONFORMS, DOES_NOT_CONFORM, CANNOT_DECIDE}:
        raise InvalidInputError(f"decisions: expected some of {CONFORMS}, {DOES_NOT_CONFORM}, {CANNOT_DECIDE}")
    if outcomes == {CONFORMS}:
        return CONFORMS
    return DOES_NOT_CONFORM if DOES_NOT_CONFORM in outcomes else CANNOT_DECIDE


def decide_check(result, standard_uncertainty_deg=None, coverage=DEFAULT_COVERAGE, figure_uncertainties_deg=None):
    """([(criterion, Decision)], overall outcome) of a check result (core/check.py): every judged figure
    decided against its tolerance, and the check's decision from them (overall_outcome). Each figure takes
    its own uncertainty from figure_uncertainties_deg (criterion name -> degrees) when given, else the one
    standard uncertainty."""
    def u(criterion):
        if standard_uncertainty_deg is None or figure_uncertainties_deg is None:
            return standard_uncertainty_deg
        if criterion.name not in figure_uncertainties_deg:
            raise InvalidInputError(f"decisions: no propagated uncertainty for the figure '{criterion.name}'")
        return figure_uncertainties_deg[criterion.name]
    decisions = [(c, decide(c.value_deg, c.tolerance_deg, u(c), coverage)) for c in result.criteria]
    return decisions, overall_outcome(d.outcome for _, d in decisions)


def setup_figure_uncertainties(nominal, measured, settings, setup):
    """The figures' own uncertainties (criterion name -> degrees) propagated from the check's covariance
    when its adjustment setup holds one (core/adjustment_setup.py), else None (the one u on every figure)."""
    if setup.uncertainty_deg is None or setup.covariance_deg2 is None:
        return None
    from core.uncertainty import check_figure_uncertainties
    covariance = np.array(setup.covariance_deg2) * (math.pi / 180) ** 2
    return check_figure_uncertainties(nominal, measured, settings, covariance)


def decide_setup(nominal, measured, settings, result, setup):
    """decide_check for a check as saved: its uncertainty and coverage, propagated per figure when it has a
    covariance."""
    return decide_check(result, setup.uncertainty_deg, setup.coverage,
                        setup_figure_uncertainties(nominal, measured, settings, setup))


def check_lines(result, standard_uncertainty_deg=None, coverage=DEFAULT_COVERAGE,
                figure_uncertainties_deg=None) -> list[str]:
    """A check's verdict and, with an uncertainty, its ISO 14253-1 decision, as lines for a report: the
    plain verdict first, then each judged figure against its tolerance with its decision."""
    lines = [f"Check verdict: {'PASS' if result.passed else 'FAIL'}"]
    decisions, overall = decide_check(result, standard_uncertainty_deg, coverage, figure_uncertainties_deg)
    for c, d in decisions:
        lines.append(f"  {c.name} {c.value_deg:.4f} deg against {c.tolerance_deg:.4f} deg: {d.words()}")
    if standard_uncertainty_deg is not None:
        lines.append(f"ISO 14253-1 decision: {overall}")
    else:
        lines.append("ISO 14253-1 decision: none (no measurement uncertainty was given)")
    return lines


def _non_negative(value, what, upper=None) -> float:
    if isinstance(value, bool):
        raise InvalidInputError(f"{what}: expected a number, got {value!r}")
    try:
        number = float(value)
    except (TypeError, ValueError):
        raise InvalidInputError(f"{what}: expected a number, got {value!r}") from None
    if not math.isfinite(number) or number < 0 or (upper is not None and number > upper):
        limit = f" up to {upper:g}" if upper is not None else ""
        raise InvalidInputError(f"{what}: expected a finite number of 0 or more{limit}, got {value!r}")
    return number


def decide(value_deg, tolerance_deg, standard_uncertainty_deg=None, coverage=DEFAULT_COVERAGE) -> Decision:
    """The ISO 14253-1 decision for a figure against an upper tolerance (degrees)."""
    value = _non_negative(value_deg, "checked figure")
    tolerance = _non_negative(tolerance_deg, "tolerance", 180)
    k = _non_negative(coverage, "coverage factor", 10)
    if k == 0:
        raise InvalidInputError("coverage factor: expected a number above 0 (usually 2)")
    if standard_uncertainty_deg is None:
        outcome = CONFORMS if value <= tolerance else DOES_NOT_CONFORM
        return Decision(outcome, value, tolerance, None, k, None)
    u = _non_negative(standard_uncertainty_deg, "standard uncertainty", 180)
    expanded = k * u
    if value <= tolerance - expanded:
        outcome = CONFORMS
    elif value > tolerance + expanded:
        outcome = DOES_NOT_CONFORM
    else:
        outcome = CANNOT_DECIDE
    return Decision(outcome, value, tolerance, u, k, expanded)
