"""Autosave to a recovery file, so an unsaved session survives a crash.

A Recovery listens to the model: a change with unsaved edits starts a short timer unless it is already
running, so the session is written, atomically (core/session.save_session), to a recovery file in the
user's data folder AUTOSAVE_DELAY_MS after the first of a burst of changes — the burst coalesces into one
write, a steady stream of edits is still written every AUTOSAVE_DELAY_MS, and no committed step waits for
the edits to pause. It is never written on the path of an edit. A save (the undo stack
becomes clean) or a clean close removes the file. Each running window owns its file and holds a lock
beside it (QLockFile), so a second window never offers another live window's file: a recovery file whose
lock can be taken belongs to a run that ended without cleaning up, i.e. crashed.

On the next start `find_crashed` lists those files, newest first, and `offer_recovery` asks a plain
question; a recovery file older than the session file it was made from (saved after the crash from
another window) is stale and removed without asking.

The folder: FRAMEWRIGHT_RECOVERY_DIR if set; under the tests (FRAMEWRIGHT_TESTING) a temporary folder of
the test process; otherwise QStandardPaths' application data location.
"""

from __future__ import annotations

import datetime
import os
import tempfile
from dataclasses import dataclass, replace
from pathlib import Path

from PySide6.QtCore import QLockFile, QObject, QStandardPaths, QTimer, Signal

from core import atomic_file
from core.errors import FramewrightError
from core.session import FILE_SUFFIX, Session, load_session, save_session

# Within half a second of any committed undo step, with room for the write itself.
AUTOSAVE_DELAY_MS = 300
PREFIX = "recovery-"
MARK = "recovery"   # top-level key in a recovery file: which file it recovers and when it was written


def default_folder() -> Path:
    override = os.environ.get("FRAMEWRIGHT_RECOVERY_DIR")
    if override:
        return Path(override)
    if os.environ.get("FRAMEWRIGHT_TESTING"):
        return Path(tempfile.gettempdir()) / f"framewright-test-recovery-{os.getpid()}"
    location = QStandardPaths.writableLocation(QStandardPaths.StandardLocation.AppDataLocation)
    return Path(location or tempfile.gettempdir()) / "recovery"


def _lock_for(path: Path) -> QLockFile:
    return QLockFile(str(path.with_name(path.name[: -len(FILE_SUFFIX)] + ".lock")))


class Recovery(QObject):
    """Autosave of one model to its own recovery file. `discard()` on a clean close. `failed` carries why
    a write did not happen (the window shows it); the session in the window is untouched either way."""

    failed = Signal(str)

    def __init__(self, model, folder: Path | None = None, delay_ms: int = AUTOSAVE_DELAY_MS, parent=None):
        super().__init__(parent)
        self.model = model
        self.folder = Path(folder) if folder is not None else default_folder()
        self.path = self.folder / f"{PREFIX}{os.getpid()}-{id(self):x}{FILE_SUFFIX}"
        self.last_error: str | None = None
        self._lock = None
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(delay_ms)
        self._timer.timeout.connect(self.write_now)
        model.changed.connect(self._on_change)
        model.undo_stack.cleanChanged.connect(self._on_clean_changed)

    def pending(self) -> bool:
        return self._timer.isActive()

    def _on_change(self, _change=None) -> None:
        if not self.model.undo_stack.isClean():
            self._schedule()

    def _on_clean_changed(self, clean: bool) -> None:
        if clean:
            self.discard()
        else:
            self._schedule()

    def _schedule(self) -> None:
        # Never restart a running timer: restarting would wait for the edits to pause.
        if not self._timer.isActive():
            self._timer.start()

    def write_now(self) -> bool:
        """Write the recovery file now (the timer calls this). False, with last_error, if it failed: the
        session in the window is untouched either way."""
        self._timer.stop()
        if self.model.undo_stack.isClean():
            self._remove_file()
            return False
        session = self.model.session()
        extra = dict(session.extra)
        extra[MARK] = {"of": self.model.file_path,
                       "written": datetime.datetime.now(datetime.timezone.utc).isoformat(timespec="seconds")}
        try:
            self.folder.mkdir(parents=True, exist_ok=True)
            if self._lock is None:
                lock = _lock_for(self.path)
                lock.setStaleLockTime(0)  # only a dead owner makes it stale, never its age
                if lock.tryLock(0):
                    self._lock = lock
            save_session(replace(session, extra=extra), self.path)
        except (OSError, FramewrightError) as exc:
            why = atomic_file.describe(exc) if isinstance(exc, OSError) else str(exc)
            self.last_error = f"recovery file {self.path}: {why}"
            self.failed.emit(self.last_error)
            return False
        self.last_error = None
        return True

    def discard(self) -> None:
        """Stop the timer and remove this window's recovery file (a save, or a clean close)."""
        self._timer.stop()
        self._remove_file()

    def _remove_file(self) -> None:
        try:
            self.path.unlink()
        except FileNotFoundError:
            pass
        except OSError as exc:
            self.last_error = f"recovery file {self.path}: {exc}"
        if self._lock is not None:
            self._lock.unlock()
            self._lock = None


