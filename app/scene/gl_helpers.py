"""Small helpers around pyqtgraph.opengl items: GL state options, a softly lit shader, group nodes and
4x4 transforms from numpy rotations."""

from __future__ import annotations

import numpy as np
from OpenGL import GL
from PySide6 import QtGui
from pyqtgraph.opengl import GLLinePlotItem, GLMeshItem, shaders
from pyqtgraph.opengl.GLGraphicsItem import GLGraphicsItem

# Lines hide behind nearer lines (depth test) and are smooth (blended).
LINES = {
    GL.GL_DEPTH_TEST: True,
    GL.GL_BLEND: True,
    GL.GL_CULL_FACE: False,
    "glBlendFuncSeparate": (GL.GL_SRC_ALPHA, GL.GL_ONE_MINUS_SRC_ALPHA, GL.GL_ONE, GL.GL_ONE_MINUS_SRC_ALPHA),
    "glDepthMask": (GL.GL_TRUE,),
}
# See-through surfaces (part, cone) test depth but do not write it, so the lines and the cone behind a
# face still show through it. The label layer, drawn last, turns depth writes back on for the next clear.
SEE_THROUGH = {**LINES, "glDepthMask": (GL.GL_FALSE,)}
SOLID = {**LINES, GL.GL_BLEND: False}

_SOFT_LIGHT = shaders.ShaderProgram("framewright_soft_light", [
    shaders.VertexShader("""
        uniform mat4 u_mvp;
        uniform mat3 u_normal;
        attribute vec4 a_position;
        attribute vec3 a_normal;
        attribute vec4 a_color;
        varying vec4 v_color;
        varying vec3 v_normal;
        void main() {
            v_normal = normalize(u_normal * a_normal);
            v_color = a_color;
            gl_Position = u_mvp * a_position;
        }
    """),
    shaders.FragmentShader("""
        #ifdef GL_ES
        precision mediump float;
        #endif
        varying vec4 v_color;
        varying vec3 v_normal;
        void main() {
            // faces keep most of their colour whichever way they face, so no face goes black
            float p = abs(dot(v_normal, normalize(vec3(0.4, 0.6, 1.0))));
            gl_FragColor = vec4(v_color.rgb * (0.6 + 0.4 * p), v_color.a);
        }
    """),
])


def soft_light_shader():
    return _SOFT_LIGHT


def group(parent=None, depth=0):
    node = GLGraphicsItem(parentItem=parent)
    node.setDepthValue(depth)
    return node


def lines(parent=None, pos=None, color=(1, 1, 1, 1), width=2.0, mode="lines", depth=0, options=LINES):
    item = GLLinePlotItem(parentItem=parent, pos=np.zeros((2, 3)) if pos is None else pos,
                                         color=color, width=width, mode=mode, antialias=True)
    item.setGLOptions(options)
    item.setDepthValue(depth)
    return item


def mesh(parent=None, depth=0, options=SOLID, **kwds):
    item = GLMeshItem(parentItem=parent, glOptions=options, **kwds)
    item.setDepthValue(depth)
    return item


def transform(rotation=None, translation=None, scale=None) -> QtGui.QMatrix4x4:
    """4x4 [s·R | t] as a QMatrix4x4 (the constructor takes the 16 numbers row by row)."""
    m = np.eye(4)
    if rotation is not None:
        m[:3, :3] = rotation
    if scale is not None:
        m[:3, :3] = m[:3, :3] * scale
    if translation is not None:
        m[:3, 3] = translation
    return QtGui.QMatrix4x4(*m.ravel().tolist())
