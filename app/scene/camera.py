"""View presets (look along a direction) and the projection of reference points to pixels, using the
GLViewWidget's own projection and view matrices so tests and labels agree with what is drawn."""

from __future__ import annotations

import math

import numpy as np

ISOMETRIC = (-1.0, -1.0, -1.0)  # from the (+, +, +) octant towards the origin, Z up
SCENE_RADIUS = 1.6  # everything the scene draws lies within this distance of the origin
FIELD_OF_VIEW = 40.0  # horizontal, degrees


def up_z_for(preset) -> int:
    """-1 when the frame preset names its +Z "down" (NED, aircraft body): the Scene then draws -Z up the
    screen; +1 for the others, whose +Z is up or not vertical (ENU, vehicle body, camera optical)."""
    return -1 if preset.words[(2, 1)] == "down" else 1


def isometric_for(up_z: int) -> tuple[float, float, float]:
    """The isometric view looks down at the origin from the (+X, +Y, up) octant."""
    return (-1.0, -1.0, -float(up_z))


def elevation_azimuth_for(direction) -> tuple[float, float]:
    """pyqtgraph's camera sits at centre + distance·(cos e cos a, cos e sin a, sin e) and looks at the
    centre, so looking along d means (e, a) of -d. Straight down or up keeps +X to the right."""
    d = np.asarray(direction, dtype=float)
    d = d / np.linalg.norm(d)
    elevation = math.degrees(math.asin(max(-1.0, min(1.0, -d[2]))))
    if math.hypot(d[0], d[1]) < 1e-9:
        return elevation, -90.0
    return elevation, math.degrees(math.atan2(-d[1], -d[0]))


def fitting_distance(width: int, height: int, fov_deg: float = FIELD_OF_VIEW) -> float:
    """Camera distance at which a sphere of SCENE_RADIUS, seen in perspective, fits the narrower side of
    the view with a margin for the corner panels."""
    tan_h = math.tan(math.radians(fov_deg) / 2)
    tan_v = tan_h * height / max(width, 1)
    half_angle = math.atan(min(tan_h, tan_v))
    return SCENE_RADIUS / math.sin(half_angle) * 1.12


def _numpy(matrix) -> np.ndarray:
    return np.array(matrix.data(), dtype=float).reshape(4, 4).T  # QMatrix4x4.data() is column-major


def project_points(view, points, width: int, height: int) -> np.ndarray:
    """(N, 3) reference points to (N, 2) pixel coordinates (x right, y down from the top-left corner) in an
    image of width x height, with the view's own projection and view matrices. NaN where behind the camera."""
    region = (0, 0, width, height)
    m = _numpy(view.projectionMatrix(region, region)) @ _numpy(view.viewMatrix())
    pts = np.atleast_2d(np.asarray(points, dtype=float))
    clip = np.c_[pts, np.ones(len(pts))] @ m.T
    with np.errstate(divide="ignore", invalid="ignore"):
        ndc = clip[:, :2] / clip[:, 3:4]
    px = np.column_stack([(ndc[:, 0] + 1) * 0.5 * width, (1 - ndc[:, 1]) * 0.5 * height])
    px[clip[:, 3] <= 0] = np.nan
    return px
