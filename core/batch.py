"""Batch check: a CSV of many mounts, nominal against measured, becomes a table of deviations with the
out-of-tolerance rows flagged, written back as CSV.

Input file
----------
Comma-separated, '.' as decimal point, first line the header. Cells may be quoted ("a, b"). The Unicode
minus (−), the en dash used as a minus and non-breaking spaces are accepted in number cells. Blank lines
are skipped.

The first column is ``name``. The other columns are two sets, each named with its prefix ``nominal_`` or
``measured_`` followed by one of these field groups (all fields of the group, in any column order):

    qw qx qy qz                      quaternion, Hamilton (names say which number is w)
    r11 r12 r13 r21 ... r33          matrix, r<row><column> as printed
    axis_x axis_y axis_z angle       axis and angle
    rv_x rv_y rv_z                   rotation vector (angle × unit axis)
    yaw pitch roll                   yaw–pitch–roll: intrinsic ZYX (= roll–pitch–yaw about fixed axes)
    angle1 angle2 angle3             three angles of a sequence that must be stated

Conventions are written in square brackets after a column name, as words separated by spaces, on any
one column of the set (or spread over several; they must not contradict each other)::

    deg | rad                                angles and rotation vectors (default deg)
    ZYX, Z-Y'-X'', XZX, ...                  the sequence of angle1..angle3
    intrinsic | extrinsic                    for angle1..angle3
    body_to_reference | reference_to_body    what the nine matrix numbers mean (default body_to_reference)

Example header::

    name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_angle1[XYZ extrinsic deg],measured_angle2,measured_angle3

Conventions can also be passed in (`SetConventions`) for a file whose header has none; a passed-in value
that contradicts the header is refused, never silently preferred. Other columns (serial, notes) are
ignored and named in the table's notes; an unknown ``nominal_``/``measured_`` column is refused (a typo).

Any bad cell refuses the whole file with a BatchFileError naming the line, the data row, the mount and
the column; nothing partial is returned.

Output file
-----------
``name,total_deviation_deg,deviation_axis_x,deviation_axis_y,deviation_axis_z[,pointing_error_deg,roll_deg],result,margin_deg``
with the deviation D = Nᵀ M and its axis in the nominal body frame, the pointing error and roll of the
chosen body axis when one is set, ``pass``/``fail`` and the margin (tolerance − value, the smallest of
the criteria) under the CheckSettings given (see core/check.py).

The arithmetic is vectorised over all rows (core/kernels.py on arrays); rows are processed in chunks of
CHUNK_ROWS only so that a progress callback can report and cancel.
"""

from __future__ import annotations

import csv
import io
import re
import warnings
from dataclasses import dataclass

import numpy as np

from core import kernels
from core.check import ROUNDING_ALLOWANCE_DEG, CheckSettings, deviation_angles, deviation_axes, deviation_quaternions, swing_twist_angles
from core.errors import FramewrightError, InvalidInputError, SequenceError
from core.nearest import WARNING_LIMIT, orthogonality_report
from core.sequences import parse_sequence

CHUNK_ROWS = 50_000

REPRESENTATIONS = {
    "quaternion": ("qw", "qx", "qy", "qz"),
    "matrix": tuple(f"r{i}{j}" for i in (1, 2, 3) for j in (1, 2, 3)),
    "axis_angle": ("axis_x", "axis_y", "axis_z", "angle"),
    "rotation_vector": ("rv_x", "rv_y", "rv_z"),
    "yaw_pitch_roll": ("yaw", "pitch", "roll"),
    "angles": ("angle1", "angle2", "angle3"),
}
_USES = {  # which conventions each representation takes
    "quaternion": (), "matrix": ("matrix_meaning",), "axis_angle": ("degrees",),
    "rotation_vector": ("degrees",), "yaw_pitch_roll": ("degrees",),
    "angles": ("degrees", "sequence", "intrinsic"),
}
ROLES = ("nominal", "measured")
MATRIX_MEANINGS = ("body_to_reference", "reference_to_body")
_HEADER_CELL = re.compile(r"^\s*(nominal|measured)_([a-z0-9_]+)\s*(?:\[([^\]]*)\])?\s*$", re.IGNORECASE)
_WORD_TAGS = {
    "deg": ("degrees", True), "degrees": ("degrees", True),
    "rad": ("degrees", False), "radians": ("degrees", False),
    "intrinsic": ("intrinsic", True), "extrinsic": ("intrinsic", False),
    "body_to_reference": ("matrix_meaning", "body_to_reference"),
    "reference_to_body": ("matrix_meaning", "reference_to_body"),
}
_QUATERNION_NOTICE = 1e-6


