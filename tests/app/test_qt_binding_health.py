"""The Qt binding itself must not leak: PySide6-Essentials 6.12.0 dropped a reference to None on every
Qt call returning nothing, which aborts Python after a few thousand calls (pyproject excludes it). This
guards against that release, or a later one with the same fault, coming back in."""

import sys

from PySide6.QtWidgets import QWidget


def test_qt_calls_returning_nothing_keep_none_alive(qtbot):
    widget = QWidget()
    qtbot.addWidget(widget)
    before = sys.getrefcount(None)
    for _ in range(2000):
        widget.update()
        widget.setObjectName("probe")
    # Other code may take or drop a few references meanwhile; a leak would be 4000.
    assert abs(sys.getrefcount(None) - before) < 100
