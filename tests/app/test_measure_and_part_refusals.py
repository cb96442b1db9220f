"""Hostile numbers typed into the Measure panel and the Part dialog, as a person types and clicks: the
refusal shows in the panel's note or the dialog's message, names the place, keeps the user's text and
the last good values, and never raises. At a laptop size (1280 × 800) and a large one.

Check values: SciPy's Rotation (a general-purpose reference library) makes the rotation of the points
that must still fit when every coordinate is huge or tiny."""

import numpy as np
import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QDialogButtonBox, QLineEdit
from scipy.spatial.transform import Rotation

from app.panels.measure_fit import DIRECTIONS, THREE_POINTS
from app.panels.measure_panel import MeasurePanel
from app.part_dialog import LARGEST_BOX_MM, SMALLEST_BOX_MM, PartDialog
from tests.app.test_measure_panel import NOMINAL, click, paste_into, spreadsheet_text

ROTATION = Rotation.from_euler("ZYX", [20.0, -5.0, 12.0], degrees=True)   # SciPy: the known answer
SIZES = [(1280, 800), (1900, 1000)]


@pytest.fixture(params=SIZES, ids=["laptop", "large"])
def panel(request, qtbot, model):
    widget = MeasurePanel(model)
    qtbot.addWidget(widget)
    widget.resize(*request.param)
    widget.show()
    qtbot.waitExposed(widget)
    widget.activateWindow()
    qtbot.waitUntil(widget.isActiveWindow, timeout=2000)
    return widget


def type_into_cell(qtbot, table, row, column, text):
    """Click the cell, press F2 and type, as a person edits a cell; Return commits."""
    rect = table.visualItemRect(table.item(row, column))
    qtbot.mouseClick(table.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())
    qtbot.keyClick(table, Qt.Key.Key_F2)
    editor = next(e for e in table.findChildren(QLineEdit) if e.isVisible())
    editor.selectAll()
    qtbot.keyClicks(editor, text)
    qtbot.keyClick(editor, Qt.Key.Key_Return)
    qtbot.waitUntil(lambda: table.state() != table.State.EditingState)


@pytest.mark.parametrize("text, words", [
    ("1.797e308", "measured point 4, x = 1.797e+308"),
    ("-1e200", "measured point 4, x = -1e+200"),
    ("1e20", "measured points lie on one line"),
])
def test_a_huge_coordinate_typed_into_the_table_is_refused_in_the_note(qtbot, panel, text, words):
    table = panel.current_table()
    measured = ROTATION.apply(NOMINAL) + [100.0, 200.0, 300.0]
    paste_into(qtbot, table, spreadsheet_text(NOMINAL, measured))
    with qtbot.waitSignal(panel.fit_changed):
        click(qtbot, panel.fit_button)
    made = panel.last_fit
    assert made is not None
    panel.make_mount_button.click()
    mounts = len(panel.model.mounts)
    type_into_cell(qtbot, table, 3, 3, text)
    with qtbot.assertNotEmitted(panel.fit_changed):
        click(qtbot, panel.fit_button)      # the edit already withdrew the fit; the refusal emits nothing more
    note = panel.message.text()
    assert note.startswith("Not fitted:") and words in note
    assert panel.message.textFormat() == Qt.TextFormat.PlainText      # the note quotes typed text
    assert "Traceback" not in note and "LinAlgError" not in note
    assert table.item(3, 3).text() == text                      # the typed text stays for the user to fix
    assert len(panel.model.mounts) == mounts                    # the mount made from the good fit stays
    assert panel.model.mounts[-1].orientation.isclose(made.orientation, atol=0)
    assert not panel.make_mount_button.isEnabled()


@pytest.mark.parametrize("text", ["nan", "inf", "-inf", "1e400"])
def test_a_non_finite_coordinate_is_named_by_its_cell(qtbot, panel, text):
    table = panel.current_table()
    paste_into(qtbot, table, spreadsheet_text(NOMINAL, ROTATION.apply(NOMINAL)))
    type_into_cell(qtbot, table, 2, 1, text)
    click(qtbot, panel.fit_button)
    note = panel.message.text()
    assert "Not fitted" in note and "row 3, Nominal y" in note and "finite" in note
    assert panel.last_fit is None


@pytest.mark.parametrize("factor", [1e-200, 1e200])
def test_points_all_huge_or_all_tiny_still_fit_to_the_scipy_rotation(qtbot, panel, factor):
    table = panel.current_table()
    paste_into(qtbot, table, spreadsheet_text(NOMINAL * factor, ROTATION.apply(NOMINAL) * factor))
    with qtbot.waitSignal(panel.fit_changed) as signal:
        click(qtbot, panel.fit_button)
    fit = signal.args[0]
    np.testing.assert_allclose(fit.orientation.as_matrix(), ROTATION.as_matrix(), atol=1e-12)
    assert np.all(np.isfinite(fit.fitted)) and "Fitted." in panel.message.text()


def test_a_translation_beyond_a_double_is_refused_in_the_note(qtbot, panel):
    nominal = NOMINAL * 1e305 - 1.6e308
    measured = nominal.copy()
    measured[:, :2] = (-nominal[:, :2] - 1.6e308) - 1.6e308   # a half turn about Z, moved 3.2e308 along x, y
    paste_into(qtbot, panel.current_table(), spreadsheet_text(nominal, measured))
    click(qtbot, panel.fit_button)
    assert "largest number a double holds" in panel.message.text() and panel.last_fit is None


