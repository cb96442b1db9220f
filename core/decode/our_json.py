"""Our own JSON object (the export and `decode --json`): read the representation asked for."""

from __future__ import annotations

import json

import numpy as np

from core import representations
from core.errors import DecodeError
from core.decode.characters import _normalise_characters
from core.decode.hints import DecodeHints, Reading
from core.decode.numbers import parse_numbers
from core.decode.readings import readings_from_numbers

def _decode_our_json(text: str, hints: DecodeHints):
    """Our own JSON object (the export and `decode --json`) holds every representation: read the one
    the hints ask for, or the quaternion, which is exact."""
    if "quaternion_wxyz" not in text:
        return None
    # normalised before the '{' is looked for: a byte-order mark or a zero-width space that an editor put
    # first would otherwise hide the object, and the other readers would take its lines for bare numbers
    stripped = _normalise_characters(text).strip()
    if not stripped.startswith("{"):
        return None
    try:
        data = json.loads(stripped)
    except (ValueError, RecursionError):
        return None
    if not isinstance(data, dict) or "quaternion_wxyz" not in data:
        return None

    def numbers(key, size):
        value = data.get(key)
        flat = np.array(value, dtype=float).ravel() if value is not None else None
        if flat is None or flat.size != size or not np.all(np.isfinite(flat)):
            raise DecodeError(f"JSON key '{key}' should hold {size} finite numbers")
        return " ".join(repr(float(x)) for x in flat)

    try:
        kind = hints.kind or "quaternion"
        if kind == "matrix":
            body, extra = numbers("matrix", 9), {"transposed": False}
        elif kind == "axis-angle":
            # the object's order, whatever order a hint gives for pasted numbers
            body = numbers("axis", 3) + " " + numbers("angle_deg", 1)
            extra = {"units": "deg", "order": "axis-first"}
        elif representations.by_kind(kind).vector:
            chosen = representations.by_kind(kind)
            if chosen.half_turn_words and chosen.json_key in data and data[chosen.json_key] is None:
                raise DecodeError(f"JSON key '{chosen.json_key}' is null: the {chosen.name} is "
                                  f"{chosen.half_turn_words}")
            body, extra = numbers(chosen.json_key, 3), ({"units": "deg"} if chosen.units == "angle" else {})
        elif kind == "angles":
            body = numbers("angles_deg", 3)
            intrinsic = data.get("intrinsic", True)
            if not isinstance(intrinsic, bool):        # bool("false") would be True: a silent wrong reading
                raise DecodeError(f"JSON key 'intrinsic' should be true or false, not {json.dumps(intrinsic)[:40]}")
            extra = {"units": "deg", "sequence": data.get("sequence", "ZYX"), "intrinsic": intrinsic}
        else:
            body, extra = numbers("quaternion_wxyz", 4), {"order": "wxyz"}
    except (TypeError, ValueError) as error:
        raise DecodeError(f"the JSON object has a malformed representation: {error}") from None
    merged = {**{k: v for k, v in hints.__dict__.items() if v is not None}, **extra, "kind": kind}
    readings = readings_from_numbers(parse_numbers(body), DecodeHints.coerce(merged))
    return [_with_note(r, f"read the '{ {'quaternion': 'quaternion_wxyz', 'matrix': 'matrix'}.get(kind, kind)}'"
                          " entry of a Framewright JSON object") for r in readings]


def _with_note(reading: Reading, note: str) -> Reading:
    from dataclasses import replace
    return replace(reading, notes=(note,) + reading.notes)
