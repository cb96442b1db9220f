"""Whether a report's Scene picture is tried without a display: on a platform that makes an OpenGL context
offscreen it is; where none can be made the reason says so (app/report_picture.py)."""

from PySide6 import QtGui

from app import report_picture


def test_a_platform_without_a_display_is_tried_for_an_offscreen_context(qtbot, monkeypatch):
    monkeypatch.setattr(QtGui.QGuiApplication, "platformName", staticmethod(lambda: "offscreen"))
    monkeypatch.setattr(report_picture, "_offscreen_context_can_be_made", lambda: True)
    assert report_picture.no_picture_reason() is None
    monkeypatch.setattr(report_picture, "_offscreen_context_can_be_made", lambda: False)
    reason = report_picture.no_picture_reason()
    assert reason.startswith("no display to draw the Scene with OpenGL")
    assert "no OpenGL context could be made offscreen (Qt platform 'offscreen')" in reason


def test_the_probe_answers_without_a_crash(qtbot):
    # Under Xvfb with Mesa's llvmpipe an offscreen context can be made (the baseline of these tests).
    assert report_picture._offscreen_context_can_be_made() is True
