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
    gibbs_x gibbs_y gibbs_z          Gibbs vector (classical Rodrigues parameters, n tan(angle/2))
    mrp_x mrp_y mrp_z                modified Rodrigues parameters (n tan(angle/4), either set)
    yaw pitch roll                   yaw–pitch–roll: intrinsic ZYX (= roll–pitch–yaw about fixed axes)
    angle1 angle2 angle3             three angles of a sequence that must be stated

(the field groups of core/representations.py, its batch_columns, plus yaw pitch roll)

Conventions are written in square brackets after a column name, as words separated by spaces, on any
one column of the set (or spread over several; they must not contradict each other)::

    deg | rad                                angles and rotation vectors (default deg)
    ZYX, Z-Y'-X'', XZX, ...                  the sequence of angle1..angle3
    intrinsic | extrinsic                    for angle1..angle3
    body_to_reference | reference_to_body    what the nine matrix numbers mean (default body_to_reference)

Example header::

    name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_angle1[XYZ extrinsic deg],measured_angle2,measured_angle3

An optional column ``uncertainty_deg`` gives each row's standard uncertainty u of the measured orientation
(degrees, 0 to 180, a number in every row), taken as the standard uncertainty of every figure judged. Rows
are then also decided by ISO 14253-1 (see core/decision.py): with U = k·u (coverage k, default 2) a row
*conforms* when its margin is at least U, *does not conform* when its margin is below −U, and otherwise
the measurement *cannot decide*.

Conventions can also be passed in (`SetConventions`) for a file whose header has none; a passed-in value
that contradicts the header is refused, never silently preferred. Other columns (serial, notes) are
ignored and named in the table's notes; an unknown ``nominal_``/``measured_`` column is refused (a typo).

A file that is not a table (its header unreadable, no rows, a line over MAX_LINE_CHARS, unbalanced
quotes) is refused whole with a BatchFileError naming the line (and column). A row whose numbers cannot
be trusted (not a number, not finite, outside the range its meaning allows, the wrong number of cells)
is an error row: a RowProblem names its line, column and what was expected; it is counted apart and never
judged pass or fail. Line endings may be LF, CR LF or a bare CR.

Output file
-----------
``name,total_deviation_deg,deviation_axis_x,deviation_axis_y,deviation_axis_z[,pointing_error_deg,roll_deg],result,margin_deg[,uncertainty_deg,decision],problem``
with the deviation D = Nᵀ M and its axis in the nominal body frame, the pointing error and roll of the
chosen body axis when one is set, ``pass``/``fail`` and the margin (tolerance − value, the smallest of
the criteria) under the CheckSettings given (see core/check.py); an error row has empty figures, ``error``
and its problem. Text cells are spreadsheet-safe (core/csv_cells.py).

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

from core import kernels, representations
from core.check import ROUNDING_ALLOWANCE_DEG, CheckSettings, deviation_angles, deviation_axes, deviation_quaternions, swing_twist_angles
from core.csv_cells import spreadsheet_safe
from core.decision import CANNOT_DECIDE, CONFORMS, DEFAULT_COVERAGE, DOES_NOT_CONFORM
from core.errors import FramewrightError, InvalidInputError, SequenceError
from core.nearest import WARNING_LIMIT, orthogonality_report
from core.sequences import parse_sequence

CHUNK_ROWS = 50_000
UNCERTAINTY_COLUMN = "uncertainty_deg"
MAX_UNCERTAINTY_DEG = 180.0