@dataclass(frozen=True)
class CrashedRun:
    path: Path
    session: Session      # without the recovery mark
    of: str | None        # the session file it was made from (None: a new or demo session)
    written: str


def find_crashed(folder: Path | None = None) -> list[CrashedRun]:
    """Recovery files left by runs that ended without cleaning up, newest first. Unreadable ones are
    skipped (and left where they are); stale ones (older than the file they came from) are removed."""
    folder = Path(folder) if folder is not None else default_folder()
    atomic_file.remove_stale_temporaries_in(folder)   # left by autosaves that were killed mid-write
    found = []
    for path in sorted(folder.glob(f"{PREFIX}*{FILE_SUFFIX}")):
        lock = _lock_for(path)
        lock.setStaleLockTime(0)
        if not lock.tryLock(0):
            continue                      # a live window owns it
        lock.unlock()
        try:
            session = load_session(path)
        except FramewrightError:
            continue
        mark = session.extra.get(MARK) if isinstance(session.extra.get(MARK), dict) else {}
        of = mark.get("of") if isinstance(mark.get("of"), str) else None
        try:
            saved_since = bool(of) and Path(of).exists() and Path(of).stat().st_mtime > path.stat().st_mtime
        except (OSError, ValueError):     # a name the file system cannot hold: not saved since
            saved_since = False
        if saved_since:
            remove(path)                  # the session was saved after this was written
            continue
        clean = replace(session, extra={k: v for k, v in session.extra.items() if k != MARK})
        found.append(CrashedRun(path, clean, of, str(mark.get("written", ""))))
    found.sort(key=lambda run: run.path.stat().st_mtime, reverse=True)
    return found


def remove(path: Path) -> None:
    for p in (Path(path), Path(str(path)[: -len(FILE_SUFFIX)] + ".lock")):
        try:
            p.unlink()
        except OSError:
            pass


def _local_time(iso_text: str) -> str:
    """'2026-12-01T17:20:03+00:00' as the local wall-clock time '2026-12-01 18:20'."""
    try:
        return datetime.datetime.fromisoformat(iso_text).astimezone().strftime("%Y-%m-%d %H:%M")
    except ValueError:
        return iso_text


def offer_recovery(window, folder: Path | None = None) -> bool:
    """Ask whether to restore the newest crashed run's session into `window`; True if restored. The
    recovery file is removed either way once the question is answered (restored: the window's own
    autosave takes over); older crashed runs, if any, are offered on later starts."""
    from PySide6.QtWidgets import QMessageBox

    from app import plain_text

    runs = find_crashed(folder)
    if not runs:
        return False
    run = runs[0]
    what = f"“{Path(run.of).name}”" if run.of else "a session that was never saved"
    when = f" (last autosaved {_local_time(run.written)})" if run.written else ""
    answer = plain_text.question(   # plain text: the file name is shown as it is
        window, "Restore unsaved changes?",
        f"Framewright did not close normally last time. Unsaved changes to {what} were kept{when}.\n\n"
        "Restore them? (No: they are thrown away.)",
        QMessageBox.StandardButton.Yes | QMessageBox.StandardButton.No, QMessageBox.StandardButton.Yes)
    if answer != QMessageBox.StandardButton.Yes:
        remove(run.path)
        return False
    window.model.load_session(run.session, file_path=run.of)
    # Restored edits are not saved yet: mark them as changed so the title, the close question and the
    # autosave treat them as unsaved.
    window.model.undo_stack.resetClean()
    remove(run.path)
    window.recovery.write_now()
    window.statusBar().showMessage(f"Restored the unsaved changes to {what}. Save them to keep them.")
    return True
