"""Parsing and checking a JSON document (core.bounded_json.parse, check_values, place): what is accepted
is returned as json.loads gives it; each limit is pinned on both sides (nesting depth, digits of a whole
number, the range of a double for whole numbers, the length of a spelled place); each refusal is pinned
in the module's own words with the place it names. Check values: the largest double is 2**1024 - 2**971,
about 1.8e308, and float() of a whole number rounds half to even (IEEE 754, common practice); Python's json module accepts
NaN and Infinity and parses \\ud800 to a lone surrogate (its documented behaviour); positions and MB
sums worked by hand. Documents are invented."""

import json
import sys

import pytest

from core import bounded_json
from core.bounded_json import BoundedJsonError, check_values, parse, place

NAN_WORDS = "is not a finite number (JSON has no NaN or infinity; the file may be damaged)"
RANGE_WORDS = "a whole number beyond the range of a double (about ±1.8e308)"
LONE = "which is not valid Unicode text (the file may be damaged)"


def _refusal(raw, **kwargs) -> str:
    with pytest.raises(BoundedJsonError) as caught:
        parse(raw, **kwargs)
    return str(caught.value)


# --- place -----------------------------------------------------------------------------------------

@pytest.mark.parametrize("parts, spelled", [
    (("mounts", 3, "part", "box_size_mm", 1), "mounts[3].part.box_size_mm[1]"),
    (("a", "b"), "a.b"),
    ((3, "name"), "[3].name"),
    (("face_names", "+X"), 'face_names["+X"]'),
    (("+X", "name"), '["+X"].name'),
    (("notes", "é"), 'notes["\\u00e9"]'),          # kept ASCII, so a message never carries odd text
    ((), "(the top level)"),
])
def test_a_place_is_spelled_as_a_path(parts, spelled):
    assert place(parts) == spelled


# --- what is accepted ------------------------------------------------------------------------------

@pytest.mark.parametrize("raw, value", [
    (b"5", 5), (b"-7", -7), (b"1.5", 1.5), (b"true", True), (b"null", None), (b'"plain"', "plain"),
    (b'"\\ud83d\\ude00"', "\U0001F600"),        # an escaped surrogate pair is one valid character
    (b'{"a": [1, 2.5, "x", null, false, {"b": {}}]}', {"a": [1, 2.5, "x", None, False, {"b": {}}]}),
])
def test_a_valid_document_is_returned_as_parsed(raw, value):
    assert parse(raw) == value
    assert parse(b"\xef\xbb\xbf" + raw) == value      # with a byte-order mark in front


def test_a_byte_order_mark_is_dropped_and_nothing_else():
    assert parse(b"\xef\xbb\xbf[1]") == [1]
    assert parse(b"\xef\xbb\xbf\"\xef\xbb\xbfkept\"") == "\ufeffkept"   # only the leading mark goes


def test_values_built_in_memory_in_tuples_are_walked_too():
    check_values(("a", (1, 2.0), {"k": ("v",)}))
    with pytest.raises(BoundedJsonError) as caught:
        check_values(("a", (float("nan"),)))
    assert str(caught.value) == f"[1][0]: nan {NAN_WORDS}"


# --- empty, not UTF-8, not JSON -----------------------------------------------------------------

@pytest.mark.parametrize("raw", [b"", b"  \n\t", b"\xef\xbb\xbf", b"\xef\xbb\xbf \n"])
def test_an_empty_file_is_refused_as_empty(raw):
    assert _refusal(raw) == "the file is empty"


def test_bytes_that_are_not_utf8_are_refused_with_the_first_bad_byte():
    assert _refusal(b'{"a": "\xff"}') == ("not a text file in UTF-8 (byte 7); it may be damaged or not a "
                                          "session file")


@pytest.mark.parametrize("raw, words", [
    (b"[1,]", "damaged JSON at line 1, column 4: Expecting value"),
    (b'{\n"a" 1}', "damaged JSON at line 2, column 5: Expecting ':' delimiter"),
])
def test_damaged_json_is_refused_with_its_line_and_column(raw, words):
    assert _refusal(raw) == words


