"""Transform echo printouts: blocks of `At time …`, `- Translation: […]`, `- Rotation: in Quaternion
[x, y, z, w]`, `in RPY (radian) […]`, `in RPY (degree) […]` and `- Matrix:` with four rows. Every
representation a block gives is read and their agreement reported; of repeated blocks the last is read,
with how many there were and how far apart they are."""

from __future__ import annotations

import math
import re

import numpy as np

from core.decode.characters import _normalise_characters
from core.decode.poses import PoseText, checked_translation, homogeneous, values_in
from core.errors import DecodeError

_BLOCK_START = re.compile(r"^[ \t]*At time[ \t]+(?P<time>\S+)", re.MULTILINE)
_TRANSLATION = re.compile(r"^[ \t]*-?[ \t]*Translation:[ \t]*(?P<v>\[[^\]\n]*\])", re.MULTILINE)
_QUATERNION = re.compile(r"in Quaternion(?P<order>[ \t]*\((?:xyzw|wxyz)\))?[ \t]*(?P<v>\[[^\]\n]*\])")
_RPY = re.compile(r"in RPY \((?P<unit>radian|degree)\)[ \t]*(?P<v>\[[^\]\n]*\])")
_MATRIX = re.compile(r"^[ \t]*-?[ \t]*Matrix:[ \t]*\n(?P<rows>(?:[ \t]*[-+\d.eE]+(?:[ \t]+[-+\d.eE]+){3}[ \t]*\n?){4})",
                     re.MULTILINE)
_KNOWN_LINE = re.compile(r"^\s*(?:At time\b|-?\s*Translation:|-?\s*Rotation:|in (?:Quaternion|RPY)\b|-?\s*Matrix:|"
                         r"[-+\d.eE \t]+$|\[\w+\]|$)")


def echo_poses(text: str) -> list[PoseText] | None:
    if "Translation:" not in text:
        return None
    clean = _normalise_characters(text)
    if not _TRANSLATION.search(clean) or "Rotation:" not in clean:
        return None
    starts = [m.start() for m in _BLOCK_START.finditer(clean)]
    if not starts or starts[0] > clean.find("Translation:"):
        starts = [0] + starts
    bounds = list(zip(starts, starts[1:] + [len(clean)]))
    blocks = [b for b in (_block(clean, a, z) for a, z in bounds) if b is not None]
    if not blocks:
        return None
    line, pieces, translation, time = blocks[-1]
    notes = ["a transform printout: quaternion x, y, z, w, RPY about fixed X, Y, Z (common practice); its lengths"
             " are metres by convention, but the text does not say so"]
    if time:
        notes.append(f"the time stamp ({time[:32]}) was set aside")
    best, agreement = _agreement(pieces)
    if agreement:
        notes.append(agreement)
    if len(blocks) > 1:
        notes.append(_spread(blocks))
    rotation, fixed, what = best
    notes.append(f"read its {what}, the most precisely printed representation")
    return [PoseText(tuple(rotation), "transform printout", line, fixed, translation, None, None, notes)]


def _line_of(text: str, pos: int) -> int:
    return text.count("\n", 0, pos) + 1


