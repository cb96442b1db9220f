"""Three coloured axes from the origin with arrowheads: the body frame, its ghost, and (faintly) the
reference frame. Built once; an orientation change only moves the parent group."""

from __future__ import annotations

import numpy as np

from app.scene import gl_helpers, palette
from app.scene.geometry import arrowhead_mesh, basis_with_z_along


class FrameTriad:
    def __init__(self, parent, length, colours, alpha=1.0, width=3.0, head=0.09, depth=0):
        self.length = length
        pos = np.zeros((6, 3))
        colour = np.zeros((6, 4))
        for k in range(3):
            pos[2 * k + 1, k] = length - (head * 0.9 if head else 0.0)  # the shaft stops inside the head
            colour[2 * k: 2 * k + 2] = palette.rgba_float(colours[k], alpha)
        self.shafts = gl_helpers.lines(parent, pos=pos, color=colour, width=width, depth=depth)
        self.heads = []
        if head:
            verts, faces = arrowhead_mesh(head, head * 0.38)
            for k in range(3):
                direction = np.eye(3)[k]
                item = gl_helpers.mesh(parent, depth=depth, vertexes=verts, faces=faces,
                                       color=palette.rgba_float(colours[k], alpha), shader=None,
                                       options=gl_helpers.SOLID if alpha >= 1 else gl_helpers.SEE_THROUGH)
                item.setTransform(gl_helpers.transform(basis_with_z_along(direction), direction * length))
                self.heads.append(item)

    def tips(self, rotation, extra=1.0) -> np.ndarray:
        """Where the three axis tips are in the reference frame, pushed out by `extra` (for labels)."""
        return (np.asarray(rotation) * self.length * extra).T

    def set_visible(self, visible):
        for item in (self.shafts, *self.heads):
            item.setVisible(visible)
