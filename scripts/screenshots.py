"""Screenshots of the window for the README, made under Xvfb with software OpenGL.

    make screenshots        (or: .venv/bin/python scripts/screenshots.py [output folder])

Starts its own virtual X display when none is set, uses a throw-away settings folder (so the shot does
not depend on anyone's preferences) and writes docs/screenshots/window.png.
"""

from __future__ import annotations

import os
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
os.environ.setdefault("LIBGL_ALWAYS_SOFTWARE", "1")

# A matrix as a drawing might print it: four decimals, reference -> body rows.
DRAWING_PASTE = """R =
[ 0.0000  0.9781 -0.2079
 -1.0000  0.0000  0.0000
  0.0000  0.2079  0.9781 ]"""


def _virtual_display():
    if os.environ.get("DISPLAY") and not os.environ.get("FRAMEWRIGHT_FORCE_XVFB"):
        return None
    from pyvirtualdisplay import Display

    display = Display(visible=False, size=(1920, 1200), color_depth=24, extra_args=["+extension", "GLX"])
    display.start()
    return display


def main(argv: list[str]) -> int:
    out_dir = Path(argv[1]) if len(argv) > 1 else ROOT / "docs" / "screenshots"
    out_dir.mkdir(parents=True, exist_ok=True)
    display = _virtual_display()
    try:
        os.environ.setdefault("QT_QPA_PLATFORM", "xcb")
        from PySide6.QtCore import QSettings
        from PySide6.QtWidgets import QApplication

        from app.window import make_window  # before the QApplication: the Scene sets a GL sharing flag

        app = QApplication.instance() or QApplication(sys.argv)
        settings_dir = tempfile.mkdtemp(prefix="framewright-shot-settings-")
        QSettings.setPath(QSettings.Format.IniFormat, QSettings.Scope.UserScope, settings_dir)

        window = make_window()
        window.resize(1600, 1000)
        window.show()
        for _ in range(5):
            app.processEvents()
        window.model.select(2)  # the down-looking camera: close to lock, so the meter has something to say
        window.decode_panel.set_text(DRAWING_PASTE)
        for _ in range(5):
            app.processEvents()
        # The Scene alone for two demo mounts, at a size that reads well in the README.
        for index, slug in ((0, "scene-masthead-camera"), (3, "scene-radar-antenna")):
            window.model.select(index)
            for _ in range(5):
                app.processEvents()
            scene_path = out_dir / f"{slug}.png"
            window.scene.export_png(str(scene_path), 1200, 750)
            print(f"wrote {scene_path} ({window.model.current_mount().name})")
        window.model.select(2)
        for _ in range(5):
            app.processEvents()
        path = out_dir / "window.png"
        if not window.grab().save(str(path)):
            print(f"could not write {path}", file=sys.stderr)
            return 1
        print(f"wrote {path} ({window.width()}x{window.height()})")
        window.model.undo_stack.setClean()
        window.close()
        return 0
    finally:
        if display is not None:
            display.stop()


if __name__ == "__main__":
    sys.exit(main(sys.argv))
