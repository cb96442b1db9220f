"""Entry point of the `framewright` console script and of `python -m app.main`.

No arguments: open the window. A command (decode, compare, fit, batch, open FILE): hand over to
app/cli.py, which never imports Qt; `open` comes back here through open_window once the file has read."""

from __future__ import annotations

import time

# The fallback clock for seconds_since_start(), read before any other import of ours; where the process's
# own start time can be read (Linux), that is used instead, so the interpreter's start is counted too.
_IMPORTED_AT = time.perf_counter()

import os  # noqa: E402  (after the clock on purpose)
import sys  # noqa: E402


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


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else list(argv)
    if argv:
        from app import cli
        return cli.main(argv)
    from app.display_check import open_display_problem
    problem = open_display_problem()
    if problem is not None:           # Qt would abort the process without a display: say why, in one line
        sys.stderr.write(f"framewright: {problem}\n")
        return 2
    return open_window()


def open_window(path: str | None = None) -> int:
    """Run the window (on the session file `path`, or the last session; the demo the first time) until
    it closes."""
    from app import window   # imported only here: the command line never loads Qt
    status = window.run_window() if path is None else window.run_window(path)
    return status if isinstance(status, int) else 0


if __name__ == "__main__":
    sys.exit(main())
