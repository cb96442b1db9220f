"""What a digital level or inclinometer would read on a mounted box-shaped part, so a mount can be
checked with a hand tool.

Gravity points along `down`, a direction in the reference frame: (0, 0, −1) when the reference Z is up
(ENU, a bench with Z up; the default), (0, 0, +1) in NED. The part is a box whose faces are named by
their outward normals in body axes: '+X', '−X', ... ('-X' in text).

Face readings (`level_readings`):
- from_up_deg: angle between the face's outward normal and straight up: 0 on the top face, 180 on the
  underside, 90 on a vertical side.
- tilt_deg: inclination of the face plane from level, 0..90; what a level laid on the face (or held
  under it) shows as its total tilt. off_plumb_deg = 90 − tilt_deg is the face's departure from vertical,
  what a level held against a side face shows.
- facing: 'up' (from_up_deg < 45), 'down' (> 135) or 'side'. up_face / down_face name the faces nearest
  straight up and straight down.
Axis elevations: angle of each body axis above the horizontal plane, −90..90, positive upwards.

Two-axis inclinometer (`inclinometer_reading`), our stated choice: the instrument's base sits on the face
(its z is the face's outward normal), its x lies along a chosen in-face direction d, its y = z × x. Each
of its two readings is the elevation of that instrument axis above the horizontal (positive when the axis
rises), the per-axis angle-to-horizon reading of accelerometer-based dual-axis inclinometers (from memory;
check the instrument's manual for its sign and axis marks). The two readings satisfy
sin²(along) + sin²(across) = sin²(tilt), tilt being the face's from_up angle.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core.axes import POSITIVE_AXES, SIGNED_AXES, axis_name
from core.check import axis_vector
from core.errors import InvalidInputError
from core.orientation import Orientation

DOWN_Z_UP = (0.0, 0.0, -1.0)
DOWN_NED = (0.0, 0.0, 1.0)
FACES = SIGNED_AXES   # each face named by its outward normal
AXES = POSITIVE_AXES

# The in-face direction used when none is chosen: the next body axis round the cycle X -> Y -> Z -> X.
DEFAULT_IN_FACE = {axis[1]: POSITIVE_AXES[(i + 1) % 3] for i, axis in enumerate(POSITIVE_AXES)}

_UP_LIMIT_DEG = 45.0


def _elevation_deg(directions, up):
    """Angle above the horizontal plane, degrees; atan2 of the vertical and horizontal parts stays exact
    near ±90 where an arcsin would not."""
    directions = np.atleast_2d(directions)
    vertical = directions @ up
    horizontal = np.linalg.norm(directions - vertical[:, None] * up, axis=1)
    return np.degrees(np.arctan2(vertical, horizontal))


def _up_vector(down):
    return -axis_vector(down, "gravity direction")


@dataclass(frozen=True)
class FaceReading:
    face: str
    normal: np.ndarray          # outward normal in reference coordinates
    from_up_deg: float
    tilt_deg: float
    off_plumb_deg: float
    facing: str


@dataclass(frozen=True)
class AxisElevation:
    axis: str
    direction: np.ndarray       # the body axis in reference coordinates
    elevation_deg: float


@dataclass(frozen=True)
class LevelReport:
    down: np.ndarray
    faces: tuple                # FaceReading per face, in FACES order
    axes: tuple                 # AxisElevation for +X, +Y, +Z
    up_face: str
    down_face: str

    def face(self, name):
        wanted = axis_name(name)
        for reading in self.faces:
            if reading.face == wanted:
                return reading
        raise InvalidInputError(f"no face {name!r}; expected one of {', '.join(FACES)}")


def level_readings(orientation, down=DOWN_Z_UP):
    """Face tilts and axis elevations of the part at `orientation` with gravity along `down`."""
    if not isinstance(orientation, Orientation):
        raise InvalidInputError("level readings: expected an Orientation")
    up = _up_vector(down)
    normals = np.array([orientation.apply(axis_vector(face)) for face in FACES])
    elevation = _elevation_deg(normals, up)          # elevation of the normal = 90 − from_up
    from_up = 90.0 - elevation
    tilt = 90.0 - np.abs(elevation)
    faces = tuple(
        FaceReading(face, normals[i], float(from_up[i]), float(tilt[i]), float(90.0 - tilt[i]),
                    "up" if from_up[i] < _UP_LIMIT_DEG else "down" if from_up[i] > 180 - _UP_LIMIT_DEG
                    else "side")
        for i, face in enumerate(FACES))
    axes = tuple(AxisElevation(face, normals[2 * i], float(elevation[2 * i])) for i, face in enumerate(AXES))
    return LevelReport(-up, faces, axes, FACES[int(np.argmin(from_up))], FACES[int(np.argmax(from_up))])


@dataclass(frozen=True)
class InclinometerReading:
    face: str
    direction: np.ndarray       # the instrument's x, body frame (in the face plane, unit)
    cross_direction: np.ndarray  # the instrument's y = normal × x, body frame
    along_deg: float            # elevation of x above the horizontal
    across_deg: float           # elevation of y above the horizontal
    tilt_deg: float             # angle of the face normal from straight up (0 on a level top face)
    notes: tuple = ()


def inclinometer_reading(orientation, face, direction=None, down=DOWN_Z_UP):
    """The two readings of an inclinometer set on `face` with its x along `direction` (a body-frame
    direction in the face plane; a named axis or three numbers; the DEFAULT_IN_FACE axis when None).
    A direction not quite in the face plane is projected onto it, with a note."""
    if not isinstance(orientation, Orientation):
        raise InvalidInputError("inclinometer reading: expected an Orientation")
    name = axis_name(face)
    if name is None:
        raise InvalidInputError(f"face {face!r} is unknown; expected one of {', '.join(FACES)}")
    normal = axis_vector(name)
    chosen = axis_vector(DEFAULT_IN_FACE[name[1]] if direction is None else direction, "in-face direction")
    x = chosen - (chosen @ normal) * normal
    length = float(np.linalg.norm(x))
    if length < 1e-6:
        raise InvalidInputError(
            f"in-face direction {direction!r} is perpendicular to face {name}; expected a direction lying "
            f"in the face, such as {DEFAULT_IN_FACE[name[1]]}")
    notes = ()
    if length < 1.0 - 1e-12:
        notes = (f"the chosen direction was {np.degrees(np.arccos(length)):.3g}° out of the face "
                 f"plane; it was projected onto the face",)
    x = x / length
    y = np.cross(normal, x)
    up = _up_vector(down)
    along, across, normal_elevation = _elevation_deg(orientation.apply(np.array([x, y, normal])), up)
    return InclinometerReading(name, x, y, float(along), float(across), float(90.0 - normal_elevation), notes)
