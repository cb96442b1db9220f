"""The correction part of a check's record (core/inspection_record.py) item by item: the correction's
figures and their values, the adjustment table's title, row labels and grouping, and the shims table with
its pivot anywhere on the footprint. Built in-process from the small invented bracket session. Check values:
SciPy's Rotation for the correction (C = M⁻¹ N in body axes, N M⁻¹ in reference axes); worked by hand where
named; labels and lines are the record's own words."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.adjustment_setup import AdjustmentSetup
from core.orientation import Orientation
from tests.core.test_inspection_record_check_words import FEET, bracket_record, bracket_session

# Invented: the nominal is a quarter turn about reference Z, the part measured 3° about a tilted axis from it.
NOMINAL = Orientation.from_axis_angle([0, 0, 1], 90.0)
MEASURED = NOMINAL @ Orientation.from_axis_angle([1, 2, 2], 3.0)


def _scipy(o):
    return Rotation.from_quat(o.as_quaternion(), scalar_first=True)


def _items(setup=None, shown=records.ReportUnits()):
    session = bracket_session(nominal=NOMINAL, measured=MEASURED, setup=setup or AdjustmentSetup())
    items = list(bracket_record(session, shown=shown).sections[0].items)
    start = items.index("Correction C (turns the part from measured to nominal: M · C = N in body axes).")
    return items[start:]


def _figures(items):
    return {i.key: i for i in items if isinstance(i, records.Figure)}


def _numbers(figure):
    return [float(v) for v in figure.values]


def test_the_correction_figures_agree_with_scipy():
    figures = _figures(_items())
    body = _scipy(MEASURED).inv() * _scipy(NOMINAL)          # SciPy's Rotation: C in body axes
    reference = _scipy(NOMINAL) * _scipy(MEASURED).inv()      # and in reference axes
    rotvec = body.as_rotvec(degrees=True)
    angle = float(np.linalg.norm(rotvec))
    assert _numbers(figures["check[0].correction_angle"]) == pytest.approx([angle], abs=1e-7)
    assert angle == pytest.approx(3.0)                        # by construction
    assert _numbers(figures["check[0].correction_axis_body"]) == pytest.approx(rotvec / angle, abs=1e-8)
    ref = reference.as_rotvec(degrees=True)
    assert _numbers(figures["check[0].correction_axis_reference"]) == pytest.approx(ref / angle, abs=1e-8)
    # small turns: the rotation vector's parts in body axes, to first order (common practice); the record
    # prints them exactly as the body rotation vector for a single turn
    assert _numbers(figures["check[0].correction_small_turns"]) == pytest.approx(rotvec, abs=1e-3)
    assert figures["check[0].correction_small_turns"].unit == "deg"


def test_the_correction_angle_follows_the_records_unit():
    figures = _figures(_items(shown=records.ReportUnits(angle="arcmin")))
    # worked by hand: 3° = 180′
    assert (figures["check[0].correction_angle"].values, figures["check[0].correction_angle"].unit) == \
        (("180",), "arcmin")


def test_the_adjustment_table_names_each_axis_in_turn_order():
    items = _items(AdjustmentSetup(axes="+X; +Y; +Z"))
    table = next(i for i in items if isinstance(i, records.Table))
    assert table.title == "Adjustment angles about the mount's body axes, in the order they are turned"
    assert table.columns == ("axis", "angle")
    assert [(r.key, r.label, r.unit) for r in table.rows] == [
        ("check[0].adjustment[0]", "1. about (1, 0, 0)", "deg"),
        ("check[0].adjustment[1]", "2. about (0, 1, 0)", "deg"),
        ("check[0].adjustment[2]", "3. about (0, 0, 1)", "deg")]
    # SciPy's Rotation: turning about body X, then Y, then Z is the intrinsic XYZ sequence of C
    body = _scipy(MEASURED).inv() * _scipy(NOMINAL)
    assert [float(r.values[0]) for r in table.rows] == pytest.approx(body.as_euler("XYZ", degrees=True), abs=1e-7)
    assert items[items.index(table) + 1] == "These reach the correction exactly."


def test_the_adjustment_angles_are_printed_as_one_group():
    # Invented: a correction of 1° about body X only; the zero turns print as 0, not as noise
    session = bracket_session(measured=Orientation.from_axis_angle([1, 0, 0], -1.0),
                              setup=AdjustmentSetup(axes="+X; +Y; +Z"))
    items = bracket_record(session).sections[0].items
    table = next(i for i in items if isinstance(i, records.Table) and i.title.startswith("Adjustment"))
    assert [r.values for r in table.rows] == [("1",), ("0",), ("0",)]


def test_a_slanted_axis_is_printed_as_given():
    items = _items(AdjustmentSetup(axes="0.6 0 0.8; +Y; +X", axes_frame="reference"))
    table = next(i for i in items if isinstance(i, records.Table))
    assert table.title == "Adjustment angles about the mount's reference axes, in the order they are turned"
    assert [r.label for r in table.rows] == ["1. about (0.6, 0, 0.8)", "2. about (0, 1, 0)", "3. about (1, 0, 0)"]


@pytest.mark.parametrize("pivot", [0, 2, 3])
def test_the_pivot_foot_is_marked_wherever_it_is(pivot):
    items = _items(AdjustmentSetup(footprint=FEET, pivot=pivot))
    table = next(i for i in items if isinstance(i, records.Table) and i.title.startswith("Shims"))
    marked = [i for i, r in enumerate(table.rows) if r.label.endswith(" (the pivot)")]
    assert marked == [pivot]
    assert [r.key for r in table.rows] == [f"check[0].shim[{i}]" for i in range(4)]


def test_shims_and_turns_are_printed_each_as_their_own_group():
    items = _items(AdjustmentSetup(footprint=FEET, pitch_mm=0.25))
    table = next(i for i in items if isinstance(i, records.Table) and i.title.startswith("Shims"))
    for row in table.rows:
        shim, turns = (float(v) for v in row.values)
        # worked by hand: turns of a 0.25 mm pitch screw = thickness / 0.25
        assert turns == pytest.approx(shim / 0.25, abs=1e-6)
    # the items after the table: the tilt, then the twist
    after = items[items.index(table) + 1:]
    assert [(f.key, f.unit) for f in after] == [("check[0].shim_tilt", "deg"), ("check[0].shim_twist", "deg")]