def test_nesting_too_deep_for_the_parser_is_refused_with_the_limit():
    deep = b"[" * 100_000 + b"]" * 100_000
    assert _refusal(deep) == "nested deeper than 64 levels; the file may be damaged"
    assert _refusal(deep, max_depth=5) == "nested deeper than 5 levels; the file may be damaged"


@pytest.mark.parametrize("error", [MemoryError("out of memory"), OverflowError("too big"),
                                   ValueError("odd value")])
def test_any_other_parser_failure_is_refused_with_its_kind(monkeypatch, error):
    def failing(*args, **kwargs):
        raise error
    monkeypatch.setattr(bounded_json.json, "loads", failing)
    assert _refusal(b"[1]") == f"cannot be read as JSON ({type(error).__name__}: {error})"


def test_a_parser_failure_with_a_long_message_is_cut_to_300_characters(monkeypatch):
    def failing(*args, **kwargs):
        raise ValueError("v" * 1000)
    monkeypatch.setattr(bounded_json.json, "loads", failing)
    words = _refusal(b"[1]")
    assert len(words) == 300 and words.startswith("cannot be read as JSON (ValueError: vvv")


# --- nesting depth, after parsing --------------------------------------------------------------

def test_nesting_up_to_the_limit_is_kept_and_one_more_level_is_refused_by_its_place():
    assert parse(b"[[[1]]]", max_depth=3) == [[[1]]]
    assert _refusal(b"[[[[1]]]]", max_depth=3) == "[0][0][0]: nested deeper than 3 levels"
    assert _refusal(b'{"a": [5, {"b": {}}]}', max_depth=2) == "a[1]: nested deeper than 2 levels"
    assert parse(b'{"a": [5, {"b": 1}]}', max_depth=3) == {"a": [5, {"b": 1}]}


def test_the_default_depth_limit_is_64_levels():
    assert parse(b"[" * 64 + b"]" * 64) is not None
    # 64 levels of "[0]" are 192 characters: the first 100 are kept
    assert _refusal(b"[" * 65 + b"]" * 65) == ("[0]" * 64)[:100] + "… (64 levels down): nested deeper than 64 levels"


# --- whole numbers -----------------------------------------------------------------------------

def test_a_whole_number_of_400_digits_is_parsed_and_one_of_401_is_refused_before_converting():
    assert _refusal(b"[" + b"1" * 400 + b"]") == f"[0]: {RANGE_WORDS}"        # read, then out of range
    assert _refusal(b"[" + b"9" * 401 + b"]") == ("a whole number of 401 digits (at most 400 are read); "
                                                   "the file may be damaged")
    assert _refusal(b"7" * 5000) == ("a whole number of 5,000 digits (at most 400 are read); the file "
                                     "may be damaged")


# The largest double is 2**1024 - 2**971; whole numbers from halfway to 2**1024 on round (half to even)
# to 2**1024 and overflow (IEEE 754 rounding, common practice; float() rounds correctly).
FIRST_OVER = 2 ** 1024 - 2 ** 970


@pytest.mark.parametrize("number", [FIRST_OVER - 1, -(FIRST_OVER - 1), 10 ** 308, 0],
                         ids=["just under", "just over minus", "1e308", "zero"])
def test_a_whole_number_a_double_can_hold_is_kept(number):
    assert parse(f"[{number}]".encode()) == [number]
    assert parse(f"{number}".encode()) == number
    assert abs(float(number)) <= sys.float_info.max          # so a reader converting it cannot overflow


@pytest.mark.parametrize("number", [FIRST_OVER, -FIRST_OVER, 2 ** 1024 - 1, 2 ** 1024, -2 ** 1024 - 1,
                                    10 ** 399],
                         ids=["first over", "first under minus", "2**1024-1", "2**1024", "-2**1024-1", "1e399"])
