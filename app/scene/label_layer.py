"""All text of the scene drawn in one QPainter pass after the 3D items: labels anchored to 3D points and
overlay panels in the corners. One pass (instead of one painter per label) keeps a redraw cheap on software
OpenGL, and every label gets a dark box behind it so it stays readable over any line or face."""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np
from OpenGL import GL
from PySide6 import QtCore, QtGui
from PySide6.QtOpenGL import QOpenGLPaintDevice
from pyqtgraph.opengl.GLGraphicsItem import GLGraphicsItem

from app.scene import palette

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


# An optional panel (the legend) is drawn only while the panels together take at most this share of the
# view's height, so a short view keeps room for the axis and angle labels it explains.
_OPTIONAL_PANEL_SHARE = 0.6


class LabelLayer(GLGraphicsItem):
    def __init__(self):
        super().__init__()
        self.labels: dict[str, Label] = {}
        self.panels: dict[str, OverlayPanel] = {}
        self.setDepthValue(10_000)  # drawn after every 3D item
        self._fonts = {}
        self._panel_rects = []
        self._label_box = QtGui.QColor(*palette.LABEL_BOX_RGBA)
        self._panel_box = QtGui.QColor(*palette.OVERLAY_BOX_RGBA)
        self._device = None

    # --- state --------------------------------------------------------------------------------------
    def set_label(self, key, pos=None, text=None, rgb=None, bold=None, visible=None, normal=None):
        label = self.labels.get(key)
        if label is None:
            label = self.labels[key] = Label(np.zeros(3), "", palette.LABEL_TEXT_RGB)
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
        self.panels[key] = OverlayPanel(corner, list(lines), visible, optional)

    # --- drawing ------------------------------------------------------------------------------------
    def _font(self, pixel_size, bold, mono):
        key = (pixel_size, bold, mono)
        if key not in self._fonts:
            font = QtGui.QFont("DejaVu Sans Mono" if mono else "DejaVu Sans")
            font.setPixelSize(pixel_size)
            font.setBold(bold)
            self._fonts[key] = (font, QtGui.QFontMetrics(font))
        return self._fonts[key]

    def paint(self):
        view = self.view()
        GL.glDepthMask(GL.GL_TRUE)  # see-through items turn depth writes off; the next clear needs them on
        _, _, width, height = (int(v) for v in GL.glGetIntegerv(GL.GL_VIEWPORT))
        if width <= 0 or height <= 0:
            return
        scale = max(0.85, min(3.0, height / _BASE_HEIGHT))
        if self._device is None:
            self._device = QOpenGLPaintDevice()
        self._device.setSize(QtCore.QSize(width, height))
        painter = QtGui.QPainter(self._device)
        try:
            painter.setRenderHints(QtGui.QPainter.RenderHint.Antialiasing | QtGui.QPainter.RenderHint.TextAntialiasing)
            self._paint_panels(painter, width, height, scale)
            self._paint_labels(painter, view, width, height, scale)
        finally:
            painter.end()

    def _paint_labels(self, painter, view, width, height, scale):
        shown = [lab for lab in self.labels.values() if lab.visible and lab.text]
        if not shown:
            return
        mvp = view.currentProjection() * view.currentModelView()
        m = np.array(mvp.data(), dtype=float).reshape(4, 4).T  # QMatrix4x4.data() is column-major
        points = np.array([lab.pos for lab in shown])
        clip = np.c_[points, np.ones(len(points))] @ m.T
        pad = round(3 * scale)
        camera = np.array(view.cameraPosition().toTuple(), dtype=float)
        placed = list(self._panel_rects)  # labels keep clear of the corner panels and of each other
        for lab, c in zip(shown, clip):
            if c[3] <= 1e-9:
                continue  # behind the camera
            if lab.normal is not None and np.dot(lab.normal, camera - lab.pos) <= 0:
                continue  # a face turned away from the camera
            x = (c[0] / c[3] + 1.0) * 0.5 * width
            y = (1.0 - c[1] / c[3]) * 0.5 * height
            font, metrics = self._font(round(15 * scale), lab.bold, False)
            rect = metrics.boundingRect(lab.text)
            w, h = rect.width() + 2 * pad, metrics.height() + 2 * pad
            box = _free_spot(x, y, w, h, width, height, placed)
            placed.append(box)
            painter.fillRect(box, self._label_box)  # square boxes: far cheaper than rounded paths on GL
            painter.setFont(font)
            painter.setPen(QtGui.QColor(*lab.rgb))
            painter.drawText(box, QtCore.Qt.AlignmentFlag.AlignCenter, lab.text)

    def _paint_panels(self, painter, width, height, scale):
        self._panel_rects = []
        margin, pad = round(10 * scale), round(8 * scale)
        font, metrics = self._font(round(14 * scale), False, True)
        painter.setFont(font)
        line_h = metrics.height()
        shown = [p for p in self.panels.values() if p.visible and p.lines]
        for side in ("left", "right"):   # the panels stacked on one side, top and bottom corner
            stacked = [p for p in shown if side in p.corner]
            used = sum(line_h * len(p.lines) + 2 * pad + margin for p in stacked)
            if used > _OPTIONAL_PANEL_SHARE * height:
                shown = [p for p in shown if not (p.optional and side in p.corner)]
        for panel in shown:
            w = max(metrics.horizontalAdvance(text) for text, _ in panel.lines) + 2 * pad
            h = line_h * len(panel.lines) + 2 * pad
            left = margin if "left" in panel.corner else width - w - margin
            top = margin if "top" in panel.corner else height - h - margin
            painter.fillRect(QtCore.QRectF(left, top, w, h), self._panel_box)
            self._panel_rects.append(QtCore.QRectF(left, top, w, h))
            for i, (text, rgb) in enumerate(panel.lines):
                painter.setPen(QtGui.QColor(*rgb))
                painter.drawText(QtCore.QPointF(left + pad, top + pad + i * line_h + metrics.ascent()), text)


def _free_spot(x, y, w, h, width, height, placed):
    """A w x h box near the anchor (x, y) that overlaps no placed box if one of a few nearby spots is free,
    always wholly inside the image (never clipped)."""
    def box_at(cx, cy):
        left = min(max(cx - w / 2, 2), width - w - 2)
        top = min(max(cy - h / 2, 2), height - h - 2)
        return QtCore.QRectF(left, top, w, h)

    step = h * 1.05
    offsets = [(0, 0), (0, -step), (0, step), (w * 0.6, 0), (-w * 0.6, 0), (0, -2 * step), (0, 2 * step),
               (w * 0.6, -step), (-w * 0.6, step), (w * 0.6, step), (-w * 0.6, -step)]
    for dx, dy in offsets:
        box = box_at(x + dx, y + dy)
        if not any(box.intersects(other) for other in placed):
            return box
    return box_at(x, y)
