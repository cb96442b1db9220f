"""The README's "Poses and transforms" examples are real output (issue 11: the README shows `decode` of a
4×4 transform, a pose line, a description-file origin and a transform printout "with their real output").

Each `$ framewright …` line of that section's code blocks is run through bash (so `$'…'` and `- < file`
work as a reader would type them) with `framewright` standing for `python -m app.main`; what it prints
(stdout, then stderr, then `(exit status N)` when N is not 0) must be the lines below it. A `$ cat FILE`
block writes FILE with the lines shown, in a scratch folder the later commands run in."""

import os
import re
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
SECTION = "### Poses and transforms"


def _section() -> str:
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    start = text.index(SECTION)
    end = text.index("\n### ", start + len(SECTION))
    return text[start:end]


def _examples():
    """[(command, expected lines, files written before it)] in the order of the section."""
    out, files = [], {}
    for block in re.findall(r"```\n(.*?)```", _section(), re.DOTALL):
        command, lines = None, []
        for line in block.rstrip("\n").split("\n") + ["$ end"]:
            if line.startswith("$ "):
                if command is not None:
                    if command.startswith("cat "):
                        files[command[4:].strip()] = "\n".join(lines) + "\n"
                    else:
                        out.append((command, lines, dict(files)))
                command, lines = line[2:], []
            else:
                lines.append(line)
    return out


EXAMPLES = _examples()


def test_the_section_shows_the_four_kinds_of_text_the_issue_names():
    commands = " ".join(c for c, _, _ in EXAMPLES)
    assert len(EXAMPLES) >= 4
    for needle in ("0 0 0 1]", "tx ty tz qx qy qz qw", "<origin", "printout.txt"):
        assert needle in commands, needle


@pytest.mark.parametrize("command, expected, files", EXAMPLES, ids=[c[:50] for c, _, _ in EXAMPLES])
def test_each_example_prints_what_the_readme_shows(command, expected, files, tmp_path):
    for name, content in files.items():
        (tmp_path / name).write_text(content, encoding="utf-8")
    assert command.startswith("framewright ")
    env = {**os.environ, "PYTHONPATH": str(ROOT), "QT_QPA_PLATFORM": "offscreen"}
    env.pop("DISPLAY", None)
    shell = f'framewright() {{ "{sys.executable}" -m app.main "$@"; }}; {command}'
    result = subprocess.run(["bash", "-c", shell], capture_output=True, text=True, cwd=tmp_path, env=env,
                            timeout=120)
    printed = (result.stdout + result.stderr).rstrip("\n").split("\n")
    if result.returncode != 0:
        printed.append(f"(exit status {result.returncode})")
    assert printed == expected, "\n".join(printed)
