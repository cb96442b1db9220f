"""Fuzzing decode with arbitrary text and with mangled versions of valid snippets: it returns readings
or raises our DecodeError; nothing else escapes and no NaN is returned. A hang would be reported by
pytest's fault-handler timeout (pyproject.toml), not by a timed assertion. The example budget is the
hypothesis profile's (tests/conftest.py): `ci` by default, more with `make fuzz`."""

import numpy as np
from hypothesis import given
from hypothesis import strategies as st

from core.decode import MAX_INPUT_BYTES, DecodeError, decode, parse_numbers
from tests.core.test_decode_snippets import SNIPPETS

VALID = [text for _, text, *_ in SNIPPETS]
PASTE_ALPHABET = st.sampled_from(list("0123456789.,;:|-+eE \t\n[](){}=°'\"xyzwXYZW&\\") +
                                 ["\u2212", "\u2013", "\u00a0", "\u2009", "rad", "deg", "axis", "angle", "q",
                                  "yaw", "pitch", "roll", "DCM", "body to reference", "ZYX", "1e308", "nan",
                                  "inf", "1e-320", "⁻¹⁷", "×10^", "/", "√", "#", "%", "//", "/*"])


def check_outcome(text, hints=None):
    try:
        readings = decode(text, hints)
    except DecodeError as error:
        assert str(error)                      # a message, always
        return
    assert readings
    for r in readings:
        q = r.orientation.quaternion
        assert q.shape == (4,) and np.all(np.isfinite(q))
        assert abs(np.linalg.norm(q) - 1) < 1e-12
        assert all(np.isfinite(r.numbers))
        assert r.orthogonality_error is None or np.isfinite(r.orthogonality_error)


@given(st.text(max_size=300))
def test_arbitrary_unicode_text(text):
    check_outcome(text)


@given(st.lists(PASTE_ALPHABET, max_size=80).map("".join))
def test_text_made_of_paste_fragments(text):
    check_outcome(text)


@st.composite
def mangled(draw):
    text = draw(st.sampled_from(VALID))
    for _ in range(draw(st.integers(1, 4))):
        action = draw(st.sampled_from(["delete", "insert", "duplicate", "swap", "digit"]))
        i = draw(st.integers(0, max(len(text) - 1, 0)))
        if action == "delete":
            text = text[:i] + text[i + 1:]
        elif action == "insert":
            text = text[:i] + draw(PASTE_ALPHABET) + text[i:]
        elif action == "duplicate":
            j = draw(st.integers(i, len(text)))
            text = text[:j] + text[i:j] + text[j:]
        elif action == "swap" and i + 1 < len(text):
            text = text[:i] + text[i + 1] + text[i] + text[i + 2:]
        elif action == "digit":
            text = text[:i] + draw(st.sampled_from("0123456789")) + text[i + 1:]
    return text


@given(mangled())
def test_mangled_valid_snippets(text):
    check_outcome(text)


@given(mangled(), st.fixed_dictionaries({}, optional={
    "kind": st.sampled_from(["matrix", "quaternion", "axis-angle", "rotation-vector", "angles"]),
    "sequence": st.sampled_from(["ZYX", "XYZ", "ZXZ", "yxy"]), "intrinsic": st.booleans(),
    "order": st.sampled_from(["wxyz", "xyzw", "jpl"]), "units": st.sampled_from(["deg", "rad"]),
    "transposed": st.booleans()}))
def test_mangled_snippets_with_any_hints(text, hints):
    check_outcome(text, hints)


def test_large_inputs_just_under_the_limit_finish_and_over_it_are_refused():
    junk = ("axis = [0, 0, 1] 1.2.3 IMU2 ° rad \u2212 " * 4000)[: MAX_INPUT_BYTES - 10]
    check_outcome(junk)
    check_outcome("[" * 20000 + "1 0 0 0" + "]" * 20000)
    check_outcome("-" * 50000 + "1")
    try:
        decode("x" * (MAX_INPUT_BYTES + 1))
    except DecodeError as error:
        assert "at most" in str(error)
    else:
        raise AssertionError("over 100 kB must be refused")
    assert len(parse_numbers(" ".join(["1"] * 20000)).numbers) == 20000
