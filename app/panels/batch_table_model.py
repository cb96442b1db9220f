"""The Batch results as a Qt table model over the result arrays (nothing is copied into cells, so
100,000 rows cost only the rows on screen), and a proxy that filters out-of-tolerance rows and hands
sorting to numpy.

Why the proxy does not sort itself: QSortFilterProxyModel compares rows through data() calls into
Python, about two million of them for 100,000 rows; an argsort of the column's array does the same job
in milliseconds and the proxy keeps filtering and the header's sort indicator as usual.
"""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import QAbstractTableModel, QModelIndex, QSortFilterProxyModel, Qt
from PySide6.QtGui import QBrush, QColor, QFont

from app import plain_text
from core.batch import BatchResult

FAILED_ROW = QBrush(QColor("#ffcdd2"))
ERROR_ROW = QBrush(QColor("#ffe0b2"))
_BOLD = QFont()
_BOLD.setBold(True)
_RIGHT = int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter)
_CENTRE = int(Qt.AlignmentFlag.AlignCenter)


def columns_for(result: BatchResult):
    """(title, tooltip, key) per column; key names the array or 'name' / 'result'. The verdict and the
    numbers it rests on come first, the axis of the deviation last: in a laptop's side area the name, the
    result and the deviation are in view without scrolling the table sideways."""
    columns = [("Name", "The mount's name, from the file's first column.", "name"),
               ("Result", "pass: within the tolerance; fail: out of tolerance; error: the row's numbers "
                "cannot be trusted and it was not checked (the tooltip says why).", "result"),
               ("Deviation (°)", "Total deviation: the angle of D = Nᵀ M, nominal N against measured M, "
                "in degrees.", "total"),
               ("Margin (°)", "Tolerance minus the deviation, in degrees (the smallest of the criteria); "
                "negative when out of tolerance.", "margin")]
    if result.pointing_deg is not None:
        axis = result.settings.body_axis
        columns += [("Pointing (°)", f"Pointing error of the body axis {axis}: the angle between N a and M a, "
                     "in degrees.", "pointing"),
                    ("Roll (°)", f"Roll about the body axis {axis} left after the pointing correction, in "
                     "degrees.", "roll")]
    columns += [("Axis x", "Axis of the deviation D, in the nominal body frame (unit vector), x.", "axis_x"),
                ("Axis y", "Axis of the deviation D, in the nominal body frame (unit vector), y.", "axis_y"),
                ("Axis z", "Axis of the deviation D, in the nominal body frame (unit vector), z.", "axis_z")]
    return columns


