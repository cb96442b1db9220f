"""The name column of a copied CSV row, pinned at its edges (core/decode/name_column.py): which line ends
split the two lines, the 2,000-character line limit from both sides, the header's name words and its least
width of four cells, the note's exact words, the 60-character shortening from both sides, and the single
quote a spreadsheet-safe copy puts before a formula-like name (the OWASP guidance on CSV injection that
core/csv_cells.py follows: '=', '+', '-' and '@' start a formula). Expected texts are the module's own note
words and the cells of the input itself; the orientation read is checked against SciPy's Rotation."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import formats
from core.decode import decode
from core.decode.name_column import split_name_column
from core.errors import DecodeError

HALF = math.sqrt(0.5)
ROW = f"{HALF!r},0,0,{HALF!r}"          # a 90° turn about z, w first (cos 45°, 0, 0, sin 45°)


def note_for(name, column="name"):
    return f"column '{column}' is the mount's name ({name!r}), text and not a number"


@pytest.mark.parametrize("text", [
    f"name,qw,qx,qy,qz\r\nCamera 2,{ROW}",          # Windows line ends
    f"name,qw,qx,qy,qz\rCamera 2,{ROW}",            # old Mac line ends
    f"name,qw,qx,qy,qz\nCamera 2,{ROW}",
    f"\n\nname,qw,qx,qy,qz\r\n \r\n\tCamera 2,{ROW}\r\n\r\n",   # blank lines around and between
])
def test_any_line_end_splits_the_header_from_the_row(text):
    assert split_name_column(text) == (f"qw,qx,qy,qz\n{ROW}", note_for("Camera 2"))


def test_a_line_end_is_only_a_line_end_and_the_cells_beside_it_are_kept_whole():
    # cells that end and start with the same letters on either side of a CRLF are not trimmed
    assert split_name_column("name,w,x,y,zXX\r\nXXL crane,1,0,0,0") == (
        "w,x,y,zXX\n1,0,0,0", note_for("XXL crane"))


@pytest.mark.parametrize("text", [
    f"name,qw,qx,qy,qz\nCamera 2,{ROW}\nCamera 3,{ROW}",        # two rows: a table, not one copied row
    "name,qw,qx,qy,qz",                                          # a header alone
    f"Camera 2,{ROW}",
    "",
    "\r\n\r\n",
])
def test_other_than_one_header_over_one_row_is_not_this_layout(text):
    assert split_name_column(text) is None


def test_three_named_lines_are_refused_as_bare_numbers_without_a_crash():
    # a table of two named rows is not one copied row: its names' digits count, and ten numbers are refused
    text = f"name,qw,qx,qy,qz\nCamera 2,{ROW}\nCamera 3,{ROW}"
    assert split_name_column(text) is None
    with pytest.raises(DecodeError, match=r"found 10 numbers \(line 2: 5, line 3: 5\)"):
        decode(text)


def _lines_of_length(header_length, row_length):
    """A header of four number columns after the name and a row beneath, each padded to the length asked."""
    header = "name,qw,qx,qy,qz"
    header = header[:-2] + "q" * (header_length - len(header)) + "qz"
    row = "n" * (row_length - len(f",{ROW}")) + f",{ROW}"
    assert (len(header), len(row)) == (header_length, row_length)
    return header + "\n" + row


@pytest.mark.parametrize("header_length, row_length", [(2000, 100), (100, 2000), (2000, 2000)])
def test_lines_of_exactly_2000_characters_are_read(header_length, row_length):
    assert split_name_column(_lines_of_length(header_length, row_length)) is not None


@pytest.mark.parametrize("header_length, row_length", [(2001, 100), (100, 2001), (2001, 2001)])
def test_a_line_of_2001_characters_is_not_this_layout(header_length, row_length):
    assert split_name_column(_lines_of_length(header_length, row_length)) is None


@pytest.mark.parametrize("header, column", [
    ("name", "name"), ("NAME", "NAME"), ("Mount", "Mount"), (" Mount Name ", "Mount Name"),
    ("mount name", "mount name"),
])
def test_the_name_words_in_any_case_and_the_note_quotes_the_header_as_written(header, column):
    rest, note = split_name_column(f"{header},qw,qx,qy,qz\nCamera 2,{ROW}")
    assert rest == f"qw,qx,qy,qz\n{ROW}"
    assert note == note_for("Camera 2", column)


@pytest.mark.parametrize("header", ["label", "names", "id", "qw", "mountname", ""])
def test_other_first_columns_are_not_a_name(header):
    assert split_name_column(f"{header},qw,qx,qy,qz\nCamera 2,{ROW}") is None


def test_a_name_column_needs_three_more_cells_and_a_row_as_wide():
    # the smallest useful copy is a name and three numbers (angles, a Gibbs vector, MRPs)
    assert split_name_column("name,yaw,pitch,roll\nMast 7,30,20,10") == (
        "yaw,pitch,roll\n30,20,10", note_for("Mast 7"))
    assert split_name_column("name,a,b\nMast 7,30,20") is None
    assert split_name_column("name,a\nMast 7,30") is None
    assert split_name_column("name,yaw,pitch,roll\nMast 7,30,20") is None         # the row is short
    assert split_name_column("name,yaw,pitch,roll\nMast 7,30,20,10,0") is None    # the row is long


def test_the_name_is_the_first_cell_of_the_row_stripped():
    assert split_name_column(f"name,qw,qx,qy,qz\n  Camera 2  ,{ROW}")[1] == note_for("Camera 2")


@pytest.mark.parametrize("length, shown", [
    (59, "n" * 59), (60, "n" * 60), (61, "n" * 57 + "..."), (200, "n" * 57 + "..."),
])
def test_a_name_over_60_characters_is_shortened_to_57_and_three_dots(length, shown):
    assert split_name_column(f"name,qw,qx,qy,qz\n{'n' * length},{ROW}")[1] == note_for(shown)


@pytest.mark.parametrize("name", ["=SUM(1,2)", "+44 mast", "-Z camera", "@mount"])
def test_the_quote_a_spreadsheet_safe_copy_adds_before_a_formula_is_taken_off(name):
    text = formats.csv_with_name(name, "qw,qx,qy,qz\n", ROW + "\n")
    assert "'" + name in text                       # the copy neutralised it (core/csv_cells.py)
    assert split_name_column(text) == (f"qw,qx,qy,qz\n{ROW}", note_for(name))


@pytest.mark.parametrize("name", ["'Rover' cam", "'", "''=x", "X-1", "A=B", "C+D", "E@F", "'a-b"])
def test_a_quote_or_formula_mark_anywhere_else_is_part_of_the_name(name):
    rest, note = split_name_column(f"name,qw,qx,qy,qz\n{name},{ROW}")
    assert note == note_for(name)


def test_only_one_quote_is_taken_off():
    assert split_name_column(f"name,qw,qx,qy,qz\n'=x',{ROW}")[1] == note_for("=x'")


def test_decode_reads_the_rest_as_scipy_has_it_and_puts_the_note_first():
    readings = decode(formats.csv_with_name("=Cam 2", "qw,qx,qy,qz\n", ROW + "\n"))
    q = readings[0].orientation.as_quaternion()
    want = Rotation.from_rotvec([0, 0, math.pi / 2]).as_quat(scalar_first=True)   # SciPy's Rotation
    assert np.abs(q - want).max() < 1e-12
    assert readings[0].notes[0] == note_for("=Cam 2")
