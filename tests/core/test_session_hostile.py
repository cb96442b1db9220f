"""The session loader on damaged and hostile files: for any bytes it returns a Session or raises
SessionFileError with a message naming the field, never another exception; every Session it returns
saves and reads back identically. Hypothesis mutates valid files (and shrinks a failure); a seeded corpus
of 3,000 mutations keeps a fixed count. A hang would be reported by pytest's fault-handler timeout."""

import json
import random

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from core import bounded_json
from core.session import Session, SessionFileError, load_session, save_session
from tests.core.session_mutations import VALID_DOCUMENTS, mutate

FUZZ = settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])


@pytest.fixture(scope="module")
def folder(tmp_path_factory):
    return tmp_path_factory.mktemp("hostile")


def outcome(raw: bytes, folder) -> str:
    """'loaded' or 'refused'; fails the test on anything else."""
    path = folder / "damaged.fwsession.json"
    path.write_bytes(raw)
    try:
        session = load_session(path)
    except SessionFileError as error:
        message = str(error)
        assert message.startswith(str(path) + ": ") and len(message) > len(str(path)) + 10
        assert not error.unexpected, f"refused by a constructor, not by a named field check: {message}"
        return "refused"
    assert isinstance(session, Session)
    again = folder / "again.fwsession.json"
    save_session(session, again)
    assert load_session(again) == session
    save_session(load_session(again), again)                 # a second round trip changes nothing either
    assert load_session(again) == session
    return "loaded"


@FUZZ
@given(st.sampled_from(VALID_DOCUMENTS), st.randoms(use_true_random=False))
def test_a_mutated_session_file_loads_or_is_refused_by_name(folder, document, rng):
    outcome(mutate(document, rng), folder)


@FUZZ
@given(st.binary(max_size=400))
def test_random_bytes_are_refused_with_a_message(folder, raw):
    assert outcome(raw, folder) == "refused"


@FUZZ
@given(st.recursive(st.none() | st.booleans() | st.integers() | st.floats() | st.text(),
                    lambda inner: st.lists(inner, max_size=4) | st.dictionaries(st.text(max_size=8), inner, max_size=4),
                    max_leaves=20))
def test_any_json_value_in_place_of_a_mount_loads_or_is_refused(folder, value):
    document = json.loads(json.dumps(VALID_DOCUMENTS[1]))
    document["mounts"][0] = value
    outcome(json.dumps(document, allow_nan=True).encode("utf-8", errors="surrogatepass"), folder)


def test_a_seeded_corpus_of_3000_damaged_files_has_no_crash(folder):
    rng = random.Random(20261201)
    counts = {"loaded": 0, "refused": 0}
    for i in range(3000):
        counts[outcome(mutate(VALID_DOCUMENTS[i % 2], rng), folder)] += 1
    # Both outcomes occur: the corpus is neither all harmless nor all garbage.
    assert counts["refused"] > 1000 and counts["loaded"] > 100, counts


