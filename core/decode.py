"""Pasted text -> ranked readings of an orientation.

Two layers:
- `parse_numbers(text)` finds the numbers in text pasted from a drawing, PDF, spreadsheet, e-mail or a
  program, with their line, unit mark and label, and notes on what it set aside. A points-table paste
  can reuse it.
- `decode(text, hints)` turns those numbers into every plausible reading (matrix as written or
  transposed, quaternion w-first or w-last, degrees or radians, which sequence), ranked by plausibility.

Nothing here guesses silently: every assumption a reading makes is in its `conventions`, every repair
in its `notes`, and the reason for its rank in `why`.
"""

from __future__ import annotations

import json
import math
import re
from dataclasses import dataclass, field

import numpy as np

from core.errors import DecodeError, FramewrightError

MAX_INPUT_BYTES = 100_000
KINDS = ("matrix", "quaternion", "axis-angle", "rotation-vector", "angles")
UNDERSTOOD_COUNTS = "9 (a matrix), 4 (a quaternion, or an axis and an angle) or 3 (angles or a rotation vector)"
_MAX_NOTES = 12
_MAX_NUMBERS = 2000        # decode stops early on a flood of numbers: no orientation is written with more
_SUMMARY_LINES = 8         # a count message names this many lines, then says how many more

# ---------------------------------------------------------------------------------------------------
# Characters that pasted text brings along
# ---------------------------------------------------------------------------------------------------
_SPACES = dict.fromkeys(map(ord, "\u00a0\u1680\u2000\u2001\u2002\u2003\u2004\u2005\u2006\u2007\u2008"
                                 "\u2009\u200a\u202f\u205f\u3000\t\v\f"), " ")
_INVISIBLE = dict.fromkeys(map(ord, "\u200b\u200c\u200d\u2060\ufeff\u00ad"), None)
_MINUS = dict.fromkeys(map(ord, "\u2212\u2010\u2011\u2012\ufe63\uff0d"), "-")
_OTHER = {ord("\u2014"): " ", ord("\u2015"): " ", ord("\uff0c"): ",", ord("\uff1b"): ";",
          ord("\uff1a"): ":", ord("\u2018"): "'", ord("\u2019"): "'", ord("\u201c"): '"',
          ord("\u201d"): '"', ord("\u2032"): "'", ord("\u2033"): '"', ord("\u00ba"): "°",
          ord("\u02da"): "°", ord("\u2218"): "°", ord("\uff0e"): ".", ord("\r"): "\n",
          ord("\u2028"): "\n", ord("\u2029"): "\n", ord("\u0085"): "\n"}
_SUPERSCRIPT = {"⁰": "0", "¹": "1", "²": "2", "³": "3", "⁴": "4", "⁵": "5", "⁶": "6", "⁷": "7",
                "⁸": "8", "⁹": "9", "⁻": "-", "⁺": "+"}
_SUPERSCRIPT_RUN = re.compile("[⁰¹²³⁴⁵⁶⁷⁸⁹⁻⁺]+")


def _normalise_characters(text: str) -> str:
    """Plain ASCII punctuation and spaces for the scanner; digits and letters are left alone."""
    text = text.replace("\r\n", "\n").translate(_INVISIBLE).translate(_SPACES).translate(_MINUS)
    text = text.translate(_OTHER)
    # An en dash directly before a digit is a minus (PDF typesetting); elsewhere it separates words.
    text = re.sub("\u2013(?=\\.?\\d)", "-", text).replace("\u2013", " ")
    # 10⁻¹⁷ -> 10^-17
    return _SUPERSCRIPT_RUN.sub(lambda m: "^" + "".join(_SUPERSCRIPT[c] for c in m.group()), text)


# ---------------------------------------------------------------------------------------------------
# Numbers
# ---------------------------------------------------------------------------------------------------
_NUMBER = re.compile(r"""
    (?:(?<![\w.])(?<![A-Za-z_][-+])|(?<=\d)(?=[+-]))  # not part of a name (IMU2, q0, IMU-2); '0.5-0.5' is two
    (?P<sign>[+-]?)
    (?P<mantissa>\d+(?:\.\d*)?|\.\d+)
    (?:[eEdD](?P<exp>[+-]?\d+))?                   # 6.123e-17, Fortran 1.0D-3
    (?:[ ]?(?:[x×·*]|\\times|\\cdot)[ ]?10[ ]?(?:\^|\*\*)[ ]?\{?(?P<exp10>[+-]?\d+)\}?)?   # 6.1×10^-17
    (?P<suffix>[fFlL](?!\w))?                      # C float suffix 1.0f
    """, re.VERBOSE)
_UNIT = re.compile(r"[ ]?(?:(?P<deg>°|deg(?:rees?|s)?(?![A-Za-z]))|(?P<rad>rad(?:ians?|s)?(?![A-Za-z])))")
_MINUTES = re.compile(r"[ ]?(?P<m>\d+(?:\.\d*)?)[ ]?'(?:[ ]?(?P<s>\d+(?:\.\d*)?)[ ]?(?:\"|''))?")
_TOKEN = re.compile(r"[^\s,;|\[\](){}&<>=:\"]+")   # a run between separators; filtered, never backtracked
# A key before its value: `w = 0.7`, `"qx": 0`, `X:`, `angle (deg) =`, `yaw [deg]:`
_KEY = re.compile(r"""(?<![\w.:])["']?(?P<key>[A-Za-z_][\w.]*(?:[ ]?[(\[][A-Za-z]+[)\]])?)["']?[ ]*(?::(?!:)|=(?!=))""")
# Expressions we refuse rather than misread: 1/√2, sqrt(2)/2, pi/2, cos(30°)
_EXPRESSION = re.compile(r"(?:\d[ ]*/[ ]*[\d.(\\a-zA-Z√π])|(?:\)[ ]*/)|√|π|\\frac|\\sqrt|(?<![A-Za-z])(?:sqrt|pi|sin|cos|tan)"
                         r"(?![A-Za-z])[ ]*[(\d/*]", re.IGNORECASE)
