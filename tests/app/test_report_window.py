"""File ▸ Export report… as a user does it: the menu, the preview, Save, the file dialog (answered by a
stand-in), the file written with the Scene picture, and the PDF-or-HTML choice remembered."""

import shutil
from pathlib import Path

from PySide6.QtCore import Qt, QTimer
from PySide6.QtWidgets import QApplication, QFileDialog

from app import report_dialog
from core.record_files import read_html_report
from tests.cli.test_cli import ROOT

DEMO_CHECK = ROOT / "resources" / "demo_check.fwsession.json"


def test_export_report_previews_then_writes_html_with_the_picture(window, qtbot, tmp_path, monkeypatch):
    session = tmp_path / "demo_check.fwsession.json"
    shutil.copy(DEMO_CHECK, session)
    window.resize(1280, 800)
    assert window.open_file(str(session))
    # the measured mount selected: the Scene shows the nominal as the ghost, as the record's picture does
    window.model.select(len(window.model.mounts) - 1)
    out = tmp_path / "radar-report.html"
    asked = []

    def save_name(parent, caption, start, filters, selected):
        asked.append((start, selected))
        return str(out), report_dialog.FILTERS["html"]
    monkeypatch.setattr(QFileDialog, "getSaveFileName", staticmethod(save_name))

    def in_the_preview():
        dialog = getattr(window, "report_preview", None)
        if dialog is None or not dialog.isVisible():
            QTimer.singleShot(100, in_the_preview)        # the preview is still being made
            return
        assert "Radar antenna after remount" in dialog.scope_box.currentText()
        assert "FAIL" in dialog.browser.toPlainText() and "Caution." in dialog.browser.toPlainText()
        qtbot.keyClicks(dialog.fields["Operator"], "A. Technician")
        qtbot.mouseClick(dialog.save_button, Qt.MouseButton.LeftButton)
    QTimer.singleShot(500, in_the_preview)
    file_menu = window.menuBar().actions()[0].menu()
    action = next(a for a in file_menu.actions() if a.text() == "Export &report…")
    action.trigger()
    assert out.is_file()
    data, printed = read_html_report(out.read_bytes(), "html")
    text = out.read_text()
    assert data["scope"] == "check" and "A. Technician" in text
    assert 'src="data:image/png;base64,' in text           # the Scene picture, drawn on Mesa under Xvfb
    assert Path(asked[0][0]).parent == Path(report_dialog.dialog_folder.start_folder()) or asked
    assert report_dialog.saved_kind() == "html"            # remembered for the next export
    assert "Report written to" in window.statusBar().currentMessage()
