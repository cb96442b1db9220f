"""What a name and a piece of free text may hold in a session (mounts, faces, chains, steps, checks, notes,
the description), and why a value is not one. Numpy-free; never imports Qt."""

from __future__ import annotations

import re
from typing import Any

MAX_NAME_CHARS = 500

# Names (mounts, faces, chains, steps, checks) are one line of plain text: no control characters (C0, DEL,
# C1) and no line or paragraph separators. Free text (notes, description) may hold tabs and line breaks.
# Neither may hold a lone surrogate, which is not Unicode text and cannot be written in UTF-8.
_NOT_IN_NAME = re.compile("[\x00-\x1f\x7f-\x9f\u2028\u2029\ud800-\udfff]")
_NOT_IN_TEXT = re.compile("[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f\ud800-\udfff]")


def _character_problem(found: re.Match, what: str) -> str:
    char = found.group()
    kind = "a lone surrogate (not valid Unicode text)" if "\ud800" <= char <= "\udfff" else "a control character"
    return f"{what} holds {kind} U+{ord(char):04X} at character {found.start() + 1}; expected plain text"


def kind_of(value: Any) -> str:
    """A JSON value's kind in words, for a refusal."""
    if value is None:
        return "null"
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return "a number"
    if isinstance(value, str):
        return "text"
    if isinstance(value, list):
        return "a list"
    if isinstance(value, dict):
        return "an object"
    return type(value).__name__


def name_problem(value, empty_ok: bool = False) -> str | None:
    """Why `value` is not a valid name (None when it is): text, one line, printable, not too long."""
    if not isinstance(value, str):
        return f"expected a name (text), got {kind_of(value)}"
    if not empty_ok and not value.strip():
        return "expected a non-empty name"
    if len(value) > MAX_NAME_CHARS:
        return f"a name of {len(value):,} characters; expected at most {MAX_NAME_CHARS}"
    found = _NOT_IN_NAME.search(value)
    return None if found is None else _character_problem(found, "the name")


def free_text_problem(value) -> str | None:
    """Why `value` is not valid free text (notes, description); None when it is."""
    if not isinstance(value, str):
        return f"expected text, got {kind_of(value)}"
    found = _NOT_IN_TEXT.search(value)
    return None if found is None else _character_problem(found, "the text")

