"""The inspection record's content (core/inspection_record.py): numbers printed as typed, figures that
agree with SciPy's Rotation, a canonical JSON whose hash follows every figure, and refusals by name."""

import math
from dataclasses import replace
from pathlib import Path

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.formats import SAFETY_CAUTION
from core.orientation import Orientation
from core.session import load_session

ROOT = Path(__file__).resolve().parents[2]
SESSION = load_session(ROOT / "resources" / "demo_check.fwsession.json")
CHECK = "Radar antenna after remount"


def _figures(record):
    return {f.key: f for f in record.figures()}


def test_a_typed_angle_prints_as_typed_and_noise_prints_as_zero():
    # -30.4 typed, through the quaternion and back, is -30.39999999999999 or so (common practice).
    back = Orientation.from_angles("ZYX", [-30.4, 5.0, 2.5]).as_angles("ZYX").angles
    assert records.printed_numbers(back, 9) == ("-30.4", "5", "2.5")
    assert records.printed_numbers([0.7071067811865476, -2e-17, 0.0], 9) == ("0.707106781", "0", "0")
    with pytest.raises(records.RecordError):
        records.printed_numbers([math.nan], 9)


def test_digits_follow_the_session_preference():
    assert records.printed_numbers([math.pi], 4) == ("3.142",)
    assert records.printed_numbers([math.pi, 100.0], 4) == ("3.1", "100")


def test_check_figures_agree_with_scipy():
    record = records.check_record(SESSION, CHECK, "demo_check.fwsession.json", "0" * 64)
    figures = _figures(record)
    mounts = {m.name: m for m in SESSION.mounts}
    saved = SESSION.checks[0]
    n = Rotation.from_quat(mounts[saved.nominal].orientation.as_quaternion(), scalar_first=True)
    m = Rotation.from_quat(mounts[saved.measured].orientation.as_quaternion(), scalar_first=True)
    # SciPy's Rotation: the deviation D = N^T M, its angle; the pointing error of +X (angle between N x, M x)
    total = math.degrees((n.inv() * m).magnitude())
    x_n, x_m = n.apply([1, 0, 0]), m.apply([1, 0, 0])
    pointing = math.degrees(math.acos(max(-1.0, min(1.0, float(x_n @ x_m)))))
    digits = SESSION.preferences.significant_digits
    assert figures["check[0].total_deviation"].values == records.printed_numbers([total], digits)
    assert figures["check[0].pointing_error"].values == records.printed_numbers([pointing], digits)
    assert figures["check[0].verdict"].values == ("FAIL",)        # 3° against 1° (the invented measurement)
    assert figures["check[0].decision"].values == ("does not conform",)
    assert figures["check[0].total_deviation"].unit == "deg"
    numeric = [f for f in record.figures() if all(_is_number(v) for v in f.values)]
    assert len(numeric) > 40 and all(f.unit for f in numeric), "every number carries a unit"


def _is_number(text):
    try:
        float(text)
        return True
    except ValueError:
        return False


def test_the_hash_follows_every_figure_and_first_difference_names_it():
    record = records.check_record(SESSION, CHECK, "a", "0" * 64)
    again = records.check_record(SESSION, CHECK, "b", "0" * 64)
    assert record.canonical_json() == again.canonical_json() and record.sha256() == again.sha256()
    saved = SESSION.checks[0]
    looser = replace(saved, settings=replace(saved.settings, pointing_tolerance_deg=3.5))
    other = records.check_record(replace(SESSION, chains=(), checks=(looser,)), CHECK, "a", "0" * 64)
    assert other.sha256() != record.sha256()
    difference = records.first_difference(record.numbers()["figures"], other.numbers()["figures"])
    assert difference.startswith("check[0].criterion[0]")
    assert records.first_difference(record.numbers()["figures"], again.numbers()["figures"]) is None


def test_unknown_and_incomplete_checks_are_refused_by_name():
    with pytest.raises(records.RecordError, match="no check named 'nope'.*Radar antenna after remount"):
        records.check_record(SESSION, "nope", "a", "0" * 64)
    saved = replace(SESSION.checks[0], measured=None)
    with pytest.raises(records.RecordError, match="no measured mount"):
        records.check_record(replace(SESSION, chains=(), checks=(saved,)), CHECK, "a", "0" * 64)
    whole = records.session_record(replace(SESSION, chains=(), checks=(saved,)), "a", "0" * 64)
    assert whole.sections[-1].title.endswith("not judged")


def test_the_caution_is_the_one_the_about_box_and_readme_carry():
    assert SAFETY_CAUTION[1:] in records.CAUTION
    readme = (ROOT / "README.md").read_text()
    assert "verify every value against the governing drawing" in readme.lower() or SAFETY_CAUTION[:20] in readme.lower()


def test_a_check_with_a_covariance_prints_each_figures_propagated_uncertainty():
    """The demo check with an invented covariance about the measured boresight only (0.04° standard
    deviation): the record prints the pointing error's uncertainty 0 and the roll's 0.04°, as
    core/uncertainty.py propagates them (its Monte Carlo tests); without one, no such line."""
    from core.adjustment_setup import AdjustmentSetup
    mounts = {m.name: m for m in SESSION.mounts}
    saved = SESSION.checks[0]
    boresight = mounts[saved.measured].orientation.apply([1.0, 0, 0])
    covariance = tuple(tuple(float(v) for v in row) for row in 0.04 ** 2 * np.outer(boresight, boresight))
    setup = AdjustmentSetup(uncertainty_deg=0.04, covariance_deg2=covariance)
    session = replace(SESSION, checks=(replace(saved, adjustment=setup),))
    figures = _figures(records.check_record(session, CHECK, "demo_check.fwsession.json", "0" * 64))
    line = figures["check[0].figure_uncertainties"]
    assert [float(v) for v in line.values] == pytest.approx([0.0, 0.04], abs=1e-9) and line.unit == "deg"
    assert "pointing error, roll" in line.label
    assert "check[0].figure_uncertainties" not in _figures(
        records.check_record(SESSION, CHECK, "demo_check.fwsession.json", "0" * 64))
