"""Export renderers for the Copy as menu and the command line. Every format parses back through
core/decode: `round_trip_error` decodes a rendered text with hints that match the format and reports
the angle between what was rendered and what came back, before anything is called verified.

    render(orientation, "python", FormatOptions(representation="quaternion")) -> str
    round_trip_error(orientation, text, "python", options) -> degrees
    FORMATS: (name, plain label) pairs, in menu order

The pieces, one purpose each: format_options (what is asked for), format_text (numbers and words),
format_summary (every representation as values), format_report (the report for a person) and
format_round_trip (reading an export back); this module holds the formats themselves and names them all.

Numbers are printed with the shortest decimal within NOISE_RELATIVE of the double (so a typed -30.4 that
came back through the quaternion as -30.39999999999999 is written -30.4 again), unless `decimals` asks
for fixed decimals; then the round trip is exact only to the printed precision.
"""

from __future__ import annotations

import csv
import io
import json
import re

from core import representations
from core.csv_cells import spreadsheet_safe
from core.errors import FramewrightError
from core.format_options import KINDS, REPRESENTATIONS, FormatOptions, _options, _representation, _unit
from core.format_report import REPORT_DECIMALS, SAFETY_CAUTION, render_report
from core.format_round_trip import printed_precision_deg, round_trip_error, round_trip_hints
from core.format_summary import summary, vector_lines
from core.format_text import NOISE_RELATIVE, angle_names, format_number, shortest_decimal, spelled_sequence

FORMATS = (
    ("text", "Plain text"),
    ("json", "JSON (one object with every representation)"),
    ("csv", "CSV row"),
    ("python", "Python / numpy"),
    ("c", "C / C++ initializer"),
    ("matlab", "MATLAB / Octave literal"),
    ("report", "Report for a person (every representation, conventions, date and time)"),
)
FORMAT_NAMES = tuple(name for name, _ in FORMATS)

JSON_KEYS = ("format", "matrix", "quaternion_wxyz", "axis", "angle_deg",
             *(r.json_key for r in representations.VECTORS), "sequence", "intrinsic", "angles_deg",
             "gimbal_margin_deg", "gimbal_lock")


def _values(orientation, o: FormatOptions) -> list[float]:
    """The numbers of the chosen representation, in the order they are written."""
    chosen = _representation(o)
    if chosen.vector:
        return list(chosen.values(orientation, degrees=o.degrees))
    if o.representation == "matrix":
        return list(orientation.as_matrix(transposed=o.transposed).ravel())
    if o.representation == "quaternion":
        return list(orientation.as_quaternion(scalar_last=o.scalar_last))
    if o.representation == "axis-angle":
        axis, angle = orientation.as_axis_angle(degrees=o.degrees)
        return list(axis) + [angle]
    return list(orientation.as_angles(o.sequence, intrinsic=o.intrinsic, degrees=o.degrees).angles)


def _caption(o: FormatOptions) -> str:
    """One line that says what the numbers are, in words the decoder also understands."""
    if o.representation == "matrix":
        if o.transposed:
            return "Rotation matrix transposed, reference -> body (rows are the body axes)"
        return "Rotation matrix, body -> reference (v_ref = R v_body; columns are the body axes)"
    if o.representation == "quaternion":
        return "Quaternion (x, y, z, w), Hamilton, scalar last" if o.scalar_last else \
            "Quaternion (w, x, y, z), Hamilton, scalar first"
    if o.representation == "axis-angle":
        return f"Axis (x, y, z) and angle ({_unit(o)})"
    chosen = _representation(o)
    if chosen.vector:
        return chosen.caption.format(u=_unit(o))
    kind = "intrinsic" if o.intrinsic else "extrinsic"
    return f"Angles {spelled_sequence(o.sequence, o.intrinsic)} {kind}{angle_names(o.sequence, o.intrinsic)} ({_unit(o)})"


def _identifier(o: FormatOptions) -> str:
    if o.name:
        name = re.sub(r"\W+", "_", o.name).strip("_")
        if name and not name[0].isdigit():
            return name
    chosen = _representation(o)
    if chosen.vector:
        return chosen.identifier.format(u=_unit(o))
    return {"matrix": "R", "quaternion": "q_xyzw" if o.scalar_last else "q_wxyz", "axis-angle": "axis_angle",
            "angles": f"angles_{_unit(o)}"}[o.representation]


# ---------------------------------------------------------------------------------------------------
# The formats
# ---------------------------------------------------------------------------------------------------
def _render_text(orientation, o: FormatOptions) -> str:
    values = [format_number(v, o.decimals) for v in _values(orientation, o)]
    if o.representation == "matrix":
        rows = ["  ".join(values[i:i + 3]) for i in (0, 3, 6)]
        return _caption(o) + ":\n" + "\n".join(rows) + "\n"
    return f"{_caption(o)}: {', '.join(values)}\n"


def _render_json(orientation, o: FormatOptions) -> str:
    data = {"format": "framewright orientation", **summary(orientation, o.sequence, o.intrinsic)}
    if o.name:
        data["name"] = o.name
    if o.decimals is not None:
        data = _rounded(data, o.decimals)
    return json_object_text(data)


def json_object_text(data: dict) -> str:
    """One JSON object, a key per line and each list on one line (readable in an e-mail). Strict JSON: a
    non-finite number raises ValueError rather than printing NaN or Infinity."""
    body = ",\n".join(f"  {json.dumps(k)}: {json.dumps(v, ensure_ascii=False, allow_nan=False)}"
                       for k, v in data.items())
    return "{\n" + body + "\n}\n"


