"""Saving a session never loses the file on disk or leaves litter: the target's mode is kept, a symbolic
link is written through, pipes, devices and folders are refused, a read-only target or folder and a full
disk (simulated: we run as root, for whom permissions do not apply) leave the old file intact and no
temporary behind, text that cannot be written is refused by its field before anything is written, and
temporaries of killed saves are removed by the next save."""

import errno
import os
import stat
import time

import pytest

from core import atomic_file
from core.chain import Chain
from core.orientation import Orientation
from core.session import Mount, Session, SessionFileError, load_session, save_session


def _session(name="Bracket camera"):
    return Session((Mount(name, Orientation.from_axis_angle((0, 0, 1), 30)), Mount("Level sensor")))


@pytest.fixture
def saved(tmp_path):
    path = tmp_path / "rig.fwsession.json"
    save_session(_session(), path)
    return path


def _others(folder, path):
    return sorted(p.name for p in folder.iterdir() if p.name != path.name)


@pytest.mark.parametrize("mode", [0o664, 0o600, 0o644, 0o640])
def test_a_save_keeps_the_mode_of_the_file_it_replaces(saved, mode):
    os.chmod(saved, mode)
    save_session(_session("renamed"), saved)
    assert stat.S_IMODE(os.stat(saved).st_mode) == mode
    assert load_session(saved).mounts[0].name == "renamed"


def test_a_new_file_gets_0666_less_the_umask(tmp_path):
    old = os.umask(0o027)
    try:
        save_session(_session(), tmp_path / "new.fwsession.json")
    finally:
        os.umask(old)
    # The usual mode of a new file (common practice): 0666 & ~umask = 0640 here.
    assert stat.S_IMODE(os.stat(tmp_path / "new.fwsession.json").st_mode) == 0o640


def test_a_save_through_a_symbolic_link_replaces_its_target_and_keeps_the_link(tmp_path):
    real_folder = tmp_path / "real"
    real_folder.mkdir()
    target = real_folder / "rig.fwsession.json"
    save_session(_session(), target)
    os.chmod(target, 0o664)
    link = tmp_path / "link.fwsession.json"
    link.symlink_to(target)
    save_session(_session("through the link"), link)
    assert link.is_symlink() and os.readlink(link) == str(target)
    assert load_session(target).mounts[0].name == "through the link"
    assert stat.S_IMODE(os.stat(target).st_mode) == 0o664
    assert _others(real_folder, target) == [] and _others(tmp_path, link) == ["real"]


def test_a_chain_of_links_and_a_dangling_link_are_followed(tmp_path):
    target = tmp_path / "rig.fwsession.json"
    (tmp_path / "a").symlink_to(target)            # dangling until the first save creates the target
    (tmp_path / "b").symlink_to(tmp_path / "a")
    save_session(_session("new"), tmp_path / "b")
    assert (tmp_path / "b").is_symlink() and (tmp_path / "a").is_symlink()
    assert load_session(target).mounts[0].name == "new"


@pytest.mark.parametrize("kind, words", [("fifo", "named pipe"), ("folder", "a folder"),
                                          ("device", "a device")])
def test_a_pipe_a_folder_or_a_device_is_refused_and_left_alone(tmp_path, kind, words):
    if kind == "fifo":
        target = tmp_path / "pipe.fwsession.json"
        os.mkfifo(target)
    elif kind == "folder":
        target = tmp_path / "folder.fwsession.json"
        target.mkdir()
    else:
        target = tmp_path / "null.fwsession.json"
        target.symlink_to("/dev/null")             # a link to a device: the device is what would be hit
    with pytest.raises(OSError, match=words):
        save_session(_session(), target)
    assert _others(tmp_path, target) == []
    if kind == "fifo":
        assert stat.S_ISFIFO(os.stat(target).st_mode)
    if kind == "device":
        assert target.is_symlink() and stat.S_ISCHR(os.stat("/dev/null").st_mode)


def test_a_read_only_target_is_refused_and_kept(saved, monkeypatch):
    before = saved.read_bytes()
    os.chmod(saved, 0o444)
    real_access = os.access
    # As root every file is writable to os.access; answer as for an ordinary user.
    monkeypatch.setattr(os, "access", lambda p, m, *a, **k: False if m == os.W_OK else real_access(p, m))
    with pytest.raises(OSError, match="read-only"):
        save_session(_session("other"), saved)
    assert saved.read_bytes() == before and _others(saved.parent, saved) == []


