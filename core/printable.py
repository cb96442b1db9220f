"""Text from a file or a user, made safe to print on a terminal: control characters (C0, DEL, C1), bidi
overrides and isolates, and lone surrogates become visible escapes such as \\x1b or \\u202e, so a name
can neither move the cursor, erase a line nor reverse the text printed after it. Anything else is kept.
For every verb that prints user-supplied strings (names, notes, file names, messages quoting a cell)."""

from __future__ import annotations

import re

# C0 controls (tab and newline included: a name is one line), DEL and C1; the bidi embeddings,
# overrides, isolates and marks (Unicode Bidirectional Algorithm, UAX #9); lone surrogates.
_UNSAFE = re.compile("[\x00-\x1f\x7f-\x9f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069\ud800-\udfff]")


def _escape(match: re.Match) -> str:
    code = ord(match.group())
    return f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}"


def printable(text) -> str:
    """`text` (any value; str() is taken) with every unsafe character replaced by its visible escape.
    One pass of one character class: linear in the length."""
    return _UNSAFE.sub(_escape, str(text))
