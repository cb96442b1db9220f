"""The GL viewport: pyqtgraph's GLViewWidget, counting the frames it draws (tests and the benchmark wait
for a real paint instead of guessing)."""

import pyqtgraph.opengl as gl


class SceneView(gl.GLViewWidget):
    def __init__(self, *args, **kwargs):
        super().__init__(*args, **kwargs)
        self.frames_drawn = 0

    def paintGL(self):
        super().paintGL()
        self.frames_drawn += 1
