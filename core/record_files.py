"""Reading a written inspection record back, for `framewright verify-report`: the JSON block of an HTML
report and the figures its page prints, and the JSON a PDF report carries in its XMP metadata packet.
Plain Python (html.parser, no PDF library, no Qt), so checking a report needs nothing but this program.

The PDF carries the numbers in its document metadata (an XMP packet, the PDF standard's place for
metadata about the document), between XMP_START and XMP_END, XML-escaped. Qt writes the packet as an
uncompressed stream, so it is read here by finding those markers in the bytes, with no PDF parser; any
PDF tool shows the same packet (pypdf's `xmp_metadata`, exiftool, a viewer's document properties)."""

from __future__ import annotations

import json
from html import unescape
from html.parser import HTMLParser

from core.errors import FramewrightError

JSON_ELEMENT_ID = "framewright-record"
XMP_START, XMP_END = b"<framewright:record>", b"</framewright:record>"
MAX_REPORT_BYTES = 100_000_000


class ReportFileError(FramewrightError):
    """A file that is not a Framewright report, or one whose embedded numbers cannot be read."""


def xmp_packet(title: str, record_json: str) -> bytes:
    """The XMP packet a PDF report carries: its title and the record's JSON, XML-escaped."""
    from xml.sax.saxutils import escape

    return ('<?xpacket begin="\ufeff" id="W5M0MpCehiHzreSzNTczkc9d"?>'
            '<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">'
            '<rdf:Description rdf:about="" xmlns:dc="http://purl.org/dc/elements/1.1/" '
            'xmlns:framewright="https://framewright.invalid/ns/record/1/">'
            f'<dc:title><rdf:Alt><rdf:li xml:lang="x-default">{escape(title)}</rdf:li></rdf:Alt></dc:title>'
            f"<dc:format>application/pdf</dc:format>"
            f"<framewright:record>{escape(record_json)}</framewright:record>"
            '</rdf:Description></rdf:RDF></x:xmpmeta><?xpacket end="w"?>').encode("utf-8")


class _ReportParser(HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.json_parts: list[str] | None = None
        self.json_blocks = 0
        self.printed: dict[str, dict[int, str]] = {}
        self._span: tuple[str, int] | None = None
        self._text: list[str] = []

    def handle_starttag(self, tag, attrs):
        attrs = dict(attrs)
        if tag == "script" and attrs.get("id") == JSON_ELEMENT_ID:
            self.json_blocks += 1
            self.json_parts = []
        elif tag == "span" and "data-figure" in attrs:
            try:
                self._span = (attrs["data-figure"] or "", int(attrs.get("data-index") or "0"))
            except ValueError:
                self._span = (attrs["data-figure"] or "", -1)
            self._text = []

    def handle_endtag(self, tag):
        if tag == "span" and self._span is not None:
            key, index = self._span
            self.printed.setdefault(key, {})[index] = "".join(self._text)
            self._span = None

    def handle_data(self, data):
        if self._span is not None:
            self._text.append(data)
        if self.json_parts is not None and self.lasttag == "script":
            self.json_parts.append(data)


def _json_object(text: str, where: str) -> dict:
    try:
        data = json.loads(text)
    except (ValueError, RecursionError) as error:
        raise ReportFileError(f"{where}: the embedded numbers are not valid JSON ({error})") from None
    if not isinstance(data, dict) or not isinstance(data.get("figures"), list):
        raise ReportFileError(f"{where}: the embedded numbers are not a Framewright record")
    return data


def read_html_report(raw: bytes, where: str) -> tuple[dict, dict]:
    """(the JSON block, the printed figures {key: {index: text}}) of an HTML report."""
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError:
        raise ReportFileError(f"{where}: not UTF-8 text, so not an HTML report") from None
    parser = _ReportParser()
    parser.feed(text)
    parser.close()
    if parser.json_blocks != 1 or parser.json_parts is None:
        raise ReportFileError(f"{where}: expected one JSON block <script id=\"{JSON_ELEMENT_ID}\">, found "
                              f"{parser.json_blocks}; not a Framewright report")
    return _json_object("".join(parser.json_parts), where), parser.printed


def read_pdf_report(raw: bytes, where: str) -> dict:
    """The JSON a PDF report carries in its XMP packet."""
    if not raw.startswith(b"%PDF-"):
        raise ReportFileError(f"{where}: not a PDF file")
    start = raw.find(XMP_START)
    if start < 0 or raw.find(XMP_START, start + 1) >= 0:
        raise ReportFileError(f"{where}: expected one Framewright record in the document's metadata, found "
                              f"{'none' if start < 0 else 'more than one'}")
    end = raw.find(XMP_END, start)
    if end < 0:
        raise ReportFileError(f"{where}: the record in the document's metadata is cut short")
    try:
        text = unescape(raw[start + len(XMP_START):end].decode("utf-8"))
    except UnicodeDecodeError:
        raise ReportFileError(f"{where}: the record in the document's metadata is not UTF-8 text") from None
    return _json_object(text, where)


def read_report(path: str) -> tuple[dict, dict | None, str]:
    """(embedded numbers, printed figures or None for a PDF, 'html' or 'pdf') of a report file."""
    try:
        with open(path, "rb") as handle:
            raw = handle.read(MAX_REPORT_BYTES + 1)
    except OSError as error:
        raise ReportFileError(f"{path}: cannot be read ({error.strerror or error})") from None
    if len(raw) > MAX_REPORT_BYTES:
        raise ReportFileError(f"{path}: larger than {MAX_REPORT_BYTES // 1_000_000} MB; not a report")
    if raw.startswith(b"%PDF-"):
        return read_pdf_report(raw, path), None, "pdf"
    data, printed = read_html_report(raw, path)
    return data, printed, "html"


def first_printed_difference(numbers: dict, printed: dict) -> str | None:
    """The first figure whose printed value differs from the JSON block's, in words; None when every
    figure is printed as the block says (and nothing else is printed as a figure)."""
    seen = set()
    for figure in numbers.get("figures", []):
        key = figure.get("key")
        values = figure.get("values") or []
        shown = printed.get(key, {})
        seen.add(key)
        for i, value in enumerate(values):
            if shown.get(i) != value:
                found = "nothing" if i not in shown else repr(shown[i])
                return f"{key} ({figure.get('label')}): the page prints {found} where its numbers say {value!r}"
        extra = sorted(set(shown) - set(range(len(values))))
        if extra:
            return f"{key} ({figure.get('label')}): the page prints a value the numbers do not hold"
    unknown = sorted(set(printed) - seen)
    if unknown:
        return f"{unknown[0]}: the page prints a figure its numbers do not hold"
    return None
