"""One CSV cell made safe to open in a spreadsheet: text that a spreadsheet would run as a formula is
prefixed by a single quote, and numbers stay numbers.

Following the OWASP guidance on CSV injection (owasp.org/www-community/attacks/CSV_Injection): a cell
that begins with '=', '+', '-', '@', a tab or a carriage return may be read as a formula (=HYPERLINK(…),
@SUM(…), =cmd|…), so it is written with a leading "'" which shows the text as it is. A cell that is a
plain decimal number (-0.5, +1e-3) is data, not a formula, and is left alone.
"""

from __future__ import annotations

import re

_FORMULA_START = ("=", "+", "-", "@", "\t", "\r")
_PLAIN_NUMBER = re.compile(r"[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?")


def spreadsheet_safe(cell) -> str:
    """The cell's text, with a leading "'" when a spreadsheet would take it for a formula."""
    text = str(cell)
    if text.startswith(_FORMULA_START) and not _PLAIN_NUMBER.fullmatch(text):
        return "'" + text
    return text
