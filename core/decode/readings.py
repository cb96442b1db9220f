"""From numbers to ranked readings: refusals of ambiguous layouts, titles, candidates, notes."""

from __future__ import annotations

import math
import re

import numpy as np

from core import representations
from core.errors import DecodeError, FramewrightError
from core.decode.unit_marks import respect_unit_marks
from core.decode.candidates import (POINTS, _MAX_MAGNITUDE, _NEAR_LOCK_DEG, _Candidate, _matrix_candidates,
                                    _three_candidates)
from core.decode.four_numbers import _four_candidates
from core.decode.characters import _shorten
from core.decode.clues import _WXYZ, _XYZW, _read_clues
from core.decode.hints import DecodeHints, Reading
from core.decode.number_refusals import refuse_strays
from core.decode.named import _COMPONENT, _keyed, _labels, _split_key
from core.decode.numbers import ParsedNumbers, UNDERSTOOD_COUNTS

_COUNT_KINDS = representations.COUNTS                           # {9: ('matrix',), 4: (...), 3: (...)}
_KIND_COUNT = {r.kind: r.count for r in representations.ALL}
# the kind as a message names it ('three angles need', not 'a angles needs'); others read 'a <kind>'
_KIND_WORDS = {"angles": "a set of three angles", "axis-angle": "an axis and angle", "mrp": "an MRP vector",
               "gibbs": "a Gibbs vector", "rotation-vector": "a rotation vector"}


def readings_from_numbers(parsed: ParsedNumbers, hints=None, direction=None) -> list[Reading]:
    """The readings of numbers already found (see decode). A first or last line that looks like a title
    holding a number ('Mount 7 rotation:') is also tried without it, and both sets are ranked together.
    `direction`: (transposed, reason) that the layout around the numbers establishes for a matrix (a
    transform's rotation is as written), used when the words themselves say nothing."""
    hints = DecodeHints.coerce(hints)
    untitled = _without_title_line(parsed)
    from dataclasses import replace
    try:
        readings = _readings(parsed, hints, direction)
    except DecodeError:
        if untitled is None:
            raise
        readings = _readings(untitled, hints, direction)
    else:
        if untitled is not None:
            try:
                others = _readings(untitled, hints, direction)
            except DecodeError:
                others = []
            others = [replace(r, score=round(r.score + POINTS["without the title line"], 6),
                              why=f"{r.why}; reads the text without its title"
                              " line") for r in others]
            readings = sorted(readings + others, key=lambda r: -r.score)
    if len(readings) == 1:
        readings = [replace(readings[0], why=f"the only reading: {readings[0].why}")]
    return readings


_KNOWN_KEYS = frozenset(_COMPONENT) | {"q0", "q1", "q2", "q3", "q4", "yaw", "pitch", "roll", "heading", "bank",
                                       "elevation", "axis", "angle", "theta"}


def _refuse_mixed_keys(parsed: ParsedNumbers) -> None:
    """'q0 abc = 0.7071, q1 = 0, q2 = 0.7071, q3 = 0': three component names and one key we do not know;
    reading the numbers bare would drop the names and read another kind."""
    if len(parsed.numbers) not in _COUNT_KINDS:
        return                          # a longer text: one of its lines is read (or it is refused)
    keys = [_split_key(label)[0] for label in _labels(parsed)]
    named = [k for k in keys if k in _KNOWN_KEYS]
    if not named:
        return
    for n, k in zip(parsed.numbers, keys):
        if k and k not in _KNOWN_KEYS:
            raise DecodeError(f"line {n.line}: the key '{_shorten(k, 24)}' is not a component name like the"
                              f" others ({', '.join(dict.fromkeys(named))}); Framewright will not guess its place")


def _refuse_square_of_two(parsed: ParsedNumbers, keyed, count: int) -> None:
    """'[1 0; 0 1]': four numbers in two rows of two are a 2x2 matrix, not a quaternion."""
    if count == 4 and keyed is None and [len(r) for r in parsed.rows] == [2, 2]:
        lines = sorted({n.line for n in parsed.numbers})
        raise DecodeError(f"the 4 numbers are written as 2 rows of 2 (a 2x2 matrix, line"
                          f"{'s' if len(lines) > 1 else ''} {', '.join(map(str, lines))}); an orientation needs a"
                          " 3x3 matrix, or a quaternion or axis and angle written as one row")


# The kind a library call's name fixes ('from_quat' is a quaternion), and so how many numbers it takes
_LIBRARY_CALL_KIND = {"euler": "angles", "quat": "quaternion", "rotvec": representations.ROTATION_VECTOR.kind}


def _refuse_library_call_count(parsed: ParsedNumbers, keyed, count: int) -> None:
    """'from_quat([0.1, 0.2, 0.3])': the call names its kind, so its numbers are never read as another kind."""
    call = parsed.library_call
    if call is None or keyed is not None or _KIND_COUNT[_LIBRARY_CALL_KIND[call[0]]] == count:
        return
    kind = call[0]
    raise DecodeError(f"the text's library call (from_{kind} or as_{kind}) takes "
                      f"{_KIND_COUNT[_LIBRARY_CALL_KIND[kind]]} numbers,"
                      f" but the text holds {count} ({parsed.lines_summary() or 'none'}): Framewright will not read"
                      " them as another kind; paste the call's own numbers")