# {representation: its field group}: the registry's batch columns, and yaw-pitch-roll (angles of one
# sequence, named by their own words)
REPRESENTATIONS = {
    **{r.key: r.batch_columns for r in representations.ALL if r is not representations.ANGLES},
    "yaw_pitch_roll": ("yaw", "pitch", "roll"),
    "angles": representations.ANGLES.batch_columns,
}
_USES = {  # which conventions each representation takes
    **{r.key: ("degrees",) if r.units == representations.ANGLE else () for r in representations.ALL},
    "matrix": ("matrix_meaning",), "yaw_pitch_roll": ("degrees",),
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
                 "yaw_pitch_roll": "yaw-pitch-roll (intrinsic ZYX)", "angles": None,
                 **{r.key: r.name for r in representations.VECTORS + (representations.AXIS_ANGLE,)}}
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
    problems: tuple = ()    # RowProblem of every error row (its quaternions are placeholders, never judged)
    uncertainty: np.ndarray | None = None   # (N,) standard uncertainty in degrees, when the file has the column

    def error_rows(self):
        """(N,) True where the row is in error."""
        error = np.zeros(len(self.names), dtype=bool)
        error[[p.row for p in self.problems]] = True
        return error


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
    problems: tuple = ()          # RowProblem per error row; their figures are NaN and passed is False
    error: np.ndarray | None = None   # (N,) True where the row is in error (None: no error rows)
    uncertainty_deg: np.ndarray | None = None   # (N,) u per row, when the file gives it
    coverage: float = DEFAULT_COVERAGE
    decision: tuple | None = None  # ISO 14253-1 outcome per row ('' for error rows), with an uncertainty

    def decision_counts(self):
        """{outcome: rows} of the decided rows (empty without an uncertainty column)."""
        if self.decision is None:
            return {}
        return {o: self.decision.count(o) for o in (CONFORMS, DOES_NOT_CONFORM, CANNOT_DECIDE)}

    def error_mask(self):
        return np.zeros(len(self.names), dtype=bool) if self.error is None else self.error

    @property
    def error_count(self):
        return len(self.problems)

    @property
    def failed_count(self):
        """Rows judged and outside the tolerance (error rows are counted apart)."""
        return int(np.count_nonzero(~self.passed & ~self.error_mask()))

    @property
    def passed_count(self):
        return int(np.count_nonzero(self.passed))

    def verdicts(self):
        """'pass', 'fail' or 'error' per row, in file order."""
        return np.where(self.error_mask(), "error", np.where(self.passed, "pass", "fail")).tolist()

    def problem_texts(self):
        """{row: message} of the error rows."""
        return {p.row: p.message for p in self.problems}


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
    uncertainty = None
    for index, cell in enumerate(header[1:], start=1):
        if cell.strip().lower() == UNCERTAINTY_COLUMN:
            if uncertainty is not None:
                raise BatchFileError(f"line 1: the column {UNCERTAINTY_COLUMN!r} appears twice", line=1, column=cell)
            uncertainty = index
            continue
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
    return sets, ignored, uncertainty


# --- cells ------------------------------------------------------------------------------------------

# Caps checked before the csv module sees the text (its own limit, 131,072 characters per field, is
# process-wide and raises a bare csv.Error): no number or name needs more.
MAX_LINE_CHARS = 100_000
MAX_HEADER_CHARS = 20_000
MAX_CELL_CHARS = 1_000
# The range each kind of number may take before any arithmetic. Angles: ten turns, as the decoder allows
# (beyond that a decimal point was lost, not a mount measured). Matrix entries of a rotation lie in
# [-1, 1]; 1.5 leaves room for rounding and still keeps the SVD far from overflow. A quaternion is about
# unit; a length outside [1e-6, 1e6] is a misplaced number, not one to normalise.
MAX_ANGLE_DEG = 3600.0
MAX_MATRIX_ENTRY = 1.5
QUATERNION_LENGTHS = (1e-6, 1e6)


@dataclass(frozen=True)
class RowProblem:
    """Why one data row cannot be checked. row: 0-based data row; line: 1-based line in the file;
    column: the header cell at fault (None for the row as a whole)."""

    row: int
    line: int | None
    column: str | None
    message: str


def _clean_number_text(text):
    return text.replace("−", "-").replace("–", "-").replace("\u00a0", " ")


def normalise_line_ends(text):
    """CR LF and old-style bare CR become LF, so every reader sees the same lines."""
    return text.replace("\r\n", "\n").replace("\r", "\n")


def _check_line_lengths(text, header):
    """Refuse a line too long to be a table's (naming line and column) before the csv module sees it."""
    for number, line in enumerate(text.split("\n"), start=1):
        limit = MAX_HEADER_CHARS if number == 1 else MAX_LINE_CHARS
        if len(line) > limit:
            pieces = line.split(",")
            index = next((i for i, piece in enumerate(pieces) if len(piece) > MAX_CELL_CHARS), None)
            column = header[index] if header and index is not None and index < len(header) else None
            where = f", column {column!r}" if column else (f", cell {index + 1}" if index is not None else "")
            raise BatchFileError(f"line {number}{where}: the line is {len(line):,} characters long; expected "
                                 f"at most {limit:,}", line=number, column=column)


