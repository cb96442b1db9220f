"""What to adjust after a check: the correction, angles about the mount's own adjustment axes, and shims.

For nominal N and measured M the correction C turns measured into nominal (CONVENTIONS.md):
in body axes M · C = N, so C = Mᵀ N; in reference axes C_ref · M = N, so C_ref = N Mᵀ.

Adjustment angles about any axes a1, a2[, a3] (unit vectors, in the order the hardware turns) solve
C = R(a1, θ1) R(a2, θ2) R(a3, θ3): the generalisation of an angle sequence to arbitrary axes (Davenport
angles; M. D. Shuster & F. L. Markley 2003, "Generalization of Euler angles", J. Astronaut. Sci. 51(2)).
Written with quaternions, q1 q2 q3 · c = u1ᵀ K(θ2) u3 with u = (cos θ/2, sin θ/2): for a fixed middle angle the
best outer angles are the leading singular vectors of a 2×2 matrix, and the exact middle angle solves
A cos θ2 + B sin θ2 = a1ᵀ C a3 − (a1·a2)(a2·a3). Two axes are the same problem without a middle angle (a
2×2 singular value problem, least squares). Axes that cannot reach C get the least-squares answer and
the residual that remains, which is computed from the returned angles themselves. Every answer is then
polished by Newton steps (kept only when they bring it closer), so exact answers rebuild C to about 1e-14°.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from core.errors import InvalidInputError
from core.orientation import Orientation

# Consecutive axes closer than this to parallel (radians) cannot share the work: refused by name.
MIN_AXIS_SEPARATION_RAD = 1e-6
# A correction below this (degrees) is the rounding of N and M composed: no turn, and no axis to name.
NO_CORRECTION_DEG = 1e-12


@dataclass(frozen=True)
class Correction:
    """The correction in both frames. small_angles_*: the rotation vector in degrees, which for small
    corrections is the turn to make about each axis of that frame."""
    body: Orientation
    reference: Orientation
    angle_deg: float
    axis_body: np.ndarray | None
    axis_reference: np.ndarray | None
    small_angles_body_deg: np.ndarray
    small_angles_reference_deg: np.ndarray


def correction(nominal: Orientation, measured: Orientation) -> Correction:
    body = measured.inverse() @ nominal
    reference = nominal @ measured.inverse()
    axis_body, angle = body.as_axis_angle()
    axis_reference, _ = reference.as_axis_angle()
    defined = angle > NO_CORRECTION_DEG
    return Correction(body, reference, float(angle), axis_body if defined else None,
                      axis_reference if defined else None, body.as_rotation_vector(),
                      reference.as_rotation_vector())


# ---------------------------------------------------------------------------------------------------
# Adjustment angles about arbitrary axes
# ---------------------------------------------------------------------------------------------------
@dataclass(frozen=True)
class AdjustmentAngles:
    """Angles (degrees, in (−180, 180]) about `axes`, in order; residual_deg: the angle between what they
    produce and the correction asked for (0 to rounding when the axes reach it)."""
    axes: tuple
    angles_deg: tuple
    residual_deg: float

    @property
    def exact(self) -> bool:
        return self.residual_deg < 1e-9

    def orientation(self) -> Orientation:
        return compose_about_axes(self.axes, self.angles_deg)


def read_axes(text: str) -> np.ndarray:
    """'+X; 0 1 1; -Z' -> the unit axes, each a named axis (+X, -y, Z) or three numbers; ';' between axes.
    Two or three axes, none of zero length and no two in a row parallel, or InvalidInputError."""
    from core.axes import axis_name, unit_vector
    from core.number_text import parse_number
    if not isinstance(text, str) or len(text) > 1000:
        raise InvalidInputError("adjustment axes: expected text such as '+X; 0 1 1' (at most 1000 characters)")
    axes = []
    for i, part in enumerate(text.split(";"), start=1):
        name = axis_name(part)
        if name is not None:
            axes.append(unit_vector(name))
            continue
        numbers = part.replace(",", " ").split()
        if len(numbers) != 3:
            raise InvalidInputError(f"adjustment axis {i} ('{part.strip()[:40]}'): expected a named axis such as +X "
                                    "or three numbers")
        try:
            axes.append([parse_number(n) for n in numbers])
        except ValueError as error:
            raise InvalidInputError(f"adjustment axis {i}: {error}") from None
    return _unit_axes(axes)


def _unit_axes(axes, counts=(2, 3)) -> np.ndarray:
    try:
        a = np.array(axes, dtype=float)
    except (TypeError, ValueError):
        raise InvalidInputError(f"adjustment axes: expected two or three axes of three numbers, got {axes!r}") \
            from None
    if a.ndim != 2 or a.shape[1] != 3 or a.shape[0] not in counts:
        raise InvalidInputError(f"adjustment axes: expected two or three axes of three numbers each, got shape "
                                f"{a.shape}")
    out = []
    for i, axis in enumerate(a, start=1):
        if not np.all(np.isfinite(axis)) or np.abs(axis).max() > 1e150:
            raise InvalidInputError(f"adjustment axis {i}: expected finite numbers, got {axis.tolist()}")
        scale = np.abs(axis).max()
        if scale == 0 or np.linalg.norm(axis / scale) * scale < 1e-12:
            raise InvalidInputError(f"adjustment axis {i} has zero length; expected a direction")
        out.append(axis / scale / np.linalg.norm(axis / scale))
    for i in range(len(out) - 1):
        separation = math.acos(min(1.0, abs(float(out[i] @ out[i + 1]))))
        if separation < MIN_AXIS_SEPARATION_RAD:
            raise InvalidInputError(f"adjustment axes {i + 1} and {i + 2} are parallel; turning about one and then "
                                    "the other reaches nothing the first alone does not: expected different axes")
    return np.array(out)


def _about(axis, angle_rad) -> np.ndarray:
    return np.concatenate([[math.cos(angle_rad / 2)], math.sin(angle_rad / 2) * np.asarray(axis)])


def _product(p, q) -> np.ndarray:
    """Hamilton product p ⊗ q, written out on floats: np.cross on one pair costs more than all of it."""
    pw, px, py, pz = (float(v) for v in p)
    qw, qx, qy, qz = (float(v) for v in q)
    return np.array([pw * qw - px * qx - py * qy - pz * qz, pw * qx + px * qw + py * qz - pz * qy,
                     pw * qy - px * qz + py * qw + pz * qx, pw * qz + px * qy - py * qx + pz * qw])


def _basis(axis) -> tuple:
    """(1, a) as quaternions: q(θ) = cos(θ/2)·1 + sin(θ/2)·a."""
    return np.array([1.0, 0, 0, 0]), np.concatenate([[0.0], axis])


def _outer_matrix(first, middle_q, last, target) -> np.ndarray:
    """K[i, k] = <e_i(first) · middle · e_k(last), target>: q1 q2 q3 · c = u1ᵀ K u3."""
    return np.array([[_product(_product(e1, middle_q), e3) @ target for e3 in _basis(last)]
                     for e1 in _basis(first)])


def _outer_angles(k: np.ndarray) -> tuple[float, float, float]:
    """(θ1, θ3, fit) maximising |u1ᵀ K u3|; when both singular values agree (the axes' gimbal lock) the last
    angle is set to 0 and the first carries the whole turn, as for angle sequences."""
    u, s, vt = np.linalg.svd(k)
    if s[0] - s[1] < 1e-12:
        u3 = np.array([1.0, 0.0])
        u1 = k @ u3
        u1 = u1 / np.linalg.norm(u1) if np.linalg.norm(u1) > 0 else np.array([1.0, 0.0])
    else:
        u1, u3 = u[:, 0], vt[0]
    return 2 * math.atan2(u1[1], u1[0]), 2 * math.atan2(u3[1], u3[0]), float(s[0])


def _wrap_deg(angle_rad: float) -> float:
    degrees = math.degrees(math.remainder(angle_rad, 2 * math.pi))
    return 180.0 if degrees == -180.0 else degrees + 0.0


def compose_about_axes(axes, angles_deg) -> Orientation:
    """R(a1, θ1) R(a2, θ2) … as an Orientation (angles in degrees)."""
    # one axis too is made unit: (0, 0, 2) at 90° must be a quarter turn, not the 127° an unscaled axis gives
    unit = _unit_axes(axes, counts=(1, 2, 3))
    if len(angles_deg) != len(unit):
        raise InvalidInputError(f"{len(unit)} adjustment axes but {len(angles_deg)} angles: expected one angle "
                                "per axis")
    q = np.array([1.0, 0, 0, 0])
    for axis, angle in zip(unit, angles_deg):
        q = _product(q, _about(axis, math.radians(angle)))
    return Orientation.from_quaternion(q / np.linalg.norm(q))


def _middle_candidates(a1, a2, a3, target_matrix) -> list[float]:
    """The exact middle angles (two, or one at the edge of reach), or the edge of reach itself when the
    axes cannot reach the target (the best middle angle is then refined numerically)."""
    along = a1 @ a2 * (a2 @ a3)
    a_cos = a1 @ a3 - along
    b_sin = a1 @ np.cross(a2, a3)
    reach = math.hypot(a_cos, b_sin)
    wanted = float(a1 @ target_matrix @ a3) - along
    centre = math.atan2(b_sin, a_cos)
    ratio = wanted / reach
    if abs(ratio) <= 1:
        spread = math.acos(ratio)
        return [centre + spread, centre - spread]
    return [centre if ratio > 0 else centre + math.pi]


def _best_middle(a1, a2, a3, target, start: float) -> float:
    """Refine the middle angle of a correction the axes cannot reach exactly: the fit of the outer
    angles as a function of the middle one, sampled and then narrowed by golden sections."""
    def fit(t):
        return _outer_angles(_outer_matrix(a1, _about(a2, t), a3, target))[2]
    grid = start + np.linspace(-math.pi, math.pi, 721)
    best = grid[int(np.argmax([fit(t) for t in grid]))]
    low, high = best - 2 * math.pi / 720, best + 2 * math.pi / 720
    golden = (math.sqrt(5) - 1) / 2
    for _ in range(80):
        left, right = high - golden * (high - low), low + golden * (high - low)
        if fit(left) < fit(right):
            low = left
        else:
            high = right
    return (low + high) / 2


def _conjugate(q) -> np.ndarray:
    return q * np.array([1.0, -1.0, -1.0, -1.0])


def _turn_left(q, target) -> np.ndarray:
    """The small turn e (radians, body axes of q) with q · exp(e) = target."""
    error = _product(_conjugate(q), target)
    error = error if error[0] >= 0 else -error
    size = float(np.linalg.norm(error[1:]))
    return np.zeros(3) if size == 0 else error[1:] * (2 * math.atan2(size, error[0]) / size)


def _polish(unit, angles, target) -> tuple:
    """Newton steps on the angles: the closed form loses digits where the middle angle sits near the edge
    of the axes' reach (first and last axes nearly parallel), leaving up to 1e-10° where 1e-14° is possible.
    Turning θi by d turns the composed rotation about (R(i+1)…R(n))ᵀ aᵢ in its body axes, so the step solves
    J d = e in the least-squares sense; a step is kept only when it brings the result closer."""
    def composed(values):
        parts = [_about(a, t) for a, t in zip(unit, values)]
        q = np.array([1.0, 0, 0, 0])
        for part in parts:
            q = _product(q, part)
        return q, parts

    best = np.array(angles, dtype=float)
    q, parts = composed(best)
    error = _turn_left(q, target)
    for _ in range(4):
        columns, tail = [None] * len(unit), np.array([1.0, 0, 0, 0])
        for i in range(len(unit) - 1, -1, -1):
            columns[i] = _product(_product(_conjugate(tail), np.concatenate([[0.0], unit[i]])), tail)[1:]
            tail = _product(parts[i], tail)
        step = np.linalg.lstsq(np.array(columns).T, error, rcond=1e-10)[0]
        trial = best + step
        q_trial, parts_trial = composed(trial)
        error_trial = _turn_left(q_trial, target)
        if not np.linalg.norm(error_trial) < np.linalg.norm(error):
            break
        best, parts, error = trial, parts_trial, error_trial
    return tuple(float(a) for a in best)


def adjustment_angles(target: Orientation, axes) -> AdjustmentAngles:
    """Angles about two or three `axes` (in the frame `target` is written in) that produce `target`,
    exactly when the axes can, else in the least-squares sense with the residual stated."""
    unit = _unit_axes(axes)
    c = target.quaternion
    candidates = []
    if len(unit) == 2:
        theta1, theta2, _ = _outer_angles(_outer_matrix(unit[0], np.array([1.0, 0, 0, 0]), unit[1], c))
        candidates.append((theta1, theta2))
    else:
        a1, a2, a3 = unit
        middles = _middle_candidates(a1, a2, a3, target.as_matrix())
        if len(middles) == 1:
            middles = [_best_middle(a1, a2, a3, c, middles[0])]
        for middle in middles:
            theta1, theta3, _ = _outer_angles(_outer_matrix(a1, _about(a2, middle), a3, c))
            candidates.append((theta1, middle, theta3))
    results = []
    for angles in candidates:
        degrees = tuple(_wrap_deg(a) for a in _polish(unit, angles, c))
        residual = compose_about_axes(unit, degrees).angle_to(target)
        results.append((round(residual, 9), max(abs(d) for d in degrees), degrees, residual))
    # the closest fit; between exact answers the one with the smaller largest turn (less to adjust)
    _, _, degrees, residual = min(results, key=lambda r: (r[0], r[1]))
    return AdjustmentAngles(tuple(tuple(float(v) for v in axis) for axis in unit), degrees, float(residual))
