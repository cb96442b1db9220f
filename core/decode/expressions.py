"""A small, safe arithmetic: the expressions description files and launch arguments write for angles.

`evaluate(text)` knows numbers, pi (`pi`, `PI`, `M_PI`, `π`), unary minus and plus, `+ - * /`,
parentheses, and the `${…}` wrapper of description files. It is a hand-written parser (never `eval`):
anything else (a name, a call, `**`, an attribute) is refused by name. `substitute(line, …)` replaces the
expressions inside a line of pasted text by their values, so that `rpy="0 0 ${-M_PI/2}"` reads as three
numbers, and says so in a note.
"""

from __future__ import annotations

import math
import re

from core.decode.characters import _shorten
from core.errors import DecodeError

_MAX_LENGTH = 200          # an expression for one angle is short; longer text is not one
_MAX_DEPTH = 32            # parentheses and signs nested deeper than this are not an angle someone wrote
_PI_NAMES = ("M_PI", "PI", "Pi", "pi", "π")
_TOKENS = re.compile(r"""\s*(?:
    (?P<number>(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)
  | (?P<power>\*\*)
  | (?P<op>[-+*/()])
  | (?P<name>[A-Za-z_π][\w]*)
  | (?P<other>\S))""", re.VERBOSE)


def evaluate(text: str) -> float:
    """The value of `text` (see the module's docstring); DecodeError naming what is outside the subset."""
    if not isinstance(text, str):
        raise DecodeError(f"expected an expression as text, got {type(text).__name__}")
    body = text.strip()
    if body.startswith("${"):
        if not body.endswith("}"):
            raise DecodeError(f"'{_shorten(body)}': the '${{' has no closing '}}'")
        body = body[2:-1].strip()
    if len(body) > _MAX_LENGTH:
        raise DecodeError(f"an expression of {len(body)} characters is too long to be an angle (at most {_MAX_LENGTH})")
    if not body:
        raise DecodeError("an empty expression has no value")
    return _Parser(_tokens(body), text).value()


def _tokens(body: str) -> list[tuple[str, str]]:
    out = []
    pos = 0
    while pos < len(body):
        m = _TOKENS.match(body, pos)
        if m is None:               # only trailing spaces are left
            break
        pos = m.end()
        kind = m.lastgroup
        token = m.group(kind)
        if kind == "power":
            raise DecodeError(f"'{_shorten(body)}': '**' (a power) is not evaluated; Framewright evaluates numbers,"
                              " pi, + - * / and parentheses only")
        if kind == "name":
            if token in _PI_NAMES:
                out.append(("number", repr(math.pi)))
                continue
            following = body[pos:].lstrip()
            what = "a function" if following.startswith("(") else "an attribute" if following.startswith(".") \
                else "a name"
            where = "" if token == body.strip() else f" in '{_shorten(body)}'"
            raise DecodeError(f"'{_shorten(token, 24)}'{where} is {what} Framewright does not evaluate; only numbers,"
                              " pi, + - * / and parentheses are")
        if kind == "other":
            raise DecodeError(f"'{token}' in '{_shorten(body)}' is not part of the arithmetic Framewright"
                              " evaluates (numbers, pi, + - * / and parentheses)")
        out.append((kind, token))
    return out


class _Parser:
    """expression := term (('+'|'-') term)*;  term := factor (('*'|'/') factor)*;
    factor := ('+'|'-') factor | number | '(' expression ')'. Depth is bounded before any recursion."""

    def __init__(self, tokens: list, text: str):
        self.tokens, self.text, self.pos, self.depth = tokens, text, 0, 0

    def value(self) -> float:
        result = self._expression()
        if self.pos != len(self.tokens):
            token = self.tokens[self.pos][1]
            raise DecodeError(f"'{_shorten(self.text)}': unexpected '{token}'"
                              + (" (a ')' without its '(')" if token == ")" else ""))
        if not math.isfinite(result):
            raise DecodeError(f"'{_shorten(self.text)}' has no finite value")
        return result

    def _peek(self) -> str | None:
        return self.tokens[self.pos][1] if self.pos < len(self.tokens) else None

    def _expression(self) -> float:
        result = self._term()
        while self._peek() in ("+", "-"):
            op = self.tokens[self.pos][1]
            self.pos += 1
            right = self._term()
            result = result + right if op == "+" else result - right
        return result

    def _term(self) -> float:
        result = self._factor()
        while self._peek() in ("*", "/"):
            op = self.tokens[self.pos][1]
            self.pos += 1
            right = self._factor()
            if op == "/" and right == 0:
                raise DecodeError(f"'{_shorten(self.text)}' divides by zero")
            result = result * right if op == "*" else result / right
        return result

    def _factor(self) -> float:
        self.depth += 1
        if self.depth > _MAX_DEPTH:
            raise DecodeError(f"'{_shorten(self.text)}' nests more than {_MAX_DEPTH} deep; write the value instead")
        try:
            token = self._peek()
            if token is None:
                raise DecodeError(f"'{_shorten(self.text)}' ends where a number is expected")
            kind = self.tokens[self.pos][0]
            self.pos += 1
            if token in ("+", "-"):
                inner = self._factor()
                return -inner if token == "-" else inner
            if kind == "number":
                return float(token)
            if token == "(":
                if self._peek() == ")":
                    raise DecodeError(f"'{_shorten(self.text)}' has empty parentheses")
                inner = self._expression()
                if self._peek() != ")":
                    raise DecodeError(f"'{_shorten(self.text)}': a '(' has no closing ')'")
                self.pos += 1
                return inner
            raise DecodeError(f"'{_shorten(self.text)}': '{token}' where a number is expected")
        finally:
            self.depth -= 1


