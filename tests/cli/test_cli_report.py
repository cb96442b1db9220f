"""`framewright report` and `framewright verify-report` through a subprocess, without a display (as a
server or a CI runner runs them): the report is written without the Scene picture and says so; the PDF's
text (read back with pypdf) and the HTML hold every field and figure; verify-report accepts the untouched
pair and rejects an edited number; hostile input is one stderr line and exit 2."""

import json
import re
import shutil
import time

import pytest
from pypdf import PdfReader

from core import inspection_record as records
from core.record_files import read_html_report, read_pdf_report
from core.session import load_session_and_bytes
from tests.cli.test_cli import ROOT, framewright

DEMO_CHECK = ROOT / "resources" / "demo_check.fwsession.json"
DEMO = ROOT / "resources" / "demo.fwsession.json"
CHECK = "Radar antenna after remount"


def _record(path=DEMO_CHECK, check=CHECK):
    session, raw = load_session_and_bytes(path)
    digest = records.sha256_of_bytes(raw)
    if check is None:
        return records.session_record(session, path.name, digest)
    return records.check_record(session, check, path.name, digest)


@pytest.fixture(scope="module")
def written(tmp_path_factory):
    folder = tmp_path_factory.mktemp("reports")
    out = {}
    for suffix in ("pdf", "html"):
        result = framewright("report", str(DEMO_CHECK), "--check", CHECK, "-o", str(folder / f"check.{suffix}"),
                             "--operator", "A. Technician")
        out[suffix] = (folder / f"check.{suffix}", result)
    return out


@pytest.mark.parametrize("suffix", ["pdf", "html"])
def test_without_a_display_the_report_is_written_without_the_picture_and_says_so(written, suffix):
    path, result = written[suffix]
    assert result.returncode == 0 and result.stderr == "", result.stderr
    assert path.is_file()
    assert "note: the Scene picture is left out: no display" in result.stdout
    assert f"record SHA-256 {_record().sha256()}" in result.stdout


def _pdf_text(path):
    reader = PdfReader(str(path))
    pages = [" ".join(page.extract_text().split()) for page in reader.pages]   # tabs, line breaks -> spaces
    return reader, pages


def test_the_pdf_text_holds_every_field_every_figure_and_the_caution_and_every_page_its_number(written):
    reader, pages = _pdf_text(written["pdf"][0])
    text = " ".join(" ".join(pages).split())
    record = _record()
    for field in ("Session file", "demo_check.fwsession.json", record.session_sha256, record.sha256(),
                  "Date and time", "Reference frame", "NED (x north, y east, z down)", "Operator", "A. Technician",
                  "Instrument", "Instrument calibration due", "Signature", "FAIL", "does not conform",
                  "The Scene picture is left out", "ISO 14253-1"):
        assert field in text, field
    # The caution is the one the About box and the README carry (core/formats.SAFETY_CAUTION).
    assert " ".join(records.CAUTION.split()) in text
    squeezed = text.replace(" ", "")
    for figure in record.figures():
        for value in figure.values:
            assert value.replace(" ", "") in squeezed, (figure.key, value)
        assert figure.unit.replace(" ", "") in squeezed
    for number, page in enumerate(pages, start=1):
        assert f"page {number} of {len(pages)}" in page
        assert record.session_sha256 in page
        assert f"Record SHA-256 {record.sha256()}" in page
    # the numbers, in the document's XMP metadata, are the record's own
    assert read_pdf_report(written["pdf"][0].read_bytes(), "pdf") == record.embedded()
    assert reader.metadata.title == record.title


def test_the_html_parses_and_holds_the_json_block_and_prints_what_it_says(written):
    raw = written["html"][0].read_bytes()
    data, printed = read_html_report(raw, "html")
    record = _record()
    assert data == record.embedded()
    for figure in record.figures():
        assert [printed[figure.key][i] for i in range(len(figure.values))] == list(figure.values)
    text = raw.decode()
    assert "<img" not in text and "The Scene picture is left out" in text
    assert text.count('type="application/json"') == 1


def test_a_typed_angle_prints_as_typed(written):
    # The demo's radar antenna was typed as yaw, pitch, roll = -30, 5, 2.5 (resources/demo.fwsession.json's
    # notes); the quaternion stored in the file brings them back as -30.000000000000004 and the like.
    data, printed = read_html_report(written["html"][0].read_bytes(), "html")
    nominal = next(f for f in data["figures"] if f["key"].endswith(".angles") and f["values"][0] == "-30")
    assert nominal["values"] == ["-30", "5", "2.5"] and nominal["unit"] == "deg"


@pytest.mark.parametrize("suffix", ["pdf", "html"])
def test_verify_report_accepts_the_untouched_pair(written, suffix):
    result = framewright("verify-report", str(written[suffix][0]), str(DEMO_CHECK))
    assert result.returncode == 0 and result.stderr == "", result.stderr
    assert "figures are this session's numbers" in result.stdout


