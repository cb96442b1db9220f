"""A batch file whose every data row has the wrong number of cells is refused row by row (numpy's fast
reader, asked for some columns only, would not notice an extra cell), and a file with Windows (CR LF) or
old-style (CR) line ends reads as the same lines as one with LF. The rows are our own invented ones."""

import numpy as np

from core.batch import normalise_line_ends, read_mounts

HEADER = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz"


def test_every_row_with_an_extra_cell_is_a_problem_naming_the_counts():
    table = read_mounts(HEADER + "\na,1,0,0,0,1,0,0,0,9\nb,1,0,0,0,1,0,0,0,9\n")
    assert [(p.line, p.message) for p in table.problems] == [
        (2, "line 2 (row 1, mount 'a') has 10 cells; expected 9 as in the header"),
        (3, "line 3 (row 2, mount 'b') has 10 cells; expected 9 as in the header")]


def test_every_row_with_an_extra_quoted_cell_is_a_problem_too():
    table = read_mounts(HEADER + '\n"a",1,0,0,0,1,0,0,0,"x"\n')
    assert [(p.line, p.message) for p in table.problems] == [
        (2, "line 2 (row 1, mount 'a') has 10 cells; expected 9 as in the header")]


def test_rows_of_the_right_length_read_without_problems():
    table = read_mounts(HEADER + "\na,1,0,0,0,1,0,0,0\nb,1,0,0,0,0,1,0,0\n")
    assert tuple(table.problems) == () and table.names == ("a", "b")


def test_crlf_and_bare_cr_become_single_line_ends():
    assert normalise_line_ends("a\r\nb\r\n") == "a\nb\n"
    assert normalise_line_ends("a\rb\r") == "a\nb\n"
    assert normalise_line_ends("a\r\n\r\nb") == "a\n\nb"      # a blank line stays one blank line


def test_a_crlf_file_reports_the_same_line_numbers_as_an_lf_file():
    rows = [HEADER, "a,1,0,0,0,1,0,0,0", "b,1,0,0,0,x,0,0,0"]
    lf = read_mounts("\n".join(rows) + "\n")
    crlf = read_mounts("\r\n".join(rows) + "\r\n")
    assert [(p.line, p.message) for p in crlf.problems] == [(p.line, p.message) for p in lf.problems]
    assert [p.line for p in crlf.problems] == [3]
    assert crlf.names == lf.names == ("a", "b")
