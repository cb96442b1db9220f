"""plain_id: the same plain ASCII id on every collection (see tests/plain_ids.py for why)."""

import pytest

from tests.plain_ids import plain_id


@pytest.mark.parametrize("text, expected", [
    ("π/6", "U+03C0/6"),                       # U+03C0 is GREEK SMALL LETTER PI (the Unicode chart)
    ("yaw: 10\npitch: NaN", "yaw: 10 | pitch: NaN"),
    ("a\r\nb", "a | b"),
    ("C:\\x", "C:U+005Cx"),                    # U+005C is REVERSE SOLIDUS
    ("", "<empty>"),
    ("1 0 0", "1 0 0"),
])
def test_an_id_is_plain_ascii_with_no_backslash(text, expected):
    made = plain_id(text)
    assert made == expected
    assert made.isascii() and "\\" not in made and made.isprintable()
