"""Matrix editor: the 3x3 rotation matrix, body → reference (columns are the body axes) or its transpose
(reference → body, rows are the body axes), with the orthogonality error and determinant of the numbers as
typed. Pasting nine numbers into any cell fills the whole grid through the decoder."""

from __future__ import annotations

import numpy as np
from PySide6.QtCore import QEvent, QObject
from PySide6.QtGui import QGuiApplication, QKeySequence
from PySide6.QtWidgets import QButtonGroup, QGridLayout, QHBoxLayout, QLabel, QRadioButton

from app.editors.base import EditorBase
from app.widgets.number_field import NumberField
from app.editors.pasted_numbers import numbers_in_text
from core.errors import FramewrightError, MatrixRefusedError
from core.nearest import orthogonality_report
from core.orientation import Orientation
from core.representations import MATRIX

MEANINGS = {
    "body_to_reference": "body → reference (columns are the body axes)",
    "reference_to_body": "reference → body (rows are the body axes)",
}


def _cell_tip(row: int, col: int, meaning: str) -> str:
    if meaning == "body_to_reference":
        return (f"Row {row + 1}, column {col + 1} of R, body → reference (v_ref = R · v_body): "
                f"component {'xyz'[row]} of body axis {'XYZ'[col]} in reference coordinates. "
                "Paste nine numbers here to fill the grid.")
    return (f"Row {row + 1}, column {col + 1} of Rᵀ, reference → body (v_body = Rᵀ · v_ref): "
            f"component {'xyz'[col]} of body axis {'XYZ'[row]} in reference coordinates. "
            "Paste nine numbers here to fill the grid.")


class _PasteCatcher(QObject):
    """Turns Ctrl+V of several numbers in one cell into a paste of the whole grid."""

    def __init__(self, editor: "MatrixEditor"):
        super().__init__(editor)
        self._editor = editor

    def eventFilter(self, watched, event):
        if event.type() == QEvent.Type.KeyPress and event.matches(QKeySequence.StandardKey.Paste):
            text = QGuiApplication.clipboard().text()
            if self._editor.paste_grid(text):
                return True
        if event.type() == QEvent.Type.ContextMenu:
            menu = self.context_menu(watched)
            menu.exec(event.globalPos())
            menu.deleteLater()
            return True
        return False

    def context_menu(self, line_edit):
        """The cell's usual right-click menu, whose Paste fills the whole grid when the clipboard holds
        nine numbers (and pastes into the cell otherwise), as Ctrl+V does."""
        menu = line_edit.createStandardContextMenu()
        for action in menu.actions():
            if action.objectName() == "edit-paste":
                action.triggered.disconnect()
                action.triggered.connect(
                    lambda: self._editor.paste_grid(QGuiApplication.clipboard().text()) or line_edit.paste())
        return menu