def _scan_rows(text):
    """(line number, cells) of every non-blank data row, by the csv module (used to locate problems)."""
    reader = csv.reader(io.StringIO(text))
    try:
        next(reader, None)
        for cells in reader:
            if cells and any(c.strip() for c in cells):
                yield reader.line_num, cells
    except csv.Error as error:
        raise BatchFileError(f"line {reader.line_num}: the file is not readable as CSV ({error}); expected "
                             f"comma-separated cells with balanced quotes", line=reader.line_num) from None


def _cell_problem(cell):
    if len(cell) > MAX_CELL_CHARS:
        return f"the cell is {len(cell):,} characters long; expected a number"
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


def _where(line, row, name):
    return f"line {line} (row {row + 1}, mount {name[:80]!r})"


def _row_problem(row, line, cells, header, numeric):
    """The first problem of one row (a RowProblem) or None."""
    where = _where(line, row, cells[0])
    if len(cells) != len(header):
        return RowProblem(row, line, None, f"{where} has {len(cells)} cells; expected {len(header)} as in "
                          f"the header")
    if len(cells[0]) > MAX_CELL_CHARS:
        return RowProblem(row, line, header[0], f"{where}, column {header[0]!r}: the name is "
                          f"{len(cells[0]):,} characters long; expected at most {MAX_CELL_CHARS:,}")
    for index in numeric:
        problem = _cell_problem(cells[index])
        if problem:
            return RowProblem(row, line, header[index], f"{where}, column {header[index]!r}: {problem}")
    return None


def _read_one_by_one(text, header, numeric):
    """Every row through the csv module: names, values (NaN in rows that cannot be read) and problems."""
    names, rows, problems = [], [], []
    for row, (line, cells) in enumerate(_scan_rows(text)):
        names.append(cells[0][:MAX_CELL_CHARS])
        problem = _row_problem(row, line, cells, header, numeric)
        if problem is None:
            rows.append([float(_clean_number_text(cells[i]).strip()) for i in numeric])
        else:
            problems.append(problem)
            rows.append([np.nan] * len(numeric))
    values = np.array(rows, dtype=np.float64).reshape(len(rows), len(numeric))
    return tuple(names), values, problems


def _structure_problems(text, header):
    """Rows with the wrong number of cells (loadtxt's usecols would not notice extra cells)."""
    if '"' in text:
        counts = ((line, len(cells)) for line, cells in _scan_rows(text))
    else:
        lines = text.splitlines()[1:]
        counts = ((i + 2, line.count(",") + 1) for i, line in enumerate(lines) if line.strip())
    return any(count != len(header) for _, count in counts)


def _read_cells(text, header, numeric):
    """Names (tuple), the numeric columns (N, len(numeric)) and the RowProblems of rows that cannot be
    read. Clean files take numpy's fast reader; any doubt sends every row through the csv module."""
    if _structure_problems(text, header):
        return _read_one_by_one(text, header, numeric)
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
    except ValueError:
        return _read_one_by_one(text, header, numeric)
    if not np.isfinite(values).all() or values.shape[0] != names.shape[0] \
            or (names.size and max(map(len, names.tolist())) > MAX_CELL_CHARS):
        return _read_one_by_one(text, header, numeric)
    return tuple(names.tolist()), values, []


# --- conversion to quaternions ----------------------------------------------------------------------

def scaled_lengths(v):
    """Euclidean length of each row of v (N, k), scaled first (divided by its largest magnitude), so a
    component of 1e200 neither overflows nor one of 1e-200 underflows."""
    scale = np.abs(v).max(axis=1)
    safe = np.where(scale > 0, scale, 1.0)
    with np.errstate(over="ignore"):   # only a length beyond the largest float becomes inf (then refused)
        return scale * np.sqrt(np.einsum("ij,ij->i", v / safe[:, None], v / safe[:, None]))


def _first_bad(bad, usable):
    return np.flatnonzero(bad & usable)


