"""Batch text as people write it: a Unicode minus, an en dash and a no-break space in number cells; a
row with a cell missing named with its line; the line length limit from both sides; conventions passed
in for a header that states none. Check values: q and −q are one rotation (common practice), so
(−0.8, 0, −0.6, 0) is read as (0.8, 0, 0.6, 0); a nominal 90° yaw measured as the identity is a 90° deviation
about −Z, Nᵀ M (hand-worked)."""

import pytest

from core.batch import read_mounts, run_batch
from core.batch_cells import MAX_LINE_CHARS
from core.batch_header import BatchFileError, SetConventions

HEADER = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz"


def test_unicode_minus_en_dash_and_no_break_space_read_as_in_plain_ascii():
    table = read_mounts(f"{HEADER}\na,1,0,0,0,\u22120.8,0,\u20130.6,\u00a00\n")
    assert table.problems == ()
    assert table.measured.tolist() == [[0.8, 0.0, 0.6, 0.0]]


def test_a_row_with_a_cell_missing_is_named_with_its_line_and_the_count():
    table = read_mounts(f"{HEADER}\na,1,0,0,0,1,0,0,0\nb,1,0,0,0,1,0,0\n")
    assert [(p.line, p.message) for p in table.problems] == [
        (3, "line 3 (row 2, mount 'b') has 8 cells; expected 9 as in the header")]


def test_a_line_of_the_longest_length_is_read_and_one_character_more_is_refused():
    start = "a,1,0,0,0,1,0,0,"
    # at the line limit the file is read; the one cell that long is the row's problem (over 1,000 characters)
    longest = read_mounts(f"{HEADER}\n{start}{'0' * (MAX_LINE_CHARS - len(start))}\n")
    assert [(p.line, p.column) for p in longest.problems] == [(2, "measured_qz")]
    assert longest.names == ("a",)
    with pytest.raises(BatchFileError) as raised:
        read_mounts(f"{HEADER}\n{start}{'0' * (MAX_LINE_CHARS + 1 - len(start))}\n")
    assert str(raised.value) == ("line 2, column 'measured_qz': the line is 100,001 characters long; expected at "
                                 "most 100,000")


def test_conventions_passed_in_reach_a_header_that_states_none():
    text = ("name,nominal_angle1,nominal_angle2,nominal_angle3,measured_qw,measured_qx,measured_qy,measured_qz\n"
            "a,90,0,0,1,0,0,0\n")
    result, _ = run_batch(text, nominal=SetConventions(sequence="ZYX", intrinsic=True))
    assert result.total_deg[0] == pytest.approx(90.0)
    assert result.axis[0].tolist() == pytest.approx([0.0, 0.0, -1.0])
