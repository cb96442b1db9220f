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
    try:
        from app import window
    except ModuleNotFoundError as error:
        if error.name != "app.window":
            print(f"framewright: the window cannot start: {error}", file=sys.stderr)
            return 1
        window = None
    run_window = getattr(window, "run_window", None)
    if run_window is None:
        print("framewright: the window is not built yet; commands work: framewright decode --help")
        return 0
    status = run_window()
    return status if isinstance(status, int) else 0


if __name__ == "__main__":
    sys.exit(main())
