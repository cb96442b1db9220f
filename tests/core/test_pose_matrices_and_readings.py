"""Bare 4x4 and 3x4 transforms (core/decode/pose_matrices.py) and what every pose reading carries
(core/decode/poses.py): the last row's tolerance from both sides, the notes of one-line and column-major
layouts, the unit said in the words, the translation's bound from both sides, the name hint, and the
refusal of a hint that contradicts the format. Rotations are checked against SciPy's Rotation (or worked by
hand); words are the modules' own. All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

_ROWS = "0 -1 0 1\n1 0 0 2\n0 0 1 3\n"        # a quarter turn about Z, t = (1, 2, 3) (worked by hand)


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def test_a_4x4_is_read_as_written_with_its_translation():
    first = decode(_ROWS + "0 0 0 1")[0]
    assert first.label.startswith("4x4 transform: ") and first.translation == (1.0, 2.0, 3.0)
    assert first.why.startswith("a transform's rotation maps the child frame into the parent frame: as written")
    # SciPy: a quarter turn about Z
    assert np.allclose(_matrix(first), Rotation.from_euler("z", 90, degrees=True).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("last", ["0 0 0 1.0004", "0.0004 0 0 1", "0 0 -0.0004 1"])
def test_a_last_row_within_print_precision_is_accepted(last):
    assert decode(_ROWS + last)[0].translation == (1.0, 2.0, 3.0)


@pytest.mark.parametrize("last, shown", [("0 0 0 1.0006", "0 0 0 1.0006"), ("0 0 0.1 1", "0 0 0.1 1"),
                                         ("0 0 0 2", "0 0 0 2")])
def test_a_last_row_beyond_print_precision_is_refused_at_its_line(last, shown):
    with pytest.raises(DecodeError, match=rf"^line 5: the last row of the 4x4 transform is '{shown}', not 0 0 0 1:"
                                          r" it is not a rigid transform \(a projection or a scaled matrix\?\)"):
        decode("pose\n" + _ROWS + last)


@pytest.mark.parametrize("text, note", [
    ("0 -1 0 1 1 0 0 2 0 0 1 3", "12 numbers on one line read as a 3x4 matrix, row after row"),
    ("0 -1 0 1 1 0 0 2 0 0 1 3 0 0 0 1", "16 numbers on one line read as a 4x4 matrix, row after row"),
])
def test_a_transform_on_one_line_says_how_it_was_read(text, note):
    first = decode(text)[0]
    assert note in first.notes and first.translation == (1.0, 2.0, 3.0)
    assert np.allclose(_matrix(first), Rotation.from_euler("z", 90, degrees=True).as_matrix(), atol=1e-12)


def test_a_3x4_in_rows_is_labelled_r_and_t():
    first = decode("0 -1 0 1\n1 0 0 2\n0 0 1 3")[0]
    assert first.label.startswith("3x4 transform [R | t]: ") and not any("one line" in n for n in first.notes)


def test_a_column_major_4x4_written_by_columns_is_transposed():
    first = decode("column-major\n0 1 0 0\n-1 0 0 0\n0 0 1 0\n1 2 3 1")[0]
    assert first.translation == (1.0, 2.0, 3.0)
    assert ("the text says column-major and the line holding 0 0 0 1 is the last column: each written line is a"
            " column") in first.notes
    assert np.allclose(_matrix(first), Rotation.from_euler("z", 90, degrees=True).as_matrix(), atol=1e-12)


def test_a_unit_in_the_words_is_the_translations():
    assert decode("t in mm\n" + _ROWS + "0 0 0 1")[0].translation_unit == "mm"
    assert decode(_ROWS + "0 0 0 1")[0].translation_unit is None


@pytest.mark.parametrize("x", ["1000000000", "-1000000000"])
def test_a_translation_up_to_a_billion_is_kept(x):
    assert decode(f"1 0 0 {x}\n0 1 0 2\n0 0 1 3\n0 0 0 1")[0].translation[0] == float(x)


@pytest.mark.parametrize("x", ["1000000001", "-1e10"])
def test_a_translation_beyond_a_billion_is_refused(x):
    with pytest.raises(DecodeError, match=r"^line 1: the translation -?1e\+(09|10) is not a usable distance"):
        decode(f"1 0 0 {x}\n0 1 0 2\n0 0 1 3\n0 0 0 1")


def test_a_kind_hint_that_contradicts_a_transform_is_refused_in_full():
    with pytest.raises(DecodeError, match=r"^the text is a 4x4 transform, whose kind is 'matrix'; the kind hint says"
                                          r" 'quaternion': drop the hint or check the text$"):
        decode(_ROWS + "0 0 0 1", {"kind": "quaternion"})


_TWO = "a:\n  translation: [1, 2, 3]\n  rpy: [0, 0, 0]\nb:\n  translation: [4, 5, 6]\n  rpy: [0, 0, 1]"


def test_several_transforms_are_counted_and_named_in_a_note():
    readings = decode(_TWO)
    assert "the text holds 2 transforms (a, b)" in readings[0].notes


def test_the_name_hint_picks_a_transform_whatever_its_case():
    readings = decode(_TWO, {"name": " B "})
    assert {r.name for r in readings} == {"b"} and readings[0].translation == (4.0, 5.0, 6.0)
    assert not any(n.startswith("the text holds") for n in readings[0].notes)
    assert np.allclose(_matrix(readings[0]), Rotation.from_euler("xyz", [0, 0, 1]).as_matrix(), atol=1e-12)


def test_a_name_hint_that_names_no_transform_is_refused_listing_the_names():
    with pytest.raises(DecodeError, match=r"^no transform named 'c' in the text \(names found: a, b\)$"):
        decode(_TWO, {"name": "c"})
    with pytest.raises(DecodeError, match=r"^no transform named 'x' in the text \(names found: none\)$"):
        decode(_ROWS + "0 0 0 1 ", {"name": "x"})
