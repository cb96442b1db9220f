"""The six signed axes (core/axes.py): the one reader of their spellings, with hostile input, their unit
vectors against the identity, the display spelling, and a scan that no other module keeps a table of its
own.

Check values: the unit vector of +X, +Y, +Z is the first, second, third column of the 3x3 identity
(numpy.eye), and of -X, -Y, -Z its negation (the definition of a basis vector; common practice)."""

import ast
from pathlib import Path

import numpy as np
import pytest

from core import axes
from core.errors import InvalidInputError

ROOT = Path(__file__).resolve().parents[2]


@pytest.mark.parametrize("spec, name", [
    ("x", "+X"), ("X", "+X"), ("+x", "+X"), ("+X", "+X"), (" +X ", "+X"), ("\t-z\n", "-Z"), (" -Z ", "-Z"),
    ("-y", "-Y"), ("Y", "+Y"), ("+z", "+Z"),
    ("\u2212z", "-Z"), ("\u2212X", "-X"), (" \u2212y ", "-Y"),        # the Unicode minus, as the window shows it
    ("\u00a0+x\u2003", "+X"),                                          # non-breaking and em spaces around it
])
def test_every_spelling_reads(spec, name):
    assert axes.axis_name(spec) == name
    assert axes.parse_axis(spec) == name


@pytest.mark.parametrize("spec", [
    "", " ", "xx", "+-x", "-+x", "--x", "++x", "+ x", "x+", "w", "+W", "1", "+1", "-", "+", "\u2212",
    "\uff58", "\uff0bX",          # full-width x and full-width plus: look alike, are not ours
    "\u2013x", "\u2010z",         # en dash and hyphen: not a minus sign
    "x" * 10_000, " " * 100_000 + "x" + " " * 100_000 + "y", "+X" * 50_000,
    "\x00x", "x\x00",
])
def test_anything_else_is_refused_with_a_message_naming_the_six(spec):
    assert axes.axis_name(spec) is None
    with pytest.raises(InvalidInputError, match=r"face: cannot read .*; expected one of \+X, -X, \+Y, -Y, \+Z, -Z$") \
            as refused:
        axes.parse_axis(spec, "face")
    assert len(str(refused.value)) < 200      # a long text is cut short in the message, not echoed whole


@pytest.mark.parametrize("spec", [None, 3, 1.0, b"+x", ["+X"], ("+X",), np.array([1.0, 0.0, 0.0]), {"+X": 1}])
def test_a_non_text_is_refused(spec):
    assert axes.axis_name(spec) is None
    with pytest.raises(InvalidInputError, match="cannot read"):
        axes.unit_vector(spec)


def test_the_refusal_names_what_else_the_caller_takes():
    with pytest.raises(InvalidInputError, match=r"^body axis: cannot read 'up'; expected one of \+X, -X, \+Y, "
                                                r"-Y, \+Z, -Z or three numbers$"):
        axes.unit_vector("up", "body axis", or_else="three numbers")


def test_the_vectors_are_the_identity_columns_with_their_signs():
    identity = np.eye(3)   # numpy.eye: column k is the unit vector along axis k
    assert axes.SIGNED_AXES == ("+X", "-X", "+Y", "-Y", "+Z", "-Z")
    assert axes.POSITIVE_AXES == ("+X", "+Y", "+Z")
    for k, letter in enumerate("XYZ"):
        np.testing.assert_array_equal(axes.unit_vector("+" + letter), identity[:, k])
        np.testing.assert_array_equal(axes.unit_vector("-" + letter), -identity[:, k])
        np.testing.assert_array_equal(axes.UNIT_VECTORS[axes.SIGNED_AXES.index("+" + letter)], identity[:, k])
        np.testing.assert_array_equal(axes.UNIT_VECTORS[axes.SIGNED_AXES.index("-" + letter)], -identity[:, k])
    assert not np.signbit(axes.UNIT_VECTORS[axes.UNIT_VECTORS == 0]).any()   # no -0.0 to print as "-0"


def test_the_table_cannot_be_changed_by_a_caller():
    with pytest.raises(ValueError):
        axes.UNIT_VECTORS[0, 0] = 5.0
    mine = axes.unit_vector("+X")
    mine[0] = 5.0                         # a caller's own copy
    assert axes.unit_vector("+X")[0] == 1.0


