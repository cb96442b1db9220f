"""Writing an inspection record to a file: the record (core/inspection_record.py) with its Scene pictures
(app/report_picture.py), as PDF (app/report_pdf.py) or one self-contained HTML file (app/report_html.py),
written whole or not at all (core/atomic_file.py). Used by File ▸ Export report… and `framewright report`."""

from __future__ import annotations

from dataclasses import dataclass
from datetime import datetime
from pathlib import Path

from PySide6.QtCore import QBuffer, QIODevice

from app import report_html, report_pdf
from app.report_picture import PictureMaker
from core import atomic_file
from core.inspection_record import Record

KINDS = {".pdf": "pdf", ".html": "html", ".htm": "html"}


@dataclass(frozen=True)
class Written:
    path: str
    kind: str
    pages: int | None             # PDF pages (None for HTML)
    pictures: int
    picture_problem: str | None   # why pictures were left out (None: every one was drawn)


def kind_of(path: str) -> str | None:
    """'pdf' or 'html' by the file's suffix; None for any other."""
    return KINDS.get(Path(path).suffix.lower())


def now_text() -> str:
    """The date and time with the time zone, e.g. '2026-12-01 14:03:22 +01:00 (CET)'."""
    now = datetime.now().astimezone()
    offset = now.strftime("%z")
    return f"{now:%Y-%m-%d %H:%M:%S} {offset[:3]}:{offset[3:]} ({now.tzname()})"


def pictures_for(record: Record, camera_from=None) -> tuple[dict, dict, str | None]:
    """({section index: PNG bytes}, {section index: why left out}, the problem if any was left out)."""
    maker = PictureMaker(camera_from)
    pngs, missing = {}, {}
    try:
        for index, section in enumerate(record.sections):
            if section.picture is None:
                continue
            png = maker.png(section.picture)
            if png is None:
                missing[index] = maker.problem
            else:
                pngs[index] = png
    finally:
        maker.close()
    return pngs, missing, maker.problem if missing else None


def report_bytes(record: Record, kind: str, when: str, pngs: dict, missing: dict,
                 free_values: dict | None = None) -> tuple[bytes, int | None]:
    if kind == "html":
        return report_html.html_file(record, when, pngs, missing, free_values).encode("utf-8"), None
    buffer = QBuffer()
    buffer.open(QIODevice.OpenModeFlag.WriteOnly)
    pages = report_pdf.write_pdf(buffer, record, when, pngs, missing, free_values)
    buffer.close()
    return bytes(buffer.data()), pages


def write_report(path: str, record: Record, free_values: dict | None = None, when: str | None = None,
                 camera_from=None) -> Written:
    """Write the record to `path` (its suffix says PDF or HTML). Raises OSError when it cannot be written;
    the file is then unchanged."""
    kind = kind_of(path)
    if kind is None:
        raise ValueError(f"{path}: expected a file name ending in .pdf or .html")
    pngs, missing, problem = pictures_for(record, camera_from)
    raw, pages = report_bytes(record, kind, when or now_text(), pngs, missing, free_values)
    atomic_file.write_atomically(path, raw)
    return Written(str(path), kind, pages, len(pngs), problem)
