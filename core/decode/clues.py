"""What the words around the numbers say: units, matrix direction, sequence, quaternion order, kind."""

from __future__ import annotations

import re
from dataclasses import dataclass, field

from core.decode.column_major import says_column_major
from core.errors import DecodeError, FramewrightError
from core.representations import caption_patterns
from core.decode.numbers import ParsedNumbers
from core.representations import AXIS_ANGLE, ROTATION_VECTOR

@dataclass
class _Clues:
    """What the words around the numbers say."""
    units: str | None = None
    units_reason: str = ""
    transposed: bool | None = None
    transposed_reason: str = ""
    sequence: str | None = None
    intrinsic: bool | None = None
    intrinsic_stated: bool | None = None   # said as a flag ('intrinsic: false'), not only as a word
    order: str | None = None
    kinds: set = field(default_factory=set)
    notes: list = field(default_factory=list)
    angle_first: bool = False
    pi_written: str | None = None       # an evaluated expression naming π ('PI/2'): its angles are radians


_REF = r"(?:reference|ref|world|nav(?:igation)?|ned|enu|local|vehicle|platform|base|parent|earth|inertial|fixed)"
_ARROW = r"[ _-]*(?:frame[ _-]*)?(?:->|→|=>|to|2)[ _-]*"
_BODY_TO_REF = re.compile(rf"(?<![a-z])(?:body|sensor|part){_ARROW}{_REF}(?![a-z])|(?<![a-z])[cr]_\{{?b\}}?\^\{{?[nwre]\}}?"
                          r"|(?<![a-z])b2[nwre](?![a-z])")
_REF_TO_BODY = re.compile(rf"(?<![a-z]){_REF}{_ARROW}(?:body|sensor|part)(?![a-z])|(?<![a-z])[cr]_\{{?[nwre]\}}?\^\{{?b\}}?"
                          r"|(?<![a-z])[nwre]2b(?![a-z])")
_DCM = re.compile(r"(?<![a-z])dcm(?![a-z])|direction[ _-]?cosine")
_SEQUENCE_WORD = re.compile(r"(?<![a-z])([xyz])-?('*)-?([xyz])-?('*)-?([xyz])('*)(?![a-z])")
_INTRINSIC_WORD = re.compile(r"intrinsic|rotating axes|moving axes|body[ -]fixed axes")
_EXTRINSIC_WORD = re.compile(r"extrinsic|fixed axes|static axes|space[ -]fixed")
_WXYZ = re.compile(r"(?<![a-z])q?_?wxyz(?![a-z])|(?<![a-z])q?w\W{1,3}q?x\W{1,3}q?y\W{1,3}q?z(?![a-z])"
                   r"|scalar[ _-]?(?:part[ _-]?)?first|(?<![a-z])w[ _-]first")
_XYZW = re.compile(r"(?<![a-z])q?_?xyzw(?![a-z])|(?<![a-z])q?x\W{1,3}q?y\W{1,3}q?z\W{1,3}q?w(?![a-z])"
                   r"|scalar[ _-]?(?:part[ _-]?)?last|(?<![a-z])w[ _-]last")
_KIND_WORDS = caption_patterns()      # {kind: the words that name it}, from core/representations.py
# The angle written before the axis: 'angle (rad), axis:', '(angle, axis) =', 'theta, n =', 'AngleAxisd aa(…)',
# '[angle first]', '30° about [x, y, z]'
_ANGLE_FIRST = re.compile(r"(?<![a-z])(?:angle|theta|phi)(?![a-z])[ _,/()a-z-]{0,16}?(?<![a-z])(?:axis|n)(?![a-z])"
                          r"|angleaxis|angle[ _-]first|(?<![a-z])about[ ]*[\[(]")