def _readings(parsed: ParsedNumbers, hints: DecodeHints, direction=None) -> list[Reading]:
    clues = _read_clues(parsed)
    if direction is not None and clues.transposed is None:
        clues.transposed, clues.transposed_reason = direction
    notes = list(parsed.notes) + clues.notes
    keyed = _keyed(parsed)
    if keyed is None:
        _refuse_mixed_keys(parsed)
    if keyed is not None:
        values = keyed.values
        if keyed.note:
            notes.append(keyed.note)
    else:
        values = [n.value for n in parsed.numbers]
    if len(values) not in _COUNT_KINDS:
        picked = _labelled_quaternion_line(parsed)
        if picked is None:
            refuse_strays(parsed, {n.line for n in parsed.numbers})   # a stray word says more than a count
            raise DecodeError(_count_message(parsed, hints))
        values, line, caption_order = picked
        refuse_strays(parsed, {line})
        notes.append(f"the text holds {len(parsed.numbers)} numbers; read the quaternion on line {line}")
        if caption_order and hints.order is None:
            clues.order = caption_order
        clues.kinds.add("quaternion")
        if hints.kind is None:
            hints = DecodeHints(**{**hints.__dict__, "kind": "quaternion"})
    else:
        refuse_strays(parsed, {n.line for n in parsed.numbers})
    for n in parsed.numbers:
        if abs(n.value) > _MAX_MAGNITUDE:
            raise DecodeError(f"line {n.line}: {_shorten(n.text)} is too large for any part of an orientation")
    count = len(values)
    _refuse_square_of_two(parsed, keyed, count)
    if hints.kind is not None and _KIND_COUNT[hints.kind] != count:
        raise DecodeError(f"{_KIND_WORDS.get(hints.kind, 'a ' + hints.kind)} needs {_KIND_COUNT[hints.kind]} numbers;"
                          f" the text holds {count}"
                          f" ({parsed.lines_summary() or 'none'})")
    _refuse_library_call_count(parsed, keyed, count)
    if hints.kind is None and keyed is None and clues.kinds == {"quaternion"} and count == 3:
        # 'quaternion: 0.1 0.2 0.3' is a quaternion with a number missing, not three angles
        raise DecodeError(f"the text says quaternion, which needs 4 numbers; the text holds 3"
                          f" ({parsed.lines_summary() or 'none'}); give the fourth, or the kind as an option")
    builder = {9: _matrix_candidates, 4: _four_candidates, 3: _three_candidates}[count]
    candidates = builder(values, parsed, hints, clues, keyed)
    candidates, unit_refusal = respect_unit_marks(candidates, parsed, count, keyed)
    if not candidates and unit_refusal:
        raise DecodeError(f"cannot read the {count} numbers: {unit_refusal}")
    if hints.kind is not None:
        candidates = [c for c in candidates if c.kind == hints.kind]
    elif parsed.library_call is not None and keyed is None:
        # the call fixes the kind: from_quat([0, 0, 1, 90]) is a quaternion, never an axis and an angle
        called = _LIBRARY_CALL_KIND[parsed.library_call[0]]
        candidates = [c for c in candidates if c.kind == called] or candidates
    if hints.transposed is not None:
        candidates = [c for c in candidates if c.kind != "matrix" or
                      c.conventions["matrix"] == ("reference-to-body" if hints.transposed else "body-to-reference")]
    readings, failures = [], []
    for c in candidates:
        implausible = _implausible_angle(c, values)
        if implausible:
            failures.append(implausible)
            continue
        try:
            orientation = c.make()
        except FramewrightError as error:
            failures.append(f"{c.label}: {error}")
            continue
        reading_notes = notes + c.notes + [n for n in orientation.notes if n not in c.notes]
        reading_notes += _gimbal_notes(orientation, c)
        readings.append((c, orientation, reading_notes))
    if not readings:
        detail = failures[0] if failures else "no reading fits the hints given"
        raise DecodeError(f"cannot read the {count} numbers: {detail}")
    readings.sort(key=lambda r: -r[0].score)
    out = []
    for rank, (c, orientation, reading_notes) in enumerate(readings, start=1):
        why = "; ".join(c.reasons) if c.reasons else "no other clue"
        out.append(Reading(kind=c.kind, conventions=dict(c.conventions), orientation=orientation,
                           notes=tuple(dict.fromkeys(reading_notes)), why=why, score=round(c.score, 6),
                           label=c.label, numbers=tuple(float(x) for x in values),
                           orthogonality_error=c.orthogonality_error))
    return out


_MAX_TURNS_DEG = 3600.0     # ten turns: an angle beyond this is a typo (a lost decimal point), not a mount


