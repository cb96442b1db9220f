"""The words and numbers of a check's part of the record (core/inspection_record.py), built in-process
from a small invented session: a bracket measured 1° off about body Y and 5 mm off its nominal origin.
Check values: worked by hand (each named beside its check) and SciPy's Rotation."""

import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.adjustment_setup import AdjustmentSetup
from core.check import CheckSettings
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, Preferences, SavedCheck, Session

# Invented scenario: a bracket's nominal is the reference itself; it was measured turned 1° about -Y.
NOMINAL = Orientation.identity()
MEASURED = Orientation.from_axis_angle([0, 1, 0], -1.0)
FEET = ((100.0, 50.0, -40.0), (-100.0, 50.0, -40.0), (-100.0, -50.0, -40.0), (100.0, -50.0, -40.0))


def bracket_session(settings=None, setup=None, nominal=NOMINAL, measured=MEASURED, frame="enu",
                    preferences=None, notes="", positions=((0, 0, 0), (3, 4, 0))):
    settings = settings or CheckSettings(mode="pointing_and_roll", body_axis=(0, 0, 1), position_tolerance_mm=2.0)
    setup = setup if setup is not None else AdjustmentSetup(uncertainty_deg=0.05)
    where = [None if p is None else Position.from_shown(p, "mm") for p in positions]
    mounts = (Mount("Nominal bracket", nominal, notes=notes, position=where[0]),
              Mount("Measured bracket", measured, position=where[1]))
    return Session(mounts=mounts, reference_frame=frame, preferences=preferences or Preferences(),
                   checks=(SavedCheck("Nominal bracket", "Measured bracket", settings, "Bracket check", setup),))


def bracket_record(session=None, **kwargs):
    return records.check_record(session or bracket_session(), "Bracket check", "bracket.fwsession.json", "0" * 64,
                                **kwargs)


def figures_of(items):
    return {i.key: i for i in items if isinstance(i, records.Figure)}


def check_section(record):
    return record.sections[0]


def test_the_check_names_its_check_and_both_mounts_under_their_labels():
    figures = figures_of(check_section(bracket_record()).items)
    assert (figures["check[0].name"].label, figures["check[0].name"].values) == ("Check", ("Bracket check",))
    assert (figures["check[0].nominal"].label, figures["check[0].nominal"].values) == \
        ("Nominal mount", ("Nominal bracket",))
    assert (figures["check[0].measured"].label, figures["check[0].measured"].values) == \
        ("Measured mount", ("Measured bracket",))


def test_a_body_axis_given_as_numbers_is_printed_in_the_judged_by_line():
    figure = figures_of(check_section(bracket_record()).items)["check[0].judged"]
    assert figure.label == "Judged by"
    assert figure.values == ("the pointing error of body axis (0, 0, 1) and the roll about it",)


def test_a_named_body_axis_and_the_total_mode_are_said_in_words():
    named = bracket_session(CheckSettings(mode="pointing_and_roll", body_axis="+X"))
    figure = figures_of(check_section(bracket_record(named)).items)["check[0].judged"]
    assert (figure.label, figure.values) == ("Judged by", ("the pointing error of body axis +X and the roll about it",))
    total = bracket_session(CheckSettings(mode="total"))
    figure = figures_of(check_section(bracket_record(total)).items)["check[0].judged"]
    assert (figure.label, figure.values) == ("Judged by", ("the total deviation",))


def test_the_deviation_axis_is_labelled_and_agrees_with_scipy():
    figures = figures_of(check_section(bracket_record()).items)
    axis = figures["check[0].deviation_axis"]
    assert axis.label == "Axis of D (x, y, z), in nominal body axes" and axis.unit == "unit vector"
    # SciPy's Rotation: D = Nᵀ M; its rotation vector's direction is the axis (here -Y: M turns 1° about -Y)
    d = Rotation.from_quat(NOMINAL.as_quaternion(), scalar_first=True).inv() * \
        Rotation.from_quat(MEASURED.as_quaternion(), scalar_first=True)
    rotvec = d.as_rotvec()
    assert [float(v) for v in axis.values] == pytest.approx(rotvec / abs(rotvec).max(), abs=1e-9)
    assert axis.values == ("0", "-1", "0")


