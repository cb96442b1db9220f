"""SessionModel: the only place the window's state lives.

It holds one Session value (core/session.py: the mounts, the selected one, the display preferences, the
reference frame's name, the chains and the checks), the view state that is not saved (whether the scene
draws the chain's frames, the file path) and the QUndoStack. An edit is a pure function of the session
(core/operations.py); the model pushes the session before and after as one undo command
(app/commands.py). Every change of any kind is announced by the one ``changed`` signal, carrying a
``Change`` (app/changes.py) whose kinds come from the fields that differ and whose origin says who made it,
so the editor that made an edit can ignore it and keep the user's own spelling.

The Chain panel edits the session's first chain and the Check panel shows its first check (which mount is
nominal, which is measured, and the CheckSettings). The ghost rule: the scene's ghost is the check's
nominal mount exactly when a nominal and a measured mount are both chosen, they are different mounts, and
the selected mount is the measured one; otherwise there is no second orientation (the scene then shows
the reference).

Not undoable (they change no data, or only its spelling): which mount is selected, how numbers are shown
and which names the reference directions get. Undo restores only the fields its edit changed.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import QObject, QTimer, Signal
from PySide6.QtGui import QUndoStack

from app import commands
from app.changes import (CHAIN, CHECK, DESCRIPTION, EVERYTHING, MEASUREMENTS, MOUNTS, ORIENTATION, POSITION,
                         PREFERENCES, SELECTION, SESSION, WORDS, Change, kinds_between)
from core import describe, operations
from core.average import Average
from core.chain import Chain
from core.orientation import Orientation
from core.session import Mount, Preferences, SavedCheck, Session

__all__ = ["CHAIN", "CHECK", "DESCRIPTION", "MEASUREMENTS", "MOUNTS", "ORIENTATION", "POSITION", "PREFERENCES",
           "SELECTION", "SESSION", "WORDS", "Change", "MERGE_IDLE_MS", "SessionModel"]

# Continuous edits (typing, spin arrows, wheel, slider) merge while they keep coming; a pause this long
# ends the run, as does committing a field, leaving the editor, or undo/redo.
MERGE_IDLE_MS = 1200


class SessionModel(QObject):
    changed = Signal(object)  # a Change

    def __init__(self, session: Session | None = None, parent: QObject | None = None):
        super().__init__(parent)
        self.undo_stack = QUndoStack(self)
        self._merge_token = 0
        self._idle = QTimer(self)
        self._idle.setSingleShot(True)
        self._idle.setInterval(MERGE_IDLE_MS)
        self._idle.timeout.connect(self.end_continuous)
        self._session = session if session is not None else Session.single()
        self._show_chain_frames = True
        self._chain_in_view = False
        self.file_path: str | None = None

    # ---- reading --------------------------------------------------------------------------------
    def session(self) -> Session:
        """The state as plain data, ready to save."""
        return self._session

    @property
    def mounts(self) -> tuple[Mount, ...]:
        return self._session.mounts

    @property
    def selected_index(self) -> int:
        return self._session.selected

    @property
    def preferences(self) -> Preferences:
        return self._session.preferences

    @property
    def reference_frame(self) -> str:
        """The frame preset (core/describe.py) whose names the panels use for reference directions."""
        return self._session.reference_frame

    def current_mount(self) -> Mount:
        return self._session.current_mount

    def current_orientation(self) -> Orientation:
        return self._session.current_mount.orientation

    def ghost_orientation(self) -> Orientation | None:
        """The check's nominal orientation while its measured mount is selected (the rule above); else None."""
        nominal = self._ghost_mount()
        return None if nominal is None else nominal.orientation

    def ghost_label(self) -> str | None:
        nominal = self._ghost_mount()
        return None if nominal is None else f"nominal, {nominal.name}"

    def _ghost_mount(self) -> Mount | None:
        nominal, measured = self.check_mount_indices()
        if nominal is None or measured is None or nominal == measured or measured != self.selected_index:
            return None
        return self.mounts[nominal]

    @property
    def chains(self) -> tuple[Chain, ...]:
        return self._session.chains

    @property
    def chain(self) -> Chain:
        """The chain the Chain panel edits (the session's first; an empty one when it has none)."""
        return self._session.chain

    @property
    def show_chain_frames(self) -> bool:
        return self._show_chain_frames

    def scene_frames(self) -> list[tuple[Orientation, str]]:
        """The chain's intermediate frames for the scene, as (orientation, label), reference side first;
        the last one is the product. Empty when the frames are switched off, and on a mount the chain does
        not describe: they are drawn while the chain is being worked on (its panel in view) and, otherwise,
        only beside the mount whose orientation is the chain's product (one made from it, unchanged since)."""
        if not self._show_chain_frames or not (self._chain_in_view or self._mount_is_chain_product()):
            return []
        frames = self.chain.frames()
        out = []
        for k, frame in enumerate(frames, start=1):
            label = f"{k} {frame.name}" if frame.name else f"{k}"
            out.append((frame.orientation, label + (" = product" if k == len(frames) else "")))
        return out

    @property
    def check(self) -> SavedCheck:
        """The check the Check panel shows (the session's first; an empty one when it has none)."""
        return self._session.check

    def check_mount_indices(self) -> tuple[int | None, int | None]:
        """(nominal, measured) mount indices of the check; None where not chosen or no mount has the name
        (the first mount of that name when several share it)."""
        names = [m.name for m in self.mounts]
        check = self.check
        return tuple(names.index(n) if n in names else None for n in (check.nominal, check.measured))

    def current_average(self) -> Average | None:
        """The average of the selected mount's measurements (core/average.py); None when it has none or
        every weight is 0."""
        return operations.current_average(self._session)

    def unused_name(self, base: str) -> str:
        return operations.unused_name(self._session, base)

    # ---- whole-session changes (not undoable: they start a new history) ------------------------
    def load_session(self, session: Session, file_path: str | None = None, keep_preferences: bool = True) -> None:
        """Replace the session. The user's own display preferences stay unless told otherwise."""
        self.end_continuous()
        self.undo_stack.clear()
        self._session = replace(session, preferences=self.preferences) if keep_preferences else session
        self.file_path = file_path
        self.undo_stack.setClean()
        self._emit(EVERYTHING, None)

    # ---- view state and spelling (not undoable: they change no data) ---------------------------
    def select(self, index: int, origin: object | None = None) -> None:
        new = operations.select(self._session, index)
        if new != self._session:
            self.end_continuous()
            self._put(new, origin)

    def set_preferences(self, origin: object | None = None, **changes) -> None:
        """Change how numbers are shown (units, orders, sequence, digits, thresholds)."""
        self._put(operations.set_preferences(self._session, **changes), origin)  # raises when not valid

    def set_reference_frame(self, key: str, origin: object | None = None) -> None:
        """Name the reference directions after a frame preset. It never changes R; it is saved with the
        session, and it sets where gravity points for level readings."""
        self._put(operations.set_reference_frame(self._session, key), origin)

    def _mount_is_chain_product(self) -> bool:
        if len(self.chain) == 0:
            return False
        product, _ = self.chain.pose_product()
        # 1e-9°: the product as a mount made from it stores it, not a value near it
        return self.current_orientation().angle_to(product) <= 1e-9

    def set_chain_in_view(self, in_view: bool) -> bool:
        """Whether the chain is being worked on (the window says so while its panel is in view; not saved).
        Announces no change: nothing the editors and panels show depends on it, only scene_frames(), so
        the caller refreshes the Scene. True when it changed."""
        if bool(in_view) == self._chain_in_view:
            return False
        self._chain_in_view = bool(in_view)
        return True

    def set_show_chain_frames(self, shown: bool, origin: object | None = None) -> None:
        """Whether the scene draws the chain's intermediate frames (a view choice, not saved)."""
        if bool(shown) != self._show_chain_frames:
            self._show_chain_frames = bool(shown)
            self._emit({CHAIN}, origin)

    # ---- data edits: each one undo step ---------------------------------------------------------
    def apply(self, operation, *args, origin: object | None = None, text: str | None = None,
              continuous_key: object = None, pause_ends_run: bool = True) -> None:
        """Apply ``operation(session, *args)`` (core/operations.py) as one undo step; no step when it changes
        nothing. Edits with the same ``continuous_key`` that follow each other without a pause merge into
        one step (one drag, one typing run). A typing run passes ``pause_ends_run=False``: it ends when the
        field commits, never half-typed on a pause. ``text`` names the step (else the diff says)."""
        if continuous_key is None:
            self.end_continuous()
        new = operation(self._session, *args)
        if new == self._session:
            return  # nothing to change (a run that returns to its start is dropped by the merge)
        self.undo_stack.push(commands.ReplaceSessionCommand(self, self._session, new, origin, text,
                                                            continuous_key, self._merge_token))
        if continuous_key is not None and pause_ends_run:
            self._idle.start()
        elif continuous_key is not None:
            self._idle.stop()
        else:
            self.end_continuous()

    def set_orientation(self, orientation: Orientation, origin: object | None = None, *,
                        continuous_key: object = None, text: str | None = None,
                        pause_ends_run: bool = True) -> None:
        """Set the selected mount's orientation (merging runs as `apply` says)."""
        self.apply(operations.set_orientation, orientation, origin=origin, text=text,
                   continuous_key=continuous_key, pause_ends_run=pause_ends_run)

    def set_position(self, position, origin: object | None = None, index: int | None = None,
                     text: str | None = None) -> None:
        """Set a mount's position (a core.position.Position), or clear it with None."""
        self.apply(operations.set_position, position, index, origin=origin, text=text)

    def apply_pose(self, orientation: Orientation, position, text: str, origin: object | None = None) -> None:
        """Set the selected mount's orientation and position together."""
        self.apply(operations.set_pose, orientation, position, origin=origin, text=text)

    def add_measurement(self, source: str = "typed", origin: object | None = None, weight: float = 1.0) -> None:
        """Keep the selected mount's current orientation as one more measurement, of `weight` in the average."""
        self.apply(operations.add_measurement, source, weight, origin=origin)

    def remove_measurement(self, number: int, origin: object | None = None) -> None:
        """Remove measurement `number` (0-based) of the selected mount."""
        self.apply(operations.remove_measurement, number, origin=origin,
                   text=f"Remove measurement {number + 1} of “{self.current_mount().name}”")

    def clear_measurements(self, origin: object | None = None) -> None:
        self.apply(operations.clear_measurements, origin=origin)

    def use_average(self, origin: object | None = None) -> None:
        """Set the selected mount's orientation to the average of its measurements."""
        result = self.current_average()
        self.apply(operations.use_average, origin=origin, text=None if result is None else
                   f"Use the average of {result.counted} measurements of “{self.current_mount().name}”")

    def add_mount(self, name: str | None = None, orientation: Orientation | None = None,
                  origin: object | None = None) -> None:
        self.apply(operations.add_mount, name, orientation, origin=origin)

    def duplicate_mount(self, index: int | None = None, origin: object | None = None) -> None:
        source = self.mounts[operations.mount_index(self._session, index)]   # not there: refused by number
        self.apply(operations.duplicate_mount, index, origin=origin, text=f"Duplicate mount “{source.name}”")

    def rename_mount(self, index: int, name: str, origin: object | None = None) -> None:
        """Rename a mount, and the check's mounts of that name with it (one step)."""
        self.apply(operations.rename_mount, index, name, origin=origin)

    def set_part(self, part, index: int | None = None, origin: object | None = None) -> None:
        """Change a mount's part (box size, face names, boresight face)."""
        self.apply(operations.set_part, part, index, origin=origin)

    def delete_mount(self, index: int | None = None, origin: object | None = None) -> None:
        self.apply(operations.delete_mount, index, origin=origin)

    def make_chain_mount(self, origin: object | None = None) -> None:
        """Add the chain's product as a new mount, named after the chain, and select it."""
        self.apply(operations.chain_to_mount, origin=origin)

    def snap_to_right_angle(self, origin: object | None = None) -> None:
        """Set the selected mount to the nearest of the 24 right-angle orientations."""
        near = describe.nearest_right_angle(self.current_orientation())
        self.apply(operations.snap_to_right_angle, origin=origin,
                   text=f"Snap to nearest right angle ({near.right_angle.rotation_words})")

    # ---- undo ------------------------------------------------------------------------------------
    def end_continuous(self) -> None:
        """End the current run of merging edits; the next edit starts a new undo step."""
        self._idle.stop()
        self._merge_token += 1

    @property
    def merge_token(self) -> int:
        return self._merge_token

    def undo(self) -> None:
        self.end_continuous()
        self.undo_stack.undo()

    def redo(self) -> None:
        self.end_continuous()
        self.undo_stack.redo()

    # ---- used by the undo command only ---------------------------------------------------------
    def _restore(self, source: Session, fields, origin: object | None) -> None:
        """Take `fields` of `source` (with the selection an edit of the mounts was made on)."""
        values = {name: getattr(source, name) for name in fields}
        if "mounts" in fields:
            values["selected"] = source.selected
        self._put(replace(self._session, **values), origin)

    def _put(self, session: Session, origin: object | None) -> None:
        what = kinds_between(self._session, session)
        self._session = session
        if what:
            self._emit(what, origin)

    def _emit(self, what, origin) -> None:
        self.changed.emit(Change(frozenset(what), origin))
