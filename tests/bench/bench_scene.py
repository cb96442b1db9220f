"""Scene benchmark: one edit -> the scene re-rendered, on software OpenGL (Mesa llvmpipe) at 1280 x 800.

For 300 edits (a new orientation each, as while dragging a slider) it prints median and p95 of
  update      SceneWidget.set_orientation: transforms, vertex data, labels and overlay text (no drawing)
  frame       update + the viewport's paintGL at 1280 x 800 into its framebuffer, finished on the GL side
  on screen   update + Qt's own repaint through the event loop (paint, compose, flush to the X server)
  readback    update + render_image(1280, 800): offscreen, 4x multisampled, read into numpy (PNG export)
and, in the same run, the frame of a bare GLViewWidget holding one line at the same size, drawn and on
screen: the floor of pyqtgraph and of Qt's window composition on this machine, as ratios. The goal is an edit -> frame p95 <= 16 ms (one frame at 60 Hz).

Needs a display with GLX; without DISPLAY it starts its own Xvfb (PyVirtualDisplay, which pytest-xvfb
brings). Run: python tests/bench/bench_scene.py
"""

import os
import pathlib
import sys
import time

import numpy as np

ROOT = pathlib.Path(__file__).resolve().parents[2]
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

EDITS = 300
WIDTH, HEIGHT = 1280, 800
BUDGET_MS = 16.0


def _stats(samples_s):
    ms = np.asarray(samples_s) * 1e3
    return float(np.median(ms)), float(np.percentile(ms, 95))


def _orientations(count):
    from core.orientation import Orientation

    rng = np.random.default_rng(11)
    # a drag-like walk: each edit a few degrees on from the last, so labels and cone change every time
    rv = np.cumsum(rng.normal(scale=3.0, size=(count, 3)), axis=0) + [40.0, -25.0, 60.0]
    return [Orientation.from_rotation_vector(v) for v in rv]


def _draw(view):
    """One frame as Qt's paintEvent draws it: the widget's framebuffer, its viewport, paintGL, and a
    glFinish so the software rasteriser has really finished."""
    from OpenGL import GL

    view.makeCurrent()
    GL.glBindFramebuffer(GL.GL_FRAMEBUFFER, view.defaultFramebufferObject())
    GL.glViewport(0, 0, view.width(), view.height())
    view.paintGL()
    GL.glFinish()
    view.doneCurrent()


def _repaint_through_event_loop(qt_app, view):
    """update() and run the event loop until the view has really drawn a frame (at most 1 s)."""
    before = view.frames_drawn
    view.update()
    deadline = time.perf_counter() + 1.0
    while view.frames_drawn == before and time.perf_counter() < deadline:
        qt_app.processEvents()
        time.sleep(0.0002)


def measure():
    import pyqtgraph.opengl as gl
    from OpenGL import GL
    from PySide6 import QtWidgets

    import app.scene  # noqa: F401  (shares GL contexts before the application exists)
    from app.scene.scene_widget import SceneWidget

    qt_app = QtWidgets.QApplication.instance() or QtWidgets.QApplication([])
    scene = SceneWidget()
    scene.show()
    # size the viewport itself to 1280 x 800 (the toolbar sits above it)
    scene.resize(WIDTH, HEIGHT + scene.toolbar.sizeHint().height())
    qt_app.processEvents()
    view = scene.view
    view.makeCurrent()
    renderer = GL.glGetString(GL.GL_RENDERER).decode()
    view.doneCurrent()
    size = (view.width(), view.height())

    orientations = _orientations(EDITS + 20)
    for o in orientations[:20]:  # warm up: shaders compiled, buffers allocated, glyphs cached
        scene.set_orientation(o)
        _draw(view)

    update, frame, screen, readback = [], [], [], []
    for o in orientations[20:]:
        start = time.perf_counter()
        scene.set_orientation(o)
        update.append(time.perf_counter() - start)
        _draw(view)
        frame.append(time.perf_counter() - start)
    for o in orientations[20:]:
        start = time.perf_counter()
        scene.set_orientation(o)
        _repaint_through_event_loop(qt_app, view)
        screen.append(time.perf_counter() - start)
    for o in orientations[20:20 + 60]:
        start = time.perf_counter()
        scene.set_orientation(o)
        scene.render_image(WIDTH, HEIGHT)
        readback.append(time.perf_counter() - start)

    from app.scene.scene_view import SceneView

    bare = SceneView()
    bare.addItem(gl.GLLinePlotItem(pos=np.array([[0, 0, 0], [1, 0, 0]], float), color=(1, 0, 0, 1), width=2))
    bare.resize(*size)
    bare.show()
    qt_app.processEvents()
    floor = []
    for i in range(EDITS):
        start = time.perf_counter()
        bare.opts["azimuth"] = i  # something changes, as in an edit
        _draw(bare)
        floor.append(time.perf_counter() - start)
    floor_screen = []
    for i in range(EDITS):
        start = time.perf_counter()
        bare.opts["azimuth"] = i
        _repaint_through_event_loop(qt_app, bare)
        floor_screen.append(time.perf_counter() - start)
    scene.close()
    bare.close()
    qt_app.processEvents()
    return renderer, size, {"update (no drawing)": update, "edit -> frame": frame,
                            "edit -> on screen": screen, "edit -> 1280x800 readback": readback}, floor, floor_screen


def main():
    display = None
    if not os.environ.get("DISPLAY"):
        from pyvirtualdisplay import Display

        display = Display(visible=False, size=(1600, 1000), color_depth=24,
                          extra_args=["+extension", "GLX", "+render"])
        display.start()
    try:
        renderer, size, timings, floor, floor_screen = measure()
    finally:
        if display is not None:
            display.stop()
    f_med, f_p95 = _stats(floor)
    print(f"Scene benchmark: {EDITS} edits, viewport {size[0]} x {size[1]}, renderer {renderer}")
    for name, samples in timings.items():
        med, p95 = _stats(samples)
        print(f"  {name:26s} n={len(samples):3d}  median {med:7.2f} ms  p95 {p95:7.2f} ms  "
              f"p95/16ms {p95 / BUDGET_MS:5.2f}  median/bare-frame {med / f_med:6.2f}")
    print(f"  {'bare pyqtgraph frame':26s} n={len(floor):3d}  median {f_med:7.2f} ms  p95 {f_p95:7.2f} ms  "
          "(one line, same size: the floor)")
    s_med, s_p95 = _stats(floor_screen)
    print(f"  {'bare pyqtgraph on screen':26s} n={len(floor_screen):3d}  median {s_med:7.2f} ms  p95 {s_p95:7.2f} ms  "
          "(Qt's compose and flush to Xvfb alone)")
    med, p95 = _stats(timings["edit -> on screen"])
    print(f"  on screen, less the bare view's own on-screen cost: median {med - s_med:6.2f} ms")
    med, p95 = _stats(timings["edit -> frame"])
    verdict = "met" if p95 <= BUDGET_MS else "NOT met"
    print(f"  goal edit -> frame p95 <= {BUDGET_MS:.0f} ms: {verdict} ({p95:.2f} ms)")


if __name__ == "__main__":
    main()
