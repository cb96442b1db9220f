"""The lines a person reads for a point fit: the turn's axis and the translation in x, y, z order, the
worst point and each flagged point numbered from 1 and separated by ", ", the unit named everywhere, and
the notes after the figures.

Check values: the axis (1, 2, 3)/√14 and its 30° turn made with SciPy's Rotation.from_rotvec; the axis
components 0.26726, 0.53452, 0.80178 worked by hand (1/√14, 2/√14, 3/√14). Point sets are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.fit import fit_points

AXIS = np.array([1.0, 2.0, 3.0]) / np.sqrt(14.0)
TURN = Rotation.from_rotvec(AXIS * np.radians(30.0))
RNG = np.random.default_rng(99)
NOMINAL = RNG.uniform(-100, 100, size=(14, 3))
CLEAN = TURN.apply(NOMINAL) + [10.0, 20.0, 30.0]


def test_the_first_line_shows_the_axis_and_the_translation_in_order():
    fit = fit_points(NOMINAL, CLEAN)
    assert fit.summary().splitlines()[0] == ("best fit of 14 points: 30.0000° about [0.26726, 0.53452, 0.80178], "
                                             "translation [10.0000, 20.0000, 30.0000] mm")


def test_two_flagged_points_are_listed_from_one_and_the_unit_is_mm_unless_told():
    measured = CLEAN + RNG.normal(scale=0.01, size=CLEAN.shape)
    measured[2] += [3.0, 0.0, 0.0]
    measured[9] += [0.0, -4.0, 0.0]                  # two points far off (invented)
    fit = fit_points(NOMINAL, measured)
    assert fit.flagged == (2, 9) and fit.worst_index == 9
    lines = fit.summary().splitlines()
    assert lines[1] == f"RMS residual {fit.rms:.4g} mm; worst point 10 at {fit.distances[9]:.4g} mm"
    assert lines[2] == f"flagged (residual above {fit.flag_threshold:.4g} mm): point(s) 3, 10"
    assert len(lines) == 3


def test_the_notes_follow_the_figures_each_on_its_own_line():
    fit = fit_points(NOMINAL[:4], CLEAN[:4])
    lines = fit.summary("in").splitlines()
    assert len(lines) == 3 and lines[0].endswith(" in") and lines[1].endswith(" in")
    assert lines[2] == fit.notes[0] == ("with 4 points no point is flagged: the fit absorbs a single bad point "
                                        "(at least 5 are needed)")


@pytest.mark.parametrize("unit", ["m", "thou"])
def test_the_unit_given_is_named_on_every_figure(unit):
    text = fit_points(NOMINAL, CLEAN).summary(unit)
    assert text.count(f" {unit}") == 3 and " mm" not in text
