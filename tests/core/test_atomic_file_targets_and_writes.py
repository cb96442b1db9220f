"""The atomic save of core.atomic_file, step by step: the temporary's name, which targets are refused
(each kind in its own words, with the errno and the path as given), what a save keeps (mode, owner) and
gives a new file (0666 less the umask: common practice), writes that come back short or make no
progress, a temporary name already taken, and which leftover temporaries are removed (age limit on both
sides, a live or unknown process, a failing removal that must not stop the others). We run as root, so
read-only files and other users' processes are simulated where needed. Contents are invented."""

import errno
import os
import re
import socket
import stat

import pytest

from core import atomic_file
from core.atomic_file import UnsafeTargetError, resolve_target, write_atomically

DEAD_PID = 2 ** 22 + 777          # above Linux's largest pid_max (4194304): no such process (common practice)


def _others(folder, *keep):
    return sorted(p.name for p in folder.iterdir() if p.name not in keep)


# --- the temporary's name ------------------------------------------------------------------------

def test_a_temporary_is_named_after_its_target_pid_and_eight_random_hex_digits():
    mine = atomic_file.temporary_name("rig.json")
    assert re.fullmatch(rf"\.rig\.json\.fw-save-{os.getpid()}-[0-9a-f]{{8}}\.tmp", mine)
    assert re.fullmatch(r"\.rig\.json\.fw-save-4242-[0-9a-f]{8}\.tmp", atomic_file.temporary_name("rig.json", 4242))
    assert atomic_file.temporary_name("rig.json") != mine            # random: two saves never share one


# --- refused targets -----------------------------------------------------------------------------

def _refused(path):
    with pytest.raises(UnsafeTargetError) as caught:
        resolve_target(path)
    return caught.value


@pytest.mark.parametrize("kind, words", [("folder", "a folder"), ("fifo", "a named pipe (FIFO)"),
                                          ("char", "a device"), ("block", "a device"), ("socket", "a socket")])
def test_what_is_not_a_regular_file_is_refused_by_its_kind(tmp_path, monkeypatch, request, kind, words):
    path = tmp_path / f"{kind}.json"
    if kind == "folder":
        path.mkdir()
    elif kind == "fifo":
        os.mkfifo(path)
    elif kind == "char":
        path.symlink_to("/dev/null")
    elif kind == "block":
        os.mknod(path, stat.S_IFBLK | 0o600, os.makedev(7, 0))      # as root; a loop device's numbers
    else:
        monkeypatch.chdir(tmp_path)                  # a socket's path must be short
        server = socket.socket(socket.AF_UNIX)
        server.bind(path.name)
        request.addfinalizer(server.close)
    error = _refused(path)
    assert error.errno == errno.EINVAL
    assert error.strerror == f"{words}, not a file: nothing was written"
    assert error.filename == str(path)                              # the path as the user gave it
    with pytest.raises(UnsafeTargetError):
        write_atomically(path, b"data")
    assert _others(tmp_path, path.name) == []


def test_a_mode_of_no_known_kind_is_described_plainly():
    # Every kind a Linux stat can give has its own words; the fallback is pinned on the mode itself.
    assert atomic_file._kind(0) == "not a regular file"


def test_a_read_only_target_is_refused_with_its_errno_and_path(tmp_path, monkeypatch):
    path = tmp_path / "kept.json"
    path.write_bytes(b"old")
    link = tmp_path / "link.json"
    link.symlink_to(path)
    real_access = os.access
    monkeypatch.setattr(os, "access", lambda p, m, *a, **k: False if m == os.W_OK else real_access(p, m))
    error = _refused(link)
    assert (error.errno, error.strerror, error.filename) == (
        errno.EACCES, "the file is read-only: nothing was written", str(link))
    assert path.read_bytes() == b"old"


def test_a_writable_target_resolves_to_the_real_file_and_its_status(tmp_path):
    path = tmp_path / "real.json"
    path.write_bytes(b"old")
    link = tmp_path / "link.json"
    link.symlink_to(path)
    target, info = resolve_target(link)
    assert target == path and info.st_ino == os.stat(path).st_ino
    assert resolve_target(tmp_path / "new.json") == (tmp_path / "new.json", None)


# --- what a save writes and keeps ------------------------------------------------------------------

def test_a_save_returns_the_real_file_and_writes_the_bytes(tmp_path):
    path = tmp_path / "real.json"
    link = tmp_path / "link.json"
    link.symlink_to(path)
    assert write_atomically(link, b"first") == path
    assert write_atomically(str(link), b"second") == path
    assert path.read_bytes() == b"second" and link.is_symlink()
    assert _others(tmp_path, "real.json", "link.json") == []


