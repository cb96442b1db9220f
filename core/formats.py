"""Export renderers for the Copy as menu and the command line. Every format parses back through
core/decode: `round_trip_error` decodes a rendered text with hints that match the format and reports
the angle between what was rendered and what came back, before anything is called verified.

    render(orientation, "python", FormatOptions(representation="quaternion")) -> str
    round_trip_error(orientation, text, "python", options) -> degrees
    FORMATS: (name, plain label) pairs, in menu order

Numbers are printed with the shortest decimal within NOISE_RELATIVE of the double (so a typed -30.4 that
came back through the quaternion as -30.39999999999999 is written -30.4 again), unless `decimals` asks
for fixed decimals; then the round trip is exact only to the printed precision.
"""

from __future__ import annotations

import csv
import io
import json
import math
import re
from dataclasses import dataclass, replace
from datetime import datetime

from core.csv_cells import spreadsheet_safe
from core.decode import DecodeHints, decode
from core.errors import FramewrightError
from core import representations, sequences
from core.representations import ANGLE
from core.sequences import gimbal_margin, parse_sequence

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
# The representations every orientation has, in menu order (core/representations.py lists them); the
# Gibbs vector is accepted as well (KINDS) but refused at a half turn, where it is infinite.
REPRESENTATIONS = tuple(r.kind for r in representations.ALL if not r.half_turn_words)
KINDS = representations.KINDS
REPORT_DECIMALS = 10          # the report's numbers for a person (its quaternion line is always exact)
SAFETY_CAUTION = ("verify against the governing drawing and procedure; this tool does not replace inspection "
                  "by qualified personnel; local codes and licensed practice govern")
JSON_KEYS = ("format", "matrix", "quaternion_wxyz", "axis", "angle_deg",
             *(r.json_key for r in representations.VECTORS), "sequence", "intrinsic", "angles_deg",
             "gimbal_margin_deg", "gimbal_lock")


@dataclass(frozen=True)
class FormatOptions:
    """representation: which one the one-representation formats write (text, csv, python, c, matlab);
    decimals: None = exact shortest text, or a fixed number of decimals; sequence, intrinsic: for
    angles; degrees: angle units; scalar_last: quaternion order (x, y, z, w); transposed: write the
    matrix reference -> body (rows are the body axes); name: variable name in code, mount name in the
    report; timestamp: date and time for the report (the caller passes it: text or datetime);
    caution: the report's safety caution (SAFETY_CAUTION unless the caller passes its own wording);
    words_preset: the frame preset (core/describe.py) naming the reference directions in the report's
    words (ENU unless given); gravity_down: the reference direction gravity points along for the report's
    level readings ((0, 0, -1), the reference Z up, unless given; (0, 0, 1) for NED).

    A dict may also use the window's preference names: angle_units ('deg'/'rad'), quaternion_order
    ('wxyz'/'xyzw') and matrix_meaning ('body_to_reference'/'reference_to_body')."""
    representation: str = "matrix"
    decimals: int | None = None
    sequence: str = "ZYX"
    intrinsic: bool = True
    degrees: bool = True
    scalar_last: bool = False
    transposed: bool = False
    name: str | None = None
    timestamp: object = None
    notes: tuple = ()
    caution: str | None = None
    words_preset: str | None = None
    gravity_down: tuple | None = None

    def checked(self) -> "FormatOptions":
        found = representations.lookup(self.representation)
        if found is None:
            raise FramewrightError(f"unknown representation {self.representation!r}; expected one of "
                                   f"{', '.join(KINDS)}")
        if self.decimals is not None and not (isinstance(self.decimals, int) and 0 <= self.decimals <= 17):
            raise FramewrightError(f"decimals must be a whole number from 0 to 17, got {self.decimals!r}")
        return replace(self, representation=found.kind, sequence=parse_sequence(self.sequence))


_PREFERENCE_NAMES = {
    "angle_units": lambda v: {"degrees": str(v).lower().startswith("deg")},
    "quaternion_order": lambda v: {"scalar_last": str(v).lower() in ("xyzw", "w-last", "scalar-last")},
    "matrix_meaning": lambda v: {"transposed": str(v).lower().replace("-", "_") == "reference_to_body"},
}


