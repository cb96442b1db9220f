"""Candidate readings for 9 and 3 numbers (four_numbers.py: 4), each with its score and the reasons for it,
and the one table of ranking bonuses every candidate draws on."""

from __future__ import annotations

import math
from dataclasses import dataclass, field

import numpy as np

from core import representations
from core.representations import ANGLES, AXIS_ANGLE, QUATERNION, ROTATION_VECTOR
from core.errors import DecodeError
from core.decode.clues import YAW_PITCH_ROLL_STATED_EXTRINSIC, _Clues
from core.decode.hints import DecodeHints

# Every ranking bonus in one table: the points a candidate earns (or loses) for each kind of evidence.
# Readers of the numbers: a unit norm, a largest first or last element, an axis of unit length are what the
# values say; "the text ..." entries are what the words say; named numbers (w = …, axis = …) say the most.
POINTS = {
    "matrix direction named": 2.0,          # 'body to reference', 'DCM', 'C_b^n'
    "unit quaternion": 1.0, "near unit quaternion": 0.3, "far from unit": -1.5,
    "largest first or last": 1.0, "w first by default": 0.2,
    "jpl offered last": -3.0, "order named": 2.0, "jpl named": 6.0,
    "unit axis": 1.0, "near unit axis": -1.5, "far from unit axis": -2.5,
    "angle beyond one": 2.5, "four numbers of unit norm": -1.0, "angle written first": 3.5,
    "angle first by the values": 0.5,
    "proper Euler middle outside 0..180": -0.7, "Tait-Bryan middle beyond 90": -1.0,
    "rotation vector prior": 0.9,
    # units read from the values alone (whole numbers, decimals within ±2π, multiples of 15° in radians)
    "decimals within 2 pi": 0.6, "multiple of pi/12": 1.0, "whole numbers": 0.6,
    # a title line set aside ('Mount 7 rotation:' above the numbers) makes a reading a little less likely
    "without the title line": -0.5,
    # a pose's 'orientation' list of 4 numbers without an order named (pose_keys)
    "orientation list scalar last": 1.0,
    # a parameter set read only when named (core/representations.py, caption_only): named, it
    # outranks what bare numbers suggest; unnamed, it is never offered
    "caption names a parameter set": 3.0,
}
# The text names the kind ('quaternion', 'axis-angle', 'yaw', 'rvec'), and numbers named as that kind
TEXT_NAMES_KIND = {QUATERNION.kind: 1.5, AXIS_ANGLE.kind: 1.5, ANGLES.kind: 1.0, ROTATION_VECTOR.kind: 3.0}
NAMED_NUMBERS = {QUATERNION.kind: 1.0, AXIS_ANGLE.kind: 3.0, ROTATION_VECTOR.kind: 3.0}

_TWO_PI = 2 * math.pi
_MAX_MAGNITUDE = 1e9
_NEAR_LOCK_DEG = 5.0
_COMMON_SEQUENCES = (   # (sequence, intrinsic, prior, why) when the text names none
    ("ZYX", True, 1.5, "yaw-pitch-roll (intrinsic Z-Y'-X''), the most common sequence"),
    ("XYZ", False, 1.2, "roll-pitch-yaw about fixed axes (extrinsic X-Y-Z), common in robotics"),
    ("XYZ", True, 0.5, "intrinsic X-Y'-Z''"),
    ("ZYX", False, 0.5, "extrinsic Z-Y-X"),
    ("ZXZ", True, 0.3, "proper Euler Z-X'-Z''"),
    ("ZYZ", True, 0.3, "proper Euler Z-Y'-Z''"),
    ("ZXZ", False, 0.1, "proper Euler, extrinsic Z-X-Z"),
    ("ZYZ", False, 0.1, "proper Euler, extrinsic Z-Y-Z"),
)


@dataclass
class _Candidate:
    kind: str
    conventions: dict
    make: object                 # () -> Orientation; may raise FramewrightError
    label: str
    score: float = 0.0
    reasons: list = field(default_factory=list)
    notes: list = field(default_factory=list)
    orthogonality_error: float | None = None

    def plus(self, points: float, reason: str) -> "_Candidate":
        self.score += points
        if reason:
            self.reasons.append(reason)
        return self


