"""All text of the scene drawn in one pass after the 3D items: labels anchored to 3D points and overlay
panels in the corners. Every label gets a dark box behind it so it stays readable over any line or face.
Each box with its text is an image drawn once while it stays the same (text_images.py) and kept as a
texture (image_quads.py), so a frame places textures and draws only the leader lines: no QPainter on the
OpenGL device, whose begin and end alone cost a fifth of a frame on software OpenGL."""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np
from OpenGL import GL
from PySide6 import QtCore, QtGui
from pyqtgraph.opengl.GLGraphicsItem import GLGraphicsItem

from app.scene import palette
from app.scene.image_quads import ImageQuads
from app.scene.label_placement import leader_end, place_labels, stack_panels
from app.scene.text_images import TextImages

_BASE_HEIGHT = 800.0  # label sizes are chosen for an 800-pixel-high view and scale with the image


@dataclass
class Label:
    pos: np.ndarray
    text: str
    rgb: tuple
    bold: bool = False
    visible: bool = True
    normal: np.ndarray | None = None  # a face label shows only while its face turns towards the camera


@dataclass
class OverlayPanel:
    corner: str  # 'top-left', 'top-right', 'bottom-left', 'bottom-right'
    lines: list = field(default_factory=list)  # (text, rgb) pairs
    visible: bool = True
    optional: bool = False  # left out when it would leave the 3D labels too little room (a small view)


# Which labels win when there is no room for all (higher first): the body axes and the rotation axis the
# view is about, then the tracked vector, the angle and flagged points, then the reference axes, and last
# the names of faces and chain frames and the ghost's. A key's family is its name without the digits.
_IMPORTANCE = {"body": 5, "n": 5, "r": 4, "phi": 4, "flag": 4, "alpha": 3, "ref": 3, "face": 2, "chain": 2,
               "ghost": 1}


def importance(key: str) -> int:
    family = "face" if key.startswith("face") else key.rstrip("0123456789")
    return _IMPORTANCE.get(family, 2)


