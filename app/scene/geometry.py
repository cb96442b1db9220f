"""Pure numpy geometry the scene draws: the Rodrigues pieces of a rotation, cone sectors, arcs, arrowheads
and the part box. No Qt here, so every shape can be checked with plain numbers."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core import axes

FACE_NAMES = axes.SIGNED_AXES    # each face of the box is named by its outward normal
FACE_NORMALS = axes.VECTORS      # read-only: copy one before changing it


def unit(v) -> np.ndarray:
    v = np.asarray(v, dtype=float)
    # one vector (the common case, a dozen times an edit): math.hypot costs a fraction of np.linalg.norm
    n = math.hypot(*v.tolist()) if v.ndim == 1 else float(np.linalg.norm(v))
    if not math.isfinite(n) or n == 0.0:
        raise ValueError(f"cannot take the direction of the zero or non-finite vector {v.tolist()}")
    return v / n


@dataclass(frozen=True)
class RodriguesPieces:
    """r split against the unit axis n: r = r_par + r_perp; w = n × r is r_perp turned by 90° about n."""

    n: np.ndarray
    r: np.ndarray
    r_par: np.ndarray
    r_perp: np.ndarray
    w: np.ndarray
    alpha_deg: float  # angle between r and n (the cone's half-angle)

    def on_circle(self, angles_rad) -> np.ndarray:
        """Where r lies after turning by each angle about n (Rodrigues: r∥ + r⊥ cos θ + (n × r) sin θ)."""
        a = np.asarray(angles_rad, dtype=float)[..., None]
        return self.r_par + self.r_perp * np.cos(a) + self.w * np.sin(a)


def rodrigues_pieces(n, r) -> RodriguesPieces:
    n = unit(n)
    r = np.asarray(r, dtype=float)
    r_par = np.dot(r, n) * n
    r_perp = r - r_par
    w = _cross(n, r)
    alpha = float(np.degrees(np.arctan2(np.linalg.norm(w), np.dot(r, n))))
    return RodriguesPieces(n, r, r_par, r_perp, w, alpha)


def cone_sector_triangles(pieces: RodriguesPieces, sweep_rad: float, segments: int) -> np.ndarray:
    """(segments, 3, 3) triangles fanned from the apex (the origin) over the path of r from 0 to sweep_rad.
    A fixed segment count keeps the vertex buffer the same size on every edit."""
    ring = pieces.on_circle(np.linspace(0.0, sweep_rad, segments + 1))
    tris = np.zeros((segments, 3, 3))
    tris[:, 1] = ring[:-1]
    tris[:, 2] = ring[1:]
    return tris


def _cross(a, b) -> np.ndarray:
    """a × b of two 3-vectors, written out: np.cross costs ten times this on one pair (every edit draws
    several)."""
    a0, a1, a2 = a.tolist() if isinstance(a, np.ndarray) else a
    b0, b1, b2 = b.tolist() if isinstance(b, np.ndarray) else b
    return np.array((a1 * b2 - a2 * b1, a2 * b0 - a0 * b2, a0 * b1 - a1 * b0))


def arc_between(a, b, radius: float, samples: int) -> np.ndarray:
    """Points on the great-circle arc from direction a to direction b at the given radius (for the angle α)."""
    a, b = unit(a), unit(b)
    angle = np.arctan2(np.linalg.norm(_cross(a, b)), np.dot(a, b))
    side = b - np.dot(a, b) * a
    if np.linalg.norm(side) < 1e-12:
        side = any_perpendicular(a)
    side = unit(side)
    t = np.linspace(0.0, angle, samples)[:, None]
    return radius * (a * np.cos(t) + side * np.sin(t))


def any_perpendicular(v) -> np.ndarray:
    v = unit(v)
    helper = np.eye(3)[int(np.argmin(np.abs(v)))]
    return unit(_cross(v, helper))


def basis_with_z_along(direction) -> np.ndarray:
    """A rotation matrix whose third column is the given direction (to stand an arrowhead on it)."""
    z = unit(direction)
    x = any_perpendicular(z)
    y = _cross(z, x)
    return np.column_stack([x, y, z])


def arrowhead_mesh(length: float, radius: float, segments: int = 16) -> tuple[np.ndarray, np.ndarray]:
    """A closed cone along +z with its tip at the origin and its base at z = -length: (vertexes, faces)."""
    t = np.linspace(0.0, 2 * np.pi, segments, endpoint=False)
    base = np.column_stack([radius * np.cos(t), radius * np.sin(t), np.full(segments, -length)])
    verts = np.vstack([[0.0, 0.0, 0.0], [0.0, 0.0, -length], base])
    faces = []
    for i in range(segments):
        j = (i + 1) % segments
        faces.append((0, 2 + i, 2 + j))  # side
        faces.append((1, 2 + j, 2 + i))  # base
    return verts, np.array(faces, dtype=np.uint32)


def box_mesh(size) -> tuple[np.ndarray, np.ndarray, list[str]]:
    """A box centred on the origin: (vertexes (24,3), faces (12,3), face name of each triangle).
    Each face has its own four vertexes so it can carry its own colour."""
    half = 0.5 * np.asarray(size, dtype=float)
    verts, faces, owners = [], [], []
    for name in FACE_NAMES:
        normal = FACE_NORMALS[name]
        k = int(np.argmax(np.abs(normal)))
        u_axis, v_axis = (k + 1) % 3, (k + 2) % 3  # cyclic, so u × v = +e_k
        if normal[k] < 0:  # keep every face wound counter-clockwise seen from outside
            u_axis, v_axis = v_axis, u_axis
        start = len(verts)
        for du, dv in ((-1, -1), (1, -1), (1, 1), (-1, 1)):
            p = np.zeros(3)
            p[k] = normal[k] * half[k]
            p[u_axis] = du * half[u_axis]
            p[v_axis] = dv * half[v_axis]
            verts.append(p)
        faces += [(start, start + 1, start + 2), (start, start + 2, start + 3)]
        owners += [name, name]
    return np.array(verts), np.array(faces, dtype=np.uint32), owners


def box_edges(size) -> np.ndarray:
    """The twelve edges of the box as (24, 3) segment end points (for line mode 'lines')."""
    half = 0.5 * np.asarray(size, dtype=float)
    corners = np.array([[sx, sy, sz] for sx in (-1, 1) for sy in (-1, 1) for sz in (-1, 1)]) * half
    segs = []
    for i in range(8):
        for j in range(i + 1, 8):
            if np.count_nonzero(corners[i] != corners[j]) == 1:
                segs += [corners[i], corners[j]]
    return np.array(segs)


def face_centres(lower, upper) -> dict[str, np.ndarray]:
    """Centres of the six faces of the axis-aligned box [lower, upper] (used for labels)."""
    lower, upper = np.asarray(lower, float), np.asarray(upper, float)
    mid = 0.5 * (lower + upper)
    out = {}
    for name, normal in FACE_NORMALS.items():
        k = int(np.argmax(np.abs(normal)))
        p = mid.copy()
        p[k] = upper[k] if normal[k] > 0 else lower[k]
        out[name] = p
    return out


def boresight_mark(size, face: str, samples: int = 40) -> np.ndarray:
    """A ring and cross on the given face of the box, as 'lines' segments, slightly proud of the face."""
    half = 0.5 * np.asarray(size, dtype=float)
    normal = FACE_NORMALS[face]
    k = int(np.argmax(np.abs(normal)))
    u_axis, v_axis = [i for i in range(3) if i != k]
    radius = 0.35 * min(half[u_axis], half[v_axis])
    centre = normal * (half[k] * 1.01 + 1e-3)
    t = np.linspace(0, 2 * np.pi, samples + 1)
    ring = np.zeros((samples + 1, 3))
    ring[:, u_axis] = radius * np.cos(t)
    ring[:, v_axis] = radius * np.sin(t)
    ring += centre
    segs = list(np.repeat(ring, 2, axis=0)[1:-1])
    for axis in (u_axis, v_axis):
        d = np.zeros(3)
        d[axis] = 1.6 * radius
        segs += [centre - d, centre + d]
    return np.array(segs)
