"""Linked editors driven by real key and mouse events: typing in one updates all the others live (checked
against SciPy's Rotation to 1e-9), the field in use keeps the user's spelling until focus leaves, and bad
text turns the field red and changes nothing."""

import numpy as np
import pytest
from PySide6.QtCore import QPoint, QPointF, Qt
from PySide6.QtGui import QGuiApplication, QWheelEvent
from PySide6.QtWidgets import QApplication
from scipy.spatial.transform import Rotation

from app.widgets.number_field import NumberField
from core.orientation import Orientation
from tests.app.window_driver import assert_editors_agree, focus, leave_editor, scipy_rotation, type_into


@pytest.fixture
def win(window):
    window.model.set_preferences(significant_digits=15)  # enough digits to compare at 1e-9
    return window


def all_fields(window):
    return [f for editor in window.editors for f in editor.findChildren(NumberField) if f.isVisible()]


# ---- each editor updates every other ---------------------------------------------------------------

def test_typing_angles_updates_every_other_editor_live(qtbot, win):
    for field, text in zip(win.angles.fields, ("30", "20", "10")):
        type_into(qtbot, field, text)
    # SciPy: 'ZYX' uppercase is intrinsic Z-Y'-X'', the Angles editor's default sequence.
    assert_editors_agree(win, Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))
    assert [f.text() for f in win.angles.fields] == ["30", "20", "10"]
    assert win.meter.margin.margin_deg == pytest.approx(70.0, abs=1e-9)  # 90° − |θ2| (CONVENTIONS.md)


def test_typing_a_quaternion_updates_every_other_editor_live(qtbot, win):
    for field, text in zip(win.quaternion.fields, ("1", "2", "3", "4")):
        type_into(qtbot, field, text)
    # Not unit length: the editor keeps what was typed and the others show the unit quaternion.
    assert [f.text() for f in win.quaternion.fields] == ["1", "2", "3", "4"]
    assert win.quaternion.norm_label.text().startswith("Norm 5.47722557505")  # sqrt(30)
    assert_editors_agree(win, Rotation.from_quat([2, 3, 4, 1]), skip=("quaternion",))


def test_typing_a_matrix_updates_every_other_editor_live(qtbot, win):
    rotation = Rotation.from_euler("XYZ", [25, -40, 110], degrees=True)
    m = rotation.as_matrix()
    for r in range(3):
        for c in range(3):
            type_into(qtbot, win.matrix.cells[r][c], repr(float(m[r, c])))
    assert_editors_agree(win, rotation, skip=("matrix",))
    assert win.matrix.error_label.text().startswith("Orthogonality error")
    assert float(win.matrix.det_label.text().split()[-1]) == pytest.approx(1.0, abs=1e-12)


def test_typing_axis_and_angle_updates_every_other_editor_and_normalises_on_commit(qtbot, win):
    for field, text in zip(win.axis_angle.axis_fields + [win.axis_angle.angle_field], ("1", "2", "2", "70")):
        type_into(qtbot, field, text)
    rotation = Rotation.from_rotvec(np.radians(70) * np.array([1, 2, 2]) / 3.0)
    assert_editors_agree(win, rotation, skip=("axis",))
    assert [f.text() for f in win.axis_angle.axis_fields] == ["1", "2", "2"]  # kept while typing
    assert "not unit length" in win.axis_angle.note.text()
    qtbot.keyClick(win.axis_angle.angle_field.lineEdit(), Qt.Key.Key_Return)
    np.testing.assert_allclose([float(f.text()) for f in win.axis_angle.axis_fields], [1 / 3, 2 / 3, 2 / 3],
                               atol=1e-12)
    assert "normalised" in win.axis_angle.note.text() and "3" in win.axis_angle.note.text()


