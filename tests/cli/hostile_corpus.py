"""A seeded corpus of hostile command lines for every verb: random bytes and Unicode, overlong lines,
extreme and non-finite numbers spliced into valid input, broken CSV and JSON, wrong options.

Each case is (argv, stdin bytes, files to write first). The corpus is generated, not hand-picked, so it
finds what nobody thought to type; the seed keeps a failure reproducible."""

from __future__ import annotations

import json
import random
from dataclasses import dataclass, field
from pathlib import Path

RESOURCES = Path(__file__).resolve().parents[2] / "resources"

EXTREME_NUMBERS = ["1e308", "-1e308", "1.797e308", "1e309", "1e999", "-1e-320", "5e-324", "1e154", "1e200",
                   "nan", "NaN", "-nan", "inf", "-inf", "Infinity", "0x1p3", "1_000", "１２", "٣", "1e-400",
                   "9" * 400, "0." + "0" * 5000 + "1", "-0", "+.5", ".", "-", "1e", "e5", "1.2.3", "١.٥"]
WORDS = ["abc", "NaN", "PI/2", "${-M_PI/2}", "M_PI", "pi", "sqrt(2)", "True", "None", "null", "°", "rad", "deg",
         "'", '"', "\\", "/*", "*/", "//", "#", "%", "[", "]", "{", "}", "(", ")", ",", ";", "|", "=", ":",
         "\x1b[2K", "\x1b]0;x\x07", "\u202e", "\u0000", "\r", "\t", "\ud800", "\U0001f600", "é", "Ж", "一"]
VALID_TEXTS = ["0 0 1 90", "yaw 30, pitch 20, roll 10", "0.7071 -0.7071 0; 0.7071 0.7071 0; 0 0 1",
               "q = [0.7071, 0, 0, 0.7071]", "[[1,0,0],[0,1,0],[0,0,1]]", "extrinsic XYZ: 10 20 30",
               "w=1 x=0 y=0 z=0", "rotvec: 0.1 0.2 0.3 rad", '{"quaternion_wxyz": [1, 0, 0, 0]}',
               "axis: 1 2 3, angle: 40"]
READING_OPTIONS = [[], ["--json"], ["--all"], ["--all", "--json"], ["--kind", "matrix"], ["--kind", "quaternion"],
                   ["--kind", "angles", "--sequence", "ZXZ"], ["--radians"], ["--scalar-last"], ["--transposed"],
                   ["--sequence", "QQQ"], ["--sequence", "X" * 5000], ["--kind"], ["--extrinsic", "--intrinsic"]]
TOLERANCES = ["0.5", "0", "180", "-1", "nan", "inf", "1e308", "-0", "abc", "", "1e-320", "5e-324", "0.5mrad"]


@dataclass
class Case:
    argv: list
    stdin: bytes = b""
    files: dict = field(default_factory=dict)     # name -> bytes, written into the case's folder
    json_out: bool = False

    def describe(self) -> str:
        return f"argv={self.argv!r} stdin={self.stdin[:80]!r} files={ {k: v[:80] for k, v in self.files.items()} }"


def _random_unicode(rng: random.Random, length: int) -> str:
    out = []
    for _ in range(length):
        pick = rng.random()
        if pick < 0.5:
            out.append(chr(rng.randrange(32, 127)))
        elif pick < 0.7:
            out.append(rng.choice(WORDS + EXTREME_NUMBERS))
        elif pick < 0.85:
            out.append(chr(rng.randrange(0x80, 0x3000)))
        else:
            out.append(chr(rng.choice([rng.randrange(0, 32), rng.randrange(0x2000, 0x2070),
                                       rng.randrange(0xd800, 0xe000), rng.randrange(0xfff0, 0x10000)])))
    return "".join(out)


def _as_bytes(text: str) -> bytes:
    return text.encode("utf-8", "surrogatepass")