def test_verify_report_rejects_an_edited_number_in_the_json_block(written, tmp_path):
    text = written["html"][0].read_text()
    block = text[text.index('id="framewright-record">'):]
    edited_block = block.replace('"3.02654315"', '"3.02654316"', 1)
    assert edited_block != block
    path = tmp_path / "edited.html"
    path.write_text(text.replace(block, edited_block))
    result = framewright("verify-report", str(path), str(DEMO_CHECK))
    assert result.returncode == 1 and result.stderr == ""
    assert "check[0].total_deviation" in result.stdout and "3.02654316" in result.stdout


def test_verify_report_rejects_an_edited_printed_number(written, tmp_path):
    text = written["html"][0].read_text()
    edited = re.sub(r'(data-figure="check\[0\]\.pointing_error" data-index="0">)3<', r"\g<1>0.3<", text)
    assert edited != text
    path = tmp_path / "edited.html"
    path.write_text(edited)
    result = framewright("verify-report", str(path), str(DEMO_CHECK))
    assert result.returncode == 1
    assert "check[0].pointing_error" in result.stdout and "'0.3'" in result.stdout


def test_verify_report_rejects_an_edited_number_in_the_pdf_metadata(written, tmp_path):
    raw = written["pdf"][0].read_bytes()
    edited = raw.replace(b"&quot;0.4&quot;", b"&quot;0.9&quot;", 1) if b"&quot;0.4&quot;" in raw else \
        raw.replace(b'"0.4"', b'"0.9"', 1)
    assert edited != raw
    path = tmp_path / "edited.pdf"
    path.write_bytes(edited)
    result = framewright("verify-report", str(path), str(DEMO_CHECK))
    assert result.returncode == 1 and "check[0]" in result.stdout or "mount[" in result.stdout


def test_verify_report_says_a_report_of_another_session_is_not_its_record(written):
    result = framewright("verify-report", str(written["html"][0]), str(DEMO))
    assert result.returncode == 1 and result.stderr == ""
    assert result.stdout.startswith("NOT the record of this session")


def test_a_session_edited_after_the_report_is_caught(written, tmp_path):
    data = json.loads(DEMO_CHECK.read_text())
    data["checks"][0]["settings"]["pointing_tolerance_deg"] = 3.5
    session = tmp_path / "edited.fwsession.json"
    session.write_text(json.dumps(data))
    result = framewright("verify-report", str(written["html"][0]), str(session))
    assert result.returncode == 1 and "check[0].criterion[0]" in result.stdout


def test_the_same_numbers_in_a_resaved_file_verify_with_a_note(written, tmp_path):
    session = tmp_path / "resaved.fwsession.json"
    session.write_text(json.dumps(json.loads(DEMO_CHECK.read_text())))     # other bytes, same numbers
    result = framewright("verify-report", str(written["html"][0]), str(session))
    assert result.returncode == 0 and "note: the session file is not byte for byte" in result.stdout


def _refused(result, starts):
    lines = result.stderr.strip().splitlines()
    assert result.returncode == 2 and result.stdout == "", (result.stdout, result.stderr)
    assert len(lines) == 1 and lines[0].startswith(starts), result.stderr
    return lines[0]


def test_hostile_inputs_are_one_line_and_exit_2(tmp_path):
    damaged = tmp_path / "damaged.fwsession.json"
    damaged.write_text(DEMO_CHECK.read_text()[:300])
    _refused(framewright("report", str(damaged), "-o", str(tmp_path / "r.pdf")), "framewright report: ")
    line = _refused(framewright("report", str(DEMO_CHECK), "--check", "no such check", "-o", str(tmp_path / "r.pdf")),
                    "framewright report: no check named 'no such check'")
    assert CHECK in line
    line = _refused(framewright("report", str(DEMO_CHECK), "-o", str(tmp_path / "missing" / "r.pdf")),
                    "framewright report: ")
    assert "does not exist" in line
    _refused(framewright("report", str(DEMO_CHECK), "-o", str(tmp_path / "r.txt")), "framewright report: ")
    copy = tmp_path / "copy.fwsession.json"
    shutil.copy(DEMO_CHECK, copy)
    _refused(framewright("report", str(copy), "-o", str(copy)), "framewright report: ")
    assert copy.read_bytes() == DEMO_CHECK.read_bytes()
    _refused(framewright("report", str(DEMO_CHECK), "--check", CHECK, "--all", "-o", str(tmp_path / "r.pdf")),
             "framewright report: usage: ")
    _refused(framewright("report", str(DEMO_CHECK), "--operator", "a\x1b[2Jb", "-o", str(tmp_path / "r.pdf")),
             "framewright report: operator: ")
    assert not (tmp_path / "r.pdf").exists()
    not_a_report = tmp_path / "plain.html"
    not_a_report.write_text("<html><body>hello</body></html>")
    _refused(framewright("verify-report", str(not_a_report), str(DEMO_CHECK)), "framewright verify-report: ")
    _refused(framewright("verify-report", str(tmp_path / "absent.pdf"), str(DEMO_CHECK)), "framewright verify-report: ")
    fake_pdf = tmp_path / "fake.pdf"
    fake_pdf.write_bytes(b"%PDF-1.4\n" + b"x" * 1000)
    _refused(framewright("verify-report", str(fake_pdf), str(DEMO_CHECK)), "framewright verify-report: ")


