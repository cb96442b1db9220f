"""A record printed in the units the trade states tolerances in: angles in arcseconds (or any decimal unit),
level readings as slopes in mm/m; the figures checked against SciPy's Rotation and the units'
definitions, and the hash of a record in degrees unchanged by the option."""

import math
from pathlib import Path

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.session import load_session, read_checks

ROOT = Path(__file__).resolve().parents[2]
SESSION = load_session(ROOT / "resources" / "demo_check.fwsession.json")
CHECK = "Radar antenna after remount"
ARCSEC_MM_M = records.ReportUnits("arcsec", "mm/m")


def _figures(record):
    return {f.key: f for f in record.figures()}


def _check(shown=records.ReportUnits()):
    return records.check_record(SESSION, CHECK, "demo_check.fwsession.json", "0" * 64, shown=shown)


def test_the_deviation_in_arcseconds_agrees_with_scipy():
    record = _figures(_check(ARCSEC_MM_M))
    index = [c.name for c in read_checks(SESSION)].index(CHECK)
    saved = read_checks(SESSION)[index]
    mounts = {m.name: m for m in SESSION.mounts}
    n = Rotation.from_quat(mounts[saved.nominal].orientation.as_quaternion(), scalar_first=True)
    m = Rotation.from_quat(mounts[saved.measured].orientation.as_quaternion(), scalar_first=True)
    # SciPy's Rotation: the angle of D = Nᵀ M, in arcseconds by the SI Brochure's 1° = 3600″
    expected = math.degrees((n.inv() * m).magnitude()) * 3600.0
    figure = record[f"check[{index}].total_deviation"]
    assert figure.unit == "arcsec"
    assert float(figure.values[0]) == pytest.approx(expected, rel=1e-6)


def test_every_angle_figure_is_its_degrees_figure_times_3600():
    in_degrees, in_seconds = _figures(_check()), _figures(_check(ARCSEC_MM_M))
    angle_keys = [k for k, f in in_degrees.items() if f.unit == "deg"]
    assert len(angle_keys) > 20
    for key in angle_keys:
        seconds = in_seconds[key]
        assert seconds.unit == "arcsec", key
        for deg, sec in zip(in_degrees[key].values, seconds.values):
            assert float(sec) == pytest.approx(float(deg) * 3600.0, rel=1e-6, abs=1e-6), key
    others = [k for k, f in in_degrees.items() if f.unit != "deg"]
    assert all(in_seconds[k].unit == in_degrees[k].unit for k in others)      # mm, unit vectors untouched


def test_level_slopes_in_mm_per_metre_agree_with_scipy():
    record = _check(ARCSEC_MM_M)
    slopes = {f.key: f for f in record.figures() if ".level_slope[" in f.key}
    assert len(slopes) == 6 * 2                                              # nominal and measured mounts
    mounts = {m.name: m for m in SESSION.mounts}
    saved = read_checks(SESSION)[[c.name for c in read_checks(SESSION)].index(CHECK)]
    measured = Rotation.from_quat(mounts[saved.measured].orientation.as_quaternion(), scalar_first=True)
    up = np.array([0.0, 0.0, -1.0]) if SESSION.reference_frame == "ned" else np.array([0.0, 0.0, 1.0])
    for face, body_normal in (("+X", [1, 0, 0]), ("-Z", [0, 0, -1]), ("+Y", [0, 1, 0])):
        normal = measured.apply(body_normal)              # SciPy: the face's outward normal in the reference
        from_up = math.degrees(math.acos(np.clip(normal @ up, -1, 1)))
        tilt = min(from_up, 180 - from_up)               # a face's plane from level (0..90)
        lean = 90 - tilt
        shown = tilt if tilt <= 45 else lean             # up/down faces from level, side faces from plumb
        expected = 1000.0 * math.tan(math.radians(shown))   # mm per metre = 1000 tan (hand-worked definition)
        figures = [f for k, f in slopes.items() if k.endswith(f"level_slope[{face}]")]
        assert len(figures) == 2 and all(f.unit == "mm/m" for f in figures)
        # one of the two is the measured mount's (the other the nominal's)
        assert any(float(f.values[0]) == pytest.approx(expected, rel=1e-6, abs=1e-6) for f in figures), face


def test_a_record_in_degrees_names_no_units_so_older_reports_keep_their_hash():
    plain = _check()
    assert "units" not in plain.numbers()
    assert _check(records.ReportUnits("deg", "deg")).sha256() == plain.sha256()
    chosen = _check(ARCSEC_MM_M)
    assert chosen.numbers()["units"] == {"angle": "arcsec", "slope": "mm/m"}
    assert chosen.sha256() != plain.sha256()
    assert records.ReportUnits.from_numbers(chosen.numbers()) == ARCSEC_MM_M
    assert records.ReportUnits.from_numbers(plain.numbers()) == records.ReportUnits()


def test_the_conventions_say_which_unit_the_angles_are_in():
    assert any("Angles are in arcseconds." in line for line in _check(ARCSEC_MM_M).conventions)
    assert any("Angles are in degrees." in line for line in _check().conventions)


@pytest.mark.parametrize("angle, slope, says", [
    ("dms", "deg", "decimal"), ("furlong", "deg", "unknown angle unit"), ("deg", "mm", "unknown slope unit"),
    (3600, "deg", "text"),
])
def test_bad_units_are_refused_by_name(angle, slope, says):
    with pytest.raises(records.RecordError, match=says):
        records.ReportUnits(angle, slope)


@pytest.mark.parametrize("numbers", [{"units": "arcsec"}, {"units": {"angle": "arcsec", "colour": "red"}},
                                     {"units": {"angle": "nonsense"}}])
def test_a_report_whose_units_cannot_be_read_is_refused(numbers):
    with pytest.raises(records.RecordError):
        records.ReportUnits.from_numbers(numbers)
