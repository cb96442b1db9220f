"""Screenshots of the window for the README, made under Xvfb with software OpenGL.

    make screenshots        (or: .venv/bin/python scripts/screenshots.py [output folder])

Starts its own virtual X display when none is set, uses a throw-away settings folder (so the shot does
not depend on anyone's preferences) and writes docs/screenshots/: window.png, the Scene alone for two demo
mounts, decode-pose.png (Decode with a 4x4 transform at 1280x800), check.png (the Check panel),
repeated-measurements.png (the Adjust tab with three measurements of one mount at 1280x800), fit.png (the
Measure panel with a fit), adjust.png (the Adjust tab on the invented demo check) and adjust-inches.png (its feet and shims in
inches), check-milliradians-1280x800.png (the Check figures in mrad), and the whole window at
1280x800 (window.png, window-1280x800.png) and 1920x1080 (window-1920x1080.png), and at 1280x800 with the
Gibbs vector and MRP editors shown (parameters-1280x800.png, parameters-half-turn-1280x800.png).
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

# A 4x4 transform as a calibration file might hold it (invented values): 90° about x, t = (0.1, 0.2, 0.3)
# with no unit stated, so the panel shows both readings 180° apart and asks for the unit.
POSE_PASTE = """1 0 0 0.1
0 0 -1 0.2
0 1 0 0.3
0 0 0 1"""


def _virtual_display():
    if os.environ.get("DISPLAY") and not os.environ.get("FRAMEWRIGHT_FORCE_XVFB"):
        return None
    from pyvirtualdisplay import Display

    display = Display(visible=False, size=(1920, 1200), color_depth=24, extra_args=["+extension", "GLX"])
    display.start()
    return display


def _settle(app, rounds=8):
    for _ in range(rounds):
        app.processEvents()


def _grab(window, path) -> bool:
    if not window.grab().save(str(path)):
        print(f"could not write {path}", file=sys.stderr)
        return False
    print(f"wrote {path} ({window.width()}x{window.height()})")
    return True


def _show_tab(window, title):
    tabs = window.side_tabs
    tabs.setCurrentIndex(next(i for i in range(tabs.count()) if tabs.tabText(i) == title))


def _check_shot(app, window, out_dir) -> bool:
    """The Check panel: the demo radar antenna as nominal, an invented 'as measured' copy turned 3° in
    pointing and 0.4° in roll, judged on the boresight +X with 1° tolerances; the Scene shows the nominal
    as the ghost."""
    from core.check import CheckSettings
    from core.orientation import Orientation
    from core import operations
    from core.session import SavedCheck

    model = window.model
    nominal_index = next(i for i, m in enumerate(model.mounts) if m.name.startswith("Radar antenna"))
    nominal = model.mounts[nominal_index]
    measured_name = "Radar antenna, as measured"
    model.select(nominal_index)
    model.duplicate_mount(nominal_index)
    model.rename_mount(model.selected_index, measured_name)
    turned = (nominal.orientation @ Orientation.from_axis_angle((0, 1, 0), 3.0)
              @ Orientation.from_axis_angle((1, 0, 0), 0.4))
    model.set_orientation(turned)
    settings = CheckSettings(mode="pointing_and_roll", pointing_tolerance_deg=1.0, roll_tolerance_deg=1.0,
                             body_axis="+X")
    model.apply(operations.set_check, SavedCheck(nominal=nominal.name, measured=measured_name, settings=settings))
    _show_tab(window, "Check")
    _settle(app)
    return _grab(window, out_dir / "check.png")


def _level_shot(app, window, out_dir) -> bool:
    """The Level tab at a laptop's size on the demo's radar antenna (its bracket shimmed 5° up, invented),
    the readings shown in mm/m as a precision machinist's level shows them, over a 100 mm base."""
    window.resize(1280, 800)
    model = window.model
    model.select(next(i for i, m in enumerate(model.mounts) if m.name.startswith("Radar antenna on")))
    _show_tab(window, "Level")
    _settle(app)
    slopes = window.level_panel.slopes
    index = slopes.instrument_box.findData("machinist")
    slopes.instrument_box.setCurrentIndex(index)
    slopes.instrument_box.activated.emit(index)
    _settle(app)
    from PySide6.QtWidgets import QScrollArea
    area = slopes.parentWidget()
    while area is not None and not isinstance(area, QScrollArea):
        area = area.parentWidget()
    if area is not None:                    # the choices and the shim line in view, under the table
        area.ensureWidgetVisible(window.level_panel.slopes, 0, 120)
    _settle(app)
    return _grab(window, out_dir / "level-mm-per-m.png")


def _units_shot(app, window, out_dir) -> bool:
    """The window at a laptop's size with every angle in milliradians (the one preference)."""
    window.resize(1280, 800)
    model = window.model
    before = model.preferences.angle_units
    model.set_preferences(angle_units="mrad")
    _settle(app)
    ok = _grab(window, out_dir / "window-milliradians-1280x800.png")
    _show_tab(window, "Check")              # the check figures in the display unit too
    _settle(app)
    ok = ok and _grab(window, out_dir / "check-milliradians-1280x800.png")
    model.set_preferences(angle_units=before)
    _settle(app)
    return ok


