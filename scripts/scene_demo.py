"""Open just the Scene on an example orientation and save PNGs of it (run under a display, e.g. Xvfb).

The example is invented for the demo: a small camera on a bracket, turned 35° about z, tipped down 20°
and rolled 10° (intrinsic Z-Y'-X''), checked against its reference orientation.

    python scripts/scene_demo.py [output folder] [--stay]
"""

import pathlib
import sys

ROOT = pathlib.Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

from PySide6 import QtWidgets  # noqa: E402

from app.scene.scene_widget import SceneWidget  # noqa: E402
from core.orientation import Orientation  # noqa: E402


def main(argv=None):
    argv = list(sys.argv[1:] if argv is None else argv)
    stay = "--stay" in argv
    argv = [a for a in argv if a != "--stay"]
    out = pathlib.Path(argv[0]) if argv else ROOT / "screenshots" / "tmp"
    out.mkdir(parents=True, exist_ok=True)
    app = QtWidgets.QApplication.instance() or QtWidgets.QApplication(sys.argv)
    scene = SceneWidget()
    scene.setWindowTitle("Framewright Scene (demo; invented example)")
    scene.resize(1280, 880)
    scene.show()
    app.processEvents()
    scene.set_part((60.0, 40.0, 30.0), {"+Z": "lens", "-X": "connector", "-Z": "mounting plate"}, "+Z")
    scene.set_orientation(Orientation.from_angles("ZYX", (35.0, -20.0, 10.0)))
    scene.set_ghost(Orientation.identity(), "reference")
    app.processEvents()
    scene.export_png(out / "scene_demo.png", 1600, 1000)
    scene.set_sweep(0.5)
    scene.export_png(out / "scene_demo_sweep_half.png", 1280, 800)
    scene.set_sweep(1.0)
    scene.set_overlay_representation("matrix")
    scene.set_view("-Z")
    scene.export_png(out / "scene_demo_from_above.png", 1280, 800)
    scene.set_view("iso")
    scene.set_overlay_representation("angles")
    scene.set_tracked_vector("+X")
    scene.export_png(out / "scene_demo_track_x.png", 1280, 800)
    scene.set_tracked_vector("boresight")
    scene.set_overlay_representation("axis-angle")
    app.processEvents()
    scene.grab().save(str(out / "scene_demo_widget.png"))
    print(f"saved PNGs in {out}")
    if stay:
        app.exec()


if __name__ == "__main__":
    main()
