"""Values on a line that decode refuses rather than misreads: empty cells, non-finite values,
named constants, words between numbers."""

from __future__ import annotations

import re

from core.errors import DecodeError
from core.decode.characters import _shorten

_TOKEN = re.compile(r"[^\s,;|\[\](){}&<>=:\"]+")   # a run between separators; filtered, never backtracked


# Words that stand for a value we will not guess at: non-finite values, named constants, substitutions
_NON_FINITE = re.compile(r"(?<![\w.])[+-]?\.?(?:nan|inf(?:inity)?)(?!\w)", re.IGNORECASE)   # YAML .nan, -.inf too
_CONSTANT = re.compile(r"(?<![A-Za-z0-9])(?:M_)?PI(?![A-Za-z0-9_])|π|\$\{|\$\(", re.IGNORECASE)
# Words allowed between two numbers on a line (besides keys): units, component and angle names, 'and'
_BETWEEN_WORDS = frozenset("""deg degs degree degrees rad rads radian radians and w x y z i j k qw qx qy qz
    yaw pitch roll heading bank elevation axis angle theta phi psi about n eigen""".split())
_NUMBER_TYPE = re.compile(r"(?:np\.|numpy\.)?(?:float|int|uint|double)\d*|vector3[dfi]?|vec3[df]?|angleaxis[df]?",
                          re.IGNORECASE)  # np.float64(0.5)


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


# A flag written as 0 or 1 ('"degrees": 1', 'intrinsic=0'), a lone digit followed by the next key or the end:
# the digit would be read as one of the orientation's numbers, and three angles with it become an axis and an
# angle. With '=' it is an assignment whatever follows ('intrinsic=1 10 20 30'); with ':' it may be a caption
# ('in degrees: 1, 2, 3'), so only a digit the next key or the end follows is a flag.
_NUMBER_FLAG = re.compile(r"(?<![a-z_])(?:use_|in_)?(degrees|radians|intrinsic|extrinsic|scalar_first|scalar_last|"
                          r"transposed)(?:[\"']?\s*:\s*[01](?=\s*(?:$|[})\]]|[,;]\s*[\"'A-Za-z_]|\s+[\"'A-Za-z_]))"
                          r"|\s*=\s*[01](?![\w.]))", re.IGNORECASE)


def _refuse_values_we_will_not_guess(line: str, line_no: int) -> None:
    """NaN, inf, PI, M_PI, π, ${…}: dropping them would shift the other numbers into another reading, and
    reading 'PI/2' as 2 loses the sign and π; a flag written as 0 or 1 would be read as a number. Refused by
    name, with the line."""
    m = _NUMBER_FLAG.search(line)
    if m:
        raise DecodeError(f"line {line_no}: '{_shorten(m.group(), 24)}' is a flag written as a number, which "
                          f"would be read as part of the orientation; write {m.group(1)} as true or false, or "
                          "give it as an option")
    m = _NON_FINITE.search(line)
    if m:
        raise DecodeError(f"line {line_no}: '{m.group()}' is not a finite number; every number must be a"
                          " finite decimal value")
    m = _CONSTANT.search(line)
    if m:
        token = _shorten(line[m.start():].split()[0], 24)
        raise DecodeError(f"line {line_no}: '{token}' is a name or substitution Framewright cannot evaluate (an"
                          " expression may hold numbers, pi, + - * / and parentheses): paste its value")


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


# A JSON or Python literal as an element of a list on a line of numbers: '[true, 0.5, 0.5, 0.5]' or
# '(0.5, 0.5, 0.5, None)' is a list with a gap where a number should be, and reading the three numbers left
# would take a quaternion for angles. Only list elements count ('"intrinsic": true' is a key's value).
_LITERALS = frozenset({"true", "false", "null", "none", "undefined"})
_LIST_LITERAL = re.compile(rf"[\[(,]\s*({'|'.join(sorted(_LITERALS))})\s*(?=[,\])])", re.IGNORECASE)
# A square-bracketed list on a line of numbers, as the line reads with its numbers blanked out: an element
# that is a bare word ('[abc, 0.5, 0.5, 0.5]', '[0.5, 0.5, 0.5, q3]') is a gap where a number should be.
_BRACKETED = re.compile(r"\[([^\[\]]*)\]")
_WORD_ELEMENT = re.compile(r"[A-Za-z_][\w.]*")


class ListGap(str):
    """A word found standing in a list of numbers: refused in its own words (not 'between numbers')."""


def literals_in_lists(rest: str, line_no: int) -> list:
    """(line, word) for each literal standing as an element of a list on this line (see _LIST_LITERAL), and
    each bare word standing as an element of a square-bracketed list that holds numbers (see _BRACKETED)."""
    found = [(line_no, ListGap(m.group(1))) for m in _LIST_LITERAL.finditer(rest)]
    for group in _BRACKETED.finditer(rest):
        elements = group.group(1).split(",")
        if len(elements) < 2 or not any(e and not e.strip() for e in elements):   # no blanked-out number
            continue
        for element in elements:
            word = element.strip()
            if (_WORD_ELEMENT.fullmatch(word) and word.lower() not in _BETWEEN_WORDS
                    and not _NUMBER_TYPE.fullmatch(word) and word.lower() not in _LITERALS):
                found.append((line_no, ListGap(word)))
    return found


def refuse_strays(parsed, lines: set) -> None:
    """A word between numbers on a line that is read (see _words_between_numbers), or a literal in a list
    of numbers (see literals_in_lists), is refused."""
    read = [(line, word) for line, word in parsed.strays if line in lines]
    gap = next(((line, word) for line, word in read if isinstance(word, ListGap)), None)   # named as a gap first
    if gap:
        raise DecodeError(f"line {gap[0]}: '{_shorten(gap[1], 24)}' stands in a list of numbers where a number "
                          "should be; Framewright will not read the list with a gap (write the number)")
    if read:
        line, word = read[0]
        raise DecodeError(f"line {line}: '{_shorten(word, 24)}' between numbers is not a number, key, unit or"
                          " component name; Framewright will not guess what it stands for (remove it)")
