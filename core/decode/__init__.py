"""Pasted text -> ranked readings of an orientation (or a pose: an orientation and a translation).

Two layers:
- `parse_numbers(text)` finds the numbers in text pasted from a drawing, PDF, spreadsheet, e-mail or a
  program, with their line, unit mark and label, and notes on what it set aside. A points-table paste
  can reuse it.
- `decode(text, hints)` turns those numbers into every plausible reading (matrix as written or
  transposed, quaternion w-first or w-last, degrees or radians, which sequence), ranked by plausibility.

Nothing here guesses silently: every assumption a reading makes is in its `conventions`, every repair
in its `notes`, and the reason for its rank in `why`. The modules, in the order text passes through them:
characters (clean-up, comments, size) -> numbers (+ angle_marks, number_refusals) -> clues and named (what the words
say) -> candidates and four_numbers (readings per count) -> readings (ranking); our_json reads our own
export. The pose readers (pose_*, printouts, column_major) come first and hand their rotations to readings.
"""

from __future__ import annotations

import re
from dataclasses import replace

from core.decode.characters import MAX_INPUT_BYTES, _check_size
from core.decode.hints import KINDS, DecodeHints, Reading
from core.decode.numbers import (UNDERSTOOD_COUNTS, FoundNumber, ParsedNumbers, _MAX_NUMBERS, extract_numbers,
                                 parse_numbers)
from core.decode.our_json import _decode_our_json
from core.decode.name_column import split_name_column
from core.decode.pose_expressions import read_poses
from core.decode.pose_keys import keyed_poses
from core.decode.pose_lines import argument_poses, column_poses, origin_poses, quaternion_sum, sdf_poses
from core.decode.pose_matrices import matrix_poses
from core.decode.poses import pose_readings
from core.decode.printouts import echo_poses
from core.decode.readings import readings_from_numbers
from core.errors import DecodeError

_COMMENT_MARK = re.compile(r"^[ \t]*(?://+|#+|%+)[ \t]?|/\*|\*/", re.MULTILINE)

# Readers of structured text, tried in this order before the numbers are read bare: each says None when
# the text is not its kind, and refuses (DecodeError) when it is but something in it cannot be read.
_POSE_READERS = (echo_poses, origin_poses, sdf_poses, argument_poses, quaternion_sum, keyed_poses, column_poses)

__all__ = ["MAX_INPUT_BYTES", "KINDS", "UNDERSTOOD_COUNTS", "DecodeError", "DecodeHints", "FoundNumber",
           "ParsedNumbers", "Reading", "decode", "extract_numbers", "parse_numbers", "readings_from_numbers"]


def decode(text: str, hints=None) -> list[Reading]:
    """Every plausible reading of `text`, most plausible first. With every hint given there is one.

    A pose (a 4x4 or 3x4 transform, a position with a quaternion or angles, a description-file origin, a
    transform printout, keyed calibration text) gives readings of its rotation that carry its translation,
    its unit and, when the text holds several, the transform's name.

    Raises DecodeError (with a message that says what is wrong and where) when the text cannot be read:
    no numbers or a count other than 9, 4 or 3, a refused matrix, conflicting unit marks, over 100 kB."""
    hints = DecodeHints.coerce(hints)
    _check_size(text)
    named = split_name_column(text)
    if named is not None:          # a copied CSV row: its first column is the mount's name
        rest, note = named
        return [replace(r, notes=(note,) + r.notes) for r in decode(rest, hints)]
    from_json = _decode_our_json(text, hints)
    if from_json is not None:
        return from_json
    for reader in _POSE_READERS:
        poses = read_poses(reader, text)
        if poses:
            return pose_readings(poses, hints, [])
    parsed = parse_numbers(text, max_numbers=_MAX_NUMBERS)
    if not parsed.numbers and "numbers inside comments were not read" in parsed.notes:
        uncommented = _COMMENT_MARK.sub("", text)
        if uncommented != text:     # the comments hold the only data: read it, and say so
            readings = decode(uncommented, hints)
            note = "the only numbers are inside comments (#, //, %): they were read"
            return [replace(r, notes=(note,) + r.notes) for r in readings]
    poses = matrix_poses(parsed)
    if poses:
        return pose_readings(poses, hints, list(parsed.notes))
    if hints.name is not None:
        raise DecodeError(f"the text holds no named transforms; the name hint '{hints.name[:40]}' picks nothing")
    return readings_from_numbers(parsed, hints)