def _to_quaternions(column_set, values, usable, notes):
    """Unit quaternions (N, 4) of the rows marked usable (identity elsewhere) and {row: what is wrong}
    for usable rows whose numbers fall outside the range their meaning allows."""
    rep = column_set.representation
    n = len(values)
    out = np.tile([1.0, 0.0, 0.0, 0.0], (n, 1))
    problems = {}
    limit = MAX_ANGLE_DEG if column_set.degrees else np.radians(MAX_ANGLE_DEG)
    unit = "deg" if column_set.degrees else "rad"
    columns = ", ".join(column_set.columns)
    safe = np.where(usable[:, None], values, 0.0)

    def refuse(bad, what):
        for row in _first_bad(bad, usable):
            problems.setdefault(int(row), what(int(row)))
        return usable & ~bad

    scale = np.pi / 180.0 if column_set.degrees else 1.0
    if rep == "quaternion":
        norms = scaled_lengths(safe)
        low, high = QUATERNION_LENGTHS
        ok = refuse((norms < low) | (norms > high),
                    lambda r: f"columns {columns}: quaternion of length {norms[r]:.3g}; expected a unit "
                              f"quaternion (length about 1, w x y z not all zero)")
        off = np.abs(norms - 1.0)[ok]
        if off.size and off.max() > _QUATERNION_NOTICE:
            notes.append(f"{column_set.role}: {int(np.count_nonzero(off > _QUATERNION_NOTICE))} quaternion(s) "
                         f"normalised (largest norm departure {off.max():.2g})")
        if ok.any():
            out[ok] = kernels.canonical_quaternions(safe[ok] / norms[ok, None])
        return out, problems, ok
    if rep == "matrix":
        big = np.abs(safe).max(axis=1) > MAX_MATRIX_ENTRY
        ok = refuse(big, lambda r: f"columns {columns}: an entry of {np.abs(safe[r]).max():.3g} cannot belong "
                                   f"to a rotation matrix; expected entries between -1 and 1")
        if not ok.any():
            return out, problems, ok
        m = safe[ok].reshape(-1, 3, 3)
        if column_set.matrix_meaning == "reference_to_body":
            m = np.swapaxes(m, 1, 2)
        rotations, error, det = kernels.nearest_rotations(m)
        rows = np.flatnonzero(ok)
        bad_rows = (det <= 0) | (error > WARNING_LIMIT)
        for k in np.flatnonzero(bad_rows):
            problems[int(rows[k])] = f"columns {columns}: {orthogonality_report(m[k]).message}"
        good = ~bad_rows
        corrected = (error > 1e-9) & good
        if corrected.any():
            notes.append(f"{column_set.role}: {int(np.count_nonzero(corrected))} matrix(es) not exactly "
                         f"orthonormal were replaced by their nearest rotation (largest orthogonality error "
                         f"{error[corrected].max():.2g})")
        ok = ok.copy()
        ok[rows[bad_rows]] = False
        if good.any():
            out[rows[good]] = kernels.matrices_to_quaternions(rotations[good])
        return out, problems, ok
    if rep == "axis_angle":
        axis, angle = safe[:, :3], safe[:, 3]
        ok = refuse(np.abs(angle) > limit, lambda r: f"column {column_set.columns[3]!r}: angle "
                    f"{angle[r]:.6g} {unit}; expected at most {limit:g} {unit} either way")
        ok = refuse((np.abs(axis).max(axis=1) == 0) & (angle != 0),
                    lambda r: f"columns {columns}: rotation axis of zero length; expected a non-zero "
                              f"direction (x, y, z)") & ok
        if ok.any():
            out[ok] = kernels.axis_angles_to_quaternions(axis[ok], angle[ok] * scale)
        return out, problems, ok
    vector = representations.BY_KEY.get(rep)
    if vector is not None and vector.vector:
        ok = usable
        if vector.units == representations.ANGLE:
            lengths = scaled_lengths(safe)
            ok = refuse(lengths > limit, lambda r: f"columns {columns}: {vector.name} of length "
                        f"{lengths[r]:.6g} {unit}; expected at most {limit:g} {unit}")
        else:
            scale = 1.0                 # pure numbers: any finite vector is an orientation
        if ok.any():
            out[ok] = vector.to_quaternions(safe[ok] * scale)
        return out, problems, ok
    big = np.abs(safe).max(axis=1) > limit
    ok = refuse(big, lambda r: f"columns {columns}: an angle of {np.abs(safe[r]).max():.6g} {unit}; "
                               f"expected at most {limit:g} {unit} either way")
    if ok.any():
        out[ok] = kernels.angles_to_quaternions(safe[ok] * scale, column_set.sequence, column_set.intrinsic)
    return out, problems, ok


