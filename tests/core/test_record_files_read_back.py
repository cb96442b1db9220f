"""Reading a written report back: the HTML page's JSON block and printed figures, the PDF's XMP packet, and
the refusals a user reads for a page or file that is not a Framewright report. The HTML is written by
app.report_html.html_file (plain Python, no Qt) from the invented demo session; the PDF is built by hand.
Check values: the record itself (record.embedded(), its figures' printed values) and hand-made pages."""

import json
from pathlib import Path

import pytest

from app.report_html import html_file
from core import inspection_record as records
from core.record_files import (ReportFileError, first_printed_difference, read_html_report, read_pdf_report,
                               read_report, xmp_packet)
from core.session import load_session

ROOT = Path(__file__).resolve().parents[2]
SESSION = load_session(ROOT / "resources" / "demo_check.fwsession.json")
CHECK = "Radar antenna after remount"


def _record():
    return records.check_record(SESSION, CHECK, "demo_check.fwsession.json", "ab" * 32)


def _page(record) -> str:
    return html_file(record, "2026-01-01 00:00 UTC", {}, {})


def test_an_html_report_reads_back_its_json_and_every_printed_figure():
    record = _record()
    data, printed = read_html_report(_page(record).encode("utf-8"), "r.html")
    assert data == record.embedded()
    # The page prints each figure's values in order, index by index (the record's own printed strings).
    expected = {f["key"]: dict(enumerate(f["values"])) for f in record.embedded()["figures"]}
    assert printed == expected
    assert first_printed_difference(data, printed) is None


def test_a_page_with_one_number_changed_names_that_figure():
    record = _record()
    data, printed = read_html_report(_page(record).encode("utf-8"), "r.html")
    figure = data["figures"][0]
    changed = {k: dict(v) for k, v in printed.items()}
    changed[figure["key"]][0] = figure["values"][0] + "1"
    message = first_printed_difference(data, changed)
    assert message is not None and message.startswith(f"{figure['key']} ({figure['label']}): the page prints")
    assert repr(figure["values"][0] + "1") in message


def test_a_page_missing_a_printed_figure_or_printing_one_too_many_is_told():
    record = _record()
    data, printed = read_html_report(_page(record).encode("utf-8"), "r.html")
    key = data["figures"][0]["key"]
    missing = {k: v for k, v in printed.items() if k != key}
    assert "the page prints nothing where" in first_printed_difference(data, missing)
    extra = {k: dict(v) for k, v in printed.items()}
    extra[key][len(data["figures"][0]["values"])] = "9"
    assert first_printed_difference(data, extra).endswith("the page prints a value the numbers do not hold")
    stranger = {**printed, "not.a.key": {0: "1"}}
    assert first_printed_difference(data, stranger) == "not.a.key: the page prints a figure its numbers do not hold"


def test_a_span_without_a_figure_name_or_with_a_bad_index_is_kept_under_an_empty_name():
    page = ('<html><body><span data-figure="" data-index="x">7</span><span data-figure="" data-index="">8</span>'
            '<script type="application/json" id="framewright-record">{"figures": []}</script></body></html>')
    data, printed = read_html_report(page.encode("utf-8"), "p.html")
    assert data == {"figures": []}
    # worked by hand: a bad index reads as -1, an empty one as 0, both under the empty key
    assert printed == {"": {-1: "7", 0: "8"}}
    assert first_printed_difference(data, printed) == ": the page prints a figure its numbers do not hold"


def test_a_foreign_page_with_an_ordinary_script_is_refused_by_name():
    page = "<html><head><script>var x = 1;</script></head><body><p>hello</p></body></html>"
    with pytest.raises(ReportFileError) as refused:
        read_html_report(page.encode("utf-8"), "foreign.html")
    message = str(refused.value)
    assert message.startswith("foreign.html: expected one JSON block")
    assert '<script id="framewright-record">' in message and "found 0" in message
    assert message.endswith("not a Framewright report")


def test_two_record_blocks_are_refused_and_one_is_read():
    block = '<script type="application/json" id="framewright-record">{"figures": []}</script>'
    with pytest.raises(ReportFileError, match="found 2; not a Framewright report"):
        read_html_report(("<html>" + block + block + "</html>").encode("utf-8"), "two.html")
    assert read_html_report(("<html>" + block + "</html>").encode("utf-8"), "one.html") == ({"figures": []}, {})


def test_a_record_block_with_broken_json_names_the_file():
    page = '<html><script type="application/json" id="framewright-record">{"figures": [</script></html>'
    with pytest.raises(ReportFileError) as refused:
        read_html_report(page.encode("utf-8"), "broken.html")
    assert str(refused.value).startswith("broken.html: the embedded numbers are not valid JSON")


def _pdf(title: str, record_json: str) -> bytes:
    # A hand-made file: only the header and the metadata packet matter to the reader.
    return b"%PDF-1.4\n1 0 obj\n<< /Type /Metadata >>\nstream\n" + xmp_packet(title, record_json) + \
        b"\nendstream\nendobj\n%%EOF\n"


def test_a_pdf_packet_with_markup_characters_reads_back_to_the_same_numbers():
    numbers = {"figures": [{"key": "a<b", "values": ["1 & 2"]}], "note": "x > y, \u00b0 ok"}
    text = json.dumps(numbers, ensure_ascii=False)
    packet = xmp_packet("Title <&>", text)
    assert "\u00b0".encode("utf-8") in packet            # written as UTF-8 bytes
    assert b"a&lt;b" in packet and b"1 &amp; 2" in packet  # XML-escaped (the XML 1.0 escapes)
    assert read_pdf_report(_pdf("Title <&>", text), "r.pdf") == numbers


def test_a_pdf_without_its_header_is_refused():
    with pytest.raises(ReportFileError, match=r"^r.pdf: not a PDF file$"):
        read_pdf_report(b"PDF-1.4\n" + xmp_packet("t", '{"figures": []}'), "r.pdf")


def test_read_report_tells_pdf_from_html_by_the_first_bytes(tmp_path):
    record = _record()
    html = tmp_path / "r.html"
    html.write_text(_page(record), encoding="utf-8")
    data, printed, kind = read_report(str(html))
    assert kind == "html" and data == record.embedded() and printed
    pdf = tmp_path / "r.pdf"
    pdf.write_bytes(_pdf(record.title, json.dumps(record.embedded(), ensure_ascii=False)))
    assert read_report(str(pdf)) == (record.embedded(), None, "pdf")
