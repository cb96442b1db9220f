"""The correction part of a check's record (core/inspection_record.py): the correction C, the adjustment
angles (exact, or what remains when the axes cannot reach C) and the shims under the footprint, with
their labels, columns and units. Check values worked by hand (each named beside its check)."""

import math

import pytest

from core import inspection_record as records
from core.adjustment_setup import AdjustmentSetup
from core.orientation import Orientation
from tests.core.test_inspection_record_check_words import FEET, bracket_record, bracket_session

# Invented: the correction the part needs is 2° about body +Z after 1° about body +Y, C = R_Z(2°) R_Y(1°);
# the measured orientation is then M = N C⁻¹ with N the identity (M · C = N).
CORRECTION = Orientation.from_axis_angle([0, 0, 1], 2.0) @ Orientation.from_axis_angle([0, 1, 0], 1.0)
TURNED = CORRECTION.inverse()
# worked by hand: the feet at x = -100 are 200 mm from those at x = +100 along body X; tilting 1° about
# body Y lifts them by 200·sin(1°) against the face normal -Z
SHIM = 200.0 * math.sin(math.radians(1.0))


def _correction_items(setup, measured=TURNED, shown=records.ReportUnits()):
    items = bracket_record(bracket_session(setup=setup, measured=measured), shown=shown).sections[0].items
    start = next(i for i, item in enumerate(items) if isinstance(item, str) and item.startswith("Correction C"))
    return items[start:]


def _figures(items):
    return {i.key: i for i in items if isinstance(i, records.Figure)}


def _table(items, starts):
    return next(i for i in items if isinstance(i, records.Table) and i.title.startswith(starts))


def test_the_correction_is_introduced_and_its_body_axis_labelled():
    items = _correction_items(AdjustmentSetup(), measured=Orientation.from_axis_angle([0, 1, 0], -1.0))
    assert items[0] == "Correction C (turns the part from measured to nominal: M · C = N in body axes)."
    axis = _figures(items)["check[0].correction_axis_body"]
    # worked by hand: measured 1° about -Y from the nominal, so C turns 1° about +Y
    assert (axis.label, axis.values, axis.unit) == ("Correction axis (x, y, z), in body axes", ("0", "1", "0"),
                                                    "unit vector")


def test_no_correction_is_said_in_words():
    items = _correction_items(AdjustmentSetup(), measured=Orientation.identity())
    assert items[:2] == ("Correction C (turns the part from measured to nominal: M · C = N in body axes).",
                         "No correction needed: the measured orientation is the nominal.")


def test_axes_that_reach_the_correction_say_so_and_print_no_residual():
    items = _correction_items(AdjustmentSetup(axes="+Z; +Y"))
    rows = _table(items, "Adjustment angles").rows
    assert [r.values for r in rows] == [("2",), ("1",)]          # by construction: R_Z(2°) then R_Y(1°)
    assert "These reach the correction exactly." in items
    assert "check[0].adjustment_residual" not in _figures(items)


def test_axes_that_cannot_reach_the_correction_print_what_remains_in_the_records_unit():
    # worked by hand: C = R_Y(1°) against R_Z(a) R_X(b); with s, c = sin, cos 0.5° the quaternions' dot
    # product is c·cos(a/2)cos(b/2) + s·sin(a/2)sin(b/2) <= c, largest at a = b = 0: 1° remains, 3600″
    measured = Orientation.from_axis_angle([0, 1, 0], -1.0)
    for shown, value, unit in ((records.ReportUnits(), 1.0, "deg"), (records.ReportUnits("arcsec"), 3600.0, "arcsec")):
        items = _correction_items(AdjustmentSetup(axes="+Z; +X"), measured=measured, shown=shown)
        residual = _figures(items)["check[0].adjustment_residual"]
        assert residual.label == "These axes cannot reach the correction; what remains (least squares)"
        assert residual.unit == unit and float(residual.values[0]) == pytest.approx(value, rel=1e-9)
        assert "These reach the correction exactly." not in items


def test_the_shims_with_a_screw_pitch_print_thickness_and_turns():
    items = _correction_items(AdjustmentSetup(footprint=FEET, pitch_mm=0.5))
    table = _table(items, "Shims under the footprint")
    assert table.title == "Shims under the footprint (face normal (0, 0, -1), body axes)"
    assert table.columns == ("foot", "shim", "screw turns")
    assert [r.label for r in table.rows] == ["foot 1 at (100, 50, -40) mm (the pivot)", "foot 2 at (-100, 50, -40) mm",
                                             "foot 3 at (-100, -50, -40) mm", "foot 4 at (100, -50, -40) mm"]
    for row, shim in zip(table.rows, (0.0, SHIM, SHIM, 0.0)):
        assert row.unit == "mm; turns"
        # worked by hand: turns of a 0.5 mm pitch screw = thickness / 0.5
        assert [float(v) for v in row.values] == pytest.approx([shim, shim / 0.5], abs=1e-7)


def test_the_shims_without_a_pitch_print_thickness_only():
    table = _table(_correction_items(AdjustmentSetup(footprint=FEET)), "Shims under the footprint")
    assert table.columns == ("foot", "shim")
    assert all(r.unit == "mm" and len(r.values) == 1 for r in table.rows)
    assert [float(r.values[0]) for r in table.rows] == pytest.approx([0.0, SHIM, SHIM, 0.0], abs=1e-7)


def test_the_shims_tilt_and_the_twist_left_for_slotted_holes_are_labelled():
    figures = _figures(_correction_items(AdjustmentSetup(footprint=FEET, pitch_mm=0.5)))
    tilt, twist = figures["check[0].shim_tilt"], figures["check[0].shim_twist"]
    # worked by hand: C = R_Z(2°) R_Y(1°) is the twist R_Z(2°) about the face normal n = -Z (so -2°, right
    # hand about n) after the swing R_Y(1°), which the shims make
    assert (tilt.label, tilt.values, tilt.unit) == ("Tilt the shims make", ("1",), "deg")
    assert (twist.label, twist.values, twist.unit) == ("Turn about the face normal left for the slotted holes",
                                                       ("-2",), "deg")


def test_a_footprint_through_the_body_origin_is_said_not_to_be_worked_out():
    # feet in the plane z = 0 through the origin: which side is outward is not known, so no shims
    through_origin = ((100.0, 50.0, 0.0), (-100.0, 50.0, 0.0), (-100.0, -50.0, 0.0))
    items = _correction_items(AdjustmentSetup(footprint=through_origin))
    assert items[-1].startswith("The adjustment set up with this check cannot be worked out: footprint: ")
    assert "passes through the body origin" in items[-1]
    assert not any(isinstance(i, records.Table) and i.title.startswith("Shims") for i in items)
