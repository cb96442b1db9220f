"""Poses and transforms that must be refused, with a message that names what is wrong (issue 11 item 5:
every character is understood or the input is refused, naming it; a wrong answer with exit 0 is the worst
defect). Layouts as in tests/core/pose_corpus.py; all values invented.
"""

import pytest

from core.decode import decode
from core.errors import DecodeError

# (id, text, words the message must contain (case-insensitive; a tuple: any one of them), why)
REFUSALS = [
    # --- a 4x4 whose last row is not 0 0 0 1 (homogeneous matrix definition, CONVENTIONS.md) ----------
    ("last-row-scaled-z", "1 0 0 0.1\n0 1 0 0.2\n0 0 1 0.3\n0 0 0.5 1", [("0 0 0.5 1", "0, 0, 0.5, 1"), "row"],
     "the last row of a homogeneous transform is 0 0 0 1; name the row"),
    ("last-row-two", "[[1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 1, 0], [0, 0, 0, 2]]", [("0 0 0 2", "0, 0, 0, 2"), "row"],
     "a projective scale of 2 is not a rigid transform"),
    ("last-row-perspective", "T = [1 0 0 0; 0 1 0 0; 0 0 1 0; 0.1 0 0 1]", [("0.1 0 0 1", "0.1, 0, 0, 1"), "row"],
     "a perspective row is not a pose"),
    ("last-row-in-data-list", "T_BS:\n  rows: 4\n  cols: 4\n  data: [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 1, 1]",
     [("0 0 1 1", "0, 0, 1, 1"), "row"], "row-major 16 numbers whose fourth row is 0 0 1 1"),
    # --- non-finite values inside a pose ------------------------------------------------------------
    ("nan-in-3x4", "Tr: 1 0 0 0.1 0 1 0 NaN 0 0 1 0", ["nan"], "a NaN translation is never dropped"),
    ("nan-in-quaternion", "q = [0.7071, NaN, 0.0, 0.7071]", ["nan"],
     "issue 11: read as three angles once, with exit 0"),
    ("inf-before-quaternion", "inf 0 0 1", ["inf"], "issue 11: inf was dropped and the rest re-read"),
    ("overflow-in-4x4", "1 0 0 1e999\n0 1 0 0\n0 0 1 0\n0 0 0 1", ["1e999"], "1e999 overflows to infinity"),
    ("inf-in-tum-translation", "# timestamp tx ty tz qx qy qz qw\n1.0 inf 0.0 0.0 0.0 0.0 0.0 1.0", ["inf"],
     "a non-finite position is refused, not set aside"),
    ("nan-in-echo-translation", "At time 0.0\n- Translation: [nan, 0.000, 0.100]\n"
     "- Rotation: in Quaternion [0.000, 0.000, 0.000, 1.000]", ["nan"], "a NaN translation in an echo block"),
    ("nan-in-pose-yaml", "position:\n  x: .nan\n  y: 0.0\n  z: 0.0\norientation:\n  x: 0.0\n  y: 0.0\n"
     "  z: 0.0\n  w: 1.0", ["nan"], "YAML's .nan spelling"),
    ("nan-in-rvec", "rvec = [nan, 0.1, 0.2]", ["nan"], "a NaN rotation vector component"),
    ("infinity-in-urdf", '<origin xyz="0 0 0" rpy="0 0 Infinity"/>', ["infinity"], "Infinity in a description file"),
    # --- stray words between numbers of a pose line --------------------------------------------------
    ("stray-word-angles", "30 abc 20 10", ["abc"], "issue 11: 'abc' was dropped and the rest re-read"),
    ("stray-word-pose-line", "# timestamp tx ty tz qx qy qz qw\n1305031098.6659 1.3563 0.6305 oops 1.6380 0.6132"
     " 0.5962 -0.3311 -0.3986", ["oops"], "a word inside a TUM-layout line"),
    ("stray-word-4x4-row", "1 0 0 0.1\n0 1 0 bar 0.2\n0 0 1 0.3\n0 0 0 1", ["bar"], "a word inside a matrix row"),
    ("stray-word-publisher", "static_transform_publisher 0.1 0 0.2 fast 1.5708 0 0 base_link laser", ["fast"],
     "a word among the numeric arguments (frame names come after them)"),
    # --- a 3x4 / R block that is not a rotation (CONVENTIONS.md: refused, saying which row or column) -
    ("scaled-3x4", "Tr: 2 0 0 0.1 0 2 0 0 0 0 2 0", [("row", "column")], "a scaled block breaks unit length"),
    ("reflection-3x4", "Tr: -1 0 0 0 0 1 0 0 0 0 1 0", ["reflection"], "det = -1 is never fixed"),
    ("sheared-r-beside-t", "R: 1 0.3 0 0 1 0 0 0 1\nT: 0 0 0", [("row", "column")], "a shear is not a rotation"),
    # --- expressions outside the subset (issue 11 item 3) ---------------------------------------------
    ("power-operator", '<origin xyz="0 0 0" rpy="0 0 ${2**3}"/>', ["**"], "** is not in the subset"),
    ("function-call", '<origin xyz="0 0 0" rpy="0 0 ${sin(1)}"/>', ["sin"], "calls are refused"),
    ("call-radians", '<origin xyz="0 0 0" rpy="0 0 ${radians(30)}"/>', ["radians"], "calls are refused"),
    ("os-system", '<origin xyz="0 0 0" rpy="0 0 ${os.system(\'ls\')}"/>', [("os.system", "os")], "attributes and calls"),
    ("attribute", '<origin xyz="0 0 0" rpy="0 0 ${a.b}"/>', ["a.b"], "attributes are refused"),
    ("dunder-import", '<origin xyz="0 0 0" rpy="0 0 ${__import__(\'os\')}"/>', ["__import__"], "names are refused"),
    ("unknown-property", '<origin xyz="0 0 0.1" rpy="0 0 ${camera_yaw}"/>', ["camera_yaw"],
     "a description-file property we do not know is never guessed"),
    ("unknown-constant", '<origin xyz="0 0 0" rpy="0 0 ${M_PI_2}"/>', ["M_PI_2"], "only pi, PI, M_PI and π"),
    ("empty-substitution", '<origin xyz="0 0 0" rpy="0 0 ${}"/>', [("${}", "empty")], "an empty ${} has no value"),
    ("launch-substitution", 'args="0 0 0 $(arg yaw) 0 0 base_link laser"', [("$(arg yaw)", "$(arg")],
     "a launch substitution is not a number"),
    ("python-launch-call", "arguments=['0', '0', '0', str(math.pi/2), '0', '0', 'base_link', 'laser']",
     [("math.pi", "math", "str(")], "a Python expression in a launch description"),
    ("division-by-zero", '<origin xyz="0 0 0" rpy="0 0 ${pi/0}"/>', ["zero"], "pi/0 has no value"),
]


