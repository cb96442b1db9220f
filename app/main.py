"""Entry point of the `framewright` console script and of `python -m app.main`.

No arguments: open the window. A command (decode, compare, ...): hand over to app/cli.py, which never
imports Qt."""

from __future__ import annotations

import sys


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else list(argv)
    if argv:
        from app import cli
        return cli.main(argv)
    return _open_window()


def _open_window() -> int:
    from app import window   # imported only here: the command line never loads Qt
    status = window.run_window()
    return status if isinstance(status, int) else 0


if __name__ == "__main__":
    sys.exit(main())
