"""Angle units on the command line: --tolerance and --uncertainty with their unit marks, --units for what
is printed, and the JSON carrying degrees beside the chosen unit. Deviations checked against SciPy's
Rotation (the magnitude of the relative rotation)."""

import io
import json
import math

import pytest
from scipy.spatial.transform import Rotation

from app import cli

NOMINAL = "yaw 30, pitch 20, roll 10"
MEASURED = "yaw 30.02, pitch 20, roll 10"


def _run(*argv):
    out, err = io.StringIO(), io.StringIO()
    status = cli.main(list(argv), stdin=io.StringIO(""), stdout=out, stderr=err)
    return status, out.getvalue(), err.getvalue()


def _scipy_deviation_deg():
    # SciPy: the angle of Nᵀ M for intrinsic Z-Y'-X'' (SciPy's "ZYX" upper case = intrinsic)
    n = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True)
    m = Rotation.from_euler("ZYX", [30.02, 20, 10], degrees=True)
    return math.degrees((n.inv() * m).magnitude())


def test_a_tolerance_in_milliradians_decides_as_the_same_tolerance_in_degrees():
    deviation = _scipy_deviation_deg()                     # 0.02° = 0.349 mrad
    inside, outside = "0.5mrad", "0.3 mrad"                # 0.5 mrad = 0.0286°, 0.3 mrad = 0.0172°
    assert _run("compare", NOMINAL, MEASURED, "--tolerance", inside)[0] == 0
    assert _run("compare", NOMINAL, MEASURED, "--tolerance", outside)[0] == 1
    status, out, _ = _run("compare", NOMINAL, MEASURED, "--tolerance", inside, "--units", "mrad", "--json")
    data = json.loads(out)
    assert data["deviation_deg"] == pytest.approx(deviation, rel=1e-9)
    assert data["tolerance_deg"] == pytest.approx(0.5e-3 * 180 / math.pi, rel=1e-12)   # SI: 1 mrad = 1e-3 rad
    assert data["units"] == "mrad"
    assert data["in_units"]["deviation"] == pytest.approx(math.radians(deviation) * 1e3, rel=1e-9)
    assert data["in_units"]["tolerance"] == pytest.approx(0.5, rel=1e-12)
    assert data["tolerance_given"]["unit"] == "mrad" and "0.5mrad" in data["tolerance_given"]["read_as"]


@pytest.mark.parametrize("unit, per_degree, mark", [
    ("mrad", 1e3 * math.pi / 180, "mrad"), ("arcmin", 60.0, "′"), ("arcsec", 3600.0, "″"),
    ("gon", 10 / 9, "gon"), ("mil", 6400 / 360, "mil"), ("rad", math.pi / 180, "rad"),
])
def test_the_printed_deviation_is_in_the_unit_asked_for(unit, per_degree, mark):
    # per_degree from the definitions (SI Brochure Table 4; 400 gon and 6400 NATO mils to a turn)
    status, out, _ = _run("compare", NOMINAL, MEASURED, "--units", unit)
    assert status == 0
    first = out.splitlines()[0]
    assert first.startswith("deviation: ") and mark in first
    number = float(first.split()[1].rstrip("′″").replace("\u2212", "-"))
    assert number == pytest.approx(_scipy_deviation_deg() * per_degree, rel=1e-3)


def test_degrees_minutes_seconds_are_printed_and_read():
    status, out, _ = _run("compare", NOMINAL, MEASURED, "--tolerance", "1′30″", "--units", "dms")
    assert status == 0
    assert "deviation: 0° 1′ 12.0″" in out                 # 0.02° = 72″ (hand-worked)
    assert "within tolerance 0° 1′ 30.0″" in out


def test_the_degrees_output_is_unchanged_without_units():
    status, out, _ = _run("compare", NOMINAL, MEASURED, "--tolerance", "0.05")
    assert status == 0 and out.startswith("deviation: 0.02") and " deg " in out.splitlines()[0]
    assert "within tolerance 0.05 deg" in out


@pytest.mark.parametrize("tolerance, says", [
    ("1° 2gon", "mixes"), ("0.5 mm", "not an angle unit"), ("nan", "not a finite"), ("1,5", "decimal comma"),
    ("1′ 2′", "twice"), ("x" * 500, "characters"),
])
def test_bad_tolerance_text_is_refused_with_exit_2_and_one_line(tolerance, says):
    status, out, err = _run("compare", NOMINAL, MEASURED, "--tolerance", tolerance)
    assert status == 2 and out == ""
    assert len(err.strip().splitlines()) == 1 and says in err and "--tolerance" in err


def test_an_unknown_unit_is_a_usage_error():
    status, out, err = _run("compare", NOMINAL, MEASURED, "--units", "furlong")
    assert status == 2 and out == "" and "--units" in err


def test_an_uncertainty_with_its_unit_decides_by_iso_14253(tmp_path):
    # deviation 72″, tolerance 90″, u = 10″, k = 2: 72 + 20 > 90, so the measurement cannot decide (exit 4)
    status, out, _ = _run("compare", NOMINAL, MEASURED, "--tolerance", "90″", "--uncertainty", "10″")
    assert status == 4 and "cannot decide" in out
    status, _, _ = _run("compare", NOMINAL, MEASURED, "--tolerance", "90″", "--uncertainty", "5″")
    assert status == 0                                     # 72 + 10 ≤ 90: conforms