def _implausible_angle(c: _Candidate, values) -> str | None:
    units = c.conventions.get("units")
    if units is None:
        return None
    angle_part = values[:1] if c.conventions.get("order") == "angle, axis" else values[3:]
    angles = {representations.AXIS_ANGLE.kind: angle_part,
              representations.ROTATION_VECTOR.kind: [float(np.linalg.norm(values))]}.get(c.kind, values)
    worst = max(abs(float(a)) for a in angles)
    worst_deg = worst if units == "deg" else math.degrees(worst)
    if worst_deg > _MAX_TURNS_DEG:
        return (f"{c.label}: an angle of {worst:.6g} {'degrees' if units == 'deg' else 'radians'} is more than"
                " ten turns (a lost decimal point?)")
    return None


def _gimbal_notes(orientation, c: _Candidate) -> list[str]:
    from core.sequences import gimbal_margin
    if c.kind == "angles":
        sequence, intrinsic = c.conventions["sequence"], c.conventions["intrinsic"]
    else:
        sequence, intrinsic = "ZYX", True
    margin = gimbal_margin(orientation, sequence, intrinsic)
    spelled = f"{'intrinsic' if intrinsic else 'extrinsic'} {sequence}"
    if margin.locked or margin.margin_deg < 1e-6:
        return [f"gimbal lock in {spelled}: only the sum or difference of the first and third angles is"
                " determined"]
    if margin.margin_deg < _NEAR_LOCK_DEG and c.kind == "angles":
        return [f"near gimbal lock in {spelled} (margin {margin.margin_deg:.3g}°): the first and third angles"
                f" swing about {margin.amplification:.3g} times as much as the orientation"]
    return []


def _count_message(parsed: ParsedNumbers, hints: DecodeHints) -> str:
    n = len(parsed.numbers)
    if n == 0:
        return f"found no numbers in the text; Framewright reads {UNDERSTOOD_COUNTS}"
    message = f"found {n} number{'s' if n != 1 else ''} ({parsed.lines_summary()}); Framewright reads " \
              f"{UNDERSTOOD_COUNTS}"
    if parsed.decimal_commas:
        message += " (commas are read as separators: if they are decimal commas, write decimal points)"
    elif n in (6, 7, 8):
        message += (", or a pose (4x4, 3x4, keyed, or a line under a header naming its columns such as"
                    " '# x y z qx qy qz qw'): name the columns so their order is not guessed")
    return message


_DATA_WORDS = re.compile(r"(?<![a-z])(?:deg\w*|rad\w*|yaw|pitch|roll|heading|bank|axis|angle|rotvec|scalar|"
                         r"array|matrix|quaternion)(?![a-z])")


def _without_title_line(parsed: ParsedNumbers) -> ParsedNumbers | None:
    """'Mount 7 rotation:' above a 3x3 block makes ten numbers. When exactly one first or last line holds
    one or two numbers among words, and without it the count is one we read, set it aside (with a note)."""
    if not parsed.line_words:
        return None
    per_line: dict[int, int] = {}
    for n in parsed.numbers:
        per_line[n.line] = per_line.get(n.line, 0) + 1
    ends = {parsed.line_words[0], parsed.line_words[-1]}
    candidates = []
    for line, text in ends:
        words = re.findall(r"[a-z]{3,}", _DATA_WORDS.sub(" ", text.lower()))
        keyed_line = any(n.label is not None for n in parsed.numbers if n.line == line)   # 'w = 0.5' is data
        if words and not keyed_line and per_line[line] <= 2 and len(parsed.numbers) - per_line[line] in _COUNT_KINDS:
            candidates.append((line, text))
    if len(candidates) != 1 or len(per_line) < 2:
        return None
    line, text = candidates[0]
    from dataclasses import replace
    dropped = [n.text for n in parsed.numbers if n.line == line]
    text = " ".join(text.split())
    note = (f"line {line} ('{_shorten(text)}') was taken for a title: its {'numbers' if len(dropped) > 1 else 'number'}"
            f" {', '.join(dropped)} {'were' if len(dropped) > 1 else 'was'} not read")
    return replace(parsed, numbers=tuple(n for n in parsed.numbers if n.line != line),
                   notes=parsed.notes + (note,),
                   captions=tuple(c for c in parsed.captions if c[0] != line),
                   line_words=tuple(w for w in parsed.line_words if w[0] != line))


def _labelled_quaternion_line(parsed: ParsedNumbers):
    """A block holding several representations (a report, a log) whose quaternion line we can read."""
    by_line: dict[int, list[float]] = {}
    for n in parsed.numbers:
        by_line.setdefault(n.line, []).append(n.value)
    found = [(line, caption) for line, caption in parsed.captions
             if "quaternion" in caption and len(by_line.get(line, ())) == 4]
    if len(found) != 1:
        return None
    line, caption = found[0]
    order = "wxyz" if _WXYZ.search(caption) else "xyzw" if _XYZW.search(caption) else None
    return by_line[line], line, order
