"""Measure panel: turn what the bench measured into an orientation — a best fit of point pairs, the body
frame from three datum points (3-2-1), or two or more directions — and make it a Mount (undoable).

A made Mount is what the Check panel uses as its measured side. The last fit (points, fitted points,
residual vectors) goes out through ``fit_changed`` for a view that draws it; None when there is none.
"""

from __future__ import annotations

import math
from pathlib import Path

import numpy as np
from PySide6.QtCore import Signal
from PySide6.QtGui import QFontDatabase, QGuiApplication
from PySide6.QtWidgets import QHBoxLayout, QLabel, QPlainTextEdit, QStackedWidget, QVBoxLayout

from app import dialog_folder
from app.model import MOUNTS, PREFERENCES, SELECTION, SESSION, Change, SessionModel
from app.panels.base import Panel
from app.panels.measure_fit import (DIRECTIONS, POINTS, THREE_POINTS, MeasuredFit, fit_direction_rows,
                                    fit_point_rows, fit_three_points, result_lines, row_outputs)
from app.panels.measure_rows import RowsError, rows_from_csv
from app.panels.measure_table import MeasureTable, TableInputError
from app.widgets.with_tips import button, choice_box, length_choice, line_field
from core import operations
from core.errors import FramewrightError
from core.point_rows import DIRECTION_COLUMNS, POINT_COLUMNS, THREE_POINT_COLUMNS, THREE_POINT_ROWS

METHODS = [
    (POINTS, "Best fit from point pairs",
     "Nominal points in the body frame (from the drawing) and the same points measured in the reference "
     "frame. At least 3 pairs, not all on one line; 5 or more to flag a bad point."),
    (THREE_POINTS, "Three datum points (3-2-1)",
     "Three points measured in the reference frame: the body origin, a point on the body +X axis, and a "
     "point in the body XY plane on the +Y side."),
    (DIRECTIONS, "Two or more directions",
     "Directions known in the body frame and measured in the reference frame (gravity from a level, a "
     "boresight from a sight). Two: TRIAD, the first row matched exactly; more: least squares."),
]


