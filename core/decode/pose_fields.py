"""Keyed values in a text: YAML and INI-like `key: value` lines (nested by indentation, inline `{…}`,
lists over several lines, `- […]` rows), JSON objects, XML attributes and `--flag value` pairs. The pose
readers find translations and rotations among these by their keys."""

from __future__ import annotations

import json
import re
from dataclasses import dataclass

from core.decode.characters import _normalise_characters, _strip_comments
from core.decode.poses import values_in
from core.errors import DecodeError

_MAX_FIELDS = 2000
_KEY_LINE = re.compile(r"""^(?P<indent>[ ]*)(?P<dash>-[ ]+)?["']?(?P<key>[A-Za-z_][\w.\-/]{0,120}"""
                       r"""(?:[ ][A-Za-z_][\w]{0,20}){0,3}(?:[ ]?[(\[][^()\[\]\n]{0,30}[)\]])?)["']?"""
                       r"""[ ]*(?::(?!:)|=(?!=))[ ]*(?P<rest>.*)$""")
_HAS_DIGIT = re.compile(r"\d")
_ALIAS = re.compile(r"[&*][A-Za-z_][\w\-]*(?:\s|$)")
ORPHAN = "\x00orphan"      # the key of a field that stands for a line of numbers under no key
_INLINE_PAIR = re.compile(r"""["']?(?P<key>[A-Za-z_][\w.\-]{0,40})["']?[ ]*:[ ]*(?P<value>[^,{}]*)""")
_ATTRIBUTE = re.compile(r"""(?P<key>[A-Za-z_][\w.\-:]{0,40})[ ]*=[ ]*(?:"(?P<value>[^"<>\n]{0,400})"|'(?P<value2>[^'<>\n]{0,400})')""")
_TAG = re.compile(r"<(?P<tag>[A-Za-z_][\w.\-:]{0,40})(?P<body>[^<>]{0,2000})>")
_FLAG = re.compile(r"(?<!\S)--(?P<key>[A-Za-z][\w\-]{0,40})(?:[ ]+|=)(?P<value>[^\s-][^\s]*|-[\d.][^\s]*)")


@dataclass(frozen=True)
class Field:
    """One key with its value text, where it is and the keys it sits under (lower case)."""
    key: str
    value: str
    line: int
    path: tuple[str, ...] = ()
    shape: tuple[int, int] | None = None     # rows and columns when the text writes them beside the data

    @property
    def name(self) -> str:
        return self.key.lower()


def yaml_like_fields(text: str) -> list[Field]:
    """`key: value` lines. A key with nothing after it opens a group for the lines indented below it, or
    takes the lines of numbers that follow it (`R =` above a printed array); `- ` starts a list item."""
    clean, _ = _strip_comments(_normalise_characters(text))
    lines = clean.split("\n")
    fields: list[Field] = []
    stack: list[tuple[float, str]] = []        # (indent, key) of the open groups; items are '#0', '#1', …
    items: dict[tuple, int] = {}
    orphans: list[tuple[int, str]] = []        # lines with numbers that belong to no key
    i = 0
    while i < len(lines) and len(fields) < _MAX_FIELDS:
        raw = lines[i].replace("\t", "    ")
        i += 1
        m = _KEY_LINE.match(raw)
        if m is None:
            if _HAS_DIGIT.search(raw):
                orphans.append((i, raw.strip()))
            continue
        indent, key, rest = len(m.group("indent")), m.group("key").strip(), m.group("rest").strip()
        if _ALIAS.match(rest):      # 'b: *x' repeats what '&x' marked: following it is YAML's job, not ours
            raise DecodeError(f"line {i}: '{rest[:24]}' is a YAML alias (or anchor); Framewright does not follow"
                              " them: paste the values where they are used")
        if m.group("dash"):                  # '- key: v' starts a list item one level in
            while stack and stack[-1][0] > indent:
                stack.pop()
            parent = tuple(k for _, k in stack)
            items[parent] = items.get(parent, -1) + 1
            stack.append((indent + 0.5, f"#{items[parent]}"))
            indent += len(m.group("dash"))
        while stack and stack[-1][0] >= indent:
            stack.pop()
        path = tuple(k for _, k in stack)
        start = i
        if rest.startswith("!!"):            # a YAML tag such as !!opencv-matrix: the group follows
            rest = ""
        if not rest:
            rows, j = _rows_below(lines, i)
            if rows:                         # '- [a, b, c, d]' rows or printed lines of numbers under the key
                fields.append(Field(key, " ; ".join(rows), start, path))
                i = j
                continue
            stack.append((indent, key))
            continue
        if rest.startswith("{") and "}" in rest:
            for pair in _INLINE_PAIR.finditer(rest[1:rest.rfind("}")]):
                fields.append(Field(pair.group("key"), pair.group("value").strip(), start, path + (key,)))
            continue
        while rest.count("[") > rest.count("]") and i < len(lines) and i - start < 200:
            rest += " ; " + lines[i].strip()  # a list over several lines; rows keep their breaks
            i += 1
        fields.append(Field(key, rest, start, path))
    if orphans and fields:
        fields.append(Field(ORPHAN, orphans[0][1], orphans[0][0]))
    return fields


