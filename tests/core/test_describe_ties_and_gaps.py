"""Words for where a body axis points when it lies exactly between two reference directions (both are
named, each with its own sign), and the refusal of a matrix with an empty entry."""

import numpy as np
import pytest

from core import describe

# Worked by hand: a turn of -45° about Z, Rz(-45) = [[c, s, 0], [-s, c, 0], [0, 0, 1]] with c = s = √½.
# Body +X lands on (√½, −√½, 0): 45° from reference +X and 45° from reference −Y, a tie.
# Body +Y lands on (√½, √½, 0): 45° from +X and from +Y.
H = np.sqrt(0.5)
RZ_MINUS_45 = np.array([[H, H, 0.0], [-H, H, 0.0], [0.0, 0.0, 1.0]])


def test_a_tie_names_the_other_direction_with_its_own_sign():
    x, y, z = describe.axis_pointing(RZ_MINUS_45)
    assert (x.ref_axis, x.ref_sign, x.also) == (0, 1, ((1, -1),))
    assert x.off_deg == pytest.approx(45.0, abs=1e-12)
    assert (y.ref_axis, y.ref_sign, y.also) == (0, 1, ((1, 1),))
    assert z.also == ()


def test_the_words_for_a_tie_say_minus_y_where_the_axis_leans_negative():
    lines = describe.describe_axes(RZ_MINUS_45)
    assert lines[0].startswith("+X \u2192 +X or \u2212Y (")
    assert "45.0\u00b0 off" in lines[0]
    assert lines[1].startswith("+Y \u2192 +X or +Y (")


def test_a_tie_on_the_negative_side_of_both_directions():
    # Worked by hand: Rz(135°) = [[c, -s, 0], [s, c, 0], [0, 0, 1]] with c = -√½, s = √½:
    # body +X -> (−√½, √½, 0), tied between −X and +Y; body +Y -> (−√½, −√½, 0), tied between −X and −Y.
    m = np.array([[-H, -H, 0.0], [H, -H, 0.0], [0.0, 0.0, 1.0]])
    x, y, _ = describe.axis_pointing(m)
    assert sorted([(x.ref_axis, x.ref_sign), *x.also]) == [(0, -1), (1, 1)]
    assert sorted([(y.ref_axis, y.ref_sign), *y.also]) == [(0, -1), (1, -1)]


def test_a_matrix_with_an_empty_entry_is_refused_with_a_clear_message():
    with pytest.raises(ValueError, match="NaN or infinity"):
        describe.matrix_of([[1, 0, 0], [0, 1, 0], [0, 0, None]])
    with pytest.raises(ValueError, match="NaN or infinity"):
        describe.axis_pointing([[None, 0, 0], [0, 1, 0], [0, 0, 1]])


def test_whole_number_and_text_entries_are_read_as_numbers():
    # the identity written with integers or digits as text is still the identity (common practice)
    np.testing.assert_array_equal(describe.matrix_of([["1", "0", "0"], ["0", "1", "0"], ["0", "0", "1"]]),
                                  np.eye(3))
    assert describe.matrix_of(np.eye(3, dtype=int)).dtype == float
