"""The part drawn in the body frame: a box with editable dimensions by default, or an STL mesh. Faces are
labelled (+X … −Z and the user's own names) and one face is marked as the boresight face."""

from __future__ import annotations

import numpy as np
from OpenGL import GL

from app.scene import gl_helpers, palette
from app.scene.geometry import FACE_NAMES, FACE_NORMALS, box_edges, box_mesh, boresight_mark, face_centres
from app.scene.stl_reader import StlError, read_stl
from core import axes

DRAWN_HALF_EXTENT = 0.45  # the part is scaled so its farthest extent from the origin is this (axes are 1.0)
DEFAULT_SIZE = (120.0, 80.0, 50.0)
DEFAULT_BORESIGHT = "+Z"
SMALLEST_DRAWN_SIZE, LARGEST_DRAWN_SIZE = 1e-9, 1e12   # any unit; the Part dialog holds mm to 1e-3..1e6
_FACE_ALPHA = 0.42
_BORESIGHT_ALPHA = 0.70
_FRONT_FACES_ONLY = {**gl_helpers.SEE_THROUGH, GL.GL_CULL_FACE: True}


def normalise_face_name(name: str) -> str:
    key = axes.axis_name(name)
    if key is None:
        raise ValueError(f"unknown face {name!r}; expected one of {', '.join(FACE_NAMES)}")
    return key


class PartModel:
    def __init__(self, parent, depth=1):
        self.group = gl_helpers.group(parent, depth=depth)
        self.faces = gl_helpers.mesh(self.group, depth=1, options=gl_helpers.SEE_THROUGH,
                                     shader=gl_helpers.soft_light_shader(), smooth=False)
        self.edges = gl_helpers.lines(self.group, color=palette.rgba_float((200, 206, 216), 0.9), width=1.5, depth=0)
        self.mark = gl_helpers.lines(self.group, color=palette.rgba_float(palette.BORESIGHT_RGB), width=2.5, depth=0)
        self.size = np.array(DEFAULT_SIZE)
        self.face_names: dict[str, str] = {}
        self.boresight_face = DEFAULT_BORESIGHT
        self.source = "box"  # or the STL file name
        self.scale = 1.0
        self.lower = -0.5 * self.size
        self.upper = 0.5 * self.size
        self.set_box(DEFAULT_SIZE, {}, DEFAULT_BORESIGHT)

    # --- state --------------------------------------------------------------------------------------
    def set_box(self, size, face_names=None, boresight_face=DEFAULT_BORESIGHT):
        size = np.asarray(size, dtype=float)
        if size.shape != (3,) or not np.all(np.isfinite(size)) or np.any(size <= 0):
            raise ValueError(f"part dimensions must be three positive numbers (x, y, z), got {size.tolist()}")
        if np.any(size < SMALLEST_DRAWN_SIZE) or np.any(size > LARGEST_DRAWN_SIZE):
            # The drawing scale is 1 / size and the vertices go to the GPU in single precision: sizes far
            # outside any part would divide by (nearly) zero or overflow there.
            raise ValueError(f"part dimensions must lie between {SMALLEST_DRAWN_SIZE:g} and "
                             f"{LARGEST_DRAWN_SIZE:g}, got {size.tolist()}")
        self.boresight_face = normalise_face_name(boresight_face)
        self.face_names = {normalise_face_name(k): str(v) for k, v in (face_names or {}).items() if str(v).strip()}
        self.size = size
        self.source = "box"
        self.lower, self.upper = -0.5 * size, 0.5 * size
        self.scale = DRAWN_HALF_EXTENT / float(np.max(0.5 * size))
        verts, faces, owners = box_mesh(size)
        colours = np.array([self._face_rgba(name) for name in owners], dtype=float)
        self.faces.setGLOptions(_FRONT_FACES_ONLY)  # the box is wound outward: half the fill work
        self.faces.setMeshData(vertexes=verts, faces=faces, faceColors=colours)
        self.edges.setData(pos=box_edges(size))
        self.mark.setData(pos=boresight_mark(size, self.boresight_face))
        self.mark.setVisible(True)
        self.group.setTransform(gl_helpers.transform(scale=self.scale))

    def load_stl(self, path):
        """Replace the box by the triangles of an STL file (binary or ASCII), kept in the body frame's own
        coordinates and scaled with its origin fixed. Raises StlError with a plain message."""
        triangles = read_stl(path)
        points = triangles.reshape(-1, 3)
        extent = float(np.max(np.abs(points)))
        if extent < SMALLEST_DRAWN_SIZE:   # refused before anything changes, so the last part stays drawn
            raise StlError(f"{path!s}: every vertex is at the origin" if extent == 0 else
                           f"{path!s}: every vertex lies within {extent:.3g} of the origin; expected a part at "
                           f"least {SMALLEST_DRAWN_SIZE:g} units across")
        self.lower, self.upper = points.min(axis=0), points.max(axis=0)
        self.scale = DRAWN_HALF_EXTENT / extent
        self.source = str(path)
        normals = np.cross(triangles[:, 1] - triangles[:, 0], triangles[:, 2] - triangles[:, 0])
        # colour the triangles facing the boresight direction like the boresight face of the box
        facing = normals @ FACE_NORMALS[self.boresight_face] > 0.7 * np.linalg.norm(normals, axis=1)
        colours = np.where(facing[:, None], self._face_rgba(self.boresight_face),
                           self._face_rgba("none")).astype(float)
        # without an index array pyqtgraph takes face colours per corner: (N, 3, 4)
        self.faces.setGLOptions(gl_helpers.SEE_THROUGH)  # an STL's winding is not to be trusted
        self.faces.setMeshData(vertexes=triangles, faceColors=np.repeat(colours[:, None, :], 3, axis=1))
        bbox = box_edges(self.upper - self.lower) + 0.5 * (self.upper + self.lower)
        self.edges.setData(pos=bbox)  # the bounding box, so the STL's extent along each axis is readable
        self.mark.setVisible(False)
        self.group.setTransform(gl_helpers.transform(scale=self.scale))
        return len(triangles)

    def _face_rgba(self, name):
        if name == self.boresight_face:
            return palette.rgba_float(palette.BORESIGHT_RGB, _BORESIGHT_ALPHA)
        return palette.rgba_float(palette.PART_RGB, _FACE_ALPHA)

    # --- labels -------------------------------------------------------------------------------------
    def face_label_anchors(self) -> dict[str, np.ndarray]:
        """Body-frame anchor of each face label, just outside the face, in drawn (scaled) units."""
        centres = face_centres(self.lower, self.upper)
        return {name: centres[name] * self.scale + FACE_NORMALS[name] * 0.10 for name in FACE_NAMES}

    def face_label_text(self, name) -> str:
        shown = name.replace("-", "\u2212")
        text = f"{shown} {self.face_names[name]}" if name in self.face_names else shown
        if name == self.boresight_face:
            text += " \u25ce boresight"
        return text

    def edge_segments_drawn(self) -> np.ndarray:
        """The edges as drawn (scaled), for the ghost outline."""
        return np.asarray(self.edges.pos, dtype=float) * self.scale
