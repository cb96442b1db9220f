"""Export report… carries the Measure tab's point fit when the check's measured mount is that fit: the
residual table a reviewer needs to see how the orientation was measured. Driven as a user does it: the
Measure tab's Import, Fit and Make mount buttons, the Check panel's measured mount, Save, the menu.

Check values: the residuals against SciPy's Rotation.align_vectors on the same points (a general-purpose
reference library), the record's units as the window's display unit."""

import shutil

import numpy as np
from PySide6.QtCore import Qt, QTimer
from scipy.spatial.transform import Rotation

from core.point_rows import read_point_pairs
from tests.app.test_check_panel import choose
from tests.cli.test_cli import ROOT

DEMO_CHECK = ROOT / "resources" / "demo_check.fwsession.json"
POINTS = ROOT / "resources" / "demo_points.csv"


def _preview_text(qtbot, window):
    seen = {}

    def in_the_preview():
        dialog = getattr(window, "report_preview", None)
        if dialog is None or not dialog.isVisible():
            QTimer.singleShot(100, in_the_preview)
            return
        seen["text"] = dialog.browser.toPlainText()
        dialog.reject()
    QTimer.singleShot(300, in_the_preview)
    file_menu = window.menuBar().actions()[0].menu()
    next(a for a in file_menu.actions() if a.text() == "Export &report…").trigger()
    return seen["text"]


def _fit_and_make_mount(qtbot, window):
    panel = window.measure_panel
    panel.set_method("points")
    panel.import_csv(str(POINTS))
    qtbot.mouseClick(panel.fit_button, Qt.MouseButton.LeftButton)
    qtbot.mouseClick(panel.make_mount_button, Qt.MouseButton.LeftButton)
    return window.model.mounts[-1].name


def test_the_report_of_a_check_measured_by_points_holds_their_residuals(qtbot, window, tmp_path):
    session = tmp_path / "demo_check.fwsession.json"
    shutil.copy(DEMO_CHECK, session)
    window.resize(1280, 800)
    assert window.open_file(str(session))
    made = _fit_and_make_mount(qtbot, window)
    choose(window.check_panel.measured_box, made)
    assert window.model.check.measured == made
    window.model.set_preferences(angle_units="mrad")
    assert window.save_file()
    text = _preview_text(qtbot, window)
    assert "Residuals of the point fit" in text and "the Measure tab's points" in text
    assert "milliradians" in text                                    # the record's angles in the display unit
    pairs = read_point_pairs(POINTS.read_text())
    nominal, measured = np.asarray(pairs.nominal, float), np.asarray(pairs.measured, float)
    rotation, _ = Rotation.align_vectors(measured - measured.mean(0), nominal - nominal.mean(0))
    fitted = rotation.apply(nominal - nominal.mean(0)) + measured.mean(0)
    worst = np.linalg.norm(measured - fitted, axis=1).max()
    assert f"{worst:.3g}" in text or f"{worst:.4g}" in text, worst


def test_a_fit_of_another_orientation_is_left_out(qtbot, window, tmp_path):
    session = tmp_path / "demo_check.fwsession.json"
    shutil.copy(DEMO_CHECK, session)
    assert window.open_file(str(session))
    _fit_and_make_mount(qtbot, window)           # the check still compares its own measured mount
    assert window.save_file()
    text = _preview_text(qtbot, window)
    assert "FAIL" in text and "Residuals of the point fit" not in text
