"""The Scene picture of a record's section (core/inspection_record.Picture): the part as measured with the
nominal as the faint outline, drawn by a SceneWidget of its own, never shown on the screen, through the
same offscreen framebuffer the Scene's Export PNG uses. Without a display the picture is still drawn
when the platform makes an OpenGL context offscreen; where none can be made (no display, no GL driver)
it is left out with the reason: never a crash."""

from __future__ import annotations

from PySide6 import QtCore, QtGui, QtWidgets

PICTURE_SIZE = (1040, 640)      # pixels; printed about 13.7 cm wide on an A4 page
GL_PLATFORMS = ("xcb", "wayland", "wayland-egl", "windows", "cocoa")


def no_picture_reason() -> str | None:
    """Why this process cannot draw the Scene (None: it may be able to)."""
    app = QtWidgets.QApplication.instance()
    if not isinstance(app, QtWidgets.QApplication):
        return "the program runs without its window (no Qt widgets)"
    platform = QtGui.QGuiApplication.platformName()
    if platform not in GL_PLATFORMS and not _offscreen_context_can_be_made():
        return (f"no display to draw the Scene with OpenGL, and no OpenGL context could be made offscreen "
                f"(Qt platform '{platform}')")
    return None


def _offscreen_context_can_be_made() -> bool:
    """Whether this platform (e.g. Qt's 'offscreen', which some builds give OpenGL through EGL) makes an
    OpenGL context current on an offscreen surface: then the picture is drawn without a display."""
    context, surface = QtGui.QOpenGLContext(), QtGui.QOffscreenSurface()
    surface.create()
    try:
        return bool(context.create() and surface.isValid() and context.makeCurrent(surface))
    finally:
        context.doneCurrent()
        surface.destroy()


class PictureMaker:
    """Draws pictures one after another with one SceneWidget (a GL context is made once)."""

    def __init__(self, camera_from=None):
        self._scene = None
        self._problem = no_picture_reason()
        self._camera_from = camera_from      # a shown SceneWidget whose camera the pictures copy

    @property
    def problem(self) -> str | None:
        return self._problem

    def _widget(self):
        if self._scene is None and self._problem is None:
            from app.scene.scene_widget import SceneWidget

            scene = SceneWidget()
            scene.setAttribute(QtCore.Qt.WidgetAttribute.WA_DontShowOnScreen, True)
            scene.resize(*PICTURE_SIZE)
            scene.show()
            for _ in range(3):
                QtWidgets.QApplication.processEvents()
            if not scene.view.isValid():
                self._problem = "no OpenGL context could be made here"
                scene.close()
                scene.deleteLater()
            else:
                self._scene = scene
        return self._scene

    def png(self, picture) -> bytes | None:
        """PNG bytes of one picture, or None (then `problem` says why)."""
        scene = self._widget()
        if scene is None:
            return None
        try:
            part = picture.part
            scene.set_part(part.box_size_mm, part.face_names, part.boresight)
            scene.set_frame_preset(picture.preset)
            scene.set_orientation(picture.orientation)
            scene.set_ghost(picture.ghost, picture.ghost_label)
            scene.set_view("iso")
            if self._camera_from is not None:
                scene.view.opts.update({k: self._camera_from.view.opts[k]
                                        for k in ("elevation", "azimuth", "distance", "center")})
            width, height = PICTURE_SIZE
            array = scene.render_image(width, height)
        except (RuntimeError, OSError) as error:
            self._problem = f"the Scene could not be drawn ({error})"
            return None
        image = QtGui.QImage(array.data, width, height, width * 4, QtGui.QImage.Format.Format_RGBA8888)
        buffer = QtCore.QBuffer()
        buffer.open(QtCore.QIODevice.OpenModeFlag.WriteOnly)
        if not image.save(buffer, "PNG"):
            self._problem = "the picture could not be encoded as PNG"
            return None
        return bytes(buffer.data())

    def close(self) -> None:
        if self._scene is not None:
            self._scene.close()
            self._scene.deleteLater()
            self._scene = None
