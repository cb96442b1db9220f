"""Autosave to a recovery file, the offer to restore it after a crash (a real process killed), and the
Recent files list. The recovery folder is each test's own (tmp_path); the question dialog is answered by
the test."""

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest
from PySide6.QtWidgets import QMessageBox

from app import plain_text, recent_files, recovery
from app.model import SessionModel
from core.orientation import Orientation
from core.session import load_session, save_session

ROOT = Path(__file__).resolve().parents[2]


@pytest.fixture
def folder(tmp_path, monkeypatch):
    path = tmp_path / "recovery"
    monkeypatch.setenv("FRAMEWRIGHT_RECOVERY_DIR", str(path))
    return path


def _files(folder):
    return sorted(folder.glob("recovery-*.fwsession.json")) if folder.exists() else []


def test_autosave_coalesces_a_burst_of_edits_into_one_write_of_the_session(qtbot, folder, demo_session,
                                                                          monkeypatch):
    model = SessionModel(demo_session)
    saver = recovery.Recovery(model, folder, delay_ms=300)
    writes = []
    real_write = recovery.save_session
    monkeypatch.setattr(recovery, "save_session", lambda s, p: writes.append(p) or real_write(s, p))
    for angle in (10, 20, 30):
        model.set_orientation(Orientation.from_axis_angle((0, 0, 1), angle))
        assert writes == [] and saver.pending()          # nothing is written on the path of an edit
    qtbot.waitUntil(lambda: len(writes) == 1, timeout=3000)
    qtbot.wait(400)
    assert len(writes) == 1                               # three quick edits, one write
    kept = load_session(saver.path)
    assert kept.mounts[model.selected_index].orientation == model.current_orientation()   # bit for bit
    assert model.current_orientation().isclose(Orientation.from_axis_angle((0, 0, 1), 30), atol=1e-15)
    assert kept.extra[recovery.MARK]["of"] is None
    saver.discard()


def test_a_save_and_a_clean_close_remove_the_recovery_file(qtbot, folder, window, tmp_path):
    window.model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 5))
    assert window.recovery.write_now() and window.recovery.path.exists()
    assert window.recovery.path.parent == folder
    assert window.save_file_as(str(tmp_path / "rig.fwsession.json"))
    assert not window.recovery.path.exists()
    window.model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 6))
    assert window.recovery.write_now()
    window.model.undo_stack.setClean()
    window.close()
    assert _files(folder) == []


def test_a_steady_stream_of_edits_is_written_while_it_goes_on_not_only_after_it(qtbot, folder, demo_session,
                                                                              monkeypatch):
    # Autosave never waits for a pause: edits every 100 ms for well over the delay are written meanwhile.
    model = SessionModel(demo_session)
    saver = recovery.Recovery(model, folder)
    assert recovery.AUTOSAVE_DELAY_MS <= 500      # a committed step reaches the file within half a second
    writes = []
    real_write = recovery.save_session
    monkeypatch.setattr(recovery, "save_session", lambda s, p: writes.append(p) or real_write(s, p))
    edits = 0
    while edits < 30 and not writes:
        model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 10 + edits))
        edits += 1
        qtbot.wait(100)
    assert writes, "nothing written during a stream of 30 edits"
    assert edits < 30
    saver.discard()


CRASH_ONE_STEP_AFTER_AN_EDIT = """
import os, sys
from PySide6.QtCore import QCoreApplication, QTimer
from app import recovery
from app.model import SessionModel
from core.orientation import Orientation
from core.session import load_session

app = QCoreApplication([])
model = SessionModel(load_session(sys.argv[1]))
saver = recovery.Recovery(model, sys.argv[2])          # the window's own delay
model.set_orientation(Orientation.from_axis_angle((0, 0, 1), 17.25))
# The crash comes one autosave step after the edit (plus the 5% a coarse Qt timer may slip), well before
# the edits could be called paused.
QTimer.singleShot(recovery.AUTOSAVE_DELAY_MS + 100, lambda: os.kill(os.getpid(), 9))
app.exec()
"""


def test_a_kill_minus_9_one_step_after_an_edit_recovers_the_edit(tmp_path, folder, demo_session):
    session_file = tmp_path / "rig.fwsession.json"
    save_session(demo_session, session_file)
    env = {**os.environ, "PYTHONPATH": str(ROOT), "QT_QPA_PLATFORM": "offscreen"}
    result = subprocess.run([sys.executable, "-c", CRASH_ONE_STEP_AFTER_AN_EDIT, str(session_file), str(folder)],
                            cwd=ROOT, env=env, capture_output=True, text=True, timeout=60)
    assert result.returncode == -9, result.stderr
    [crashed] = recovery.find_crashed(folder)
    edited = crashed.session.mounts[crashed.session.selected].orientation
    assert edited == Orientation.from_axis_angle((0, 0, 1), 17.25)


