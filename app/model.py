"""SessionModel: the only place the window's state lives.

It holds the session's mounts, the selected one, the display preferences and the QUndoStack. Every change
to the mounts goes through an undo command (app/commands.py); every change of any kind is announced by the
one ``changed`` signal, carrying a ``Change`` that says what changed and who made it (the origin), so the
editor that made an edit can ignore it and keep the user's own spelling.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from PySide6.QtCore import QObject, QTimer, Signal
from PySide6.QtGui import QUndoStack

from app import commands
from core.orientation import Orientation
from core.session import Mount, Preferences, Session

# What a change can touch.
ORIENTATION = "orientation"  # the selected mount's orientation
MOUNTS = "mounts"  # the list of mounts: count, names, order, properties
SELECTION = "selection"  # which mount is selected (so the current orientation changed too)
PREFERENCES = "preferences"  # how numbers are shown

# Continuous edits (typing, spin arrows, wheel, slider) merge while they keep coming; a pause this long
# ends the run, as does committing a field, leaving the editor, or undo/redo.
MERGE_IDLE_MS = 1200


@dataclass(frozen=True)
class Change:
    what: frozenset
    origin: object | None = None

    def touches(self, *kinds: str) -> bool:
        return any(kind in self.what for kind in kinds)

    def made_by(self, view: object) -> bool:
        return self.origin is not None and self.origin is view


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
        self._mounts: tuple[Mount, ...] = self._session.mounts
        self._selected = self._session.selected
        self._preferences = self._session.preferences
        self.file_path: str | None = None

    # ---- reading --------------------------------------------------------------------------------
    @property
    def mounts(self) -> tuple[Mount, ...]:
        return self._mounts

    @property
    def selected_index(self) -> int:
        return self._selected

    @property
    def preferences(self) -> Preferences:
        return self._preferences

    def current_mount(self) -> Mount:
        return self._mounts[self._selected]

    def current_orientation(self) -> Orientation:
        return self._mounts[self._selected].orientation

    def ghost_orientation(self) -> Orientation | None:
        """A second orientation the scene may draw faintly (e.g. a nominal); none yet."""
        return None

    def session(self) -> Session:
        """The state as plain data, ready to save."""
        return replace(self._session, mounts=self._mounts, selected=self._selected,
                       preferences=self._preferences)

    # ---- whole-session changes (not undoable: they start a new history) ------------------------
    def load_session(self, session: Session, file_path: str | None = None, keep_preferences: bool = True) -> None:
        """Replace the session. The user's own display preferences stay unless told otherwise."""
        self.end_continuous()
        self.undo_stack.clear()
        self._session = session
        self._mounts = session.mounts
        self._selected = session.selected
        if not keep_preferences:
            self._preferences = session.preferences
        self.file_path = file_path
        self.undo_stack.setClean()
        self._emit({ORIENTATION, MOUNTS, SELECTION, PREFERENCES}, None)

    # ---- view state (not undoable: it changes no data) -----------------------------------------
    def select(self, index: int, origin: object | None = None) -> None:
        if not 0 <= index < len(self._mounts):
            raise IndexError(f"mount {index} is outside 0..{len(self._mounts) - 1}")
        if index == self._selected:
            return
        self.end_continuous()
        self._selected = index
        self._emit({SELECTION, ORIENTATION}, origin)

    def set_preferences(self, origin: object | None = None, **changes) -> None:
        """Change how numbers are shown (units, orders, sequence, digits, thresholds)."""
        new = replace(self._preferences, **changes)  # validates; raises FramewrightError when not valid
        if new == self._preferences:
            return
        self._preferences = new
        self._emit({PREFERENCES}, origin)

    # ---- data edits: every one through an undo command -----------------------------------------
    def set_orientation(self, orientation: Orientation, origin: object | None = None, *,
                        continuous_key: object = None, text: str = "Edit orientation") -> None:
        """Set the selected mount's orientation. Edits with the same ``continuous_key`` that follow each
        other without a pause merge into one undo step (one drag, one typing run)."""
        if not isinstance(orientation, Orientation):
            raise TypeError("set_orientation needs an Orientation")
        if continuous_key is None:
            self.end_continuous()
        old = self.current_orientation()
        if orientation == old:
            return  # nothing to change (a run that returns to its start is dropped by the merge)
        command = commands.SetOrientationCommand(self, self._selected, old, orientation, origin,
                                                 text, continuous_key, self._merge_token)
        self.undo_stack.push(command)
        if continuous_key is not None:
            self._idle.start()
        else:
            self.end_continuous()

    def end_continuous(self) -> None:
        """End the current run of merging edits; the next edit starts a new undo step."""
        self._idle.stop()
        self._merge_token += 1

    @property
    def merge_token(self) -> int:
        return self._merge_token

    def add_mount(self, name: str | None = None, orientation: Orientation | None = None,
                  origin: object | None = None) -> None:
        mount = Mount(name or self.unused_name("Mount"), orientation or Orientation.identity())
        self._push_mounts(self._mounts + (mount,), len(self._mounts), f"Add mount “{mount.name}”", origin)

    def duplicate_mount(self, index: int | None = None, origin: object | None = None) -> None:
        index = self._selected if index is None else index
        source = self._mounts[index]
        copy = source.renamed(self.unused_name(source.name + " copy"))
        mounts = self._mounts[: index + 1] + (copy,) + self._mounts[index + 1:]
        self._push_mounts(mounts, index + 1, f"Duplicate mount “{source.name}”", origin)

    def rename_mount(self, index: int, name: str, origin: object | None = None) -> None:
        name = name.strip()
        if not name:
            raise ValueError("a mount needs a name; the old one is kept")
        if name == self._mounts[index].name:
            return
        mounts = self._mounts[:index] + (self._mounts[index].renamed(name),) + self._mounts[index + 1:]
        self._push_mounts(mounts, self._selected, f"Rename mount to “{name}”", origin)

    def delete_mount(self, index: int | None = None, origin: object | None = None) -> None:
        index = self._selected if index is None else index
        if len(self._mounts) <= 1:
            raise ValueError("the session needs at least one mount; the last one cannot be deleted")
        name = self._mounts[index].name
        mounts = self._mounts[:index] + self._mounts[index + 1:]
        if self._selected < index:
            selected = self._selected
        elif self._selected > index:
            selected = self._selected - 1
        else:
            selected = min(index, len(mounts) - 1)
        self._push_mounts(mounts, selected, f"Delete mount “{name}”", origin)

    def unused_name(self, base: str) -> str:
        names = {m.name for m in self._mounts}
        if base not in names:
            return base
        n = 2
        while f"{base} {n}" in names:
            n += 1
        return f"{base} {n}"

    def undo(self) -> None:
        self.end_continuous()
        self.undo_stack.undo()

    def redo(self) -> None:
        self.end_continuous()
        self.undo_stack.redo()

    # ---- used by the undo commands only ---------------------------------------------------------
    def _push_mounts(self, mounts, selected, text, origin) -> None:
        self.end_continuous()
        self.undo_stack.push(commands.ReplaceMountsCommand(self, self._mounts, self._selected,
                                                           tuple(mounts), selected, text, origin))

    def _apply_orientation(self, index: int, orientation: Orientation, origin: object | None) -> None:
        what = {ORIENTATION}
        if index != self._selected:  # undo of an edit on another mount: show that mount again
            self._selected = index
            what.add(SELECTION)
        mount = self._mounts[index]
        self._mounts = self._mounts[:index] + (mount.with_orientation(orientation),) + self._mounts[index + 1:]
        self._emit(what, origin)

    def _apply_mounts(self, mounts: tuple[Mount, ...], selected: int, origin: object | None) -> None:
        self._mounts = mounts
        self._selected = selected
        self._emit({MOUNTS, SELECTION, ORIENTATION}, origin)

    def _emit(self, what, origin) -> None:
        self.changed.emit(Change(frozenset(what), origin))
