"""The numbers in pasted text, with their line, unit mark and label, and notes on what was set aside."""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

import numpy as np

from core.errors import DecodeError
from core.decode.characters import _check_size, _normalise_characters, _shorten, _strip_comments
from core.decode.angle_marks import _MINUTES, _UNIT, _other_unit
from core.decode.expressions import substitute
from core.decode.number_refusals import (_TOKEN, _refuse_empty_cells, _refuse_values_we_will_not_guess,
                                         _words_between_numbers, literals_in_lists)

UNDERSTOOD_COUNTS = "9 (a matrix), 4 (a quaternion, or an axis and an angle) or 3 (angles or a rotation vector)"
_MAX_NOTES = 12
_MAX_NUMBERS = 2000        # decode stops early on a flood of numbers: no orientation is written with more
_SUMMARY_LINES = 8         # a count message names this many lines, then says how many more


_NUMBER = re.compile(r"""
    (?:(?<![\w.])(?<![A-Za-z_][-+])|(?<=\d)(?=[+-]))  # not part of a name (IMU2, q0, IMU-2); '0.5-0.5' is two
    (?P<sign>[+-]?)
    (?P<mantissa>\d+(?:\.\d*)?|\.\d+)
    (?:[eEdD](?P<exp>[+-]?\d+))?                   # 6.123e-17, Fortran 1.0D-3
    (?:[ ]?(?:[x×·*]|\\times|\\cdot)[ ]?10[ ]?(?:\^|\*\*)[ ]?\{?(?P<exp10>[+-]?\d+)\}?)?   # 6.1×10^-17
    (?P<suffix>[fFlL](?!\w))?                      # C float suffix 1.0f
    """, re.VERBOSE)
# A key before its value: `w = 0.7`, `"qx": 0`, `X:`, `angle (deg) =`, `yaw [deg]:`
_KEY = re.compile(r"""(?<![\w.:])["']?(?P<key>[A-Za-z_][\w.]*(?:[ ]?[(\[][A-Za-z]+[)\]])?)["']?[ ]*(?::(?!:)|=(?!=))""")
# Expressions we refuse rather than misread: 1/√2, sqrt(2)/2, pi/2, cos(30°)
_EXPRESSION = re.compile(r"(?:(?<![A-Za-z_\d.])\d[\d.]*[ ]*/[ ]*[\d.(\\a-zA-Z√π])|(?:\)[ ]*/)|√|π|\\frac|\\sqrt|(?<![A-Za-z])(?:sqrt|pi|sin|cos|tan)"
                         r"(?![A-Za-z])[ ]*[(\d/*]", re.IGNORECASE)


_C_DIMENSIONS = re.compile(r"(?<=[\w\]])[ ]*\[[ ]*\d+[ ]*\]")          # double R[3][3], q[4]
_TEMPLATE_ARGS = re.compile(r"(?<=\w)[ ]*<[^<>\n]*>")                   # Matrix<double,3,3>


@dataclass(frozen=True)
class FoundNumber:
    """One number as found in the text."""
    value: float
    text: str                 # as written, after character clean-up
    line: int                 # 1-based line number
    column: int               # 1-based column in that line
    unit: str | None = None   # 'deg' or 'rad' when marked (°, deg, rad; other angle marks become 'deg')
    converted_from: str | None = None   # the angle unit it was marked in and converted from ('mrad', …)
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
    library_call: tuple[str, str, bool, bool] | None = None   # ('euler', 'xyz', degrees=, scalar_first=)

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


_PI_NAME = r"(?:M_PI|PI|Pi|pi|π)(?![A-Za-z0-9_])"
_DETACHED_SIGN = re.compile(rf"((?:^|[\s,;|(\[{{=:&])[+-]) +(?=\.?\d|{_PI_NAME})")
# '- (0.5)' and '- (pi/2)': a sign standing apart before a bracket may negate it or be a bullet or a dash
_DETACHED_SIGN_BEFORE_BRACKET = re.compile(rf"(?:^|[\s,;|(\[{{=:&])([+-]) +\(+[ ]*[-+]?(?:\.?\d|{_PI_NAME})")
# 'pi/2 + 1', '0 0 pi/2 - 0.1', '1 - pi/2': a spaced sign beside an expression may be arithmetic or two values
_SPACED_SIGN_BY_EXPRESSION = re.compile(
    rf"(?:{_PI_NAME}|[*/][ ]*[\d.]+)\)*[ \t]+[+-][ \t]+(?=[\d.(]|{_PI_NAME})"
    rf"|[\d.)][ \t]+[+-][ \t]+(?=\(*{_PI_NAME}|\(*[\d.]+[ ]*[*/])")