def test_names_of_vectors_and_of_matrix_columns():
    for name, vector in zip(axes.SIGNED_AXES, axes.UNIT_VECTORS):
        assert axes.name_of_vector(vector) == name
        assert axes.name_of_vector(tuple(vector.tolist())) == name
        index, sign = int(np.argmax(np.abs(vector))), int(vector[np.argmax(np.abs(vector))])
        assert axes.signed_axis(index, sign) == name
    assert axes.name_of_vector((-0.0, 0.0, -1.0)) == "-Z"
    for other in ((0.0, 0.0, -2.0), (1e-17, 0.0, 1.0), (np.nan, 0.0, 1.0), (0.0, 0.0, 0.0), (1.0, 0.0), [[1, 0, 0]]):
        assert axes.name_of_vector(other) is None
    assert axes.name_of_vector((1e-13, 0.0, 1.0)) is None                     # exact unless told otherwise
    assert axes.name_of_vector((1e-13, 0.0, 1.0), atol=1e-12) == "+Z"
    assert axes.name_of_vector((1e-11, 0.0, 1.0), atol=1e-12) is None
    assert axes.name_of_vector((np.nan, 0.0, 1.0), atol=1.0) is None


def test_display_uses_the_unicode_minus():
    assert [axes.display(n) for n in axes.SIGNED_AXES] == ["+X", "\u2212X", "+Y", "\u2212Y", "+Z", "\u2212Z"]
    assert all(axes.parse_axis(axes.display(n)) == n for n in axes.SIGNED_AXES)   # what is shown reads back


# --- one table only ----------------------------------------------------------------------------------

_SPELLINGS = {name: name for name in axes.SIGNED_AXES} | {n.replace("-", "\u2212"): n for n in axes.SIGNED_AXES}
_VECTORS = {tuple(v.tolist()): name for name, v in zip(axes.SIGNED_AXES, axes.UNIT_VECTORS)}


def _literal_vector(node):
    if isinstance(node, (ast.Tuple, ast.List)) and len(node.elts) == 3:
        try:
            return _VECTORS.get(tuple(float(ast.literal_eval(e)) + 0.0 for e in node.elts))
        except (ValueError, TypeError, SyntaxError):
            return None
    if isinstance(node, ast.Call) and node.args:    # np.array([1.0, 0.0, 0.0])
        return _literal_vector(node.args[0])
    return None


def _axes_named_in(literal):
    """The signed axes a container literal names: by string ('+X', '−X') or by unit-vector literal."""
    named = set()
    for node in ast.walk(literal):
        if isinstance(node, ast.Constant) and isinstance(node.value, str) and node.value in _SPELLINGS:
            named.add(_SPELLINGS[node.value])
        vector = _literal_vector(node)
        if vector:
            named.add(vector)
    return named


def _own_axis_tables(path):
    tree = ast.parse(path.read_text(encoding="utf-8"))
    found = []
    for node in ast.walk(tree):
        if isinstance(node, (ast.Tuple, ast.List, ast.Set, ast.Dict)) and len(_axes_named_in(node)) >= 4:
            where = path.relative_to(ROOT) if path.is_relative_to(ROOT) else path.name
            found.append(f"{where}:{node.lineno}")
    return found


def test_the_scan_finds_planted_tables(tmp_path):
    planted = tmp_path / "planted.py"
    planted.write_text('NAMES = ("+X", "-X", "+Y", "-Y", "+Z", "-Z")\n'
                       'SHOWN = (("+X", "tip"), ("\u2212X", "tip"), ("+Y", "tip"), ("\u2212Y", "tip"))\n'
                       'LOOK = {"a": (1.0, 0.0, 0.0), "b": (-1, 0, 0), "c": [0, 1.0, 0], "d": (0, 0, -1.0)}\n'
                       'NORMALS = [np.array([1.0, 0.0, 0.0]), np.array([0.0, -1.0, 0.0]), np.array((0, 0, 1)),\n'
                       '           np.array([0.0, 0.0, -1.0])]\n'
                       'FINE = ("+X", "+Y", "+Z", "boresight")\n', encoding="utf-8")
    assert _own_axis_tables(planted) == ["planted.py:1", "planted.py:2", "planted.py:3", "planted.py:4"]


def test_no_other_module_keeps_its_own_table_of_the_six_axes():
    sources = [p for folder in ("core", "app") for p in sorted((ROOT / folder).rglob("*.py"))]
    assert len(sources) > 50
    found = [hit for p in sources if p != ROOT / "core" / "axes.py" for hit in _own_axis_tables(p)]
    assert found == [], f"tables of the signed axes outside core/axes.py (use core.axes): {found}"
