"""Clearing a folder of temporaries left by killed saves of any file (autosaves of crashed runs): ours
go, by our name pattern and age only; other files, and a young temporary of a live save, stay."""

import os
import time

from core import atomic_file


def _touch(path, age_s):
    path.write_bytes(b"partial")
    then = time.time() - age_s
    os.utime(path, (then, then))
    return path


def test_old_temporaries_of_any_file_are_removed_and_nothing_else(tmp_path):
    live = os.getpid()     # our own process runs, so only age can make its temporary stale
    old_a = _touch(tmp_path / atomic_file.temporary_name("autosave-1.json", live), 3600)
    old_b = _touch(tmp_path / atomic_file.temporary_name("rig.fwsession.json", live), 3600)
    young = _touch(tmp_path / atomic_file.temporary_name("rig.fwsession.json", live), 0)
    other = _touch(tmp_path / "rig.fwsession.json", 3600)          # a user's file, however old
    lookalike = _touch(tmp_path / ".notes.txt.tmp", 3600)          # not our name pattern
    removed = atomic_file.remove_stale_temporaries_in(tmp_path)
    assert sorted(removed) == sorted([old_a, old_b])
    assert not old_a.exists() and not old_b.exists()
    assert young.exists() and other.exists() and lookalike.exists()


def test_the_age_limit_is_measured_from_the_given_time(tmp_path):
    # STALE_AFTER_S is the limit; one second either side of it (from the module's own constant)
    live = os.getpid()
    path = _touch(tmp_path / atomic_file.temporary_name("autosave-2.json", live), 0)
    mtime = os.stat(path).st_mtime
    assert atomic_file.remove_stale_temporaries_in(tmp_path, now=mtime + atomic_file.STALE_AFTER_S - 1) == []
    assert path.exists()
    assert atomic_file.remove_stale_temporaries_in(tmp_path, now=mtime + atomic_file.STALE_AFTER_S + 1) == [path]
    assert not path.exists()


def test_a_folder_that_does_not_exist_removes_nothing(tmp_path):
    assert atomic_file.remove_stale_temporaries_in(tmp_path / "missing") == []