def _row_lines(text):
    """1-based line of every data row, in order."""
    return [line for line, _ in _scan_rows(text)]


def read_mounts(text, nominal=None, measured=None, progress=None):
    """Read a batch CSV (the text of the file) into unit quaternions per row. `nominal` / `measured` are
    optional SetConventions for a header that states none.

    A file whose header cannot be read, with no rows, with a line too long or with unbalanced quotes is
    refused whole (BatchFileError). A row whose numbers cannot be trusted (not a number, not finite, out of
    the range its meaning allows, the wrong number of cells) becomes an error row: its RowProblem names
    line, column and what was expected, and it is never judged."""
    if not isinstance(text, str):
        raise InvalidInputError(f"batch file: expected the file's text, got {type(text).__name__}")
    text = normalise_line_ends(text.lstrip("\ufeff"))
    first_line = text.split("\n", 1)[0]
    if len(first_line) > MAX_HEADER_CHARS:
        _check_line_lengths(first_line, None)
    header = next(csv.reader([first_line]), [])
    sets, ignored, uncertainty_index = _read_header(header, nominal, measured)
    _check_line_lengths(text, header)
    _report(progress, 0, 1, "reading")
    numeric = [i for s in sets for i in s.indices] + ([uncertainty_index] if uncertainty_index else [])
    names, values, problems = _read_cells(text, header, numeric)
    if len(names) == 0:
        raise BatchFileError("the file has a header but no rows; expected one row per mount", line=2)
    notes = [f"ignored column(s): {', '.join(ignored)}"] if ignored else []
    width = len(sets[0].indices)
    usable = np.ones(len(names), dtype=bool)
    usable[[p.row for p in problems]] = False
    nominal_q, bad_nominal, usable = _to_quaternions(sets[0], values[:, :width], usable, notes)
    measured_q, bad_measured, usable = _to_quaternions(sets[1], values[:, width:width + len(sets[1].indices)],
                                                       usable, notes)
    found = {**bad_measured, **bad_nominal}
    uncertainty = None
    if uncertainty_index:
        uncertainty = values[:, -1].copy()
        bad_u = usable & ~((uncertainty >= 0) & (uncertainty <= MAX_UNCERTAINTY_DEG))
        lines = _row_lines(text) if bad_u.any() else []
        for row in np.flatnonzero(bad_u):
            if row not in found:
                problems.append(RowProblem(int(row), lines[row], header[uncertainty_index],
                                           f"{_where(lines[row], row, names[row])}, column {header[uncertainty_index]!r}:"
                                           f" {uncertainty[row]:g} is not a standard uncertainty; expected 0 to"
                                           f" {MAX_UNCERTAINTY_DEG:g} degrees"))
        uncertainty[~usable | bad_u] = np.nan
    if found:
        lines = _row_lines(text)
        for row, what in found.items():
            column_set = sets[0] if row in bad_nominal else sets[1]
            problems.append(RowProblem(row, lines[row], column_set.columns[0],
                                       f"{_where(lines[row], row, names[row])}, {what}"))
    _report(progress, 1, 1, "reading")
    return MountTable(names, nominal_q, measured_q, sets, tuple(notes),
                      tuple(sorted(problems, key=lambda p: p.row)), uncertainty)


# --- deviations -------------------------------------------------------------------------------------