_AXIS_FIRST = re.compile(r"(?<![a-z])axis(?![a-z])[ _,/()a-z-]{0,16}?(?<![a-z])(?:angle|theta|phi)(?![a-z])|axis[ _-]first")
_RADIAN_VECTOR = re.compile(r"(?<![a-z])(?:rvecs?|om)(?![a-z])")
_DEG_WORD = re.compile(r"°|(?<![a-z])deg(?:s|rees?)?(?![a-z])")
_RAD_WORD = re.compile(r"(?<![a-z])rad(?:s|ians?)?(?![a-z])")
_PI_EVALUATED = re.compile(r"evaluated '(?P<written>[^']*(?:pi|π)[^']*)'", re.IGNORECASE)


# 'intrinsic: false' or '"extrinsic": true' states the convention as a flag: the word alone would read
# "intrinsic": false as intrinsic. Two flags that disagree say nothing.
_STATED_FLAG = re.compile(r"(?<![a-z])(intrinsic|extrinsic)[\"']?\s*[:=]\s*[\"']?(true|false|yes|no|on|off)"
                          r"(?![a-z0-9])")


YAW_PITCH_ROLL_STATED_EXTRINSIC = ("the text names yaw, pitch and roll (intrinsic Z-Y'-X'') but states the angles "
                                   "are extrinsic; Framewright will not guess which holds (give the sequence and "
                                   "convention as options)")


def _stated_intrinsic(words: str) -> bool | None:
    said = {(m.group(1) == "intrinsic") == (m.group(2) in ("true", "yes", "on"))
            for m in _STATED_FLAG.finditer(words)}
    return said.pop() if len(said) == 1 else None


def _read_clues(parsed: ParsedNumbers) -> _Clues:
    words = parsed.words
    clues = _Clues()
    marked = {n.unit for n in parsed.numbers if n.unit}
    if len(marked) > 1:
        raise DecodeError("the numbers are marked in both degrees and radians; expected one unit for all")
    if marked:
        clues.units = marked.pop()
        clues.units_reason = f"the numbers are marked in {'degrees' if clues.units == 'deg' else 'radians'}"
    else:
        deg, rad = bool(_DEG_WORD.search(words)), bool(_RAD_WORD.search(words))
        if deg != rad:
            clues.units = "deg" if deg else "rad"
            clues.units_reason = f"the text says {'degrees' if deg else 'radians'}"
    body_to_ref, ref_to_body = _BODY_TO_REF.search(words), _REF_TO_BODY.search(words)
    if body_to_ref and not ref_to_body:
        clues.transposed, clues.transposed_reason = False, f"the text says '{body_to_ref.group()}'"
    elif ref_to_body and not body_to_ref:
        clues.transposed, clues.transposed_reason = True, f"the text says '{ref_to_body.group()}'"
    elif not body_to_ref and _DCM.search(words):
        clues.transposed = True
        clues.transposed_reason = "the text calls it a direction cosine matrix, usually reference -> body"
    elif body_to_ref and ref_to_body:
        clues.notes.append("the text names both directions (body to reference and reference to body)")
    if says_column_major(words) and len(parsed.numbers) == 9 and len(parsed.rows) == 1:
        # nine numbers on one line written column after column are the transpose of a row-major reading
        said = "the text says column-major: the nine numbers are the columns one after another"
        if clues.transposed is None:
            clues.transposed, clues.transposed_reason = True, said
        else:
            clues.transposed, clues.transposed_reason = not clues.transposed, f"{clues.transposed_reason}; {said}"
    from core.sequences import parse_sequence
    found = set()
    primes = False
    for m in _SEQUENCE_WORD.finditer(words):
        try:
            found.add(parse_sequence(m.group(1) + m.group(3) + m.group(5)))
            primes = primes or bool(m.group(4) or m.group(6))
        except FramewrightError:
            pass
    if len(found) == 1:
        clues.sequence = found.pop()
    elif len(found) > 1:
        clues.notes.append(f"the text names several sequences ({', '.join(sorted(found))}); none was assumed")
    intrinsic, extrinsic = bool(_INTRINSIC_WORD.search(words)) or primes, bool(_EXTRINSIC_WORD.search(words))
    if intrinsic != extrinsic:
        clues.intrinsic = intrinsic
    stated = clues.intrinsic_stated = _stated_intrinsic(words)
    if stated is not None:
        clues.intrinsic = stated
    if clues.sequence is None:
        yaw, pitch, roll = (words.find(w) for w in ("yaw", "pitch", "roll"))
        if min(yaw, pitch, roll) >= 0:
            if yaw < pitch < roll:
                if stated is False:
                    raise DecodeError(YAW_PITCH_ROLL_STATED_EXTRINSIC)
                clues.sequence, clues.intrinsic = "ZYX", True
            elif roll < pitch < yaw and clues.intrinsic is not True:
                clues.sequence, clues.intrinsic = "XYZ", False
    wxyz, xyzw = bool(_WXYZ.search(words)), bool(_XYZW.search(words))
    if wxyz != xyzw:
        clues.order = "wxyz" if wxyz else "xyzw"
    if re.search(r"(?<![a-z])jpl(?![a-z])", words):
        clues.order = "jpl"
    clues.kinds = {kind for kind, pattern in _KIND_WORDS.items() if pattern.search(words)}
    caption = " ".join(c for _, c in parsed.captions[:1])
    angle_first = _ANGLE_FIRST.search(caption) or _ANGLE_FIRST.search(words)
    axis_first = _AXIS_FIRST.search(caption)
    if angle_first and not (axis_first and axis_first.start() < angle_first.start()):
        clues.angle_first = True
        clues.kinds.add(AXIS_ANGLE.kind)
    _pi_clue(parsed, clues)
    if clues.units is None and _RADIAN_VECTOR.search(words):
        clues.units, clues.units_reason = "rad", "rvec and om rotation vectors are in radians (common practice)"
    _library_clues(parsed, clues)
    return clues


