"""Batch panel: a CSV of many mounts (nominal and measured) becomes a sortable table of deviations with the
out-of-tolerance rows flagged, exportable as CSV. The reading and the arithmetic are core/batch.py's.

A refused file leaves everything as it was (the table, the file name, the export) and says which line,
row and column is at fault. Files of more than LARGE_FILE_ROWS rows show a progress dialog with Cancel.
"""

from __future__ import annotations

import os
from pathlib import Path

import numpy as np

from PySide6.QtCore import Qt, QTimer, Signal
from PySide6.QtWidgets import (QAbstractItemView, QApplication, QCheckBox, QHBoxLayout,
                               QHeaderView, QLabel, QProgressDialog, QTableView, QVBoxLayout)

from app import dialog_folder, plain_text
from app.panels.base import Panel
from app.text import significant
from app.widgets.number_field import NumberField
from app.panels.batch_conventions_dialog import BatchConventionsDialog
from app.panels.batch_table_model import BatchFilterProxy, BatchResultModel
from app.widgets.with_tips import button
from core.atomic_file import write_atomically
from core.batch import (BatchCancelledError, BatchFileError, SetConventions, compute_deviations, read_mounts,
                        write_results)
from core.check import CheckSettings
from core.errors import FramewrightError

LARGE_FILE_ROWS = 5000
_STAGES = {"reading": (0, 40), "computing": (40, 100), "writing": (0, 100)}