# Words that stand for a value we will not guess at: non-finite values, named constants, substitutions
_NON_FINITE = re.compile(r"(?<![\w.])[+-]?(?:nan|inf(?:inity)?)(?!\w)", re.IGNORECASE)
_CONSTANT = re.compile(r"(?<![A-Za-z0-9])(?:M_)?PI(?![A-Za-z0-9_])|π|\$\{|\$\(", re.IGNORECASE)
# Words allowed between two numbers on a line (besides keys): units, component and angle names, 'and'
_BETWEEN_WORDS = frozenset("""deg degs degree degrees rad rads radian radians and w x y z i j k qw qx qy qz
    yaw pitch roll heading bank elevation axis angle theta phi psi""".split())
_NUMBER_TYPE = re.compile(r"(?:np\.|numpy\.)?(?:float|int|uint|double)\d*", re.IGNORECASE)  # np.float64(0.5)
_C_DIMENSIONS = re.compile(r"(?<=[\w\]])[ ]*\[[ ]*\d+[ ]*\]")          # double R[3][3], q[4]
_TEMPLATE_ARGS = re.compile(r"(?<=\w)[ ]*<[^<>\n]*>")                   # Matrix<double,3,3>
_COMMENT_START = re.compile(r"/\*|//|#|%")


@dataclass(frozen=True)
class FoundNumber:
    """One number as found in the text."""
    value: float
    text: str                 # as written, after character clean-up
    line: int                 # 1-based line number
    column: int               # 1-based column in that line
    unit: str | None = None   # 'deg' or 'rad' when marked (°, deg, rad)
    label: str | None = None  # key or row label written before it on its line, lower case
    row: int = 0              # row index as written (lines, ';', '\\', closing brackets)
    has_decimals: bool = False


@dataclass(frozen=True)
class ParsedNumbers:
    """The numbers found in a text, in reading order, and notes on what was set aside."""
    numbers: tuple[FoundNumber, ...]
    notes: tuple[str, ...]
    words: str = ""            # lower-case text of everything that is not a number (hints)
    captions: tuple[tuple[int, str], ...] = ()   # (line, text before its first number) per data line
    headers: tuple[tuple[int, str], ...] = ()    # (data line, the numberless line just above it): CSV headers
    decimal_commas: bool = False                 # '0,7071' seen: maybe decimal commas (read as separators)
    line_words: tuple[tuple[int, str], ...] = ()  # (data line, its text with the numbers blanked out)
    strays: tuple[tuple[int, str], ...] = ()      # (line, word) between two numbers that we do not know

    @property
    def values(self) -> np.ndarray:
        return np.array([n.value for n in self.numbers], dtype=float)

    @property
    def rows(self) -> tuple[tuple[float, ...], ...]:
        """Numbers grouped in rows as written (a points table reads these)."""
        out: dict[int, list[float]] = {}
        for n in self.numbers:
            out.setdefault(n.row, []).append(n.value)
        return tuple(tuple(v) for _, v in sorted(out.items()))

    def lines_summary(self) -> str:
        counts: dict[int, int] = {}
        for n in self.numbers:
            counts[n.line] = counts.get(n.line, 0) + 1
        parts = [f"line {k}: {v}" for k, v in sorted(counts.items())]
        if len(parts) > _SUMMARY_LINES:
            parts = parts[:_SUMMARY_LINES] + [f"and {len(parts) - _SUMMARY_LINES} more lines"]
        return ", ".join(parts)


class _Notes(list):
    """A bounded list of notes: fuzzing with 100 kB of junk must not make 10 000 notes."""

    def add(self, text: str) -> None:
        if len(self) < _MAX_NOTES:
            self.append(text)
        elif len(self) == _MAX_NOTES:
            self.append("further notes left out")


def _check_size(text: str) -> None:
    if not isinstance(text, str):
        raise DecodeError(f"expected text to decode, got {type(text).__name__}")
    size = len(text.encode("utf-8", "surrogatepass"))
    if size > MAX_INPUT_BYTES:
        raise DecodeError(f"the text is {size} bytes long; Framewright decodes at most {MAX_INPUT_BYTES} bytes"
                          " (paste only the orientation)")


def _to_float(match: re.Match, line_no: int) -> float:
    mantissa = match.group("mantissa")
    exponents = (match.group("exp") or "0", match.group("exp10") or "0")
    if any(len(e.lstrip("+-").lstrip("0")) > 4 for e in exponents):     # before int(): 5000 digits
        raise DecodeError(f"line {line_no}: '{_shorten(match.group().strip())}' has an exponent out of range")
    exponent = int(exponents[0]) + int(exponents[1])
    if abs(exponent) > 400:
        raise DecodeError(f"line {line_no}: '{_shorten(match.group().strip())}' has an exponent out of range")
    value = float(f"{mantissa}e{exponent}")
    return -value if match.group("sign") == "-" else value