@pytest.mark.parametrize("umask, mode", [(0o000, 0o666), (0o022, 0o644), (0o077, 0o600)])
def test_a_new_file_gets_0666_less_the_umask(tmp_path, umask, mode):
    old = os.umask(umask)
    try:
        write_atomically(tmp_path / "new.json", b"x")
    finally:
        os.umask(old)
    assert stat.S_IMODE(os.stat(tmp_path / "new.json").st_mode) == mode


def test_a_save_keeps_the_owner_and_mode_of_the_file_it_replaces(tmp_path):
    path = tmp_path / "owned.json"
    path.write_bytes(b"old")
    os.chown(path, 12345, 23456)                    # as root: an invented user and group
    os.chmod(path, 0o640)
    write_atomically(path, b"new")
    info = os.stat(path)
    assert (info.st_uid, info.st_gid, stat.S_IMODE(info.st_mode)) == (12345, 23456, 0o640)
    assert path.read_bytes() == b"new"


def test_short_writes_are_continued_until_every_byte_is_written(tmp_path, monkeypatch):
    data = bytes(range(256)) * 3
    real_write = os.write
    sizes = []

    def one_byte_at_a_time(fd, view):
        sizes.append(real_write(fd, bytes(view[:1])))
        return sizes[-1]

    monkeypatch.setattr(os, "write", one_byte_at_a_time)
    write_atomically(tmp_path / "slow.json", data)
    assert (tmp_path / "slow.json").read_bytes() == data and len(sizes) == len(data)


def test_a_write_that_makes_no_progress_fails_the_save_and_keeps_the_old_file(tmp_path, monkeypatch):
    path = tmp_path / "kept.json"
    path.write_bytes(b"old")
    calls = []

    def stuck(fd, view):
        calls.append(len(view))
        if len(calls) > 3:
            raise AssertionError("the write loop kept spinning")
        return 0

    monkeypatch.setattr(os, "write", stuck)
    with pytest.raises(OSError) as caught:
        write_atomically(path, b"new contents")
    assert (caught.value.errno, caught.value.strerror) == (errno.EIO, "the write made no progress")
    assert len(calls) == 1
    assert path.read_bytes() == b"old" and _others(tmp_path, "kept.json") == []


def test_a_temporary_name_already_taken_is_never_written_into(tmp_path, monkeypatch):
    path = tmp_path / "rig.json"
    monkeypatch.setattr(atomic_file.secrets, "token_hex", lambda n: "0badcafe")
    taken = tmp_path / atomic_file.temporary_name("rig.json")      # a live save's, in this process
    taken.write_bytes(b"another save in progress")
    with pytest.raises(OSError) as caught:
        write_atomically(path, b"new")
    assert caught.value.errno == errno.EEXIST
    assert caught.value.strerror == f"cannot create a file in the folder {tmp_path} (File exists)"
    assert taken.read_bytes() == b"another save in progress" and not path.exists()


def test_a_folder_that_refuses_new_files_says_so_with_the_errno(tmp_path, monkeypatch):
    real_open = os.open

    def refusing(name, flags, *args):
        if flags & os.O_CREAT:
            raise PermissionError(errno.EACCES, "Permission denied", str(name))
        return real_open(name, flags, *args)

    monkeypatch.setattr(os, "open", refusing)
    with pytest.raises(OSError) as caught:
        write_atomically(tmp_path / "new.json", b"x")
    assert caught.value.errno == errno.EACCES
    assert caught.value.strerror == f"cannot create a file in the folder {tmp_path} (Permission denied)"


def test_the_file_and_its_folder_are_flushed_to_disk(tmp_path, monkeypatch):
    synced = []
    real_fsync = os.fsync
    monkeypatch.setattr(os, "fsync", lambda fd: (synced.append(stat.S_ISDIR(os.fstat(fd).st_mode)),
                                                 real_fsync(fd)))
    write_atomically(tmp_path / "durable.json", b"x")
    assert synced == [False, True]                  # the temporary first, then the folder's rename


def test_a_folder_that_cannot_be_flushed_does_not_fail_the_save(tmp_path, monkeypatch):
    real_fsync = os.fsync

    def no_folder_fsync(fd):
        if stat.S_ISDIR(os.fstat(fd).st_mode):
            raise OSError(errno.EINVAL, "Invalid argument")     # as on file systems that refuse it
        real_fsync(fd)

    monkeypatch.setattr(os, "fsync", no_folder_fsync)
    write_atomically(tmp_path / "saved.json", b"x")
    assert (tmp_path / "saved.json").read_bytes() == b"x"


# --- describe ------------------------------------------------------------------------------------

def test_an_error_is_described_by_its_reason_without_the_number():
    assert atomic_file.describe(FileNotFoundError(errno.ENOENT, "No such file or directory", "x")) == \
        "No such file or directory"
    assert atomic_file.describe(OSError("plain words")) == "plain words"
    assert atomic_file.describe(ValueError("not an OSError")) == "not an OSError"