def test_a_whole_number_a_double_cannot_hold_is_refused_by_its_place(number):
    with pytest.raises(OverflowError):
        float(number)
    assert _refusal(f'{{"kept": [0, {number}]}}'.encode()) == f"kept[1]: {RANGE_WORDS}"
    assert _refusal(f"{number}".encode()) == f"(the top level): {RANGE_WORDS}"


def test_true_and_false_are_not_taken_for_whole_numbers():
    assert parse(b"[true, false]") == [True, False]
    check_values(True)


# --- numbers that are not finite ---------------------------------------------------------------

@pytest.mark.parametrize("raw, spelled", [(b"NaN", "nan"), (b"Infinity", "inf"), (b"-Infinity", "-inf")])
def test_nan_and_infinity_are_refused_where_they_are(raw, spelled):
    assert _refusal(raw) == f"(the top level): {spelled} {NAN_WORDS}"
    assert _refusal(b'{"m": [1.5, ' + raw + b"]}") == f"m[1]: {spelled} {NAN_WORDS}"
    assert _refusal(b"[1e999]") == f"[0]: inf {NAN_WORDS}"          # a float too large parses to inf


# --- lone surrogates ---------------------------------------------------------------------------

@pytest.mark.parametrize("raw, where, code, at", [
    (b'"\\ud800"', "(the top level)", "D800", 1),
    (b'["ok", "ab\\udc00"]', "[1]", "DC00", 3),
    (b'{"mounts": [{"name": "x\\uDBFFy"}]}', "mounts[0].name", "DBFF", 2),
])
def test_a_lone_surrogate_in_text_is_refused_with_its_place_and_position(raw, where, code, at):
    assert _refusal(raw) == f"{where}: holds a lone surrogate U+{code} at character {at}, {LONE}"


def test_a_lone_surrogate_in_a_key_is_refused_with_the_place_of_its_object():
    assert _refusal(b'{"ok": {"\\ud800x": 1}}') == f"ok: a key holds a lone surrogate U+D800 at character 1, {LONE}"
    assert _refusal(b'{"a\\udfffb": 1}') == (f"(the top level): a key holds a lone surrogate U+DFFF at "
                                              f"character 2, {LONE}")


def test_text_built_in_memory_is_checked_for_surrogates_by_default():
    with pytest.raises(BoundedJsonError, match=r"^\[0\]: holds a lone surrogate U\+D800"):
        check_values(["\ud800"])
    check_values(["\ud800"], may_hold_surrogates=False)        # the caller's word that none can be there
    check_values("plain text")
    check_values(["plain text", {"key": "value"}])


# --- long places -------------------------------------------------------------------------------

def test_a_place_of_120_characters_is_given_whole_and_a_longer_one_is_shortened():
    for length in (119, 120):
        key = "k" * length
        assert _refusal(json.dumps({key: float("nan")}).encode()) == f"{key}: nan {NAN_WORDS}"
    key = "k" * 121
    assert _refusal(json.dumps({key: float("nan")}).encode()) == "k" * 100 + f"… (1 levels down): nan {NAN_WORDS}"
    two = json.dumps({"a" * 60: {"b" * 60: float("nan")}}).encode()     # 60 + 1 + 60 = 121 characters
    assert _refusal(two) == "a" * 60 + "." + "b" * 39 + f"… (2 levels down): nan {NAN_WORDS}"


def test_a_session_file_with_a_whole_number_just_past_a_double_names_the_field(tmp_path):
    from core.session import SessionFileError, load_session
    from tests.core.session_mutations import VALID_DOCUMENTS

    document = json.loads(json.dumps(VALID_DOCUMENTS[0]))
    document["mounts"][0]["part"]["box_size_mm"][0] = 12345
    path = tmp_path / "big.fwsession.json"
    path.write_text(json.dumps(document).replace("12345", str(2 ** 1024 - 1), 1))
    with pytest.raises(SessionFileError) as caught:
        load_session(path)
    assert str(caught.value) == f"{path}: mounts[0].part.box_size_mm[0]: {RANGE_WORDS}"
    assert not caught.value.unexpected
