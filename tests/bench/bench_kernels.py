"""Every batch kernel beside SciPy's Rotation and numpy-quaternion at N = 1e3, 1e4, 1e5 and 1e6, and one
orientation's full editor refresh beside SciPy's single-object calls for the same outputs, all measured in
the same run. Ratio = ours / theirs (below 1 is faster).

Goals: every kernel <= 1.0x SciPy at N >= 1e4 and <= 1.5x at 1e3; <= 1.0x numpy-quaternion where it is
C-level (composition, rotation vector -> quaternion) at N >= 1e5; the one-orientation refresh <= 1.0x SciPy.
Each side starts from plain arrays of numbers and ends with plain arrays, as the program does (SciPy's
from_* / as_* pair is its conversion); composition and rotating vectors start from values already built.
Timings only; nothing here passes or fails."""

from __future__ import annotations

import sys
import time
from pathlib import Path

import numpy as np
import scipy
from scipy.spatial.transform import Rotation

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from core import Orientation, kernels  # noqa: E402
from core.sequences import gimbal_margin  # noqa: E402

SIZES = tuple(int(s) for s in __import__("os").environ.get("BENCH_SIZES", "1000,10000,100000,1000000").split(","))
BUDGET_S = 0.25          # each measurement repeats for about this long and keeps the best run

try:
    import quaternion as npq          # numpy-quaternion, a test extra
except ImportError:                   # pragma: no cover - the bench still runs without it
    npq = None


def best_time(function) -> float:
    return best_times(function)[0]


def best_times(*functions) -> list[float]:
    """Best run of each function, taking turns (ours, theirs, ours, ...) so that a burst of load from the
    rest of a shared machine falls on every side alike rather than on whichever was being timed."""
    once = []
    for function in functions:
        function()
        start = time.perf_counter()
        function()
        once.append(max(time.perf_counter() - start, 1e-7))
    repeats = max(3, min(200, int(BUDGET_S / sum(once) * len(functions))))
    best = list(once)
    for _ in range(repeats):
        for i, function in enumerate(functions):
            start = time.perf_counter()
            function()
            best[i] = min(best[i], time.perf_counter() - start)
    return best


def rows(n: int):
    rng = np.random.default_rng(n)
    rotations = Rotation.random(n, rng=rng)
    other = Rotation.random(n, rng=rng)
    q, q_last = rotations.as_quat(scalar_first=True), rotations.as_quat()
    p = other.as_quat(scalar_first=True)
    m = rotations.as_matrix()
    rv = rotations.as_rotvec()
    angles = rotations.as_euler("ZYX")
    v = rng.normal(size=(n, 3))
    out = [
        ("quaternion -> matrix", lambda: kernels.quaternions_to_matrices(q),
         lambda: Rotation.from_quat(q_last).as_matrix(),
         (lambda qa=npq.as_quat_array(q): npq.as_rotation_matrix(qa)) if npq else None, False),
        ("matrix -> quaternion (input known valid)", lambda: kernels.matrices_to_quaternions(m),
         lambda: Rotation.from_matrix(m, assume_valid=True).as_quat(),
         (lambda: npq.from_rotation_matrix(m, nonorthogonal=False)) if npq else None, False),
        ("rotation vector -> quaternion", lambda: kernels.rotation_vectors_to_quaternions(rv),
         lambda: Rotation.from_rotvec(rv).as_quat(),
         (lambda: npq.from_rotation_vector(rv)) if npq else None, True),
        ("quaternion -> rotation vector", lambda: kernels.quaternions_to_rotation_vectors(q),
         lambda: Rotation.from_quat(q_last).as_rotvec(),
         (lambda qa=npq.as_quat_array(q): npq.as_rotation_vector(qa)) if npq else None, False),
        ("angles ZYX -> quaternion", lambda: kernels.angles_to_quaternions(angles, "ZYX", True),
         lambda: Rotation.from_euler("ZYX", angles).as_quat(), None, False),
        ("quaternion -> angles ZYX", lambda: kernels.quaternions_to_angles(q, "ZYX", True),
         lambda: Rotation.from_quat(q_last).as_euler("ZYX"), None, False),
        ("composition p q (values built)", lambda: kernels.multiply_quaternions(p, q),
         lambda: other * rotations,
         (lambda pa=npq.as_quat_array(p), qa=npq.as_quat_array(q): pa * qa) if npq else None, True),
        ("rotate vectors (values built)", lambda: kernels.rotate_vectors(q, v), lambda: rotations.apply(v),
         None, False),
    ]
    return out


