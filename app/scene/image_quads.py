"""The Scene's text images and leader lines drawn straight with OpenGL, in pixels (x right, y down).

QPainter on the OpenGL paint device costs about 5 ms per frame on software OpenGL (Mesa llvmpipe) just to
begin and end, before it draws anything; that was a fifth of a frame. Here every image is copied once into
one texture while it stays the same (its cacheKey) and a frame's images are drawn as quads in one draw; the
leader lines are a batch of lines per colour. Images are premultiplied (QImage's ARGB32_Premultiplied), so
they blend with (1, 1 − source alpha).
"""

from __future__ import annotations

import numpy as np
from OpenGL import GL
from PySide6 import QtGui
from pyqtgraph.opengl import shaders

_PROGRAM = shaders.ShaderProgram("framewright_image_quads", [
    shaders.VertexShader("""
        uniform vec2 u_view;            // the viewport's size in pixels
        attribute vec2 a_position;      // pixels, y down
        attribute vec2 a_texcoord;
        attribute vec4 a_color;
        varying vec2 v_texcoord;
        varying vec4 v_color;
        void main() {
            v_texcoord = a_texcoord;
            v_color = a_color;
            gl_Position = vec4(2.0 * a_position.x / u_view.x - 1.0, 1.0 - 2.0 * a_position.y / u_view.y, 0.0, 1.0);
        }
    """),
    shaders.FragmentShader("""
        #ifdef GL_ES
        precision mediump float;
        #endif
        uniform sampler2D u_image;
        varying vec2 v_texcoord;
        varying vec4 v_color;
        void main() {
            gl_FragColor = texture2D(u_image, v_texcoord) * v_color;
        }
    """),
])

_ATLAS_SIDE = 2048      # one texture holds every image of a few frames; llvmpipe allows 16384


