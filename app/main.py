"""Entry point of the `framewright` console script and of `python -m app.main`.

No arguments: open the window. A command (decode, compare, fit, batch, open FILE): hand over to
app/cli.py, which never imports Qt; `open` comes back here through open_window once the file has read."""

from __future__ import annotations

# The clock module first, before any other import of ours: its fallback clock starts when it is imported.
from app.start_clock import seconds_since_start  # noqa: F401  (re-exported for the entry point's callers)

import sys  # noqa: E402


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else list(argv)
    if argv:
        from app import cli
        # main dispatches: the command line never imports this module, the window or Qt
        return cli.main(argv, open_window=open_window, write_report=write_report)
    from app.display_check import open_display_problem
    problem = open_display_problem()
    if problem is not None:           # Qt would abort the process without a display: say why, in one line
        sys.stderr.write(f"framewright: {problem}\n")
        return 2
    return open_window()


def write_report(out: str, record, free: dict):
    """Lay out and write a report with Qt (for `framewright report`, once its input has been read)."""
    from app.report_with_qt import write_report_with_qt
    return write_report_with_qt(out, record, free)


def open_window(path: str | None = None) -> int:
    """Run the window (on the session file `path`, or the last session; the demo the first time) until
    it closes."""
    from app import window   # imported only here: the command line never loads Qt
    status = window.run_window() if path is None else window.run_window(path)
    return status if isinstance(status, int) else 0


if __name__ == "__main__":
    sys.exit(main())
