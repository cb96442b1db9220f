"""Pictures of the Measure and Batch panels, each alone on an invented example, for looking at them.

    Xvfb :97 -screen 0 1600x1000x24 &
    DISPLAY=:97 .venv/bin/python scripts/panel_shots.py [output folder, default /tmp]

Writes measure_points.png, measure_directions.png, measure_refused.png, batch.png and batch_refused.png.
The data are invented (a bracket with eight datum points, a line of 400 inertial-unit mounts).
"""

from __future__ import annotations

import os
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("LIBGL_ALWAYS_SOFTWARE", "1")

import numpy as np  # noqa: E402
from PySide6.QtCore import Qt  # noqa: E402
from PySide6.QtGui import QGuiApplication  # noqa: E402
from PySide6.QtWidgets import QApplication  # noqa: E402

from app.model import SessionModel  # noqa: E402
from app.panels.batch_panel import BatchPanel  # noqa: E402
from app.panels.measure_fit import DIRECTIONS  # noqa: E402
from app.panels.measure_panel import MeasurePanel  # noqa: E402
from core.orientation import Orientation  # noqa: E402

NOMINAL = np.array([[0, 0, 0], [120, 0, 0], [120, 80, 0], [0, 80, 0],
                    [0, 0, 40], [120, 0, 40], [60, 80, 40], [30, 40, 20]], dtype=float)


def settle(app, widget):
    widget.show()
    for _ in range(5):
        app.processEvents()


def measure_shots(app, out: Path) -> None:
    rng = np.random.default_rng(5)
    rotation = Orientation.from_angles("ZYX", [31.5, -12.25, 7.75])
    measured = rotation.apply(NOMINAL) + [512.5, -140.25, 960.0] + rng.normal(scale=0.01, size=NOMINAL.shape)
    measured[5] += [0.0, 0.8, -0.6]
    panel = MeasurePanel(SessionModel())
    panel.resize(1000, 760)
    settle(app, panel)
    text = "\n".join("\t".join(f"{v:.3f}" for v in (*p, *q)) for p, q in zip(NOMINAL, measured))
    QGuiApplication.clipboard().setText(text)
    panel.current_table().setCurrentCell(0, 0)
    panel.paste_rows()
    panel.fit()
    settle(app, panel)
    panel.grab().save(str(out / "measure_points.png"))

    panel.set_method(DIRECTIONS)
    body = np.array([[0.0, 0.0, 1.0], [1.0, 0.0, 0.0]])
    reference = rotation.apply(body)
    QGuiApplication.clipboard().setText("\n".join("\t".join(f"{v:.6f}" for v in (*b, *r))
                                                  for b, r in zip(body, reference)))
    panel.current_table().setCurrentCell(0, 0)
    panel.paste_rows()
    panel.fit()
    settle(app, panel)
    panel.grab().save(str(out / "measure_directions.png"))

    panel.set_method("points")
    line = np.array([[0, 0, 0], [10, 20, 30], [20, 40, 60], [35, 70, 105], [50, 100, 150]], dtype=float)
    panel.current_table().clear_inputs()
    QGuiApplication.clipboard().setText("\n".join("\t".join(f"{v:g}" for v in (*p, *p)) for p in line))
    panel.current_table().setCurrentCell(0, 0)
    panel.paste_rows()
    panel.fit()
    settle(app, panel)
    panel.grab().save(str(out / "measure_refused.png"))


def batch_shots(app, out: Path) -> None:
    rng = np.random.default_rng(9)
    rows = 400
    lines = ["name,nominal_yaw[deg],nominal_pitch,nominal_roll,measured_qw,measured_qx,measured_qy,measured_qz"]
    for i in range(rows):
        ypr = rng.uniform([-180, -60, -180], [180, 60, 180])
        nominal = Orientation.from_angles("ZYX", ypr)
        error = rng.normal(size=3)
        size = rng.uniform(0.02, 0.3) if i % 97 else rng.uniform(0.6, 1.2)   # degrees; every 97th is off
        error *= size / np.linalg.norm(error)
        measured = nominal @ Orientation.from_rotation_vector(error)
        lines.append(f"IMU-{i + 1:03d}," + ",".join(f"{v:.6f}" for v in ypr) + ","
                     + ",".join(f"{v:.9f}" for v in measured.as_quaternion()))
    folder = Path(tempfile.mkdtemp())
    good = folder / "line 4 mounts.csv"
    good.write_text("\n".join(lines) + "\n", encoding="utf-8")
    panel = BatchPanel(SessionModel())
    panel.resize(1000, 640)
    settle(app, panel)
    panel.open_file(str(good))
    panel.view.sortByColumn(1, Qt.SortOrder.DescendingOrder)     # as a click on "Deviation (°)" does
    settle(app, panel)
    panel.grab().save(str(out / "batch.png"))
    bad_lines = list(lines)
    cells = bad_lines[12].split(",")
    cells[3] = "1O.5"                  # a letter O for a zero, as typed in a hurry
    bad_lines[12] = ",".join(cells)
    bad = folder / "line 5 mounts.csv"
    bad.write_text("\n".join(bad_lines) + "\n", encoding="utf-8")
    panel.open_file(str(bad))
    settle(app, panel)
    panel.grab().save(str(out / "batch_refused.png"))


def main() -> None:
    out = Path(sys.argv[1]) if len(sys.argv) > 1 else Path("/tmp")
    out.mkdir(parents=True, exist_ok=True)
    app = QApplication.instance() or QApplication(sys.argv)
    measure_shots(app, out)
    batch_shots(app, out)
    print(f"wrote the panel pictures to {out}")


if __name__ == "__main__":
    main()
