"""Clean-up of pasted text: the characters it brings along, comments, its size."""

from __future__ import annotations

import re

from core.errors import DecodeError

MAX_INPUT_BYTES = 100_000


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


_COMMENT_START = re.compile(r"/\*|//|#|%")


def _check_size(text: str) -> None:
    if not isinstance(text, str):
        raise DecodeError(f"expected text to decode, got {type(text).__name__}")
    size = len(text.encode("utf-8", "surrogatepass"))
    if size > MAX_INPUT_BYTES:
        raise DecodeError(f"the text is {size} bytes long; Framewright decodes at most {MAX_INPUT_BYTES} bytes"
                          " (paste only the orientation)")


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


def _shorten(text: str, width: int = 40) -> str:
    return text if len(text) <= width else text[:width - 1] + "…"