def test_a_read_only_folder_says_so_and_keeps_the_file(saved, monkeypatch):
    before = saved.read_bytes()
    real_open = os.open

    def refusing_open(path, flags, *args, **kwargs):
        if flags & os.O_CREAT:                     # creating the temporary, as in a read-only folder
            raise PermissionError(errno.EACCES, "Permission denied", str(path))
        return real_open(path, flags, *args, **kwargs)

    monkeypatch.setattr(os, "open", refusing_open)
    with pytest.raises(OSError, match="cannot create a file in the folder .*Permission denied"):
        save_session(_session("other"), saved)
    assert saved.read_bytes() == before and _others(saved.parent, saved) == []


@pytest.mark.parametrize("call", ["write", "fsync", "replace"])
def test_a_full_disk_leaves_the_old_file_intact_and_no_temporary(saved, monkeypatch, call):
    before = saved.read_bytes()
    real_write = os.write
    calls = []

    def full(*args, **kwargs):
        calls.append(call)
        raise OSError(errno.ENOSPC, "No space left on device")

    if call == "write":          # the first chunk goes, the second finds the disk full
        def partial_then_full(fd, data):
            if calls:
                full()
            calls.append("first")
            return real_write(fd, bytes(data[: len(data) // 2]))
        monkeypatch.setattr(os, "write", partial_then_full)
    else:
        monkeypatch.setattr(os, call, full)
    with pytest.raises(OSError, match="No space left"):
        save_session(_session("other" * 100), saved)
    assert call in calls
    assert saved.read_bytes() == before and _others(saved.parent, saved) == []


def test_text_that_cannot_be_written_is_refused_by_its_field_before_anything_is_written(saved):
    before = saved.read_bytes()
    # Mount names are checked when a Mount is made, so a lone surrogate can only come in through a value
    # that checks less (a chain's name need only be text); the save names it and writes nothing.
    session = Session((Mount("A"),), chains=(Chain(name="lone \ud800"),))
    with pytest.raises(SessionFileError, match=r"chains\[0\]\.name.*lone surrogate U\+D800"):
        save_session(session, saved)
    with pytest.raises(SessionFileError, match=r"kept\.x.*not a finite number"):
        save_session(Session((Mount("A"),), extra={"kept": {"x": float("nan")}}), saved)
    assert saved.read_bytes() == before and _others(saved.parent, saved) == []


@pytest.mark.parametrize("name", ["lone \ud800", "erase\x1b[2K", "two\nlines", "\u2028", "", "x" * 501])
def test_a_mount_cannot_be_given_a_name_that_could_not_be_saved_and_read(name):
    with pytest.raises(ValueError, match="name"):
        Mount(name)


def test_stale_temporaries_of_killed_saves_are_removed_by_the_next_save(saved):
    folder = saved.parent
    dead_pid = 2 ** 22 + 12345                     # above the usual pid_max of 4194304: no such process
    dead = folder / atomic_file.temporary_name(saved.name, pid=dead_pid)
    old = folder / atomic_file.temporary_name(saved.name)          # our own pid, but from long ago
    live = folder / atomic_file.temporary_name(saved.name)         # a save in progress in this process
    other_file = folder / atomic_file.temporary_name("another.fwsession.json", pid=dead_pid)
    lookalike = folder / f".{saved.name}.fw-save-notapid.tmp"
    for p in (dead, old, live, other_file, lookalike):
        p.write_bytes(b"x" * 1000)
    long_ago = time.time() - atomic_file.STALE_AFTER_S - 5
    os.utime(old, (long_ago, long_ago))
    save_session(_session("next"), saved)
    assert not dead.exists() and not old.exists()
    assert live.exists() and other_file.exists() and lookalike.exists()   # not ours to remove
    assert load_session(saved).mounts[0].name == "next"


def test_a_stale_temporary_that_is_a_link_or_folder_is_left_alone(saved, tmp_path):
    elsewhere = tmp_path / "precious.txt"
    elsewhere.write_text("keep me")
    as_link = saved.parent / atomic_file.temporary_name(saved.name, pid=2 ** 22 + 1)
    as_link.symlink_to(elsewhere)
    save_session(_session("next"), saved)
    assert as_link.is_symlink() and elsewhere.read_text() == "keep me"