class BatchFileError(InvalidInputError):
    """A batch file refused. line: 1-based line in the file; row: 1-based data row; column: header name."""

    def __init__(self, message, line=None, row=None, column=None):
        super().__init__(message)
        self.line, self.row, self.column = line, row, column


class BatchCancelledError(FramewrightError):
    """The progress callback asked to stop."""


@dataclass(frozen=True)
class SetConventions:
    """Conventions of one column set given from outside the file; None leaves a value to the header or
    the default (degrees, body_to_reference). Values that a representation does not use are ignored."""

    sequence: str | None = None
    intrinsic: bool | None = None
    degrees: bool | None = None
    matrix_meaning: str | None = None


@dataclass(frozen=True)
class ColumnSet:
    """One set as read from the header: role, representation, its column indices in the file (in the
    order of REPRESENTATIONS) and the conventions in force."""

    role: str
    representation: str
    columns: tuple
    indices: tuple
    sequence: str | None
    intrinsic: bool | None
    degrees: bool
    matrix_meaning: str

    def describe(self):
        words = {"quaternion": "quaternion (Hamilton)", "matrix": f"matrix, {self.matrix_meaning}",
                 "axis_angle": "axis and angle", "rotation_vector": "rotation vector",
                 "yaw_pitch_roll": "yaw-pitch-roll (intrinsic ZYX)"}
        text = words.get(self.representation) or \
            f"angles {self.sequence} {'intrinsic' if self.intrinsic else 'extrinsic'}"
        if "degrees" in _USES[self.representation]:
            text += ", degrees" if self.degrees else ", radians"
        return f"{self.role}: {text}"


@dataclass(frozen=True)
class MountTable:
    names: tuple
    nominal: np.ndarray     # (N, 4) unit quaternions, w-first
    measured: np.ndarray
    sets: tuple             # (nominal ColumnSet, measured ColumnSet)
    notes: tuple = ()


@dataclass(frozen=True)
class BatchResult:
    names: tuple
    total_deg: np.ndarray
    axis: np.ndarray
    pointing_deg: np.ndarray | None
    roll_deg: np.ndarray | None
    passed: np.ndarray
    margin_deg: np.ndarray
    settings: CheckSettings
    notes: tuple = ()

    @property
    def failed_count(self):
        return int(np.count_nonzero(~self.passed))


def _report(progress, done, total, stage):
    if progress is not None and progress(done, total, stage) is False:
        raise BatchCancelledError(f"batch cancelled while {stage} ({done} of {total})")


# --- header -----------------------------------------------------------------------------------------

def _convention_words(key, value):
    """How a convention is written in a header: 'extrinsic', 'rad', 'ZYX', 'reference_to_body'."""
    if key == "intrinsic":
        return "intrinsic" if value else "extrinsic"
    if key == "degrees":
        return "deg" if value else "rad"
    return str(value)


def _read_tags(text, column):
    found = {}
    for word in text.replace(";", " ").split():
        key_value = _WORD_TAGS.get(word.lower())
        if key_value is None:
            try:
                key_value = ("sequence", parse_sequence(word))
            except SequenceError:
                raise BatchFileError(
                    f"line 1, column {column!r}: unknown convention {word!r}; expected deg, rad, intrinsic, "
                    f"extrinsic, body_to_reference, reference_to_body or a sequence such as ZYX",
                    line=1, column=column) from None
        key, value = key_value
        if key in found and found[key] != value:
            raise BatchFileError(f"line 1, column {column!r}: contradictory conventions in [{text}]",
                                 line=1, column=column)
        found[key] = value
    return found


