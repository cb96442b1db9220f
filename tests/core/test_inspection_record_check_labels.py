"""Every item of a check's part of the record (core/inspection_record.py), in print order: each figure's
key, label and unit, the lines of words between them, the table of figures against their tolerances, the
verdict words and the verdict line, on both sides of each branch (total or pointing and roll, a defined or
an undefined roll, with or without an uncertainty, with or without positions). Built in-process from the
small invented bracket session. Check values: SciPy's Rotation for the deviation and the offsets, worked by
hand where named; labels and lines are the record's own words."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.adjustment_setup import AdjustmentSetup
from core.check import CheckSettings
from core.orientation import Orientation
from core.session import Mount, SavedCheck, Session
from core.record_values import ReportUnits
from tests.core.test_inspection_record_check_words import bracket_record, bracket_session

POINTING = CheckSettings(mode="pointing_and_roll", body_axis=(0, 0, 1), position_tolerance_mm=2.0)
DEVIATION_LINE = ("Deviation D = Nᵀ · M: the turn from the nominal body frame to the measured one, in nominal "
                  "body axes.")
NO_GUARD_BAND = ("No measurement uncertainty was given: the verdict is the plain comparison, with no guard band "
                 "(an ISO 14253-1 decision needs U).")
TABLE_TITLE = "Figures against their tolerances (a figure equal to its tolerance passes)"


def _items(session=None, **kwargs):
    return list(bracket_record(session, **kwargs).sections[0].items)


def _figures(items):
    return {i.key: i for i in items if isinstance(i, records.Figure)}


def _outline(items):
    """Each item as (key, label, unit) for a figure, ('table', title, columns) or the line itself."""
    out = []
    for i in items:
        if isinstance(i, records.Figure):
            out.append((i.key, i.label, i.unit))
        elif isinstance(i, records.Table):
            out.append(("table", i.title, i.columns))
        else:
            out.append(i)
    return out


def test_a_pointing_check_with_uncertainty_and_positions_prints_everything_in_order():
    # the record's own words, in the order a reader meets them
    assert _outline(_items()) == [
        ("check[0].name", "Check", ""),
        ("check[0].nominal", "Nominal mount", ""),
        ("check[0].measured", "Measured mount", ""),
        ("check[0].judged", "Judged by", ""),
        DEVIATION_LINE,
        ("check[0].total_deviation", "Total deviation (the angle of D)", "deg"),
        ("check[0].deviation_axis", "Axis of D (x, y, z), in nominal body axes", "unit vector"),
        ("check[0].pointing_error", "Pointing error of the body axis", "deg"),
        ("check[0].roll", "Roll about the body axis (signed, right-hand rule)", "deg"),
        ("table", TABLE_TITLE, ("figure", "value", "tolerance", "margin")),
        ("check[0].verdict", "Verdict", ""),
        records.DECISION_RULE + ".",
        ("check[0].uncertainty", "Standard uncertainty u of the measured orientation", "deg"),
        ("check[0].coverage", "Coverage factor k", "dimensionless"),
        ("check[0].expanded_uncertainty", "Expanded uncertainty U = k·u", "deg"),
        ("check[0].decision", "Decision (ISO 14253-1)", ""),
        ("check[0].position_offset", "Position offset of the measured origin from the nominal one", "mm"),
        ("check[0].position_offset_axes", "The offset along the nominal body axes (x, y, z)", "mm"),
        ("check[0].position_verdict", "Position against 2 mm", ""),
        "Correction C (turns the part from measured to nominal: M · C = N in body axes).",
        ("check[0].correction_angle", "Correction angle", "deg"),
        ("check[0].correction_axis_body", "Correction axis (x, y, z), in body axes", "unit vector"),
        ("check[0].correction_axis_reference", "Correction axis (x, y, z), in reference axes", "unit vector"),
        ("check[0].correction_small_turns", "Small turns about body X, Y, Z", "deg"),
    ]


def test_the_deviation_figures_agree_with_scipy():
    figures = _figures(_items())
    # SciPy's Rotation: the measured bracket is 1° about -Y from an identity nominal
    d = Rotation.from_rotvec([0.0, -1.0, 0.0], degrees=True)
    assert [float(v) for v in figures["check[0].total_deviation"].values] == \
        pytest.approx([np.degrees(d.magnitude())], abs=1e-9)
    assert figures["check[0].pointing_error"].values == ("1",)   # body Z tips 1° (worked by hand)
    assert figures["check[0].roll"].values == ("0",)


def test_the_tolerance_table_says_pass_or_fail_beside_each_figure_with_its_margin():
    table = [i for i in _items() if isinstance(i, records.Table)][0]
    rows = [(r.key, r.label, r.values, r.unit) for r in table.rows]
    # worked by hand: 1° pointing error against 0.5° leaves -0.5°; roll 0 against 1° leaves 1°
    assert rows == [("check[0].criterion[0]", "pointing error: FAIL", ("1", "0.5", "-0.5"), "deg"),
                    ("check[0].criterion[1]", "roll: PASS", ("0", "1", "1"), "deg")]


def test_the_table_and_uncertainty_follow_the_records_angle_unit():
    items = _items(shown=ReportUnits(angle="arcmin"))
    table = [i for i in items if isinstance(i, records.Table)][0]
    # worked by hand: 1° = 60′, 0.5° = 30′
    assert (table.rows[0].values, table.rows[0].unit) == (("60", "30", "-30"), "arcmin")
    figures = _figures(items)
    assert (figures["check[0].expanded_uncertainty"].values, figures["check[0].expanded_uncertainty"].unit) == \
        (("6",), "arcmin")
    assert figures["check[0].coverage"].values == ("2",)


def test_the_verdict_line_names_each_figure_and_the_decision():
    record = bracket_record()
    assert record.verdict == ("FAIL: pointing error exceeds its tolerance; roll within its tolerance; "
                              "ISO 14253-1 decision: does not conform (U = 0.1 deg, k = 2)")
    assert _figures(record.sections[0].items)["check[0].verdict"].values == ("FAIL",)
    assert record.sections[0].title == "Check “Bracket check”: FAIL"


def test_the_verdict_line_in_arcseconds_gives_u_in_arcseconds():
    record = bracket_record(shown=ReportUnits(angle="arcsec"))
    # worked by hand: U = 0.1° = 360″
    assert record.verdict.endswith("ISO 14253-1 decision: does not conform (U = 360 arcsec, k = 2)")


def test_a_check_within_every_tolerance_passes_in_every_word():
    wide = CheckSettings(mode="pointing_and_roll", body_axis=(0, 0, 1), pointing_tolerance_deg=2.0,
                         position_tolerance_mm=6.0)
    record = bracket_record(bracket_session(wide, setup=AdjustmentSetup()))
    items = list(record.sections[0].items)
    figures = _figures(items)
    table = [i for i in items if isinstance(i, records.Table)][0]
    assert [r.label for r in table.rows] == ["pointing error: PASS", "roll: PASS"]
    assert figures["check[0].verdict"].values == ("PASS",)
    assert figures["check[0].position_verdict"].values == ("PASS",)
    assert record.verdict == "PASS: pointing error within its tolerance; roll within its tolerance"
    assert record.sections[0].title == "Check “Bracket check”: PASS"


def test_without_an_uncertainty_there_is_no_decision_and_the_line_says_why():
    items = _items(bracket_session(setup=AdjustmentSetup()))
    outline = _outline(items)
    keys = {entry[0] for entry in outline if isinstance(entry, tuple)}
    assert not keys & {"check[0].uncertainty", "check[0].coverage", "check[0].expanded_uncertainty",
                       "check[0].decision"}
    assert records.DECISION_RULE + "." not in outline
    # the line comes right after the verdict
    verdict = outline.index(("check[0].verdict", "Verdict", ""))
    assert outline[verdict + 1] == NO_GUARD_BAND
    assert "ISO 14253-1" not in bracket_record(bracket_session(setup=AdjustmentSetup())).verdict


def test_a_total_check_prints_no_pointing_figures_and_judges_the_total_deviation():
    items = _items(bracket_session(CheckSettings(mode="total", total_tolerance_deg=0.5)))
    figures = _figures(items)
    assert "check[0].pointing_error" not in figures and "check[0].roll" not in figures
    table = [i for i in items if isinstance(i, records.Table)][0]
    # worked by hand: 1° against 0.5°
    assert [(r.label, r.values) for r in table.rows] == [("total deviation: FAIL", ("1", "0.5", "-0.5"))]


def test_a_body_axis_pointing_backwards_says_its_roll_is_undefined():
    # Invented: the measured bracket is a half turn about X, so body Z points exactly backwards
    backwards = bracket_session(measured=Orientation.from_axis_angle([1, 0, 0], 180.0), setup=AdjustmentSetup())
    items = _items(backwards)
    figures = _figures(items)
    assert figures["check[0].roll"].label == ("Roll about the body axis (signed, right-hand rule); undefined: the "
                                              "axis points backwards")
    assert figures["check[0].pointing_error"].values == ("180",)       # worked by hand
    notes = [i for i in items if isinstance(i, str) and i.startswith("Note: ")]
    assert notes == ["Note: the body axis points exactly backwards: the roll about it is undefined (shown as 0)"]
    table = [i for i in items if isinstance(i, records.Table)][0]
    assert [r.label for r in table.rows] == ["pointing error: FAIL", "roll (undefined, judged as 180°): FAIL"]
    # the notes come right after the verdict
    outline = _outline(items)
    verdict = outline.index(("check[0].verdict", "Verdict", ""))
    assert outline[verdict + 1] == notes[0]


def test_a_defined_roll_prints_no_note():
    assert not [i for i in _items() if isinstance(i, str) and i.startswith("Note: ")]


def test_the_offset_is_along_the_nominal_body_axes_as_scipy_gives_it():
    # Invented: the nominal is a quarter turn about Z; the origin moved (3, 4, 0) mm in reference axes
    nominal = Orientation.from_axis_angle([0, 0, 1], 90.0)
    figures = _figures(_items(bracket_session(nominal=nominal, measured=nominal)))
    # SciPy's Rotation: the offset in nominal body axes is Nᵀ · (3, 4, 0)
    along = Rotation.from_rotvec([0, 0, 90], degrees=True).inv().apply([3.0, 4.0, 0.0])
    assert [float(v) for v in figures["check[0].position_offset_axes"].values] == pytest.approx(along, abs=1e-9)
    assert figures["check[0].position_offset"].values == ("5",)          # a 3-4-5 triangle (by hand)
    assert figures["check[0].position_verdict"].values == ("FAIL",)


@pytest.mark.parametrize("positions", [((0, 0, 0), None), (None, (3, 4, 0)), (None, None)])
def test_without_both_positions_there_is_no_offset(positions):
    figures = _figures(_items(bracket_session(positions=positions)))
    assert not {"check[0].position_offset", "check[0].position_offset_axes", "check[0].position_verdict"} & \
        set(figures)


def _unchosen_session(nominal, measured):
    mount = Mount("Bracket", Orientation.identity())
    return Session(mounts=(mount,), checks=(SavedCheck(nominal, measured, CheckSettings(), "Loose check"),))


@pytest.mark.parametrize("nominal, measured, why", [
    (None, "Bracket", "check 'Loose check' has no nominal mount chosen; choose one before a report"),
    ("Bracket", None, "check 'Loose check' has no measured mount chosen; choose one before a report"),
    ("Gone", "Bracket", "check 'Loose check': its nominal mount 'Gone' is not in the session"),
    ("Bracket", "Gone", "check 'Loose check': its measured mount 'Gone' is not in the session"),
])
def test_a_check_without_both_mounts_is_refused_in_a_check_record_and_not_judged_in_a_session_record(
        nominal, measured, why):
    session = _unchosen_session(nominal, measured)
    with pytest.raises(records.RecordError) as raised:
        records.check_record(session, "Loose check", "s", "0" * 64)
    assert str(raised.value) == why
    whole = records.session_record(session, "s", "0" * 64)
    assert [s.title for s in whole.sections] == ["Mount 1: Bracket", "Check “Loose check”: not judged"]
    assert whole.sections[1].items == (f"Not judged: {why}",)
    assert whole.sections[1].picture is None


def test_a_check_not_judged_does_not_stop_the_checks_after_it():
    bracket = Mount("Bracket", Orientation.identity())
    tilted = Mount("Tilted bracket", Orientation.from_axis_angle([0, 1, 0], -1.0))
    checks = (SavedCheck(None, "Bracket", CheckSettings(), "Loose check"),
              SavedCheck("Bracket", "Tilted bracket", CheckSettings(total_tolerance_deg=2.0), "Tilt check"))
    whole = records.session_record(Session(mounts=(bracket, tilted), checks=checks), "s", "0" * 64)
    # worked by hand: a 1° tilt against a 2° total tolerance passes
    assert [s.title for s in whole.sections] == ["Mount 1: Bracket", "Mount 2: Tilted bracket",
                                                 "Check “Loose check”: not judged", "Check “Tilt check”: PASS"]
    # the second check is the second of the session: its keys say so
    assert whole.sections[3].items[0].key == "check[1].name"


def test_the_mounts_a_check_names_are_found_wherever_they_are_in_the_session():
    # Invented: the measured mount comes first in the session, the nominal second, and a third stands by
    measured = Mount("Tilted bracket", Orientation.from_axis_angle([0, 1, 0], -1.0))
    spare = Mount("Spare", Orientation.from_axis_angle([1, 0, 0], 45.0))
    nominal = Mount("Bracket", Orientation.identity())
    check = SavedCheck("Bracket", "Tilted bracket", CheckSettings(), "Tilt check")
    record = records.check_record(Session(mounts=(measured, spare, nominal), checks=(check,)), "Tilt check", "s",
                                  "0" * 64)
    assert record.title == "Inspection record: Tilted bracket"
    figures = _figures(record.sections[0].items)
    assert figures["check[0].nominal"].values == ("Bracket",)
    assert figures["check[0].measured"].values == ("Tilted bracket",)
    assert figures["check[0].total_deviation"].values == ("1",)          # worked by hand
    assert record.sections[0].picture.ghost_label == "nominal, Bracket"
    nominal_section, measured_section = record.sections[1], record.sections[2]
    # each mount section keeps the mount's own place in the session for its keys
    assert (nominal_section.items[0].key, nominal_section.items[0].values) == ("mount[2].name", ("Bracket",))
    assert (measured_section.items[0].key, measured_section.items[0].values) == ("mount[0].name",
                                                                                 ("Tilted bracket",))


def test_the_check_picture_shows_the_measured_part_in_the_sessions_frame():
    from core.session import PartProperties
    # Invented: the measured mount is a long antenna box pointing along +X, the nominal a plain block
    antenna = PartProperties(box_size_mm=(300.0, 40.0, 40.0), boresight="+X")
    nominal = Mount("Block", Orientation.identity())
    measured = Mount("Antenna", Orientation.from_axis_angle([0, 0, 1], 0.5), part=antenna)
    check = SavedCheck("Block", "Antenna", CheckSettings(), "Antenna check")
    session = Session(mounts=(nominal, measured), reference_frame="ned", checks=(check,))
    section = records.check_record(session, "Antenna check", "s", "0" * 64).sections[0]
    assert section.picture.part == antenna
    assert section.picture.preset == "ned"
    # a deviation well under a degree still prints its axis: 0.5° about +Z (by construction)
    assert _figures(section.items)["check[0].deviation_axis"].values == ("0", "0", "1")
    assert _figures(section.items)["check[0].total_deviation"].values == ("0.5",)


def test_each_figures_own_uncertainty_is_labelled_after_the_expanded_one():
    # Invented: a covariance of 0.03° about reference Z only; the bracket's body Z is reference Z here, so it
    # turns the part about its own axis (roll) and leaves the pointing alone (the roll's 0.03° as
    # core/uncertainty.py propagates it, its own tests check it by Monte Carlo)
    covariance = ((0.0, 0.0, 0.0), (0.0, 0.0, 0.0), (0.0, 0.0, 0.03 ** 2))
    setup = AdjustmentSetup(uncertainty_deg=0.03, covariance_deg2=covariance)
    outline = _outline(_items(bracket_session(setup=setup)))
    at = outline.index(("check[0].expanded_uncertainty", "Expanded uncertainty U = k·u", "deg"))
    assert outline[at + 1] == ("check[0].figure_uncertainties", "Standard uncertainty of each figure, propagated "
                               "from the orientation's covariance (pointing error, roll)", "deg")
    assert outline[at + 2] == ("check[0].decision", "Decision (ISO 14253-1)", "")
