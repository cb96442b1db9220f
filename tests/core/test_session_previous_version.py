"""A session file written by the previous version of the program (before chains and checks became typed
fields of Session, when they were kept as read among its unknown keys) opens to the same values and saves back to the same JSON.

The fixture was written by that version: the invented demo check session with a chain of four steps (a
position, an inverted step, a disabled step, an unnamed step), an empty chain, two checks (one with an
adjustment set-up), a mount with a position, a mount with two repeated measurements and a top-level key
this program does not know. The expected values are read from the file with the json module alone, so
they do not depend on the session code under test.
"""

import json
from pathlib import Path

from core.session import load_session, save_session

FIXTURE = Path(__file__).parent / "fixtures" / "previous_version.fwsession.json"


def _raw():
    return json.loads(FIXTURE.read_text(encoding="utf-8"))


def _quaternion(orientation):
    return [float(v) for v in orientation.as_quaternion()]


def test_the_previous_versions_file_opens_to_the_values_it_holds():
    raw = _raw()
    session = load_session(FIXTURE)
    assert session.description == raw["description"]
    assert session.reference_frame == raw["reference_frame"] == "ned"
    assert session.selected == raw["selected"] == 1
    assert session.preferences.to_dict() == raw["preferences"]
    assert len(session.mounts) == len(raw["mounts"]) == 6
    for mount, stored in zip(session.mounts, raw["mounts"]):
        assert mount.name == stored["name"] and mount.notes == stored["notes"]
        assert _quaternion(mount.orientation) == stored["orientation"]["quaternion_wxyz"]   # exact
        assert list(mount.part.box_size_mm) == stored["part"]["box_size_mm"]
        assert dict(mount.part.face_names) == stored["part"]["face_names"]
        assert mount.part.boresight == stored["part"]["boresight"]
        if "position" in stored:
            assert list(mount.position.metres) == stored["position"]["metres"]
            assert mount.position.unit == stored["position"]["unit"]
        else:
            assert mount.position is None
        kept = stored.get("measurements", [])
        assert len(mount.measurements) == len(kept)
        for measurement, entry in zip(mount.measurements, kept):
            assert _quaternion(measurement.orientation) == entry["orientation"]["quaternion_wxyz"]
            assert (measurement.weight, measurement.source) == (entry["weight"], entry["source"])
    assert sum(m.position is not None for m in session.mounts) == 1
    assert sum(len(m.measurements) for m in session.mounts) == 2

    chains = session.chains
    assert [c.name for c in chains] == [c["name"] for c in raw["chains"]] == ["mast to antenna", "empty chain"]
    for chain, stored in zip(chains, raw["chains"]):
        assert len(chain.steps) == len(stored["steps"])
        for step, entry in zip(chain.steps, stored["steps"]):
            assert step.name == entry["name"]
            assert [float(v) for v in step.orientation.quaternion] == entry["orientation"]["quaternion_wxyz"]
            assert (step.inverted, step.enabled) == (entry["inverted"], entry["enabled"])
            assert (step.position is None) == ("position" not in entry)
            if step.position is not None:
                assert list(step.position.metres) == entry["position"]["metres"]
    checks = session.checks
    assert [c.name for c in checks] == [c["name"] for c in raw["checks"]]
    for check, stored in zip(checks, raw["checks"]):
        assert (check.nominal, check.measured) == (stored["nominal"], stored["measured"])
        assert check.settings.to_dict() == stored["settings"]
        if "adjustment" in stored:
            assert check.adjustment.to_dict() == stored["adjustment"]
    assert checks[1].measured is None
    assert session.extra["kept_by_a_newer_minor_revision"] == raw["kept_by_a_newer_minor_revision"]


def test_the_previous_versions_file_saves_back_to_the_same_json(tmp_path):
    again = tmp_path / "again.fwsession.json"
    save_session(load_session(FIXTURE), again)
    assert json.loads(again.read_text(encoding="utf-8")) == _raw()
    # and a second round trip changes nothing either
    third = tmp_path / "third.fwsession.json"
    save_session(load_session(again), third)
    assert third.read_bytes() == again.read_bytes()