class LabelLayer(GLGraphicsItem):
    """before_read: called before the labels or panels are read from outside (the Scene works them out
    only when they are drawn or read, and this keeps a read from ever finding them stale)."""

    def __init__(self, before_read=None):
        super().__init__()
        self._labels: dict[str, Label] = {}
        self._panels: dict[str, OverlayPanel] = {}
        self._before_read = before_read
        self.images = TextImages()
        self.setDepthValue(10_000)  # drawn after every 3D item
        self._fonts = {}
        self._panel_rects = []
        self.drawn_labels: dict[str, QtCore.QRectF] = {}   # where each label went in the last paint
        self.drawn_panels: dict[str, QtCore.QRectF] = {}
        self.quads = ImageQuads()
        self._prepared = False

    # --- state --------------------------------------------------------------------------------------
    @property
    def labels(self) -> dict[str, Label]:
        if self._before_read is not None:
            self._before_read()
        return self._labels

    @property
    def panels(self) -> dict[str, OverlayPanel]:
        if self._before_read is not None:
            self._before_read()
        return self._panels

    def set_label(self, key, pos=None, text=None, rgb=None, bold=None, visible=None, normal=None):
        label = self._labels.get(key)
        if label is None:
            label = self._labels[key] = Label(np.zeros(3), "", palette.LABEL_TEXT_RGB)
        if pos is not None:
            label.pos = np.asarray(pos, dtype=float)
        if text is not None:
            label.text = text
        if rgb is not None:
            label.rgb = rgb
        if bold is not None:
            label.bold = bold
        if visible is not None:
            label.visible = visible
        if normal is not None:
            label.normal = np.asarray(normal, dtype=float)

    def set_panel(self, key, corner, lines, visible=True, optional=False):
        self._panels[key] = OverlayPanel(corner, list(lines), visible, optional)

    # --- drawing ------------------------------------------------------------------------------------
    def _font(self, pixel_size, bold, mono):
        key = (pixel_size, bold, mono)
        if key not in self._fonts:
            font = QtGui.QFont("DejaVu Sans Mono" if mono else "DejaVu Sans")
            font.setPixelSize(pixel_size)
            font.setBold(bold)
            self._fonts[key] = (font, QtGui.QFontMetrics(font))
        return self._fonts[key]

    def prepare(self):
        """Lay the labels and panels out for the frame about to be drawn and upload their new images; the
        view calls it before it clears (SceneView.before_clear), while nothing is drawn yet."""
        view = self.view()
        if view is None or not self.visible():
            return
        _, _, width, height = (int(v) for v in GL.glGetIntegerv(GL.GL_VIEWPORT))
        self.quads.begin(width, height)
        self._prepared = True
        if width <= 0 or height <= 0:
            return
        scale = max(0.85, min(3.0, height / _BASE_HEIGHT))
        panels = self._layout_panels(width, height, scale)
        # leader lines under the panels and the labels, so no line crosses a text
        self._paint_labels(view, width, height, scale, before_boxes=lambda: self._paint_panels(panels, scale))
        self.quads.upload()

    def paint(self):
        GL.glDepthMask(GL.GL_TRUE)  # see-through items turn depth writes off; the next clear needs them on
        if not self._prepared:   # drawn without the view's call to prepare first
            self.prepare()
        self._prepared = False
        self.quads.draw()

    def _paint_labels(self, view, width, height, scale, before_boxes):
        self.drawn_labels = {}
        shown = [(key, lab) for key, lab in self._labels.items() if lab.visible and lab.text]
        if not shown:
            before_boxes()
            return
        mvp = view.currentProjection() * view.currentModelView()
        m = np.array(mvp.data(), dtype=float).reshape(4, 4).T  # QMatrix4x4.data() is column-major
        clip = np.c_[np.array([lab.pos for _, lab in shown]), np.ones(len(shown))] @ m.T
        pad = round(3 * scale)
        camera = np.array(view.cameraPosition().toTuple(), dtype=float)
        keys, anchors, sizes, fonts = [], [], [], []
        for (key, lab), c in zip(shown, clip):
            if c[3] <= 1e-9:
                continue  # behind the camera
            if lab.normal is not None and np.dot(lab.normal, camera - lab.pos) <= 0:
                continue  # a face turned away from the camera
            font, metrics = self._font(round(15 * scale), lab.bold, False)
            keys.append(key)
            anchors.append(((c[0] / c[3] + 1.0) * 0.5 * width, (1.0 - c[1] / c[3]) * 0.5 * height))
            sizes.append((metrics.boundingRect(lab.text).width() + 2 * pad, metrics.height() + 2 * pad))
            fonts.append(font)
        # labels keep clear of the corner panels and of each other (label_placement.py)
        places = place_labels(anchors, sizes, [importance(k) for k in keys], width, height, self._panel_rects)
        leaders = {}   # colour -> segments, one batch each
        for key, (x, y), place in zip(keys, anchors, places):
            if place.rect is not None and place.leader:
                leaders.setdefault(self._labels[key].rgb, []).append(((x, y), leader_end(place.rect, x, y)))
        for rgb, segments in leaders.items():
            self.quads.lines(segments, (*(c / 255 for c in rgb), 170 / 255), max(1.0, scale))
            dot = self.images.dot(rgb, 2.0 * scale)
            for (x, y), _ in segments:
                self.quads.image(dot, round(x - dot.width() / 2), round(y - dot.height() / 2))
        before_boxes()
        for key, font, place in zip(keys, fonts, places):
            if place.rect is None:
                continue  # no room near its anchor: the less important label is left out
            lab = self._labels[key]
            self.drawn_labels[key] = place.rect
            rect = place.rect
            image = self.images.label(lab.text, font, lab.rgb, palette.LABEL_BOX_RGBA, rect.width(), rect.height())
            self.quads.image(image, round(rect.left()), round(rect.top()))

    def _layout_panels(self, width, height, scale):
        """Where each shown overlay panel goes, as (panel, rect) pairs; also kept for the labels to avoid."""
        margin, pad = round(10 * scale), round(8 * scale)
        _, metrics = self._font(round(14 * scale), False, True)
        line_h = metrics.height()
        # the required panels first, so an optional one (the legend) gives way when they meet
        shown = sorted(((k, p) for k, p in self._panels.items() if p.visible and p.lines), key=lambda kp: kp[1].optional)
        sizes = [(max(metrics.horizontalAdvance(text) for text, _ in p.lines) + 2 * pad, line_h * len(p.lines) + 2 * pad)
                 for _, p in shown]
        rects = stack_panels(sizes, [p.corner for _, p in shown], [p.optional for _, p in shown], width, height,
                             margin)
        self._panel_rects = [r for r in rects if r is not None]
        self.drawn_panels = {k: r for (k, _), r in zip(shown, rects) if r is not None}
        return [(p, r) for (_, p), r in zip(shown, rects) if r is not None]

    def _paint_panels(self, panels, scale):
        pad = round(8 * scale)
        font, metrics = self._font(round(14 * scale), False, True)
        for panel, rect in panels:
            image = self.images.panel(panel.lines, font, metrics, palette.OVERLAY_BOX_RGBA, pad, rect.width(),
                                      rect.height())
            self.quads.image(image, round(rect.left()), round(rect.top()))