def test_no_deviation_prints_no_deviation_axis():
    same = bracket_session(measured=NOMINAL)
    assert "check[0].deviation_axis" not in figures_of(check_section(bracket_record(same)).items)


def test_the_uncertainty_lines_carry_their_labels_and_numbers():
    figures = figures_of(check_section(bracket_record()).items)
    coverage = figures["check[0].coverage"]
    assert (coverage.label, coverage.values, coverage.unit) == ("Coverage factor k", ("2",), "dimensionless")
    # worked by hand: U = k·u = 2 × 0.05° = 0.1°
    expanded = figures["check[0].expanded_uncertainty"]
    assert (expanded.label, expanded.values, expanded.unit) == ("Expanded uncertainty U = k·u", ("0.1",), "deg")


def _position_verdict(tolerance_mm):
    settings = CheckSettings(mode="pointing_and_roll", body_axis=(0, 0, 1), position_tolerance_mm=tolerance_mm)
    return figures_of(check_section(bracket_record(bracket_session(settings))).items)


@pytest.mark.parametrize("tolerance, verdict", [(4.999, "FAIL"), (5.001, "PASS"), (2.0, "FAIL"), (7.5, "PASS")])
def test_the_position_is_judged_against_its_tolerance_on_both_sides(tolerance, verdict):
    figures = _position_verdict(tolerance)
    # worked by hand: the origin moved (3, 4, 0) mm, so 5 mm (a 3-4-5 triangle)
    assert figures["check[0].position_offset"].values == ("5",)
    line = figures["check[0].position_verdict"]
    assert line.label == f"Position against {tolerance:g} mm"
    assert line.values == (verdict,)


def test_without_a_position_tolerance_the_offset_is_printed_but_not_judged():
    settings = CheckSettings(mode="pointing_and_roll", body_axis=(0, 0, 1))
    figures = figures_of(check_section(bracket_record(bracket_session(settings))).items)
    assert figures["check[0].position_offset_axes"].values == ("3", "4", "0")    # N is the identity (by hand)
    assert "check[0].position_verdict" not in figures


def test_the_check_section_carries_the_picture_of_the_measured_part_over_the_nominal():
    section = check_section(bracket_record())
    assert section.title == "Check “Bracket check”: FAIL"      # 1° pointing error against 0.5° (by hand)
    picture = section.picture
    assert picture is not None
    assert picture.orientation.angle_to(MEASURED) < 1e-12 and picture.ghost.angle_to(NOMINAL) < 1e-12
    assert picture.ghost_label == "nominal, Nominal bracket"


def test_the_mount_sections_name_their_mount_by_role():
    record = bracket_record()
    nominal, measured = record.sections[1], record.sections[2]
    assert (nominal.title, measured.title) == ("Nominal", "Measured")
    assert (nominal.items[0].label, nominal.items[0].values) == ("Nominal mount", ("Nominal bracket",))
    assert (measured.items[0].label, measured.items[0].values) == ("Measured mount", ("Measured bracket",))


def test_a_session_record_names_each_mount_plainly():
    whole = records.session_record(bracket_session(), "bracket.fwsession.json", "0" * 64)
    assert [s.title for s in whole.sections[:2]] == ["Mount 1: Nominal bracket", "Mount 2: Measured bracket"]
    assert (whole.sections[0].items[0].label, whole.sections[0].items[0].values) == ("Mount", ("Nominal bracket",))


def test_a_check_without_a_covariance_or_uncertainty_says_there_is_no_guard_band():
    plain = bracket_session(setup=AdjustmentSetup())
    items = check_section(bracket_record(plain)).items
    assert "check[0].coverage" not in figures_of(items)
    assert any(isinstance(i, str) and i.startswith("No measurement uncertainty was given") for i in items)
