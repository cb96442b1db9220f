"""What the person already knows (DecodeHints) and what decode returns (Reading)."""

from __future__ import annotations

from dataclasses import dataclass

from core import representations
from core.errors import DecodeError, FramewrightError

KINDS = representations.KINDS
_ORDER_ALIASES = {"wxyz": "wxyz", "w-first": "wxyz", "scalar-first": "wxyz", "xyzw": "xyzw",
                  "w-last": "xyzw", "scalar-last": "xyzw", "jpl": "jpl",
                  "angle-first": "angle-first", "axis-first": "axis-first"}
QUATERNION_ORDERS = ("wxyz", "xyzw", "jpl")
# the order of an axis and an angle, as the hint names it -> as a reading's conventions name it
AXIS_ANGLE_ORDERS = {"angle-first": "angle, axis", "axis-first": "axis, angle"}
_UNIT_ALIASES = {"deg": "deg", "degree": "deg", "degrees": "deg", "rad": "rad", "radian": "rad",
                 "radians": "rad"}


@dataclass(frozen=True)
class DecodeHints:
    """What the person already knows; each given hint removes the readings that disagree with it.

    kind: one of KINDS ('matrix', 'quaternion', 'axis-angle', 'rotation-vector', 'angles', ...), or any
    spelling core/representations.py accepts ('rotation_vector', 'rotvec', 'euler', ...)
    sequence: 'ZYX', "Z-Y'-X''", ...; intrinsic: True / False
    order: quaternion order 'wxyz', 'xyzw' (both Hamilton) or 'jpl' (scalar last, JPL convention); or the
        order of an axis and an angle: 'angle-first' or 'axis-first'
    units: 'deg' or 'rad'; transposed: False = matrix is body -> reference, True = reference -> body
    name: which transform to read when the text holds several named ones
    """
    kind: str | None = None
    sequence: str | None = None
    intrinsic: bool | None = None
    order: str | None = None
    units: str | None = None
    transposed: bool | None = None
    name: str | None = None

    @classmethod
    def coerce(cls, hints) -> "DecodeHints":
        if hints is None:
            return cls()
        if isinstance(hints, dict):
            unknown = set(hints) - set(cls.__dataclass_fields__)
            if unknown:
                raise DecodeError(f"unknown hint(s) {sorted(unknown)}; expected {sorted(cls.__dataclass_fields__)}")
            hints = cls(**hints)
        if not isinstance(hints, cls):
            raise DecodeError(f"hints must be DecodeHints or a dict, got {type(hints).__name__}")
        return hints.checked()

    def checked(self) -> "DecodeHints":
        from core.sequences import parse_sequence
        kind, order, units, sequence = self.kind, self.order, self.units, self.sequence
        if kind is not None:
            found = representations.lookup(kind)
            kind = found.kind if found is not None else None
            if kind is None:
                raise DecodeError(f"unknown kind hint {self.kind!r}; expected one of {', '.join(KINDS)}")
        if order is not None:
            order = _ORDER_ALIASES.get(str(order).lower())
            if order is None:
                raise DecodeError(f"unknown order hint {self.order!r}; expected wxyz, xyzw or jpl (a quaternion),"
                                  " or angle-first or axis-first (an axis and an angle)")
        if units is not None:
            units = _UNIT_ALIASES.get(str(units).lower())
            if units is None:
                raise DecodeError(f"unknown units hint {self.units!r}; expected deg or rad")
        if sequence is not None:
            try:
                sequence = parse_sequence(sequence)
            except FramewrightError as error:
                raise DecodeError(f"sequence hint: {error}") from None
        for name in ("intrinsic", "transposed"):
            if getattr(self, name) not in (None, True, False):
                raise DecodeError(f"the {name} hint must be true, false or not given; got {getattr(self, name)!r}")
        if self.name is not None and not isinstance(self.name, str):
            raise DecodeError(f"the name hint must be text; got {type(self.name).__name__}")
        return DecodeHints(kind, sequence, self.intrinsic, order, units, self.transposed, self.name)


@dataclass(frozen=True, eq=False)
class Reading:
    """One way of reading the pasted numbers.

    kind: one of KINDS; conventions: what this reading assumed (matrix meaning, quaternion order,
    units, sequence and intrinsic/extrinsic); orientation: the result; notes: repairs and warnings
    (normalised, orthogonality corrected and by how much, gimbal lock); why: why it ranks where it
    does; score: its plausibility (higher ranks first); label: a short name for a person."""
    kind: str
    conventions: dict
    orientation: object
    notes: tuple[str, ...]
    why: str
    score: float
    label: str
    numbers: tuple[float, ...]
    orthogonality_error: float | None = None
    # A pose's translation as written (x, y, z), its unit when the text names one ('m', 'mm', ...), and
    # the transform's name when the text holds several ('base_link -> imu', a YAML key); None otherwise.
    translation: tuple[float, float, float] | None = None
    translation_unit: str | None = None
    name: str | None = None