def _block(text: str, a: int, z: int):
    """(line, [(numbers, fixed hints, what, decimals, rounding bound)], translation, time) of one block."""
    body = text[a:z]
    t = _TRANSLATION.search(body)
    if t is None:
        return None
    line = _line_of(text, a + t.start())
    for k, raw in enumerate(body.split("\n")):
        if not _KNOWN_LINE.match(raw):
            raise DecodeError(f"line {_line_of(text, a) + k}: '{raw.strip()[:40]}' is not part of a transform"
                              " printout as Framewright reads it")
    translation = checked_translation(values_in(t.group("v"), line), line)
    pieces = []
    q = _QUATERNION.search(body)
    if q:
        order = "wxyz" if q.group("order") and "wxyz" in q.group("order") else "xyzw"
        pieces.append((values_in(q.group("v"), _line_of(text, a + q.start())),
                       {"kind": "quaternion", "order": order}, f"quaternion ({', '.join(order)})",
                       _decimals(q.group("v")), _ROUNDING_TURN["quaternion"] * _half_unit(q.group("v"))))
    for r in _RPY.finditer(body):
        degrees = r.group("unit") == "degree"
        values = values_in(r.group("v"), _line_of(text, a + r.start()))
        pieces.append((values, {"kind": "angles", "sequence": "XYZ", "intrinsic": False,
                                "units": "deg" if degrees else "rad"},
                       f"RPY ({r.group('unit')})", _decimals(r.group("v")) + (math.log10(180 / math.pi) if degrees else 0),
                       _ROUNDING_TURN["angles"] * _half_unit(r.group("v")) * (math.pi / 180 if degrees else 1.0)))
    m = _MATRIX.search(body)
    if m:
        rows = [values_in(row, _line_of(text, a + m.start())) for row in m.group("rows").strip().split("\n")]
        rotation, _ = homogeneous(rows, _line_of(text, a + m.start()), "printout's matrix")
        pieces.append((rotation, {"kind": "matrix"}, "matrix", _decimals(m.group("rows")),
                       _ROUNDING_TURN["matrix"] * _half_unit(m.group("rows"))))
    if not pieces:
        raise DecodeError(f"line {line}: the printout gives a translation but no rotation Framewright reads")
    time = None
    s = _BLOCK_START.match(body)
    if s:
        time = s.group("time")
    return line, pieces, translation, time


# How far (radians) rounding each printed number by h can turn a representation, per h: a quaternion's four
# parts move it by at most 2·|δq| ≤ 4h; three angles by at most h each; a matrix by at most its Frobenius
# change, 3h (first-order bounds, doubled below for the products the first order leaves out).
_ROUNDING_TURN = {"quaternion": 4.0, "angles": 3.0, "matrix": 3.0}
_SAFETY = 2.0


def _half_unit(text: str) -> float:
    """Half a unit in the last printed place of the least precise number ('0.707' -> 0.0005)."""
    return 0.5 * 10.0 ** -_decimals(text)


def _decimals(text: str) -> float:
    places = [len(d) for d in re.findall(r"\.(\d+)", text)]
    return float(min(places)) if places else 0.0


def _rotation_of(piece) -> np.ndarray:
    from core.orientation import Orientation
    values, fixed, *_ = piece
    if fixed["kind"] == "quaternion":
        return Orientation.from_quaternion(values, scalar_last=fixed["order"] == "xyzw").as_matrix()
    if fixed["kind"] == "angles":
        # roll, pitch, yaw about fixed X, Y, Z
        return Orientation.from_angles("XYZ", values, intrinsic=False, degrees=fixed["units"] == "deg").as_matrix()
    from core.nearest import nearest_rotation
    return nearest_rotation(np.array(values, dtype=float).reshape(3, 3))


def _agreement(pieces):
    """The most precisely printed piece, and a note on how far the others are from it."""
    best = max(pieces, key=lambda p: p[3])
    if len(pieces) == 1:
        return (best[0], best[1], best[2]), ""
    reference = _rotation_of(best)
    worst = 0.0
    for p in pieces:
        d = reference.T @ _rotation_of(p)
        apart = math.degrees(math.acos(max(-1.0, min(1.0, (np.trace(d) - 1) / 2))))
        allowed = math.degrees(_SAFETY * (p[4] + best[4]))
        if apart > allowed:
            # the text contradicts itself: which representation is right cannot be told from it
            raise DecodeError(f"the printout's {p[2]} and its {best[2]} are {apart:.3g}° apart, more than their"
                              f" printed digits allow ({allowed:.2g}°): the block contradicts itself; check it")
        worst = max(worst, apart)
    names = ", ".join(p[2] for p in pieces)
    return (best[0], best[1], best[2]), f"the block gives {len(pieces)} representations ({names}); they agree within {worst:.3g}°"


def _spread(blocks) -> str:
    rotations = [_rotation_of(max(b[1], key=lambda p: p[3])) for b in blocks]
    last = rotations[-1]
    angle = max(math.degrees(math.acos(max(-1.0, min(1.0, (np.trace(last.T @ r) - 1) / 2)))) for r in rotations)
    distance = max(float(np.linalg.norm(np.subtract(b[2], blocks[-1][2]))) for b in blocks)
    return (f"the text holds {len(blocks)} printout blocks; read the last; the others differ from it by up to"
            f" {angle:.3g}° and {distance:.3g} m")
