"""Entry point of the `framewright` console script and of `python -m app.main`.

No arguments: open the window. A command (decode, compare, fit, batch, open FILE): hand over to
app/cli.py, which never imports Qt; `open` comes back here through open_window once the file has read."""

from __future__ import annotations

import sys


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else list(argv)
    if argv:
        from app import cli
        return cli.main(argv)
    return open_window()


def open_window(path: str | None = None) -> int:
    """Run the window (on the session file `path`, or the last session; the demo the first time) until
    it closes."""
    from app import window   # imported only here: the command line never loads Qt
    status = window.run_window() if path is None else window.run_window(path)
    return status if isinstance(status, int) else 0


if __name__ == "__main__":
    sys.exit(main())
