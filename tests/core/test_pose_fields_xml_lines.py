"""XML attributes (core/decode/pose_fields.py) keep the line their tag is on: a description file's
refusal names that line, counted from the start of the text. Refusal words are the decoder's own;
the description files are invented."""

import pytest

from core.decode import DecodeError, decode


@pytest.mark.parametrize("before, line", [("", 1), ("<robot>\n", 2), ("<robot>\n<joint name='j'>\n\n", 4)])
def test_a_bad_origin_is_refused_at_the_line_of_its_tag(before, line):
    with pytest.raises(DecodeError, match=rf"^line {line}: rpy holds 2 numbers; it needs roll, pitch and yaw"):
        decode(f'{before}<origin xyz="0 0 0" rpy="0 0"/>')


def test_an_origin_line_counts_the_lines_of_the_tags_before_it():
    text = '<robot>\n<joint name="j" type="fixed">\n<parent link="a"/>\n<origin xyz="0 0" rpy="0 0 0"/>\n</joint>'
    with pytest.raises(DecodeError, match=r"^line 4: a translation needs 3 numbers \(x, y, z\); found 2"):
        decode(text)


def test_a_keyed_translation_of_two_numbers_is_refused_in_full():
    with pytest.raises(DecodeError, match=r"^line 2: a translation needs 3 numbers \(x, y, z\); found 2$"):
        decode("cam:\n  translation: [1, 2]\n  rpy: [0, 0, 0]")
