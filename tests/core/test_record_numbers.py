"""The record's printed numbers at their limits, its canonical JSON spelled one way, and the keys its numbers
and its embedded copy carry. Check values: hand-worked (named beside each), Python's json and hashlib."""

import hashlib
import json
import math
from pathlib import Path

import pytest

from core import inspection_record as records
from core.session import load_session

ROOT = Path(__file__).resolve().parents[2]
SESSION = load_session(ROOT / "resources" / "demo_check.fwsession.json")
CHECK = "Radar antenna after remount"


def test_an_empty_group_prints_nothing_and_a_group_of_zeros_prints_zeros():
    assert records.printed_numbers([], 6) == ()
    assert records.printed_numbers([0.0, -0.0], 6) == ("0", "0")


@pytest.mark.parametrize("bad", [math.nan, math.inf, -math.inf])
def test_a_figure_that_is_not_finite_stops_the_record_word_for_word(bad):
    with pytest.raises(records.RecordError) as refused:
        records.printed_numbers([1.0, bad], 6)
    assert str(refused.value) == "a figure is not a finite number; the record is not made"


def test_a_large_figure_prints_with_no_decimals_and_a_tiny_one_with_at_most_17():
    # hand-worked: 3 digits from 123456.7 leave no decimals, rounded half up: 123457
    assert records.printed_numbers([123456.7], 3) == ("123457",)
    # 1.5e-18 needs 18 decimals to show; the record prints at most 17, so it is 0 (1.5e-17 shows as 2e-17)
    assert records.printed_numbers([1.5e-18], 6) == ("0",)
    assert records.printed_numbers([1.5e-17], 6) == ("0.00000000000000002",)


def test_a_small_negative_beside_a_large_figure_prints_as_zero_not_minus_zero():
    # hand-worked: 3 digits from 10 leave one decimal; -0.0001 rounds to -0.0, printed 0
    assert records.printed_numbers([10.0, -0.0001], 3) == ("10", "0")
    assert records.printed_numbers([1.5, 2.0], 3) == ("1.5", "2")


def test_the_canonical_json_is_one_spelling_sorted_without_spaces_in_utf8_and_refuses_nan():
    numbers = {"b": [1, 2.5], "a": "µrad"}
    assert records.canonical_json(numbers) == '{"a":"µrad","b":[1,2.5]}'
    assert records.numbers_sha256(numbers) == hashlib.sha256('{"a":"µrad","b":[1,2.5]}'.encode()).hexdigest()
    with pytest.raises(ValueError):
        records.canonical_json({"a": math.nan})


def test_a_record_carries_its_keys_and_its_own_hash_of_exactly_those_numbers():
    record = records.check_record(SESSION, CHECK, "demo_check.fwsession.json", "ab" * 32)
    numbers = record.numbers()
    assert set(numbers) == {"format", "version", "scope", "check", "session_sha256", "digits", "figures"}
    assert numbers["scope"] == "check" and numbers["check"] == CHECK and numbers["session_sha256"] == "ab" * 32
    expected_hash = hashlib.sha256(json.dumps(numbers, sort_keys=True, separators=(",", ":"),
                                              ensure_ascii=False).encode("utf-8")).hexdigest()
    assert record.sha256() == expected_hash
    assert record.embedded() == {**numbers, "record_sha256": expected_hash}


def test_units_other_than_degrees_are_named_in_the_numbers_and_read_back():
    shown = records.ReportUnits(angle="arcmin", slope="deg")
    record = records.check_record(SESSION, CHECK, "demo_check.fwsession.json", "ab" * 32, shown=shown)
    assert record.numbers()["units"] == {"angle": "arcmin", "slope": "deg"}
    assert records.ReportUnits.from_numbers(record.numbers()) == shown
    assert records.ReportUnits.from_numbers({}) == records.ReportUnits()
    assert records.ReportUnits.from_numbers([]) == records.ReportUnits()       # not a mapping: degrees
    with pytest.raises(records.RecordError) as refused:
        records.ReportUnits.from_numbers({"units": {"angle": "deg", "colour": "red"}})
    assert str(refused.value) == "the report's units are not readable: {'angle': 'deg', 'colour': 'red'}"
    with pytest.raises(records.RecordError) as refused:
        records.ReportUnits(angle="dms")
    assert str(refused.value) == ("a record prints decimal numbers; choose deg, arcmin or arcsec rather than "
                                  "degrees-minutes-seconds")