def _column_set(role, fields, passed):
    """fields: {field: (index, header cell, tags)} of one role."""
    names = set(fields)
    matches = [rep for rep, wanted in REPRESENTATIONS.items() if names == set(wanted)]
    if not matches:
        partial = [rep for rep, wanted in REPRESENTATIONS.items() if names & set(wanted)]
        hint = (f"; for {partial[0]} expected {', '.join(role + '_' + f for f in REPRESENTATIONS[partial[0]])}"
                if partial else "")
        raise BatchFileError(
            f"line 1: the {role} columns ({', '.join(role + '_' + f for f in sorted(names))}) are not one "
            f"complete set{hint}; expected one of: "
            + "; ".join(" ".join(w) for w in REPRESENTATIONS.values()), line=1)
    representation = matches[0]
    uses = _USES[representation]
    values = {}
    for field in REPRESENTATIONS[representation]:
        index, cell, tags = fields[field]
        for key, value in tags.items():
            if key not in uses:
                raise BatchFileError(
                    f"line 1, column {cell!r}: the convention {key.replace('_', ' ')} does not apply to a "
                    f"{representation.replace('_', ' ')}; expected only: {', '.join(uses) or 'none'}",
                    line=1, column=cell)
            if key in values and values[key][0] != value:
                raise BatchFileError(f"line 1, column {cell!r}: contradicts column {values[key][1]!r} on the "
                                     f"{key.replace('_', ' ')}", line=1, column=cell)
            values[key] = (value, cell)
    resolved = {}
    for key in ("sequence", "intrinsic", "degrees", "matrix_meaning"):
        outside = getattr(passed, key) if key in uses else None
        if key == "sequence" and outside is not None:
            outside = parse_sequence(outside)
        if key == "matrix_meaning" and outside is not None and outside not in MATRIX_MEANINGS:
            raise InvalidInputError(f"{role} matrix meaning {outside!r}; expected one of "
                                    f"{', '.join(MATRIX_MEANINGS)}")
        if key in values and outside is not None and outside != values[key][0]:
            raise BatchFileError(
                f"line 1, column {values[key][1]!r}: the header says {_convention_words(key, values[key][0])} "
                f"but {_convention_words(key, outside)} was passed in; expected them to agree", line=1,
                column=values[key][1])
        resolved[key] = values[key][0] if key in values else outside
    if representation == "angles" and (resolved["sequence"] is None or resolved["intrinsic"] is None):
        first = fields["angle1"][1]
        raise BatchFileError(
            f"line 1, column {first!r}: angle1..angle3 need a sequence and intrinsic or extrinsic; expected "
            f"e.g. {role}_angle1[ZYX intrinsic] in the header, or conventions passed in", line=1, column=first)
    if representation == "yaw_pitch_roll":
        resolved["sequence"], resolved["intrinsic"] = "ZYX", True
    ordered = REPRESENTATIONS[representation]
    return ColumnSet(role, representation, tuple(fields[f][1] for f in ordered),
                     tuple(fields[f][0] for f in ordered), resolved["sequence"], resolved["intrinsic"],
                     True if resolved["degrees"] is None else resolved["degrees"],
                     resolved["matrix_meaning"] or "body_to_reference")