CRASHING_RUN = """
import os, sys
from PySide6.QtCore import QCoreApplication
from app import recovery
from app.model import SessionModel
from core.orientation import Orientation
from core.session import load_session

app = QCoreApplication([])
model = SessionModel(load_session(sys.argv[1]))
model.file_path = sys.argv[1]
saver = recovery.Recovery(model, sys.argv[2], delay_ms=50)
model.add_mount("Added before the crash", Orientation.from_axis_angle((0, 1, 0), 42))
from PySide6.QtCore import QTimer
QTimer.singleShot(500, lambda: os.kill(os.getpid(), 9))   # the crash: no clean-up runs
app.exec()
"""


def _crash(tmp_path, folder, demo_session):
    session_file = tmp_path / "rig.fwsession.json"
    save_session(demo_session, session_file)
    os.utime(session_file, (1_000_000_000, 1_000_000_000))   # saved well before the crash
    env = {**os.environ, "PYTHONPATH": str(ROOT), "QT_QPA_PLATFORM": "offscreen"}
    result = subprocess.run([sys.executable, "-c", CRASHING_RUN, str(session_file), str(folder)], cwd=ROOT,
                            env=env, capture_output=True, text=True, timeout=60)
    assert result.returncode == -9, result.stderr
    assert len(_files(folder)) == 1
    return session_file


def test_after_a_crash_the_next_start_offers_the_changes_and_restores_them(qtbot, folder, window, tmp_path,
                                                                            demo_session, monkeypatch):
    session_file = _crash(tmp_path, folder, demo_session)
    asked = []

    def answer(parent, title, text, *args):
        asked.append(text)
        return QMessageBox.StandardButton.Yes

    monkeypatch.setattr(plain_text, "question", answer)
    assert recovery.offer_recovery(window)
    assert len(asked) == 1 and "rig.fwsession.json" in asked[0] and "did not close normally" in asked[0]
    names = [m.name for m in window.model.mounts]
    assert names == [m.name for m in demo_session.mounts] + ["Added before the crash"]
    assert window.model.mounts[-1].orientation == Orientation.from_axis_angle((0, 1, 0), 42)
    assert window.model.file_path == str(session_file)
    assert not window.model.undo_stack.isClean() and "(changed)" in window.windowTitle()
    assert recovery.MARK not in window.model.session().extra       # the mark never reaches the user's file
    assert _files(folder) == [window.recovery.path]                 # the window's own autosave took over
    assert recovery.find_crashed(folder) == []                      # ...and it is live, so never offered


def test_declining_throws_the_changes_away_and_changes_nothing(qtbot, folder, window, tmp_path, demo_session,
                                                               monkeypatch):
    _crash(tmp_path, folder, demo_session)
    monkeypatch.setattr(plain_text, "question", lambda *args: QMessageBox.StandardButton.No)
    before = window.model.session()
    assert not recovery.offer_recovery(window)
    assert window.model.session() == before and window.model.undo_stack.isClean()
    assert _files(folder) == []


def test_a_recovery_file_older_than_its_saved_session_is_not_offered(qtbot, folder, window, tmp_path,
                                                                      demo_session, monkeypatch):
    session_file = _crash(tmp_path, folder, demo_session)
    os.utime(session_file, None)                                 # saved again after the crash
    monkeypatch.setattr(plain_text, "question", lambda *a: pytest.fail("asked about a stale file"))
    assert not recovery.offer_recovery(window)
    assert _files(folder) == []


def test_a_damaged_recovery_file_is_skipped(qtbot, folder, window, monkeypatch):
    folder.mkdir(parents=True)
    (folder / "recovery-1-1.fwsession.json").write_text("{half a file")
    monkeypatch.setattr(plain_text, "question", lambda *a: pytest.fail("asked about a damaged file"))
    assert not recovery.offer_recovery(window)


def test_recent_files_keep_eight_newest_first_and_drop_missing_ones_with_a_note(qtbot, window, tmp_path,
                                                                                demo_session):
    paths = []
    for k in range(10):
        path = tmp_path / f"s{k}.fwsession.json"
        save_session(demo_session, path)
        paths.append(path)
        window.model.undo_stack.setClean()
        assert window.open_file(str(path))
    stored, dropped = recent_files.load_recent(window._settings)
    assert stored == [str(p.resolve()) for p in reversed(paths)][:8] and dropped == []
    paths[9].unlink()
    window._fill_recent_menu()
    texts = [a.text() for a in window.recent_menu.actions()]
    assert texts[0] == "&1 s8.fwsession.json" and len(texts) == 7
    assert "(no longer found): s9.fwsession.json" in window.statusBar().currentMessage()
    window.recent_menu.actions()[2].trigger()                    # opens s6 and moves it to the top
    assert window.model.file_path == str(paths[6].resolve())
    assert recent_files.load_recent(window._settings)[0][0] == str(paths[6].resolve())
    assert all(a.toolTip() for a in window.recent_menu.actions())


def test_a_fit_in_the_measure_panel_is_drawn_in_the_scene(qtbot, window):
    window.measure_panel.import_csv(str(ROOT / "resources" / "demo_points.csv"))
    window.measure_panel.fit()
    fit = window.measure_panel.last_fit
    assert fit is not None and window.scene.measured_points.fit is fit
    window.measure_panel.current_table().clear_inputs()
    assert window.scene.measured_points.fit is None