def _pi_clue(parsed: ParsedNumbers, clues: _Clues) -> None:
    """'PI/2', '${-M_PI/2}': π is half a turn in radians, so angles written with it are radians; a text that
    also says degrees contradicts itself and is refused."""
    found = next((m for m in map(_PI_EVALUATED.search, parsed.notes) if m), None)
    if found is None:
        return
    clues.pi_written = found.group("written")
    if clues.units == "deg":
        raise DecodeError(f"'{clues.pi_written}' is an angle in radians (π is half a turn), but {clues.units_reason}"
                          " too; Framewright will not guess which is meant")
    if clues.units is None:
        clues.units, clues.units_reason = "rad", f"'{clues.pi_written}' names π: radians"


def _library_clues(parsed: ParsedNumbers, clues: _Clues) -> None:
    call = parsed.library_call
    if call is None:
        return
    kind, seq, degrees, scalar_first = call
    marked = "degrees=True" if degrees else "radians, the library's default"
    if kind == "euler":
        from core.sequences import parse_sequence
        try:
            clues.sequence = parse_sequence(seq.upper())
        except FramewrightError:
            return
        clues.intrinsic = seq.isupper()
        clues.kinds.add("angles")
        case = "upper case, intrinsic" if seq.isupper() else "lower case, extrinsic"
        clues.notes.append(f"a library call names '{seq}': {case} (SciPy's documented meaning), {marked}")
    elif kind == "quat":
        clues.order = "wxyz" if scalar_first else "xyzw"
        clues.kinds.add("quaternion")
        clues.notes.append("a library call: from_quat is scalar last unless scalar_first=True (SciPy's documented"
                           " meaning)")
    else:
        clues.kinds.add(ROTATION_VECTOR.kind)
        clues.notes.append(f"a library call: a rotation vector in {marked}")
    if not any(n.unit for n in parsed.numbers) and kind != "quat":
        clues.units = "deg" if degrees else "rad"
        clues.units_reason = f"the library call says {marked}"