class MeasurePanel(Panel):
    fit_changed = Signal(object)  # a MeasuredFit, or None when there is no valid fit
    watches = frozenset({MOUNTS, PREFERENCES})

    def __init__(self, model: SessionModel, parent=None):
        super().__init__(model, parent)
        self.last_fit: MeasuredFit | None = None
        self._fit_mount = None   # the name of the mount selected when the fit was made: the Scene shows it on that one only

        self.method = choice_box("How the orientation is found from the measurements.",
                                 [(label, key) for key, label, _ in METHODS])
        self.unit = length_choice("The length unit of every point (nominal and measured alike). It only labels "
                               "the residuals: the orientation does not depend on it.",
                               ("mm", "in", "thou", "m"))
        self.help = QLabel()
        self.help.setWordWrap(True)

        self.tables = {POINTS: MeasureTable(POINT_COLUMNS, rows=6),
                       THREE_POINTS: MeasureTable(THREE_POINT_COLUMNS, row_labels=THREE_POINT_ROWS),
                       DIRECTIONS: MeasureTable(DIRECTION_COLUMNS, rows=2)}
        self.stack = QStackedWidget()
        for table in self.tables.values():
            self.stack.addWidget(table)
            table.inputs_edited.connect(self._inputs_edited)
            table.problem.connect(self.problem)

        self.add_button = button("Add row", "Add an empty row at the end of the table.")
        self.remove_button = button("Remove rows", "Remove the selected rows.")
        self.paste_button = button("Paste rows", "Paste rows copied from a spreadsheet (tab-, comma- or "
                                                 "space-separated, one row per line) at the current cell; Ctrl+V in "
                                                 "the table does the same.")
        self.import_button = button("Import CSV…", "Replace the table with the rows of a CSV file whose first row "
                                                   "names the columns (hover the column titles for the names "
                                                   "accepted).")
        self.clear_button = button("Clear", "Empty every cell of this table.")
        self.fit_button = button("Fit", "Find the orientation from the rows of this table.")
        self.fit_button.setDefault(True)

        self.result_text = QPlainTextEdit()
        self.result_text.setReadOnly(True)
        self.result_text.setFont(QFontDatabase.systemFont(QFontDatabase.SystemFont.FixedFont))
        self.result_text.setToolTip("The fitted orientation (body → reference), its quality figures and "
                                    "notes. Angles in degrees.")
        self.result_text.setMinimumHeight(self.fontMetrics().height() * 15)
        self.mount_name = line_field("Name of the new mount (blank: the suggested name).")
        self.make_mount_button = button("Make mount", "Add the fitted orientation to the session as a new mount "
                                                      "(undoable). The Check panel can use it as the measured side.")
        self.make_mount_button.setEnabled(False)
        self.use_uncertainty_button = button(
            "Use its uncertainty in the check",
            "Set the check's standard uncertainty (Adjust tab, ISO 14253-1 decision) to the fit's: its "
            "covariance, from which each figure the check judges gets its own u, and the largest as the "
            "headline (one undo step).")
        self.use_uncertainty_button.setEnabled(False)

        layout = QVBoxLayout(self)
        top = QHBoxLayout()
        top.addWidget(QLabel("Method:"))
        top.addWidget(self.method, 1)
        top.addWidget(QLabel("Length unit:"))
        top.addWidget(self.unit)
        layout.addLayout(top)
        layout.addWidget(self.help)
        layout.addWidget(self.stack, 1)
        # Two short rows of buttons, Fit on the first, so it is in reach in a narrow side area.
        buttons, more = QHBoxLayout(), QHBoxLayout()
        for control in (self.add_button, self.remove_button, self.paste_button):
            buttons.addWidget(control)
        buttons.addStretch(1)
        buttons.addWidget(self.fit_button)
        for control in (self.import_button, self.clear_button):
            more.addWidget(control)
        more.addStretch(1)
        layout.addLayout(buttons)
        layout.addLayout(more)
        layout.addWidget(self.message)
        layout.addWidget(self.result_text, 1)
        bottom = QHBoxLayout()
        bottom.addWidget(QLabel("Mount name:"))
        bottom.addWidget(self.mount_name, 1)
        bottom.addWidget(self.make_mount_button)
        layout.addLayout(bottom)
        layout.addWidget(self.use_uncertainty_button)

        self.method.currentIndexChanged.connect(self._method_changed)
        self.unit.currentIndexChanged.connect(self._inputs_edited)
        self.add_button.clicked.connect(lambda: self.current_table().add_rows(1))
        self.remove_button.clicked.connect(lambda: self.current_table().remove_selected_rows())
        self.paste_button.clicked.connect(self.paste_rows)
        self.import_button.clicked.connect(lambda: self.import_csv())
        self.clear_button.clicked.connect(lambda: self.current_table().clear_inputs())
        self.fit_button.clicked.connect(self.fit)
        self.make_mount_button.clicked.connect(self.make_mount)
        self.use_uncertainty_button.clicked.connect(self.use_uncertainty)
        self._method_changed()
        self.render()

    # ---- reading the panel ------------------------------------------------------------------------
    def current_method(self) -> str:
        return self.method.currentData()

    def current_table(self) -> MeasureTable:
        return self.tables[self.current_method()]

    def set_method(self, method: str) -> None:
        self.method.setCurrentIndex(self.method.findData(method))

    # ---- actions ----------------------------------------------------------------------------------
    def paste_rows(self) -> None:
        table = self.current_table()
        try:
            rows = table.paste_text(QGuiApplication.clipboard().text())
        except RowsError as exc:
            self.problem(f"Paste refused, the table is unchanged: {exc}")
            return
        self.say(f"Pasted {len(rows.values)} row(s)." + "".join(f" {n}." for n in rows.notes[:3]))

    def import_csv(self, path: str | None = None) -> None:
        if path is None:
            path = dialog_folder.open_file_name(self, "Import rows", "CSV files (*.csv *.txt);;All files (*)")
            if not path:
                return
        table = self.current_table()
        try:
            text = Path(path).read_text(encoding="utf-8-sig")
            rows = rows_from_csv(text, [table.columns[c] for c in table.inputs])
            table.replace_all(rows)
        except (OSError, UnicodeDecodeError) as exc:
            self.problem(f"Cannot read {Path(path).name}: {exc}")
            return
        except RowsError as exc:
            self.problem(f"{Path(path).name} refused, the table is unchanged: {exc}")
            return
        self.say(f"Imported {len(rows.values)} row(s) from {Path(path).name}."
                 + "".join(f" {n}." for n in rows.notes))

    def fit(self) -> None:
        """Fit the current table; a refusal says why and leaves every typed cell as it was."""
        method, table, unit = self.current_method(), self.current_table(), self.unit.currentText()
        table.clear_outputs()
        try:
            values, weights, rows = table.values()
            if method == POINTS:
                result = fit_point_rows(values, weights, rows, unit)
            elif method == THREE_POINTS:
                if len(rows) != 3:
                    raise TableInputError(f"{3 - len(rows)} of the three datum points are blank; expected all "
                                          f"three", 0, 0)
                result = fit_three_points(values, rows, unit)
            else:
                result = fit_direction_rows(values, weights, rows)
        except (TableInputError, FramewrightError) as exc:
            self._refuse(f"Not fitted: {exc}.")
            return
        except (np.linalg.LinAlgError, ArithmeticError) as exc:   # the core turns these into refusals; if one
            self._refuse(f"Not fitted: the arithmetic failed ({exc}); check the numbers.")   # slips, say so
            return
        self.last_fit = result
        texts, marked = row_outputs(result)
        table.show_outputs(list(result.rows), texts, marked)
        self._render_result()
        flagged = len(result.flagged)
        self.say("Fitted." + (f" {flagged} row(s) flagged: look at them again." if flagged else ""))
        self.make_mount_button.setEnabled(True)
        self.use_uncertainty_button.setEnabled(result.uncertainty_deg is not None)
        self._fit_mount = self.model.current_mount().name
        self.fit_changed.emit(result)

    def use_uncertainty(self) -> None:
        """The fit's largest standard uncertainty becomes the check's (it is the measured side's)."""
        from dataclasses import replace
        fit = self.last_fit
        if fit is None or fit.uncertainty_deg is None:
            return
        check = self.model.check
        _, measured = self.model.check_mount_indices()
        if measured is None:
            self.problem("Choose the check's measured mount in the Check panel first; the uncertainty "
                         "belongs to it.")
            return
        try:
            # with the covariance, so each figure the check judges gets its own u; the largest is the headline
            covariance = None if fit.covariance_rad2 is None else (fit.covariance_rad2 * (180 / math.pi) ** 2).tolist()
            adjustment = replace(check.adjustment, uncertainty_deg=float(fit.uncertainty_deg),
                                 covariance_deg2=covariance)
        except FramewrightError as error:
            self.problem(f"{error} (the check is unchanged)")
            return
        self.model.apply(operations.set_check, replace(check, adjustment=adjustment), origin=self,
                         text="Measure: the check's uncertainty from the fit")
        self.say(f"The check's standard uncertainty is now {fit.uncertainty_deg:.4g}°, the fit's largest (each "
                 "figure is judged by its own, from the fit's covariance); "
                 f"it applies to the measured mount “{self.model.mounts[measured].name}” (Undo takes it back).")

    def make_mount(self) -> None:
        if self.last_fit is None:
            return
        name = self.mount_name.text().strip() or self.mount_name.placeholderText()
        self.model.add_mount(self.model.unused_name(name), self.last_fit.orientation, origin=self)
        self.say(f"Mount “{self.model.mounts[-1].name}” made from the fit (Undo takes it back).")
        self.mount_name.clear()

    # ---- rendering --------------------------------------------------------------------------------
    def _render_result(self) -> None:
        if self.last_fit is None:
            self.result_text.setPlainText("")
            return
        prefs = self.model.preferences
        self.result_text.setPlainText("\n".join(result_lines(self.last_fit, prefs.significant_digits,
                                                             prefs.sequence, prefs.intrinsic)))

    def _refuse(self, text: str) -> None:
        self._forget_fit()
        self.problem(text)

    def _forget_fit(self) -> None:
        had_fit = self.last_fit is not None
        self.last_fit = None
        self.result_text.setPlainText("")
        self.make_mount_button.setEnabled(False)
        self.use_uncertainty_button.setEnabled(False)
        if had_fit:
            self.fit_changed.emit(None)

    def _inputs_edited(self, *_):
        if self.last_fit is not None:
            self.current_table().clear_outputs()
            self._forget_fit()
            self.say("The rows changed since the last fit: press Fit again.")

    def _method_changed(self, *_):
        key = self.current_method()
        self.stack.setCurrentWidget(self.tables[key])
        self.help.setText(next(h for k, _, h in METHODS if k == key))
        fixed = self.tables[key].fixed_rows
        self.add_button.setEnabled(not fixed)
        self.remove_button.setEnabled(not fixed)
        self.unit.setEnabled(key != DIRECTIONS)
        for table in self.tables.values():
            table.clear_outputs()
        self._forget_fit()
        self.say("")

    def _suggest_name(self) -> None:
        self.mount_name.setPlaceholderText(self.model.unused_name("Measured"))

    def render(self) -> None:
        self._suggest_name()
        self._render_result()

    def follow(self, change: Change) -> None:
        if change.touches(SESSION):
            self._forget_fit()      # the points were measured on a mount of the last session, not this one
        if change.touches(SELECTION) and self.last_fit is not None:
            # the measured points belong to the mount they were fitted on: hidden on any other, back on it
            on_its_mount = self.model.current_mount().name == self._fit_mount
            self.fit_changed.emit(self.last_fit if on_its_mount else None)