class BatchPanel(Panel):
    """The batch changes no mount and follows no change of the session: it watches nothing."""
    results_changed = Signal(object)  # the BatchResult shown, or None

    def __init__(self, model=None, parent=None):
        super().__init__(model, parent)
        self.table = None          # core.batch.MountTable of the file shown
        self.result = None         # core.batch.BatchResult shown
        self.file_path: str | None = None
        self.pending_text: str | None = None   # the last file read (refused or not), re-read on new conventions
        self.pending_path: str | None = None
        self.nominal_conventions = SetConventions()
        self.measured_conventions = SetConventions()
        self.tolerance_deg = CheckSettings().total_tolerance_deg
        self.progress_dialog: QProgressDialog | None = None

        self.open_button = button("Open CSV…", "Read a CSV of mounts: a header row, then one mount per row (name, "
                                               "nominal columns, measured columns).")
        self.conventions_button = button("Conventions…", "Angle unit, sequence, intrinsic/extrinsic and matrix "
                                                         "meaning for files whose header does not state them.")
        self.tolerance = NumberField("Tolerance on the total deviation, in degrees (0 or more). '.' is the "
                                     "decimal point.", step=0.1)
        self.tolerance.set_text(significant(self.tolerance_deg, 6))
        self.tolerance.fit_digits(5)
        self.only_failed = QCheckBox("Show only out of tolerance")
        self.only_failed.setToolTip("Hide the rows within the tolerance.")
        self.export_button = button("Export results…", "Write every row's deviation, result and margin as CSV "
                                                       "(degrees, axis in the nominal body frame), in the file's row "
                                                       "order.")
        self.export_button.setEnabled(False)
        self.file_label = QLabel("No file open.")
        self.file_label.setWordWrap(True)  # a long file name and its conventions wrap in a narrow side area
        self.summary = QLabel("")
        self.summary.setWordWrap(True)
        plain_text.plain(self.file_label, self.summary)   # names and cells are the file's text

        self.results = BatchResultModel(self)
        self.proxy = BatchFilterProxy(self)
        self.proxy.setSourceModel(self.results)
        self.view = QTableView()
        self.view.setModel(self.proxy)
        self.view.setSortingEnabled(True)
        self.view.horizontalHeader().setSortIndicatorShown(True)
        self.view.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Interactive)
        self.view.horizontalHeader().setStretchLastSection(False)
        self.view.verticalHeader().setDefaultSectionSize(self.fontMetrics().height() + 6)
        self.view.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.view.setToolTip("One row per mount; out-of-tolerance rows are flagged. Click a column title "
                             "to sort.")

        layout = QVBoxLayout(self)
        # Two short rows rather than one long one, so Export stays in reach in a narrow side area.
        top = QHBoxLayout()
        top.addWidget(self.open_button)
        top.addWidget(self.conventions_button)
        top.addStretch(1)
        top.addWidget(self.export_button)
        layout.addLayout(top)
        second = QHBoxLayout()
        second.addWidget(QLabel("Tolerance (°):"))
        second.addWidget(self.tolerance)
        second.addSpacing(12)
        second.addWidget(self.only_failed)
        second.addStretch(1)
        layout.addLayout(second)
        layout.addWidget(self.file_label)
        layout.addWidget(self.summary)
        layout.addWidget(self.message)
        layout.addWidget(self.view, 1)

        self._recompute_timer = QTimer(self)
        self._recompute_timer.setSingleShot(True)
        self._recompute_timer.setInterval(300)
        self._recompute_timer.timeout.connect(self._tolerance_settled)
        self.open_button.clicked.connect(lambda: self.open_file())
        self.conventions_button.clicked.connect(self.choose_conventions)
        self.export_button.clicked.connect(lambda: self.export_results())
        self.only_failed.toggled.connect(self.proxy.set_only_failed)
        self.tolerance.edited.connect(lambda _: self._recompute_timer.start())
        self.tolerance.committed.connect(self._tolerance_settled)
        self.tolerance.stepped.connect(self._tolerance_stepped)

    # ---- settings ---------------------------------------------------------------------------------
    def settings(self) -> CheckSettings:
        return CheckSettings(total_tolerance_deg=self.tolerance_deg)

    def set_conventions(self, nominal: SetConventions, measured: SetConventions) -> None:
        """Conventions for sets the header leaves open; re-reads the last file with them."""
        self.nominal_conventions, self.measured_conventions = nominal, measured
        if self.pending_text is not None:
            self._load(self.pending_text, self.pending_path)

    def choose_conventions(self) -> None:
        dialog = BatchConventionsDialog(self.nominal_conventions, self.measured_conventions, self)
        if dialog.exec() == BatchConventionsDialog.DialogCode.Accepted:
            self.set_conventions(*dialog.conventions())

    def _tolerance_stepped(self, value: float) -> None:
        self.tolerance.set_text(significant(max(value, 0.0), 6))
        self._tolerance_settled()

    def _tolerance_settled(self) -> None:
        self._recompute_timer.stop()
        try:
            value = self.tolerance.value()
            CheckSettings(total_tolerance_deg=value)  # validates (finite, 0 or more)
        except (ValueError, FramewrightError) as exc:
            self.tolerance.set_problem(f"{exc}; the tolerance stays {significant(self.tolerance_deg, 6)}°")
            return
        self.tolerance.set_problem(None)
        if value == self.tolerance_deg:
            return
        self.tolerance_deg = value
        if self.table is not None:
            self._show(compute_deviations(self.table, self.settings()))

    # ---- files ------------------------------------------------------------------------------------
    def open_file(self, path: str | None = None) -> bool:
        if path is None:
            path = dialog_folder.open_file_name(self, "Open a CSV of mounts", "CSV files (*.csv *.txt);;All files (*)")
            if not path:
                return False
        try:
            text = Path(path).read_text(encoding="utf-8-sig")
        except (OSError, UnicodeDecodeError) as exc:
            self.problem(f"Cannot read {Path(path).name}: {exc}. Nothing changed.")
            return False
        return self._load(text, path)

    def load_text(self, text: str, name: str = "pasted text") -> bool:
        return self._load(text, name)

    def _load(self, text: str, path: str) -> bool:
        self.pending_text, self.pending_path = text, path
        name = Path(path).name
        large = text.count("\n") > LARGE_FILE_ROWS
        try:
            progress = self._start_progress(f"Reading {name}…") if large else None
            try:
                table = read_mounts(text, self.nominal_conventions, self.measured_conventions, progress)
                result = compute_deviations(table, self.settings(), progress)
            finally:
                self._end_progress()
        except BatchCancelledError:
            self.problem(f"Reading “{name}” was cancelled. Nothing changed.")
            return False
        except BatchFileError as exc:
            where = ", ".join(part for part in (f"row {exc.row}" if exc.row else "",
                                                f"column {exc.column}" if exc.column else "") if part)
            hint = (" Choose them with Conventions… (the file is read again)."
                    if "need a sequence" in str(exc) else "")
            self.problem(f"“{name}” refused{' at ' + where if where else ''}. Nothing changed.\n{exc}{hint}")
            return False
        except FramewrightError as exc:
            self.problem(f"“{name}” refused. Nothing changed.\n{exc}")
            return False
        self.table, self.file_path = table, path
        self.file_label.setText(f"{name}: {len(table.names)} mounts. "
                                + "; ".join(s.describe() for s in table.sets))
        self.file_label.setToolTip(plain_text.plain_tip(str(path)))
        self.say("; ".join(table.notes))
        self._show(result)
        return True

    def export_results(self, path: str | None = None) -> bool:
        if self.result is None:
            return False
        if path is None:
            suggested = str(Path(self.file_path).with_name(Path(self.file_path).stem + "-deviations.csv")) \
                if self.file_path and os.sep in str(self.file_path) else "deviations.csv"
            path = dialog_folder.save_file_name(self, "Export results", suggested, "CSV files (*.csv)")
            if not path:
                return False
        large = len(self.result.names) > LARGE_FILE_ROWS
        try:
            progress = self._start_progress("Writing results…") if large else None
            try:
                text = write_results(self.result, progress=progress)
            finally:
                self._end_progress()
            write_atomically(path, text.encode("utf-8"))
        except BatchCancelledError:
            self.problem("Export cancelled; no file was written.")
            return False
        except OSError as exc:
            self.problem(f"Cannot write {Path(path).name}: {exc}")
            return False
        self.say(f"Exported {len(self.result.names)} rows to {Path(path).name}.")
        return True

    # ---- showing ----------------------------------------------------------------------------------
    def _show(self, result) -> None:
        self.result = result
        self.results.set_result(result)
        self.export_button.setEnabled(True)
        failed, errors = result.failed_count, result.error_count
        judged = ~result.error_mask()
        text = (f"{len(result.names)} mounts checked against {significant(self.tolerance_deg, 6)}°: "
                f"{result.passed_count} within, {failed} out of tolerance, {errors} in error (not checked).")
        if judged.any():
            worst = int(np.flatnonzero(judged)[np.argmax(result.total_deg[judged])])
            text += (f" Largest deviation {result.total_deg[worst]:.4f}° ({result.names[worst]}, "
                     f"row {worst + 1}).")
        if errors:
            text += f" First error: {result.problems[0].message}"
        plain_text.say(self.summary, text, problem=bool(errors))
        self.view.resizeColumnsToContents()
        header = self.view.horizontalHeader()
        for column in range(header.count()):   # room for the sort arrow beside each title
            header.resizeSection(column, max(header.sectionSize(column), header.sectionSizeHint(column) + 16))
        self.results_changed.emit(result)

    def _start_progress(self, title: str):
        dialog = QProgressDialog(title, "Cancel", 0, 100, self)
        dialog.setWindowTitle("Batch")
        dialog.setWindowModality(Qt.WindowModality.WindowModal)
        dialog.setMinimumDuration(0)
        dialog.setAutoClose(False)
        dialog.setAutoReset(False)
        dialog.setValue(0)
        self.progress_dialog = dialog
        QApplication.processEvents()

        def progress(done, total, stage):
            low, high = _STAGES.get(stage, (0, 100))
            dialog.setLabelText(f"{title} {stage} {done:,} of {total:,}" if total > 1 else f"{title} {stage}")
            dialog.setValue(int(low + (high - low) * done / max(total, 1)))
            QApplication.processEvents()
            return not dialog.wasCanceled()
        return progress

    def _end_progress(self) -> None:
        if self.progress_dialog is not None:
            self.progress_dialog.close()
            self.progress_dialog.deleteLater()
            self.progress_dialog = None
