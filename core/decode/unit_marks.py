"""A number marked with an angle unit is an angle: readings that would take it for anything else are set
aside, so '0 0 1 12″' is never read as a quaternion and '12° 0 0 1' never as an axis of (12, 0, 0).

Degree and radian marks keep their older rule (one mark stands for every number: '0.5 0 0 rad'); a number
converted from another unit (mrad, ′, ″, gon) marks only itself, so a reading in which it stands beside
unmarked angles that are not zero ('0.5 0 0 mrad') is refused: Framewright will not guess which numbers
the mark belongs to."""

from __future__ import annotations

import re

from core import representations
from core.errors import DecodeError

# Kinds whose numbers are all angles, and kinds of pure numbers (no number of theirs carries a unit), from
# core/representations.py; axis and angle, one angle among pure numbers, has its own rule below.
_ANGLES_ONLY = tuple(r.kind for r in representations.ALL
                     if r.units == representations.ANGLE and r is not representations.AXIS_ANGLE)
_PURE_NUMBERS = tuple(r.kind for r in representations.ALL if r.units == representations.PURE)
_SEXAGESIMAL = ("deg", "arcmin", "arcsec", "dms")
# Words naming an angle unit the numbers would have to be converted from (a caption, a column header)
_OTHER_UNIT_WORD = re.compile(r"(?<![a-z])(?P<unit>mrads?|milliradians?|arcmin(?:utes?|s)?|arcsec(?:onds?|s)?"
                              r"|gons?|gradians?|grads?|mils?)(?![a-z])")


def respect_unit_marks(candidates: list, parsed, count: int, keyed) -> tuple[list, str | None]:
    """(the candidates that read every marked number as an angle, why any were set aside or None).
    Named angle components (`keyed`) and numbers picked out of a longer text keep their own rules."""
    numbers = parsed.numbers
    marked = [i for i, n in enumerate(numbers) if n.unit]
    written = {numbers[i].converted_from or numbers[i].unit for i in marked}
    families = {"sexagesimal" if u in _SEXAGESIMAL else u for u in written}
    if len(families) > 1:
        raise DecodeError(f"the numbers are marked in {' and '.join(sorted(written))}; expected one unit for all "
                          "(degrees, minutes and seconds may be written together)")
    if not marked:
        named = _OTHER_UNIT_WORD.search(parsed.words)
        if named:
            raise DecodeError(f"the text names '{named.group('unit')}' but its numbers carry no unit mark: mark "
                              "each angle (0.5 mrad, 30″, 2 gon) or convert them to degrees; Framewright will not "
                              "guess which numbers are in that unit")
        return candidates, None
    if len(numbers) != count:
        return candidates, None
    if keyed is not None and keyed.kind not in _PURE_NUMBERS:
        return candidates, None         # named angles keep their own rules; a named quaternion part has no unit
    converted = [numbers[i] for i in marked if numbers[i].converted_from]
    unmarked_nonzero = [n for n in numbers if not n.unit and n.value != 0]
    kept, why = [], None
    for c in candidates:
        if c.kind in _PURE_NUMBERS:
            why = why or (f"'{numbers[marked[0]].text}' carries an angle unit, so it is no {c.kind} entry")
            continue
        if c.kind == representations.AXIS_ANGLE.kind:
            angle_at = 0 if c.conventions.get("order") == "angle, axis" else count - 1
            if marked != [angle_at]:
                # the more telling reason: it names where an angle would have to stand
                why = (f"'{numbers[marked[0]].text}' carries an angle unit where an axis component stands (an "
                       "axis and angle is read axis first unless the text, or a unit axis after the first number,"
                       " says the angle comes first)")
                continue
        if c.kind in _ANGLES_ONLY and converted and unmarked_nonzero:
            mark = converted[0].converted_from
            why = (f"only some numbers carry the unit mark of '{converted[0].text}' ({mark}), and "
                   f"'{unmarked_nonzero[0].text}' on line {unmarked_nonzero[0].line} carries none: mark every angle "
                   "or none; Framewright will not guess which numbers the mark belongs to")
            continue
        kept.append(c)
    return kept, why
