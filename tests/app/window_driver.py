"""Drive the window through real widget events, and read what every editor shows, for the GUI tests."""

import numpy as np
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QApplication
from scipy.spatial.transform import Rotation


def focus(qtbot, widget):
    """Give a widget real keyboard focus (so focus-leave behaviour runs as for a person)."""
    widget.window().activateWindow()
    widget.setFocus(Qt.FocusReason.MouseFocusReason)
    qtbot.waitUntil(lambda: QApplication.focusWidget() is not None, timeout=2000)


def type_into(qtbot, field, text):
    """Click into a number field, select what is there and type `text`, key by key. Characters a keyboard
    layout or an input method gives that QTest cannot synthesise (′ ″ °) go as key events carrying them."""
    from PySide6.QtCore import QEvent
    from PySide6.QtGui import QKeyEvent

    line = field.lineEdit()
    focus(qtbot, line)
    line.selectAll()
    if text.isascii():
        qtbot.keyClicks(line, text)
        return
    for ch in text:
        if ch.isascii():
            qtbot.keyClicks(line, ch)
        else:
            for kind in (QEvent.Type.KeyPress, QEvent.Type.KeyRelease):
                QApplication.sendEvent(line, QKeyEvent(kind, Qt.Key.Key_unknown, Qt.KeyboardModifier.NoModifier, ch))


def leave_editor(qtbot, window):
    """Move focus out of every editor, as clicking into the Decode paste box does."""
    focus(qtbot, window.decode_panel.paste_box)
    qtbot.wait(10)


def click_side_tab(qtbot, window, title):
    """Bring a side tab to the front by clicking its title in the tab bar, as a person does."""
    tabs = window.side_tabs
    bar = tabs.tabBar()
    index = [tabs.tabText(i) for i in range(tabs.count())].index(title)
    qtbot.mouseClick(bar, Qt.MouseButton.LeftButton, pos=bar.tabRect(index).center())
    qtbot.waitUntil(lambda: tabs.currentIndex() == index and tabs.currentWidget().isVisible(), timeout=2000)


def numbers(fields):
    return np.array([float(f.text()) for f in fields])


def scipy_rotation(orientation):
    w, x, y, z = orientation.as_quaternion()
    return Rotation.from_quat([x, y, z, w])


def canonical_wxyz(rotation):
    """SciPy's quaternion in our canonical form (w first, w >= 0) — CONVENTIONS.md."""
    x, y, z, w = rotation.as_quat()
    q = np.array([w, x, y, z])
    if q[0] < 0 or (q[0] == 0 and q[np.nonzero(q[1:])[0][0] + 1] < 0):
        q = -q
    return q


def shown(window):
    """What each editor shows, as numbers in its own representation (preferences as default)."""
    return {
        "matrix": numbers([c for row in window.matrix.cells for c in row]).reshape(3, 3),
        "quaternion": numbers(window.quaternion.fields),
        "axis": numbers(window.axis_angle.axis_fields),
        "angle": float(window.axis_angle.angle_field.text()),
        "angles": numbers(window.angles.fields),
    }


def expected_from_scipy(rotation, sequence="ZYX"):
    """The same five readouts computed by SciPy's Rotation, an outside reference library.
    SciPy: uppercase sequence = intrinsic; as_quat is scalar last; rotation vector in radians."""
    rv = rotation.as_rotvec()
    angle = float(np.degrees(np.linalg.norm(rv)))
    return {
        "matrix": rotation.as_matrix(),
        "quaternion": canonical_wxyz(rotation),
        "axis": rv / np.linalg.norm(rv),
        "angle": angle,
        "angles": rotation.as_euler(sequence, degrees=True),
    }


def assert_editors_agree(window, rotation, skip=(), atol=1e-9):
    got, want = shown(window), expected_from_scipy(rotation, window.model.preferences.sequence)
    for key in want:
        if key in skip:
            continue
        np.testing.assert_allclose(got[key], want[key], atol=atol, rtol=0, err_msg=key)
