"""File ▸ Export report…: the inspection record of the Check panel's check (or of the whole session) shown
in a preview, then saved as PDF or HTML. The record names the session file and its SHA-256, so it is made
from the file as saved: with unsaved changes the window offers to save first. The PDF-or-HTML choice is
remembered (QSettings), and the save dialog starts in the folder app/dialog_folder.py keeps."""

from __future__ import annotations

from pathlib import Path

from PySide6.QtCore import QUrl
from PySide6.QtGui import QImage, QTextDocument
from PySide6.QtWidgets import (QComboBox, QDialog, QDialogButtonBox, QFileDialog, QFormLayout, QLabel, QLineEdit,
                               QMessageBox, QTextBrowser, QVBoxLayout)

from app import dialog_folder, report_html, settings as app_settings
from app.report_writer import now_text, pictures_for, write_report
from core import inspection_record as records
from core.errors import FramewrightError
from core.session import load_session_and_bytes, name_problem

KIND_KEY = "report/kind"
FILTERS = {"pdf": "PDF document (*.pdf)", "html": "HTML file, self-contained (*.html)"}


def saved_kind(settings=None) -> str:
    value = (settings or app_settings.open_settings()).value(KIND_KEY)
    return value if value in FILTERS else "pdf"


class ReportPreview(QDialog):
    """The preview: what the record will say, the free fields to fill in, and Save…"""

    def __init__(self, window, session_path: str, check_name: str | None):
        super().__init__(window)
        self.setWindowTitle("Export report")
        self.resize(900, 760)
        self.window_ = window
        self.session, raw = load_session_and_bytes(session_path)
        self.session_name, self.digest = Path(session_path).name, records.sha256_of_bytes(raw)
        self.when = now_text()
        self.written = None
        self.scope_box = QComboBox()
        if check_name is not None:
            self.scope_box.addItem(f"the check “{check_name}”", check_name)
        self.scope_box.addItem("every mount and every check of the session", None)
        self.fields = {name: QLineEdit() for name in records.FREE_FIELDS if name != "Signature"}
        form = QFormLayout()
        form.addRow("Report of", self.scope_box)
        for name, field in self.fields.items():
            field.setPlaceholderText("blank: a line to fill in by hand")
            form.addRow(name, field)
        self.note = QLabel()
        self.note.setWordWrap(True)
        self.browser = QTextBrowser()
        self.browser.setOpenLinks(False)
        buttons = QDialogButtonBox()
        self.save_button = buttons.addButton("Save as PDF or HTML…", QDialogButtonBox.ButtonRole.AcceptRole)
        buttons.addButton(QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.save)
        buttons.rejected.connect(self.reject)
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(self.note)
        layout.addWidget(self.browser, 1)
        layout.addWidget(buttons)
        self.scope_box.currentIndexChanged.connect(self.render)
        for field in self.fields.values():
            field.editingFinished.connect(self.render)
        self.render()

    def record(self):
        check_name = self.scope_box.currentData()
        # the record in the window's display unit, as its panels show the figures (it names the unit)
        shown = records.ReportUnits(self.window_.model.preferences.angle_units)
        if check_name is None:
            return records.session_record(self.session, self.session_name, self.digest, shown)
        fit = self._point_fit(check_name)
        if fit is None:
            return records.check_record(self.session, check_name, self.session_name, self.digest, shown=shown)
        return records.check_record(self.session, check_name, self.session_name, self.digest, fit=fit.fit,
                                    fit_rows=[r + 1 for r in fit.rows], fit_unit=fit.unit,
                                    fit_source="the Measure tab's points", shown=shown)

    def _point_fit(self, check_name: str):
        """The Measure tab's last point fit when the check's measured mount is that fit (to the record's
        agreement limit), so its residual table belongs in the record; None otherwise."""
        from app.panels.measure_fit import POINTS

        page = self.window_.side_pages.pages.get("measure_panel")
        fit = page.panel().last_fit if page is not None and page.built else None    # never built: no fit
        if fit is None or fit.method != POINTS:
            return None
        try:
            _, saved = records.find_check(self.session, check_name)
        except FramewrightError:
            return None
        measured = next((m for m in self.session.mounts if m.name == saved.measured), None)
        if measured is None or fit.orientation.angle_to(measured.orientation) > records.FIT_AGREEMENT_DEG:
            return None
        return fit

    def free_values(self) -> dict:
        return {name: field.text().strip() for name, field in self.fields.items()
                if field.text().strip() and name_problem(field.text().strip()) is None}

    def render(self) -> None:
        try:
            record = self.record()
        except FramewrightError as error:
            self.browser.setPlainText(str(error))
            self.save_button.setEnabled(False)
            return
        self.save_button.setEnabled(True)
        pngs, missing, problem = pictures_for(record, self._live_camera(record))
        doc = QTextDocument(self.browser)
        pictures: dict = {("missing", i): why for i, why in missing.items()}
        for index, png in pngs.items():
            doc.addResource(QTextDocument.ResourceType.ImageResource, QUrl(f"picture-{index}.png"),
                            QImage.fromData(png, "PNG"))
            pictures[index] = f"picture-{index}.png"
        doc.setDefaultStyleSheet(report_html.STYLE)
        doc.setHtml(report_html.body_html(record, self.when, pictures, self.free_values()))
        self.browser.setDocument(doc)
        self.note.setText(f"Record SHA-256 {record.sha256()}."
                          + (f" The Scene picture is left out: {problem}." if problem else ""))

    def _live_camera(self, record):
        """The Scene's own camera when it shows the check as the record does (the measured mount selected,
        the nominal as the ghost): the picture is then taken from the viewpoint the technician chose."""
        model = self.window_.model
        nominal, measured = model.check_mount_indices()
        if record.scope == "check" and measured is not None and measured == model.selected_index \
                and nominal is not None and self.window_.scene.view.isValid():
            return self.window_.scene
        return None

    def save(self) -> None:
        try:
            record = self.record()
        except FramewrightError as error:
            self.note.setText(str(error))
            return
        settings = app_settings.open_settings()
        kind = saved_kind(settings)
        stem = Path(self.session_name).name.split(".")[0] or "report"
        start = str(Path(dialog_folder.start_folder()) / f"{stem}-report.{kind}")
        path, chosen = QFileDialog.getSaveFileName(self, "Export report", start,
                                                   ";;".join(FILTERS.values()), FILTERS[kind])
        if not path:
            return
        kind = next((k for k, f in FILTERS.items() if f == chosen), kind)
        if Path(path).suffix.lower() not in (".pdf", ".html", ".htm"):
            path += f".{kind}"
        dialog_folder.remember(path)
        settings.setValue(KIND_KEY, "html" if path.lower().endswith((".html", ".htm")) else "pdf")
        settings.sync()
        try:
            self.written = write_report(path, record, self.free_values(), self.when, self._live_camera(record))
        except OSError as error:
            self.note.setText(f"Not written: {path}: {error.strerror or error}. Nothing was changed.")
            return
        self.accept()


def export_report(window) -> str | None:
    """The menu action: save first when needed, preview, then write. Returns the path written (or None)."""
    from app import plain_text

    model = window.model
    if not model.file_path or not model.undo_stack.isClean():
        save = QMessageBox.StandardButton.Save
        answer = plain_text.question(window, "Export report",
                                     "The report names the session file and its SHA-256, so it is made from the "
                                     "file as saved. Save the session now?",
                                     save | QMessageBox.StandardButton.Cancel, save)
        if answer != save or not window.save_file():
            return None
    nominal, measured = model.check_mount_indices()
    saved_names = [c.name for c in model.session().checks]
    complete = nominal is not None and measured is not None and model.check.name in saved_names
    check_name = model.check.name if complete else None
    try:
        dialog = ReportPreview(window, model.file_path, check_name)
    except FramewrightError as error:
        window._tell("Export report", str(error))
        return None
    window.report_preview = dialog       # for the tests, which click in it
    dialog.exec()
    if dialog.written is None:
        return None
    written = dialog.written
    window.statusBar().showMessage(f"Report written to {written.path}"
                                   + (f" (the Scene picture is left out: {written.picture_problem})"
                                      if written.picture_problem else "") + ".")
    return written.path

