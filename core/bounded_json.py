"""Read a JSON document from a file within limits, so no file, however damaged or hostile, costs more than
a bounded amount of time and memory or raises anything but BoundedJsonError.

Limits, each with its own message: the file's size (read no further than the cap), UTF-8 text (a leading
byte-order mark is accepted and dropped), nesting depth, and the length of a whole number's digits (Python
refuses to convert very long ones, and nothing we store needs more than a few). After parsing, every value
in the document is checked once: numbers finite and within the range of a double, text valid Unicode
(JSON's \\ud800 escapes can spell a lone surrogate, which no UTF-8 file can hold, so such a document could
be read but never written back). Problems found then are named by their place, e.g. `mounts[3].name`.
"""

from __future__ import annotations

import json
import math
import os
import re
import stat

from core.errors import FramewrightError

MAX_FILE_BYTES = 20 * 1024 * 1024
MAX_DEPTH = 64            # a session nests 7 deep; room for additions, far from any recursion limit
MAX_INT_DIGITS = 400      # beyond a double's range (309 digits) already; Python's own limit is 4300

_IDENTIFIER = re.compile(r"[A-Za-z_][A-Za-z0-9_]*")
_SURROGATE_ESCAPE = re.compile(r"\\u[dD][89a-fA-F][0-9a-fA-F]{2}")
# The first whole number a double cannot hold: halfway between the largest double (2**1024 - 2**971)
# and 2**1024, it rounds (half to even) to 2**1024, so float() of it overflows.
_LARGEST_INT = 2 ** 1024 - 2 ** 970


class BoundedJsonError(FramewrightError):
    """A document that is not read: too large, not UTF-8, not JSON, or past one of the limits."""


def place(parts) -> str:
    """`("mounts", 3, "part", "box_size_mm", 1)` as `mounts[3].part.box_size_mm[1]`."""
    out = ""
    for part in parts:
        if isinstance(part, int):
            out += f"[{part}]"
        elif _IDENTIFIER.fullmatch(part):
            out += f".{part}" if out else part
        else:
            out += f"[{json.dumps(part, ensure_ascii=True)}]"
    return out or "(the top level)"


def _kind(mode: int) -> str:
    if stat.S_ISDIR(mode):
        return "a folder"
    if stat.S_ISFIFO(mode):
        return "a named pipe (FIFO)"
    if stat.S_ISSOCK(mode):
        return "a socket"
    return "a device"


