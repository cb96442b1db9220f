"""SceneWidget: the 3D viewport (pyqtgraph.opengl on PyOpenGL) with its small toolbar, behind a plain state
API. It knows nothing about the model: bind_scene_to_model (model_binding.py) feeds it. A setter only
records the new state and asks for a frame; the items' transforms and vertex data, the labels and the
overlay text are worked out once, just before the next frame is drawn or when someone reads them
(settle), so an edit costs the editors' time and several edits between two frames cost one update. No
item is rebuilt on an edit, so a redraw stays cheap on software OpenGL."""

from __future__ import annotations

import contextlib

import numpy as np
import pyqtgraph.opengl as gl
from OpenGL import GL
from PySide6 import QtCore, QtGui, QtWidgets
from PySide6.QtOpenGL import QOpenGLFramebufferObject, QOpenGLFramebufferObjectFormat

from app import dialog_folder
from app.scene import VIEW_MINIMUM_SIZE, camera, gl_helpers, overlay_text, palette
from app.scene.chain_frames import ChainFrames
from app.scene.frame_triad import FrameTriad
from app.scene.geometry import FACE_NAMES, FACE_NORMALS
from app.scene.label_layer import LabelLayer
from app.scene.measured_points import MeasuredPoints
from app.scene.part_model import PartModel, normalise_face_name
from app.scene.rotation_construction import RotationConstruction
from app.scene.scene_toolbar import SceneToolbar
from app.scene.scene_view import SceneView
from app.scene.stl_reader import StlError
from core import axes, describe
from core.orientation import Orientation
from core.sequences import parse_sequence

BODY_AXIS_LENGTH = 1.0
REFERENCE_AXIS_LENGTH = 1.3
PLAY_SECONDS = 2.5
EXPORT_SAMPLES = 4  # multisampling for exported PNGs (smooth edges); the live view keeps its own format


def _as_orientation(o) -> Orientation:
    if isinstance(o, Orientation):
        return o
    return Orientation.from_matrix(np.asarray(o, dtype=float))


def _lighter(rgb, amount=0.35):
    return tuple(round(c + (255 - c) * amount) for c in rgb)


