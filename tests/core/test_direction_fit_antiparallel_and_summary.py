"""Two directions measured nearly antiparallel are judged as nearly parallel (the rotation about their
line is just as undetermined), on both sides of the refusal limit and of the weak-pair note; and the
summary a person reads has one line for the rotation and one for the pair.

Check values: the angle between the pair worked by hand (folded: 180° − angle); the rotation from SciPy's
Rotation (a general-purpose reference library)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.direction_fit import fit_directions, triad
from core.fit import FitRefusedError

BODY = [(1.0, 0.0, 0.0), (0.0, 1.0, 0.0)]     # 90° apart


def measured_at(angle_deg):
    """Two reference directions `angle_deg` apart in the XY plane."""
    a = np.radians(angle_deg)
    return [(1.0, 0.0, 0.0), (np.cos(a), np.sin(a), 0.0)]


@pytest.mark.parametrize("solve", [triad, fit_directions])
def test_measured_directions_1_5_degrees_from_antiparallel_are_refused(solve):
    first, second = measured_at(178.5)
    with pytest.raises(FitRefusedError) as caught:
        if solve is triad:
            triad(BODY[0], BODY[1], first, second)
        else:
            fit_directions(BODY, [first, second])
    # By hand: 180° − 178.5° = 1.5°, below the 2° limit.
    assert caught.value.reason == "parallel"
    assert "nearly parallel (1.5° apart, limit 2°)" in str(caught.value)


def test_measured_directions_2_5_degrees_from_antiparallel_are_taken_with_a_note():
    first, second = measured_at(177.5)
    fit = triad(BODY[0], BODY[1], first, second)
    # By hand: 180° − 177.5° = 2.5°, above the 2° limit and below the 15° note; 1 / sin 2.5° = 22.9.
    assert fit.reference_pair_angle_deg == pytest.approx(177.5, abs=1e-9)
    assert any("only 2.5° apart" in note and "magnified about 23 times" in note for note in fit.notes)


@pytest.mark.parametrize("angle, folded", [(170.0, "10"), (165.5, "14.5")])
def test_the_weak_pair_note_folds_the_measured_angle(angle, folded):
    first, second = measured_at(angle)
    fit = triad(BODY[0], BODY[1], first, second)
    # By hand: 180° − 170° = 10° and 180° − 165.5° = 14.5°, both below the 15° note limit.
    notes = [n for n in fit.notes if "apart" in n]
    assert len(notes) == 1 and f"only {folded}° apart" in notes[0]


def test_measured_directions_15_5_degrees_from_antiparallel_get_no_note():
    first, second = measured_at(164.5)
    fit = triad(BODY[0], BODY[1], first, second)
    # By hand: 180° − 164.5° = 15.5°, above the 15° note limit.
    assert not [n for n in fit.notes if "apart" in n]


def test_summary_has_a_rotation_line_and_a_pair_line():
    rotation = Rotation.from_rotvec([0.0, 0.0, 30.0], degrees=True)
    reference = rotation.apply(np.array(BODY))
    fit = triad(BODY[0], BODY[1], reference[0], reference[1])
    # SciPy: the turn is 30° about +Z; the pair stays 90° apart with no mismatch (worked by hand).
    assert fit.summary().splitlines() == [
        "TRIAD: 30.0000° about [0.00000, 0.00000, 1.00000]",
        "directions 90.00° apart (measured 90.00°, mismatch 0.0000°); residuals 0.0000°, 0.0000°"]
