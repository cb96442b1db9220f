"""Reading a report back, the refusals a user reads for a PDF whose metadata holds no record, more than one
or a cut-short one, and for an HTML file that is not UTF-8; and the XMP packet a PDF carries is well-formed
XML with its namespaces declared, so any XML or PDF tool can read the same record.

Check values: hand-made files (worked by hand: which markers they hold); Python's xml.etree.ElementTree
(the standard library's XML parser) reads the packet; the namespace names are the XMP specification's
"adobe:ns:meta/" (from memory), the W3C RDF syntax namespace and Dublin Core elements 1.1 (published)."""

import json
import xml.etree.ElementTree as ElementTree

import pytest

from core.record_files import (XMP_END, XMP_START, ReportFileError, read_html_report, read_pdf_report,
                               xmp_packet)

RECORD = '{"figures": [{"key": "a<b", "values": ["1 & 2"]}]}'


def _pdf(metadata: bytes) -> bytes:
    # A hand-made file: only the header and the metadata stream matter to the reader.
    return b"%PDF-1.4\n1 0 obj\n<< /Type /Metadata >>\nstream\n" + metadata + b"\nendstream\nendobj\n%%EOF\n"


def test_a_pdf_with_no_record_in_its_metadata_says_none():
    with pytest.raises(ReportFileError) as refused:
        read_pdf_report(_pdf(b"<x:xmpmeta></x:xmpmeta>"), "plain.pdf")
    assert str(refused.value) == "plain.pdf: expected one Framewright record in the document's metadata, found none"


def test_a_pdf_with_two_records_in_its_metadata_says_more_than_one():
    packet = xmp_packet("t", RECORD)
    with pytest.raises(ReportFileError) as refused:
        read_pdf_report(_pdf(packet + b"\n" + packet), "two.pdf")
    assert str(refused.value) == \
        "two.pdf: expected one Framewright record in the document's metadata, found more than one"


def test_a_pdf_whose_record_has_no_end_marker_is_cut_short():
    packet = xmp_packet("t", RECORD)
    cut = packet[:packet.index(XMP_END)]                   # worked by hand: the start marker, no end marker
    assert XMP_START in cut
    with pytest.raises(ReportFileError) as refused:
        read_pdf_report(_pdf(cut), "cut.pdf")
    assert str(refused.value) == "cut.pdf: the record in the document's metadata is cut short"
    # the other side: the whole packet, end marker included, reads back
    assert read_pdf_report(_pdf(packet), "whole.pdf") == json.loads(RECORD)


def test_an_html_file_that_is_not_utf8_is_refused_by_name():
    page = '<html><p>Kamera 30°</p></html>'.encode("latin-1")   # RFC 3629: a lone 0xb0 byte is not UTF-8
    with pytest.raises(ReportFileError) as refused:
        read_html_report(page, "latin.html")
    assert str(refused.value) == "latin.html: not UTF-8 text, so not an HTML report"


def test_the_xmp_packet_is_well_formed_xml_with_its_namespaces_declared():
    packet = xmp_packet("Title <&>", RECORD)
    root = ElementTree.fromstring(packet)
    assert root.tag == "{adobe:ns:meta/}xmpmeta"
    rdf = "{http://www.w3.org/1999/02/22-rdf-syntax-ns#}"
    dc = "{http://purl.org/dc/elements/1.1/}"
    description = root.find(f"{rdf}RDF/{rdf}Description")
    assert description is not None and description.text is None   # no stray text inside the description
    assert description.find(f"{dc}title/{rdf}Alt/{rdf}li").text == "Title <&>"
    assert description.find(f"{dc}format").text == "application/pdf"
    record = description.find("{https://framewright.invalid/ns/record/1/}record")
    assert record is not None and record.text == RECORD     # the XML parser unescapes it to the same JSON