def _options(options) -> FormatOptions:
    if options is None:
        return FormatOptions()
    if isinstance(options, dict):
        fields = dict(options)
        translated = {}
        for name, translate in _PREFERENCE_NAMES.items():
            if name in fields:
                translated.update(translate(fields.pop(name)))
        unknown = set(fields) - set(FormatOptions.__dataclass_fields__)
        if unknown:
            raise FramewrightError(f"unknown format option(s) {sorted(unknown)}; expected "
                                   f"{sorted(FormatOptions.__dataclass_fields__)}")
        # explicit fields win over preference names when both are given
        return FormatOptions(**{**translated, **fields}).checked()
    return options.checked()


# ---------------------------------------------------------------------------------------------------
# Numbers and words shared by the formats
# ---------------------------------------------------------------------------------------------------
# The last few bits of arithmetic noise (a conversion to the quaternion and back leaves about 1e-15
# relative): rounding off no more than this keeps every exact format's round trip within 1e-12 degrees,
# which a relative 1e-12 would not (a quaternion component off by 1e-12 turns the orientation ~1e-10°).
NOISE_RELATIVE = 2e-15


def shortest_decimal(value: float, relative: float = NOISE_RELATIVE) -> str:
    """The shortest decimal (as Python writes a float) within `relative` of value; '0.0' for zero."""
    value = float(value) + 0.0            # + 0.0 turns -0.0 into 0.0
    if value == 0.0 or not math.isfinite(value):
        return repr(value)
    for digits in range(1, 17):
        rounded = float(f"{value:.{digits}g}")
        if abs(rounded - value) <= relative * abs(value):
            return repr(rounded)
    return repr(value)


def format_number(value: float, decimals: int | None = None) -> str:
    """'0.7071067811865476' (the shortest decimal, arithmetic noise off) or fixed decimals; never '-0'."""
    value = float(value)
    if decimals is None:
        text = shortest_decimal(value)
    else:
        text = f"{value:.{decimals}f}"
        if float(text) == 0:
            text = text.lstrip("-")
    return text


def spelled_sequence(sequence: str, intrinsic: bool) -> str:
    """Z-Y'-X'' for intrinsic (the moving axes), Z-Y-X for extrinsic: plain ASCII, so every copy reads
    back in any program."""
    return sequences.spelled_sequence(sequence, intrinsic, ascii=True)


def _angle_names(sequence: str, intrinsic: bool) -> str:
    names = sequences.preset_names(sequence, intrinsic)
    return f" ({', '.join(names)})" if names else ""


def _unit(o: FormatOptions) -> str:
    return "deg" if o.degrees else "rad"


def _representation(o: FormatOptions):
    return representations.by_kind(o.representation)


def _unit_of(o: FormatOptions) -> str:
    """'deg'/'rad' for a representation of angles, '' for pure numbers (Gibbs, MRP)."""
    return representations.unit_text(_representation(o), o.degrees)


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
    return f"Angles {spelled_sequence(o.sequence, o.intrinsic)} {kind}{_angle_names(o.sequence, o.intrinsic)} ({_unit(o)})"


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


def summary(orientation, sequence: str = "ZYX", intrinsic: bool = True) -> dict:
    """Every representation of one orientation as plain JSON-ready values (degrees; body -> reference;
    canonical w-first quaternion; the axis is None at angle 0, where it is undefined)."""
    sequence = parse_sequence(sequence)
    axis, angle = orientation.as_axis_angle()
    angles = orientation.as_angles(sequence, intrinsic=intrinsic)
    margin = gimbal_margin(orientation, sequence, intrinsic)
    return {
        "matrix": [[float(v) for v in row] for row in orientation.as_matrix()],
        "quaternion_wxyz": [float(v) for v in orientation.as_quaternion()],
        "axis": None if angle == 0 else [float(v) for v in axis],
        "angle_deg": float(angle),
        **{r.json_key: _vector_or_none(r, orientation) for r in representations.VECTORS},
        "sequence": sequence,
        "intrinsic": bool(intrinsic),
        "angles_deg": [float(v) for v in angles.angles],
        "gimbal_margin_deg": float(margin.margin_deg),
        "gimbal_lock": bool(angles.locked or margin.locked),
    }


def _vector_or_none(representation, orientation):
    """The numbers of a vector representation (degrees for angles), or None where it does not exist (the
    Gibbs vector at a half turn)."""
    if representation.half_turn_words and orientation.quaternion[0] == 0:
        return None
    return [float(v) for v in representation.values(orientation)]


def _vector_line(representation, values, number) -> str:
    """'rotation vector (deg): 1, 2, 3', or what is said where the representation does not exist."""
    unit = representations.unit_text(representation, True)
    label = representation.name + (f" ({unit})" if unit else "")
    if values is None:
        return f"{label}: {representation.half_turn_words}"
    return f"{label}: {', '.join(number(v) for v in values)}"


