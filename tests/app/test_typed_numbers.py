"""Typed numbers commit only when complete and valid, driven by real key events: a half-typed or
out-of-range entry previews nothing, commits nothing, and says why in the editor's visible note."""

import pytest
from PySide6.QtCore import Qt

from tests.app.window_driver import focus, type_into


def press_tab(qtbot, field):
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Tab)
    qtbot.wait(10)


def test_typing_1_comma_5_then_tab_commits_nothing_and_the_note_says_why(qtbot, window):
    model = window.model
    before, steps = model.current_orientation(), model.undo_stack.count()
    field = window.angles.fields[0]
    type_into(qtbot, field, "1,5")
    # the keystroke "1" previewed, but "1," withdrew it: the model is back where it was
    assert model.current_orientation() == before
    assert model.undo_stack.count() == steps
    assert "'.'" in window.angles.note.text() and window.angles.note.isVisible()
    press_tab(qtbot, field)
    assert model.current_orientation() == before
    assert model.undo_stack.count() == steps
    assert "“1,5”" in window.angles.note.text() and "'.'" in window.angles.note.text()


def test_a_complete_number_previews_live_and_commits_one_step_on_tab(qtbot, window):
    model = window.model
    steps = model.undo_stack.count()
    field = window.angles.fields[2]
    type_into(qtbot, field, "12.5")
    assert model.current_orientation().as_angles("ZYX", degrees=True).angles[2] == pytest.approx(12.5, abs=1e-9)
    press_tab(qtbot, field)
    assert model.undo_stack.count() == steps + 1


def test_a_pause_while_typing_commits_nothing_half_typed(qtbot, window):
    # A pause in typing is not a commit: the run stays open until Enter or Tab.
    model = window.model
    before, steps = model.current_orientation(), model.undo_stack.count()
    field = window.angles.fields[0]
    type_into(qtbot, field, "1")
    qtbot.wait(1500)  # longer than the merge pause (app/model.MERGE_IDLE_MS)
    qtbot.keyClicks(field.lineEdit(), ",5")
    press_tab(qtbot, field)
    assert model.current_orientation() == before and model.undo_stack.count() == steps


@pytest.mark.parametrize("text", ["1e308", "721", "-720.5", "1e6", "9" * 300])
def test_an_angle_beyond_two_full_turns_is_refused_with_its_reason(qtbot, window, text):
    model = window.model
    before, steps = model.current_orientation(), model.undo_stack.count()
    for field, editor in ((window.angles.fields[1], window.angles),
                          (window.axis_angle.angle_field, window.axis_angle)):
        type_into(qtbot, field, text)
        assert model.current_orientation() == before
        assert "±720°" in field.problem
        note = editor.note.text()
        assert "±720°" in note and len(note) < 200, note  # said plainly, the typed text cut short
        press_tab(qtbot, field)
        assert model.current_orientation() == before and model.undo_stack.count() == steps


def test_720_degrees_is_inside_the_range(qtbot, window):
    # 720° is two full turns: the identity about that axis (common practice).
    field = window.axis_angle.angle_field
    type_into(qtbot, field, "720")
    assert field.problem is None
    assert window.model.current_orientation().angle == pytest.approx(0.0, abs=1e-9)


def test_the_rotation_vector_components_are_angles_and_limited_too(qtbot, window):
    window.axis_angle.rotvec_toggle.setChecked(True)
    before = window.model.current_orientation()
    field = window.axis_angle.axis_fields[0]
    type_into(qtbot, field, "1e308")
    assert "±720°" in field.problem and window.model.current_orientation() == before


def test_radians_have_the_same_limit_in_radians(qtbot, window):
    window.model.set_preferences(angle_units="rad")
    field = window.angles.fields[0]
    type_into(qtbot, field, "13")  # 13 rad ≈ 745°
    assert "rad" in field.problem and "12.5664" in field.problem
    type_into(qtbot, field, "12")
    assert field.problem is None


def test_an_axis_field_with_no_range_of_its_own_still_refuses_junk(qtbot, window):
    before = window.model.current_orientation()
    field = window.axis_angle.axis_fields[0]
    focus(qtbot, field.lineEdit())
    type_into(qtbot, field, "0.5x")
    assert "not a number" in field.problem and window.model.current_orientation() == before
