"""Replace a file's contents atomically and safely: a temporary file beside the real target, written in
full, flushed to disk and renamed over it, so a crash, a kill or a full disk leaves either the old file or
the new one, never half of one, and nothing else behind.

What a save keeps and refuses:
- A symbolic link is written through: the file it points to is replaced and the link stays a link.
- The target's permission bits (and, where allowed, its owner) are kept; a new file gets the usual
  0666 less the umask, as any program's new file would.
- Directories, named pipes (FIFOs), devices and sockets are refused with a message: renaming over them
  would destroy them, and writing into a pipe or device is not a save.
- A target that is not writable by us is refused rather than replaced behind its permissions.
- Every temporary file is named `.<target name>.fw-save-<pid>-<random>.tmp`; a failed save removes its
  own, and each save first removes those of earlier saves of the same target that were killed (their
  process is gone, or they are older than STALE_AFTER_S).

Hard links: the rename gives the target a new inode, so other hard links keep the old contents (as with
every atomic save).
"""

from __future__ import annotations

import errno
import os
import re
import secrets
import stat
import time
from pathlib import Path

STALE_AFTER_S = 60.0    # no save takes a minute: an older temporary is from a save that was killed
_TEMP_MARK = ".fw-save-"


class UnsafeTargetError(OSError):
    """A save target that must not be replaced (a directory, a pipe, a device, a read-only file)."""


def temporary_name(target_name: str, pid: int | None = None) -> str:
    pid = os.getpid() if pid is None else pid
    return f".{target_name}{_TEMP_MARK}{pid}-{secrets.token_hex(4)}.tmp"


def _temporary_pattern(target_name: str | None) -> re.Pattern:
    """Our temporaries of saves of `target_name` (None: of any file)."""
    name = r"\..+" if target_name is None else re.escape(f".{target_name}")
    return re.compile(name + re.escape(_TEMP_MARK) + r"(\d+)-[0-9a-f]+\.tmp")


def _kind(mode: int) -> str:
    if stat.S_ISDIR(mode):
        return "a folder"
    if stat.S_ISFIFO(mode):
        return "a named pipe (FIFO)"
    if stat.S_ISCHR(mode) or stat.S_ISBLK(mode):
        return "a device"
    if stat.S_ISSOCK(mode):
        return "a socket"
    return "not a regular file"


def _process_is_gone(pid: int) -> bool:
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return True
    except (PermissionError, OverflowError, ValueError):
        return False     # another user's live process (or a pid we cannot ask about): leave it
    return False


def remove_stale_temporaries(target: Path, now: float | None = None) -> list[Path]:
    """Remove temporaries of killed saves of `target` (regular files only, our name pattern only); the
    ones removed. A temporary of a live save in progress (its process runs, and it is young) is kept."""
    return _remove_stale(Path(target).parent, _temporary_pattern(Path(target).name), now)


def remove_stale_temporaries_in(folder: Path, now: float | None = None) -> list[Path]:
    """As remove_stale_temporaries, for saves of any file in `folder` (e.g. autosaves of runs that
    crashed, whose files have names no later save will use)."""
    return _remove_stale(Path(folder), _temporary_pattern(None), now)


def _remove_stale(folder: Path, pattern: re.Pattern, now: float | None) -> list[Path]:
    now = time.time() if now is None else now
    removed = []
    try:
        names = os.listdir(folder)
    except OSError:
        return removed
    for name in names:
        match = pattern.fullmatch(name)
        if match is None:
            continue
        candidate = folder / name
        try:
            info = os.lstat(candidate)
            if not stat.S_ISREG(info.st_mode):
                continue
            if now - info.st_mtime > STALE_AFTER_S or _process_is_gone(int(match.group(1))):
                os.unlink(candidate)
                removed.append(candidate)
        except OSError:
            continue     # gone meanwhile, or not ours to remove: never a reason to fail the save
    return removed


def resolve_target(path: str | os.PathLike) -> tuple[Path, os.stat_result | None]:
    """The real file a save of `path` replaces (symbolic links followed) and its status (None: it does not
    exist yet). Raises UnsafeTargetError for anything a save must not replace."""
    target = Path(os.path.realpath(os.fspath(path)))
    try:
        info = os.stat(target)
    except FileNotFoundError:
        return target, None
    if not stat.S_ISREG(info.st_mode):
        raise UnsafeTargetError(errno.EINVAL, f"{_kind(info.st_mode)}, not a file: nothing was written",
                                str(path))
    if not os.access(target, os.W_OK):
        raise UnsafeTargetError(errno.EACCES, "the file is read-only: nothing was written", str(path))
    return target, info


def describe(error: OSError) -> str:
    """An OSError in words for a person: the reason without the errno number."""
    return error.strerror or str(error) if isinstance(error, OSError) else str(error)


def _write_all(fd: int, data: bytes) -> None:
    view = memoryview(data)
    while view:
        written = os.write(fd, view)
        if written <= 0:       # never seen, but a loop that cannot advance must not spin
            raise OSError(errno.EIO, "the write made no progress")
        view = view[written:]


def write_atomically(path: str | os.PathLike, data: bytes) -> Path:
    """Replace the contents of `path` by `data` (see the module text for what is kept and refused); the
    real file written. Any failure raises OSError and leaves the old file as it was and no temporary."""
    target, info = resolve_target(path)
    remove_stale_temporaries(target)
    tmp = target.parent / temporary_name(target.name)
    try:
        fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_CLOEXEC", 0), 0o666)  # umask applies
    except OSError as exc:
        raise OSError(exc.errno, f"cannot create a file in the folder {target.parent} ({exc.strerror})") from None
    try:
        try:
            if info is not None:
                try:
                    os.fchown(fd, info.st_uid, info.st_gid)   # only where allowed (root, or our own file)
                except OSError:
                    pass
                os.fchmod(fd, stat.S_IMODE(info.st_mode))     # after chown, which may clear set-id bits
            _write_all(fd, data)
            os.fsync(fd)
        finally:
            os.close(fd)
        os.replace(tmp, target)
    except BaseException:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        raise
    _sync_folder(target.parent)
    return target


def _sync_folder(folder: Path) -> None:
    """Make the rename itself durable where the platform allows it."""
    try:
        dir_fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(dir_fd)
    except OSError:
        pass
    finally:
        os.close(dir_fd)
