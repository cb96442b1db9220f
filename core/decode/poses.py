"""Poses: an orientation with a translation, as calibration files, description files and tool printouts
write them. Each reader (pose_matrices, pose_keys, pose_lines, printouts) turns its kind of text into
`PoseText` items; `pose_readings` reads each item's rotation through the ordinary candidates and ranking
and keeps the translation, its unit and the transform's name beside every reading.

Meaning (CONVENTIONS.md): the child frame of a transform is our body, the parent our reference, so the
rotation maps child-frame vectors into the parent frame: v_parent = R v_child + t.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass, field, replace

import numpy as np

from core.decode.hints import DecodeHints, Reading
from core.decode.number_refusals import refuse_strays
from core.decode.numbers import parse_numbers
from core.errors import DecodeError

_MAX_TRANSLATION = 1e9       # a translation beyond this (in any unit) is a misread, not a mount


TRANSFORM_DIRECTION = (False, "a transform's rotation maps the child frame into the parent frame: as written")


@dataclass
class PoseText:
    """One transform found in a text: its rotation's numbers and what the format fixes about them."""
    rotation: tuple[float, ...]
    layout: str                          # what the text is, for a person: '4x4 transform', 'pose line', ...
    line: int                            # where it starts (1-based)
    fixed: dict = field(default_factory=dict)        # hints the format fixes (kind, order, units, ...)
    translation: tuple[float, float, float] | None = None
    unit: str | None = None
    name: str | None = None
    notes: list = field(default_factory=list)
    # ranking bonuses the format's context gives: ((conventions that must match, points, reason), ...)
    prefer: tuple = ()


_UNIT_SAID = re.compile(r"(?<![a-z])(?:t|translation|position|offset)[ ]*(?:\(|\[|is[ ]+|in[ ]+)[ ]*"
                        r"(mm|millimet(?:re|er)s?|m|met(?:re|er)s?|cm|inch(?:es)?|thou)(?![a-z])")
# ('in' alone is not a unit here: 't in mm' has it as a word; inches are named in full)
_UNIT_WORDS = {"millimetre": "mm", "millimetres": "mm", "millimeter": "mm", "millimeters": "mm", "metre": "m",
               "metres": "m", "meter": "m", "meters": "m", "inch": "in", "inches": "in"}


def unit_said(words: str) -> str | None:
    """The translation's unit when the words name it: 't in mm', 'translation (m)', 'position [mm]'."""
    found = set()
    for m in _UNIT_SAID.finditer(words.lower()):
        found.add(_UNIT_WORDS.get(m.group(1), m.group(1)))
    return found.pop() if len(found) == 1 else None


def checked_translation(values, line: int) -> tuple[float, float, float]:
    if len(values) != 3:
        raise DecodeError(f"line {line}: a translation needs 3 numbers (x, y, z); found {len(values)}")
    out = tuple(float(v) for v in values)
    for v in out:
        if not math.isfinite(v) or abs(v) > _MAX_TRANSLATION:
            raise DecodeError(f"line {line}: the translation {v:g} is not a usable distance")
    return out


def one_value(text: str, line: int, key: str) -> float:
    """The single number a key holds (`x: 0.1`, `--yaw 0.5`)."""
    values = values_in(text, line)
    if len(values) != 1:
        raise DecodeError(f"line {line}: '{key}' should hold one number; found {len(values)}")
    return values[0]


def values_in(fragment: str, line: int) -> list[float]:
    """The numbers in a piece of the text, with every refusal of parse_numbers (NaN, words between
    numbers, expressions outside the evaluated subset) reported at the line where the piece is."""
    from core.decode.pose_expressions import collect
    parsed = parse_numbers(fragment, first_line=line)
    refuse_strays(parsed, {line for line, _ in parsed.strays})
    collect(parsed.notes)               # 'evaluated pi/2 as …' goes into the pose's notes
    return [n.value for n in parsed.numbers]


def pose_readings(poses: list[PoseText], hints: DecodeHints, notes: list[str]) -> list[Reading]:
    """Every reading of every pose, each pose's best first, poses in the order of the text (or the one
    the name hint picks)."""
    from core.decode.readings import readings_from_numbers
    if hints.name is not None:
        wanted = hints.name.strip().lower()
        picked = [p for p in poses if p.name is not None and p.name.lower() == wanted]
        if not picked:
            names = ", ".join(sorted({p.name for p in poses if p.name})) or "none"
            raise DecodeError(f"no transform named '{hints.name[:40]}' in the text (names found: {names[:300]})")
        poses = picked
    if len(poses) > 1:
        named = [p.name for p in poses]
        notes = notes + [f"the text holds {len(poses)} transforms"
                         + (f" ({', '.join(n for n in named if n)[:200]})" if any(named) else "")]
    out: list[Reading] = []
    for pose in poses:
        merged = _merged_hints(pose, hints)
        text = " ".join(repr(float(v)) for v in pose.rotation)
        direction = TRANSFORM_DIRECTION if merged.kind == "matrix" else None
        readings = readings_from_numbers(parse_numbers(text), merged, direction)
        scored = []
        user = {k for k, v in hints.__dict__.items() if v is not None}
        for r in readings:
            score, why = r.score, r.why
            for key, said in (("sequence", "sequence given"), ("units", "units given"), ("kind", "kind given")):
                if key in pose.fixed and key not in user:
                    why = why.replace(said, f"{key} fixed by the {pose.layout.split(' (')[0]}")
            for wanted, points, reason in pose.prefer:
                if all(r.conventions.get(k) == v for k, v in wanted.items()):
                    score, why = score + points, f"{reason}; {why}"
            scored.append(replace(
                r, score=round(score, 6), why=why, label=f"{pose.layout}: {r.label}",
                notes=tuple(dict.fromkeys(list(notes) + list(pose.notes) + list(r.notes))),
                translation=pose.translation, translation_unit=pose.unit, name=pose.name))
        out += sorted(scored, key=lambda r: -r.score)
    return out


def _merged_hints(pose: PoseText, hints: DecodeHints) -> DecodeHints:
    given = {k: v for k, v in hints.__dict__.items() if v is not None and k != "name"}
    for key, value in pose.fixed.items():
        if key in given and given[key] != value:
            raise DecodeError(f"the text is a {pose.layout}, whose {key} is {value!r}; the {key} hint says"
                              f" {given[key]!r}: drop the hint or check the text")
    return DecodeHints.coerce({**given, **pose.fixed})


def homogeneous(rows: list[list[float]], line: int, layout: str, last_line: int | None = None):
    """A 4x4 (last row 0 0 0 1 within print precision) or 3x4 [R | t]: (the nine rotation numbers, t).
    `last_line` is where the fourth row is written, for the refusal."""
    m = np.array(rows, dtype=float)
    if m.shape == (4, 4):
        last = m[3]
        if not np.allclose(last, [0.0, 0.0, 0.0, 1.0], atol=5e-4, rtol=0):
            shown = " ".join(f"{v:g}" for v in last)
            raise DecodeError(f"line {last_line or line}: the last row of the {layout} is '{shown}', not 0 0 0 1: it is not a"
                              " rigid transform (a projection or a scaled matrix?)")
    elif m.shape != (3, 4):
        raise DecodeError(f"line {line}: a {layout} needs 3 or 4 rows of 4 numbers; found shape {m.shape}")
    return [float(v) for v in m[:3, :3].ravel()], checked_translation(m[:3, 3], line)