def _join_detached_signs(line: str, notes: _Notes, line_no: int) -> str:
    """'- 0.5' after a separator is a sign with a stray space (common in PDFs); dropping it would flip a value."""
    def join(m: re.Match) -> str:
        notes.add(f"line {line_no}: a sign separated from its number by a space was read as its sign")
        return m.group(1)
    return re.sub(r"((?:^|[\s,;|(\[{=:&])[+-]) +(?=\.?\d)", join, line)


def _strip_comments(text: str) -> tuple[str, str]:
    """Comments (# // /* */ %) can carry words we use as hints but their numbers are not data.

    One forward scan: a '/*' with no '*/' after it is text, and once one is unclosed every later one is
    too, so the closing search runs at most once per comment (linear time on '/*x/*x…')."""
    comments: list[str] = []
    out: list[str] = []
    pos = 0
    closes = True                       # False once a '/*' found no '*/' after it
    while True:
        m = _COMMENT_START.search(text, pos)
        if m is None:
            break
        start, opener = m.start(), m.group()
        if opener == "/*":
            end = text.find("*/", start + 2) if closes else -1
            if end < 0:
                closes = False
                out.append(text[pos:start + 1])
                pos = start + 1
                continue
            end += 2
        elif opener == "#" and start > 0 and (text[start - 1].isalnum() or text[start - 1] in "_&"):
            out.append(text[pos:start + 1])
            pos = start + 1
            continue
        else:
            end = text.find("\n", start)
            end = len(text) if end < 0 else end
        comment = text[start:end]
        comments.append(comment)
        out += [text[pos:start], "\n" * comment.count("\n")]
        pos = end
    out.append(text[pos:])
    return "".join(out), " ".join(comments)


def _has_digit(word: str) -> bool:
    return any(c.isdigit() for c in word)


def parse_numbers(text: str, max_numbers: int | None = None) -> ParsedNumbers:
    """Find the numbers in pasted text.

    Accepts integers, decimals, scientific notation (6.123e-17, 6.1×10⁻¹⁷, Fortran 1D-3), a leading '+',
    the Unicode minus and an en dash as minus, non-breaking and thin spaces, any separators and brackets,
    degree marks (°, deg, d°m's") and 'rad'. Words, labels and lines with no numbers are set aside with a
    note. Raises DecodeError for text over 100 kB, for expressions (1/√2, pi/2) it will not guess at, and
    for more than `max_numbers` numbers when given (the decoder's early stop on a flood of numbers).
    """
    _check_size(text)
    notes = _Notes()
    clean = _normalise_characters(text)
    clean, comment_words = _strip_comments(clean)
    if comment_words.strip() and re.search(r"\d", comment_words):
        notes.add("numbers inside comments were not read")
    numbers: list[FoundNumber] = []
    words: list[str] = [comment_words]
    captions: list[tuple[int, str]] = []
    headers: list[tuple[int, str]] = []
    line_words: list[tuple[int, str]] = []
    strays: list[tuple[int, str]] = []
    row = 0
    skipped_titles = 0
    previous_text = None
    for line_no, raw_line in enumerate(clean.split("\n"), start=1):
        if not raw_line or raw_line.isspace():
            continue                    # a blank line holds nothing (and must stay cheap: 100 kB of them)
        line = raw_line
        if "<" in line or "[" in line:
            line = _C_DIMENSIONS.sub(" ", _TEMPLATE_ARGS.sub(" ", line))
        if "-" in line or "+" in line:
            line = _join_detached_signs(line, notes, line_no)
        expression = _EXPRESSION.search(line)
        if expression and _NUMBER.search(line):
            start = max(0, expression.start() - 6)
            raise DecodeError(f"line {line_no} holds an expression ('{_shorten(line[start:expression.end() + 6].strip())}');"
                              " Framewright reads plain numbers only: paste decimal values")
        if "," in line or ";" in line or "|" in line:
            _refuse_empty_cells(line, line_no)
        _refuse_values_we_will_not_guess(line, line_no)
        key_matches = list(_KEY.finditer(line))
        keys = [(m.end(), m.group("key").lower()) for m in key_matches]
        next_key = 0
        label = None
        found_here: list[FoundNumber] = []
        covered: list[tuple[int, int]] = []
        last_end = 0
        pos = 0
        while True:
            m = _NUMBER.search(line, pos)
            if m is None:
                break
            end = m.end()
            unit = None
            u = _UNIT.match(line, end)
            if u:
                unit = "deg" if u.group("deg") else "rad"
                end = u.end()
            value = _to_float(m, line_no)
            if not math.isfinite(value):
                raise DecodeError(f"line {line_no}: '{_shorten(m.group().strip())}' is too large to be a number here")
            if unit == "deg" and u.group("deg") == "°":
                dms = _MINUTES.match(line, end)
                if dms and float(dms.group("m")).is_integer():
                    minutes = float(dms.group("m"))
                    seconds = float(dms.group("s") or 0.0)
                    if minutes >= 60 or seconds >= 60:
                        raise DecodeError(f"line {line_no}: '{_shorten(line[m.start():dms.end()].strip())}' has minutes or"
                                          " seconds of 60 or more")
                    value = math.copysign(abs(value) + minutes / 60 + seconds / 3600, value if value else
                                          (-1.0 if m.group("sign") == "-" else 1.0))
                    end = dms.end()
                    notes.add(f"line {line_no}: degrees, minutes and seconds read as {value:.10g}°")
            if end < len(line) and (line[end].isalnum() or line[end] in "_."):
                pos = m.start() + 1 + len(m.group("sign"))      # glued to letters: '2D', '3rd', '1.2.3'
                while pos < len(line) and (line[pos].isalnum() or line[pos] in "_."):
                    pos += 1
                continue
            # a row ends at a newline (new line), ';', '\\' or a closing bracket between two numbers
            if found_here and re.search(r"[;\])}]|\\\\", line[last_end:m.start()]):
                row += 1
            while next_key < len(keys) and keys[next_key][0] <= m.start():   # the last key before it
                label = keys[next_key][1]
                next_key += 1
            # a new label on the same line starts a new row ("X: 1 0 0  Y: 0 1 0")
            if found_here and label is not None and label != found_here[-1].label:
                row += 1
            if max_numbers is not None and len(numbers) + len(found_here) >= max_numbers:
                raise DecodeError(f"the text holds more than {max_numbers} numbers (line {line_no} and before);"
                                  f" Framewright reads {UNDERSTOOD_COUNTS}: paste only the orientation")
            found_here.append(FoundNumber(
                value=value, text=line[m.start():end].strip(), line=line_no, column=m.start() + 1, unit=unit,
                label=label, row=row,
                has_decimals="." in m.group("mantissa") or bool(m.group("exp") or m.group("exp10"))))
            covered.append((m.start(), end))
            last_end = end
            pos = end
        # What was set aside on this line, for notes and hints
        pieces, previous_end = [], 0
        for a, b in covered:
            pieces += [line[previous_end:a], " " * (b - a)]
            previous_end = b
        rest = "".join(pieces) + line[previous_end:]
        words.append(rest.lower())
        if found_here:
            strays.extend(_words_between_numbers(rest, found_here, key_matches, line_no))
            captions.append((line_no, line[:found_here[0].column - 1].strip().lower()))
            line_words.append((line_no, rest.strip()))
            odd = [w for w in _TOKEN.findall(rest) if _has_digit(w) and w.strip("'\"^°+-*x×·")]
            if odd:
                notes.add(f"line {line_no}: ignored {', '.join(repr(w) for w in odd[:3])} (not a number)")
            numbers.extend(found_here)
            row += 1
            if previous_text is not None:
                headers.append((line_no, previous_text))
            previous_text = None
        elif rest.strip():
            previous_text = rest.strip().lower()
            skipped_titles += 1
            if skipped_titles <= 3:
                notes.add(f"line {line_no} ('{_shorten(rest.strip())}') holds no numbers and was ignored")
    if skipped_titles > 3:
        notes.add(f"{skipped_titles - 3} more lines without numbers were ignored")
    return ParsedNumbers(tuple(numbers), tuple(notes), " ".join(words), tuple(captions), tuple(headers),
                         bool(re.search(r"\d,\d", clean)), tuple(line_words), tuple(strays))