class SceneWidget(QtWidgets.QWidget):
    sweep_changed = QtCore.Signal(float)

    def __init__(self, parent=None, native_view=False):
        """native_view: the Scene is a native child window of its own. Qt composes the window that holds
        a QOpenGLWidget through OpenGL on every frame; in a native child only the Scene's own area is
        composed so, not the whole top-level window around it, which on software OpenGL took a large
        window longer than the Scene's drawing (tests/bench/bench_window.py). The window's Scene uses it;
        a Scene that is never put on the screen (the report's pictures) does without."""
        super().__init__(parent)
        self.view = SceneView()
        self.view.setBackgroundColor(palette.BACKGROUND)
        self.view.opts["fov"] = camera.FIELD_OF_VIEW
        self.view.setMinimumSize(*VIEW_MINIMUM_SIZE)
        self.toolbar = SceneToolbar(self)
        layout = QtWidgets.QVBoxLayout(self)
        layout.setContentsMargins(0, 0, 0, 0)
        layout.setSpacing(0)
        layout.addWidget(self.toolbar)
        layout.addWidget(self.view, 1)
        if native_view:
            self.setAttribute(QtCore.Qt.WidgetAttribute.WA_NativeWindow)

        self._orientation = Orientation.identity()
        self._ghost = Orientation.identity()
        self._ghost_label = "reference"
        self._ghost_enabled = True
        self._tracked_name = "boresight"
        self._tracked_body = FACE_NORMALS["+Z"].copy()
        self._sweep_t = 1.0
        self._representation = "axis-angle"
        self._angle_unit = "deg"          # the display unit the overlay writes angles in
        self._sequence, self._intrinsic = "ZYX", True
        self._preset = describe.DEFAULT_PRESET

        self._unsettled = False    # state set since the items were last worked out (settle)
        self.settles = 0           # how often they were: what an edit costs here, for tests to count
        self._build_items()
        self.view.before_paint = self.settle
        self._wire_toolbar()
        self._play_timer = QtCore.QTimer(self, interval=16)
        self._play_timer.timeout.connect(self._play_step)
        self._play_clock = QtCore.QElapsedTimer()
        self.view.installEventFilter(self)
        self.set_view("iso")
        self._refresh()

    # --- construction -------------------------------------------------------------------------------
    def _build_items(self):
        v = self.view
        self.grid = gl.GLGridItem(color=palette.GRID_RGBA, antialias=False)  # faint: smoothing buys nothing
        self.grid.setSize(3.0, 3.0)
        self.grid.setSpacing(0.25, 0.25)
        self.grid.setDepthValue(-10)
        v.addItem(self.grid)

        self.reference_group = gl_helpers.group(depth=0)
        v.addItem(self.reference_group)
        self.reference = FrameTriad(self.reference_group, REFERENCE_AXIS_LENGTH, palette.AXIS_RGB, alpha=0.4,
                                    width=1.5, head=0.07)

        self.ghost_group = gl_helpers.group(depth=1)
        v.addItem(self.ghost_group)
        self.ghost_frame = FrameTriad(self.ghost_group, BODY_AXIS_LENGTH, (palette.GHOST_RGB,) * 3, alpha=0.45,
                                      width=1.5, head=0.0)
        self.ghost_outline = gl_helpers.lines(self.ghost_group, color=palette.rgba_float(palette.GHOST_RGB, 0.55),
                                              width=1.5)

        self.rotation = RotationConstruction(v, depth=3)

        self.body_group = gl_helpers.group(depth=4)  # after the construction lines, before the cone
        v.addItem(self.body_group)
        self.body = FrameTriad(self.body_group, BODY_AXIS_LENGTH, palette.AXIS_RGB, width=3.5, head=0.11)
        self.part = PartModel(self.body_group, depth=1)

        self.labels = LabelLayer(before_read=self.settle)  # a label read is never stale
        v.addItem(self.labels)
        v.before_clear = self.labels.prepare   # its new text images are uploaded before the frame's draws
        # Labels are placed in this order; a later one moves aside when an earlier one holds its spot.
        for key in ("body0", "body1", "body2", "r", "n", "phi", "alpha", *(f"face{f}" for f in FACE_NAMES),
                    "ref0", "ref1", "ref2", "ghost"):
            self.labels.set_label(key, visible=False)
        self.chain_frames = ChainFrames(v, self.labels)
        self.measured_points = MeasuredPoints(v, self.labels)
        self._sync_ghost_outline()

    def _wire_toolbar(self):
        tb = self.toolbar
        tb.view_requested.connect(self.set_view)
        tb.grid_toggled.connect(self.set_grid_visible)
        tb.ghost_toggled.connect(self.set_ghost_visible)
        tb.sweep_moved.connect(self.set_sweep)
        tb.play_toggled.connect(self._play)
        tb.tracked_chosen.connect(self._tracked_from_toolbar)
        tb.representation_chosen.connect(self.set_overlay_representation)
        tb.preset_chosen.connect(self.set_frame_preset)
        tb.export_requested.connect(self._export_dialog)
        tb.stl_requested.connect(self._stl_dialog)

    # --- state API ----------------------------------------------------------------------------------
    def orientation(self) -> Orientation:
        return self._orientation

    def set_orientation(self, o):
        """The current orientation (an Orientation, or a 3x3 body -> reference matrix)."""
        self._orientation = _as_orientation(o)
        self._refresh()

    def set_ghost(self, o, label="reference"):
        """A faint second orientation (the reference, or a second Mount); None hides it."""
        self._ghost = None if o is None else _as_orientation(o)
        self._ghost_label = label or ""
        self._refresh()

    def set_extra_frames(self, frames):
        """Small labelled frames beside the part, e.g. a mount chain's intermediate frames:
        [(orientation or 3x3 matrix, label), ...]; an empty list hides them."""
        self.chain_frames.set_frames([(_as_orientation(o).as_matrix(), label) for o, label in frames])
        self.view.update()

    def set_measured_points(self, fit):
        """The Measure panel's last fit (a MeasuredFit: points, fitted points, residuals), drawn in the
        part's scale around the fitted body origin (measured_points.py says how); None hides it."""
        self.measured_points.show(fit, self.part.scale)
        self.view.update()

    def set_ghost_visible(self, visible):
        self._ghost_enabled = bool(visible)
        self._refresh()

    def set_part(self, size_xyz, face_names=None, boresight_face="+Z"):
        """A box part of the given dimensions (any unit; drawn to scale against the axes), with the user's
        own face names such as {'+X': 'connector'} and the boresight face. Raises ValueError on bad input
        and keeps the last good part."""
        self.part.set_box(size_xyz, face_names, boresight_face)
        self._after_part_change()

    def load_part_stl(self, path) -> int:
        """Draw an STL file (binary or ASCII) as the part; returns its triangle count. Raises StlError."""
        count = self.part.load_stl(path)
        self._after_part_change()
        return count

    def _after_part_change(self):
        self.measured_points.show(self.measured_points.fit, self.part.scale)  # points follow the part's scale
        if self._tracked_name == "boresight":
            self._tracked_body = FACE_NORMALS[self.part.boresight_face].copy()
        self._sync_ghost_outline()
        self._refresh()

    def set_tracked_vector(self, v):
        """'boresight', a body axis name ('+X', '-Z', ...) or a body-frame 3-vector."""
        if isinstance(v, str):
            name = v.strip().replace("\u2212", "-")
            if name.lower() == "boresight":
                self._tracked_name = "boresight"
                self._tracked_body = FACE_NORMALS[self.part.boresight_face].copy()
            else:
                key = normalise_face_name(name)
                self._tracked_name, self._tracked_body = key, FACE_NORMALS[key].copy()
        else:
            vec = np.asarray(v, dtype=float)
            if vec.shape != (3,) or not np.all(np.isfinite(vec)) or np.linalg.norm(vec) == 0:
                raise ValueError(f"the tracked vector must be three finite numbers, not all zero; got {v!r}")
            self._tracked_name, self._tracked_body = None, vec / np.linalg.norm(vec)
        self._refresh()

    def set_overlay_representation(self, kind, sequence=None, intrinsic=None):
        """What the overlay writes: one of overlay_text.REPRESENTATIONS ('axis-angle', 'quaternion', ...; any
        spelling core/representations.py accepts) (in `sequence`, intrinsic or not; None keeps the current
        sequence)."""
        kind = overlay_text.overlay_kind(kind)
        self._representation = kind
        if sequence is not None:
            self._sequence = parse_sequence(sequence)
        if intrinsic is not None:
            self._intrinsic = bool(intrinsic)
        self.toolbar.select(self.toolbar.representation, kind)
        self._refresh()

    def set_angle_unit(self, unit: str) -> None:
        """The display unit of the overlay's angles (a key of core/units.ANGLE_UNITS)."""
        if unit != self._angle_unit:
            self._angle_unit = unit
            self._refresh()

    def angle_unit(self) -> str:
        return self._angle_unit

    def overlay_representation(self) -> tuple[str, str, bool]:
        """(kind, sequence, intrinsic) the overlay writes the orientation in."""
        return self._representation, self._sequence, self._intrinsic

    def frame_preset(self):
        """The frame preset naming the reference directions in the overlay words ('enu', 'ned', ...)."""
        return self._preset

    def set_frame_preset(self, name):
        preset = describe.frame_preset(name)
        self._preset = preset.key
        self.toolbar.select(self.toolbar.preset, self._preset)
        up_z = camera.up_z_for(preset)
        if up_z != self.view.up_z:  # down is down on screen: turn the picture, starting from the isometric
            self.view.up_z = up_z
            self.set_view("iso")
        self._refresh()

    def set_sweep(self, t):
        """Show the body at t x the angle about n (t in [0, 1]; 1 = the current orientation). The model is
        not changed."""
        t = float(np.clip(t, 0.0, 1.0))
        if t != self._sweep_t:
            self._sweep_t = t
            self._refresh()
            self.sweep_changed.emit(t)
        self.toolbar.show_sweep(t)

    def sweep(self) -> float:
        return self._sweep_t

    def set_grid_visible(self, visible):
        self.grid.setVisible(bool(visible))

    # --- views --------------------------------------------------------------------------------------
    def set_view(self, preset):
        """'+X', '-X', '+Y', '-Y', '+Z', '-Z' (look along that reference axis), 'boresight', 'iso' or
        'reset'."""
        key = preset.replace("\u2212", "-")
        if key in axes.VECTORS:  # the camera stands behind and looks along that reference axis
            direction = axes.VECTORS[key]
        elif key == "boresight":
            direction = self._swept_matrix() @ FACE_NORMALS[self.part.boresight_face]
        elif key in ("iso", "isometric", "reset"):
            direction = camera.isometric_for(self.view.up_z)
        else:
            raise ValueError(f"unknown view {preset!r}")
        if self.view.up_z < 0:  # elevation and azimuth apply to the frame as turned (scene_view.py)
            direction = (direction[0], -direction[1], -direction[2])
        elevation, azimuth = camera.elevation_azimuth_for(direction)
        self.view.setCameraPosition(pos=QtGui.QVector3D(0, 0, 0), distance=self._fitting_distance(),
                                    elevation=elevation, azimuth=azimuth)

    def _fitting_distance(self, size=None):
        w, h = size or (self.view.width(), self.view.height())
        return camera.fitting_distance(max(w, 1), max(h, 1))

    def eventFilter(self, watched, event):
        # Keep the zoom (distance relative to the fitting distance) when the viewport changes shape, so
        # nothing the user had in view gets clipped.
        if watched is self.view and event.type() == QtCore.QEvent.Type.Resize:
            old = event.oldSize()
            if old.width() > 0 and old.height() > 0:
                zoom = self.view.opts["distance"] / self._fitting_distance((old.width(), old.height()))
                self.view.opts["distance"] = zoom * self._fitting_distance()
        return super().eventFilter(watched, event)

    @contextlib.contextmanager
    def _camera_for(self, size):
        """The camera as it would frame an image of `size`: same direction and zoom, distance refitted to
        the image's shape (exports of another aspect ratio are not clipped)."""
        saved = self.view.opts["distance"]
        if size is not None:
            zoom = saved / self._fitting_distance()
            self.view.opts["distance"] = zoom * self._fitting_distance(size)
        try:
            yield
        finally:
            self.view.opts["distance"] = saved

    # --- rendering ----------------------------------------------------------------------------------
    def project(self, point_ref, size=None) -> np.ndarray:
        """Pixel (x, y from the top-left) of a reference-frame point in an image of `size` (default: the
        viewport's size), using the view's own projection and view matrices."""
        w, h = size or (self.view.width(), self.view.height())
        with self._camera_for((w, h)):
            return camera.project_points(self.view, point_ref, w, h)[0]

    def render_image(self, width, height, samples=EXPORT_SAMPLES) -> np.ndarray:
        """The scene rendered offscreen at width x height, as an (height, width, 4) RGBA uint8 array."""
        if not self.view.isValid():
            raise RuntimeError("the scene must be shown (have an OpenGL context) before it can be rendered")
        self.settle()
        width, height = int(width), int(height)
        self.view.makeCurrent()
        fmt = QOpenGLFramebufferObjectFormat()
        fmt.setAttachment(QOpenGLFramebufferObject.Attachment.CombinedDepthStencil)
        fmt.setSamples(samples)
        fbo = QOpenGLFramebufferObject(width, height, fmt)
        try:
            fbo.bind()
            GL.glViewport(0, 0, width, height)
            region = (0, 0, width, height)
            with self._camera_for((width, height)):
                self.view.paint(region=region, viewport=region)
            if samples:
                resolved = QOpenGLFramebufferObject(width, height)
                QOpenGLFramebufferObject.blitFramebuffer(resolved, fbo)
                image = resolved.toImage()
            else:
                image = fbo.toImage()
        finally:
            fbo.release()
            self.view.doneCurrent()
        image = image.convertToFormat(QtGui.QImage.Format.Format_RGBA8888)
        array = np.frombuffer(image.constBits(), dtype=np.uint8).reshape(height, image.bytesPerLine() // 4, 4)
        return array[:, :width].copy()

    def export_png(self, path, width, height):
        array = self.render_image(width, height)
        image = QtGui.QImage(array.data, width, height, width * 4, QtGui.QImage.Format.Format_RGBA8888)
        if not image.save(str(path), "PNG"):
            raise OSError(f"could not write the PNG file {path!s}")

    # --- redraw -------------------------------------------------------------------------------------
    def _axis_angle(self):
        axis, angle = self._orientation.as_axis_angle()
        return np.asarray(axis, dtype=float), float(angle)

    def _swept_matrix(self):
        axis, angle = self._axis_angle()
        if angle == 0 or self._sweep_t == 1.0:
            return self._orientation.as_matrix()
        return Orientation.from_axis_angle(axis, self._sweep_t * angle).as_matrix()

    def _refresh(self):
        """The state changed: the picture is worked out when it is next drawn or read (settle)."""
        self._unsettled = True
        self.view.update()

    def settle(self):
        """Bring the items, labels and overlay text up to date with the state set so far. Run before each
        frame is drawn and whenever the labels are read (LabelLayer's before_read), so nothing drawn or
        read is ever stale; between two frames it does its work once, however many edits came."""
        if not self._unsettled:
            return
        self._unsettled = False
        self.settles += 1
        axis, angle = self._axis_angle()
        rotation = self._swept_matrix()
        self.body_group.setTransform(gl_helpers.transform(rotation))
        self.rotation.update(axis, angle, self._tracked_body, self._sweep_t)
        ghost_shown = self._ghost is not None and self._ghost_enabled
        self.ghost_group.setVisible(ghost_shown)
        if ghost_shown:
            self.ghost_group.setTransform(gl_helpers.transform(self._ghost.as_matrix()))
        self._update_labels(rotation, axis, angle, ghost_shown)
        self._update_panels(angle, ghost_shown)

    def _update_labels(self, rotation, axis, angle, ghost_shown):
        lab = self.labels
        words = describe.frame_preset(self._preset).words
        for k, tip in enumerate(self.reference.tips(np.eye(3), 1.1)):
            lab.set_label(f"ref{k}", pos=tip, text=f"ref {'XYZ'[k]} ({words[(k, 1)]})",
                          rgb=_lighter(palette.AXIS_RGB[k], 0.45), visible=True)
        for k, tip in enumerate(self.body.tips(rotation, 1.16)):
            lab.set_label(f"body{k}", pos=tip, text="XYZ"[k], rgb=_lighter(palette.AXIS_RGB[k], 0.2), bold=True,
                          visible=True)
        anchors = self.part.face_label_anchors()
        for name in FACE_NAMES:
            boresight = name == self.part.boresight_face
            lab.set_label(f"face{name}", pos=rotation @ anchors[name], text=self.part.face_label_text(name),
                          rgb=_lighter(palette.BORESIGHT_RGB, 0.3) if boresight else palette.LABEL_TEXT_RGB,
                          normal=rotation @ FACE_NORMALS[name], visible=True)
        a = self.rotation.anchors
        has_axis = self.rotation.has_axis
        lab.set_label("n", pos=a.get("n", np.zeros(3)), text="n", rgb=palette.ROTATION_AXIS_RGB, bold=True,
                      visible=has_axis)
        swept = self._sweep_t * angle
        short = lambda deg: overlay_text.short_angle(deg, self._angle_unit)      # noqa: E731
        phi_text = f"\u03c6 {short(swept)}" if self._sweep_t == 1.0 else f"\u03c6 {short(swept)} of {short(angle)}"
        lab.set_label("phi", pos=a.get("phi", np.zeros(3)), text=phi_text, rgb=palette.ROTATION_AXIS_RGB,
                      bold=True, visible=has_axis and self.rotation.cone_visible and swept > 0)
        lab.set_label("alpha", pos=a.get("alpha", np.zeros(3)), text=f"\u03b1 {short(self.rotation.alpha_deg)}",
                      rgb=palette.ALPHA_RGB, visible=has_axis)
        lab.set_label("r", pos=a["r"], text=f"r ({overlay_text.tracked_words(self._tracked_label(), self._tracked_body)})",
                      rgb=palette.TRACKED_RGB, bold=True, visible=True)
        if ghost_shown:
            # at the top corner of the outline nearest the reference -X, -Y side, clear of the axes
            outline = self.part.edge_segments_drawn()
            corner = self._ghost.as_matrix() @ outline[np.argmax(outline @ np.array([-1.0, -1.0, 1.5]))]
            lab.set_label("ghost", pos=corner, text=f"ghost: {self._ghost_label}" if self._ghost_label else "ghost",
                          rgb=palette.GHOST_RGB, visible=True)
        else:
            lab.set_label("ghost", visible=False)

    def _tracked_label(self):
        if self._tracked_name == "boresight":
            return f"boresight {axes.display(self.part.boresight_face)}"
        if self._tracked_name:
            return axes.display(self._tracked_name)
        return None

    def _update_panels(self, angle, ghost_shown):
        text = palette.LABEL_TEXT_RGB
        lines = overlay_text.orientation_panel(self._orientation, self._representation, self._sequence,
                                               self._intrinsic, self._preset, self._angle_unit)
        self.labels.set_panel("orientation", "top-left", [(s, text) for s in lines])
        state = []
        if self._sweep_t < 1.0 and angle > 0:
            state.append((overlay_text.sweep_line(self._sweep_t, angle), palette.ROTATION_AXIS_RGB))
        if self.part.source != "box":
            state.append((f"part: {self.part.source.rsplit('/', 1)[-1]}", text))
        self.labels.set_panel("state", "top-right", state)
        legend = [("n  rotation axis, \u03c6 its angle", palette.ROTATION_AXIS_RGB),
                  ("r  tracked vector; cone = its sweep", palette.TRACKED_RGB),
                  ("r\u2225, r\u22a5  parts of r along / across n", palette.PARALLEL_RGB),
                  ("\u03b1  angle between r and n", palette.ALPHA_RGB)]
        if ghost_shown:
            legend.append((f"faint outline  ghost: {self._ghost_label}", palette.GHOST_RGB))
        self.labels.set_panel("legend", "bottom-left", legend, optional=True)

    def _sync_ghost_outline(self):
        self.ghost_outline.setData(pos=self.part.edge_segments_drawn())

    # --- toolbar actions ----------------------------------------------------------------------------
    def _tracked_from_toolbar(self, choice, typed):
        try:
            if choice == "typed":
                parts = [p for p in typed.replace(",", " ").replace("\u2212", "-").split() if p]
                if len(parts) != 3:
                    raise ValueError(f"type three numbers x, y, z for the tracked vector; got {typed!r}")
                self.set_tracked_vector([float(p) for p in parts])
            else:
                self.set_tracked_vector(choice)
            self.toolbar.show_message("")
        except ValueError as exc:
            self.toolbar.show_message(f"{exc} (kept the last good vector)")

    def _play(self, playing):
        if playing:
            if self._sweep_t >= 1.0:
                self.set_sweep(0.0)
            self._play_start_t = self._sweep_t
            self._play_clock.start()
            self._play_timer.start()
        else:
            self._play_timer.stop()

    def _play_step(self):
        t = self._play_start_t + self._play_clock.elapsed() / 1000.0 / PLAY_SECONDS
        self.set_sweep(min(t, 1.0))
        if t >= 1.0:
            self.toolbar.play.setChecked(False)

    def _export_dialog(self):
        path = dialog_folder.save_file_name(self, "Export the scene as PNG", "scene.png", "PNG image (*.png)")
        if not path:
            return
        size, ok = QtWidgets.QInputDialog.getText(self, "Image size", "Width x height in pixels:",
                                                  text=f"{max(self.view.width(), 640)} x {max(self.view.height(), 480)}")
        if not ok:
            return
        try:
            w, h = (int(p) for p in size.lower().replace("\u00d7", "x").split("x"))
            if not (16 <= w <= 8192 and 16 <= h <= 8192):
                raise ValueError
        except ValueError:
            self.toolbar.show_message(f"image size {size!r}: expected two whole numbers 16..8192 like 1920 x 1080")
            return
        try:
            self.export_png(path, w, h)
            self.toolbar.show_message("")
        except OSError as exc:
            self.toolbar.show_message(str(exc))

    def _stl_dialog(self):
        path = dialog_folder.open_file_name(self, "Part model from STL", "STL files (*.stl)")
        if not path:
            return
        try:
            self.load_part_stl(path)
            self.toolbar.show_message("")
        except StlError as exc:
            self.toolbar.show_message(f"{exc} (kept the last part)")
