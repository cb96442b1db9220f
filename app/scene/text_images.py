"""The Scene's texts drawn once into small images and kept while they stay the same.

Drawing text through QPainter on the OpenGL paint device costs about a third of a millisecond per call on
software OpenGL (Mesa llvmpipe), and a frame has some thirty of them. A label's box with its text, or an
overlay panel with its lines, is drawn here with Qt's raster engine into an image the first time it is
needed; a frame then only places the images, which the OpenGL paint engine keeps as textures. Most labels
(the axis names, the faces, the reference directions) never change, so most frames draw no text at all.
"""

from __future__ import annotations

import math

from PySide6 import QtCore, QtGui

# Enough for every label and panel of a few views at a few sizes; past it the cache starts afresh rather
# than growing with every orientation's overlay text.
_MOST_KEPT = 512


class TextImages:
    def __init__(self):
        self._kept: dict[tuple, QtGui.QImage] = {}
        self.drawn = 0  # images drawn so far (a test counts them: an unchanged label is never drawn again)

    def _image(self, key, width, height, box_rgba, draw) -> QtGui.QImage:
        image = self._kept.get(key)
        if image is None:
            if len(self._kept) >= _MOST_KEPT:
                self._kept.clear()
            image = QtGui.QImage(max(1, math.ceil(width)), max(1, math.ceil(height)),
                                 QtGui.QImage.Format.Format_ARGB32_Premultiplied)
            image.fill(QtGui.QColor(*box_rgba))  # the box: square, the whole image
            painter = QtGui.QPainter(image)
            try:
                painter.setRenderHints(QtGui.QPainter.RenderHint.Antialiasing |
                                       QtGui.QPainter.RenderHint.TextAntialiasing)
                draw(painter)
            finally:
                painter.end()
            self._kept[key] = image
            self.drawn += 1
        return image

    def label(self, text, font, rgb, box_rgba, width, height) -> QtGui.QImage:
        """A label: its text centred on a square box of `box_rgba` (square: far cheaper than rounded)."""
        def draw(painter):
            painter.setFont(font)
            painter.setPen(QtGui.QColor(*rgb))
            painter.drawText(QtCore.QRectF(0, 0, width, height), QtCore.Qt.AlignmentFlag.AlignCenter, text)

        key = ("label", text, font.key(), tuple(rgb), tuple(box_rgba), width, height)
        return self._image(key, width, height, box_rgba, draw)

    def dot(self, rgb, radius) -> QtGui.QImage:
        """A filled round dot of `radius` pixels on a clear square, centred: where a leader line starts."""
        size = 2 * math.ceil(radius) + 2

        def draw(painter):
            painter.setPen(QtCore.Qt.PenStyle.NoPen)
            painter.setBrush(QtGui.QColor(*rgb))
            painter.drawEllipse(QtCore.QPointF(size / 2, size / 2), radius, radius)

        return self._image(("dot", tuple(rgb), radius), size, size, (0, 0, 0, 0), draw)

    def panel(self, lines, font, metrics, box_rgba, pad, width, height) -> QtGui.QImage:
        """An overlay panel: its (text, rgb) lines, one under the other, on a box of `box_rgba`."""
        def draw(painter):
            painter.setFont(font)
            for i, (text, rgb) in enumerate(lines):
                painter.setPen(QtGui.QColor(*rgb))
                painter.drawText(QtCore.QPointF(pad, pad + i * metrics.height() + metrics.ascent()), text)

        key = ("panel", tuple((text, tuple(rgb)) for text, rgb in lines), font.key(), tuple(box_rgba), pad,
               width, height)
        return self._image(key, width, height, box_rgba, draw)