def test_batch_takes_a_tolerance_with_its_unit_and_prints_the_table_in_it(tmp_path):
    path = tmp_path / "mounts.csv"
    path.write_text("name,nominal_yaw,nominal_pitch,nominal_roll,measured_yaw,measured_pitch,measured_roll\n"
                    "cam,30,20,10,30.02,20,10\n"
                    "imu,0,0,0,0,0,0.1\n", encoding="utf-8")
    status, out, _ = _run("batch", str(path), "--tolerance", "1 mrad", "--units", "mrad")
    assert status == 1                                     # 0.1° = 1.745 mrad > 1 mrad
    lines = out.splitlines()
    assert "deviation (mrad)" in lines[0] and "margin (mrad)" in lines[0]
    cam = float(lines[1].split()[1])
    assert cam == pytest.approx(math.radians(_scipy_deviation_deg()) * 1e3, abs=1e-4)
    imu = float(lines[2].split()[1])
    assert imu == pytest.approx(math.radians(0.1) * 1e3, abs=1e-4)
    assert "outside the tolerance of 1 mrad" in out


def test_a_report_in_arcseconds_and_mm_per_metre_verifies_and_an_edited_unit_does_not(tmp_path):
    import re

    from core.record_files import read_report
    from tests.cli.test_cli import ROOT, framewright

    session = ROOT / "resources" / "demo_check.fwsession.json"
    out = tmp_path / "record.html"
    result = framewright("report", str(session), "--check", "Radar antenna after remount", "--units", "arcsec",
                         "--slope-units", "mm/m", "-o", str(out))
    assert result.returncode == 0, result.stderr
    data, _, _ = read_report(str(out))
    assert data["units"] == {"angle": "arcsec", "slope": "mm/m"}
    assert any(f["unit"] == "arcsec" for f in data["figures"]) and any(f["unit"] == "mm/m" for f in data["figures"])
    assert framewright("verify-report", str(out), str(session)).returncode == 0
    # The same numbers claimed to be degrees: the record's hash no longer matches, so it is refused.
    html = out.read_text(encoding="utf-8")
    edited = tmp_path / "edited.html"
    edited.write_text(re.sub(r'"angle":\s*"arcsec"', '"angle":"deg"', html, count=1), encoding="utf-8")
    assert framewright("verify-report", str(edited), str(session)).returncode == 1
    assert framewright("report", str(session), "--units", "dms", "-o", str(tmp_path / "x.pdf")).returncode == 2


# ---- lengths: framewright correct --lengths -------------------------------------------------------
def _feet(tmp_path, scale, name):
    # a plate 200 mm tall (z ±100) on four feet at x = −300 mm: a turn about body Y lifts one edge
    feet = ((-300, 40, 100), (-300, -40, 100), (-300, -40, -100), (-300, 40, -100))
    path = tmp_path / name
    path.write_text("\n".join(" ".join(f"{v * scale:.12g}" for v in foot) for foot in feet) + "\n")
    return str(path)


@pytest.mark.parametrize("lengths, per_mm, decimals", [("in", 1 / 25.4, 5), ("thou", 1000 / 25.4, 2)])
def test_correct_reads_the_feet_and_pitch_and_prints_the_shims_in_the_lengths_chosen(tmp_path, lengths,
                                                                                     per_mm, decimals):
    # hand-worked: 0.5° about body Y over the 200 mm tall face lifts the far feet by 200 mm · sin 0.5°;
    # the inch is exactly 25.4 mm (1959), the thou a thousandth of it (common practice)
    lift_mm = 200 * math.sin(math.radians(0.5))
    feet = _feet(tmp_path, per_mm, f"feet-{lengths}.txt")
    pitch = 1.27 * per_mm                                        # 20 threads per inch
    args = ("correct", "yaw 0, pitch 0, roll 0", "yaw 0, pitch 0.5, roll 0", "--degrees",
            "--footprint", feet, "--pitch", f"{pitch:.12g}", "--lengths", lengths)
    status, out, err = _run(*args)
    assert status == 0 and err == ""
    assert f"foot 1 the pivot), {lengths}:" in out
    assert f": {lift_mm * per_mm:.{decimals}f}   {lift_mm / 1.27:.3f} turns" in out
    status, out, err = _run(*args, "--json")
    shims = json.loads(out)["shims"]
    assert shims["length_unit"] == lengths and shims["pitch_mm"] == pytest.approx(1.27, rel=1e-11)
    assert max(shims["shims_mm"]) == pytest.approx(lift_mm, rel=1e-9)      # the JSON keeps millimetres


def test_correct_refuses_a_length_unit_it_does_not_know(tmp_path):
    status, out, err = _run("correct", "yaw 0, pitch 0, roll 0", "yaw 0, pitch 0.5, roll 0", "--lengths", "mil")
    assert status == 2 and out == "" and "--lengths" in err and len(err.strip().splitlines()) == 1
