"""Directions (`triad`, `fit_directions`): unit vectors known in the body frame and measured in the
reference frame (gravity from a level, a boresight from a sight). TRIAD (Black 1964) matches the first
direction exactly and the plane of the pair; the least-squares answer for two or more weighted
directions solves Wahba's problem (1965) by the SVD of the attitude profile matrix (the same optimum as
Davenport's q-method). The angle between the pair is the quality figure: errors about the poorly
seen axis grow like 1 / sin(angle); nearly parallel directions are refused.

Directions and weights are numbered from 1 in messages, as a person counts rows; directions are
scaled before any arithmetic, so 1e200 or 1e-200 keeps its direction.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from core import kernels
from core.errors import InvalidInputError
from core.fit import (MIN_PAIR_ANGLE_DEG, WEAK_PAIR_ANGLE_DEG, FitRefusedError, read_points, read_weights,
                      rotation_from_profile)
from core.orientation import Orientation


@dataclass(frozen=True)
class DirectionFit:
    """orientation: body -> reference. residual_angles_deg: angle between R b_i and r_i per direction.
    pair_angle_deg: the angle between the two body directions (for more than two, the spread angle of
    _spread_angle_deg, folded to 0..90 because antiparallel is as bad as parallel);
    reference_pair_angle_deg the same for the measurements; mismatch_deg their difference, a consistency
    figure no rotation can remove."""

    orientation: Orientation
    residual_angles_deg: np.ndarray
    pair_angle_deg: float
    reference_pair_angle_deg: float
    mismatch_deg: float
    method: str
    notes: tuple = ()

    def summary(self):
        axis, angle = self.orientation.as_axis_angle()
        residuals = ", ".join(f"{r:.4f}°" for r in self.residual_angles_deg)
        return "\n".join([f"{self.method}: {angle:.4f}° about [{axis[0]:.5f}, {axis[1]:.5f}, {axis[2]:.5f}]",
                          f"directions {self.pair_angle_deg:.2f}° apart (measured {self.reference_pair_angle_deg:.2f}°, "
                          f"mismatch {self.mismatch_deg:.4f}°); residuals {residuals}"] + list(self.notes))


def _directions(values, what):
    """Unit directions, scaled first: 1e200 or 1e-200 keeps its direction; zero is refused by index."""
    return kernels.unit_vectors(read_points(values, what), f"{what}: direction")[0]


def _spread_angle_deg(unit):
    """arccos(λ1 − λ2) of the scatter (1/N) Σ b bᵀ of unit directions: for two directions exactly their
    angle folded to 0..90, 0 when all are parallel or antiparallel, 90 for directions spread evenly round
    a plane or wider. One number, in O(N), with the meaning of the pair angle."""
    eigen = np.linalg.eigvalsh(unit.T @ unit / len(unit))      # ascending
    return float(np.degrees(np.arccos(np.clip(eigen[2] - eigen[1], 0.0, 1.0))))


def _pair_angle_deg(u, v):
    return float(np.degrees(np.arctan2(np.linalg.norm(np.cross(u, v)), u @ v)))


def _judge_pair(body, ref, min_angle_deg):
    if len(body) == 2:
        pair, ref_pair = _pair_angle_deg(body[0], body[1]), _pair_angle_deg(ref[0], ref[1])
        folded = min(pair, 180.0 - pair), min(ref_pair, 180.0 - ref_pair)
    else:
        pair, ref_pair = _spread_angle_deg(body), _spread_angle_deg(ref)
        folded = pair, ref_pair
    worst = min(folded)
    if worst < min_angle_deg:
        raise FitRefusedError(
            f"the directions are nearly parallel ({worst:.3g}° apart, limit {min_angle_deg:g}°): the rotation "
            f"about them is not determined; expected directions at least {min_angle_deg:g}° apart, "
            f"ideally near 90°", "parallel")
    notes = []
    if worst < WEAK_PAIR_ANGLE_DEG:
        notes.append(f"the directions are only {worst:.3g}° apart: errors about the poorly seen axis are "
                     f"magnified about {1.0 / np.sin(np.radians(worst)):.2g} times")
    return pair, ref_pair, notes


def _direction_result(r, body, ref, pair, ref_pair, method, notes):
    fitted = body @ r.T
    residual = np.degrees(np.arctan2(np.linalg.norm(np.cross(fitted, ref), axis=1),
                                     np.einsum("ij,ij->i", fitted, ref)))
    # r is orthogonal by construction (SVD factors, or two orthonormal triads).
    return DirectionFit(Orientation(kernels.matrices_to_quaternions(r)), residual, pair, ref_pair, abs(pair - ref_pair), method,
                        tuple(notes))


def triad(body_first, body_second, reference_first, reference_second, min_angle_deg=MIN_PAIR_ANGLE_DEG):
    """TRIAD (Black 1964): the first direction is matched exactly, the second as well as the pair's
    plane allows. Give the more accurate measurement first. Triads t1 = r1, t2 = (r1 × r2)/|r1 × r2|,
    t3 = t1 × t2 in each frame; R = [t_ref] [t_body]ᵀ."""
    body = _directions([body_first, body_second], "body directions")
    ref = _directions([reference_first, reference_second], "reference directions")
    pair, ref_pair, notes = _judge_pair(body, ref, min_angle_deg)

    def frame(v):
        t2 = np.cross(v[0], v[1])
        t2 /= np.linalg.norm(t2)
        return np.column_stack([v[0], t2, np.cross(v[0], t2)])

    r = frame(ref) @ frame(body).T
    return _direction_result(r, body, ref, pair, ref_pair, "TRIAD", notes)


def fit_directions(body, reference, weights=None, min_angle_deg=MIN_PAIR_ANGLE_DEG):
    """The rotation minimising Σ w_i |r_i − R b_i|² over unit directions (Wahba's problem), solved by the
    SVD of B = Σ w r bᵀ. Needs two or more directions that are not all parallel."""
    b = _directions(body, "body directions")
    r = _directions(reference, "reference directions")
    if b.shape != r.shape:
        raise InvalidInputError(f"body and reference directions differ in number ({len(b)} and {len(r)}); "
                                f"expected one measurement per body direction")
    w = read_weights(weights, len(b))
    keep = slice(None) if w is None else w > 0
    if len(b[keep]) < 2:
        raise FitRefusedError(f"{len(b[keep])} direction(s) with weight above zero; expected at least 2",
                              "too few")
    pair, ref_pair, notes = _judge_pair(b[keep], r[keep], min_angle_deg)
    profile = r.T @ (b if w is None else b * w[:, None])
    rotation, _, _ = rotation_from_profile(profile)
    return _direction_result(rotation, b, r, pair, ref_pair, "least squares (Wahba, SVD)", notes)
