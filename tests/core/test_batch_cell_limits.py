"""A batch row's cells at their limits from both sides (1,000 characters for a name and for a number),
and the problem text word for word: where (line, row, mount name cut to 80 characters), which column,
what is wrong. The numbers are our own invented rows."""

import pytest

from core.batch import read_mounts

HEADER = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz"


def _problems(*rows):
    table = read_mounts(HEADER + "\n" + "\n".join(rows) + "\n")
    return table, [(p.line, p.column, p.message) for p in table.problems]


def test_a_name_of_1000_characters_is_kept_and_one_of_1001_is_a_problem_named_in_its_column():
    # The limits are applied where rows are read one by one, as when another row is in error.
    table, problems = _problems("n" * 1000 + ",1,0,0,0,1,0,0,0", "b,1,0,0,0,x,0,0,0")
    assert [p[0] for p in problems] == [3] and table.names == ("n" * 1000, "b")
    _, problems = _problems("n" * 1001 + ",1,0,0,0,1,0,0,0")
    assert problems == [(2, "name", f"line 2 (row 1, mount '{'n' * 80}'), column 'name': the name is 1,001 "
                                    f"characters long; expected at most 1,000")]


def test_a_number_of_1000_characters_is_read_and_one_of_1001_is_a_problem():
    number = "0." + "0" * 997 + "1"                              # 1,000 characters, 1e-998 (finite)
    assert len(number) == 1000
    assert _problems(f"a,1,0,0,0,1,{number},0,0", "b,1,0,0,0,x,0,0,0")[1][0][0] == 3
    _, problems = _problems(f"a,1,0,0,0,1,{number}0,0,0", "b,1,0,0,0,x,0,0,0")
    assert problems[:1] == [(2, "measured_qx", "line 2 (row 1, mount 'a'), column 'measured_qx': the cell is 1,001 "
                                           "characters long; expected a number")]


@pytest.mark.parametrize("cell, says", [
    ("1_0", "'1_0' is not a finite decimal number; expected e.g. -0.25"),
    (" ", "is empty; expected a number")])
def test_a_cell_problem_word_for_word(cell, says):
    _, problems = _problems(f"a,1,0,0,0,{cell},0,0,0")
    assert problems == [(2, "measured_qw", f"line 2 (row 1, mount 'a'), column 'measured_qw': {says}")]


def test_the_names_are_kept_in_order_around_an_error_row():
    table, problems = _problems("a,1,0,0,0,1,0,0,0", "b,1,0,0,0,x,0,0,0", "c,1,0,0,0,1,0,0,0")
    assert table.names == ("a", "b", "c")
    assert [p[0] for p in problems] == [3]


def test_the_1000_character_limit_on_a_number_holds_when_every_other_row_is_clean():
    """The limit is the file's, not only the careful reader's: a clean file (read by numpy's fast reader)
    refuses a 1,001-character number cell as a file with an error row does, and keeps one of 1,000."""
    number = "0." + "0" * 997 + "1"                              # 1,000 characters, 1e-998 (finite)
    table, problems = _problems(f"a,1,0,0,0,1,{number},0,0", "b,1,0,0,0,1,0,0,0")
    assert problems == [] and table.names == ("a", "b")
    table, problems = _problems(f"a,1,0,0,0,1,{number}0,0,0", "b,1,0,0,0,1,0,0,0")
    assert problems == [(2, "measured_qx", "line 2 (row 1, mount 'a'), column 'measured_qx': the cell is 1,001 "
                                           "characters long; expected a number")]
    assert table.names == ("a", "b")
    padded = " " * 1000 + "1"                                    # spaces count too: 1,001 characters
    _, problems = _problems("a,1,0,0,0,1,0,0,0", f"b,1,0,0,0,{padded},0,0,0")
    assert [(p[0], p[1]) for p in problems] == [(3, "measured_qw")]