class ImageQuads:
    """Draws images and lines into the current viewport: lines first, then every image of the frame in the
    order given, as quads of one draw from one texture (an atlas). Binding a texture per image cost about
    0.2 ms each on llvmpipe, several milliseconds a frame. A new image is copied into a free spot of the
    atlas once; when the atlas is full it starts afresh with the images of the frame at hand. Its texture
    belongs to the context group it was made in and is dropped, never reused, when that group changes."""

    def __init__(self):
        self._group = None
        self._texture = None
        self._side = _ATLAS_SIDE
        self._spots: dict[int, tuple[int, int, int, int]] = {}   # QImage.cacheKey() -> (x, y, w, h)
        self._shelf = (0, 0, 0)   # the spot for the next image: x, y, and the height of the row it is on
        self._images = []
        self._lines = []
        self.uploads = 0    # images copied into the atlas so far (a test counts them: each once)

    # --- one frame ------------------------------------------------------------------------------------
    def begin(self, width, height):
        group = QtGui.QOpenGLContext.currentContext().shareGroup()
        if group is not self._group:   # a new context group: the old texture means nothing there
            self._group, self._texture = group, None
        self._size = (float(width), float(height))
        self._images, self._lines = [], []

    def image(self, image: QtGui.QImage, left, top):
        """`image` with its top-left corner at pixel (left, top), one image pixel to one screen pixel."""
        self._images.append((image, float(left), float(top)))

    def lines(self, segments, rgba, width):
        """Line segments ((x0, y0), (x1, y1)) in pixels, in one colour (r, g, b, a in 0..1), smoothed.
        Lines of one width are drawn together, in one draw."""
        if len(segments):
            points = np.asarray(segments, dtype=np.float32).reshape(-1, 2)
            self._lines.append((points, np.tile(np.asarray(rgba, dtype=np.float32), (len(points), 1)), float(width)))

    def upload(self):
        """Copy the frame's new images into the atlas. Done before the frame's first draw (its clear):
        llvmpipe finishes every draw queued so far before it lets a texture change, and a frame split in
        two so cost 2-3 ms more than the same frame in one go."""
        self._make_room()

    def draw(self):
        """Draw the lines and the images given since begin, once upload has put the images in the atlas."""
        if not self._images and not self._lines:
            return
        program = _PROGRAM.program()
        GL.glUseProgram(program)
        GL.glUniform2f(GL.glGetUniformLocation(program, "u_view"), *self._size)
        GL.glUniform1i(GL.glGetUniformLocation(program, "u_image"), 0)
        GL.glActiveTexture(GL.GL_TEXTURE0)
        GL.glBindTexture(GL.GL_TEXTURE_2D, self._texture)
        GL.glDisable(GL.GL_DEPTH_TEST)
        GL.glDisable(GL.GL_CULL_FACE)
        GL.glEnable(GL.GL_BLEND)
        GL.glBindBuffer(GL.GL_ARRAY_BUFFER, 0)
        locations = [GL.glGetAttribLocation(program, name) for name in ("a_position", "a_texcoord", "a_color")]
        for loc in locations:
            GL.glEnableVertexAttribArray(loc)
        try:
            self._draw_lines(locations)
            self._draw_images(locations)
        finally:
            for loc in locations:
                GL.glDisableVertexAttribArray(loc)
            GL.glBindTexture(GL.GL_TEXTURE_2D, 0)
            GL.glUseProgram(0)
            GL.glBlendFunc(GL.GL_SRC_ALPHA, GL.GL_ONE_MINUS_SRC_ALPHA)

    # --- drawing ----------------------------------------------------------------------------------------
    def _draw_lines(self, locations):
        # smoothing scales a fragment's alpha by its coverage, not its colour: blended as straight alpha,
        # sampling the atlas's first texel, which is kept white
        GL.glBlendFunc(GL.GL_SRC_ALPHA, GL.GL_ONE_MINUS_SRC_ALPHA)
        GL.glEnable(GL.GL_LINE_SMOOTH)
        for width in sorted({width for _, _, width in self._lines}):
            batch = [(points, colours) for points, colours, w in self._lines if w == width]
            points = np.concatenate([p for p, _ in batch])
            GL.glLineWidth(width)
            _draw(locations, GL.GL_LINES, points, np.full((len(points), 2), 0.5 / self._side, dtype=np.float32),
                  np.concatenate([c for _, c in batch]))
        GL.glDisable(GL.GL_LINE_SMOOTH)

    def _draw_images(self, locations):
        if not self._images:
            return
        GL.glBlendFunc(GL.GL_ONE, GL.GL_ONE_MINUS_SRC_ALPHA)   # the images are premultiplied
        corners, texels = [], []
        for image, left, top in self._images:
            x, y, w, h = self._spots[image.cacheKey()]
            corners.append((left, top, left + w, top + h))
            texels.append((x, y, x + w, y + h))
        # two triangles per image: (x0 y0, x1 y0, x0 y1) and (x1 y0, x1 y1, x0 y1)
        order = np.array([[0, 1], [2, 1], [0, 3], [2, 1], [2, 3], [0, 3]])
        positions = np.asarray(corners, dtype=np.float32)[:, order].reshape(-1, 2)
        uv = (np.asarray(texels, dtype=np.float32)[:, order] / self._side).reshape(-1, 2)
        _draw(locations, GL.GL_TRIANGLES, positions, uv, np.ones((len(positions), 4), dtype=np.float32))

    # --- the atlas --------------------------------------------------------------------------------------
    def _make_room(self):
        """Every image of this frame in the atlas: new ones copied into free spots; when they do not fit,
        the atlas starts afresh (larger, if one image alone is wider or taller than it)."""
        if self._texture is None:
            self._new_atlas(self._side)
        new = {}
        for image, _, _ in self._images:
            if image.cacheKey() not in self._spots:
                new[image.cacheKey()] = image
        if not new:
            return
        if not self._fit(new):
            need = max(max(i.width(), i.height()) for i, _, _ in self._images) + 2
            self._new_atlas(max(_ATLAS_SIDE, 1 << (need - 1).bit_length()))
            new = {image.cacheKey(): image for image, _, _ in self._images}
            if not self._fit(new):   # this frame's images alone fill the atlas: a larger one
                self._new_atlas(self._side * 2)
                self._fit(new)
        GL.glBindTexture(GL.GL_TEXTURE_2D, self._texture)
        # rows of exactly w pixels from the first: Qt's own uploads leave other unpack settings behind
        for setting, value in ((GL.GL_UNPACK_ALIGNMENT, 4), (GL.GL_UNPACK_ROW_LENGTH, 0),
                               (GL.GL_UNPACK_SKIP_PIXELS, 0), (GL.GL_UNPACK_SKIP_ROWS, 0)):
            GL.glPixelStorei(setting, value)
        for key, image in new.items():
            x, y, w, h = self._spots[key]
            GL.glTexSubImage2D(GL.GL_TEXTURE_2D, 0, x, y, w, h, GL.GL_BGRA, GL.GL_UNSIGNED_INT_8_8_8_8_REV,
                               _pixels(image))
            self.uploads += 1

    def _fit(self, images) -> bool:
        """Spots for `images` on shelves (rows as tall as their tallest image), tallest first; False and
        nothing taken when they do not all fit."""
        spots, (x, y, row) = {}, self._shelf
        for key, image in sorted(images.items(), key=lambda kv: -kv[1].height()):
            w, h = image.width(), image.height()
            if x + w > self._side:
                x, y, row = 0, y + row + 1, 0
            if w > self._side or y + h > self._side:
                return False
            spots[key] = (x, y, w, h)
            x, row = x + w + 1, max(row, h)   # one clear texel between images, so none bleeds into another
        self._spots.update(spots)
        self._shelf = (x, y, row)
        return True

    def _new_atlas(self, side):
        if self._texture is not None:
            GL.glDeleteTextures(np.array([self._texture], dtype=np.uint32))
        self._side, self._spots = side, {}
        self._shelf = (1, 0, 1)   # texel (0, 0) stays white, for the lines
        self._texture = int(GL.glGenTextures(1))
        GL.glBindTexture(GL.GL_TEXTURE_2D, self._texture)
        for parameter in (GL.GL_TEXTURE_MIN_FILTER, GL.GL_TEXTURE_MAG_FILTER):
            GL.glTexParameteri(GL.GL_TEXTURE_2D, parameter, GL.GL_NEAREST)   # drawn pixel for pixel: crisp
        for parameter in (GL.GL_TEXTURE_WRAP_S, GL.GL_TEXTURE_WRAP_T):
            GL.glTexParameteri(GL.GL_TEXTURE_2D, parameter, GL.GL_CLAMP_TO_EDGE)
        GL.glTexImage2D(GL.GL_TEXTURE_2D, 0, GL.GL_RGBA8, side, side, 0, GL.GL_BGRA, GL.GL_UNSIGNED_BYTE, None)
        GL.glTexSubImage2D(GL.GL_TEXTURE_2D, 0, 0, 0, 1, 1, GL.GL_BGRA, GL.GL_UNSIGNED_INT_8_8_8_8_REV,
                           np.full(1, 0xFFFFFFFF, dtype=np.uint32))


def _pixels(image: QtGui.QImage) -> np.ndarray:
    """The image's pixels as 32-bit words 0xAARRGGBB, one per pixel (rows of ARGB32 are never padded),
    which OpenGL reads as (GL_BGRA, GL_UNSIGNED_INT_8_8_8_8_REV) on any byte order."""
    if image.format() != QtGui.QImage.Format.Format_ARGB32_Premultiplied:
        image = image.convertToFormat(QtGui.QImage.Format.Format_ARGB32_Premultiplied)
    return np.frombuffer(image.constBits(), dtype=np.uint32, count=image.width() * image.height()).copy()


def _draw(locations, mode, positions, texcoords, colours):
    pos_loc, uv_loc, colour_loc = locations
    GL.glVertexAttribPointer(pos_loc, 2, GL.GL_FLOAT, False, 0, positions)
    GL.glVertexAttribPointer(uv_loc, 2, GL.GL_FLOAT, False, 0, texcoords)
    GL.glVertexAttribPointer(colour_loc, 4, GL.GL_FLOAT, False, 0, colours)
    GL.glDrawArrays(mode, 0, len(positions))