@pytest.mark.parametrize("text, words", [(t, w) for _, t, w, _ in REFUSALS], ids=[r[0] for r in REFUSALS])
def test_refused_with_a_message_naming_the_offending_token(text, words):
    with pytest.raises(DecodeError) as refused:
        decode(text)
    message = str(refused.value).lower()
    for word in words:
        choices = word if isinstance(word, tuple) else (word,)
        assert any(c.lower() in message for c in choices), (
            f"the message {str(refused.value)!r} does not name {' or '.join(map(repr, choices))}")


@pytest.mark.parametrize("text", [t for _, t, _, _ in REFUSALS], ids=[r[0] for r in REFUSALS])
def test_refused_even_with_every_hint_that_fits(text):
    # issue 11: `${-M_PI/2}` was misread as 2 "even with every hint given"; hints never turn a refusal into a value
    for hints in ({"units": "rad"}, {"kind": "matrix"}, {"kind": "quaternion", "order": "xyzw"},
                  {"kind": "angles", "sequence": "ZYX", "intrinsic": True, "units": "rad"}):
        with pytest.raises(DecodeError):
            decode(text, hints)


def test_the_refusal_table_is_large_and_has_distinct_ids():
    assert len(REFUSALS) >= 30
    assert len({r[0] for r in REFUSALS}) == len(REFUSALS)


def test_a_yaml_alias_is_refused_not_followed_or_dropped():
    # 'b: *x' repeats the values '&x' marked (YAML 1.2 anchors and aliases): reading the three numbers bare
    # would give an orientation from half of what the text says.
    with pytest.raises(DecodeError, match="YAML alias"):
        decode("a: &x [1, 0, 0]\nb: *x\n")