def _unit_choices(values, hints: DecodeHints, clues: _Clues, fixed: str | None):
    """[(units, points, reason)]: the rule of thumb is that whole numbers above 2π are degrees, and
    numbers all within ±2π with decimals may well be radians."""
    if hints.units == "deg" and clues.pi_written:
        raise DecodeError(f"'{clues.pi_written}' is an angle in radians (π is half a turn); the degrees hint"
                          " contradicts it: drop the hint or write the value in degrees")
    if hints.units:
        return [(hints.units, 0.0, "units given")]
    if fixed:
        return [(fixed, 0.0, "units named with the numbers")]
    if clues.units:
        return [(clues.units, 0.0, clues.units_reason)]
    values = [float(v) for v in values]
    if any(abs(v) > _TWO_PI + 1e-9 for v in values):
        return [("deg", 0.0, "a value beyond ±2π: degrees")]
    if any(v != round(v) for v in values):
        points = POINTS["decimals within 2 pi"]
        if any(v != 0 and abs(v / (math.pi / 12) - round(v / (math.pi / 12))) < 2e-4 for v in values):
            points = POINTS["multiple of pi/12"]
        return [("rad", points, "all within ±2π with decimals: may be radians"),
                ("deg", 0.0, "degrees, the default")]
    return [("deg", POINTS["whole numbers"], "whole numbers: degrees more likely"), ("rad", 0.0, "radians")]


def _unit_word(units: str) -> str:
    return "degrees" if units == "deg" else "radians"


def _matrix_candidates(values, parsed, hints, clues, keyed):
    from core.nearest import orthogonality_report
    from core.orientation import Orientation
    m = np.array(values, dtype=float).reshape(3, 3)
    report = orthogonality_report(m)
    if not report.accepted:
        lines = [parsed.numbers[3 * i].line for i in range(3)] if len(parsed.numbers) == 9 else []
        where = f" (rows as written: lines {', '.join(map(str, lines))})" if len(set(lines)) == 3 else \
            " (rows and columns as written)"
        raise DecodeError(f"matrix {report.message}{where}")
    out = []
    for transposed in (False, True):
        c = _Candidate(
            "matrix", {"matrix": "reference-to-body" if transposed else "body-to-reference"},
            lambda t=transposed: Orientation.from_matrix(m, transposed=t),
            "matrix transposed (reference -> body: rows are the body axes)" if transposed
            else "matrix as written (body -> reference: columns are the body axes)")
        if clues.transposed is None:
            c.plus(0.0, "as written and transposed are equally likely: the text does not say which")
        elif clues.transposed == transposed:
            c.plus(POINTS["matrix direction named"], clues.transposed_reason)
        else:
            c.plus(0.0, f"the other direction: {clues.transposed_reason}")
        if report.band != "exact":
            c.notes.append(report.message)
        c.orthogonality_error = report.error
        out.append(c)
    return out


