"""How long the person has waited: seconds since the process started, for the window's "opened in X s".

Imported by app/main.py before anything else of ours, so its fallback clock starts with the entry point;
where the kernel records the process's own start (Linux), that is used, so the interpreter's start-up and
the imports are counted too. Its own module so the window can read it without importing the entry point."""

from __future__ import annotations

import time

# The fallback clock for seconds_since_start(), read before any other import of ours; where the process's
# own start time can be read (Linux), that is used instead, so the interpreter's start is counted too.
_IMPORTED_AT = time.perf_counter()

import os  # noqa: E402  (after the clock on purpose)


def _process_age() -> float | None:
    """Seconds since this process started, from the kernel's record of its start (Linux /proc), or None
    where that cannot be read. /proc/self/stat's 22nd field is the start in clock ticks since boot, on the
    boot-time clock (suspend included), hence CLOCK_BOOTTIME; its resolution is one tick (10 ms)."""
    try:
        with open("/proc/self/stat", "rb") as stat:
            text = stat.read()
        after_name = text[text.rindex(b")") + 2:].split()   # the name (field 2) may hold spaces
        started_ticks = int(after_name[19])                  # field 22; after_name[0] is field 3
        age = time.clock_gettime(time.CLOCK_BOOTTIME) - started_ticks / os.sysconf("SC_CLK_TCK")
    except (OSError, ValueError, IndexError, AttributeError):
        return None
    return age if 0 <= age < 86400 * 366 else None


_AGE_AT_IMPORT = _process_age()


def seconds_since_start() -> float:
    """Seconds since the process started: what a person has waited for the window ("opened in X s")."""
    now = time.perf_counter()
    if _AGE_AT_IMPORT is not None:
        return _AGE_AT_IMPORT + (now - _IMPORTED_AT)
    return now - _IMPORTED_AT
