"""The Rodrigues construction made visible: the rotation axis n (both ways, arrowhead on +n), the tracked
vector r at the start and at the current sweep, the sector of the cone r sweeps (apex at the origin, axis n,
half-angle α), the full circle of rotation, r∥ along n, r⊥ at the start and the end, the arc of the angle φ
and the small arc of α. Items are made once; an edit only rewrites their vertex data."""

from __future__ import annotations

import numpy as np

from app.scene import gl_helpers, palette
from app.scene.geometry import (arc_between, arrowhead_mesh, basis_with_z_along, cone_sector_triangles,
                                rodrigues_pieces)

AXIS_HALF_LENGTH = 1.45
TRACKED_LENGTH = 1.25  # r is drawn longer than the body axes (1.0) so its tip stands clear of them
CONE_SEGMENTS = 96
CIRCLE_SAMPLES = 129
ARC_SAMPLES = 64
ALPHA_ARC_RADIUS = 0.75  # outside the part, inside the cone
_DEGENERATE = 1e-9


class RotationConstruction:
    def __init__(self, view, depth=3):
        amber = palette.rgba_float(palette.ROTATION_AXIS_RGB)
        cyan = palette.rgba_float(palette.TRACKED_RGB)
        purple = palette.rgba_float(palette.PARALLEL_RGB)
        self.group = gl_helpers.group(depth=depth)
        view.addItem(self.group)
        g = self.group
        self.axis_line = gl_helpers.lines(g, color=amber, width=2.5)
        verts, faces = arrowhead_mesh(0.12, 0.045)
        self.axis_head = gl_helpers.mesh(g, vertexes=verts, faces=faces, color=amber, shader=None)
        self.r_start = gl_helpers.lines(g, color=palette.rgba_float(palette.TRACKED_START_RGB), width=2.5)
        self.r_now = gl_helpers.lines(g, color=cyan, width=3.5)
        self.r_head = gl_helpers.mesh(g, vertexes=verts * [0.8, 0.8, 0.8], faces=faces, color=cyan, shader=None)
        self.r_par = gl_helpers.lines(g, color=purple, width=3.5)
        self.r_perp = gl_helpers.lines(g, color=palette.rgba_float(palette.PARALLEL_RGB, 0.85), width=2.0)
        self.circle = gl_helpers.lines(g, color=palette.rgba_float(palette.TRACKED_RGB, 0.35), width=1.5,
                                       mode="line_strip")
        self.arc = gl_helpers.lines(g, color=amber, width=4.0, mode="line_strip")
        self.alpha_arc = gl_helpers.lines(g, color=palette.rgba_float(palette.ALPHA_RGB, 0.9), width=2.0,
                                          mode="line_strip")
        # The see-through cone is a top-level item drawn after the part (which sits at depth 4).
        self.cone = gl_helpers.mesh(None, depth=6, options=gl_helpers.SEE_THROUGH, shader=None,
                                    computeNormals=False, color=palette.rgba_float(palette.TRACKED_RGB, 0.26),
                                    vertexes=np.zeros((CONE_SEGMENTS, 3, 3)))
        view.addItem(self.cone)
        self.rotating_items = (self.axis_line, self.axis_head, self.r_par, self.r_perp, self.circle, self.arc,
                               self.alpha_arc, self.cone)
        self.anchors: dict[str, np.ndarray] = {}  # where the labels of n, r, φ, α go (reference frame)
        self.alpha_deg = 0.0
        self.has_axis = False
        self.cone_visible = False

    def update(self, axis, angle_deg, r_body, t):
        """axis, angle: the rotation from the reference to the current orientation (angle 0 = no axis);
        r_body: the tracked unit vector in the body frame; t in [0, 1]: how much of the rotation is shown."""
        r = np.asarray(r_body, dtype=float)
        r = TRACKED_LENGTH * r / np.linalg.norm(r)
        self.has_axis = angle_deg > 0 and np.linalg.norm(axis) > 0
        if not self.has_axis:  # at the reference: the axis is undefined, r does not move
            for item in self.rotating_items:
                item.setVisible(False)
            self._show_r(r, r)
            self.anchors = {"r": r * 1.1}
            self.cone_visible = False
            return
        pieces = rodrigues_pieces(axis, r)
        n = pieces.n
        self.alpha_deg = pieces.alpha_deg
        swept = np.radians(angle_deg) * t
        r_end = pieces.on_circle(swept)
        self.axis_line.setData(pos=np.array([-AXIS_HALF_LENGTH * n, AXIS_HALF_LENGTH * n]))
        self.axis_head.setTransform(gl_helpers.transform(basis_with_z_along(n), AXIS_HALF_LENGTH * n))
        for item in (self.axis_line, self.axis_head, self.r_par, self.alpha_arc):
            item.setVisible(True)
        self._show_r(r, r_end)
        self.r_par.setData(pos=np.array([np.zeros(3), pieces.r_par]))
        self.alpha_arc.setData(pos=arc_between(n, r, ALPHA_ARC_RADIUS, 24))
        mid_alpha = arc_between(n, r, ALPHA_ARC_RADIUS * 1.12, 3)[1]
        self.anchors = {"n": n * (AXIS_HALF_LENGTH + 0.13), "r": r_end * 1.1, "alpha": mid_alpha}

        self.cone_visible = np.linalg.norm(pieces.r_perp) > _DEGENERATE * TRACKED_LENGTH
        for item in (self.r_perp, self.circle, self.arc, self.cone):
            item.setVisible(self.cone_visible)
        if not self.cone_visible:  # r along n: nothing to sweep
            return
        self.r_perp.setData(pos=np.array([pieces.r_par, r, pieces.r_par, r_end]))
        self.circle.setData(pos=pieces.on_circle(np.linspace(0, 2 * np.pi, CIRCLE_SAMPLES)))
        self.arc.setData(pos=pieces.on_circle(np.linspace(0, swept, ARC_SAMPLES)))
        self.cone.setMeshData(vertexes=cone_sector_triangles(pieces, swept, CONE_SEGMENTS))
        mid = pieces.on_circle(swept / 2)
        outward = mid - pieces.r_par
        self.anchors["phi"] = mid + 0.18 * outward / np.linalg.norm(outward)

    def _show_r(self, r_start, r_end):
        self.r_start.setData(pos=np.array([np.zeros(3), r_start]))
        self.r_now.setData(pos=np.array([np.zeros(3), r_end * (1 - 0.09 / TRACKED_LENGTH)]))
        self.r_head.setTransform(gl_helpers.transform(basis_with_z_along(r_end), r_end))
        self.r_start.setVisible(not np.allclose(r_start, r_end))