_NUMBER_LINE = re.compile(r"^[ \t]*(?:-[ ]*)?[\[(]*[ ]*[-+]?(?:\d|\.\d)[-+\d.eE \t,;\[\]()]*$")


def _rows_below(lines: list[str], i: int) -> tuple[list[str], int]:
    """The lines of numbers right below a key ('- [a, b]' rows, '[[ 0. -1.  0.]' printouts)."""
    rows = []
    while i < len(lines) and len(rows) < 400:     # a covariance is 36 '- 0.0' items
        stripped = lines[i].strip()
        if not stripped or not _NUMBER_LINE.match(stripped) or _KEY_LINE.match(lines[i]):
            break
        rows.append(stripped[1:].strip() if stripped.startswith(("- ", "-[")) else stripped)
        i += 1
    return rows, i


def json_fields(text: str) -> list[Field] | None:
    """A JSON object (or a list of them) flattened to fields; None when the text is no JSON."""
    stripped = text.strip()
    if not stripped.startswith(("{", "[")):
        return None
    try:
        data = json.loads(_normalise_characters(stripped))
    except (ValueError, RecursionError):
        return None
    fields: list[Field] = []

    def walk(value, path, key):
        if len(fields) >= _MAX_FIELDS or len(path) > 12:
            return
        if isinstance(value, dict):
            for k, v in value.items():
                walk(v, path + ((key,) if key else ()), str(k))
        elif isinstance(value, list) and value and all(isinstance(v, list) for v in value):
            fields.append(Field(key or "value", " ; ".join(_json_list(v) for v in value), 1, path))
        elif isinstance(value, list) and value and any(isinstance(v, dict) for v in value):
            for n, v in enumerate(value):
                walk(v, path + ((key,) if key else ()), f"#{n}")
        elif isinstance(value, (list, int, float, str)) and not isinstance(value, bool):
            shown = _json_list(value) if isinstance(value, list) else str(value)
            fields.append(Field(key or "value", shown, 1, path))
    walk(data, (), "")
    return fields


def _json_list(values) -> str:
    return "[" + ", ".join(json.dumps(v) if not isinstance(v, str) else v for v in values) + "]"


def xml_fields(text: str) -> list[Field]:
    """XML attributes, each under (its tag, the tag's place in the text), in the order written."""
    fields: list[Field] = []
    clean = _normalise_characters(text)
    for index, tag in enumerate(_TAG.finditer(clean)):
        line = clean.count("\n", 0, tag.start()) + 1
        for a in _ATTRIBUTE.finditer(tag.group("body")):
            value = a.group("value") if a.group("value") is not None else a.group("value2")
            fields.append(Field(a.group("key"), value, line, (tag.group("tag").lower(), str(index))))
            if len(fields) >= _MAX_FIELDS:
                return fields
    return fields


def flag_fields(text: str) -> list[Field]:
    """`--x 1 --yaw 0.5 --frame-id base`: one field per flag."""
    clean = _normalise_characters(text)
    out = []
    for m in _FLAG.finditer(clean):
        out.append(Field(m.group("key").replace("-", "_"), m.group("value"), clean.count("\n", 0, m.start()) + 1))
        if len(out) >= _MAX_FIELDS:
            break
    return out


def with_shaped_matrices(fields: list[Field]) -> list[Field]:
    """A group holding rows, cols and data becomes one field under its own name, with its shape."""
    by_path: dict[tuple, dict[str, Field]] = {}
    for f in fields:
        by_path.setdefault(f.path, {})[f.name] = f
    out, done = [], set()
    for f in fields:
        group = by_path[f.path]
        if f.path and all(k in group for k in ("rows", "cols", "data")):
            if f.path in done:
                continue
            done.add(f.path)
            shape = [values_in(group[k].value, group[k].line) for k in ("rows", "cols")]
            if any(len(v) != 1 or v[0] != int(v[0]) or not 1 <= v[0] <= 16 for v in shape):
                raise DecodeError(f"line {group['rows'].line}: rows and cols must be whole numbers from 1 to 16")
            rows, cols = (int(v[0]) for v in shape)
            data = group["data"]
            count = len(values_in(data.value, data.line))
            if rows * cols != count:
                raise DecodeError(f"line {data.line}: rows {rows} x cols {cols} is {rows * cols} numbers; 'data'"
                                  f" holds {count}")
            out.append(Field(f.path[-1], data.value, data.line, f.path[:-1], (rows, cols)))
            continue
        out.append(f)
    return out
