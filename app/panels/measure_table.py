"""One editable table of the Measure panel: input columns the user types or pastes, output columns the
panel fills after a fit (residual, flag). Ctrl+V pastes spreadsheet rows from the current cell on."""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QBrush, QColor, QGuiApplication, QKeySequence
from PySide6.QtWidgets import QAbstractItemView, QHeaderView, QTableWidget, QTableWidgetItem

from app.widgets.number_field import parse_number
from app.panels.measure_rows import Column, Rows, RowsError, rows_from_paste

BAD_CELL = QColor("#ffcdd2")
FLAGGED_ROW = QColor("#ffe0b2")


def two_line_title(title: str) -> str:
    """A column title on two lines at its last space ("Measured x" over "Measured" and "x"), so a column
    of short numbers is not widened by its title."""
    head, space, tail = title.rpartition(" ")
    return f"{head}\n{tail}" if space else title


class TableInputError(ValueError):
    """A cell that is not a number: 0-based table row and column, and a message naming both."""

    def __init__(self, message, row, column):
        super().__init__(message)
        self.row, self.column = row, column


class MeasureTable(QTableWidget):
    """Signals: ``inputs_edited()`` when the user changes an input cell (so a shown fit is stale);
    ``problem(str)`` when a paste is refused (the table is left as it was)."""

    inputs_edited = Signal()
    problem = Signal(str)

    def __init__(self, columns: list[Column], row_labels: list[str] | None = None, rows: int = 4, parent=None):
        super().__init__(0, len(columns), parent)
        self.columns = columns
        self.fixed_rows = row_labels is not None
        self.inputs = [i for i, c in enumerate(columns) if c.kind in ("input", "weight")]
        self.outputs = [i for i, c in enumerate(columns) if c.kind == "output"]
        self._filling = False
        for index, column in enumerate(columns):
            item = QTableWidgetItem(two_line_title(column.title))
            item.setToolTip(column.tooltip)
            self.setHorizontalHeaderItem(index, item)
        # Each column as wide as its title and its numbers, so neither is ever cut ("1249.7…" hides digits);
        # titles take two lines to stay narrow; the last column takes any spare width, and a table wider
        # than the panel scrolls inside itself.
        self.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.ResizeToContents)
        self.horizontalHeader().setStretchLastSection(True)
        self.horizontalHeader().setMinimumSectionSize(40)
        self.setTextElideMode(Qt.TextElideMode.ElideNone)
        self.verticalHeader().setDefaultSectionSize(self.fontMetrics().height() + 8)
        self.setSelectionMode(QAbstractItemView.SelectionMode.ExtendedSelection)
        self.setAlternatingRowColors(True)
        self.add_rows(len(row_labels) if self.fixed_rows else rows)
        if self.fixed_rows:
            self.setVerticalHeaderLabels(row_labels)
        self.cellChanged.connect(self._cell_changed)

    # ---- rows -------------------------------------------------------------------------------------
    def add_rows(self, count: int = 1) -> None:
        self._filling = True
        try:
            for _ in range(count):
                row = self.rowCount()
                self.insertRow(row)
                for column in range(self.columnCount()):
                    item = QTableWidgetItem("")
                    item.setTextAlignment(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
                    item.setToolTip(self.columns[column].tooltip)
                    if column in self.outputs:
                        item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
                    self.setItem(row, column, item)
        finally:
            self._filling = False

    def remove_selected_rows(self) -> None:
        if self.fixed_rows:
            return
        rows = sorted({index.row() for index in self.selectedIndexes()} or {self.currentRow()}, reverse=True)
        for row in rows:
            if 0 <= row < self.rowCount():
                self.removeRow(row)
        self.inputs_edited.emit()

    def clear_inputs(self) -> None:
        self._filling = True
        try:
            for row in range(self.rowCount()):
                for column in range(self.columnCount()):
                    self.item(row, column).setText("")
                    self.item(row, column).setBackground(QBrush())
        finally:
            self._filling = False
        self.inputs_edited.emit()

    def input_texts(self) -> list[list[str]]:
        """What the user typed, as text (to show that a refusal changed nothing)."""
        return [[self.item(r, c).text() for c in self.inputs] for r in range(self.rowCount())]

    # ---- filling ----------------------------------------------------------------------------------
    def fill(self, rows: Rows, start_row: int = 0, start_input: int = 0) -> None:
        """Put rows of numbers into the input columns from (start_row, start_input) on, adding rows as
        needed (a table with fixed rows refuses more rows than it has)."""
        needed = start_row + len(rows.values)
        if self.fixed_rows and needed > self.rowCount():
            raise RowsError(f"{len(rows.values)} rows pasted from row {start_row + 1}; this table has "
                            f"{self.rowCount()} rows")
        if needed > self.rowCount():
            self.add_rows(needed - self.rowCount())
        self._filling = True
        try:
            for offset, values in enumerate(rows.values):
                for k, value in enumerate(values):
                    item = self.item(start_row + offset, self.inputs[start_input + k])
                    if value is None:
                        item.setText("")
                    elif rows.texts is not None:
                        item.setText(rows.texts[offset][k])
                    else:
                        item.setText(repr(float(value)))
                    item.setBackground(QBrush())
        finally:
            self._filling = False
        self.inputs_edited.emit()

    def replace_all(self, rows: Rows) -> None:
        if not self.fixed_rows:
            self.setRowCount(0)
            self.add_rows(len(rows.values))
        elif len(rows.values) != self.rowCount():
            raise RowsError(f"the file has {len(rows.values)} rows; expected {self.rowCount()}")
        self.clear_outputs()
        self.fill(rows)

    def paste_text(self, text: str) -> Rows:
        """Paste spreadsheet text at the current cell (the first input column when outside them)."""
        row = max(self.currentRow(), 0)
        column = self.currentColumn()
        start = self.inputs.index(column) if column in self.inputs else 0
        rows = rows_from_paste(text, len(self.inputs) - start)
        self.fill(rows, row, start)
        return rows

    def keyPressEvent(self, event):
        if event.matches(QKeySequence.StandardKey.Paste):
            try:
                self.paste_text(QGuiApplication.clipboard().text())
            except RowsError as exc:
                self.problem.emit(f"Paste refused, the table is unchanged: {exc}")
            return
        if event.key() in (Qt.Key.Key_Delete, Qt.Key.Key_Backspace) and self.state() != self.State.EditingState:
            for index in self.selectedIndexes():
                if index.column() in self.inputs:
                    self.item(index.row(), index.column()).setText("")
            return
        super().keyPressEvent(event)

    # ---- reading ----------------------------------------------------------------------------------
    def values(self):
        """(numbers (N, inputs without weight), weights (N,) or None, table rows used). Blank rows are
        skipped; a blank weight is 1. Raises TableInputError naming the first bad cell (marked red)."""
        coordinates = [c for c in self.inputs if self.columns[c].kind == "input"]
        weight_column = next((c for c in self.inputs if self.columns[c].kind == "weight"), None)
        numbers, weights, used = [], [], []
        for row in range(self.rowCount()):
            texts = {c: self.item(row, c).text().strip() for c in self.inputs}
            if not any(texts.values()):
                continue
            values = []
            for c in coordinates + ([weight_column] if weight_column is not None else []):
                if c == weight_column and not texts[c]:
                    values.append(1.0)
                    continue
                try:
                    value = parse_number(texts[c])
                except ValueError as exc:
                    self.item(row, c).setBackground(BAD_CELL)
                    self.setCurrentCell(row, c)
                    raise TableInputError(f"row {self._row_name(row)}, {self.columns[c].title}: {exc}", row, c) from None
                if c == weight_column and value < 0:
                    self.item(row, c).setBackground(BAD_CELL)
                    raise TableInputError(f"row {self._row_name(row)}, {self.columns[c].title}: {value:g} is "
                                          f"negative; expected a weight of 0 or more", row, c)
                values.append(value)
            numbers.append(values[:len(coordinates)])
            weights.append(values[-1] if weight_column is not None else 1.0)
            used.append(row)
        array = np.array(numbers, dtype=float).reshape(-1, len(coordinates))
        return array, (np.array(weights) if weight_column is not None else None), used

    def _row_name(self, row: int) -> str:
        if self.fixed_rows:
            return f"“{self.verticalHeaderItem(row).text()}”"
        return str(row + 1)

    # ---- outputs ----------------------------------------------------------------------------------
    def show_outputs(self, rows: list[int], texts: list[list[str]], marked: set[int], tips: dict | None = None) -> None:
        """Write the output columns of the given table rows; rows in `marked` get a coloured background."""
        self.clear_outputs()
        self._filling = True
        try:
            for row, row_texts in zip(rows, texts):
                for column, text in zip(self.outputs, row_texts):
                    self.item(row, column).setText(text)
                    if tips and row in tips:
                        self.item(row, column).setToolTip(tips[row])
                if row in marked:
                    for column in range(self.columnCount()):
                        self.item(row, column).setBackground(FLAGGED_ROW)
        finally:
            self._filling = False

    def clear_outputs(self) -> None:
        self._filling = True
        try:
            for row in range(self.rowCount()):
                for column in range(self.columnCount()):
                    item = self.item(row, column)
                    if column in self.outputs:
                        item.setText("")
                        item.setToolTip(self.columns[column].tooltip)
                    item.setBackground(QBrush())
        finally:
            self._filling = False

    def output_texts(self) -> list[list[str]]:
        return [[self.item(r, c).text() for c in self.outputs] for r in range(self.rowCount())]

    def _cell_changed(self, row: int, column: int) -> None:
        if self._filling or column not in self.inputs:
            return
        self.item(row, column).setBackground(QBrush())
        self.inputs_edited.emit()