@pytest.mark.parametrize("change, field, words", [
    (lambda d: d["mounts"][3]["part"].__setitem__("box_size_mm", [10, 5e-324, 10]),
     "mounts[3].part.box_size_mm[1]", "from 0.001 to 1e+06"),
    (lambda d: d["mounts"][0]["part"].__setitem__("box_size_mm", [10, 10, 2e6]),
     "mounts[0].part.box_size_mm[2]", "from 0.001 to 1e+06"),
    (lambda d: d["mounts"][1].__setitem__("name", ["a", "list"]), "mounts[1].name", "got a list"),
    (lambda d: d["mounts"][1].__setitem__("name", "lone \ud800"), "mounts[1].name", "lone surrogate U+D800"),
    (lambda d: d["mounts"][2].__setitem__("name", "erase\x1b[1A"), "mounts[2].name", "control character U+001B"),
    (lambda d: d["mounts"][2].__setitem__("notes", "bell\x07"), "mounts[2].notes", "control character U+0007"),
    (lambda d: d["mounts"][0]["part"]["face_names"].__setitem__("+X", "a\nb"), 'face_names["+X"]',
     "control character U+000A"),
    (lambda d: d.__setitem__("selected", True), "selected", "got true"),
    (lambda d: d.__setitem__("reference_frame", ["ned"]), "reference_frame", "got a list"),
    (lambda d: d["preferences"].__setitem__("significant_digits", 2.5), "preferences.significant_digits",
     "whole number from 3 to 17"),
    (lambda d: d["preferences"].__setitem__("intrinsic", "yes"), "preferences.intrinsic", "true or false"),
    (lambda d: d.__setitem__("kept", {"deep": float("inf")}), "kept.deep", "not a finite number"),
    (lambda d: d.__setitem__("chains", [{"name": "c", "steps": [
        {"name": "s", "orientation": {"quaternion_wxyz": [5, 0, 0, 0]}}]}]),
     "chains[0].steps[0].orientation.quaternion_wxyz", "unit quaternion"),
    (lambda d: d.__setitem__("checks", [{"settings": {"roll_tolerance_deg": "1"}}]),
     "checks[0].settings.roll_tolerance_deg", "expected a tolerance in degrees, got text"),
])
def test_a_bad_field_is_refused_by_its_place_and_what_was_expected(tmp_path, change, field, words):
    document = json.loads(json.dumps(VALID_DOCUMENTS[0]))
    change(document)
    path = tmp_path / "bad.fwsession.json"
    path.write_text(json.dumps(document, allow_nan=True), encoding="utf-8")
    with pytest.raises(SessionFileError) as caught:
        load_session(path)
    assert f"{path}: " in str(caught.value) and field in str(caught.value) and words in str(caught.value)


@pytest.mark.parametrize("digits, words", [("9" * 401, "401 digits"), ("3" * 5000, "5,000 digits"),
                                           ("1" * 400, "beyond the range of a double")])
def test_long_digit_strings_are_refused_before_any_conversion(tmp_path, digits, words):
    # Python refuses int() of more than 4,300 digits (ValueError); 401 digits overflow a double.
    text = json.dumps(VALID_DOCUMENTS[0])[:-1] + f', "count": {digits}}}'
    path = tmp_path / "digits.fwsession.json"
    path.write_text(text)
    with pytest.raises(SessionFileError, match=words):
        load_session(path)


@pytest.mark.parametrize("depth", [65, 1000, 100_000])
def test_deep_nesting_is_refused(tmp_path, depth):
    text = json.dumps(VALID_DOCUMENTS[0])[:-1] + ', "deep": ' + "[" * depth + "]" * depth + "}"
    path = tmp_path / "deep.fwsession.json"
    path.write_text(text)
    with pytest.raises(SessionFileError, match="nested deeper than 64 levels"):
        load_session(path)


def test_nesting_of_64_levels_is_kept_and_saved(tmp_path):
    depth = bounded_json.MAX_DEPTH - 1          # the top-level object is the first level
    text = json.dumps(VALID_DOCUMENTS[0])[:-1] + ', "deep": ' + "[" * depth + "]" * depth + "}"
    path = tmp_path / "deep.fwsession.json"
    path.write_text(text)
    session = load_session(path)
    save_session(session, path)
    assert load_session(path) == session


def test_a_file_over_the_size_cap_is_refused_without_being_read(tmp_path):
    path = tmp_path / "huge.fwsession.json"
    with open(path, "wb") as handle:
        handle.truncate(bounded_json.MAX_FILE_BYTES + 1)     # sparse: no 20 MB written
    with pytest.raises(SessionFileError, match="larger than the 20 MB"):
        load_session(path)


def test_a_byte_order_mark_is_accepted(tmp_path):
    path = tmp_path / "bom.fwsession.json"
    plain = json.dumps(VALID_DOCUMENTS[1]).encode("utf-8")
    path.write_bytes(b"\xef\xbb\xbf" + plain)
    with_mark = load_session(path)
    path.write_bytes(plain)
    assert with_mark == load_session(path)


@pytest.mark.parametrize("kind", ["folder", "fifo", "device"])
def test_a_folder_a_pipe_or_a_device_is_refused_without_blocking(tmp_path, kind):
    import os

    if kind == "folder":
        path = tmp_path / "folder.fwsession.json"
        path.mkdir()
    elif kind == "fifo":
        path = tmp_path / "pipe.fwsession.json"
        os.mkfifo(path)                     # no writer: a blocking open would hang here
    else:
        path = "/dev/zero"                  # endless: reading it whole would never end
    with pytest.raises(SessionFileError, match="not a file"):
        load_session(path)