@pytest.mark.parametrize("rows, words", [
    ("1\t0\t0\t1\t0\t0\n0\t1e-320\t0\t0\t1\t0\n", None),                        # tiny is still a direction
    ("1\t0\t0\t1\t0\t0\n0\t0\t0\t0\t1\t0\n", "direction 2 has zero length"),
    ("1e308\t0\t0\t1\t0\t0\n0\t1e308\t0\t0\t1\t0\n", None),                      # huge is one too
    ("1e308\t1e308\t0\t1\t0\t0\n1\t1\t0\t0\t1\t0\n", "nearly parallel"),
])
def test_directions_of_extreme_length_fit_or_are_refused_by_name(qtbot, panel, rows, words):
    panel.set_method(DIRECTIONS)
    paste_into(qtbot, panel.current_table(), rows)
    click(qtbot, panel.fit_button)
    note = panel.message.text()
    if words is None:
        assert "Fitted." in note and np.all(np.isfinite(panel.last_fit.fitted))
    else:
        assert "Not fitted" in note and words in note and panel.last_fit is None


def test_three_datum_points_beyond_a_double_apart_are_refused(qtbot, panel):
    panel.set_method(THREE_POINTS)
    paste_into(qtbot, panel.current_table(), "-1.7e308\t0\t0\n1.7e308\t0\t0\n0\t1e308\t0\n")
    click(qtbot, panel.fit_button)
    assert "Not fitted" in panel.message.text() and "largest number a double holds" in panel.message.text()


def test_a_refused_paste_keeps_the_last_good_fit(qtbot, panel):
    table = panel.current_table()
    paste_into(qtbot, table, spreadsheet_text(NOMINAL, ROTATION.apply(NOMINAL)))
    click(qtbot, panel.fit_button)
    good = panel.last_fit
    result = panel.result_text.toPlainText()
    paste_into(qtbot, table, "1,5\t2,5\t3,5\t1,5\t2,5\t3,5\n")                    # refused: decimal commas
    assert "Paste refused" in panel.message.text()
    assert panel.last_fit is good and panel.result_text.toPlainText() == result


# --- the Part dialog --------------------------------------------------------------------------------

def open_dialog(qtbot, window, size):
    window.resize(*size)
    dialog = PartDialog(window.model, window)
    qtbot.addWidget(dialog)
    dialog.show()
    qtbot.waitExposed(dialog)
    return dialog


@pytest.fixture
def dialog(qtbot, window):
    return open_dialog(qtbot, window, SIZES[0])


def retype(qtbot, field, text):
    qtbot.mouseClick(field, Qt.MouseButton.LeftButton)
    field.selectAll()
    qtbot.keyClick(field, Qt.Key.Key_Delete)
    qtbot.keyClicks(field, text)


def ok_button(dialog):
    return dialog.findChild(QDialogButtonBox).button(QDialogButtonBox.StandardButton.Ok)


@pytest.mark.parametrize("text, words, axis", [
    ("5e-324", "5e-324 mm is outside the sizes a part can have", 0),
    ("0.0001", "0.0001 mm is outside", 1), ("1e7", "1e7 mm is outside", 2), ("1e300", "1e300 mm is outside", 0),
    ("0", "expected a positive size from 0.001 mm to 1,000,000 mm", 1), ("-0", "positive", 2), ("-3", "positive", 0),
    ("nan", "not a finite number", 1), ("inf", "not a finite number", 2), ("1e400", "not a finite number", 0),
    ("0x10", "is not a number", 1), ("<b>9</b>", "is not a number", 2),
])
def test_a_box_size_outside_the_range_is_refused_by_name_and_nothing_changes(qtbot, window, dialog, text, words,
                                                                             axis):
    model = window.model
    before, steps, drawn = model.current_mount().part, model.undo_stack.count(), window.scene.part.scale
    retype(qtbot, dialog.size_fields[axis], text)
    qtbot.mouseClick(ok_button(dialog), Qt.MouseButton.LeftButton)
    message = dialog.message.text()
    assert message.startswith(f"box size {'XYZ'[axis]}: ") and words in message and "nothing was changed" in message
    assert dialog.message.textFormat() == Qt.TextFormat.PlainText      # typed text shown as typed, never as markup
    assert dialog.isVisible() and dialog.size_fields[axis].text() == text
    assert model.current_mount().part == before and model.undo_stack.count() == steps
    assert window.scene.part.scale == drawn


def test_at_a_large_size_too_the_refusal_is_shown_whole(qtbot, window):
    dialog = open_dialog(qtbot, window, SIZES[1])
    retype(qtbot, dialog.size_fields[0], "5e-324")
    qtbot.mouseClick(ok_button(dialog), Qt.MouseButton.LeftButton)
    assert "box size X: 5e-324 mm is outside" in dialog.message.text() and dialog.message.isVisible()
    assert dialog.message.width() <= dialog.width()   # wrapped inside the dialog, not cut off


@pytest.mark.parametrize("text", [f"{SMALLEST_BOX_MM:g}", f"{LARGEST_BOX_MM:g}", "0.5", "2500"])
def test_box_sizes_at_the_ends_of_the_range_are_accepted_and_drawn(qtbot, window, dialog, text):
    retype(qtbot, dialog.size_fields[1], text)
    qtbot.keyClick(dialog.size_fields[1], Qt.Key.Key_Return)
    assert window.model.current_mount().part.box_size_mm[1] == float(text)
    assert np.isfinite(window.scene.part.scale) and not dialog.isVisible()


def test_an_endless_size_text_is_cut_at_the_field(qtbot, dialog):
    field = dialog.size_fields[0]
    retype(qtbot, field, "1" * 200)
    assert len(field.text()) == 64
    qtbot.mouseClick(ok_button(dialog), Qt.MouseButton.LeftButton)
    assert "is outside the sizes a part can have" in dialog.message.text()
