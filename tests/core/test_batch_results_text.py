"""The batch results file: its columns with and without a body axis and an uncertainty column, the
figures against SciPy's Rotation (a reference library), nine decimals by default, error rows with as
many cells as the header, the decision counts, and the coverage factor's range from both sides."""

import csv
import io

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.batch import run_batch
from core.check import CheckSettings
from core.errors import InvalidInputError

HEADER = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz"
ABOUT_Y = (0.8, 0.0, 0.6, 0.0)             # (w, x, y, z), unit: a turn of 2 acos(0.8) about +Y


def _rows(text):
    return list(csv.reader(io.StringIO(text)))


def test_the_figures_of_a_turn_about_y_are_scipys_and_the_pointing_error_of_z_is_the_whole_turn():
    text = f"{HEADER}\na,1,0,0,0,{','.join(map(str, ABOUT_Y))}\n"
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=90,
                             roll_tolerance_deg=1)
    result, out = run_batch(text, settings)
    header, row = _rows(out)
    assert header == ["name", "total_deviation_deg", "deviation_axis_x", "deviation_axis_y", "deviation_axis_z",
                      "pointing_error_deg", "roll_deg", "result", "margin_deg", "problem"]
    reference = Rotation.from_quat(ABOUT_Y, scalar_first=True)
    angle = np.degrees(reference.magnitude())
    figures = dict(zip(header, row))
    assert float(figures["total_deviation_deg"]) == pytest.approx(angle, abs=1e-9)
    np.testing.assert_allclose([float(figures[f"deviation_axis_{c}"]) for c in "xyz"],
                               reference.as_rotvec() / reference.magnitude(), atol=1e-9)
    # A turn about an axis square to +Z swings +Z by the whole turn and does not roll it (hand-worked).
    assert float(figures["pointing_error_deg"]) == pytest.approx(angle, abs=1e-9)
    assert float(figures["roll_deg"]) == 0.0
    assert all(len(cell.split(".")[1]) == 9 for cell in row[1:7])      # nine decimals unless asked


def test_without_a_body_axis_there_are_no_pointing_or_roll_figures():
    result, out = run_batch(f"{HEADER}\na,1,0,0,0,{','.join(map(str, ABOUT_Y))}\n", CheckSettings())
    assert result.pointing_deg is None and result.roll_deg is None
    assert "pointing_error_deg" not in _rows(out)[0] and "roll_deg" not in _rows(out)[0]


@pytest.mark.parametrize("uncertainty", [False, True])
def test_an_error_row_has_as_many_cells_as_the_header_and_its_problem_last(uncertainty):
    head = HEADER + (",uncertainty_deg" if uncertainty else "")
    tail = ",0.01" if uncertainty else ""
    result, out = run_batch(f"{head}\na,1,0,0,0,1,0,0,0{tail}\nb,1,0,0,0,x,0,0,0{tail}\n",
                            CheckSettings(total_tolerance_deg=1))
    header, good, bad = _rows(out)
    assert len(good) == len(bad) == len(header)
    assert bad[header.index("result")] == "error"
    assert bad[-1] == ("line 3 (row 2, mount 'b'), column 'measured_qw': 'x' is not a number; expected a "
                       "decimal number such as -0.25")
    if uncertainty:
        assert result.decision_counts() == {"conforms": 1, "does not conform": 0, "cannot decide": 0}
    else:
        assert result.decision_counts() == {}


@pytest.mark.parametrize("k, accepted", [(1, True), (10, True), (0.99, False), (10.01, False), ("2", False)])
def test_the_coverage_factor_runs_from_1_to_10_inclusive(k, accepted):
    text = f"{HEADER},uncertainty_deg\na,1,0,0,0,1,0,0,0,0.01\n"
    if accepted:
        assert run_batch(text, coverage=k)[0].coverage == k
        return
    with pytest.raises(InvalidInputError) as raised:
        run_batch(text, coverage=k)
    assert str(raised.value) == f"coverage factor: expected a number from 1 to 10 (usually 2), got {k!r}"


def test_a_unit_quaternion_whose_largest_part_is_below_one_is_not_said_to_be_normalised():
    # |(0.8, 0, 0.6, 0)| = 1 exactly (the 3-4-5 right triangle, hand-worked)
    result, _ = run_batch(f"{HEADER}\na,1,0,0,0,{','.join(map(str, ABOUT_Y))}\n")
    assert not any("normalised" in note for note in result.notes)
    result, _ = run_batch(f"{HEADER}\na,1,0,0,0,0.96,0,0.72,0\n")            # length 1.2
    assert any("measured: 1 quaternion(s) normalised" in note for note in result.notes)
