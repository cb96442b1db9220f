"""Seeded random and adversarial orientation sets shared by the core tests.

The adversarial sets sit where naive formulas lose accuracy: angles within 1e-9 of 0 and 180 degrees,
middle angles within 1e-9 of gimbal lock, quaternions with w near 0."""

import numpy as np
from scipy.spatial.transform import Rotation

SEED = 20261201


def random_quaternions(n, seed=SEED):
    """Uniformly distributed unit quaternions, w-first (SciPy's Rotation.random, a general-purpose
    reference library)."""
    return Rotation.random(n, rng=np.random.default_rng(seed)).as_quat(scalar_first=True)


def _random_axes(rng, n):
    v = rng.normal(size=(n, 3))
    return v / np.linalg.norm(v, axis=1, keepdims=True)


def near_zero_and_half_turn_quaternions(n, seed=SEED):
    """Rotations by angles within 1e-9 rad of 0 and of pi, about random axes, plus exact 0 and pi."""
    rng = np.random.default_rng(seed)
    axes = _random_axes(rng, n)
    offsets = rng.uniform(-1e-9, 1e-9, size=n)
    angles = np.concatenate([np.abs(offsets[: n // 2]), np.pi - np.abs(offsets[n // 2:])])
    angles[0], angles[-1] = 0.0, np.pi
    q = np.empty((n, 4))
    q[:, 0] = np.cos(angles / 2)
    q[:, 1:] = np.sin(angles / 2)[:, None] * axes
    return q


def small_w_quaternions(n, seed=SEED):
    """Quaternions whose scalar part is within 1e-9 of zero (rotations of nearly 180 degrees)."""
    rng = np.random.default_rng(seed + 1)
    q = np.concatenate([rng.uniform(-1e-9, 1e-9, size=(n, 1)), rng.normal(size=(n, 3))], axis=1)
    q[0, 0] = 0.0
    return q / np.linalg.norm(q, axis=1, keepdims=True)


def near_lock_angles(n, sequence, seed=SEED):
    """Angle triples (radians) whose middle angle is within 1e-9 of a singular value of `sequence`."""
    rng = np.random.default_rng(seed + 2)
    outer = rng.uniform(-np.pi, np.pi, size=(n, 2))
    offsets = rng.uniform(-1e-9, 1e-9, size=n)
    offsets[:4] = 0.0
    if sequence[0] == sequence[2]:
        locks = np.where(rng.random(n) < 0.5, 0.0, np.pi)
        middle = np.clip(locks + offsets, 0.0, np.pi)
    else:
        locks = np.where(rng.random(n) < 0.5, -np.pi / 2, np.pi / 2)
        middle = locks + offsets
    return np.stack([outer[:, 0], middle, outer[:, 1]], axis=1)


def same_rotation_error(q1, q2):
    """Largest 1 − |q1 · q2| over a batch: zero when each pair is the same rotation (q ~ −q)."""
    return float(np.max(np.abs(1.0 - np.abs(np.sum(q1 * q2, axis=-1)))))


def quaternion_distance(q1, q2):
    """Largest element difference between q1 and the nearer of ±q2: rotation-aware, and on the scale of
    the numbers themselves (1 − |q1·q2| is second-order and would hide errors)."""
    d_plus = np.abs(q1 - q2).max(axis=-1)
    d_minus = np.abs(q1 + q2).max(axis=-1)
    return float(np.max(np.minimum(d_plus, d_minus)))