def compute_deviations(table, settings=CheckSettings(), progress=None, coverage=DEFAULT_COVERAGE):
    """Deviation of every row under `settings` (vectorised; chunked only to report progress); with an
    uncertainty column, the ISO 14253-1 decision of every row with expanded uncertainty U = coverage·u."""
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
    error = table.error_rows()
    problems = list(table.problems)
    figures = [total, dev_axis, margin] + ([pointing, roll] if axis is not None else [])
    # Belt and braces: a figure that came out non-finite from trusted input is an error, never a verdict.
    unfinished = ~error & ~np.logical_and.reduce([np.isfinite(f).reshape(n, -1).all(axis=1) for f in figures])
    if unfinished.any():
        for row in np.flatnonzero(unfinished):
            problems.append(RowProblem(int(row), None, None, f"row {row + 1} (mount {table.names[row][:80]!r}): the deviation could not be "
                                       "computed as a finite number; expected finite, in-range numbers"))
        error = error | unfinished
    for f in figures:
        f[error] = np.nan
    passed = (margin >= -ROUNDING_ALLOWANCE_DEG) & ~error
    decision = None
    if table.uncertainty is not None:
        coverage = _coverage(coverage)
        expanded = coverage * table.uncertainty
        outcome = np.where(margin >= expanded - ROUNDING_ALLOWANCE_DEG, CONFORMS,
                           np.where(margin < -expanded - ROUNDING_ALLOWANCE_DEG, DOES_NOT_CONFORM, CANNOT_DECIDE))
        decision = tuple(np.where(error, "", outcome).tolist())
    return BatchResult(table.names, total, dev_axis, pointing, roll, passed, margin, settings, table.notes,
                       tuple(sorted(problems, key=lambda p: p.row)), error if error.any() else None,
                       table.uncertainty, coverage, decision)


def _coverage(k):
    if isinstance(k, bool) or not isinstance(k, (int, float)) or not np.isfinite(k) or not 1 <= k <= 10:
        raise InvalidInputError(f"coverage factor: expected a number from 1 to 10 (usually 2), got {k!r}")
    return float(k)



def _quote(cell):
    cell = spreadsheet_safe(cell)
    if any(c in cell for c in ',"\n\r') or cell != cell.strip():
        return '"' + cell.replace('"', '""') + '"'
    return cell


def write_results(result, decimals=9, progress=None):
    """The results as CSV text (header and one line per mount). Error rows have empty figures, the result
    'error' and the problem in the last column; text cells are made spreadsheet-safe (core/csv_cells.py)."""
    columns = ["total_deviation_deg", "deviation_axis_x", "deviation_axis_y", "deviation_axis_z"]
    arrays = [result.total_deg, result.axis[:, 0], result.axis[:, 1], result.axis[:, 2]]
    if result.pointing_deg is not None:
        columns += ["pointing_error_deg", "roll_deg"]
        arrays += [result.pointing_deg, result.roll_deg]
    number = f"%.{int(decimals)}f"
    decided = result.decision is not None
    row_format = "%s," + ",".join([number] * len(arrays)) + ",%s," + number + (f",{number},%s," if decided else ",")
    verdict = result.verdicts()
    names = [_quote(n) for n in result.names]
    problems = result.problem_texts()
    blank = "," * len(arrays) + ",error,," + (",," if decided else "")
    lines = [",".join(["name"] + columns + ["result", "margin_deg"] + (["uncertainty_deg", "decision"] if decided
                                                                         else []) + ["problem"])]
    n = len(names)
    for start in range(0, n, CHUNK_ROWS):
        stop = min(start + CHUNK_ROWS, n)
        # Rounding first and adding 0.0 turns tiny negatives into 0.0, so no "-0.000000000" is written.
        cols = [(np.round(a[start:stop], decimals) + 0.0).tolist() for a in arrays + [result.margin_deg]]
        extra = []
        if decided:
            extra = [(np.round(result.uncertainty_deg[start:stop], decimals) + 0.0).tolist(),
                     list(result.decision[start:stop])]
        lines.extend(map(row_format.__mod__, zip(names[start:stop], *cols[:-1], verdict[start:stop], cols[-1],
                                                  *extra)))
        for row in (r for r in problems if start <= r < stop):
            lines[1 + row] = names[row] + blank + _quote(problems[row])
        _report(progress, stop, n, "writing")
    return "\n".join(lines) + "\n"


def run_batch(text, settings=CheckSettings(), nominal=None, measured=None, progress=None, decimals=9,
              coverage=DEFAULT_COVERAGE):
    """CSV text in, (BatchResult, results CSV text) out."""
    table = read_mounts(text, nominal, measured, progress)
    result = compute_deviations(table, settings, progress, coverage)
    return result, write_results(result, decimals, progress)
