"""The Scene: the 3D viewport where the numbers meet the part on the bench.

The window needs two names: SceneWidget (the view and its toolbar, a plain state API) and
bind_scene_to_model (feeds it from the session model's change signal)."""

from PySide6.QtCore import QCoreApplication, Qt

# The viewport's smallest size: small enough for a laptop, the window gives it the rest. The window's
# stand-in for a Scene not built yet (app/window.py) keeps the same.
VIEW_MINIMUM_SIZE = (240, 100)

# pyqtgraph.opengl compiles each shader program once per process; every scene (a second window, the next
# test) must share that GL context group or the cached programs are invalid there. The attribute only
# takes effect before the QApplication exists, so it is set as early as this package is imported.
if QCoreApplication.instance() is None:
    QCoreApplication.setAttribute(Qt.ApplicationAttribute.AA_ShareOpenGLContexts)