# ---- expressions inside a line of pasted text --------------------------------------------------------
_SUBSTITUTION = re.compile(r"\$\{([^{}\n]{0,%d})\}" % _MAX_LENGTH)
_PI_WORD = re.compile(r"(?<![A-Za-z0-9_.])(?:M_PI|PI|Pi|pi)(?![A-Za-z0-9_])")
# A run of arithmetic without spaces, except around * and /: '-pi/2', '3*pi / 4', '(M_PI/2)'. Character
# classes that exclude each other keep the scan linear.
_ATOM = r"[-+(]{0,8}(?:\d|\.\d|π)[\dπ.eE()+\-]*"
_RUN = re.compile(rf"(?<![\w.]){_ATOM}(?:(?:\*\*|[ ]*[*/][ ]*){_ATOM})*")
# Functions people write around angles; named in the refusal rather than read around
_CALL = re.compile(r"(?<![\w.])(?:sqrt|sin|cos|tan|asin|acos|atan2?|radians|degrees|deg2rad|rad2deg|exp|log|pow|abs)"
                   r"[ ]*\(", re.IGNORECASE)


def substitute(line: str, line_no: int, notes) -> str:
    """`line` with each expression replaced by its value; a note per expression (notes.add)."""
    if "${" in line:
        def one(m: re.Match) -> str:
            value = _evaluated(m.group(1), line_no, m.group())
            notes.add(f"line {line_no}: evaluated '{_shorten(m.group())}' as {value:.12g}")
            return f" {value!r} "
        line = _SUBSTITUTION.sub(one, line)
    if not any(c in line for c in "*/πPpI"):
        return line
    call = _CALL.search(line)
    if call:
        raise DecodeError(f"line {line_no}: '{call.group().rstrip(' (')}' is a function; Framewright evaluates"
                          " only numbers, pi, + - * / and parentheses (an expression): paste the value")
    # Each spelling of pi becomes one 'π' so the scan sees one character; `shift` maps back.
    masked_parts, shifts, pos = [], [], 0
    for m in _PI_WORD.finditer(line):
        masked_parts += [line[pos:m.start()], "π"]
        shifts.append((sum(len(p) for p in masked_parts), len(m.group()) - 1))
        pos = m.end()
    masked = "".join(masked_parts) + line[pos:]

    def original(a: int, b: int) -> str:
        def at(i):
            return i + sum(extra for end, extra in shifts if end <= i)
        return line[at(a):at(b)]

    out, pos = [], 0
    for m in _RUN.finditer(masked):
        run = _balanced(m.group())
        if not run or not any(c in run for c in "π*/"):
            continue
        start = m.start() + m.group().find(run)
        written = original(start, start + len(run))
        if "π" not in run and run.count("/") > 1:
            raise DecodeError(f"line {line_no}: '{_shorten(written)}' holds two slashes (a date or a list?);"
                              " Framewright will not read it as a division: write the values apart")
        value = _evaluated(run, line_no, written)
        notes.add(f"line {line_no}: evaluated '{_shorten(written)}' as {value:.12g}")
        out += [original(pos, start), f" {value!r} "]
        pos = start + len(run)
    if not out:
        return line
    out.append(original(pos, len(masked)))
    return "".join(out)


def _evaluated(expression: str, line_no: int, written: str | None = None) -> float:
    try:
        return evaluate(expression if written is None else written)
    except DecodeError as error:
        raise DecodeError(f"line {line_no}: {error}") from None


def _balanced(run: str) -> str:
    """'(pi/2' from '(pi/2, 0)' and 'pi/2' from '[0, pi/2)': drop brackets that open or close outside."""
    run = run.rstrip("+-")
    while run.count("(") > run.count(")") and run.startswith("("):
        run = run[1:]
    while run.count(")") > run.count("(") and run.endswith(")"):
        run = run[:-1]
    return run
