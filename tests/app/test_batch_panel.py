"""Batch panel, driven through its buttons, header clicks and typed tolerance. The check values come from
SciPy's Rotation (a reference library): deviation D = Nᵀ M, its angle (CONVENTIONS.md)."""

import numpy as np
import pytest
from PySide6.QtCore import QPoint, Qt, QTimer
from PySide6.QtWidgets import QFileDialog
from scipy.spatial.transform import Rotation

import app.panels.batch_panel as batch_panel_module
from app.panels.batch_panel import BatchPanel
from app.panels.batch_table_model import FAILED_ROW
from core.batch import SetConventions, compute_deviations, read_mounts, write_results
from core.check import CheckSettings

ROWS = 300
BAD_ROW = 137          # 0-based data row that is out of tolerance


def invented_mounts(rows=ROWS, bad_row=BAD_ROW, seed=11):
    """An invented line of sensor mounts: nominal as quaternions, measured as yaw-pitch-roll in degrees
    (a different representation per set, as such files come). Deviations about 0.05°, one row 2°."""
    rng = np.random.default_rng(seed)
    nominal = Rotation.random(rows, random_state=seed)
    small = rng.normal(size=(rows, 3))
    small *= (np.radians(0.05) / np.linalg.norm(small, axis=1))[:, None]
    small[bad_row] *= 40.0
    measured = nominal * Rotation.from_rotvec(small)                 # M = N · D, D in the body frame
    q = nominal.as_quat(scalar_first=True)
    ypr = measured.as_euler("ZYX", degrees=True)                     # SciPy: intrinsic ZYX = yaw, pitch, roll
    lines = ["name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_yaw[deg],measured_pitch,measured_roll,serial"]
    lines += [f"IMU-{i + 1:03d}," + ",".join(repr(float(v)) for v in (*q[i], *ypr[i])) + f",SN{9000 + i}"
              for i in range(rows)]
    return "\n".join(lines) + "\n", nominal, measured


@pytest.fixture
def panel(qtbot, model):
    widget = BatchPanel(model)
    qtbot.addWidget(widget)
    widget.resize(1100, 700)
    widget.show()
    qtbot.waitExposed(widget)
    widget.activateWindow()
    qtbot.waitUntil(widget.isActiveWindow, timeout=2000)
    return widget


def open_through_button(qtbot, panel, monkeypatch, path):
    monkeypatch.setattr(QFileDialog, "getOpenFileName", lambda *a, **k: (str(path), ""))
    qtbot.mouseClick(panel.open_button, Qt.MouseButton.LeftButton)


def column_of(panel, title):
    model = panel.proxy
    return next(c for c in range(model.columnCount()) if model.headerData(c, Qt.Orientation.Horizontal) == title)


def shown(panel, column):
    return [panel.proxy.index(r, column).data() for r in range(panel.proxy.rowCount())]


