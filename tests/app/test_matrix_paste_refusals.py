"""The matrix editor never reads a 2 × 2 matrix, or any count of numbers but nine, as an orientation:
Ctrl+V or the right-click Paste of such text into a cell is refused with a note and changes nothing.
Nine numbers that are not a rotation are refused by the orthogonality check as before."""

import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QGuiApplication

from tests.app.window_driver import focus


def cell_texts(window):
    return [[c.text() for c in row] for row in window.matrix.cells]


@pytest.mark.parametrize("text, words", [
    ("[1 0; 0 1]", "4 numbers (a 2 × 2 matrix?)"),
    ("[[1, 0], [0, 1]]", "4 numbers (a 2 × 2 matrix?)"),
    ("1 0 0 0", "4 numbers (a 2 × 2 matrix?)"),
    ("1 0 0\n0 1 0", "6 numbers;"),
    ("1 0 0 0\n0 1 0 0\n0 0 1 0\n0 0 0 1", "16 numbers (a 4 × 4 matrix?)"),
])
def test_pasting_other_than_nine_numbers_into_a_cell_is_refused_with_a_note(qtbot, window, text, words):
    before_cells, before = cell_texts(window), window.model.current_orientation()
    steps = window.model.undo_stack.count()
    QGuiApplication.clipboard().setText(text)
    cell = window.matrix.cells[0][0]
    focus(qtbot, cell.lineEdit())
    qtbot.keyClick(cell.lineEdit(), Qt.Key.Key_V, Qt.KeyboardModifier.ControlModifier)
    note = window.matrix.note.text()
    assert note.startswith("Paste refused: ") and words in note and "nine numbers" in note
    assert cell_texts(window) == before_cells                  # not even the cell took the text
    assert window.model.current_orientation() == before and window.model.undo_stack.count() == steps


def test_the_right_click_paste_of_a_2x2_matrix_is_refused_too(qtbot, window):
    before_cells = cell_texts(window)
    QGuiApplication.clipboard().setText("1 0\n0 1")
    cell = window.matrix.cells[2][1]
    menu = window.matrix.paste_catcher.context_menu(cell.lineEdit())
    next(a for a in menu.actions() if a.objectName() == "edit-paste").trigger()
    assert "4 numbers (a 2 × 2 matrix?)" in window.matrix.note.text()
    assert cell_texts(window) == before_cells


def test_nine_huge_numbers_are_refused_by_the_rotation_check(qtbot, window):
    before = window.model.current_orientation()
    QGuiApplication.clipboard().setText("1e308 0 0\n0 1e308 0\n0 0 1e308")
    cell = window.matrix.cells[1][1]
    focus(qtbot, cell.lineEdit())
    qtbot.keyClick(cell.lineEdit(), Qt.Key.Key_V, Qt.KeyboardModifier.ControlModifier)
    assert "a rotation's elements lie between −1 and 1" in window.matrix.note.text()
    assert window.model.current_orientation() == before
