"""Session file: round trip, atomic save, and clear messages for damaged or foreign files."""

import json
import os
import re
import sys
from pathlib import Path

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.chain import Chain
from core.errors import FramewrightError
from core.orientation import Orientation
from core.session import (FORMAT_NAME, FORMAT_VERSION, Mount, PartProperties, Preferences, Session,
                          SessionFileError, load_session, save_session, session_to_dict)

DEMO = Path(__file__).resolve().parents[2] / "resources" / "demo.fwsession.json"


def _session():
    mounts = (
        Mount("Bracket camera", Orientation.from_angles("ZYX", (30, -12, 4)),
              PartProperties((140, 90, 80), {"+X": "lens", "-X": "connector"}, "+X"), "free notes, ünïcode"),
        Mount("Level sensor", Orientation.from_quaternion((0.5, 0.5, 0.5, 0.5))),
    )
    prefs = Preferences(angle_units="rad", quaternion_order="xyzw", matrix_meaning="reference_to_body",
                        sequence="XYZ", intrinsic=False, significant_digits=12, amber_margin_deg=15.0,
                        red_margin_deg=2.0)
    return Session(mounts, selected=1, preferences=prefs, description="test rig",
                   chains=(Chain(),))


def test_save_then_load_gives_the_same_session_exactly(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    session = _session()
    save_session(session, path)
    loaded = load_session(path)
    assert loaded.selected == 1
    assert loaded.preferences == session.preferences
    assert loaded.description == "test rig"
    assert [m.name for m in loaded.mounts] == [m.name for m in session.mounts]
    for a, b in zip(loaded.mounts, session.mounts):
        assert a.orientation == b.orientation  # exact: JSON keeps every bit of a float (repr round trip)
        assert a.part == b.part
        assert a.notes == b.notes


def test_file_names_its_format_and_version_and_keeps_reserved_keys(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    data = json.loads(path.read_text(encoding="utf-8"))
    assert data["format"] == FORMAT_NAME and data["version"] == FORMAT_VERSION
    # the chains (a typed field, written with every key) survive a load/save round trip
    assert data["chains"] == [{"name": "chain", "steps": []}]
    save_session(load_session(path), path)
    assert json.loads(path.read_text(encoding="utf-8"))["chains"] == [{"name": "chain", "steps": []}]
    assert "checks" not in data                    # none: no key, as before chains and checks were typed


def test_save_is_atomic_old_file_survives_a_failed_rename(tmp_path, monkeypatch):
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    before = path.read_bytes()

    def broken_replace(src, dst):
        raise OSError("disk full (simulated)")

    monkeypatch.setattr(os, "replace", broken_replace)
    with pytest.raises(OSError):
        save_session(Session.single("other"), path)
    assert path.read_bytes() == before
    assert sorted(p.name for p in tmp_path.iterdir()) == ["rig.fwsession.json"]  # no temporary left behind


def test_save_writes_through_a_temporary_file_in_the_same_folder(tmp_path, monkeypatch):
    seen = {}
    real_replace = os.replace

    def spying_replace(src, dst):
        seen["src"], seen["dst"] = Path(src), Path(dst)
        real_replace(src, dst)

    monkeypatch.setattr(os, "replace", spying_replace)
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    assert seen["src"].parent == path.parent and seen["src"] != path and seen["dst"] == path


@pytest.mark.parametrize("content, words", [
    (b"", "empty"),
    (b'{"format": "framewright-session", "version": 1, "mounts": [', "damaged JSON at line 1"),
    (b"\xff\xfe\x00garbage", "not a text file"),
    (b'{"format": "other-program", "version": 3}', "not a Framewright session"),
    (b'[1, 2, 3]', "expected a JSON object"),
    (b'{"format": "framewright-session", "version": 99, "mounts": []}', "newer Framewright"),
    (b'{"format": "framewright-session", "mounts": []}', '"version" is missing'),
    (b'{"format": "framewright-session", "version": 1, "mounts": []}', "at least one mount"),
    (b'{"format": "framewright-session", "version": 1, "mounts": [{"name": "a", '
     b'"orientation": {"quaternion_wxyz": [1, 0, 0, 0.5]}}]}', "unit quaternion"),
    (b'{"format": "framewright-session", "version": 1, "mounts": [{"name": "a", '
     b'"orientation": {"quaternion_wxyz": [1, 0, 0]}}]}', "list of 4 numbers"),
    (b'{"format": "framewright-session", "version": 1, "mounts": [{"name": "a", '
     b'"orientation": {"quaternion_wxyz": [1, 0, 0, 0]}}], "selected": 4}', "selected"),
    (b'{"format": "framewright-session", "version": 1, "mounts": [{"name": "a", '
     b'"orientation": {"quaternion_wxyz": [1, 0, 0, 0]}}], "preferences": {"sequence": "ZZY"}}', "sequence"),
    (b'{"format": "framewright-session", "version": 1, "mounts": [{"name": "a", '
     b'"orientation": {"quaternion_wxyz": [1, 0, 0, 0]}, "part": {"boresight": "up"}}]}', "boresight"),
])
def test_damaged_or_foreign_files_get_a_message_naming_file_and_problem(tmp_path, content, words):
    path = tmp_path / "bad.fwsession.json"
    path.write_bytes(content)
    with pytest.raises(SessionFileError) as caught:
        load_session(path)
    message = str(caught.value)
    assert str(path) in message
    assert words in message


def test_missing_file_says_so(tmp_path):
    with pytest.raises(SessionFileError, match="cannot be read"):
        load_session(tmp_path / "nowhere.fwsession.json")


def test_session_needs_a_mount_and_a_valid_selection():
    with pytest.raises(FramewrightError):
        Session(mounts=())
    with pytest.raises(FramewrightError):
        Session(mounts=(Mount("a"),), selected=1)


def test_preferences_refuse_inconsistent_margin_thresholds():
    with pytest.raises(FramewrightError, match="thresholds"):
        Preferences(amber_margin_deg=1.0, red_margin_deg=5.0)


def test_demo_session_is_said_to_be_invented_and_its_notes_match_its_numbers():
    session = load_session(DEMO)
    assert "invented" in session.description.lower()
    assert len(session.mounts) >= 3
    for mount in session.mounts:
        # Each demo note states its yaw, pitch, roll (intrinsic Z-Y'-X''); check the stored quaternion
        # against SciPy's Rotation (uppercase 'ZYX' = intrinsic in SciPy's own convention).
        ypr = [float(v) for v in re.search(r"yaw, pitch, roll = ([-\d.]+), ([-\d.]+), ([-\d.]+)", mount.notes).groups()]
        x, y, z, w = Rotation.from_euler("ZYX", ypr, degrees=True).as_quat()
        expected = Orientation.from_quaternion((w, x, y, z))
        assert mount.orientation.isclose(expected, atol=1e-12)


def test_session_module_does_not_import_qt():
    import subprocess

    code = "import core.session, sys; print(any(m.startswith('PySide6') for m in sys.modules))"
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                            cwd=Path(__file__).resolve().parents[2])
    assert result.stdout.strip() == "False", result.stderr


def test_written_numbers_are_finite_json(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    q = json.loads(path.read_text())["mounts"][0]["orientation"]["quaternion_wxyz"]
    assert np.isclose(np.linalg.norm(q), 1.0, atol=1e-15)
    assert session_to_dict(load_session(path))["mounts"][0]["orientation"]["quaternion_wxyz"] == q


def test_reference_frame_name_is_saved_read_back_and_checked(tmp_path):
    import json

    from core.session import Mount, Session, SessionFileError, load_session, save_session
    session = Session(mounts=(Mount("A"),), reference_frame="ned")
    path = tmp_path / "frame.fwsession.json"
    save_session(session, path)
    assert load_session(path).reference_frame == "ned"
    data = json.loads(path.read_text())
    data["reference_frame"] = "north-east-up"
    path.write_text(json.dumps(data))
    with pytest.raises(SessionFileError, match="reference_frame"):
        load_session(path)
    # The invented demo's mast frame is x north, y east, z down: NED (common practice for the name).
    from pathlib import Path
    demo = Path(__file__).resolve().parents[2] / "resources" / "demo.fwsession.json"
    assert load_session(demo).reference_frame == "ned"


def test_an_orientation_with_a_second_representation_is_refused(tmp_path):
    import json

    from core.session import Mount, Session, SessionFileError, load_session, save_session
    path = tmp_path / "two.fwsession.json"
    save_session(Session(mounts=(Mount("A"),)), path)
    data = json.loads(path.read_text())
    data["mounts"][0]["orientation"]["matrix"] = [[1, 0, 0], [0, 1, 0], [0, 0, 1]]
    path.write_text(json.dumps(data))
    with pytest.raises(SessionFileError, match="only"):
        load_session(path)


def test_chains_and_checks_are_typed_fields_held_once():
    # One place for each value: a second copy among the kept keys could disagree with the field.
    with pytest.raises(FramewrightError, match="chains are fields of the session"):
        Session((Mount("A"),), extra={"chains": [{"steps": []}]})
    with pytest.raises(FramewrightError, match="chains must each be a Chain"):
        Session((Mount("A"),), chains=({"steps": []},))
    with pytest.raises(FramewrightError, match="checks must each be a SavedCheck"):
        Session((Mount("A"),), checks=("A",))
    with pytest.raises(FramewrightError, match="mounts must each be a Mount"):
        Session(("A",))
    session = Session((Mount("A"),), chains=[Chain()], checks=[])      # lists are kept as tuples
    assert session.chains == (Chain(),) and session.checks == ()