def _three_candidates(values, parsed, hints, clues, keyed):
    from core.orientation import Orientation
    from core.sequences import is_proper_euler
    v = np.array(values, dtype=float)
    out = []
    fixed_units = keyed.units if keyed else None
    if keyed and keyed.kind == "angles":
        if (hints.sequence and hints.sequence != keyed.sequence) or \
                (hints.intrinsic is not None and hints.intrinsic != keyed.intrinsic):
            raise DecodeError("the text names yaw, pitch and roll (intrinsic Z-Y'-X''), which the sequence"
                              " options contradict; drop the options or the names")
        if clues.intrinsic_stated is not None and clues.intrinsic_stated != keyed.intrinsic:
            raise DecodeError(YAW_PITCH_ROLL_STATED_EXTRINSIC)
        sequences = [(keyed.sequence, keyed.intrinsic, 1.0, keyed.note)]
    elif hints.sequence or clues.sequence:
        sequence = hints.sequence or clues.sequence
        why = "sequence given" if hints.sequence else f"the text names {sequence}"
        sequences = [(sequence, True, 0.6, why + "; intrinsic is the usual reading"),
                     (sequence, False, 0.3, why)]
    else:
        sequences = list(_COMMON_SEQUENCES)
    intrinsic_wanted = hints.intrinsic if hints.intrinsic is not None else clues.intrinsic
    if intrinsic_wanted is not None and not (keyed and keyed.kind == "angles"):
        sequences = [s for s in sequences if s[1] == intrinsic_wanted]
    unit_choices = _unit_choices(v, hints, clues, fixed_units)
    for sequence, intrinsic, prior, why in sequences:
        for units, points, unit_reason in unit_choices:
            spelled = "-".join(sequence[:1]) + ("-" + sequence[1] + "'-" + sequence[2] + "''" if intrinsic
                                                 else "-" + sequence[1] + "-" + sequence[2])
            c = _Candidate(
                "angles", {"sequence": sequence, "intrinsic": intrinsic, "units": units},
                lambda s=sequence, i=intrinsic, u=units: Orientation.from_angles(s, v, intrinsic=i,
                                                                                 degrees=(u == "deg")),
                f"angles {spelled} {'intrinsic' if intrinsic else 'extrinsic'}, {_unit_word(units)}")
            c.plus(prior, why).plus(points, unit_reason)
            middle = math.degrees(v[1]) if units == "rad" else float(v[1])
            if is_proper_euler(sequence) and not 0 <= middle <= 180:
                c.plus(POINTS["proper Euler middle outside 0..180"],
                       "middle angle outside 0..180°, unusual for proper Euler angles")
            elif not is_proper_euler(sequence) and abs(middle) > 90:
                c.plus(POINTS["Tait-Bryan middle beyond 90"],
                       "middle angle beyond ±90°, unusual for Tait-Bryan angles")
            if "angles" in clues.kinds:
                c.plus(TEXT_NAMES_KIND["angles"], "the text says angles")
            out.append(c)
    sequence_named = bool(hints.sequence or clues.sequence or (keyed and keyed.kind == "angles"))
    if not sequence_named or (keyed and keyed.kind == ROTATION_VECTOR.kind):
        for units, points, unit_reason in unit_choices:
            c = _Candidate(ROTATION_VECTOR.kind, {"units": units},
                           lambda u=units: Orientation.from_rotation_vector(v, degrees=(u == "deg")),
                           f"rotation vector in {_unit_word(units)} (axis times angle)")
            c.plus(POINTS["rotation vector prior"], "").plus(points, unit_reason)
            if keyed and keyed.kind == ROTATION_VECTOR.kind:
                c.plus(NAMED_NUMBERS[ROTATION_VECTOR.kind], keyed.note)
            if ROTATION_VECTOR.kind in clues.kinds:
                c.plus(TEXT_NAMES_KIND[ROTATION_VECTOR.kind], "the text says rotation vector")
            out.append(c)
    out += _named_vector_candidates(v, parsed, hints, clues, keyed)
    if keyed and keyed.kind in _VECTOR_KINDS:
        out = [c for c in out if c.kind == keyed.kind]
    return out


_VECTOR_KINDS = {r.kind for r in representations.VECTORS}


def _named_vector_candidates(v, parsed, hints, clues, keyed):
    """Three numbers as a parameter set that is read only when the text, the names or a hint say so (the
    registry's caption_only entries): bare numbers are never read as one."""
    out = []
    for chosen in representations.VECTORS:
        if not chosen.caption_only:
            continue
        by_keys = keyed is not None and keyed.kind == chosen.kind
        in_text = chosen.kind in clues.kinds
        if not (by_keys or in_text or hints.kind == chosen.kind) or (keyed is not None and not by_keys):
            continue
        marked = [n for n in parsed.numbers if n.unit]
        if marked and chosen.units == representations.PURE:
            if by_keys or hints.kind == chosen.kind:
                raise DecodeError(f"line {marked[0].line}: '{marked[0].text}' carries an angle unit, but the "
                                  f"{chosen.name} are pure numbers; drop the unit mark")
            continue            # a number with an angle mark is an angle (core/decode/unit_marks.py)
        c = _Candidate(chosen.kind, {}, lambda r=chosen: r.orientation(v), chosen.name)
        if by_keys:
            c.plus(POINTS["caption names a parameter set"], keyed.note)
        elif in_text:
            c.plus(POINTS["caption names a parameter set"], f"the text says {chosen.name}")
        else:
            c.plus(0.0, "kind given")
        out.append(c)
    return out
