"""A CSV header and one row whose first column is the mount's name ('name,qw,qx,qy,qz' over
'Camera 2,0.7071,0,0,0.7071'), as Copy as writes it: the name is text, never a number to read (its '2'
would otherwise be a fifth number). The column is set aside with a note that quotes it."""

from __future__ import annotations

import csv
import io

NAME_HEADERS = frozenset({"name", "mount", "mount name"})
_MAX_LINE = 2000          # a header and a row are short; anything longer is not this layout


def split_name_column(text: str) -> tuple[str, str] | None:
    """(the text without the name column, a note naming it), or None when the text is not a header whose
    first column is a name over exactly one row with as many cells."""
    lines = [line for line in text.replace("\r\n", "\n").replace("\r", "\n").split("\n") if line.strip()]
    if len(lines) != 2 or any(len(line) > _MAX_LINE for line in lines):
        return None
    try:
        header, row = (next(csv.reader(io.StringIO(line))) for line in lines)
    except (csv.Error, StopIteration):
        return None
    if len(header) < 4 or len(header) != len(row) or header[0].strip().lower() not in NAME_HEADERS:
        return None
    name = row[0].strip()
    if name.startswith("'") and name[1:2] in ("=", "+", "-", "@"):
        name = name[1:]            # the quote a spreadsheet-safe copy put before a formula-like name
    rest = "\n".join(",".join(cells[1:]) for cells in (header, row))
    shown = name if len(name) <= 60 else name[:57] + "..."
    return rest, f"column '{header[0].strip()}' is the mount's name ({shown!r}), text and not a number"