def vector_lines(data: dict, number) -> list[str]:
    """One line per vector representation of a `summary` dict, in words ('rotation vector (deg): …'),
    the numbers written by `number`."""
    return [_vector_line(r, data[r.json_key], number) for r in representations.VECTORS]


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


def _render_report(orientation, o: FormatOptions) -> str:
    d = o.decimals if o.decimals is not None else REPORT_DECIMALS
    n = lambda v: format_number(v, d)            # noqa: E731 - one short formatter
    s = summary(orientation, o.sequence, o.intrinsic)
    when = o.timestamp
    if isinstance(when, datetime):
        when = when.isoformat(sep=" ", timespec="seconds")
    other_sequence = o.sequence[::-1]
    other = orientation.as_angles(other_sequence, intrinsic=not o.intrinsic)
    kind = "intrinsic" if o.intrinsic else "extrinsic"
    other_kind = "extrinsic" if o.intrinsic else "intrinsic"
    margin = gimbal_margin(orientation, o.sequence, o.intrinsic)
    lines = ["Framewright orientation report"]
    if o.name:
        lines.append(f"Mount: {o.name}")
    lines.append(f"Date and time: {when if when else 'not given'}")
    lines.append("Conventions: v_ref = R v_body (the columns of R are the body axes in reference coordinates);"
                 " Hamilton quaternion, w first, w not negative; angles in degrees;"
                 f" the quaternion is printed exactly, other numbers to {d} decimals." if o.decimals is None else
                 " Hamilton quaternion, w first, w not negative; angles in degrees;"
                 f" numbers printed to {d} decimals.")
    lines.append("")
    exact = format_number if o.decimals is None else n      # the quaternion line reads back exactly
    lines.append(f"Quaternion (w, x, y, z): {', '.join(exact(v) for v in s['quaternion_wxyz'])}")
    lines.append("Rotation matrix, body -> reference:")
    lines.extend("    " + "  ".join(n(v).rjust(d + 3) for v in row) for row in s["matrix"])
    if s["axis"] is None:
        lines.append("Axis and angle: no rotation (angle 0; the axis is undefined)")
    else:
        lines.append(f"Axis and angle: axis ({', '.join(n(v) for v in s['axis'])}), angle {n(s['angle_deg'])} deg")
    lines.extend(line[:1].upper() + line[1:] for line in vector_lines(s, n))
    lines.append(f"Angles {spelled_sequence(o.sequence, o.intrinsic)} {kind}"
                 f"{_angle_names(o.sequence, o.intrinsic)}, deg: {', '.join(n(v) for v in s['angles_deg'])}")
    lines.append(f"The same spelled {spelled_sequence(other_sequence, not o.intrinsic)} {other_kind}"
                 f"{_angle_names(other_sequence, not o.intrinsic)}, deg: {', '.join(n(v) for v in other.angles)}")
    if margin.locked:
        lines.append("Gimbal margin: 0 deg, in gimbal lock: only the sum or difference of the first and third"
                     " angles is determined")
    else:
        lines.append(f"Gimbal margin: {margin.margin_deg:.3f} deg (first and third angles swing about "
                     f"{margin.amplification:.3g} times as much as the orientation)")
    for note in tuple(o.notes) + tuple(orientation.notes):
        lines.append(f"Note: {note}")
    lines.append("")
    lines.extend(_report_words(orientation, o))
    lines.append("")
    lines.extend(_report_level(orientation, o))
    lines.append("")
    lines.append(f"Caution: {(o.caution or SAFETY_CAUTION).rstrip('.')}.")
    return "\n".join(lines) + "\n"


def _report_words(orientation, o: FormatOptions) -> list[str]:
    """Where each body axis points and the nearest right-angle orientation (core/describe.py)."""
    from core import describe

    preset = describe.frame_preset(o.words_preset)
    return ([f"Where the body axes point (reference directions named as {preset.title}):"]
            + ["    " + line for line in describe.describe_orientation(orientation, preset)])