def test_the_time_to_write_a_session_report_of_every_demo_mount(tmp_path, capsys):
    # Reported, never asserted (DEVELOPERS.md: no timed assertion in the suite).
    started = time.perf_counter()
    result = framewright("report", str(DEMO), "--all", "-o", str(tmp_path / "session.pdf"))
    seconds = time.perf_counter() - started
    assert result.returncode == 0, result.stderr
    reader, texts = _pdf_text(tmp_path / "session.pdf")
    pages = len(texts)
    assert all(f"Mount {i}: {m.name}" in " ".join(texts) for i, m in enumerate(
        load_session_and_bytes(DEMO)[0].mounts, start=1))
    with capsys.disabled():
        print(f"\n[report] session report of the demo's 5 mounts (no display): {seconds:.2f} s, {pages} pages")


def _as_version(text, version, drop_ends=()):
    """The HTML report as a report of record `version` would be: the figures ending in `drop_ends` taken
    out of its JSON block and its page, the block's own hash made again."""
    start = text.index('id="framewright-record">') + len('id="framewright-record">')
    end = text.index("</script>", start)
    data = json.loads(text[start:end])
    data["figures"] = [f for f in data["figures"] if not f["key"].endswith(drop_ends)]
    data["version"] = version
    data.pop("record_sha256")
    data["record_sha256"] = records.numbers_sha256(data)
    page = re.sub(r'<span data-figure="[^"]*\.(?:gibbs|mrp)" data-index="\d">[^<]*</span>', "",
                  text[:start]) if drop_ends else text[:start]
    return page + json.dumps(data) + text[end:]


def test_a_report_written_before_the_gibbs_and_mrp_figures_still_verifies(written, tmp_path):
    text = written["html"][0].read_text()
    assert '.gibbs" data-index="0"' in text and '.mrp" data-index="0"' in text
    old = tmp_path / "old.html"
    old.write_text(_as_version(text, 1, (".gibbs", ".mrp")))
    result = framewright("verify-report", str(old), str(DEMO_CHECK))
    assert result.returncode == 0 and "figures are this session's numbers" in result.stdout, result.stdout
    # the same page claiming the present version is missing figures
    claimed = tmp_path / "claimed.html"
    claimed.write_text(_as_version(text, 2, (".gibbs", ".mrp")))
    result = framewright("verify-report", str(claimed), str(DEMO_CHECK))
    assert result.returncode == 1 and "gibbs" in result.stdout and "missing from the report" in result.stdout


def test_a_report_of_a_newer_record_version_is_refused_by_name(written, tmp_path):
    newer = tmp_path / "newer.html"
    newer.write_text(_as_version(written["html"][0].read_text(), 3))
    line = _refused(framewright("verify-report", str(newer), str(DEMO_CHECK)), "framewright verify-report: ")
    assert "record version 3" in line and "newer Framewright" in line


def test_a_table_heads_its_right_aligned_numbers_with_right_aligned_headings(written):
    # A margin of -2 printed flush right under a left-aligned "margin" heading reads as the unit's column.
    text = written["html"][0].read_text()
    head = text[text.index('<tr><th align="left">figure</th><th align="right">value</th>'):]
    head = head[:head.index("</tr>")]
    assert '<th align="right">tolerance</th><th align="right">margin</th><th align="left">unit</th>' in head
    level = text[text.index('<th align="left">face</th>'):]
    assert level.startswith('<th align="left">face</th><th align="right">tilt from level</th>')


def test_the_html_printed_from_a_browser_numbers_its_pages_and_carries_both_hashes(written):
    text = written["html"][0].read_text()
    style = text[text.index("<style>"):text.index("</style>")]
    record = _record()
    page = style[style.index("@page"):]
    assert 'content: "page " counter(page) " of " counter(pages)' in page
    assert f"Session file SHA-256 {record.session_sha256}" in page and f"Record SHA-256 {record.sha256()}" in page


def test_the_date_and_time_carry_the_time_zone(tmp_path, monkeypatch):
    # India Standard Time is UTC+05:30 with no daylight saving (a handbook fact): a half-hour offset that a
    # report printing only whole hours or only UTC would get wrong.
    monkeypatch.setenv("TZ", "Asia/Kolkata")
    out = tmp_path / "zoned.html"
    result = framewright("report", str(DEMO_CHECK), "--check", CHECK, "-o", str(out))
    assert result.returncode == 0, result.stderr
    row = re.search(r"<b>Date and time</b></td><td>([^<]*)</td>", out.read_text())
    assert row is not None
    assert re.fullmatch(r"\d{4}-\d\d-\d\d \d\d:\d\d:\d\d \+05:30 \(IST\)", row.group(1)), row.group(1)