def _read_header(header, nominal, measured):
    if not header or header[0].strip().lower() != "name":
        first = header[0] if header else ""
        hint = " (the file seems to use ';' between cells; expected ',')" if ";" in first else ""
        raise BatchFileError(f"line 1: the first column must be 'name', got {first!r}{hint}", line=1,
                             column=first or None)
    fields = {role: {} for role in ROLES}
    ignored = []
    for index, cell in enumerate(header[1:], start=1):
        match = _HEADER_CELL.match(cell)
        if not match:
            if cell.strip().lower().startswith(ROLES):
                raise BatchFileError(f"line 1, column {cell!r}: cannot read this column name; expected e.g. "
                                     f"nominal_qw or measured_yaw[deg]", line=1, column=cell)
            ignored.append(cell)
            continue
        role, field, tags = match.group(1).lower(), match.group(2).lower(), match.group(3) or ""
        if all(field not in wanted for wanted in REPRESENTATIONS.values()):
            raise BatchFileError(f"line 1, column {cell!r}: unknown field {field!r}; expected one of "
                                 + ", ".join(f for w in REPRESENTATIONS.values() for f in w), line=1, column=cell)
        if field in fields[role]:
            raise BatchFileError(f"line 1, column {cell!r}: {role}_{field} appears twice", line=1, column=cell)
        fields[role][field] = (index, cell, _read_tags(tags, cell))
    for role in ROLES:
        if not fields[role]:
            raise BatchFileError(f"line 1: no {role} columns; expected e.g. {role}_qw, {role}_qx, {role}_qy, "
                                 f"{role}_qz", line=1)
    sets = (_column_set("nominal", fields["nominal"], nominal or SetConventions()),
            _column_set("measured", fields["measured"], measured or SetConventions()))
    return sets, ignored


# --- cells ------------------------------------------------------------------------------------------

def _clean_number_text(text):
    return text.replace("−", "-").replace("–", "-").replace("\u00a0", " ")


def _scan_rows(text):
    """(line number, cells) of every non-blank data row, by the csv module (used to locate problems)."""
    reader = csv.reader(io.StringIO(text))
    next(reader, None)
    for cells in reader:
        if cells and any(c.strip() for c in cells):
            yield reader.line_num, cells


def _cell_problem(cell):
    text = _clean_number_text(cell).strip()
    if not text:
        return "is empty; expected a number"
    try:
        value = float(text)
    except ValueError:
        return f"{cell!r} is not a number; expected a decimal number such as -0.25"
    if "_" in text or not np.isfinite(value):
        return f"{cell!r} is not a finite decimal number; expected e.g. -0.25"
    return None


def _locate_bad_cells(text, header, numeric):
    """Find the problems the fast reader tripped on, naming line, row, mount and column."""
    problems = []
    for row, (line, cells) in enumerate(_scan_rows(text), start=1):
        name = cells[0] if cells else ""
        if len(cells) != len(header):
            problems.append((line, row, None, f"line {line} (row {row}, mount {name!r}) has {len(cells)} "
                             f"cells; expected {len(header)} as in the header"))
            continue
        for index in numeric:
            problem = _cell_problem(cells[index])
            if problem:
                problems.append((line, row, header[index], f"line {line} (row {row}, mount {name!r}), column "
                                 f"{header[index]!r}: {problem}"))
    return problems


def _refuse(problems, fallback):
    if not problems:
        raise BatchFileError(f"the file cannot be read: {fallback}")
    line, row, column, message = problems[0]
    if len(problems) > 1:
        message += f" (and {len(problems) - 1} more problem(s); the next: {problems[1][3]})"
    raise BatchFileError(message, line=line, row=row, column=column)


def _row_position(text, row):
    """(line, mount name) of 1-based data row `row`."""
    for r, (line, cells) in enumerate(_scan_rows(text), start=1):
        if r == row:
            return line, cells[0]
    return None, ""


def _refuse_row(text, row_index, column_set, what):
    line, name = _row_position(text, row_index + 1)
    raise BatchFileError(f"line {line} (row {row_index + 1}, mount {name!r}), columns "
                         f"{', '.join(column_set.columns)}: {what}", line=line, row=row_index + 1,
                         column=column_set.columns[0])


def _structure_problems(text, header):
    """Rows with the wrong number of cells (loadtxt's usecols would not notice extra cells)."""
    if '"' in text:
        counts = ((line, len(cells)) for line, cells in _scan_rows(text))
    else:
        lines = text.splitlines()[1:]
        counts = ((i + 2, line.count(",") + 1) for i, line in enumerate(lines) if line.strip())
    return any(count != len(header) for _, count in counts)