def _report_level(orientation, o: FormatOptions) -> list[str]:
    """What a level would read on each face and each body axis's elevation (core/level.py)."""
    from core import describe, level

    down = level.DOWN_Z_UP if o.gravity_down is None else o.gravity_down
    report = level.level_readings(orientation, down)
    axes = {tuple(v): name for name, v in (("-Z (Z up)", (0.0, 0.0, -1.0)), ("+Z (Z down)", (0.0, 0.0, 1.0)),
                                            ("+X", (1.0, 0.0, 0.0)), ("-X", (-1.0, 0.0, 0.0)),
                                            ("+Y", (0.0, 1.0, 0.0)), ("-Y", (0.0, -1.0, 0.0)))}
    name = axes.get(tuple(float(c) + 0.0 for c in report.down))
    where = f"reference {name}" if name else f"reference ({', '.join(f'{c:.6g}' for c in report.down)})"
    m = lambda text: text.replace("-", describe.MINUS)          # noqa: E731 - signs as printed elsewhere
    lines = [f"Level readings, gravity along {m(where)}; degrees to three decimals:"]
    for r in report.faces:
        lines.append(f"    face {m(r.face)}: tilt from level {r.tilt_deg:.3f}, off plumb {r.off_plumb_deg:.3f}, "
                     f"normal {r.from_up_deg:.3f} from straight up, facing {r.facing}")
    lines.append(f"    up: face {m(report.up_face)}; down: face {m(report.down_face)}")
    lines.append("    elevation above the horizontal: " + ", ".join(
        f"{m(a.axis)} {m(f'{a.elevation_deg + 0.0:.3f}')}" for a in report.axes))
    return lines


_RENDERERS = {"text": _render_text, "json": _render_json, "csv": _render_csv, "python": _render_python,
              "c": _render_c, "matlab": _render_matlab, "report": _render_report}


def render(orientation, fmt: str, options=None) -> str:
    """The orientation as text in format `fmt` (one of FORMAT_NAMES)."""
    if fmt not in _RENDERERS:
        raise FramewrightError(f"unknown format {fmt!r}; expected one of {', '.join(FORMAT_NAMES)}")
    return _RENDERERS[fmt](orientation, _options(options))


def round_trip_hints(fmt: str, options=None) -> DecodeHints:
    """The decode hints that match what `render(…, fmt, options)` wrote, so exactly one reading comes back."""
    o = _options(options)
    if fmt in ("json", "report"):
        return DecodeHints(kind="quaternion", order="wxyz")
    if o.representation == "matrix":
        return DecodeHints(kind="matrix", transposed=o.transposed)
    if o.representation == "quaternion":
        return DecodeHints(kind="quaternion", order="xyzw" if o.scalar_last else "wxyz")
    if o.representation == "angles":
        return DecodeHints(kind="angles", sequence=o.sequence, intrinsic=o.intrinsic, units=_unit(o))
    return DecodeHints(kind=o.representation, units=_unit_of(o) or None)


def round_trip_error(orientation, text: str, fmt: str, options=None) -> float:
    """Decode `text` (as written by render) with matching hints; the angle in degrees between the two.

    Raises DecodeError if the text does not decode, and FramewrightError if it decodes ambiguously."""
    readings = decode(text, round_trip_hints(fmt, options))
    if len(readings) != 1:
        raise FramewrightError(f"the {fmt} text decodes to {len(readings)} readings; expected exactly one")
    return orientation.angle_to(readings[0].orientation)


def printed_precision_deg(fmt: str, options=None) -> float:
    """How far a round trip may be off because of the printed decimals (0 when printed exactly).

    A unit quantity printed to d decimals is off by at most 0.5e-d per number; the orientation then by
    at most a few times that (in radians). Angles printed in degrees are off by 0.5e-d degrees each.
    The report prints its quaternion exactly and the rest to REPORT_DECIMALS decimals unless told
    otherwise; JSON and the report decode by their quaternion, so their bound is the quaternion's."""
    o = _options(options)
    decimals = o.decimals
    if decimals is None:
        return 0.0
    step = 0.5 * 10.0 ** -decimals
    if fmt in ("json", "report"):
        return math.degrees(8 * step)
    if _representation(o).units == ANGLE and o.degrees:
        return 4 * step + math.degrees(4 * step)
    return math.degrees(8 * step)


def check_every_format(orientation, options=None) -> dict:
    """{format: round-trip error in degrees} for every format (what the Copy as menu shows)."""
    return {fmt: round_trip_error(orientation, render(orientation, fmt, options), fmt, options)
            for fmt in FORMAT_NAMES}


__all__ = ["FORMATS", "FORMAT_NAMES", "JSON_KEYS", "KINDS", "REPRESENTATIONS", "SAFETY_CAUTION", "FormatOptions",
           "check_every_format", "csv_header", "format_number", "json_object_text", "printed_precision_deg", "render",
           "round_trip_error", "round_trip_hints", "spelled_sequence", "summary", "vector_lines"]