class BatchResultModel(QAbstractTableModel):
    DECIMALS = 4

    def __init__(self, parent=None):
        super().__init__(parent)
        self.result: BatchResult | None = None
        self._columns = []
        self._arrays = {}
        self._order = np.zeros(0, dtype=np.intp)    # view row -> row of the file (0-based)
        self._passed: list[bool] = []
        self._problems: dict[int, str] = {}
        self._sorted_by: tuple[int, Qt.SortOrder] | None = None

    # ---- contents ---------------------------------------------------------------------------------
    def set_result(self, result: BatchResult | None) -> None:
        self.beginResetModel()
        self.result = result
        if result is None:
            self._columns, self._arrays, self._passed, self._problems = [], {}, [], {}
            self._order = np.zeros(0, dtype=np.intp)
        else:
            self._columns = columns_for(result)
            self._arrays = {"total": result.total_deg, "axis_x": result.axis[:, 0], "axis_y": result.axis[:, 1],
                            "axis_z": result.axis[:, 2], "margin": result.margin_deg,
                            "pointing": result.pointing_deg, "roll": result.roll_deg}
            self._passed = result.passed.tolist()
            self._names = list(result.names)
            self._problems = result.problem_texts()
            self._order = np.arange(len(result.names))
        self.endResetModel()
        if result is not None and self._sorted_by is not None:
            column, order = self._sorted_by
            if column < len(self._columns):
                self.sort(column, order)

    def file_row(self, row: int) -> int:
        """The 0-based data row of the file shown at this model row."""
        return int(self._order[row])

    def passed_at(self, row: int) -> bool:
        return self._passed[int(self._order[row])]

    def column_key(self, column: int) -> str:
        return self._columns[column][2]

    # ---- QAbstractTableModel ----------------------------------------------------------------------
    def rowCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else len(self._order)

    def columnCount(self, parent=QModelIndex()):
        return 0 if parent.isValid() else len(self._columns)

    def data(self, index, role=Qt.ItemDataRole.DisplayRole):
        if not index.isValid():
            return None
        row = int(self._order[index.row()])
        key = self._columns[index.column()][2]
        if role == Qt.ItemDataRole.DisplayRole:
            if key == "name":
                return self._names[row]
            if key == "result":
                return "error" if row in self._problems else ("pass" if self._passed[row] else "fail")
            if row in self._problems:
                return ""
            value = float(self._arrays[key][row]) + 0.0
            text = f"{value:.{self.DECIMALS}f}"
            return "0." + "0" * self.DECIMALS if text == "-0." + "0" * self.DECIMALS else text
        if role == Qt.ItemDataRole.BackgroundRole:
            return ERROR_ROW if row in self._problems else (None if self._passed[row] else FAILED_ROW)
        if role == Qt.ItemDataRole.FontRole:
            return _BOLD if key == "result" and not self._passed[row] else None
        if role == Qt.ItemDataRole.TextAlignmentRole:
            return None if key == "name" else (_CENTRE if key == "result" else _RIGHT)
        if role == Qt.ItemDataRole.ToolTipRole:
            if row in self._problems:   # the file's text, shown as it is (escaped, never markup)
                return plain_text.plain_tip(self._problems[row])
            if key == "name":
                return plain_text.plain_tip(self._names[row])
            return self._columns[index.column()][1]
        return None

    def headerData(self, section, orientation, role=Qt.ItemDataRole.DisplayRole):
        if orientation == Qt.Orientation.Horizontal:
            if not 0 <= section < len(self._columns):
                return None
            if role == Qt.ItemDataRole.DisplayRole:
                return self._columns[section][0]
            if role == Qt.ItemDataRole.ToolTipRole:
                return self._columns[section][1]
            return None
        if role == Qt.ItemDataRole.DisplayRole and 0 <= section < len(self._order):
            return str(int(self._order[section]) + 1)   # the row of the file, as refusals name it
        if role == Qt.ItemDataRole.ToolTipRole:
            return "Row of the file (data rows, the header not counted)."
        return None

    def sort(self, column, order=Qt.SortOrder.AscendingOrder):
        """Sort by a column with numpy (stable); names compare as text, results fail before pass."""
        if self.result is None or not 0 <= column < len(self._columns):
            return
        self._sorted_by = (column, order)
        key = self._columns[column][2]
        if key == "name":
            values = np.asarray(self._names, dtype=str)
        elif key == "result":   # error, then fail, then pass
            values = self.result.passed.astype(np.int8) - self.result.error_mask().astype(np.int8)
        else:
            values = self._arrays[key]
        descending = order == Qt.SortOrder.DescendingOrder
        if key == "name":
            new_order = np.argsort(values, kind="stable")
            new_order = new_order[::-1] if descending else new_order
        else:
            new_order = np.argsort(-values if descending else values, kind="stable")
        self.layoutAboutToBeChanged.emit()
        old = self.persistentIndexList()
        position = np.empty_like(new_order)
        position[new_order] = np.arange(len(new_order))
        self.changePersistentIndexList(old, [self.index(int(position[self._order[i.row()]]), i.column())
                                             for i in old])
        self._order = new_order
        self.layoutChanged.emit()


class BatchFilterProxy(QSortFilterProxyModel):
    """Shows every row, or only the out-of-tolerance ones; sorting goes to the source's numpy sort."""

    def __init__(self, parent=None):
        super().__init__(parent)
        self.only_failed = False

    def set_only_failed(self, on: bool) -> None:
        if on != self.only_failed:
            self.beginFilterChange()   # Qt 6.10: begin/endFilterChange replace invalidate*Filter
            self.only_failed = on
            self.endFilterChange(QSortFilterProxyModel.Direction.Rows)

    def filterAcceptsRow(self, source_row, source_parent):
        return not self.only_failed or not self.sourceModel().passed_at(source_row)

    def sort(self, column, order=Qt.SortOrder.AscendingOrder):
        self.sourceModel().sort(column, order)