def _rounded(value, decimals):
    if isinstance(value, float):
        return float(format_number(value, decimals))
    if isinstance(value, list):
        return [_rounded(v, decimals) for v in value]
    if isinstance(value, dict):
        return {k: _rounded(v, decimals) for k, v in value.items()}
    return value


def csv_header(options=None) -> str:
    """The header row that names the columns of `render(..., 'csv', options)`."""
    o = _options(options)
    u = _unit(o)
    names = {
        # dcm11…: the direction cosine matrix, reference -> body; r11…: body -> reference
        "matrix": [f"{'dcm' if o.transposed else 'r'}{r}{c}" for r in (1, 2, 3) for c in (1, 2, 3)],
        "quaternion": ["qx", "qy", "qz", "qw"] if o.scalar_last else ["qw", "qx", "qy", "qz"],
    }.get(o.representation)
    chosen = _representation(o)
    if chosen.csv_columns:
        names = [c.format(u=u) for c in chosen.csv_columns]
    if names is None:
        if (o.sequence, o.intrinsic) == ("ZYX", True):
            names = [f"yaw_{u}", f"pitch_{u}", f"roll_{u}"]
        else:
            tag = f"{o.sequence.lower()}_{'intrinsic' if o.intrinsic else 'extrinsic'}"
            names = [f"{tag}_angle{i}_{u}" for i in (1, 2, 3)]
    return _csv_line(names)


def csv_with_name(name: str, header: str, row: str) -> str:
    """The header and row of a CSV copy with the mount's name as a first column ('name,qw,qx,qy,qz' over
    'Camera 2,0.7071,...'): the name is quoted as CSV needs and neutralised if a spreadsheet would run it."""
    return "name," + header + _csv_line([name]).rstrip("\n") + "," + row


def _csv_line(cells) -> str:
    """One CSV row; a text cell a spreadsheet would run as a formula is neutralised (core/csv_cells.py),
    numbers such as -0.5 stay numbers."""
    buffer = io.StringIO()
    csv.writer(buffer, lineterminator="\n").writerow(spreadsheet_safe(cell) for cell in cells)
    return buffer.getvalue()


def _render_csv(orientation, o: FormatOptions) -> str:
    return _csv_line(format_number(v, o.decimals) for v in _values(orientation, o))


def _render_python(orientation, o: FormatOptions) -> str:
    values = [format_number(v, o.decimals) for v in _values(orientation, o)]
    name = _identifier(o)
    head = f"import numpy as np\n\n# {_caption(o)}\n"
    if o.representation == "matrix":
        rows = "".join(f"    [{', '.join(values[i:i + 3])}],\n" for i in (0, 3, 6))
        return f"{head}{name} = np.array([\n{rows}])\n"
    return f"{head}{name} = np.array([{', '.join(values)}])\n"


def _render_c(orientation, o: FormatOptions) -> str:
    values = [_c_number(v) for v in (format_number(x, o.decimals) for x in _values(orientation, o))]
    name = _identifier(o)
    head = f"/* {_caption(o)}{'; row-major' if o.representation == 'matrix' else ''} */\n"
    if o.representation == "matrix":
        rows = ",\n".join(f"    {{{', '.join(values[i:i + 3])}}}" for i in (0, 3, 6))
        return f"{head}const double {name}[3][3] = {{\n{rows}\n}};\n"
    return f"{head}const double {name}[{len(values)}] = {{{', '.join(values)}}};\n"


def _c_number(text: str) -> str:
    """A C double literal: '1' -> '1.0' so integer division can never creep in."""
    return text if re.search(r"[.eE]", text) else text + ".0"


def _render_matlab(orientation, o: FormatOptions) -> str:
    values = [format_number(v, o.decimals) for v in _values(orientation, o)]
    name = _identifier(o)
    if o.representation == "matrix":
        body = "; ".join(" ".join(values[i:i + 3]) for i in (0, 3, 6))
    else:
        body = " ".join(values)
    return f"% {_caption(o)}\n{name} = [{body}];\n"


_RENDERERS = {"text": _render_text, "json": _render_json, "csv": _render_csv, "python": _render_python,
              "c": _render_c, "matlab": _render_matlab, "report": render_report}


def render(orientation, fmt: str, options=None) -> str:
    """The orientation as text in format `fmt` (one of FORMAT_NAMES)."""
    if fmt not in _RENDERERS:
        raise FramewrightError(f"unknown format {fmt!r}; expected one of {', '.join(FORMAT_NAMES)}")
    return _RENDERERS[fmt](orientation, _options(options))


def check_every_format(orientation, options=None) -> dict:
    """{format: round-trip error in degrees} for every format (what the Copy as menu shows)."""
    return {fmt: round_trip_error(orientation, render(orientation, fmt, options), fmt, options)
            for fmt in FORMAT_NAMES}


__all__ = ["FORMATS", "FORMAT_NAMES", "JSON_KEYS", "KINDS", "NOISE_RELATIVE", "REPORT_DECIMALS", "REPRESENTATIONS",
           "SAFETY_CAUTION", "FormatOptions", "shortest_decimal",
           "check_every_format", "csv_header", "csv_with_name", "format_number", "json_object_text", "printed_precision_deg", "render",
           "round_trip_error", "round_trip_hints", "spelled_sequence", "summary", "vector_lines"]