class MatrixEditor(EditorBase):
    representation = MATRIX

    def __init__(self, model, parent=None):
        super().__init__(model, "Matrix", parent)
        self.cells = [[NumberField("", steppable=False) for _ in range(3)] for _ in range(3)]
        self.meaning_buttons = {key: QRadioButton(text) for key, text in MEANINGS.items()}
        self._meaning_group = QButtonGroup(self)
        for button in self.meaning_buttons.values():
            self._meaning_group.addButton(button)
        self.meaning_buttons["body_to_reference"].setToolTip(
            "The nine numbers are R with v_ref = R · v_body: each column is a body axis in reference coordinates.")
        self.meaning_buttons["reference_to_body"].setToolTip(
            "The nine numbers are the transpose (a direction cosine matrix reference → body): each row is a "
            "body axis in reference coordinates.")
        self.error_label = QLabel()
        self.error_label.setToolTip("Orthogonality error max |MᵀM − I| of the numbers as typed "
                                    "(at most 1e-9 is exact; up to 5e-3 corrected with a notice; up to 5e-2 "
                                    "a strong warning; beyond that refused).")
        self.det_label = QLabel()
        self.det_label.setToolTip("Determinant of the numbers as typed: +1 for a rotation; negative means a "
                                  "reflection, which is refused.")
        self.note = self.note_label(lines=2)

        grid = QGridLayout(self)
        for c, name in enumerate("XYZ"):
            grid.addWidget(QLabel(""), 0, c + 1)
        self.column_labels = [QLabel() for _ in range(3)]
        self.row_labels = [QLabel() for _ in range(3)]
        for i in range(3):
            grid.addWidget(self.column_labels[i], 0, i + 1)
            grid.addWidget(self.row_labels[i], i + 1, 0)
        self.connect_fields(self.flat_cells())
        catcher = self.paste_catcher = _PasteCatcher(self)
        for r in range(3):
            for c in range(3):
                cell = self.cells[r][c]
                grid.addWidget(cell, r + 1, c + 1)
                cell.lineEdit().installEventFilter(catcher)
        readouts = QHBoxLayout()
        readouts.addWidget(self.error_label)
        readouts.addWidget(self.det_label)
        readouts.addStretch(1)
        grid.addLayout(readouts, 4, 0, 1, 4)
        grid.addWidget(self.meaning_buttons["body_to_reference"], 5, 0, 1, 4)
        grid.addWidget(self.meaning_buttons["reference_to_body"], 6, 0, 1, 4)
        grid.addWidget(self.note, 7, 0, 1, 4)
        grid.setRowStretch(8, 1)
        for key, button in self.meaning_buttons.items():
            button.clicked.connect(lambda _=False, k=key: self.model.set_preferences(origin=self, matrix_meaning=k))
        self.render()

    @property
    def transposed(self) -> bool:
        return self.model.preferences.matrix_meaning == "reference_to_body"

    def flat_cells(self) -> list[NumberField]:
        return [cell for row in self.cells for cell in row]

    def render_setup(self) -> None:
        meaning = self.model.preferences.matrix_meaning
        self.meaning_buttons[meaning].setChecked(True)
        for i in range(3):
            if self.transposed:
                self.column_labels[i].setText(f"ref {'xyz'[i]}")
                self.row_labels[i].setText(f"body {'XYZ'[i]}")
            else:
                self.column_labels[i].setText(f"body {'XYZ'[i]}")
                self.row_labels[i].setText(f"ref {'xyz'[i]}")
        for r in range(3):
            for c in range(3):
                self.cells[r][c].set_convention_tooltip(_cell_tip(r, c, meaning))

    def render_values(self) -> None:
        m = self.model.current_orientation().as_matrix(transposed=self.transposed)
        for r in range(3):
            for c in range(3):
                self.cells[r][c].set_text(self.fmt(m[r, c]))
        self._show_readouts(m)
        self.note.setText("")

    def _show_readouts(self, m) -> None:
        report = orthogonality_report(np.asarray(m, dtype=float))
        # Numbers near 1e154 and beyond overflow the products: say "too large" rather than show nan or inf.
        error = f"{report.error:.2g}" if np.isfinite(report.error) else "– (numbers too large)"
        det = self.fmt(report.det) if np.isfinite(report.det) else "– (numbers too large)"
        self.error_label.setText(f"Orthogonality error {error}")
        self.det_label.setText(f"Determinant {det}")
        return report

    def read_orientation(self) -> Orientation | None:
        values = self.read_fields(self.flat_cells())
        if values is None:
            self.error_label.setText("Orthogonality error –")
            self.det_label.setText("Determinant –")
            return None
        m = np.array(values, dtype=float).reshape(3, 3)
        report = self._show_readouts(m)
        try:
            o = Orientation.from_matrix(m, transposed=self.transposed)
        except MatrixRefusedError as exc:
            for cell in self.flat_cells():
                cell.set_problem(str(exc))
            self.note.setText(str(exc))
            return None
        except FramewrightError as exc:
            for cell in self.flat_cells():
                cell.set_problem(str(exc))
            self.note.setText(str(exc))
            return None
        self.note.setText("" if report.band == "exact" else report.message)
        return o

    def _on_committed(self) -> None:
        if not self._editing:  # Enter in a spin box reports itself twice
            return
        if self.read_orientation() is not None:
            note = self.note.text()
            self.finish_editing()
            if note:
                self.note.setText(f"Used the nearest rotation: {note}")

    def paste_grid(self, text: str) -> bool:
        """Fill all nine cells from pasted text with nine numbers, as printed (rows in order). Several
        numbers that are not nine (a 2 × 2 matrix, a quaternion) are refused with a note and change
        nothing: no other count is ever read as a 3 × 3 matrix. Returns False when the text is not
        numbers, or one or two (a decimal comma, "1,5", reads as two: the cell then says what is wrong
        with it), so the cell gets an ordinary paste."""
        numbers = numbers_in_text(text)
        if numbers is None or len(numbers) <= 2:
            return False
        if len(numbers) != 9:
            square = int(round(len(numbers) ** 0.5))
            shape = f" (a {square} × {square} matrix?)" if square * square == len(numbers) else ""
            self.note.setText(f"Paste refused: {len(numbers)} numbers{shape}; a rotation matrix is 3 × 3, "
                              f"nine numbers. Nothing was changed.")
            return True
        for cell, value in zip(self.flat_cells(), numbers):
            cell.set_text(repr(float(value)))  # what was pasted, not rounded to the display digits
        self._on_typed()
        return True