def read_capped(path: str | os.PathLike, max_bytes: int = MAX_FILE_BYTES) -> bytes:
    """The bytes of a regular file, refusing folders, pipes and devices (opened without blocking, so a
    pipe with no writer never hangs us) and files over `max_bytes` (never read past the cap)."""
    try:
        fd = os.open(os.fspath(path), os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_CLOEXEC", 0))
    except OSError as exc:
        raise BoundedJsonError(f"cannot be read ({exc.strerror or exc})") from None
    except ValueError as exc:  # e.g. a NUL character in the name
        raise BoundedJsonError(f"cannot be read ({exc})") from None
    try:
        info = os.fstat(fd)
        if not stat.S_ISREG(info.st_mode):
            raise BoundedJsonError(f"is {_kind(info.st_mode)}, not a file")
        if info.st_size > max_bytes:
            raise BoundedJsonError(f"is {info.st_size:,} bytes, larger than the {max_bytes // (1024 * 1024)} MB "
                                   "a session file may be; it is probably not one")
        chunks, total = [], 0
        while total <= max_bytes:
            chunk = os.read(fd, min(1 << 20, max_bytes + 1 - total))
            if not chunk:
                break
            chunks.append(chunk)
            total += len(chunk)
        if total > max_bytes:   # the file grew while we read it
            raise BoundedJsonError(f"is larger than the {max_bytes // (1024 * 1024)} MB a session file may be")
        return b"".join(chunks)
    except OSError as exc:
        raise BoundedJsonError(f"cannot be read ({exc.strerror or exc})") from None
    finally:
        os.close(fd)


def _whole_number(digits: str) -> int:
    # Checked before converting: converting a long digit string costs time growing with its square.
    if len(digits) > MAX_INT_DIGITS:
        raise BoundedJsonError(f"a whole number of {len(digits):,} digits (at most {MAX_INT_DIGITS} are read); "
                               "the file may be damaged")
    return int(digits)


def parse(raw: bytes, max_depth: int = MAX_DEPTH):
    """The JSON value in `raw` (UTF-8, with or without a byte-order mark), checked as the module says."""
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        raise BoundedJsonError(f"not a text file in UTF-8 (byte {exc.start}); it may be damaged or not a "
                               "session file") from None
    if text.startswith("\ufeff"):
        text = text[1:]      # a byte-order mark, as some editors write: not part of the document
    if not text.strip():
        raise BoundedJsonError("the file is empty")
    try:
        data = json.loads(text, parse_int=_whole_number)
    except BoundedJsonError:
        raise
    except json.JSONDecodeError as exc:
        raise BoundedJsonError(f"damaged JSON at line {exc.lineno}, column {exc.colno}: {exc.msg}") from None
    except RecursionError:
        raise BoundedJsonError(f"nested deeper than {max_depth} levels; the file may be damaged") from None
    except (ValueError, OverflowError, MemoryError) as exc:
        raise BoundedJsonError(f"cannot be read as JSON ({type(exc).__name__}: {exc})"[:300]) from None
    check_values(data, max_depth, may_hold_surrogates=_SURROGATE_ESCAPE.search(text) is not None)
    return data


def _surrogate_at(text: str) -> int | None:
    try:
        text.encode("utf-8")
    except UnicodeEncodeError as exc:
        return exc.start
    return None


def check_values(data, max_depth: int = MAX_DEPTH, may_hold_surrogates: bool = True) -> None:
    """Walk the parsed document once (iteratively: no recursion to exhaust) checking depth, numbers and
    text; the first problem is raised with its place. Leaves are checked where they are met and only
    containers go on the stack (millions of small entries would keep the garbage collector busy)."""
    # Each stack entry: (container, depth, where) with `where` a linked (parent, key) pair, spelled only
    # when there is a problem to report.
    stack = [(data, 1, None)]
    if not isinstance(data, (dict, list, tuple)):
        _check_leaf(data, None, may_hold_surrogates)
        return
    while stack:
        value, depth, where = stack.pop()
        if depth > max_depth:
            raise BoundedJsonError(f"{_spelled(where)}: nested deeper than {max_depth} levels")
        if isinstance(value, dict):
            if may_hold_surrogates:
                for key in value:
                    if _surrogate_at(key) is not None:
                        raise BoundedJsonError(f"{_spelled(where)}: a key {_surrogate_problem(key)}")
            items = value.items()
        else:
            items = enumerate(value)
        for key, item in items:
            if isinstance(item, (dict, list, tuple)):   # tuples: data built in memory, before a save
                stack.append((item, depth + 1, (where, key)))
            elif isinstance(item, str):
                if may_hold_surrogates and _surrogate_at(item) is not None:
                    _check_leaf(item, (where, key), may_hold_surrogates)
            elif isinstance(item, float):
                if not math.isfinite(item):
                    _check_leaf(item, (where, key), may_hold_surrogates)
            elif isinstance(item, int) and not -_LARGEST_INT < item < _LARGEST_INT:
                _check_leaf(item, (where, key), may_hold_surrogates)


def _spelled(where) -> str:
    parts = []
    while where is not None:
        where, key = where
        parts.append(key)
    spelled = place(reversed(parts))
    return spelled if len(spelled) <= 120 else spelled[:100] + f"… ({len(parts)} levels down)"


def _surrogate_problem(text: str) -> str:
    at = _surrogate_at(text)
    return (f"holds a lone surrogate U+{ord(text[at]):04X} at character {at + 1}, which is not valid "
            "Unicode text (the file may be damaged)")


def _check_leaf(value, where, may_hold_surrogates: bool) -> None:
    if isinstance(value, str):
        if may_hold_surrogates and _surrogate_at(value) is not None:
            raise BoundedJsonError(f"{_spelled(where)}: {_surrogate_problem(value)}")
    elif isinstance(value, float):
        if not math.isfinite(value):
            raise BoundedJsonError(f"{_spelled(where)}: {value!r} is not a finite number (JSON has no "
                                   "NaN or infinity; the file may be damaged)")
    elif isinstance(value, int) and not isinstance(value, bool) and not -_LARGEST_INT < value < _LARGEST_INT:
        raise BoundedJsonError(f"{_spelled(where)}: a whole number beyond the range of a double "
                               "(about ±1.8e308)")
