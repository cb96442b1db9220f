"""The About box: version, licence and the safety caution."""

from __future__ import annotations

from importlib import metadata

from PySide6.QtWidgets import QMessageBox, QWidget

from core.formats import SAFETY_CAUTION

CAUTION = ("A wrong orientation can point a safety-relevant sensor the wrong way. "
           f"{SAFETY_CAUTION[0].upper()}{SAFETY_CAUTION[1:].rstrip('.')}.")
LICENSE = "MIT License"


def version() -> str:
    try:
        return metadata.version("framewright")
    except metadata.PackageNotFoundError:
        return "0.1.0 (not installed)"


def about_text() -> str:
    return (f"<h3>Framewright {version()}</h3>"
            "<p>A desktop workbench for decoding, checking, chaining and handing on 3D orientations.</p>"
            f"<p>{LICENSE}.</p>"
            f"<p><b>Caution.</b> {CAUTION}</p>")


def show_about(parent: QWidget | None) -> None:
    QMessageBox.about(parent, "About Framewright", about_text())
