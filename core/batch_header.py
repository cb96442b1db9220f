"""A batch file's header: which column sets it holds (nominal_ and measured_, each one field group of
core/representations.py or yaw pitch roll), the conventions written in brackets after a column name,
and the conventions passed in; the errors a batch file is refused with."""

from __future__ import annotations

import re
from dataclasses import dataclass

from core import representations
from core.errors import FramewrightError, InvalidInputError, SequenceError
from core.sequences import parse_sequence


UNCERTAINTY_COLUMN = "uncertainty_deg"

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
