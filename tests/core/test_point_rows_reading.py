"""Point-pair CSV read in-process: nominal, measured and weight columns land where they belong (a blank
weight is 1, a file without weights gives none), headers with nested bracketed units are recognised,
and a missing column or an empty table is refused with the words a person needs to fix the file.

Check values: the rows are typed by hand in the tests; the fit of the read pairs is compared with SciPy's
Rotation.align_vectors (a general-purpose reference library)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.fit import fit_points
from core.point_rows import RowsError, header_key, read_point_pairs

HEADER = "name,nominal_x,nominal_y,nominal_z,measured_x,measured_y,measured_z"
ROWS = ["a,1,2,3,10,20,30", "b,4,5,6,40,50,60", "c,7,8,9.5,70,80,95"]


def test_nominal_and_measured_columns_are_kept_apart():
    pairs = read_point_pairs("\n".join([HEADER] + ROWS))
    np.testing.assert_array_equal(pairs.nominal, [[1, 2, 3], [4, 5, 6], [7, 8, 9.5]])
    np.testing.assert_array_equal(pairs.measured, [[10, 20, 30], [40, 50, 60], [70, 80, 95]])
    assert pairs.weights is None
    assert pairs.notes == ("ignored column(s): name",)


def test_weights_are_read_and_a_blank_weight_counts_as_one():
    text = "\n".join([HEADER + ",weight", ROWS[0] + ",2", ROWS[1] + ",", ROWS[2] + ",0.5"])
    pairs = read_point_pairs(text)
    np.testing.assert_array_equal(pairs.weights, [2.0, 1.0, 0.5])
    np.testing.assert_array_equal(pairs.nominal[:, 2], [3, 6, 9.5])


def test_read_pairs_fit_like_scipy():
    rotation = Rotation.from_euler("XYZ", [10, 20, 30], degrees=True)
    nominal = np.array([[0, 0, 0], [100, 0, 0], [0, 50, 0], [0, 0, 25], [30, 40, 10]], dtype=float)
    measured = rotation.apply(nominal) + [5, -6, 7]
    weights = [1, 2, 1, 3, 0.5]
    lines = [HEADER + ",w"] + [f"p{i},{','.join(repr(float(v)) for v in [*n, *m])},{w}"
                               for i, (n, m, w) in enumerate(zip(nominal, measured, weights))]
    pairs = read_point_pairs("\n".join(lines))
    fit = fit_points(pairs.nominal, pairs.measured, pairs.weights)
    # SciPy's weighted fit about the weighted centroids of the same pairs.
    w = np.array(weights)
    p0, q0 = w @ nominal / w.sum(), w @ measured / w.sum()
    reference, _ = Rotation.align_vectors(measured - q0, nominal - p0, weights=w)
    np.testing.assert_allclose(fit.orientation.as_matrix(), reference.as_matrix(), atol=1e-12)
    np.testing.assert_allclose(fit.translation, [5, -6, 7], atol=1e-9)


@pytest.mark.parametrize("cell, key", [
    ("Measured X [mm (metric)]", "measured_x"),       # nested brackets: removed as one part
    ("Nominal Y (a [b] c) [mm]", "nominal_y"),
    ("weight [(1)]", "weight")])
def test_nested_bracketed_units_are_removed_from_headers(cell, key):
    assert header_key(cell) == key


def test_a_header_with_nested_units_reads():
    header = "nominal_x,nominal_y,nominal_z,measured_x,measured_y,Measured Z [mm (metric)]"
    pairs = read_point_pairs("\n".join([header, "1,2,3,4,5,6"] * 1 + ["7,8,9,10,11,12"]))
    np.testing.assert_array_equal(pairs.measured[:, 2], [6, 12])
    assert pairs.notes == ()


def test_a_missing_column_is_named_with_the_headers_it_accepts():
    header = "nominal_x,nominal_y,nominal_z,measured_x,measured_y"
    with pytest.raises(RowsError) as caught:
        read_point_pairs("\n".join([header, "1,2,3,4,5"]))
    assert str(caught.value) == "line 1: no column for Measured z; expected one headed 'measured_z' or 'meas_z'"


def test_a_header_without_rows_is_refused():
    with pytest.raises(RowsError) as caught:
        read_point_pairs(HEADER + "\n\n")
    assert str(caught.value) == "the file has a header but no rows; expected one row per point"
