"""The inspection record (core/inspection_record.py) as HTML: one self-contained file for a browser (the
Scene picture as a data URI, the numbers as a JSON block), and the same body for Qt's QTextDocument, which
lays out the PDF pages (app/report_pdf.py). Plain Python, no Qt: only the subset of HTML and CSS that
QTextDocument draws is used, so the PDF and the HTML file look alike.

Every printed figure value sits in ``<span data-figure="KEY" data-index="I">``, so `verify-report` can
read back what the page prints and compare it with the JSON block and with the session
(core/record_files.py)."""

from __future__ import annotations

import base64
import json
from html import escape

from core.inspection_record import Figure, Record, Table

JSON_ELEMENT_ID = "framewright-record"
PICTURE_MISSING = "The Scene picture is left out: {why}."
PICTURE_ASPECT = 640 / 1040          # height over width of app/report_picture.PICTURE_SIZE


def _e(text) -> str:
    return escape(str(text), quote=True)


def _values(figure: Figure) -> str:
    spans = [f'<span data-figure="{_e(figure.key)}" data-index="{i}">{_e(v)}</span>'
             for i, v in enumerate(figure.values)]
    if figure.shape == (3, 3):
        rows = "".join("<tr>" + "".join(f'<td align="right">{spans[r * 3 + c]}</td>' for c in range(3)) + "</tr>"
                       for r in range(3))
        return f'<table class="matrix" cellspacing="0" cellpadding="2">{rows}</table>'
    return ", ".join(spans)


def _figure_rows(figures: list, header: bool = True) -> str:
    rows = "".join(f'<tr><td class="label" width="44%">{_e(f.label)}</td><td class="value" width="40%">'
                   f'{_values(f)}</td><td class="unit" width="16%">{_e(f.unit)}</td></tr>' for f in figures)
    return (f'<table class="figures" width="100%" cellspacing="0" cellpadding="3">'
            + (f'<tr><th align="left" width="44%">figure</th><th align="left" width="40%">value</th>'
               f'<th align="left" width="16%">unit</th></tr>' if header else "")
            + f"{rows}</table>")


def _table(table: Table) -> str:
    # the numbers are right-aligned, so their headings are too: each heading stands over its own column
    head = "".join(f'<th align="{"left" if i == 0 else "right"}">{_e(c)}</th>' for i, c in enumerate(table.columns))
    head += '<th align="left">unit</th>'
    body = ""
    for row in table.rows:
        cells = "".join(f'<td align="right"><span data-figure="{_e(row.key)}" data-index="{i}">{_e(v)}</span></td>'
                        for i, v in enumerate(row.values))
        body += f'<tr><td class="label">{_e(row.label)}</td>{cells}<td class="unit">{_e(row.unit)}</td></tr>'
    return (f'<p class="table-title">{_e(table.title)}</p>'
            f'<table class="figures" width="100%" cellspacing="0" cellpadding="3"><tr>{head}</tr>{body}</table>')


STYLE = """
body { font-size: 9pt; color: #111; font-variant-ligatures: none; }
h1 { font-size: 15pt; margin-bottom: 4px; }
h2 { font-size: 12pt; margin-top: 14px; margin-bottom: 4px; }
td, th { font-size: 9pt; vertical-align: top; }
th { background-color: #e8e8e8; }
td.label { color: #222; }
td.unit { color: #444; }
table.figures td, table.figures th { border-bottom: 1px solid #bbb; }
p.table-title { font-weight: bold; margin-top: 8px; margin-bottom: 2px; }
p.caution { background-color: #fff3d6; border: 1px solid #c98a00; padding: 4px; }
p.verdict-fail { font-size: 16pt; font-weight: bold; color: #b00000; }
p.verdict-pass { font-size: 16pt; font-weight: bold; color: #006400; }
p.missing { color: #7a4a00; font-style: italic; }
span.hash { font-family: 'DejaVu Sans Mono', monospace; font-size: 8pt; }
"""


