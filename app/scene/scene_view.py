"""The GL viewport: pyqtgraph's GLViewWidget, counting the frames it draws (tests and the benchmark wait
for a real paint instead of guessing) and letting its owner bring the items up to date just before each
frame (before_paint)."""

import pyqtgraph.opengl as gl
from PySide6 import QtGui

# Half a turn about the reference X axis, (x, y, z) -> (x, -y, -z): a rotation (never a mirror), its own
# inverse. Seen through it, a frame whose +Z points down is drawn with -Z up the screen.
_HALF_TURN_ABOUT_X = QtGui.QMatrix4x4(1, 0, 0, 0, 0, -1, 0, 0, 0, 0, -1, 0, 0, 0, 0, 1)


class SceneView(gl.GLViewWidget):
    """pyqtgraph's camera keeps its +Z up; with ``up_z = -1`` the view shows the reference frame turned
    half a turn about X first, so the frame's -Z is up. Elevation and azimuth then apply to that turned
    frame (SceneWidget.set_view converts)."""

    _settling = False   # before_paint is running (pyqtgraph's constructor asks for a frame before ours runs)

    def __init__(self, *args, **kwargs):
        super().__init__(*args, **kwargs)
        self.frames_drawn = 0
        self.up_z = 1
        self.before_paint = None   # called just before each frame is drawn (the Scene's settle)
        self.before_clear = None   # called in each paint with its camera set, before anything is drawn

    def viewMatrix(self):
        tr = super().viewMatrix()
        return tr * _HALF_TURN_ABOUT_X if self.up_z < 0 else tr

    def cameraPosition(self):
        position = super().cameraPosition()
        if self.up_z < 0:
            position = QtGui.QVector3D(position.x(), -position.y(), -position.z())
        return position

    def update(self):
        # Items set while the frame is being prepared ask for a frame: this one draws them already, and
        # asking for another would draw frames without end.
        if not self._settling:
            super().update()

    def paint(self, *, region, viewport, useItemNames=False):
        if self.before_clear is not None:
            self.setProjection(region, viewport)
            self.setModelview()
            self.before_clear()
        super().paint(region=region, viewport=viewport, useItemNames=useItemNames)

    def paintGL(self):
        if self.before_paint is not None:
            self._settling = True
            try:
                self.before_paint()
            finally:
                self._settling = False
        super().paintGL()
        self.frames_drawn += 1
