"""Batch benchmark: a 100,000-row CSV end to end (text in, results CSV text out), goal <= 2 s, and the
deviation step beside SciPy's Rotation (inv(), *, magnitude()) on the same quaternions, in the same run.

Prints our time, SciPy's and the ratio (ours / SciPy; below 1 is faster). Timings only; nothing here
passes or fails."""

import sys
from pathlib import Path

import numpy as np
import scipy
from scipy.spatial.transform import Rotation

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from core.batch import compute_deviations, read_mounts, run_batch, write_results  # noqa: E402
from core.check import CheckSettings  # noqa: E402
from tests.bench.bench_core import REPEATS, best_time  # noqa: E402

ROWS = 100_000
GOAL_SECONDS = 2.0


def batch_text():
    """An invented file: random nominal quaternions, measured as yaw-pitch-roll within 1° of them."""
    rng = np.random.default_rng(2026)
    nominal = Rotation.random(ROWS, rng=rng)
    axes = rng.normal(size=(ROWS, 3))
    axes *= np.radians(rng.uniform(0, 1, size=(ROWS, 1))) / np.linalg.norm(axes, axis=1, keepdims=True)
    measured = nominal * Rotation.from_rotvec(axes)
    values = np.hstack([nominal.as_quat(scalar_first=True), measured.as_euler("ZYX", degrees=True)])
    header = ("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,"
              "measured_yaw[deg],measured_pitch,measured_roll")
    fmt = "%s" + ",%.12g" * 7
    rows = map(fmt.__mod__, ((f"mount {i}", *v) for i, v in enumerate(values.tolist())))
    return header + "\n" + "\n".join(rows) + "\n"


def main():
    text = batch_text()
    settings = CheckSettings(total_tolerance_deg=0.5, body_axis="+Z")
    print(f"batch CSV, {ROWS:,} rows, {len(text) / 1e6:.1f} MB (best of {REPEATS}; "
          f"ratio = ours / SciPy {scipy.__version__})")
    end_to_end = best_time(lambda: run_batch(text, settings))
    table = read_mounts(text)
    result = compute_deviations(table, settings)
    t_read = best_time(lambda: read_mounts(text))
    t_write = best_time(lambda: write_results(result))
    print(f"{'step':44s} {'ours':>9s} {'SciPy':>9s} {'ratio':>7s}")
    print(f"{'end to end (text -> results CSV)':44s} {end_to_end * 1e3:7.0f}ms "
          f"{'':>9s} {'':>7s}  goal <= {GOAL_SECONDS:g} s: {'met' if end_to_end <= GOAL_SECONDS else 'NOT met'}")
    print(f"{'  reading and converting':44s} {t_read * 1e3:7.0f}ms")
    print(f"{'  writing':44s} {t_write * 1e3:7.0f}ms")

    n = Rotation.from_quat(table.nominal, scalar_first=True)
    m = Rotation.from_quat(table.measured, scalar_first=True)
    total_only = CheckSettings(total_tolerance_deg=0.5)
    t_scipy = best_time(lambda: (n.inv() * m).magnitude())
    t_ours = best_time(lambda: compute_deviations(table, total_only))
    t_ours_pointing = best_time(lambda: compute_deviations(table, settings))
    print(f"{'deviation: total angle, axis, flags':44s} {t_ours * 1e3:7.1f}ms {t_scipy * 1e3:7.1f}ms "
          f"{t_ours / t_scipy:7.2f}")
    print(f"{'deviation: + pointing and roll of +Z':44s} {t_ours_pointing * 1e3:7.1f}ms {t_scipy * 1e3:7.1f}ms "
          f"{t_ours_pointing / t_scipy:7.2f}")
    print("  (SciPy computes the total angle only: inv(), *, magnitude())")


if __name__ == "__main__":
    main()