_BETWEEN_DIGITS = re.compile(r"[^\d\n]+")
_EMPTY_PLACE = re.compile(r",[ ]*,|;[ ]*;|\|[ ]*\|")


def _refuse_empty_cells(line: str, line_no: int) -> None:
    """'0.7071, , 0' or '| 1 | | 0 |': a number is missing between two others; reading on would shift
    every later number into the wrong place. Each run of non-digits is looked at once (linear time)."""
    for run in _BETWEEN_DIGITS.finditer(line):
        if run.start() == 0 or run.end() == len(line):
            continue                    # not between two digits
        m = _EMPTY_PLACE.search(line, run.start(), run.end())
        if m:
            raise DecodeError(f"line {line_no}, column {m.start() + 1}: an empty place between numbers"
                              f" ('{m.group()}'): a number seems to be missing")


def _refuse_values_we_will_not_guess(line: str, line_no: int) -> None:
    """NaN, inf, PI, M_PI, π, ${…}: dropping them would shift the other numbers into another reading, and
    reading 'PI/2' as 2 loses the sign and π. Refused by name, with the line."""
    m = _NON_FINITE.search(line)
    if m:
        raise DecodeError(f"line {line_no}: '{m.group()}' is not a finite number; every number must be a"
                          " finite decimal value")
    m = _CONSTANT.search(line)
    if m:
        token = _shorten(line[m.start():].split()[0], 24)
        raise DecodeError(f"line {line_no}: '{token}' is a named constant or an expression; Framewright reads"
                          " plain numbers only: paste decimal values")


def _words_between_numbers(rest: str, found: list, key_matches: list, line_no: int) -> list:
    """Words between the first and the last number of a line that are no key, unit or component name:
    '30 abc 20 10' must not be read as three angles with 'abc' dropped."""
    first, last = found[0].column - 1, found[-1].column - 1 + len(found[-1].text)
    keyed = [(m.start(), m.end()) for m in key_matches]
    out = []
    for t in _TOKEN.finditer(rest, first, last):
        word = t.group().strip("'\"*+-^°×·\\")
        if not any(c.isalnum() for c in word) or word.lower() in _BETWEEN_WORDS or _NUMBER_TYPE.fullmatch(word):
            continue
        if any(a <= t.start() < b for a, b in keyed):
            continue
        out.append((line_no, word))
    return out


def _shorten(text: str, width: int = 40) -> str:
    return text if len(text) <= width else text[:width - 1] + "…"


def extract_numbers(text: str) -> list[float]:
    """Just the values, in reading order (for editors that take a row of numbers from a paste)."""
    return [float(v) for v in parse_numbers(text).values]


