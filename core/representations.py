"""Every representation of an orientation, listed once: its names, how many numbers it takes, the words
that name it in pasted text, its batch and CSV columns, its JSON key, its units and the Orientation pair
that builds and reads it. Decode, the export formats, the batch check, the command line, Copy as and the
Scene overlay read from here, so adding a representation is one entry (plus its kernels, its
Orientation pair and its editor).

Spellings: `key` is the one spelling in code and files we write ('rotation_vector'). `kind` is the word a
decoded reading, a format's `representation` option and the command line's --kind print: it is the key
with '-' for '_' ('rotation-vector'), as it has always been written there. `lookup` accepts the key, the
kind and every alias, in any letter case.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from core import kernels
from core.kernels import rodrigues
from core.errors import FramewrightError

ANGLE = "angle"        # the numbers are (or contain) angles: degrees or radians as chosen
PURE = "pure"          # pure numbers, no unit


@dataclass(frozen=True)
class Representation:
    """One representation. Fields used only by three-number vectors (`vector` True) say so.

    key: the one spelling in code ('rotation_vector'); name: words in a sentence ('rotation vector');
    count: how many numbers; aliases: other spellings accepted as hints and options;
    caption_words: a regular expression (lower case) of the words that name it in pasted text;
    caption_only: decode reads bare numbers as this only when the text or a hint names it;
    caption: the caption our exports write before the numbers ('{u}' the unit), which decodes back;
    batch_columns: the field group of a batch CSV column set; csv_columns: the Copy as CSV header
    ('{u}' the unit); json_key: its entry in our JSON object (degrees for angles; None: not there);
    units: ANGLE or PURE; constructor / reader: the Orientation.from_* / as_* pair;
    symbol and formula: how the Scene overlay writes it ('ρ', 'φ n');
    to_quaternions: the vectorised kernel from the numbers (radians) to quaternions (batch);
    half_turn_words: what is said instead of numbers where the representation does not exist."""

    key: str
    name: str
    count: int
    aliases: tuple = ()
    caption_words: str = ""
    caption_only: bool = False
    vector: bool = False
    caption: str = ""
    batch_columns: tuple = ()
    csv_columns: tuple = ()
    json_key: str | None = None
    units: str = ANGLE
    constructor: str = ""
    reader: str = ""
    symbol: str = ""
    formula: str = ""
    to_quaternions: object = None
    half_turn_words: str = ""
    keys: tuple = ()
    short_title: str = ""

    @property
    def menu_title(self) -> str:
        """The title where room is short (a combo box): 'MRP'."""
        return self.short_title or self.title

    @property
    def key_names(self) -> frozenset:
        """Keys that name the whole vector in keyed text ('rotvec = [...]', 'gibbs: ...')."""
        spellings = (self.key, self.name, *self.aliases, *self.keys)
        return frozenset(s.lower() for s in spellings) | frozenset(s.lower().replace(" ", "_") for s in spellings)

    @property
    def component_prefixes(self) -> tuple:
        """'rv_', 'rotvec_': what the names of its x, y, z columns start with ('rv_x', 'rotvec_y_deg')."""
        return tuple(dict.fromkeys(c[:c.index("_") + 1] for c in self.batch_columns + self.csv_columns))

    @property
    def kind(self) -> str:
        return self.key.replace("_", "-")

    @property
    def title(self) -> str:
        return self.name[:1].upper() + self.name[1:]

    @property
    def identifier(self) -> str:
        """A variable name for code exports ('{u}' the unit where the numbers are angles)."""
        return self.key + ("_{u}" if self.units == ANGLE and self.vector else "")

    def values(self, orientation, degrees=True):
        """The three numbers of a vector representation of `orientation` (degrees or radians for angles)."""
        read = getattr(orientation, self.reader)
        return read(degrees=degrees) if self.units == ANGLE else read()

    def orientation(self, values, degrees=True):
        """The Orientation of the numbers of a vector representation."""
        from core.orientation import Orientation
        make = getattr(Orientation, self.constructor)
        return make(values, degrees=degrees) if self.units == ANGLE else make(values)


MATRIX = Representation(
    "matrix", "rotation matrix", 9, aliases=("dcm", "rotation_matrix"),
    batch_columns=tuple(f"r{i}{j}" for i in (1, 2, 3) for j in (1, 2, 3)), json_key="matrix", units=PURE,
    constructor="from_matrix", reader="as_matrix")
QUATERNION = Representation(
    "quaternion", "quaternion", 4, aliases=("quat",),
    caption_words=r"quaternion|(?<![a-z])quat(?![a-z])|versor",
    batch_columns=("qw", "qx", "qy", "qz"), json_key="quaternion_wxyz", units=PURE,
    constructor="from_quaternion", reader="as_quaternion")
AXIS_ANGLE = Representation(
    "axis_angle", "axis and angle", 4, aliases=("axisangle",),
    caption_words=r"axis[ _-]?(?:and[ _-]?)?angle|angle[ _-]?axis",
    batch_columns=("axis_x", "axis_y", "axis_z", "angle"), csv_columns=("axis_x", "axis_y", "axis_z", "angle_{u}"),
    json_key="angle_deg", constructor="from_axis_angle", reader="as_axis_angle")
ROTATION_VECTOR = Representation(
    "rotation_vector", "rotation vector", 3, aliases=("rotvec",),
    caption_words=r"rotation[ _-]?vector|rotvec|(?<![a-z])rvecs?(?![a-z])|(?<![a-z])om(?![a-z])",
    vector=True, caption="Rotation vector ({u})",
    batch_columns=("rv_x", "rv_y", "rv_z"), csv_columns=("rotvec_x_{u}", "rotvec_y_{u}", "rotvec_z_{u}"),
    json_key="rotation_vector_deg", constructor="from_rotation_vector", reader="as_rotation_vector",
    symbol="\u03c1", formula="\u03c6 n", to_quaternions=kernels.rotation_vectors_to_quaternions,
    keys=("rvec", "rvecs", "om"))
GIBBS = Representation(
    "gibbs", "Gibbs vector", 3,
    aliases=("gibbs_vector", "gibbs-vector", "rodrigues_parameters", "classical_rodrigues_parameters", "crp"),
    caption_words=r"(?<![a-z])gibbs(?![a-z])|(?<!modified )(?<!modified[_-])(?<![a-z])(?:classical[ _-]?)?"
                  r"rodrigues[ _-]?param(?:eter)?s?(?![a-z])",
    caption_only=True, vector=True, caption="Gibbs vector (classical Rodrigues parameters)",
    batch_columns=("gibbs_x", "gibbs_y", "gibbs_z"), csv_columns=("gibbs_x", "gibbs_y", "gibbs_z"),
    json_key="gibbs", units=PURE, constructor="from_gibbs", reader="as_gibbs",
    symbol="g", formula="n tan(\u03c6/2)", to_quaternions=rodrigues.gibbs_to_quaternions,
    half_turn_words="infinite at a half turn (180°): it does not exist there")
MRP = Representation(
    "mrp", "modified Rodrigues parameters", 3,
    aliases=("mrps", "modified_rodrigues_parameters", "modified-rodrigues-parameters"),
    caption_words=r"(?<![a-z])mrps?(?![a-z])|modified[ _-]?rodrigues[ _-]?param(?:eter)?s?(?![a-z])",
    caption_only=True, vector=True, caption="Modified Rodrigues parameters (MRP)",
    batch_columns=("mrp_x", "mrp_y", "mrp_z"), csv_columns=("mrp_x", "mrp_y", "mrp_z"),
    json_key="mrp", units=PURE, constructor="from_mrp", reader="as_mrp",
    symbol="p", formula="n tan(\u03c6/4)", to_quaternions=rodrigues.mrps_to_quaternions, short_title="MRP")
ANGLES = Representation(
    "angles", "angles", 3, aliases=("euler", "euler_angles", "tait_bryan"),
    caption_words=r"euler|tait|(?<![a-z])(?:yaw|pitch|roll|heading)(?![a-z])|(?<![a-z])angles(?![a-z])",
    batch_columns=("angle1", "angle2", "angle3"), json_key="angles_deg",
    constructor="from_angles", reader="as_angles")

# In the order people meet them (the editors', the command line's and the formats' order).
ALL = (MATRIX, QUATERNION, AXIS_ANGLE, ROTATION_VECTOR, ANGLES, GIBBS, MRP)
BY_KEY = {r.key: r for r in ALL}
KINDS = tuple(r.kind for r in ALL)
VECTORS = tuple(r for r in ALL if r.vector)
COUNTS = {n: tuple(r.kind for r in ALL if r.count == n) for n in sorted({r.count for r in ALL}, reverse=True)}

_LOOKUP = {}
for _r in ALL:
    for _spelling in (_r.key, _r.kind, _r.name, *_r.aliases):
        _LOOKUP[_spelling.lower()] = _r
        _LOOKUP[_spelling.lower().replace(" ", "_")] = _r
        _LOOKUP[_spelling.lower().replace(" ", "-")] = _r
del _r, _spelling


def lookup(spelling) -> Representation | None:
    """The representation a spelling names (key, kind, name or alias, any case), or None."""
    return _LOOKUP.get(str(spelling).strip().lower())


def by_kind(kind: str) -> Representation:
    """The representation of a decoded reading's kind ('rotation-vector')."""
    found = lookup(kind)
    if found is None:
        raise FramewrightError(f"unknown representation {kind!r}; expected one of {', '.join(KINDS)}")
    return found


def caption_patterns() -> dict:
    """{kind: compiled pattern} of the words that name each representation in pasted text."""
    return {r.kind: re.compile(r.caption_words) for r in ALL if r.caption_words}


def unit_text(representation: Representation, degrees: bool) -> str:
    """'deg' or 'rad' for angles, '' for pure numbers."""
    return ("deg" if degrees else "rad") if representation.units == ANGLE else ""


__all__ = ["ALL", "ANGLE", "ANGLES", "AXIS_ANGLE", "BY_KEY", "COUNTS", "GIBBS", "KINDS", "MATRIX", "MRP", "PURE",
           "QUATERNION", "ROTATION_VECTOR", "Representation", "VECTORS", "by_kind", "caption_patterns", "lookup",
           "unit_text"]
