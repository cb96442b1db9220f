"""Session files: a saved and reopened session is identical as a whole, and a save killed between the
fsync of the temporary file and the rename leaves the old file intact (a real process, really killed)."""

import subprocess
import sys
from pathlib import Path

from core.orientation import Orientation
from core.session import Mount, PartProperties, Preferences, Session, load_session, save_session

ROOT = Path(__file__).resolve().parents[2]


def _session(name="Bracket camera"):
    return Session((Mount(name, Orientation.from_angles("ZYX", (30, -12, 4)),
                          PartProperties((140, 90, 80), {"+X": "lens"}, "+X"), "notes"),
                    Mount("Level sensor", Orientation.from_quaternion((0.5, 0.5, 0.5, 0.5)))),
                   selected=1, preferences=Preferences(sequence="XYZ", intrinsic=False),
                   description="test rig", extra={"added_by_a_newer_minor_revision": {"kept": [1, 2]}})


def test_saved_and_reopened_session_is_equal_as_a_whole(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    session = _session()
    save_session(session, path)
    assert load_session(path) == session
    save_session(load_session(path), path)             # and a second round trip changes nothing
    assert load_session(path) == session


KILLED_SAVE = """
import os, sys
import core.session as session_module
from core.orientation import Orientation
from core.session import Mount, Session

def die_before_rename(src, dst):
    os.kill(os.getpid(), 9)          # killed after write and fsync, before the rename

os.replace = die_before_rename
session_module.save_session(Session((Mount("new contents"),)), sys.argv[1])
print("not reached")
"""


def test_a_save_killed_between_fsync_and_rename_leaves_the_old_file_intact(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    before = path.read_bytes()
    result = subprocess.run([sys.executable, "-c", KILLED_SAVE, str(path)], cwd=ROOT, capture_output=True,
                            text=True, timeout=60, env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert result.returncode == -9 and "not reached" not in result.stdout, result.stderr
    assert path.read_bytes() == before
    assert load_session(path) == _session()
    # the temporary file the killed process wrote is complete and beside the target, never in its place
    leftovers = [p for p in tmp_path.iterdir() if p != path]
    assert len(leftovers) == 1 and leftovers[0].name.startswith(".rig.fwsession.json.")
    assert load_session(leftovers[0]).mounts[0].name == "new contents"


def test_the_next_save_removes_the_temporary_a_killed_save_left(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    result = subprocess.run([sys.executable, "-c", KILLED_SAVE, str(path)], cwd=ROOT, capture_output=True,
                            text=True, timeout=60, env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert result.returncode == -9, result.stderr
    assert len([p for p in tmp_path.iterdir() if p != path]) == 1        # the killed save's temporary
    save_session(_session("saved again"), path)    # its process is gone: the temporary is stale
    assert [p.name for p in tmp_path.iterdir()] == [path.name]
    assert load_session(path).mounts[0].name == "saved again"


KILLED_MID_WRITE = """
import os, sys
import core.atomic_file as atomic_file
from core.session import Mount, Session, save_session

real_write = os.write
def die_half_way(fd, data):
    real_write(fd, bytes(data[: len(data) // 2]))
    os.kill(os.getpid(), 9)          # killed with half the new contents written

atomic_file.os.write = die_half_way
save_session(Session((Mount("new contents", notes="long notes " * 500),)), sys.argv[1])
"""


def test_a_save_killed_half_way_through_writing_leaves_the_old_file_intact(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    before = path.read_bytes()
    result = subprocess.run([sys.executable, "-c", KILLED_MID_WRITE, str(path)], cwd=ROOT, capture_output=True,
                            text=True, timeout=60, env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert result.returncode == -9, result.stderr
    assert path.read_bytes() == before
    save_session(_session(), path)
    assert [p.name for p in tmp_path.iterdir()] == [path.name]