def click_header(qtbot, panel, column):
    header = panel.view.horizontalHeader()
    x = header.sectionViewportPosition(column) + header.sectionSize(column) // 2
    qtbot.mouseClick(header.viewport(), Qt.MouseButton.LeftButton, pos=QPoint(x, header.height() // 2))


@pytest.fixture
def mounts_file(tmp_path):
    text, nominal, measured = invented_mounts()
    path = tmp_path / "line 4 mounts.csv"
    path.write_text(text, encoding="utf-8")
    return path, text, nominal, measured


def test_a_generated_file_is_read_and_only_the_bad_row_is_flagged(qtbot, panel, monkeypatch, mounts_file):
    path, text, nominal, measured = mounts_file
    open_through_button(qtbot, panel, monkeypatch, path)
    assert panel.proxy.rowCount() == ROWS
    # Reference: SciPy, the angle of Nᵀ M per row.
    expected = np.degrees((nominal.inv() * measured).magnitude())
    np.testing.assert_allclose(panel.result.total_deg, expected, atol=1e-9)
    result_column = column_of(panel, "Result")
    verdicts = shown(panel, result_column)
    assert [i for i, v in enumerate(verdicts) if v == "fail"] == [BAD_ROW]
    assert panel.proxy.index(BAD_ROW, 0).data(Qt.ItemDataRole.BackgroundRole) == FAILED_ROW
    assert panel.proxy.index(BAD_ROW - 1, 0).data(Qt.ItemDataRole.BackgroundRole) is None
    assert "1 out of tolerance" in panel.summary.text()
    assert "serial" in panel.message.text()                       # the ignored column is named
    qtbot.mouseClick(panel.only_failed, Qt.MouseButton.LeftButton)
    assert panel.proxy.rowCount() == 1
    assert panel.proxy.index(0, 0).data() == f"IMU-{BAD_ROW + 1:03d}"
    assert panel.proxy.headerData(0, Qt.Orientation.Vertical) == str(BAD_ROW + 1)   # the file's row


def test_header_clicks_sort_by_deviation(qtbot, panel, monkeypatch, mounts_file):
    path, *_ = mounts_file
    open_through_button(qtbot, panel, monkeypatch, path)
    column = column_of(panel, "Deviation (°)")
    click_header(qtbot, panel, column)
    ascending = [float(v) for v in shown(panel, column)]
    assert ascending == sorted(ascending)
    click_header(qtbot, panel, column)
    descending = [float(v) for v in shown(panel, column)]
    assert descending == sorted(descending, reverse=True)
    assert panel.proxy.index(0, 0).data() == f"IMU-{BAD_ROW + 1:03d}"
    assert shown(panel, column_of(panel, "Result"))[0] == "fail"
    # Sorted and filtered together.
    panel.only_failed.setChecked(True)
    assert panel.proxy.rowCount() == 1 and panel.proxy.index(0, 0).data() == f"IMU-{BAD_ROW + 1:03d}"


def test_export_writes_what_core_batch_writes(qtbot, panel, monkeypatch, mounts_file, tmp_path):
    path, text, *_ = mounts_file
    open_through_button(qtbot, panel, monkeypatch, path)
    column = column_of(panel, "Deviation (°)")
    click_header(qtbot, panel, column)                              # the view's order must not matter
    target = tmp_path / "out" / "deviations.csv"
    target.parent.mkdir()
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *a, **k: (str(target), ""))
    qtbot.mouseClick(panel.export_button, Qt.MouseButton.LeftButton)
    expected = write_results(compute_deviations(read_mounts(text), CheckSettings(total_tolerance_deg=0.5)))
    assert target.read_text(encoding="utf-8") == expected
    assert list(target.parent.iterdir()) == [target]                # no temporary file left behind
    assert "Exported 300 rows" in panel.message.text()


def test_a_bad_cell_is_an_error_row_counted_apart_and_named(qtbot, panel, monkeypatch, mounts_file, tmp_path):
    path, text, *_ = mounts_file
    lines = text.splitlines()
    cells = lines[5].split(",")
    cells[6] = "12.5.3"                                             # data row 5, column measured_pitch
    lines[5] = ",".join(cells)
    bad = tmp_path / "typo.csv"
    bad.write_text("\n".join(lines) + "\n", encoding="utf-8")
    open_through_button(qtbot, panel, monkeypatch, bad)
    summary = panel.summary.text()
    assert "1 in error (not checked)" in summary and f"{ROWS - 2} within, 1 out of tolerance" in summary
    assert "line 6 (row 5, mount 'IMU-005'), column 'measured_pitch': '12.5.3' is not a number" in summary
    result_column = column_of(panel, "Result")
    assert shown(panel, result_column)[4] == "error" and shown(panel, column_of(panel, "Deviation (°)"))[4] == ""
    assert panel.proxy.index(4, 0).data(Qt.ItemDataRole.BackgroundRole) is not FAILED_ROW
    qtbot.mouseClick(panel.only_failed, Qt.MouseButton.LeftButton)
    assert sorted(shown(panel, result_column)) == ["error", "fail"]  # an error row is never hidden as a pass


def test_a_broken_header_refuses_the_file_and_changes_nothing(qtbot, panel, monkeypatch, mounts_file, tmp_path):
    path, text, *_ = mounts_file
    open_through_button(qtbot, panel, monkeypatch, path)
    shown_before, label_before = panel.result, panel.file_label.text()
    bad = tmp_path / "typo.csv"
    bad.write_text(text.replace("measured_pitch", "measured_ptch", 1), encoding="utf-8")
    open_through_button(qtbot, panel, monkeypatch, bad)
    message = panel.message.text()
    assert "“typo.csv” refused" in message and "unknown field 'ptch'" in message and "Nothing changed" in message
    assert panel.result is shown_before and panel.file_label.text() == label_before
    assert panel.proxy.rowCount() == ROWS


HOSTILE = "<b style='color:green'>ALL PASS</b><img src='/tmp/x.png'>"


def test_names_and_messages_show_as_plain_text(qtbot, panel, monkeypatch, tmp_path):
    # A name of markup must show its characters, never draw: every label with the file's text is plain.
    path = tmp_path / (HOSTILE.replace("/", "_") + ".csv")
    path.write_text("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,"
                    f"measured_qz\n\"{HOSTILE}\",1,0,0,0,0,1,0,0\n", encoding="utf-8")
    open_through_button(qtbot, panel, monkeypatch, path)
    for label in (panel.file_label, panel.summary, panel.message):
        assert label.textFormat() == Qt.TextFormat.PlainText
    assert HOSTILE in panel.summary.text() and "1 out of tolerance" in panel.summary.text()
    panel.export_results(str(tmp_path / "out.csv"))                  # a name in a message stays plain too
    path.write_text("not a header\n", encoding="utf-8")
    open_through_button(qtbot, panel, monkeypatch, path)
    assert panel.message.textFormat() == Qt.TextFormat.PlainText and "<b style" in panel.message.text()


def test_typed_tolerance_recomputes_and_bad_text_keeps_the_last_value(qtbot, panel, monkeypatch, mounts_file):
    path, *_ = mounts_file
    open_through_button(qtbot, panel, monkeypatch, path)
    line = panel.tolerance.lineEdit()
    line.selectAll()
    qtbot.keyClicks(line, "3")
    qtbot.keyClick(line, Qt.Key.Key_Return)
    assert panel.tolerance_deg == 3.0 and panel.result.failed_count == 0
    line.selectAll()
    qtbot.keyClicks(line, "0.01")
    qtbot.keyClick(line, Qt.Key.Key_Return)
    assert panel.result.failed_count == ROWS                       # every row deviates about 0.05°
    line.selectAll()
    qtbot.keyClicks(line, "0,5")
    qtbot.keyClick(line, Qt.Key.Key_Return)
    assert panel.tolerance_deg == 0.01 and "decimal point" in panel.tolerance.problem


def test_angles_without_a_sequence_wait_for_the_conventions(qtbot, panel, monkeypatch, tmp_path):
    rotations = Rotation.from_euler("xyz", [[10, 20, 30], [-5, 40, 170], [0, 0, 0]], degrees=True)
    angles = rotations.as_euler("xyz", degrees=True)              # SciPy: extrinsic XYZ (lower case)
    lines = ["name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_angle1,measured_angle2,measured_angle3"]
    lines += [f"A{i},1,0,0,0," + ",".join(repr(float(v)) for v in a) for i, a in enumerate(angles)]
    path = tmp_path / "angles.csv"
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")
    open_through_button(qtbot, panel, monkeypatch, path)
    assert "Conventions" in panel.message.text() and panel.result is None
    panel.set_conventions(SetConventions(), SetConventions(sequence="XYZ", intrinsic=False))
    assert panel.result is not None
    np.testing.assert_allclose(panel.result.total_deg, np.degrees(rotations.magnitude()), atol=1e-9)


def test_a_large_file_shows_progress_and_cancel_changes_nothing(qtbot, panel, monkeypatch, mounts_file):
    path, *_ = mounts_file
    open_through_button(qtbot, panel, monkeypatch, path)
    before = panel.result
    monkeypatch.setattr(batch_panel_module, "LARGE_FILE_ROWS", 100)
    seen = []
    QTimer.singleShot(0, lambda: (seen.append(panel.progress_dialog is not None), panel.progress_dialog.cancel()))
    open_through_button(qtbot, panel, monkeypatch, path)
    assert seen == [True]
    assert "cancelled" in panel.message.text() and panel.result is before
