"""An error inside an undo command that Qt calls (redo when the edit is pushed, undo, the merge of a drag)
reaches the caller as an exception and the window lives on: PySide6 6.11 would otherwise crash the process
(a segfault) on an error the interpreter raised there (a TypeError, a KeyError). Each case runs in its own
Python, so a crash fails this test instead of ending the test run.

Check values: the behaviour app/commands.py documents; a crash is exit status -11 (SIGSEGV)."""

import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]

SCRIPT = """
import sys
from PySide6.QtWidgets import QApplication
app = QApplication([])
from app.model import SessionModel
from core.orientation import Orientation

model = SessionModel()
turn = lambda degrees: Orientation.from_axis_angle((0, 0, 1), degrees)
case = sys.argv[1]
if case != "redo":
    model.set_orientation(turn(5), continuous_key="drag")
    model.set_orientation(turn(6), continuous_key="drag")

def broken(*args):
    first, second = None                 # the interpreter raises the TypeError, not a raise statement

if case == "merge":
    from app import commands
    commands._returned_to_start = broken
else:
    model._restore = broken
try:
    if case == "undo":
        model.undo_stack.undo()
    else:
        model.set_orientation(turn(7), continuous_key="drag")
except TypeError as error:
    print("refused:", error, flush=True)
print("alive", flush=True)
"""


@pytest.mark.parametrize("case", ["redo", "undo", "merge"])
def test_an_error_in_a_command_qt_calls_reaches_the_caller(case):
    done = subprocess.run([sys.executable, "-c", SCRIPT, case], cwd=ROOT, capture_output=True, text=True,
                          timeout=120, env={"QT_QPA_PLATFORM": "offscreen", "PYTHONPATH": str(ROOT),
                                            "PATH": "/usr/bin:/bin"})
    assert done.returncode == 0, (done.returncode, done.stderr[-2000:])
    assert "refused:" in done.stdout and "cannot unpack non-iterable NoneType object" in done.stdout
    assert done.stdout.rstrip().endswith("alive")