def test_rotation_vector_toggle_shows_and_takes_axis_times_angle(qtbot, win):
    qtbot.mouseClick(win.axis_angle.rotvec_toggle, Qt.MouseButton.LeftButton,
                     pos=QPoint(5, win.axis_angle.rotvec_toggle.height() // 2))
    assert win.axis_angle.showing_rotation_vector
    for field, text in zip(win.axis_angle.axis_fields, ("0", "-45", "0")):
        type_into(qtbot, field, text)
    rotation = Rotation.from_rotvec([0, -np.pi / 4, 0])
    assert_editors_agree(win, rotation, skip=("axis", "angle"))


# ---- the user's own spelling ---------------------------------------------------------------------

def test_angle_outside_canonical_range_is_kept_until_focus_leaves(qtbot, win):
    type_into(qtbot, win.angles.fields[0], "270")
    assert win.angles.fields[0].text() == "270"
    assert win.model.current_orientation().isclose(
        Orientation.from_angles("ZYX", [270, *[float(f.text()) for f in win.angles.fields[1:]]]), atol=1e-12)
    leave_editor(qtbot, win)
    assert float(win.angles.fields[0].text()) == pytest.approx(-90.0, abs=1e-9)  # canonical (−180, 180]


def test_quaternion_sign_is_kept_while_typing_and_canonical_after(qtbot, win):
    for field, text in zip(win.quaternion.fields, ("-0.5", "-0.5", "-0.5", "-0.5")):
        type_into(qtbot, field, text)
    assert [f.text() for f in win.quaternion.fields] == ["-0.5"] * 4
    assert_editors_agree(win, Rotation.from_quat([0.5, 0.5, 0.5, 0.5]), skip=("quaternion",))
    leave_editor(qtbot, win)
    assert [float(f.text()) for f in win.quaternion.fields] == [0.5] * 4  # w >= 0 (CONVENTIONS.md)


def test_the_field_in_use_is_not_rewritten_by_its_own_edit(qtbot, win):
    field = win.angles.fields[1]
    type_into(qtbot, field, "45.")
    assert field.text() == "45."  # a half-typed number is left alone
    assert float(win.angles.fields[1].text()) == 45.0


# ---- bad text --------------------------------------------------------------------------------------

def _frame_is_red(field):
    """Look at the pixels: the field's left edge is drawn in the problem red."""
    colour = field.grab().toImage().pixelColor(1, field.height() // 2)
    return colour.red() > 150 and colour.green() < 90 and colour.blue() < 90


def paste_into(qtbot, field, text):
    QGuiApplication.clipboard().setText(text)
    focus(qtbot, field.lineEdit())
    field.lineEdit().selectAll()
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_V, Qt.KeyboardModifier.ControlModifier)


@pytest.mark.parametrize("bad, words, how", [("abc", "not a number", "type"), ("1,5", "'.'", "paste"),
                                             ("", "empty", "clear"), ("inf", "finite", "type"),
                                             ("1e999", "finite", "paste")])
def test_bad_text_in_every_field_turns_it_red_and_changes_nothing(qtbot, win, bad, words, how):
    before = win.model.current_orientation()
    fields = all_fields(win)
    assert len(fields) == 3 + 1 + 4 + 9 + 3
    for field in fields:
        others = {id(f): f.text() for f in fields if f.parentWidget() is not field.parentWidget()}
        if how == "type":
            type_into(qtbot, field, bad)
        elif how == "paste":
            paste_into(qtbot, field, bad)
        else:
            type_into(qtbot, field, "x")
            qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Backspace)
        assert field.text() == bad  # the user's text stays for them to correct
        assert field.problem is not None and words in field.problem, field.toolTip()
        assert words in field.toolTip() and field.property("invalid") is True
        assert _frame_is_red(field)
        assert win.model.current_orientation() == before
        assert {id(f): f.text() for f in fields if id(f) in others} == others
        editor = next(e for e in win.editors if e.isAncestorOf(field))
        leave_editor(qtbot, win)  # leaving shows the last good value again, and says what was not used
        assert field.problem is None
        assert "Not used" in editor.note.text()
    assert win.model.undo_stack.count() == 0


def test_zero_axis_and_zero_quaternion_are_refused_with_a_reason(qtbot, win):
    for field in win.axis_angle.axis_fields[:2]:
        type_into(qtbot, field, "0")
    before = win.model.current_orientation()
    type_into(qtbot, win.axis_angle.axis_fields[2], "0")
    assert "zero length" in win.axis_angle.axis_fields[0].problem
    assert win.model.current_orientation() == before
    leave_editor(qtbot, win)
    for field in win.quaternion.fields[:3]:
        type_into(qtbot, field, "0")
    before = win.model.current_orientation()
    type_into(qtbot, win.quaternion.fields[3], "0")
    assert "zero length" in win.quaternion.fields[0].problem
    assert win.model.current_orientation() == before


def test_a_reflection_matrix_is_refused_and_changes_nothing(qtbot, win):
    before = win.model.current_orientation()
    win.matrix.paste_grid("1 0 0\n0 1 0\n0 0 -1")
    assert "reflection" in win.matrix.cells[0][0].problem
    assert win.model.current_orientation() == before


def test_locale_with_comma_decimal_still_reads_a_point(qtbot, win):
    from PySide6.QtCore import QLocale

    QLocale.setDefault(QLocale(QLocale.Language.German, QLocale.Country.Germany))
    try:
        type_into(qtbot, win.angles.fields[2], "12.5")
        assert win.angles.fields[2].problem is None
        assert win.model.current_orientation().as_angles("ZYX").angles[2] == pytest.approx(12.5, abs=1e-9)
    finally:
        QLocale.setDefault(QLocale.c())


def test_every_field_has_a_tooltip_stating_its_convention(win):
    for field in all_fields(win):
        assert len(field.toolTip()) > 30, field.toolTip()
    assert "body → reference" in win.matrix.cells[0][0].toolTip()
    assert "Hamilton" in win.quaternion.fields[0].toolTip()
    assert "right-hand" in win.axis_angle.angle_field.toolTip()
    assert "intrinsic" in win.angles.fields[0].toolTip()


# ---- matrix paste and meaning ----------------------------------------------------------------------

def test_pasting_nine_numbers_into_one_cell_fills_the_grid(qtbot, win):
    rotation = Rotation.from_euler("ZYX", [-20, 35, 5], degrees=True)
    m = rotation.as_matrix()
    QGuiApplication.clipboard().setText("\n".join("  ".join(f"{v:.17g}".replace("-", "\u2212") for v in row)
                                                  for row in m))
    cell = win.matrix.cells[1][2]
    focus(qtbot, cell.lineEdit())
    qtbot.keyClick(cell.lineEdit(), Qt.Key.Key_V, Qt.KeyboardModifier.ControlModifier)
    np.testing.assert_allclose([[float(c.text()) for c in row] for row in win.matrix.cells], m, atol=1e-15)
    assert_editors_agree(win, rotation, skip=("matrix",))


def test_right_click_paste_of_nine_numbers_fills_the_grid(qtbot, win):
    # Reference: SciPy's Rotation for the matrix pasted (body -> reference, rows as printed).
    rotation = Rotation.from_euler("ZYX", [25, -10, 5], degrees=True)
    m = rotation.as_matrix()
    QGuiApplication.clipboard().setText("\n".join(" ".join(repr(float(v)) for v in row) for row in m))
    cell = win.matrix.cells[1][1]
    menu = win.matrix.paste_catcher.context_menu(cell.lineEdit())
    paste = next(a for a in menu.actions() if a.objectName() == "edit-paste")
    paste.trigger()
    np.testing.assert_allclose([[float(c.text()) for c in row] for row in win.matrix.cells], m, atol=1e-15)
    assert scipy_rotation(win.model.current_orientation()).approx_equal(rotation, atol=1e-12)
    # One number on the clipboard is an ordinary paste into the cell.
    QGuiApplication.clipboard().setText("0.5")
    cell.lineEdit().clear()
    next(a for a in win.matrix.paste_catcher.context_menu(cell.lineEdit()).actions()
         if a.objectName() == "edit-paste").trigger()
    assert cell.text() == "0.5"


def test_matrix_meaning_toggle_shows_the_transpose_of_the_same_orientation(qtbot, win):
    before = win.model.current_orientation()
    m = before.as_matrix()
    button = win.matrix.meaning_buttons["reference_to_body"]
    qtbot.mouseClick(button, Qt.MouseButton.LeftButton, pos=QPoint(6, button.height() // 2))
    assert win.model.preferences.matrix_meaning == "reference_to_body"
    np.testing.assert_allclose([[float(c.text()) for c in row] for row in win.matrix.cells], m.T, atol=1e-14)
    assert win.model.current_orientation() == before
    # Typing in that meaning reads the nine numbers as rows = body axes.
    rotation = Rotation.from_euler("ZYX", [60, 0, 0], degrees=True)
    win.matrix.paste_grid("\n".join(" ".join(repr(float(v)) for v in row) for row in rotation.as_matrix().T))
    assert scipy_rotation(win.model.current_orientation()).approx_equal(rotation, atol=1e-12)


# ---- drags merge into one undo step ----------------------------------------------------------------

def test_arrow_key_steps_merge_into_one_undo_step(qtbot, win):
    start = win.model.current_orientation()
    field = win.angles.fields[0]
    focus(qtbot, field.lineEdit())
    first = float(field.text())
    for _ in range(7):
        qtbot.keyClick(field, Qt.Key.Key_Up)
    assert float(field.text()) == pytest.approx(first + 7, abs=1e-9)
    assert win.model.undo_stack.count() == 1
    win.model.undo()
    assert win.model.current_orientation() == start


def test_wheel_steps_merge_and_a_run_back_to_start_is_dropped(qtbot, win):
    field = win.quaternion.fields[1]
    focus(qtbot, field.lineEdit())
    centre = QPointF(field.width() / 2, field.height() / 2)

    def wheel(delta):
        event = QWheelEvent(centre, field.mapToGlobal(centre), QPoint(0, 0), QPoint(0, delta),
                            Qt.MouseButton.NoButton, Qt.KeyboardModifier.NoModifier,
                            Qt.ScrollPhase.NoScrollPhase, False)
        QApplication.sendEvent(field, event)

    start_text = field.text()
    for _ in range(4):
        wheel(120)
    assert win.model.undo_stack.count() == 1
    for _ in range(4):
        wheel(-120)
    assert float(field.text()) == pytest.approx(float(start_text), abs=1e-12)
    assert win.model.undo_stack.count() == 0


def test_slider_drag_with_the_mouse_is_one_undo_step(qtbot, win):
    start = win.model.current_orientation()
    slider = win.axis_angle.slider
    y = slider.height() // 2
    handle_x = int(slider.width() * slider.value() / slider.maximum())
    qtbot.mousePress(slider, Qt.MouseButton.LeftButton, pos=QPoint(handle_x, y))
    for x in range(handle_x, max(handle_x - 80, 2), -8):
        qtbot.mouseMove(slider, QPoint(x, y))
    qtbot.mouseRelease(slider, Qt.MouseButton.LeftButton, pos=QPoint(max(handle_x - 80, 2), y))
    assert win.model.current_orientation() != start
    assert win.model.undo_stack.count() == 1
    win.model.undo()
    assert win.model.current_orientation() == start


def test_undo_and_redo_restore_every_editor_exactly(qtbot, win):
    texts_before = [f.text() for f in all_fields(win)]
    for field, text in zip(win.angles.fields, ("-10", "5", "3")):
        type_into(qtbot, field, text)
    leave_editor(qtbot, win)
    texts_after = [f.text() for f in all_fields(win)]
    qtbot.keyClick(win, Qt.Key.Key_Z, Qt.KeyboardModifier.ControlModifier)  # QKeySequence.Undo
    assert [f.text() for f in all_fields(win)] == texts_before
    win.redo_action.trigger()
    assert [f.text() for f in all_fields(win)] == texts_after


def test_changing_the_sequence_respells_the_angles_without_changing_the_orientation(qtbot, win):
    before = win.model.current_orientation()
    box = win.angles.sequence_box
    box.setCurrentIndex(box.findData("XYZ"))
    box.activated.emit(box.currentIndex())
    assert win.model.current_orientation() == before
    assert [lbl.text().split()[0] for lbl in win.angles.labels] == ["X", "Y′", "Z″"]
    want = scipy_rotation(before).as_euler("XYZ", degrees=True)
    np.testing.assert_allclose([float(f.text()) for f in win.angles.fields], want, atol=1e-9)
    kind = win.angles.kind_box
    kind.setCurrentIndex(1)
    kind.activated.emit(1)
    want = scipy_rotation(before).as_euler("xyz", degrees=True)  # SciPy lowercase = extrinsic
    np.testing.assert_allclose([float(f.text()) for f in win.angles.fields], want, atol=1e-9)
    assert "(roll)" in win.angles.labels[0].text()  # extrinsic X-Y-Z is the robotics roll-pitch-yaw preset
    assert "intrinsic Z-Y′-X″ (yaw, pitch, roll)" in win.angles.other_label.text()


def test_radians_preference_changes_every_angle_shown(qtbot, win):
    win.units_box.setCurrentIndex(1)
    win.units_box.activated.emit(1)
    o = win.model.current_orientation()
    assert float(win.axis_angle.angle_field.text()) == pytest.approx(np.radians(o.angle), abs=1e-12)
    np.testing.assert_allclose([float(f.text()) for f in win.angles.fields],
                               scipy_rotation(o).as_euler("ZYX"), atol=1e-12)
    # the unit is named: beside each field, or (a unit longer than a mark) once in the editor's title
    assert "(rad)" in win.angles.labels[0].text() or win.angles.title() == "Angles, rad"
