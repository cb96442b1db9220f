"""The adjustment setup a check keeps (axes, footprint, pivot, pitch, uncertainty): checked values and a
session file round trip; an older check without one still reads."""

from dataclasses import replace

import pytest

from core.adjustment_setup import AdjustmentSetup
from core.errors import FramewrightError
from core.session import SavedCheck, Session, load_session, save_session

FEET = ((100, 50, -20), (-100, 50, -20), (-100, -50, -20))


def test_a_check_with_an_adjustment_setup_saves_and_reads_back(tmp_path):
    setup = AdjustmentSetup(axes="+Z; 0.2 1 0", axes_frame="reference", footprint=FEET, pivot=2, pitch_mm=0.5,
                            uncertainty_deg=0.02, coverage=2.0)
    session = replace(Session.single(), checks=(SavedCheck("Mount 1", "Mount 1", adjustment=setup),))
    path = tmp_path / "s.fwsession.json"
    save_session(session, path)
    assert load_session(path).checks[0].adjustment == setup


def test_a_check_without_one_writes_no_key_and_reads_the_default():
    data = SavedCheck("a", "b").to_dict()
    assert "adjustment" not in data
    assert SavedCheck.from_dict(data).adjustment == AdjustmentSetup()


@pytest.mark.parametrize("fields, words", [
    ({"axes_frame": "world"}, "body or reference"), ({"footprint": ((1, 2),)}, "three numbers"),
    ({"footprint": ((1, 2, float("nan")),)}, "finite"), ({"footprint": FEET, "pivot": 3}, "pivot"),
    ({"pivot": True}, "pivot"), ({"pitch_mm": 0}, "pitch"), ({"uncertainty_deg": 200}, "uncertainty"),
    ({"coverage": 0}, "coverage"), ({"coverage": float("inf")}, "coverage"), ({"axes": "x" * 2000}, "1000")])
def test_bad_setups_are_refused_by_field(fields, words):
    with pytest.raises(FramewrightError, match=words):
        AdjustmentSetup(**fields)


def test_unknown_keys_in_a_file_are_refused():
    with pytest.raises(FramewrightError, match="unknown key"):
        AdjustmentSetup.from_dict({"axes": "", "shims": 1})


COVARIANCE = ((0.004, 0.001, 0.0), (0.001, 0.002, 0.0), (0.0, 0.0, 0.0001))       # invented, degrees²


def test_a_covariance_from_a_scatter_saves_and_reads_back_and_a_setup_without_one_writes_no_key(tmp_path):
    setup = AdjustmentSetup(uncertainty_deg=0.05, covariance_deg2=COVARIANCE)
    session = replace(Session.single(), checks=(SavedCheck("Mount 1", "Mount 1", adjustment=setup),))
    path = tmp_path / "s.fwsession.json"
    save_session(session, path)
    assert load_session(path).checks[0].adjustment == setup
    assert "covariance_deg2" not in AdjustmentSetup(uncertainty_deg=0.05).to_dict()


@pytest.mark.parametrize("covariance, words", [
    (((1, 0, 0), (0, 1, 0)), "3 rows of 3"), (((1, 0.5, 0), (0, 1, 0), (0, 0, 1)), "symmetric"),
    (((1, 0, 0), (0, -0.1, 0), (0, 0, 1)), "below zero"), (((1, 0, 0), (0, float("nan"), 0), (0, 0, 1)), "finite"),
    (((1, 2, 0), (2, 1, 0), (0, 0, 1)), "below zero"), ("lots", "3 rows of 3")])
def test_bad_covariances_are_refused(covariance, words):
    with pytest.raises(FramewrightError, match=words):
        AdjustmentSetup(uncertainty_deg=0.05, covariance_deg2=covariance)


def test_a_covariance_without_a_standard_uncertainty_is_refused():
    with pytest.raises(FramewrightError, match="only with a standard uncertainty"):
        AdjustmentSetup(covariance_deg2=COVARIANCE)