def _read_cells(text, header, numeric):
    """Names (tuple) and the numeric columns (N, len(numeric)), or BatchFileError naming a bad cell."""
    if _structure_problems(text, header):
        _refuse(_locate_bad_cells(text, header, numeric), "rows of unequal length")
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", UserWarning)
            values = np.loadtxt(io.StringIO(_clean_number_text(text)), delimiter=",", skiprows=1,
                                usecols=numeric, quotechar='"', comments=None, ndmin=2, dtype=np.float64)
        with warnings.catch_warnings():
            # numpy remarks that blank lines are not counted as rows; skipping them is what we want.
            warnings.simplefilter("ignore", UserWarning)
            names = np.loadtxt(io.StringIO(text), delimiter=",", skiprows=1, usecols=[0], quotechar='"',
                               comments=None, ndmin=1, dtype=str)
    except ValueError as exc:
        _refuse(_locate_bad_cells(text, header, numeric), str(exc))
    if not np.isfinite(values).all():
        _refuse(_locate_bad_cells(text, header, numeric), "a cell holds NaN or infinity")
    return tuple(names.tolist()), values


# --- conversion to quaternions ----------------------------------------------------------------------

def _to_quaternions(column_set, values, text, notes):
    rep = column_set.representation
    scale = np.pi / 180.0 if column_set.degrees else 1.0
    if rep == "quaternion":
        norms = np.sqrt(np.einsum("ij,ij->i", values, values))
        if np.any(norms == 0):
            _refuse_row(text, int(np.argmin(norms)), column_set, "quaternion of zero length; expected a "
                        "non-zero (w, x, y, z)")
        off = np.abs(norms - 1.0)
        if off.max() > _QUATERNION_NOTICE:
            notes.append(f"{column_set.role}: {int(np.count_nonzero(off > _QUATERNION_NOTICE))} quaternion(s) "
                         f"normalised (largest norm departure {off.max():.2g})")
        return kernels.canonical_quaternions(values / norms[:, None])
    if rep == "matrix":
        m = values.reshape(-1, 3, 3)
        if column_set.matrix_meaning == "reference_to_body":
            m = np.swapaxes(m, 1, 2)
        rotations, error, det = kernels.nearest_rotations(m)
        bad = (det <= 0) | (error > WARNING_LIMIT)
        if bad.any():
            row = int(np.argmax(bad))
            _refuse_row(text, row, column_set, orthogonality_report(m[row]).message)
        corrected = error > 1e-9
        if corrected.any():
            notes.append(f"{column_set.role}: {int(np.count_nonzero(corrected))} matrix(es) not exactly "
                         f"orthonormal were replaced by their nearest rotation (largest orthogonality error "
                         f"{error.max():.2g})")
        return kernels.matrices_to_quaternions(rotations)
    if rep == "axis_angle":
        axis, angle = values[:, :3], values[:, 3] * scale
        zero = (np.einsum("ij,ij->i", axis, axis) == 0) & (angle != 0)
        if zero.any():
            _refuse_row(text, int(np.argmax(zero)), column_set, "rotation axis of zero length; expected a "
                        "non-zero direction (x, y, z)")
        return kernels.axis_angles_to_quaternions(axis, angle)
    if rep == "rotation_vector":
        return kernels.rotation_vectors_to_quaternions(values * scale)
    return kernels.angles_to_quaternions(values * scale, column_set.sequence, column_set.intrinsic)