def _refuse_spaced_sign_by_expression(line: str, line_no: int) -> None:
    # inside '${...}' the spaces are the wrapper's arithmetic: blank it out first
    m = _SPACED_SIGN_BY_EXPRESSION.search(re.sub(r"\$\{[^{}\n]*\}", lambda w: " " * len(w.group()), line))
    if m:
        start, end = max(0, m.start() - 8), min(len(line), m.end() + 8)
        raise DecodeError(f"line {line_no}: '{_shorten(line[start:end].strip())}' has a + or - between spaces next to"
                          " an expression; Framewright will not guess whether it is arithmetic or two values: write"
                          " it without spaces ('pi/2-0.1') or paste the values")


def _join_detached_signs(line: str, notes: _Notes, line_no: int) -> str:
    """'- 0.5' or '- pi/2' after a separator is a sign with a stray space (common in PDFs); dropping it would flip
    a value. Before a bracket the sign may also be a bullet: refused rather than guessed."""
    before_bracket = _DETACHED_SIGN_BEFORE_BRACKET.search(line)
    if before_bracket:
        raise DecodeError(f"line {line_no}: '{_shorten(before_bracket.group().strip())}': a '{before_bracket.group(1)}'"
                          " stands apart before a bracket; Framewright will not guess whether it is the value's sign:"
                          " write it against the value or leave it out")

    def join(m: re.Match) -> str:
        notes.add(f"line {line_no}: a sign separated from its number by a space was read as its sign")
        return m.group(1)
    return _DETACHED_SIGN.sub(join, line)


def _has_digit(word: str) -> bool:
    return any(c.isdigit() for c in word)


def parse_numbers(text: str, max_numbers: int | None = None, first_line: int = 1) -> ParsedNumbers:
    """Find the numbers in pasted text.

    Accepts integers, decimals, scientific notation (6.123e-17, 6.1×10⁻¹⁷, Fortran 1D-3), a leading '+',
    the Unicode minus and an en dash as minus, non-breaking and thin spaces, any separators and brackets,
    degree marks (°, deg, d°m's") and 'rad'. Words, labels and lines with no numbers are set aside with a
    note. Raises DecodeError for text over 100 kB, for expressions (1/√2, pi/2) it will not guess at, and
    for more than `max_numbers` numbers when given (the decoder's early stop on a flood of numbers).
    `first_line` numbers the lines of a piece of a larger text as they are numbered in the whole.
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
    for line_no, raw_line in enumerate(clean.split("\n"), start=first_line):
        if not raw_line or raw_line.isspace():
            continue                    # a blank line holds nothing (and must stay cheap: 100 kB of them)
        line = raw_line
        if "<" in line or "[" in line:
            line = _C_DIMENSIONS.sub(" ", _TEMPLATE_ARGS.sub(" ", line))
        if "-" in line or "+" in line:
            _refuse_spaced_sign_by_expression(line, line_no)
            line = _join_detached_signs(line, notes, line_no)
        line = substitute(line, line_no, notes)         # pi/2, ${-M_PI/2}: evaluated, with a note
        expression = _EXPRESSION.search(line)
        if expression and _NUMBER.search(line):
            start = max(0, expression.start() - 6)
            raise DecodeError(f"line {line_no} holds an expression Framewright does not evaluate"
                              f" ('{_shorten(line[start:expression.end() + 6].strip())}'): it evaluates numbers, pi,"
                              " + - * / and parentheses only; paste decimal values")
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
            converted = None
            if unit is None:
                value, unit, converted, end = _other_unit(line, m, end, value, line_no, notes)
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
                label=label, row=row, converted_from=converted,
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
            strays.extend(literals_in_lists(rest, line_no))
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
                         bool(re.search(r"\d,\d", clean)), tuple(line_words), tuple(strays), _library_call(clean))


# SciPy's Rotation spells its conventions in its calls: from_euler('xyz', …) is extrinsic, 'XYZ' intrinsic,
# radians unless degrees=True; from_quat is scalar last unless scalar_first=True (SciPy documentation).
_LIBRARY_CALL = re.compile(r"(?:from|as)_(?P<kind>euler|quat|rotvec)[ ]*\([ ]*(?:['\"](?P<seq>[xyzXYZ]{3})['\"])?")


def _library_call(clean: str):
    m = _LIBRARY_CALL.search(clean)
    if m is None or (m.group("kind") == "euler" and not m.group("seq")):
        return None
    rest = clean[m.end():m.end() + 400]
    degrees = re.search(r"degrees[ ]*=[ ]*True", rest) is not None
    scalar_first = re.search(r"scalar_first[ ]*=[ ]*True", rest) is not None
    return m.group("kind"), m.group("seq") or "", degrees, scalar_first


def extract_numbers(text: str) -> list[float]:
    """Just the values, in reading order (for editors that take a row of numbers from a paste)."""
    return [float(v) for v in parse_numbers(text).values]