def _spliced(rng: random.Random, text: str) -> str:
    """A valid snippet with tokens replaced, inserted or repeated."""
    tokens = text.split(" ")
    for _ in range(rng.randint(1, 3)):
        action, where = rng.random(), rng.randrange(len(tokens) + 1)
        if action < 0.4:
            tokens.insert(where, rng.choice(EXTREME_NUMBERS + WORDS))
        elif action < 0.7 and tokens:
            tokens[min(where, len(tokens) - 1)] = rng.choice(EXTREME_NUMBERS)
        else:
            tokens.insert(where, rng.choice(["1", ",", "[", "/*x", "a" * 50, "-"]) * rng.choice([10, 1000, 30000]))
    return " ".join(tokens)


def _hostile_text(rng: random.Random) -> str:
    kind = rng.random()
    if kind < 0.35:
        return _spliced(rng, rng.choice(VALID_TEXTS))
    if kind < 0.6:
        return _random_unicode(rng, rng.randint(0, 200))
    if kind < 0.75:
        unit = rng.choice(["1,", ",,", "[", "/*x", "a", "1 ", "-", "e", "((", "1e", "0.5 ", "°'\"", "x=", "\\\\"])
        return rng.choice(["", "q = ", "abc" * 1000]) + unit * rng.randint(10, 60_000)
    if kind < 0.9:
        return " ".join(rng.choice(EXTREME_NUMBERS) for _ in range(rng.choice([3, 4, 9, 12, 16])))
    return json.dumps({"quaternion_wxyz": [rng.choice([1, 0, 1e308, "x", None, [1]]) for _ in range(4)]})


def _decode_case(rng: random.Random) -> Case:
    options = rng.choice(READING_OPTIONS)
    text = _hostile_text(rng)
    if rng.random() < 0.4 or len(text) > 50_000:
        stdin = _as_bytes(text) if rng.random() < 0.8 else bytes(rng.randrange(256) for _ in range(rng.randint(1, 400)))
        return Case(["decode", "-", *options], stdin=stdin, json_out="--json" in options)
    return Case(["decode", text, *options], json_out="--json" in options)


def _compare_case(rng: random.Random) -> Case:
    nominal = rng.choice(VALID_TEXTS) if rng.random() < 0.5 else _hostile_text(rng)[:2000]
    measured = _hostile_text(rng)[:2000] if rng.random() < 0.7 else rng.choice(VALID_TEXTS)
    argv = ["compare", nominal, measured]
    if rng.random() < 0.8:
        argv.append("--tolerance=" + rng.choice(TOLERANCES))
    json_out = rng.random() < 0.4
    if json_out:
        argv.append("--json")
    return Case(argv, json_out=json_out)


def _csv_cells(rng: random.Random, good: list) -> list:
    cells = list(good)
    for _ in range(rng.randint(1, 3)):
        cells[rng.randrange(len(cells))] = rng.choice(EXTREME_NUMBERS + WORDS + ["", '"', '"a,b"', "x" * 140_000])
    return cells


def _line_ending(rng: random.Random) -> str:
    return rng.choice(["\n", "\r\n", "\r", "\n\n"])


def _fit_case(rng: random.Random) -> Case:
    lines = (RESOURCES / "demo_points.csv").read_text(encoding="utf-8").splitlines()
    header, rows = lines[0], lines[1:]
    kind = rng.random()
    if kind < 0.6:
        rows = [",".join(_csv_cells(rng, r.split(","))) if rng.random() < 0.4 else r for r in rows]
    elif kind < 0.75:
        header = rng.choice(["[" * 50_000, header + ",weight", "nominal_x" * 1000, "", header.replace(",", ";")])
    elif kind < 0.85:
        rows = rows[:rng.randint(0, 3)]
    else:
        rows = [",".join(rng.choice(["1.797e308", "-1.797e308", "1e-320", "0"]) for _ in range(7)) for _ in rows]
    text = _line_ending(rng).join([header, *rows])
    data = _as_bytes(text) if rng.random() < 0.9 else b"\xff\xfe" + bytes(rng.randrange(256) for _ in range(300))
    json_out = rng.random() < 0.4
    return Case(["fit", "{dir}/points.csv", *(["--json"] if json_out else [])], files={"points.csv": data},
                json_out=json_out)


