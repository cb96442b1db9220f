"""Put one mutant's change into the working copy, to prove that a new test kills it, then take it out.

    python scripts/apply_mutant.py NAME          # writes the mutant's change into the source file
    python -m pytest -q tests/core/test_new.py   # must fail
    python scripts/apply_mutant.py --undo NAME   # git checkout of that file; the test must pass again

The change is read from `mutmut show NAME` (so the mutants of the last `make mutate` must still be in
mutants/). mutmut prints a method without its class's indentation, so the old lines are looked for at 0, 4
and 8 spaces; when they are not found exactly once (the source has moved on since the run), nothing is
written and the diff is printed to apply by hand. Never commit with a mutant applied: `git diff` shows it."""

import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
MUTMUT = str(ROOT / ".venv" / "bin" / "mutmut")


def change_of(name):
    """(path, [(old lines, new lines)], mutmut's text) of one mutant."""
    out = subprocess.run([MUTMUT, "show", name], cwd=ROOT, capture_output=True, text=True, check=False).stdout
    return (*parse(out), out)


def parse(out):
    """(path, [(old lines, new lines)]) from the unified diff `mutmut show` prints."""
    path, hunks, old, new = None, [], None, None
    for line in out.splitlines():
        if line.startswith("--- "):
            path = line[4:].strip()
        elif line.startswith("+++ "):
            continue
        elif line.startswith("@@"):
            if old is not None:
                hunks.append((old, new))
            old, new = [], []
        elif old is not None:
            if line.startswith("-"):
                old.append(line[1:])
            elif line.startswith("+"):
                new.append(line[1:])
            else:
                text = line[1:] if line.startswith(" ") else line
                old.append(text)
                new.append(text)
    if old is not None:
        hunks.append((old, new))
    return path, hunks


def indented(lines, indent):
    return "".join((indent + line if line else line) + "\n" for line in lines)


def apply(text, hunks):
    """`text` with every hunk's old lines replaced by its new ones, or None when one is not found once."""
    for old, new in hunks:
        for indent in ("", "    ", "        "):
            before = indented(old, indent)
            if text.count(before) == 1:
                text = text.replace(before, indented(new, indent))
                break
        else:
            return None
    return text


def main(argv):
    undo = bool(argv) and argv[0] == "--undo"
    names = argv[1:] if undo else argv
    if len(names) != 1:
        sys.exit(__doc__)
    path, hunks, out = change_of(names[0])
    if path is None or not hunks:
        sys.exit(f"mutmut shows no change for {names[0]}:\n{out}")
    if undo:
        subprocess.run(["git", "checkout", "--", path], cwd=ROOT, check=True)
        print(f"restored {path}")
        return 0
    file = ROOT / path
    changed = apply(file.read_text(), hunks)
    if changed is None:
        sys.exit(f"{names[0]}: its old lines are not found exactly once in {path}; apply it by hand:\n{out}")
    file.write_text(changed)
    print(f"applied {names[0]} to {path}; undo with: python scripts/apply_mutant.py --undo {names[0]}")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