def _one_pass_time(n: int) -> float:
    """One elementwise numpy pass over N doubles, the unit a kernel's floor is counted in: a kernel of
    k such passes cannot run faster than about k times this."""
    a, b, c = np.ones(n), np.ones(n), np.empty(n)
    return best_time(lambda: np.add(a, b, out=c))


def _goal(n: int) -> float:
    return 1.5 if n < 10_000 else 1.0


def _verdict(ratio: float, goal: float) -> str:
    return "met" if ratio <= goal else "NOT MET"


def single_orientation():
    """One orientation, everything the editors and the meter compute on one edit, beside SciPy's
    single-object calls producing the same outputs (its Euler angles carry no gimbal margin: ours do)."""
    m = Rotation.from_euler("ZYX", [31.0, 12.0, -7.5], degrees=True).as_matrix()

    def ours():
        o = Orientation.from_matrix(m)
        o.as_matrix()
        o.as_quaternion()
        o.as_axis_angle()
        o.as_rotation_vector()
        o.as_angles("ZYX")
        gimbal_margin(o, "ZYX")

    def theirs():
        r = Rotation.from_matrix(m)
        r.as_matrix()
        r.as_quat(scalar_first=True, canonical=True)
        rv = r.as_rotvec(degrees=True)
        np.linalg.norm(rv)                      # axis and angle from the rotation vector
        r.as_euler("ZYX", degrees=True)

    t_ours, t_theirs = best_times(lambda: [ours() for _ in range(100)], lambda: [theirs() for _ in range(100)])
    return t_ours / 100, t_theirs / 100


def main():
    print(f"kernels at several sizes (best run; ratio = ours / SciPy {scipy.__version__}"
          + (f" and ours / numpy-quaternion {npq.__version__}" if npq else ", numpy-quaternion not installed") + ")")
    print(f"{'conversion':42s} {'N':>9s} {'ours':>10s} {'SciPy':>10s} {'ratio':>6s} {'goal':>5s} {'':7s}"
          f" {'npq':>10s} {'ratio':>6s}")
    floors = []
    for n in SIZES:
        pass_time = _one_pass_time(n)
        for name, ours, theirs, peer, peer_goal, in rows(n):
            t_ours, t_scipy, *t_peer = best_times(ours, theirs, *([peer] if peer is not None else []))
            ratio, goal = t_ours / t_scipy, _goal(n)
            line = (f"{name:42s} {n:>9,} {t_ours * 1e3:8.3f}ms {t_scipy * 1e3:8.3f}ms {ratio:6.2f} {goal:5.1f} "
                    f"{_verdict(ratio, goal):7s}")
            if peer is not None:
                t_peer = t_peer[0]
                peer_ratio = t_ours / t_peer
                mark = f" {_verdict(peer_ratio, 1.0)}" if peer_goal and n >= 100_000 else ""
                line += f" {t_peer * 1e3:8.3f}ms {peer_ratio:6.2f}{mark}"
            print(line)
            if ratio > goal or (peer is not None and peer_goal and n >= 100_000 and peer_ratio > 1.0):
                floors.append((name, n, t_ours / pass_time, t_scipy / pass_time,
                               t_peer / pass_time if peer is not None else None))
        sys.stdout.flush()
    t_ours, t_scipy = single_orientation()
    ratio = t_ours / t_scipy
    print(f"{'one orientation: matrix -> all editors':42s} {'1':>9s} {t_ours * 1e6:8.1f}µs {t_scipy * 1e6:8.1f}µs "
          f"{ratio:6.2f} {1.0:5.1f} {_verdict(ratio, 1.0)}")
    if floors:
        print("\nwhere a goal is not met, each time in units of one numpy pass over the same N (c = a + b on "
              "N contiguous doubles, measured at each N):")
        print(f"{'conversion':42s} {'N':>9s} {'ours':>7s} {'SciPy':>7s} {'npq':>7s}")
        for name, n, ours_passes, scipy_passes, peer_passes in floors:
            peer_text = f"{peer_passes:7.1f}" if peer_passes is not None else f"{'':7s}"
            print(f"{name:42s} {n:>9,} {ours_passes:7.1f} {scipy_passes:7.1f} {peer_text}")


if __name__ == "__main__":
    main()