def _batch_case(rng: random.Random) -> Case:
    lines = (RESOURCES / "demo_batch.csv").read_text(encoding="utf-8").splitlines()
    header, rows = lines[0], lines[1:]
    kind = rng.random()
    if kind < 0.6:
        rows = [",".join(_csv_cells(rng, r.split(","))) if rng.random() < 0.5 else r for r in rows]
    elif kind < 0.7:
        names = ['=HYPERLINK("x")', "@SUM(A1)", "\x1b[2K", "a" * 10_000, "+1", "-2"]
        rows = [rng.choice(names) + "," + ",".join(r.split(",")[1:]) for r in rows]
    elif kind < 0.8:
        header = rng.choice(["[" * 50_000, "name," + "nominal_qw[" * 500, "", "name,nominal_qw,measured_qw"])
    else:
        header = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_rv_x,measured_rv_y,measured_rv_z"
        rows = [f"m{i}," + ",".join(rng.choice(EXTREME_NUMBERS[:12] + ["0", "1"]) for _ in range(7)) for i in range(5)]
    text = _line_ending(rng).join([header, *rows])
    argv = ["batch", "{dir}/mounts.csv", "--tolerance", rng.choice(TOLERANCES)]
    if rng.random() < 0.3:
        argv += ["--out", rng.choice(["{dir}/result.csv", "{dir}/mounts.csv", "{dir}", "{dir}/missing/r.csv"])]
    return Case(argv, files={"mounts.csv": _as_bytes(text)})


def _mutated(rng: random.Random, value, depth=0):
    """A valid session value with one part of it swapped for something hostile."""
    if isinstance(value, dict) and value and rng.random() < 0.8:
        key = rng.choice(list(value))
        value = dict(value)
        value[key] = _mutated(rng, value[key], depth + 1)
        return value
    if isinstance(value, list) and value and rng.random() < 0.8:
        value = list(value)
        i = rng.randrange(len(value))
        value[i] = _mutated(rng, value[i], depth + 1)
        return value
    return rng.choice([None, True, 0, -1, 1e308, 10 ** 400, "x", "\ud800", "\x1b[2K", [], {}, [[[[]]]],
                       "9" * 5000, [1, 2], {"a": 1}, float("nan"), "a" * 100_000])


def _open_case(rng: random.Random) -> Case:
    session = json.loads((RESOURCES / "demo.fwsession.json").read_text(encoding="utf-8"))
    kind = rng.random()
    if kind < 0.7:
        text = json.dumps(_mutated(rng, session), ensure_ascii=rng.random() < 0.5)
        data = text.encode("utf-8", "surrogatepass")
    elif kind < 0.8:
        data = ("[" * 100_000 + "]" * 100_000).encode()
    elif kind < 0.9:
        data = b'{"format": "framewright-session", "version": ' + b"9" * 5000 + b"}"
    else:
        data = bytes(rng.randrange(256) for _ in range(rng.randint(0, 2000)))
    return Case(["open", "{dir}/s.fwsession.json"], files={"s.fwsession.json": data})


def _usage_case(rng: random.Random) -> Case:
    return Case(rng.choice([["frob"], ["decode", "--kind", "banana", "1 2 3"], ["compare", "1 2 3"],
                            ["batch"], ["fit"], ["open"], ["decode", "--tolerance", "1"], ["--json"],
                            ["compare", "-", "-"], ["batch", "{dir}/none.csv", "--tolerance", "1"],
                            ["fit", "{dir}"], ["decode", "\udcff\udcfe"], ["decode", "-" * 3]]))


MAKERS = {"decode": (_decode_case, 900), "compare": (_compare_case, 300), "fit": (_fit_case, 300),
          "batch": (_batch_case, 300), "open": (_open_case, 200), "usage": (_usage_case, 100)}


def corpus(seed: int = 20261201) -> list[Case]:
    rng = random.Random(seed)
    return [make(rng) for name, (make, count) in MAKERS.items() for _ in range(count)]
