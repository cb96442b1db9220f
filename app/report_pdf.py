"""The inspection record as PDF, with Qt's own support: the body HTML (app/report_html.py) laid out by a
QTextDocument on A4 pages and painted into a QPdfWriter, with a footer on every page: the session file's
SHA-256, the record's SHA-256 and "page N of M". The record's numbers go into the document's XMP
metadata (core/record_files.py says why there). `paint_pages` paints the same pages onto any paint
device, so a page can be drawn into an image exactly as it is drawn into the PDF (the README's picture)."""

from __future__ import annotations

from PySide6.QtCore import QByteArray, QMarginsF, QRectF, QSizeF, Qt, QUrl
from PySide6.QtGui import (QAbstractTextDocumentLayout, QColor, QFont, QImage, QPageLayout, QPageSize, QPainter,
                           QPdfWriter, QTextDocument)

from app.report_html import STYLE, body_html
from core.inspection_record import Record
from core.record_files import xmp_packet

RESOLUTION = 300                 # dots per inch of the page layout (the PDF itself stays vector)
MARGIN_MM = 15.0
FOOTER_MM = 9.0                  # room under the body for the footer


def _document(record: Record, when: str, pngs: dict, missing: dict, free_values, width_px: float,
              resolution: int) -> QTextDocument:
    doc = QTextDocument()
    doc.setDocumentMargin(0)
    doc.setDefaultFont(_font(9))
    doc.setDefaultStyleSheet(STYLE)
    pictures: dict = {}
    for index, png in pngs.items():
        url = f"picture-{index}.png"
        image = QImage.fromData(png, "PNG")
        doc.addResource(QTextDocument.ResourceType.ImageResource, QUrl(url), image)
        pictures[index] = url
        # 125 mm wide on the page: QTextDocument reads an image's width in pixels of 1/96 inch and scales
        # them to the paint device's resolution itself
        pictures[("width", index)] = int(round(125 / 25.4 * 96))
    pictures.update({("missing", i): why for i, why in missing.items()})
    html = body_html(record, when, pictures, free_values)
    # QTextDocument sizes fonts in points against the paint device's resolution; pixel sizes in the style
    # sheet (borders, margins) are scaled here to look as they do in the HTML file at 96 dpi.
    doc.setHtml(f"<html><body>{html}</body></html>")
    doc.setTextWidth(width_px)
    return doc


def _font(points: float) -> QFont:
    """The report's font, without ligatures: text copied or searched in the PDF reads "file", not "ﬁle"."""
    font = QFont("DejaVu Sans")
    font.setPointSizeF(points)
    for tag in ("liga", "clig", "dlig"):
        font.setFeature(QFont.Tag(tag), 0)
    return font


def _page_geometry(resolution: int) -> tuple[QSizeF, float, float]:
    """(A4 page size in device pixels, margin, footer height), both in device pixels."""
    mm = resolution / 25.4
    size = QPageSize(QPageSize.PageSizeId.A4).size(QPageSize.Unit.Millimeter)
    return QSizeF(size.width() * mm, size.height() * mm), MARGIN_MM * mm, FOOTER_MM * mm


class Pages:
    """The laid-out record: `count` pages, each painted by `paint(painter, number)`."""

    def __init__(self, record: Record, when: str, pngs: dict, missing: dict, free_values=None,
                 resolution: int = RESOLUTION, paint_device=None):
        self.record = record
        self.resolution = resolution
        self.page, self.margin, self.footer = _page_geometry(resolution)
        self.body = QSizeF(self.page.width() - 2 * self.margin, self.page.height() - 2 * self.margin - self.footer)
        self.doc = _document(record, when, pngs, missing, free_values, self.body.width(), resolution)
        if paint_device is not None:
            self.doc.documentLayout().setPaintDevice(paint_device)
            self.doc.setTextWidth(self.body.width())
        self.doc.setPageSize(self.body)
        self.count = self.doc.pageCount()

    def paint(self, painter: QPainter, number: int) -> None:
        """Page `number` (1-based) with its footer, the page's top left at the painter's origin."""
        top = (number - 1) * self.body.height()
        painter.save()
        painter.translate(self.margin, self.margin - top)
        context = QAbstractTextDocumentLayout.PaintContext()
        context.clip = QRectF(0, top, self.body.width(), self.body.height())
        painter.setClipRect(context.clip)
        self.doc.documentLayout().draw(painter, context)
        painter.restore()
        painter.save()
        painter.setFont(_font(7))
        painter.setPen(QColor(60, 60, 60))
        y = self.page.height() - self.margin - self.footer * 0.8
        line = QRectF(self.margin, y, self.body.width(), self.footer * 0.4)
        below = line.translated(0, self.footer * 0.4)
        painter.drawLine(int(self.margin), int(y), int(self.margin + self.body.width()), int(y))
        left = int(Qt.AlignmentFlag.AlignLeft | Qt.AlignmentFlag.AlignVCenter)
        painter.drawText(line, left, f"Session file SHA-256 {self.record.session_sha256}")
        # the record's own hash too: a page taken from another record of the same session shows it
        painter.drawText(below, left, f"Record SHA-256 {self.record.sha256()}")
        painter.drawText(line, int(Qt.AlignmentFlag.AlignRight | Qt.AlignmentFlag.AlignVCenter),
                         f"page {number} of {self.count}")
        painter.restore()


def write_pdf(target, record: Record, when: str, pngs: dict, missing: dict, free_values=None) -> int:
    """Write the PDF; returns the number of pages."""
    writer = QPdfWriter(target)  # a file name or a QIODevice
    writer.setResolution(RESOLUTION)
    writer.setPageLayout(QPageLayout(QPageSize(QPageSize.PageSizeId.A4), QPageLayout.Orientation.Portrait,
                                     QMarginsF(0, 0, 0, 0)))
    writer.setTitle(record.title)
    writer.setCreator("Framewright")
    writer.setDocumentXmpMetadata(QByteArray(xmp_packet(record.title, _json(record))))
    pages = Pages(record, when, pngs, missing, free_values, RESOLUTION, writer)
    painter = QPainter()
    if not painter.begin(writer):
        raise OSError("could not start writing the PDF")
    try:
        for number in range(1, pages.count + 1):
            if number > 1:
                writer.newPage()
            pages.paint(painter, number)
    finally:
        painter.end()
    return pages.count


def page_image(record: Record, when: str, pngs: dict, missing: dict, number: int = 1, width: int = 1000,
               free_values=None) -> QImage:
    """Page `number` drawn into an image by the same painting, at the same resolution, as the PDF (white
    paper), then scaled to `width` pixels."""
    resolution = RESOLUTION
    page, _, _ = _page_geometry(resolution)
    image = QImage(int(page.width()), int(page.height()), QImage.Format.Format_RGB32)
    image.setDotsPerMeterX(int(resolution / 0.0254))
    image.setDotsPerMeterY(int(resolution / 0.0254))
    image.fill(QColor("white"))
    pages = Pages(record, when, pngs, missing, free_values, resolution, image)
    painter = QPainter(image)
    painter.setRenderHint(QPainter.RenderHint.Antialiasing)
    painter.setRenderHint(QPainter.RenderHint.TextAntialiasing)
    painter.setRenderHint(QPainter.RenderHint.SmoothPixmapTransform)
    pages.paint(painter, min(number, pages.count))
    painter.end()
    return image.scaledToWidth(width, Qt.TransformationMode.SmoothTransformation)


def _json(record: Record) -> str:
    import json

    return json.dumps(record.embedded(), ensure_ascii=False, allow_nan=False, sort_keys=True)
