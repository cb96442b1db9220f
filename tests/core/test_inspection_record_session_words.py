"""What a whole-session record and a check record say about themselves (core/inspection_record.py): their
titles, scope, verdict, the session they name, and the conventions printed at their head, word for word.
Built in-process from the small invented bracket session. Check values: the record's own words; the frame
titles are core/describe.py's."""

import pytest

from core import inspection_record as records
from core.record_values import ReportUnits
from core.session import Preferences
from tests.core.test_inspection_record_check_words import bracket_record, bracket_session

SHA = "ab" * 32


def _conventions(digits=9, angles="degrees", frame="ENU (x east, y north, z up)"):
    return ("An orientation R maps body to reference: v_ref = R · v_body, so the columns of R are the body axes "
            "in reference coordinates.",
            "Quaternions are Hamilton (i j = k), written w first, with w not negative; q and −q are the same "
            "orientation.",
            f"Angles are in {angles}. Intrinsic angles turn about the moving body axes, extrinsic about the fixed "
            "reference axes.",
            f"Numbers are printed to {digits} significant digits counted from the largest of each group, trailing "
            "zeros dropped; '.' is the decimal point.",
            f"Reference frame: {frame}. It names directions and sets where gravity points; it never changes R.")


def test_a_session_record_says_what_it_is():
    record = records.session_record(bracket_session(), "bracket.fwsession.json", SHA)
    assert record.title == "Inspection record: bracket.fwsession.json"
    assert (record.scope, record.check_name, record.verdict) == ("all", None, None)
    assert (record.session_name, record.session_sha256) == ("bracket.fwsession.json", SHA)
    assert (record.reference_frame, record.digits) == ("ENU (x east, y north, z up)", 9)
    assert record.conventions == _conventions()
    assert record.units == ReportUnits()
    assert record.fit_source is None


def test_a_check_record_says_what_it_is():
    record = bracket_record()
    assert record.title == "Inspection record: Measured bracket"
    assert (record.scope, record.check_name) == ("check", "Bracket check")
    assert record.conventions == _conventions()


def test_the_conventions_follow_the_digits_the_units_and_the_frame():
    session = bracket_session(frame="ned", preferences=Preferences(significant_digits=5))
    record = records.session_record(session, "b", SHA, ReportUnits(angle="arcmin"))
    assert record.conventions == _conventions(5, "arcminutes", "NED (x north, y east, z down)")
    assert (record.digits, record.reference_frame) == (5, "NED (x north, y east, z down)")
    assert record.units == ReportUnits(angle="arcmin")


def test_a_session_record_holds_every_mount_then_every_check():
    record = records.session_record(bracket_session(), "b", SHA)
    assert [s.title for s in record.sections] == ["Mount 1: Nominal bracket", "Mount 2: Measured bracket",
                                                  "Check “Bracket check”: FAIL"]
    # the check's section is the check record's own first section
    assert record.sections[2].items == bracket_record().sections[0].items
    assert record.sections[2].picture.ghost_label == "nominal, Nominal bracket"


@pytest.mark.parametrize("digits", [3, 12])
def test_the_figures_of_a_session_record_hash_the_same_when_rebuilt(digits):
    session = bracket_session(preferences=Preferences(significant_digits=digits))
    first = records.session_record(session, "b", SHA)
    again = records.session_record(session, "b", SHA)
    assert first.sha256() == again.sha256()
    assert first.numbers()["digits"] == digits