# --- leftover temporaries --------------------------------------------------------------------------

def _temporary(folder, target_name, pid, mtime=None):
    path = folder / atomic_file.temporary_name(target_name, pid)
    path.write_bytes(b"partial")
    if mtime is not None:
        os.utime(path, (mtime, mtime))
    return path


def test_the_age_limit_holds_on_both_sides_for_a_live_process(tmp_path):
    target = tmp_path / "rig.json"
    young = _temporary(tmp_path, "rig.json", os.getpid(), mtime=1_000_000)   # whole seconds: exact sums
    assert atomic_file.remove_stale_temporaries(target, now=1_000_000 + atomic_file.STALE_AFTER_S) == []
    assert young.exists()
    assert atomic_file.remove_stale_temporaries(target, now=1_000_000 + atomic_file.STALE_AFTER_S + 0.5) == [young]
    assert not young.exists()
    other = _temporary(tmp_path, "autosave.json", os.getpid(), mtime=1_000_000)     # the folder-wide sweep
    assert atomic_file.remove_stale_temporaries_in(tmp_path, now=1_000_000 + atomic_file.STALE_AFTER_S) == []
    assert atomic_file.remove_stale_temporaries_in(tmp_path, now=1_000_000 + atomic_file.STALE_AFTER_S + 0.5) == [other]


def test_without_a_time_given_the_clock_is_used(tmp_path):
    target = tmp_path / "rig.json"
    young = _temporary(tmp_path, "rig.json", os.getpid())
    old = _temporary(tmp_path, "rig.json", os.getpid(), mtime=1_000_000)
    assert atomic_file.remove_stale_temporaries(target) == [old]
    assert young.exists()


def test_a_young_temporary_of_a_process_that_is_gone_is_removed(tmp_path):
    dead = _temporary(tmp_path, "rig.json", DEAD_PID)
    live = _temporary(tmp_path, "rig.json", os.getpid())
    assert atomic_file.remove_stale_temporaries(tmp_path / "rig.json") == [dead]
    assert live.exists()


@pytest.mark.parametrize("refusal", [PermissionError, OverflowError, ValueError])
def test_a_process_we_may_not_ask_about_keeps_its_young_temporary(tmp_path, monkeypatch, refusal):
    young = _temporary(tmp_path, "rig.json", 4242)

    def kill(pid, signal):
        assert (pid, signal) == (4242, 0)               # signal 0 only asks; it never signals
        raise refusal("not allowed")

    monkeypatch.setattr(os, "kill", kill)
    assert atomic_file.remove_stale_temporaries(tmp_path / "rig.json") == []
    assert young.exists()


def test_a_pid_too_large_to_ask_about_keeps_its_young_temporary(tmp_path):
    young = tmp_path / f".rig.json.fw-save-{2 ** 70}-0badcafe.tmp"
    young.write_bytes(b"partial")
    assert atomic_file.remove_stale_temporaries(tmp_path / "rig.json") == []
    assert young.exists()


def test_only_temporaries_of_the_target_are_removed_by_its_save(tmp_path):
    mine = _temporary(tmp_path, "rig.json", DEAD_PID)
    other = _temporary(tmp_path, "other.json", DEAD_PID)
    upper = tmp_path / f".rig.json.fw-save-{DEAD_PID}-0BADCAFE.TMP"
    upper.write_bytes(b"not our spelling")
    write_atomically(tmp_path / "rig.json", b"new")
    assert not mine.exists() and other.exists() and upper.exists()
    assert atomic_file.remove_stale_temporaries_in(tmp_path) == [other]
    assert upper.exists()


def test_a_removal_that_fails_or_a_folder_in_the_way_does_not_stop_the_others(tmp_path, monkeypatch):
    in_the_way = tmp_path / atomic_file.temporary_name("rig.json", DEAD_PID)
    in_the_way.mkdir()
    first = _temporary(tmp_path, "rig.json", DEAD_PID)
    second = _temporary(tmp_path, "rig.json", DEAD_PID)
    third = _temporary(tmp_path, "rig.json", DEAD_PID)
    order = [in_the_way.name, first.name, second.name, third.name]
    monkeypatch.setattr(os, "listdir", lambda folder: list(order))   # the folder in the way comes first
    real_unlink = os.unlink

    def unlink(path):
        if path == first:
            raise PermissionError(errno.EPERM, "Operation not permitted")
        real_unlink(path)

    monkeypatch.setattr(os, "unlink", unlink)
    assert atomic_file.remove_stale_temporaries(tmp_path / "rig.json") == [second, third]
    assert in_the_way.is_dir() and first.exists()
