"""Adversarial inputs of about 100 kB for the decoder: each aims at a scanning pattern that could take
time growing with the square of the input (a run that a pattern restarts on at every position).
Shared by the hang-guard test and `make bench`."""

import random

SIZE = 99_000


def _fill(piece: str, prefix: str = "", suffix: str = "") -> str:
    """`piece` repeated to SIZE bytes of UTF-8 (just under the decoder's 100 kB limit)."""
    room = SIZE - len(prefix.encode()) - len(suffix.encode())
    return prefix + piece * (room // len(piece.encode())) + suffix


def hostile_inputs(seed: int = 7) -> dict[str, str]:
    """name -> text. Fixed patterns plus a seeded mix of the same fragments."""
    cases = {
        "one then empty cells": "1" + ",," * 49_999,
        "empty cells between numbers": _fill(", ", "1", "2"),
        "semicolon cells": _fill(";", "1"),
        "bar cells": _fill("| ", "1"),
        "long word before numbers": _fill("a", "", " 1 2 3"),
        "long word with a digit": _fill("a1"),
        "long key": _fill("a", "", ": 1"),
        "long key dots": _fill("a.", "", "= 1"),
        "repeated comment openers": _fill("/*x"),
        "repeated hashes": _fill("#x"),
        "repeated line comments": _fill("//x"),
        "digits glued to letters": _fill("1a"),
        "digit dot runs": _fill("1."),
        "long number": _fill("1"),
        "long decimals": _fill("1", "0."),
        "signs and spaces": _fill("- "),
        "spaces": _fill(" "),               # one line of blanks: two blank runs side by side split it n² ways
        "tabs after a hash": _fill("\t", "#"),
        "separated signs": _fill(", - ", "", "1"),
        "signs": _fill("+-"),
        "many lines": _fill("1\n"),
        "many blank lines": _fill("\n", "1"),
        "many word lines": _fill("a\n"),
        "times ten": _fill("1 x 10 "),
        "exponent starts": _fill("1e"),
        "degree marks": _fill("1° "),
        "minutes": _fill("1°1'"),
        "brackets": _fill("["),
        "angle brackets": _fill("a<"),
        "c dimensions": _fill("a[1]"),
        "slashes": _fill("1/"),
        "units": _fill("1 rad"),
        "keys": _fill("x=1 "),
        "colons": _fill("a:"),
        "quotes": _fill("'a"),
        "percent": _fill("%1\n"),
        "en dashes": _fill("\u2013"),
        "superscripts": _fill("1\u207b"),
        "arrows": _fill("body to "),
        "sequence words": _fill("x-y-"),
        "quaternion captions": _fill("qw, "),
        "nan words": _fill("nan "),
    }
    rng = random.Random(seed)
    fragments = ["1", "0.5", ",", ",,", " ", "a", "x", "/*", "*/", "#", "//", "-", "e", ".", ":", "=", ";",
                 "|", "[", "]", "(", ")", "<", ">", "°", "'", '"', "\n", "deg", "rad", "nan", "pi", "/", "_"]
    for i in range(12):
        pieces = [rng.choice(fragments) for _ in range(rng.randint(2, 6))]
        cases[f"seeded mix {i}"] = _fill("".join(pieces))
    return cases
