"""Damaged session files made from valid ones, for the loader's hostile-input tests: one mutation at a
random place of the parsed document (a value of another type, a deleted key or entry, a huge, tiny or
non-finite number, deep nesting, a long digit string, a lone surrogate or a control character), or at the
byte level (random bytes written over, a cut, a byte-order mark). Used by a Hypothesis strategy (which
shrinks a failure to its smallest form) and by a seeded corpus (a fixed count, reproducible)."""

import json
import random
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
DEMO = ROOT / "resources" / "demo.fwsession.json"


def _rich_session() -> dict:
    """The invented demo session with a chain, a check and a key a newer revision might add."""
    data = json.loads(DEMO.read_text(encoding="utf-8"))
    data["chains"] = [{"name": "mast", "steps": [
        {"name": "bracket", "orientation": {"quaternion_wxyz": [0.5, 0.5, 0.5, 0.5]}, "inverted": False,
         "enabled": True},
        {"name": "plate", "orientation": {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]}, "inverted": True,
         "enabled": False}]}]
    first, second = data["mounts"][0]["name"], data["mounts"][1]["name"]
    data["checks"] = [{"name": "check", "nominal": first, "measured": second,
                       "settings": {"mode": "pointing_and_roll", "total_tolerance_deg": 0.5,
                                    "pointing_tolerance_deg": 0.25, "roll_tolerance_deg": 1.0,
                                    "body_axis": "+Z"}}]
    data["mounts"][1]["measurements"] = [
        {"orientation": {"quaternion_wxyz": [0.5, 0.5, 0.5, 0.5]}, "weight": 1.0, "source": "typed"},
        {"orientation": {"quaternion_wxyz": [1.0, 0.0, 0.0, 0.0]}, "weight": 2.5, "source": "fit"}]
    data["added_by_a_newer_minor_revision"] = {"kept": [1, 2.5, "three", None, True]}
    return data


VALID_DOCUMENTS = [json.loads(DEMO.read_text(encoding="utf-8")), _rich_session()]

# Values that break a field of one kind or another; the hostile numbers come from the ranges a double
# has (common practice: 5e-324 is the smallest subnormal, 1.7976931348623157e308 the largest finite).
HOSTILE_VALUES = [None, True, False, 0, -1, 1, 2 ** 63, 10 ** 400, -(10 ** 400), 5e-324, -5e-324,
                  1.7976931348623157e308, 1e-300, float("nan"), float("inf"), float("-inf"), -0.0, "",
                  " ", "x", "+Z", "ZYX", "deg", "\ud800", "a\udfffb", "\x00", "\x1b[2J", "\u2028", "\x85",
                  "\u202e", "é" * 600, [], [1], [1, 0, 0, 0], [0, 0, 0, 0], [5, 0, 0, 0], {}, {"a": 1},
                  [[[[[]]]]], {"quaternion_wxyz": [1, 0, 0, 0]}]


def _places(value, path=()):
    """Every place in the document: (path, value)."""
    yield path, value
    if isinstance(value, dict):
        for key, item in value.items():
            yield from _places(item, path + (key,))
    elif isinstance(value, list):
        for index, item in enumerate(value):
            yield from _places(item, path + (index,))


def _parent(document, path):
    node = document
    for key in path[:-1]:
        node = node[key]
    return node


def mutate(document: dict, rng: random.Random) -> bytes:
    """One damaged file's bytes, made from `document` (which is not changed) with choices from `rng`."""
    doc = json.loads(json.dumps(document))
    places = [p for p, _ in _places(doc) if p]
    path = rng.choice(places)
    parent, key = _parent(doc, path), path[-1]
    kind = rng.choice(["replace", "replace", "replace", "delete", "nest", "digits", "wrap", "add_key",
                       "bytes", "cut", "bom"])
    if kind == "replace":
        parent[key] = rng.choice(HOSTILE_VALUES)
    elif kind == "delete":
        del parent[key]
    elif kind == "nest":
        depth = rng.choice([10, 63, 64, 65, 500, 5000, 100_000])
        value = 0
        for _ in range(min(depth, 70)):
            value = [value]
        parent[key] = value if depth <= 70 else "@DEEP@"
    elif kind == "digits":
        parent[key] = "@DIGITS@"
    elif kind == "wrap":
        parent[key] = rng.choice([[parent[key]], {"value": parent[key]}, [parent[key], parent[key]]])
    elif kind == "add_key" and isinstance(parent, dict):
        parent[rng.choice(["extra", "\ud800", "matrix", "name", "", "format"])] = rng.choice(HOSTILE_VALUES)
    text = json.dumps(doc, ensure_ascii=rng.random() < 0.5, allow_nan=True)
    text = text.replace('"@DEEP@"', "[" * depth + "]" * depth) if kind == "nest" and depth > 70 else text
    if kind == "digits":
        digits = rng.choice(["9" * 309, "1" * 400, "1" * 401, "7" * 4301, "3" * 5000, "0." + "1" * 5000,
                             "1" + "0" * 400 + ".5", "1e400", "-1e-400"])
        text = text.replace('"@DIGITS@"', digits)
    raw = text.encode("utf-8", errors="surrogatepass")   # unescaped surrogates: bytes no UTF-8 reader takes
    if kind == "bytes":
        at = rng.randrange(len(raw))
        raw = raw[:at] + bytes(rng.randrange(256) for _ in range(rng.randint(1, 8))) + raw[at + 8:]
    elif kind == "cut":
        raw = raw[: rng.randrange(len(raw))]
    elif kind == "bom":
        raw = b"\xef\xbb\xbf" + raw
    return raw