def read_mounts(text, nominal=None, measured=None, progress=None):
    """Read a batch CSV (the text of the file) into unit quaternions per row. `nominal` / `measured` are
    optional SetConventions for a header that states none."""
    if not isinstance(text, str):
        raise InvalidInputError(f"batch file: expected the file's text, got {type(text).__name__}")
    text = text.lstrip("\ufeff")
    first_line = text.split("\n", 1)[0]
    header = next(csv.reader([first_line]), [])
    sets, ignored = _read_header(header, nominal, measured)
    _report(progress, 0, 1, "reading")
    numeric = [i for s in sets for i in s.indices]
    names, values = _read_cells(text, header, numeric)
    if len(names) == 0:
        raise BatchFileError("the file has a header but no rows; expected one row per mount", line=2)
    notes = [f"ignored column(s): {', '.join(ignored)}"] if ignored else []
    width = len(sets[0].indices)
    nominal_q = _to_quaternions(sets[0], values[:, :width], text, notes)
    measured_q = _to_quaternions(sets[1], values[:, width:], text, notes)
    _report(progress, 1, 1, "reading")
    return MountTable(names, nominal_q, measured_q, sets, tuple(notes))


# --- deviations -------------------------------------------------------------------------------------

def compute_deviations(table, settings=CheckSettings(), progress=None):
    """Deviation of every row under `settings` (vectorised; chunked only to report progress)."""
    n = len(table.names)
    axis = settings.axis_vector()
    total = np.empty(n)
    dev_axis = np.empty((n, 3))
    pointing = np.empty(n) if axis is not None else None
    roll = np.empty(n) if axis is not None else None
    judged_roll = np.empty(n) if axis is not None else None   # an undefined roll is judged as 180° (check.py)
    for start in range(0, n, CHUNK_ROWS):
        part = slice(start, min(start + CHUNK_ROWS, n))
        d = deviation_quaternions(table.nominal[part], table.measured[part])
        total[part] = np.degrees(deviation_angles(d))
        dev_axis[part] = deviation_axes(d)
        if axis is not None:
            swing, twist, defined = swing_twist_angles(d, axis)
            pointing[part] = np.degrees(swing)
            roll[part] = np.degrees(twist)
            judged_roll[part] = np.where(defined, np.abs(roll[part]), 180.0)
        _report(progress, part.stop, n, "computing")
    if settings.mode == "total":
        margin = settings.total_tolerance_deg - total
    else:
        margin = np.minimum(settings.pointing_tolerance_deg - pointing,
                            settings.roll_tolerance_deg - judged_roll)
    return BatchResult(table.names, total, dev_axis, pointing, roll, margin >= -ROUNDING_ALLOWANCE_DEG, margin, settings,
                       table.notes)


def _quote(name):
    if any(c in name for c in ',"\n\r') or name != name.strip():
        return '"' + name.replace('"', '""') + '"'
    return name


def write_results(result, decimals=9, progress=None):
    """The results as CSV text (header and one line per mount)."""
    columns = ["total_deviation_deg", "deviation_axis_x", "deviation_axis_y", "deviation_axis_z"]
    arrays = [result.total_deg, result.axis[:, 0], result.axis[:, 1], result.axis[:, 2]]
    if result.pointing_deg is not None:
        columns += ["pointing_error_deg", "roll_deg"]
        arrays += [result.pointing_deg, result.roll_deg]
    number = f"%.{int(decimals)}f"
    row_format = "%s," + ",".join([number] * len(arrays)) + ",%s," + number
    verdict = np.where(result.passed, "pass", "fail").tolist()
    names = [_quote(n) for n in result.names]
    lines = [",".join(["name"] + columns + ["result", "margin_deg"])]
    n = len(names)
    for start in range(0, n, CHUNK_ROWS):
        stop = min(start + CHUNK_ROWS, n)
        # Rounding first and adding 0.0 turns tiny negatives into 0.0, so no "-0.000000000" is written.
        cols = [(np.round(a[start:stop], decimals) + 0.0).tolist() for a in arrays + [result.margin_deg]]
        lines.extend(map(row_format.__mod__, zip(names[start:stop], *cols[:-1], verdict[start:stop], cols[-1])))
        _report(progress, stop, n, "writing")
    return "\n".join(lines) + "\n"


def run_batch(text, settings=CheckSettings(), nominal=None, measured=None, progress=None, decimals=9):
    """CSV text in, (BatchResult, results CSV text) out."""
    table = read_mounts(text, nominal, measured, progress)
    result = compute_deviations(table, settings, progress)
    return result, write_results(result, decimals, progress)