# ---------------------------------------------------------------------------------------------------
# Hints and readings
# ---------------------------------------------------------------------------------------------------
_KIND_ALIASES = {"matrix": "matrix", "dcm": "matrix", "quaternion": "quaternion", "quat": "quaternion",
                 "axis-angle": "axis-angle", "axis_angle": "axis-angle", "axisangle": "axis-angle",
                 "rotation-vector": "rotation-vector", "rotation_vector": "rotation-vector",
                 "rotvec": "rotation-vector", "angles": "angles", "euler": "angles"}
_ORDER_ALIASES = {"wxyz": "wxyz", "w-first": "wxyz", "scalar-first": "wxyz", "xyzw": "xyzw",
                  "w-last": "xyzw", "scalar-last": "xyzw", "jpl": "jpl"}
_UNIT_ALIASES = {"deg": "deg", "degree": "deg", "degrees": "deg", "rad": "rad", "radian": "rad",
                 "radians": "rad"}


@dataclass(frozen=True)
class DecodeHints:
    """What the person already knows; each given hint removes the readings that disagree with it.

    kind: 'matrix', 'quaternion', 'axis-angle', 'rotation-vector' or 'angles'
    sequence: 'ZYX', "Z-Y'-X''", ...; intrinsic: True / False
    order: quaternion order 'wxyz', 'xyzw' (both Hamilton) or 'jpl' (scalar last, JPL convention)
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
            kind = _KIND_ALIASES.get(str(kind).lower())
            if kind is None:
                raise DecodeError(f"unknown kind hint {self.kind!r}; expected one of {', '.join(KINDS)}")
        if order is not None:
            order = _ORDER_ALIASES.get(str(order).lower())
            if order is None:
                raise DecodeError(f"unknown quaternion order hint {self.order!r}; expected wxyz, xyzw or jpl")
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


@dataclass
class _Clues:
    """What the words around the numbers say."""
    units: str | None = None
    units_reason: str = ""
    transposed: bool | None = None
    transposed_reason: str = ""
    sequence: str | None = None
    intrinsic: bool | None = None
    order: str | None = None
    kinds: set = field(default_factory=set)
    notes: list = field(default_factory=list)


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
_KIND_WORDS = {
    "quaternion": re.compile(r"quaternion|(?<![a-z])quat(?![a-z])|versor"),
    "rotation-vector": re.compile(r"rotation[ _-]?vector|rotvec|(?<![a-z])rvec(?![a-z])"),
    "angles": re.compile(r"euler|tait|(?<![a-z])(?:yaw|pitch|roll|heading)(?![a-z])|(?<![a-z])angles(?![a-z])"),
    "axis-angle": re.compile(r"axis[ _-]?(?:and[ _-]?)?angle|angle[ _-]?axis"),
}
_DEG_WORD = re.compile(r"°|(?<![a-z])deg(?:s|rees?)?(?![a-z])")
_RAD_WORD = re.compile(r"(?<![a-z])rad(?:s|ians?)?(?![a-z])")


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
    if clues.sequence is None:
        yaw, pitch, roll = (words.find(w) for w in ("yaw", "pitch", "roll"))
        if min(yaw, pitch, roll) >= 0:
            if yaw < pitch < roll:
                clues.sequence, clues.intrinsic = "ZYX", True
            elif roll < pitch < yaw and clues.intrinsic is not True:
                clues.sequence, clues.intrinsic = "XYZ", False
    wxyz, xyzw = bool(_WXYZ.search(words)), bool(_XYZW.search(words))
    if wxyz != xyzw:
        clues.order = "wxyz" if wxyz else "xyzw"
    if re.search(r"(?<![a-z])jpl(?![a-z])", words):
        clues.order = "jpl"
    clues.kinds = {kind for kind, pattern in _KIND_WORDS.items() if pattern.search(words)}
    return clues


# ---------------------------------------------------------------------------------------------------
# Numbers that carry their own names: w=…, axis/angle, yaw/pitch/roll, X:/Y:/Z: rows, CSV headers
# ---------------------------------------------------------------------------------------------------
_QUATERNION_KEYS = {
    "w": ("w", "qw", "q_w", "qs", "s", "scalar", "real", "re"),
    "x": ("x", "qx", "q_x", "i", "qi"),
    "y": ("y", "qy", "q_y", "j", "qj"),
    "z": ("z", "qz", "q_z", "k", "qk"),
}
_COMPONENT = {name: part for part, names in _QUATERNION_KEYS.items() for name in names}
_UNIT_SUFFIX = re.compile(r"[ _]?(?:\((deg|rad)\w*\)|\[(deg|rad)\w*\]|(?<=_)(deg|rad)\w*)$")


@dataclass
class _Keyed:
    """Numbers put in order by their names, and what the names fixed."""
    values: list
    kind: str
    order: str | None = None
    sequence: str | None = None
    intrinsic: bool | None = None
    units: str | None = None
    note: str = ""


def _split_key(label: str | None) -> tuple[str | None, str | None]:
    """'angle (deg)' -> ('angle', 'deg'); 'orientation.x' -> ('x', None)."""
    if label is None:
        return None, None
    label = label.strip().strip("'\"").split(".")[-1]
    m = _UNIT_SUFFIX.search(label)
    unit = None
    if m:
        unit = next(g for g in m.groups() if g)
        label = label[:m.start()].rstrip(" _")
    return label, unit


def _labels(parsed: ParsedNumbers) -> list:
    labels = [n.label for n in parsed.numbers]
    # A CSV header above one data line names its columns.
    lines = {n.line for n in parsed.numbers}
    if len(lines) == 1 and parsed.headers and all(label is None for label in labels):
        names = [t for t in re.split(r"[\s,;|]+", parsed.headers[0][1]) if t]
        if len(names) == len(labels):
            labels = names
    return labels


def _keyed(parsed: ParsedNumbers) -> _Keyed | None:
    labels = _labels(parsed)
    if not any(labels):
        return None
    values = [n.value for n in parsed.numbers]
    keys, units = zip(*(_split_key(label) for label in labels))
    keys = tuple(k or "" for k in keys)
    unit_set = {u for u in units if u}
    unit = unit_set.pop() if len(unit_set) == 1 else None
    n = len(values)
    # quaternion components
    if n == 4:
        named = [_COMPONENT.get(k or "") for k in keys]
        if sorted(keys) == ["q0", "q1", "q2", "q3"]:
            named = [{"q0": "w", "q1": "x", "q2": "y", "q3": "z"}[k] for k in keys]
        elif sorted(keys) == ["q1", "q2", "q3", "q4"]:
            named = [{"q4": "w", "q1": "x", "q2": "y", "q3": "z"}[k] for k in keys]
        if sorted(p or "" for p in named) == ["w", "x", "y", "z"]:
            by = dict(zip(named, values))
            note = f"read by their names ({', '.join(k for k in keys)}) and put in the order w, x, y, z"
            if "q4" in keys:
                note += "; q4 taken as the scalar part"
            written = "wxyz" if named[0] == "w" else "xyzw" if named[3] == "w" else "by name"
            return _Keyed([by["w"], by["x"], by["y"], by["z"]], "quaternion", order=written, note=note)
        axis = [v for k, v in zip(keys, values) if k in ("axis", "rotation axis", "n", "u")]
        parts = {k: v for k, v in zip(keys, values) if k in ("axis_x", "axis_y", "axis_z", "ax", "ay", "az")}
        angle = [(v, u) for k, v, u in zip(keys, values, units) if k in ("angle", "theta", "rotation angle", "phi")]
        if len(parts) == 3:
            axis = [parts.get("axis_x", parts.get("ax")), parts.get("axis_y", parts.get("ay")),
                    parts.get("axis_z", parts.get("az"))]
        if len(axis) == 3 and len(angle) == 1:
            return _Keyed(axis + [angle[0][0]], "axis-angle", units=angle[0][1] or unit,
                          note="read by their names as an axis and an angle")
    if n == 3:
        names = {"yaw": "yaw", "heading": "yaw", "psi": None, "pitch": "pitch", "elevation": "pitch",
                 "roll": "roll", "bank": "roll"}
        named = [names.get(k or "") for k in keys]
        if sorted(p or "" for p in named) == ["pitch", "roll", "yaw"]:
            by = dict(zip(named, values))
            return _Keyed([by["yaw"], by["pitch"], by["roll"]], "angles", sequence="ZYX", intrinsic=True,
                          units=unit, note="read by their names as yaw, pitch, roll (intrinsic Z-Y'-X'')")
        if all(k in ("rotvec", "rotation vector", "rotation_vector", "rvec") for k in keys):
            return _Keyed(values, "rotation-vector", units=unit, note="named a rotation vector")
        comps = [k for k in keys if k]
        if len(comps) == 3 and {c.removeprefix("rotvec_").removeprefix("rv_") for c in comps} == {"x", "y", "z"} \
                and all(c.startswith(("rotvec_", "rv_")) for c in comps):
            by = {c[-1]: v for c, v in zip(comps, values)}
            return _Keyed([by["x"], by["y"], by["z"]], "rotation-vector", units=unit,
                          note="read by their names as a rotation vector")
    if n == 9:
        element = [re.fullmatch(r"(?:[rmc]|dcm)_?([0-3])([0-3])", k or "") for k in keys]
        if all(element):
            idx = [(int(e.group(1)), int(e.group(2))) for e in element]
            base = 0 if min(min(i) for i in idx) == 0 else 1
            cells = {(r - base, c - base): v for (r, c), v in zip(idx, values)}
            if sorted(cells) == [(r, c) for r in range(3) for c in range(3)]:
                return _Keyed([cells[(r, c)] for r in range(3) for c in range(3)], "matrix",
                              note="placed by their element names (row, column)")
        row_names = [k for k in keys]
        if set(row_names) == {"x", "y", "z"} and all(row_names.count(a) == 3 for a in "xyz"):
            rows = {a: [v for k, v in zip(row_names, values) if k == a] for a in "xyz"}
            order = list(dict.fromkeys(row_names))
            note = "rows labelled X, Y, Z"
            if order != ["x", "y", "z"]:
                note += f" (written in the order {', '.join(o.upper() for o in order)}; put in order X, Y, Z)"
            return _Keyed(rows["x"] + rows["y"] + rows["z"], "matrix", note=note)
    return None


# ---------------------------------------------------------------------------------------------------
# Candidate readings for each count
# ---------------------------------------------------------------------------------------------------
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
        points = 0.6
        if any(v != 0 and abs(v / (math.pi / 12) - round(v / (math.pi / 12))) < 2e-4 for v in values):
            points = 1.0
        return [("rad", points, "all within ±2π with decimals: may be radians"),
                ("deg", 0.0, "degrees, the default")]
    return [("deg", 0.6, "whole numbers: degrees more likely"), ("rad", 0.0, "radians")]


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
            c.plus(2.0, clues.transposed_reason)
        else:
            c.plus(0.0, f"the other direction: {clues.transposed_reason}")
        if report.band != "exact":
            c.notes.append(report.message)
        c.orthogonality_error = report.error
        out.append(c)
    return out


def _four_candidates(values, parsed, hints, clues, keyed):
    from core.orientation import Orientation
    v = np.array(values, dtype=float)
    out = []
    norm = float(np.linalg.norm(v))
    unit_like = abs(norm - 1.0) < 1e-3
    mags = np.abs(v)
    first_largest = mags[0] > mags[1:].max()
    last_largest = mags[3] > mags[:3].max()
    fixed_order = keyed.order if keyed and keyed.kind == "quaternion" else None
    orders = (("wxyz", "Hamilton"), ("xyzw", "Hamilton"), ("xyzw", "JPL"))
    if fixed_order:   # the names said which is w; the values are already in w, x, y, z order
        orders = (("wxyz", "Hamilton"), ("wxyz", "JPL"))
    for order, convention in orders:
        jpl = convention == "JPL"
        if jpl:
            # named components are already in w, x, y, z order; bare numbers are read scalar last
            make = lambda: Orientation.from_quaternion(v, scalar_last=not fixed_order).inverse()
            label = "quaternion (x, y, z, w), JPL convention: the inverse of the Hamilton reading"
        else:
            make = lambda s=(order == "xyzw"): Orientation.from_quaternion(v, scalar_last=s)
            label = f"quaternion ({', '.join(order)}), Hamilton"
        conventions = {"order": fixed_order or order, "convention": convention}
        if fixed_order:
            conventions["named"] = True
            label = "quaternion by named components, " + (
                "JPL convention: the inverse of the Hamilton reading" if jpl else "Hamilton")
        c = _Candidate("quaternion", conventions, make, label)
        if unit_like:
            c.plus(1.0, f"norm {norm:.6g}: a unit quaternion")
        elif abs(norm - 1.0) < 0.05:
            c.plus(0.3, f"norm {norm:.6g}: close to 1")
        else:
            c.plus(-1.5, f"norm {norm:.6g} is far from 1")
        if fixed_order:
            c.plus(0.0 if jpl else 1.0, keyed.note)
        elif not jpl:
            if order == "wxyz" and first_largest:
                c.plus(1.0, "the first number is the largest in magnitude: likely w first")
            elif order == "xyzw" and last_largest:
                c.plus(1.0, "the last number is the largest in magnitude: likely w last")
            elif order == "wxyz" and not last_largest:
                c.plus(0.2, "w first is the default order")
        if jpl:
            c.plus(-3.0, "the JPL convention is offered last, never assumed")
        tag = "jpl" if jpl else order
        if clues.order == tag:
            c.plus(6.0 if jpl else 2.0, "the text names this order")
        if "quaternion" in clues.kinds:
            c.plus(1.5, "the text says quaternion")
        out.append(c)
    if hints.order:
        if fixed_order:   # names decide the order; the hint can still choose Hamilton or JPL
            out = [c for c in out if (c.conventions["convention"] == "JPL") == (hints.order == "jpl")]
        else:
            out = [c for c in out if ("jpl" if c.conventions["convention"] == "JPL" else c.conventions["order"])
                   == hints.order]
    # axis and angle (axis first, angle last)
    axis, angle = v[:3], float(v[3])
    axis_length = float(np.linalg.norm(axis))
    if (axis_length > 0 or angle == 0) and not (hints.order and not hints.kind):
        fixed_units = keyed.units if keyed and keyed.kind == "axis-angle" else None
        for units, points, unit_reason in _unit_choices([angle], hints, clues, fixed_units):
            c = _Candidate("axis-angle", {"order": "axis, angle", "units": units},
                           lambda u=units: Orientation.from_axis_angle(axis, angle, degrees=(u == "deg")),
                           f"axis (x, y, z) and angle in {_unit_word(units)}")
            c.plus(points, unit_reason)
            if abs(axis_length - 1.0) < 1e-3:
                c.plus(1.0, "the first three numbers have unit length, as an axis has")
            else:
                c.plus(-1.5 if 0.5 < axis_length < 2 else -2.5, f"the axis has length {axis_length:.6g}, not 1")
            if abs(angle) > 1.0 + 1e-9:
                c.plus(2.5, f"the last number ({angle:g}) is beyond ±1: an angle, not a quaternion part")
            elif unit_like:
                c.plus(-1.0, "the four numbers have unit norm, as a quaternion has")
            if keyed and keyed.kind == "axis-angle":
                c.plus(3.0, keyed.note)
            if "axis-angle" in clues.kinds:
                c.plus(1.5, "the text says axis and angle")
            out.append(c)
    if keyed and keyed.kind == "quaternion":
        out = [c for c in out if c.kind == "quaternion"]
    if keyed and keyed.kind == "axis-angle":
        out = [c for c in out if c.kind == "axis-angle"]
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
                c.plus(-0.7, "middle angle outside 0..180°, unusual for proper Euler angles")
            elif not is_proper_euler(sequence) and abs(middle) > 90:
                c.plus(-1.0, "middle angle beyond ±90°, unusual for Tait-Bryan angles")
            if "angles" in clues.kinds:
                c.plus(1.0, "the text says angles")
            out.append(c)
    sequence_named = bool(hints.sequence or clues.sequence or (keyed and keyed.kind == "angles"))
    if not sequence_named or (keyed and keyed.kind == "rotation-vector"):
        for units, points, unit_reason in unit_choices:
            c = _Candidate("rotation-vector", {"units": units},
                           lambda u=units: Orientation.from_rotation_vector(v, degrees=(u == "deg")),
                           f"rotation vector in {_unit_word(units)} (axis times angle)")
            c.plus(0.9, "").plus(points, unit_reason)
            if keyed and keyed.kind == "rotation-vector":
                c.plus(3.0, keyed.note)
            if "rotation-vector" in clues.kinds:
                c.plus(3.0, "the text says rotation vector")
            out.append(c)
    if keyed and keyed.kind == "rotation-vector":
        out = [c for c in out if c.kind == "rotation-vector"]
    return out


# ---------------------------------------------------------------------------------------------------
# decode
# ---------------------------------------------------------------------------------------------------
_COUNT_KINDS = {9: ("matrix",), 4: ("quaternion", "axis-angle"), 3: ("angles", "rotation-vector")}
_KIND_COUNT = {"matrix": 9, "quaternion": 4, "axis-angle": 4, "angles": 3, "rotation-vector": 3}


def decode(text: str, hints=None) -> list[Reading]:
    """Every plausible reading of `text`, most plausible first. With every hint given there is one.

    Raises DecodeError (with a message that says what is wrong and where) when the text cannot be read:
    no numbers or a count other than 9, 4 or 3, a refused matrix, conflicting unit marks, over 100 kB."""
    hints = DecodeHints.coerce(hints)
    _check_size(text)
    from_json = _decode_our_json(text, hints)
    if from_json is not None:
        return from_json
    parsed = parse_numbers(text, max_numbers=_MAX_NUMBERS)
    return readings_from_numbers(parsed, hints)


def readings_from_numbers(parsed: ParsedNumbers, hints=None) -> list[Reading]:
    """The readings of numbers already found (see decode). A first or last line that looks like a title
    holding a number ('Mount 7 rotation:') is also tried without it, and both sets are ranked together."""
    hints = DecodeHints.coerce(hints)
    untitled = _without_title_line(parsed)
    from dataclasses import replace
    try:
        readings = _readings(parsed, hints)
    except DecodeError:
        if untitled is None:
            raise
        readings = _readings(untitled, hints)
    else:
        if untitled is not None:
            try:
                others = _readings(untitled, hints)
            except DecodeError:
                others = []
            others = [replace(r, score=round(r.score - 0.5, 6), why=f"{r.why}; reads the text without its title"
                              " line") for r in others]
            readings = sorted(readings + others, key=lambda r: -r.score)
    if len(readings) == 1:
        readings = [replace(readings[0], why=f"the only reading: {readings[0].why}")]
    return readings


def _refuse_strays(parsed: ParsedNumbers, lines: set) -> None:
    """A word between numbers on a line that is read (see _words_between_numbers) is refused."""
    for line, word in parsed.strays:
        if line in lines:
            raise DecodeError(f"line {line}: '{_shorten(word, 24)}' between numbers is not a number, key, unit or"
                              " component name; Framewright will not guess what it stands for (remove it)")


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


def _readings(parsed: ParsedNumbers, hints: DecodeHints) -> list[Reading]:
    clues = _read_clues(parsed)
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
            raise DecodeError(_count_message(parsed, hints))
        values, line, caption_order = picked
        _refuse_strays(parsed, {line})
        notes.append(f"the text holds {len(parsed.numbers)} numbers; read the quaternion on line {line}")
        if caption_order and hints.order is None:
            clues.order = caption_order
        clues.kinds.add("quaternion")
        if hints.kind is None:
            hints = DecodeHints(**{**hints.__dict__, "kind": "quaternion"})
    else:
        _refuse_strays(parsed, {n.line for n in parsed.numbers})
    for n in parsed.numbers:
        if abs(n.value) > _MAX_MAGNITUDE:
            raise DecodeError(f"line {n.line}: {_shorten(n.text)} is too large for any part of an orientation")
    count = len(values)
    _refuse_square_of_two(parsed, keyed, count)
    if hints.kind is not None and _KIND_COUNT[hints.kind] != count:
        raise DecodeError(f"a {hints.kind} needs {_KIND_COUNT[hints.kind]} numbers; the text holds {count}"
                          f" ({parsed.lines_summary() or 'none'})")
    builder = {9: _matrix_candidates, 4: _four_candidates, 3: _three_candidates}[count]
    candidates = builder(values, parsed, hints, clues, keyed)
    if hints.kind is not None:
        candidates = [c for c in candidates if c.kind == hints.kind]
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
    angles = {"axis-angle": values[3:], "rotation-vector": [float(np.linalg.norm(values))]}.get(c.kind, values)
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


def _decode_our_json(text: str, hints: DecodeHints):
    """Our own JSON object (the export and `decode --json`) holds every representation: read the one
    the hints ask for, or the quaternion, which is exact."""
    stripped = text.strip()
    if not stripped.startswith("{") or "quaternion_wxyz" not in stripped:
        return None
    try:
        data = json.loads(_normalise_characters(stripped))
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
            body, extra = numbers("axis", 3) + " " + numbers("angle_deg", 1), {"units": "deg"}
        elif kind == "rotation-vector":
            body, extra = numbers("rotation_vector_deg", 3), {"units": "deg"}
        elif kind == "angles":
            body = numbers("angles_deg", 3)
            extra = {"units": "deg", "sequence": data.get("sequence", "ZYX"),
                     "intrinsic": bool(data.get("intrinsic", True))}
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
