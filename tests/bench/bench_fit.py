"""Point-fit benchmark: 10,000 point pairs fitted (rotation, translation, residuals, RMS and flags) beside
SciPy's Rotation.align_vectors on the same points, in the same run; goal ratio <= 1.0.

Prints our time, SciPy's and the ratio (ours / SciPy; below 1 is faster). Timings only; nothing here
passes or fails."""

import sys
import time
from pathlib import Path

import numpy as np
import scipy
from scipy.spatial.transform import Rotation

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from core.direction_fit import fit_directions  # noqa: E402
from core.fit import fit_points  # noqa: E402

POINTS = 10_000
CALLS = 50
REPEATS = 7
GOAL_RATIO = 1.0


def best_time(function):
    """Best per-call time of a few runs of CALLS calls each; runs of ours and SciPy's alternate."""
    times = []
    for _ in range(REPEATS):
        start = time.perf_counter()
        for _ in range(CALLS):
            function()
        times.append((time.perf_counter() - start) / CALLS)
    return min(times)


def points():
    """Invented measurement: points over a 200 mm part, turned and moved, with 0.05 mm noise."""
    rng = np.random.default_rng(10)
    nominal = rng.uniform(-100, 100, size=(POINTS, 3))
    measured = Rotation.random(rng=rng).apply(nominal) + [250.0, -40.0, 900.0] \
        + rng.normal(scale=0.05, size=(POINTS, 3))
    return nominal, measured


def main():
    nominal, measured = points()
    weights = np.random.default_rng(11).uniform(0.5, 2.0, size=POINTS)
    directions = nominal / np.linalg.norm(nominal, axis=1, keepdims=True)
    turned = measured - measured.mean(axis=0)
    turned /= np.linalg.norm(turned, axis=1, keepdims=True)
    rows = [
        ("points, unweighted", lambda: fit_points(nominal, measured),
         lambda: Rotation.align_vectors(measured, nominal)),
        ("points, weighted", lambda: fit_points(nominal, measured, weights),
         lambda: Rotation.align_vectors(measured, nominal, weights=weights)),
    ]
    print(f"fit, {POINTS:,} points (best of {REPEATS} x {CALLS} calls; ratio = ours / SciPy "
          f"{scipy.__version__} align_vectors; ours also finds the translation, residuals, RMS and flags)")
    print(f"{'fit':28s} {'ours':>9s} {'SciPy':>9s} {'ratio':>7s}")
    for name, ours, theirs in rows:
        ours(), theirs()
        t_ours, t_theirs = best_time(ours), best_time(theirs)
        verdict = "met" if t_ours / t_theirs <= GOAL_RATIO else "NOT met"
        print(f"{name:28s} {t_ours * 1e6:7.0f}us {t_theirs * 1e6:7.0f}us {t_ours / t_theirs:7.2f}  "
              f"goal <= {GOAL_RATIO:g}: {verdict}")
    # Directions: many unit vectors (the pair-angle quality figure is computed over all pairs, so it is
    # timed on a smaller set).
    few = 500
    t_ours = best_time(lambda: fit_directions(directions[:few], turned[:few]))
    t_theirs = best_time(lambda: Rotation.align_vectors(turned[:few], directions[:few]))
    print(f"{f'directions ({few})':28s} {t_ours * 1e6:7.0f}us {t_theirs * 1e6:7.0f}us {t_ours / t_theirs:7.2f}")


if __name__ == "__main__":
    main()
