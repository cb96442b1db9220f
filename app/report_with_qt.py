"""The command line's report, laid out by Qt: the only place `framewright report` loads Qt, once the
session has been read and the record built (app/cli.py gets this through app/main.py, so the command
line itself never imports Qt)."""

from __future__ import annotations

import os

from app.display_check import open_display_problem


def write_report_with_qt(out: str, record, free: dict):
    """Without a display Qt's offscreen platform lays out the pages (it has no OpenGL, so the report says
    the picture is left out); Qt's own messages are kept off stderr. OSError reaches the caller."""
    if open_display_problem() is not None:
        os.environ["QT_QPA_PLATFORM"] = "offscreen"
    import app.scene  # noqa: F401 - sets the GL context sharing the Scene needs, before the QApplication
    from PySide6.QtCore import qInstallMessageHandler
    from PySide6.QtWidgets import QApplication

    from app.report_writer import write_report

    qInstallMessageHandler(lambda *_: None)
    application = QApplication.instance() or QApplication(["framewright"])  # noqa: F841 - kept alive
    return write_report(out, record, free)
