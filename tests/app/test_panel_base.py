"""The panel base (app/panels/base.py), driven as a person drives the window at a laptop size: a panel in a
background tab does no drawing while the person edits, draws once when its tab is clicked, and then shows
exactly what a freshly built panel shows; the message line shows a problem in the error colour and
clears it."""

import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QLabel, QLineEdit

from app import plain_text
from app.panels.base import Panel
from app.panels.level_panel import TYPED, LevelPanel
from tests.app.window_driver import click_side_tab, type_into

PANELS = {"Level": "level_panel", "Check": "check_panel", "Adjust": "adjust_panel", "Chain": "chain_panel"}


@pytest.fixture
def laptop(qtbot, window):
    window.resize(1280, 800)
    qtbot.waitUntil(lambda: window.width() == 1280, timeout=2000)
    return window


def texts(panel):
    """What a person reads in a panel: every label and line of text, in the order they were made."""
    return [w.text() for w in panel.findChildren(QLabel) + panel.findChildren(QLineEdit)]


def count_renders(panel):
    calls = []
    draw = panel.render

    def counted():
        calls.append(1)
        draw()
    panel.render = counted
    return calls


def type_an_angle(qtbot, window, text):
    """Type into the third angle field, keystroke by keystroke (each one a live edit), then Tab."""
    field = window.angles.fields[2]
    type_into(qtbot, field, text)
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Tab)


@pytest.mark.parametrize("title", PANELS)
def test_a_panel_in_a_background_tab_draws_nothing_while_editing_and_once_when_shown(qtbot, laptop, title):
    click_side_tab(qtbot, laptop, title)            # built and shown
    panel = getattr(laptop, PANELS[title])
    click_side_tab(qtbot, laptop, "Decode")          # now it sits in a background tab
    assert not panel.isVisible()
    renders = count_renders(panel)
    steps = laptop.model.undo_stack.count()
    type_an_angle(qtbot, laptop, "37.25")
    assert laptop.model.undo_stack.count() == steps + 1      # the edit did reach the model
    assert renders == [] and panel._stale
    click_side_tab(qtbot, laptop, title)
    assert renders == [1] and not panel._stale
    fresh = type(panel)(laptop.model)                # built now, from the same model
    qtbot.addWidget(fresh)
    assert texts(panel) == texts(fresh)


def test_the_level_panel_caught_up_shows_the_edit_it_missed(qtbot, laptop):
    click_side_tab(qtbot, laptop, "Level")
    panel = laptop.level_panel
    before = panel.elevations.text()
    click_side_tab(qtbot, laptop, "Decode")
    type_an_angle(qtbot, laptop, "37.25")
    assert panel.elevations.text() == before        # not drawn while hidden ...
    click_side_tab(qtbot, laptop, "Level")
    assert panel.elevations.text() != before        # ... and drawn anew when shown
    fresh = LevelPanel(laptop.model)
    qtbot.addWidget(fresh)
    assert panel.elevations.text() == fresh.elevations.text()


def test_a_shown_panel_draws_on_each_edit_it_watches(qtbot, laptop):
    click_side_tab(qtbot, laptop, "Level")
    panel = laptop.level_panel
    renders = count_renders(panel)
    type_an_angle(qtbot, laptop, "12")
    assert len(renders) >= 2 and not panel._stale   # a live preview per keystroke, then the commit


def test_the_message_line_shows_a_problem_in_the_error_colour_and_clears(qtbot, laptop):
    click_side_tab(qtbot, laptop, "Level")
    panel = laptop.level_panel
    typed = panel.gravity_box.findData(TYPED)
    panel.gravity_box.setCurrentIndex(typed)
    panel.gravity_box.activated.emit(typed)          # the combo's own signal for a person's choice
    kept = panel.down.tolist()
    type_into_line(qtbot, panel.gravity_field, "1, 2")
    message = panel.message
    assert "three numbers" in message.text() and "“1, 2”" in message.text()
    assert message.is_problem and message.styleSheet() == plain_text.ERROR_STYLE and message.isVisible()
    assert message.textFormat() == Qt.TextFormat.PlainText     # it quotes what was typed
    assert panel.down.tolist() == kept               # the last good direction is kept
    type_into_line(qtbot, panel.gravity_field, "3, 0, 0")
    assert message.text() == "" and not message.is_problem and message.styleSheet() == ""
    assert panel.down.tolist() == [1.0, 0.0, 0.0]


def type_into_line(qtbot, line, text):
    line.setFocus(Qt.FocusReason.MouseFocusReason)
    line.selectAll()
    qtbot.keyClicks(line, text)
    qtbot.keyClick(line, Qt.Key.Key_Return)


class _Broken(Panel):
    def render(self):
        with self.rendering():
            raise RuntimeError("a render that fails")


def test_the_rendering_guard_is_lifted_even_when_a_render_fails(qtbot, model):
    panel = _Broken(model)
    qtbot.addWidget(panel)
    with pytest.raises(RuntimeError):
        panel.render()
    assert not panel._rendering
    with panel.rendering():
        assert panel._rendering
        with panel.rendering():              # nested: the outer guard still holds after the inner one
            pass
        assert panel._rendering
    assert not panel._rendering


def test_a_panel_with_nothing_to_say_has_no_message_line(qtbot, laptop):
    click_side_tab(qtbot, laptop, "Chain")
    assert "message" not in vars(laptop.chain_panel)
