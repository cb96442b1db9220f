"""Start-up as a person waits for it: from the moment the process is spawned to the window's first
completed paint, for Framewright on its demo session and, launched alternately as the baseline, an empty
PySide6 window holding one pyqtgraph GL view. Median of 10 launches each; ratio = ours / baseline.
Goal: ours <= 1.0 s on this machine class. Timings only; nothing here passes or fails."""

from __future__ import annotations

import os
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
LAUNCHES = 10
GOAL_S = 1.0

# The child prints the wall-clock time of its first completed paint; the parent subtracts its own
# wall-clock time just before spawning, so the interpreter's start and every import are counted.
_FIRST_PAINT = r"""
import time
from PySide6.QtCore import QEvent, QObject, QTimer
class FirstPaint(QObject):
    def __init__(self, app):
        super().__init__()
        self.app = app
    def eventFilter(self, obj, event):
        if event.type() == QEvent.Type.Paint:
            QTimer.singleShot(0, lambda: (print(f"{time.time():.6f}", flush=True), self.app.quit()))
            obj.removeEventFilter(self)
        return False
"""

OURS = _FIRST_PAINT + r"""
import sys, tempfile
from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QApplication
import app.scene                       # shares GL contexts, as the program's entry point does
app = QApplication(sys.argv)
QSettings.setPath(QSettings.Format.IniFormat, QSettings.Scope.UserScope, tempfile.mkdtemp())
from app.window import make_window
window = make_window()
watcher = FirstPaint(app)
window.installEventFilter(watcher)
window.show()
app.exec()
window.model.undo_stack.setClean()
"""

BASELINE = _FIRST_PAINT + r"""
import sys
from PySide6.QtWidgets import QApplication, QMainWindow
import pyqtgraph.opengl as gl
app = QApplication(sys.argv)
window = QMainWindow()
view = gl.GLViewWidget()
window.setCentralWidget(view)
window.resize(1280, 800)
watcher = FirstPaint(app)
window.installEventFilter(watcher)
window.show()
app.exec()
"""


def launch(script: str) -> float | None:
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    start = time.time()
    result = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, cwd=ROOT, env=env,
                            timeout=120)
    lines = [line for line in result.stdout.splitlines() if line.strip()]
    if result.returncode != 0 or not lines:
        print(f"  launch failed: {result.stderr.strip()[-300:]}")
        return None
    return float(lines[-1]) - start


def main():
    ours, baseline = [], []
    for _ in range(LAUNCHES):                  # alternately, so load changes touch both alike
        for script, times in ((OURS, ours), (BASELINE, baseline)):
            seconds = launch(script)
            if seconds is not None:
                times.append(seconds)
    if not ours or not baseline:
        print("start-up: no complete launches")
        return
    mine, base = statistics.median(ours), statistics.median(baseline)
    print(f"start-up, process spawn to first paint, median of {len(ours)} launches each, alternating:")
    print(f"  Framewright on the demo session {mine:.2f} s; empty window with one GL view {base:.2f} s; "
          f"ratio {mine / base:.2f}; goal <= {GOAL_S:.1f} s: {'met' if mine <= GOAL_S else 'NOT MET'}")


if __name__ == "__main__":
    main()
