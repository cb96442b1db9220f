"""What the export formats are asked for (FormatOptions) and the few facts every format derives from it:
which representation, its unit."""

from __future__ import annotations

from dataclasses import dataclass, replace

from core import representations
from core.errors import FramewrightError
from core.sequences import parse_sequence


# The representations every orientation has, in menu order (core/representations.py lists them); the
# Gibbs vector is accepted as well (KINDS) but refused at a half turn, where it is infinite.
REPRESENTATIONS = tuple(r.kind for r in representations.ALL if not r.half_turn_words)
KINDS = representations.KINDS


@dataclass(frozen=True)
class FormatOptions:
    """representation: which one the one-representation formats write (text, csv, python, c, matlab);
    decimals: None = exact shortest text, or a fixed number of decimals; sequence, intrinsic: for
    angles; degrees: angle units; scalar_last: quaternion order (x, y, z, w); transposed: write the
    matrix reference -> body (rows are the body axes); name: variable name in code, mount name in the
    report; timestamp: date and time for the report (the caller passes it: text or datetime);
    caution: the report's safety caution (SAFETY_CAUTION unless the caller passes its own wording);
    reference_frame: the frame preset (core/describe.py) naming the reference directions in the report's
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
    reference_frame: str | None = None
    gravity_down: tuple | None = None

    def checked(self) -> "FormatOptions":
        found = representations.lookup(self.representation)
        if found is None:
            raise FramewrightError(f"unknown representation {self.representation!r}; expected one of "
                                   f"{', '.join(KINDS)}")
        if self.decimals is not None and (isinstance(self.decimals, bool) or not (
                isinstance(self.decimals, int) and 0 <= self.decimals <= 17)):   # True is an int to Python, not a count
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


def _unit(o: FormatOptions) -> str:
    return "deg" if o.degrees else "rad"


def _representation(o: FormatOptions):
    return representations.by_kind(o.representation)


def _unit_of(o: FormatOptions) -> str:
    """'deg'/'rad' for a representation of angles, '' for pure numbers (the Rodrigues parameter sets)."""
    return representations.unit_text(_representation(o), o.degrees)
