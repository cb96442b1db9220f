"""Core benchmark: our kernels beside SciPy's Rotation on the same data, in the same run.

Prints our time, SciPy's and the ratio (ours / SciPy; below 1 is faster) for a batch of a million, and the
per-call time of one refresh: a matrix turned into everything the editors show."""

import time

import numpy as np
from scipy.spatial.transform import Rotation

from core import Orientation, kernels
from core.sequences import gimbal_margin

N = 1_000_000
REPEATS = 3


def best_time(function):
    """Best of a few runs: the least disturbed by the rest of the machine."""
    times = []
    for _ in range(REPEATS):
        start = time.perf_counter()
        function()
        times.append(time.perf_counter() - start)
    return min(times)


def batch_rows():
    # Our quaternion kernels accept any non-zero length (the normalisation is folded in or the formula
    # does not depend on it), so they take the same raw array SciPy's from_quat normalises.
    rng = np.random.default_rng(7)
    rotations = Rotation.random(N, rng=rng)
    q = rotations.as_quat(scalar_first=True)
    q_last = rotations.as_quat()
    matrices = rotations.as_matrix()
    noisy = matrices + rng.normal(scale=1e-3, size=matrices.shape)
    angles = rotations.as_euler("ZYX")

    def ours_from_matrix(m):
        nearest, _, det = kernels.nearest_rotations(m)
        if np.any(det <= 0):
            raise ValueError("reflection")
        return kernels.matrices_to_quaternions(nearest)

    return [
        ("matrix -> quaternion (valid, checked)",
         lambda: ours_from_matrix(matrices),
         lambda: Rotation.from_matrix(matrices).as_quat()),
        ("matrix -> nearest rotation (noise 1e-3)",
         lambda: ours_from_matrix(noisy),
         lambda: Rotation.from_matrix(noisy).as_quat()),
        ("quaternion -> matrix",
         lambda: kernels.quaternions_to_matrices(q),
         lambda: Rotation.from_quat(q_last).as_matrix()),
        ("quaternion -> rotation vector",
         lambda: kernels.quaternions_to_rotation_vectors(q),
         lambda: Rotation.from_quat(q_last).as_rotvec()),
        ("quaternion -> angles ZYX",
         lambda: kernels.quaternions_to_angles(q, "ZYX", True),
         lambda: Rotation.from_quat(q_last).as_euler("ZYX")),
        ("angles ZYX -> quaternion",
         lambda: kernels.angles_to_quaternions(angles, "ZYX", True),
         lambda: Rotation.from_euler("ZYX", angles).as_quat()),
    ]


def refresh_time():
    """One orientation from a matrix to every number the editors show."""
    m = Rotation.from_euler("ZYX", [31.0, 12.0, -7.5], degrees=True).as_matrix()

    def refresh():
        o = Orientation.from_matrix(m)
        o.as_matrix()
        o.as_quaternion()
        o.as_axis_angle()
        o.as_rotation_vector()
        o.as_angles("ZYX")
        gimbal_margin(o, "ZYX")

    for _ in range(200):
        refresh()
    calls = 5000
    start = time.perf_counter()
    for _ in range(calls):
        refresh()
    return (time.perf_counter() - start) / calls


def main():
    print(f"core kernels, N = {N:,} (best of {REPEATS}; ratio = ours / SciPy {__import__('scipy').__version__})")
    print(f"{'conversion':42s} {'ours':>9s} {'SciPy':>9s} {'ratio':>7s}")
    for name, ours, theirs in batch_rows():
        t_ours, t_theirs = best_time(ours), best_time(theirs)
        print(f"{name:42s} {t_ours * 1e3:7.1f}ms {t_theirs * 1e3:7.1f}ms {t_ours / t_theirs:7.2f}")
    print(f"{'one orientation: matrix -> all editors':42s} {refresh_time() * 1e6:7.1f}us")


if __name__ == "__main__":
    main()
