"""At 1280×800 and 1366×768 every choice box of the editors shows the entry chosen in it whole: Qt does
not elide a closed combo box, it cuts it ("intrinsic (about the mc" was seen in a screenshot). The
entries are chosen as a person does from the keyboard: into the box, then the arrow keys."""

import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QComboBox, QStyle, QStyleOptionComboBox

from tests.app.test_laptop_layout import LAPTOPS, settle
from tests.app.window_driver import focus

TEXT_MARGIN_PX = 4


def edit_field_width(box: QComboBox) -> int:
    """The width the closed box has for its text (its frame and arrow taken off), as the style draws it."""
    option = QStyleOptionComboBox()
    box.initStyleOption(option)
    rect = box.style().subControlRect(QStyle.ComplexControl.CC_ComboBox, option,
                                      QStyle.SubControl.SC_ComboBoxEditField, box)
    return rect.width()


def step_through(qtbot, box: QComboBox):
    """Yield each entry's index in turn, chosen with Home then Down in the focused box."""
    focus(qtbot, box)
    qtbot.keyClick(box, Qt.Key.Key_Home)
    yield box.currentIndex()
    for _ in range(box.count() - 1):
        qtbot.keyClick(box, Qt.Key.Key_Down)
        yield box.currentIndex()


@pytest.mark.parametrize("size", LAPTOPS)
def test_every_choice_in_view_is_shown_whole_once_chosen(qtbot, window, size):
    # the editors', the Position unit, the Scene's tools and the toolbar's: every box in view on start
    settle(qtbot, window, size)
    boxes = [b for b in window.findChildren(QComboBox) if b.isVisible()]
    assert window.scene is not None and set(window.scene.findChildren(QComboBox)) <= set(boxes)
    assert window.angles.kind_box in boxes and window.angles.sequence_box in boxes and window.units_box in boxes
    cut = []
    for box in boxes:
        seen, start = [], box.currentIndex()
        for index in step_through(qtbot, box):
            seen.append(index)
            text = box.currentText()
            # the style draws the label a few pixels in from the edit field's edges: keep 4 px spare (a
            # closing bracket was seen cut with none left; 4 px spare draws whole)
            if box.fontMetrics().horizontalAdvance(text) + TEXT_MARGIN_PX > edit_field_width(box):
                cut.append((text, box.fontMetrics().horizontalAdvance(text), edit_field_width(box)))
        assert seen == list(range(box.count())), seen      # every entry was chosen once
        # back to where it was (a unit or a sequence changes the layout the next box is measured in)
        qtbot.keyClick(box, Qt.Key.Key_Home)
        for _ in range(start):
            qtbot.keyClick(box, Qt.Key.Key_Down)
        assert box.currentIndex() == start
    assert not cut, f"shown cut at {size}: {cut}"