def body_html(record: Record, when: str, pictures: dict, free_values: dict | None = None) -> str:
    """The record's body. pictures: {section index: image src, or None with the reason under key
    ('missing', index)}; when: the date and time with its time zone; free_values: what was typed into the
    free fields (blank lines to fill by hand otherwise)."""
    free_values = free_values or {}
    blank = "_" * 34
    head = [("Session file", _e(record.session_name)),
            ("Session file SHA-256", f'<span class="hash">{_e(record.session_sha256)}</span>'),
            ("Record SHA-256", f'<span class="hash">{_e(record.sha256())}</span>'),
            ("Date and time", _e(when)),
            ("Reference frame", _e(record.reference_frame))]
    head += [(name, _e(free_values.get(name) or blank)) for name in record.free_fields]
    parts = [f"<h1>{_e(record.title)}</h1>",
             '<table cellspacing="0" cellpadding="2">'
             + "".join(f'<tr><td width="190"><b>{k}</b></td><td>{v}</td></tr>' for k, v in head) + "</table>"]
    if record.verdict:
        word = record.verdict.split(":")[0]
        parts.append(f'<p class="verdict-{"pass" if word == "PASS" else "fail"}">{_e(word)}</p>'
                     f"<p>{_e(record.verdict)}</p>")
    parts.append(f'<p class="caution"><b>Caution.</b> {_e(record.caution)}</p>')
    parts.append("<p><b>Conventions.</b> " + " ".join(_e(c) for c in record.conventions) + "</p>")
    for index, section in enumerate(record.sections):
        parts.append(f"<h2>{_e(section.title)}</h2>")
        if section.picture is not None:
            src = pictures.get(index)
            if src:
                width = pictures.get(("width", index), 520)
                height = round(width * PICTURE_ASPECT)
                parts.append(f'<p><img src="{_e(src)}" width="{width}" height="{height}" '
                             f'alt="The Scene: {_e(section.picture.ghost_label)} as the faint outline"></p>'
                             f"<p><i>The Scene: the part as measured, the {_e(section.picture.ghost_label)} as "
                             "the faint outline.</i></p>")
            else:
                why = pictures.get(("missing", index), "no picture was made")
                parts.append(f'<p class="missing">{_e(PICTURE_MISSING.format(why=why))}</p>')
        pending: list = []
        headed = False
        for item in section.items:
            if isinstance(item, Figure):
                pending.append(item)
                continue
            if pending:
                parts.append(_figure_rows(pending, not headed))
                headed, pending = True, []
            if isinstance(item, Table):
                parts.append(_table(item))
            else:
                text = str(item)
                indent = text.startswith("    ")
                parts.append(f'<p style="margin-left: {18 if indent else 0}px; margin-top: 2px; margin-bottom: 2px;">'
                             f"{_e(text.strip())}</p>")
        if pending:
            parts.append(_figure_rows(pending, not headed))
    parts.append(f'<p class="caution"><b>Caution.</b> {_e(record.caution)}</p>')
    return "\n".join(parts)


def json_block(record: Record) -> str:
    """The numbers as a JSON block; '</' is written '<\\/' so no name can close the script element."""
    text = json.dumps(record.embedded(), ensure_ascii=False, allow_nan=False, indent=1)
    return (f'<script type="application/json" id="{JSON_ELEMENT_ID}">'
            f'{text.replace("</", "<" + chr(92) + "/")}</script>')


def print_style(record: Record) -> str:
    """For a browser's print: "page N of M" and both hashes in the margin of every printed page (CSS page
    margin boxes; a browser without them prints the hashes once, at the end). The PDF draws its own footer;
    QTextDocument never sees this rule."""
    return ("\n@page { size: A4; margin: 15mm 15mm 20mm 15mm;\n"
            f'  @bottom-left {{ content: "Session file SHA-256 {record.session_sha256} \\A Record SHA-256 '
            f'{record.sha256()}"; white-space: pre; font-size: 7pt; }}\n'
            '  @bottom-right { content: "page " counter(page) " of " counter(pages); font-size: 7pt; } }\n')


def html_file(record: Record, when: str, pngs: dict, missing: dict, free_values: dict | None = None) -> str:
    """The self-contained HTML file: pngs {section index: PNG bytes}; missing {section index: why}."""
    pictures: dict = {i: "data:image/png;base64," + base64.b64encode(png).decode("ascii") for i, png in pngs.items()}
    pictures.update({("missing", i): why for i, why in missing.items()})
    footer = (f'<p><span class="hash">Session file SHA-256 {_e(record.session_sha256)} · record SHA-256 '
              f'{_e(record.sha256())}</span></p>')
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<title>{_e(record.title)}</title><style>{STYLE}{print_style(record)}</style></head>\n<body>\n"
            f"{body_html(record, when, pictures, free_values)}\n{footer}\n{json_block(record)}\n</body></html>\n")
