"""Small behaviours pinned exactly: the CSV header names a point table accepts for each coordinate; a
stored position whose metres are text; the refusal of an unknown representation kind; and the threshold
below which swing and twist leave the twist out (a half turn about a line in the mounting face).

Check values: the header names and refusal words are the project's own; the twist at the threshold is
worked by hand (a half turn about x against a normal tilted 1e-15 towards x)."""

import numpy as np
import pytest

from core import Orientation
from core.errors import FramewrightError
from core.point_rows import POINT_COLUMNS, _coordinate_columns
from core.position import Position
from core.representations import by_kind
from core.shims import swing_and_twist


def test_each_coordinate_column_accepts_the_long_names_and_the_one_letter_short_names():
    columns = _coordinate_columns("Nominal", "Nominal point", ("nominal", "nom", "n"))
    assert [c.keys for c in columns] == [("nominal_x", "nom_x", "n_x", "nx"), ("nominal_y", "nom_y", "n_y", "ny"),
                                         ("nominal_z", "nom_z", "n_z", "nz")]
    assert [c.title for c in columns] == ["Nominal x", "Nominal y", "Nominal z"]
    assert POINT_COLUMNS[3].keys == ("measured_x", "meas_x", "m_x", "mx")


@pytest.mark.parametrize("metres", ["123", "abc"])
def test_a_stored_position_whose_metres_are_text_is_refused_as_not_three_numbers(metres):
    with pytest.raises(FramewrightError) as caught:
        Position.from_dict({"metres": metres})
    assert str(caught.value) == "position: expected three numbers (x, y, z)"


def test_an_unknown_representation_kind_is_refused_listing_the_kinds():
    with pytest.raises(FramewrightError) as caught:
        by_kind("bogus")
    assert str(caught.value) == ("unknown representation 'bogus'; expected one of matrix, quaternion, axis-angle, "
                                 "rotation-vector, angles, gibbs, mrp")


def test_the_twist_is_kept_at_the_threshold_and_left_out_below_it():
    # A half turn about x, against a face normal tilted 1e-15 towards x: the part along the normal is
    # exactly 1e-15 (1 · 1e-15 in doubles), the threshold, so the twist is kept: a half turn about the
    # normal itself (worked by hand: twist = (0, n) with n the unit normal). Tilted 5e-16, it is below the
    # threshold and left out.
    half_turn_about_x = Orientation.from_quaternion([0.0, 1.0, 0.0, 0.0])
    _, twist = swing_and_twist(half_turn_about_x, (1e-15, 0, 1))
    # (the canonical spelling drops the 1e-15 left in x as rounding dust of a half turn, CONVENTIONS.md)
    assert np.allclose(twist.quaternion, [0.0, 0.0, 0.0, 1.0], rtol=0, atol=1e-14)
    _, none = swing_and_twist(half_turn_about_x, (5e-16, 0, 1))
    assert np.array_equal(none.quaternion, [1.0, 0, 0, 0])
