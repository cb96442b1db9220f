"""Start-up as a person waits for it: from the moment the process is spawned to the window's first
completed paint, for Framewright on its demo session and, launched alternately as the baselines, an empty
PySide6 window (nothing in it) and one holding a single pyqtgraph GL view. Median of 10 launches each;
ratio = ours / baseline.
Goal: ours <= 1.0 s on this machine class. Timings only; nothing here passes or fails."""

from __future__ import annotations

import os
import shutil
import statistics
import subprocess
import sys
import tempfile
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
        super().__init__(app)          # kept alive by the application
        self.app = app
    def eventFilter(self, obj, event):
        if event.type() == QEvent.Type.Paint:
            QTimer.singleShot(0, lambda: (print(f"{time.time():.6f}", flush=True), self.app.quit()))
            obj.removeEventFilter(self)
        return False
"""

# Ours runs the program's own entry point (app.main.main with no arguments: the display check, the
# QApplication, the last session, which is the demo on a first launch with empty settings); the only
# addition is the watcher, put on the window as make_window hands it over. The Scene is built just after
# the window's first paint (MainWindow.build_scene), so ours prints a second time: when the Scene has drawn
# its first frame, the moment the whole window is there.
OURS = _FIRST_PAINT + r"""
import os, sys, tempfile
from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QApplication
QSettings.setPath(QSettings.Format.IniFormat, QSettings.Scope.UserScope, tempfile.mkdtemp())
os.environ["FRAMEWRIGHT_RECOVERY_DIR"] = tempfile.mkdtemp()   # no crashed run to offer
import app.window
class FirstPaintThenScene(FirstPaint):
    def __init__(self, app, window):
        super().__init__(app)
        self.window = window
    def eventFilter(self, obj, event):
        if event.type() == QEvent.Type.Paint:
            QTimer.singleShot(0, lambda: (print(f"{time.time():.6f}", flush=True), self._wait_for_scene()))
            obj.removeEventFilter(self)
        return False
    def _wait_for_scene(self):
        if self.window.scene is not None and self.window.scene.view.frames_drawn > 0:
            print(f"{time.time():.6f}", flush=True)
            self.app.quit()
        else:
            QTimer.singleShot(1, self._wait_for_scene)
_make_window = app.window.make_window
def make_window(*args, **kwargs):
    window = _make_window(*args, **kwargs)
    window.installEventFilter(FirstPaintThenScene(QApplication.instance(), window))
    return window
app.window.make_window = make_window
from app.main import main
sys.exit(main([]))
"""

EMPTY = _FIRST_PAINT + r"""
import sys
from PySide6.QtWidgets import QApplication, QMainWindow
app = QApplication(sys.argv)
window = QMainWindow()
window.resize(1280, 800)
watcher = FirstPaint(app)
window.installEventFilter(watcher)
window.show()
app.exec()
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


# Launched as an installed program runs: with compiled bytecode. pip writes it for the libraries, but this
# source tree may never get any (PYTHONDONTWRITEBYTECODE is set in some shells), and compiling our hundred
# modules on every launch would be measured as start-up. So each child keeps its bytecode in one temporary
# folder for the run, and a first launch of each script (not counted) fills it.
def launch(script: str, bytecode: str) -> list[float] | None:
    """Seconds from spawn to each time the child printed (the first paint; for ours then the Scene)."""
    env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}
    env.update(PYTHONPATH=str(ROOT), PYTHONPYCACHEPREFIX=bytecode)
    start = time.time()
    result = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, cwd=ROOT, env=env,
                            timeout=120)
    lines = [line for line in result.stdout.splitlines() if line.strip()]
    if result.returncode != 0 or not lines:
        print(f"  launch failed: {result.stderr.strip()[-300:]}")
        return None
    return [float(line) - start for line in lines]


def main():
    bytecode = tempfile.mkdtemp(prefix="framewright-bench-bytecode-")
    try:
        measure(bytecode)
    finally:
        shutil.rmtree(bytecode, ignore_errors=True)


def measure(bytecode: str):
    ours, scene, baseline, empty = [], [], [], []
    for script in (OURS, BASELINE, EMPTY):    # fills the bytecode folder; not counted
        launch(script, bytecode)
    for _ in range(LAUNCHES):                  # alternately, so load changes touch both alike
        mine = launch(OURS, bytecode)
        if mine is not None:
            ours.append(mine[0])
            scene.append(mine[-1])
        base = launch(BASELINE, bytecode)
        if base is not None:
            baseline.append(base[0])
        bare = launch(EMPTY, bytecode)
        if bare is not None:
            empty.append(bare[0])
    if not ours or not baseline or not empty:
        print("start-up: no complete launches")
        return
    mine, drawn = statistics.median(ours), statistics.median(scene)
    base, bare = statistics.median(baseline), statistics.median(empty)
    print(f"start-up, process spawn to first paint, median of {len(ours)} launches each, alternating:")
    print(f"  empty PySide6 window {bare:.2f} s; empty window with one GL view {base:.2f} s")
    print(f"  Framewright on the demo session, first paint {mine:.2f} s; ratio {mine / bare:.2f} to the empty "
          f"window, {mine / base:.2f} to the one with a GL view; goal <= {GOAL_S:.1f} s: "
          f"{'met' if mine <= GOAL_S else 'NOT MET'}")
    print(f"  the whole window, Scene drawn: {drawn:.2f} s; ratio {drawn / bare:.2f} to the empty window, "
          f"{drawn / base:.2f} to the one with a GL view; goal <= {GOAL_S:.1f} s: "
          f"{'met' if drawn <= GOAL_S else 'NOT MET'}")


if __name__ == "__main__":
    main()