def _repeats_shot(app, window, out_dir) -> bool:
    """The Adjust tab at a laptop's size: the radar antenna's invented 'as measured' copy measured three
    times about 0.45° off its nominal (small turns about body X, Y and Z between the readings), set to
    their average, with their scatter taken as the uncertainty, so the decision needs the guard band."""
    from core.orientation import Orientation
    from core import operations
    from core.session import SavedCheck

    model = window.model
    nominal = next(m for m in model.mounts if m.name.startswith("Radar antenna") and "measured" not in m.name)
    measured_name = "Radar antenna, as measured"
    model.select(next(i for i, m in enumerate(model.mounts) if m.name == measured_name))
    model.apply(operations.set_check, SavedCheck(nominal=nominal.name, measured=measured_name))
    off = nominal.orientation @ Orientation.from_axis_angle((0, 1, 0), 0.45)
    box = window.adjust_panel.repeats
    window.resize(1280, 800)
    _show_tab(window, "Adjust")             # first: a tab out of sight draws (and enables) nothing
    _settle(app)
    for angle, axis in ((0.12, (1, 0, 0)), (0.10, (0, 1, 0)), (-0.08, (0, 0, 1))):
        model.set_orientation(off @ Orientation.from_axis_angle(axis, angle))
        box.add_button.click()
    box.average_button.click()
    box.scatter_button.click()
    _settle(app)
    area = window.adjust_panel.parentWidget().parentWidget()       # the tab's scroll area
    area.verticalScrollBar().setValue(box.y() - 8)                  # the box at the top, the decision below
    _settle(app)
    return _grab(window, out_dir / "repeated-measurements.png")


def _decode_pose_shot(app, window, out_dir) -> bool:
    """The Decode panel at a laptop's size with an invented 4x4 transform: each reading with its result."""
    window.resize(1280, 800)
    _show_tab(window, "Decode")
    window.decode_panel.set_text(POSE_PASTE)
    _settle(app)
    return _grab(window, out_dir / "decode-pose.png")


def _fit_shot(app, window, out_dir) -> bool:
    """The Measure panel: the invented points of resources/demo_points.csv for the mast-head camera, fitted,
    with the points and magnified residuals in the Scene."""
    model = window.model
    model.select(next(i for i, m in enumerate(model.mounts) if m.name.startswith("Mast-head camera")))
    _show_tab(window, "Measure")
    # The points table is wide: show it on a 1920-pixel screen with the side area opened up.
    window.resize(1920, 1080)
    window.splitter.setSizes([200, 960, 760])
    window.measure_panel.set_method("points")
    window.measure_panel.import_csv(str(ROOT / "resources" / "demo_points.csv"))
    window.measure_panel.fit()
    _settle(app)
    return _grab(window, out_dir / "fit.png")


def _adjust_shot(app, window, out_dir) -> bool:
    """The Adjust tab at a laptop's size on resources/demo_check.fwsession.json (invented): the radar
    antenna measured 3° off in pointing and 0.4° in roll, with its adjustment axes, a four-foot footprint
    and a standard uncertainty of 0.05°."""
    if not window.open_file(str(ROOT / "resources" / "demo_check.fwsession.json")):
        print("could not open the demo check session", file=sys.stderr)
        return False
    model = window.model
    model.select(next(i for i, m in enumerate(model.mounts) if m.name == "Radar antenna, as measured"))
    _show_tab(window, "Adjust")
    # The tab is tall (correction, axes, shims, repeated measurements, decision): a large screen, scrolled
    # to the end, shows the shims and the decision with the correction's figures above them.
    window.resize(1920, 1080)
    window.splitter.setSizes([220, 1000, 700])
    _settle(app, 12)
    page = window.adjust_panel
    while page is not None and not hasattr(page, "verticalScrollBar"):
        page = page.parentWidget()
    if page is not None:
        page.verticalScrollBar().setValue(page.verticalScrollBar().maximum())
        _settle(app, 6)
    ok = _grab(window, out_dir / "adjust.png")
    # the same feet, pitch and shims in inches (the footprint is kept in mm; only the unit shown changes)
    from dataclasses import replace
    from core import operations
    check_state = model.check
    model.apply(operations.set_check, replace(check_state, adjustment=replace(check_state.adjustment,
                                                                                length_unit="in")))
    _settle(app, 6)
    if page is not None:
        page.verticalScrollBar().setValue(page.verticalScrollBar().maximum())
        _settle(app, 6)
    ok = ok and _grab(window, out_dir / "adjust-inches.png")
    model.undo_stack.undo()
    return ok


def _parameters_shot(app, window, out_dir) -> bool:
    """The window at 1280x800 with View ▸ Gibbs vector and MRP editors on (their row wraps under the
    others), once on a demo mount and once at a half turn, where the Gibbs editor says so in words."""
    from core.orientation import Orientation

    window.resize(1280, 800)
    window.parameters_action.trigger()
    _settle(app)
    ok = _grab(window, out_dir / "parameters-1280x800.png")
    window.model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 180))
    _settle(app)
    ok = ok and _grab(window, out_dir / "parameters-half-turn-1280x800.png")
    window.model.undo_stack.undo()
    window.parameters_action.trigger()
    _settle(app)
    return ok


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
        # The whole window at a laptop's size and at a large screen's (window.png is the laptop one).
        for width, height in ((1920, 1080), (1280, 800)):
            window.resize(width, height)
            _settle(app)
            if not _grab(window, out_dir / f"window-{width}x{height}.png"):
                return 1
        if not _grab(window, out_dir / "window.png"):
            return 1
        if not _parameters_shot(app, window, out_dir):
            return 1
        if not (_decode_pose_shot(app, window, out_dir) and _check_shot(app, window, out_dir)
                and _level_shot(app, window, out_dir) and _units_shot(app, window, out_dir)
                and _repeats_shot(app, window, out_dir) and _fit_shot(app, window, out_dir)):
            return 1
        window.model.undo_stack.setClean()     # the shots changed the demo: opening the next file asks nothing
        if not _adjust_shot(app, window, out_dir):
            return 1
        window.model.undo_stack.setClean()
        window.close()
        return 0
    finally:
        if display is not None:
            display.stop()


if __name__ == "__main__":
    sys.exit(main(sys.argv))
