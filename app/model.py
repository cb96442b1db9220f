"""SessionModel: the only place the window's state lives.

It holds the session's mounts, the selected one, the display preferences and the QUndoStack. Every change
to the mounts goes through an undo command (app/commands.py); every change of any kind is announced by the
one ``changed`` signal, carrying a ``Change`` that says what changed and who made it (the origin), so the
editor that made an edit can ignore it and keep the user's own spelling.

It also holds the session's mount chain (Chain panel) and check (Check panel: which mount is nominal,
which is measured, and the CheckSettings), each replaced as a whole through an undo command. The ghost
rule: the scene's ghost is the check's nominal mount exactly when a nominal and a measured mount are both
chosen, they are different mounts, and the selected mount is the measured one; otherwise there is no
second orientation (the scene then shows the reference).

Each mount may keep repeated measurements (core/measurement.py): adding the current orientation,
removing one and clearing them are one undo step each (MEASUREMENTS), and using their average
(core/average.py) is one orientation edit.
"""

from __future__ import annotations

from dataclasses import dataclass, replace

from PySide6.QtCore import QObject, QTimer, Signal
from PySide6.QtGui import QUndoStack

from app import commands
from core import describe
from core.average import Average, average
from core.chain import Chain
from core.errors import FramewrightError
from core.measurement import MAX_MEASUREMENTS_PER_MOUNT, Measurement
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, Preferences, SavedCheck, Session

# What a change can touch.
ORIENTATION = "orientation"  # the selected mount's orientation
POSITION = "position"  # the selected mount's position (or that it has none)
MOUNTS = "mounts"  # the list of mounts: count, names, order, properties
SELECTION = "selection"  # which mount is selected (so the current orientation changed too)
PREFERENCES = "preferences"  # how numbers are shown
CHAIN = "chain"  # the mount chain: its steps, or whether the scene shows its frames
CHECK = "check"  # the check: nominal and measured mounts, mode, axis, tolerances
WORDS = "words"  # which names the reference directions get in words ("down", "north")
SESSION = "session"  # a whole other session was loaded (or a new one begun): nothing of the last one holds
MEASUREMENTS = "measurements"  # the selected mount's repeated measurements

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
        self._chains: tuple[Chain, ...] = self._session.chains
        self._checks: tuple[SavedCheck, ...] = self._session.checks
        self._show_chain_frames = True
        self._words_preset = self._session.reference_frame
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
        """The check's nominal orientation while its measured mount is selected (the rule above); else None."""
        nominal = self._ghost_mount()
        return None if nominal is None else nominal.orientation

    def ghost_label(self) -> str | None:
        nominal = self._ghost_mount()
        return None if nominal is None else f"nominal, {nominal.name}"

    def _ghost_mount(self) -> Mount | None:
        nominal, measured = self.check_mount_indices()
        if nominal is None or measured is None or nominal == measured or measured != self._selected:
            return None
        return self._mounts[nominal]

    # chain
    @property
    def chains(self) -> tuple[Chain, ...]:
        return self._chains

    @property
    def chain(self) -> Chain:
        """The chain the Chain panel edits (the session's first; an empty one when it has none)."""
        return self._chains[0] if self._chains else Chain()

    @property
    def show_chain_frames(self) -> bool:
        return self._show_chain_frames

    def scene_frames(self) -> list[tuple[Orientation, str]]:
        """The chain's intermediate frames for the scene, as (orientation, label), reference side first;
        the last one is the product. Empty when the frames are switched off."""
        if not self._show_chain_frames:
            return []
        frames = self.chain.frames()
        out = []
        for k, frame in enumerate(frames, start=1):
            label = f"{k} {frame.name}" if frame.name else f"{k}"
            out.append((frame.orientation, label + (" = product" if k == len(frames) else "")))
        return out

    # check
    @property
    def check(self) -> SavedCheck:
        """The check the Check panel shows (the session's first; an empty one when it has none)."""
        return self._checks[0] if self._checks else SavedCheck()

    def check_mount_indices(self) -> tuple[int | None, int | None]:
        """(nominal, measured) mount indices of the check; None where not chosen or no mount has the name
        (the first mount of that name when several share it)."""
        names = [m.name for m in self._mounts]
        check = self.check
        return tuple(names.index(n) if n in names else None for n in (check.nominal, check.measured))

    def session(self) -> Session:
        """The state as plain data, ready to save."""
        session = replace(self._session, mounts=self._mounts, selected=self._selected,
                          preferences=self._preferences, reference_frame=self._words_preset,
                          chains=self._chains, checks=self._checks)
        return session

    # ---- whole-session changes (not undoable: they start a new history) ------------------------
    def load_session(self, session: Session, file_path: str | None = None, keep_preferences: bool = True) -> None:
        """Replace the session. The user's own display preferences stay unless told otherwise."""
        self.end_continuous()
        self.undo_stack.clear()
        self._session = session
        self._mounts = session.mounts
        self._selected = session.selected
        self._chains = session.chains
        self._checks = session.checks
        self._words_preset = session.reference_frame
        if not keep_preferences:
            self._preferences = session.preferences
        self.file_path = file_path
        self.undo_stack.setClean()
        self._emit({ORIENTATION, POSITION, MOUNTS, SELECTION, PREFERENCES, CHAIN, CHECK, WORDS, MEASUREMENTS,
                    SESSION}, None)

    # ---- view state (not undoable: it changes no data) -----------------------------------------
    def select(self, index: int, origin: object | None = None) -> None:
        if not 0 <= index < len(self._mounts):
            raise IndexError(f"mount {index} is outside 0..{len(self._mounts) - 1}")
        if index == self._selected:
            return
        self.end_continuous()
        self._selected = index
        self._emit({SELECTION, ORIENTATION, POSITION, MEASUREMENTS}, origin)

    def set_preferences(self, origin: object | None = None, **changes) -> None:
        """Change how numbers are shown (units, orders, sequence, digits, thresholds)."""
        new = replace(self._preferences, **changes)  # validates; raises FramewrightError when not valid
        if new == self._preferences:
            return
        self._preferences = new
        self._emit({PREFERENCES}, origin)

    @property
    def words_preset(self) -> str:
        """The frame preset (core/describe.py) whose names the panels use for reference directions."""
        return self._words_preset

    def set_words_preset(self, key: str, origin: object | None = None) -> None:
        """Name the reference directions after a frame preset. It never changes R; it is saved with the
        session as the reference frame's name, and it sets where gravity points for level readings."""
        key = describe.frame_preset(key).key  # validates
        if key != self._words_preset:
            self._words_preset = key
            self._emit({WORDS}, origin)

    def set_show_chain_frames(self, shown: bool, origin: object | None = None) -> None:
        """Whether the scene draws the chain's intermediate frames (a view choice, not saved)."""
        if bool(shown) != self._show_chain_frames:
            self._show_chain_frames = bool(shown)
            self._emit({CHAIN}, origin)

    # ---- data edits: every one through an undo command -----------------------------------------
    def set_orientation(self, orientation: Orientation, origin: object | None = None, *,
                        continuous_key: object = None, text: str = "Edit orientation",
                        pause_ends_run: bool = True) -> None:
        """Set the selected mount's orientation. Edits with the same ``continuous_key`` that follow each
        other without a pause merge into one undo step (one drag, one typing run). A typing run passes
        ``pause_ends_run=False``: it ends when the field commits, never half-typed on a pause."""
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
        if continuous_key is not None and pause_ends_run:
            self._idle.start()
        elif continuous_key is not None:
            self._idle.stop()
        else:
            self.end_continuous()

    def set_position(self, position, origin: object | None = None, index: int | None = None,
                     text: str | None = None) -> None:
        """Set a mount's position (a core.position.Position), or clear it with None: one undo step."""
        if position is not None and not isinstance(position, Position):
            raise TypeError("set_position needs a Position or None")
        index = self._selected if index is None else index
        mount = self._mounts[index]
        old = mount.position
        if position == old:
            return
        if text is None:
            text = (f"Clear the position of “{mount.name}”" if position is None else
                    f"Set the position of “{mount.name}”" if old is None else f"Edit the position of “{mount.name}”")
        self.end_continuous()
        self.undo_stack.push(commands.SetMountFieldCommand(self, index, "position", old, position, text, origin))

    def apply_pose(self, orientation: Orientation, position, text: str, origin: object | None = None) -> None:
        """Set the selected mount's orientation and position together: one undo step."""
        self.undo_stack.beginMacro(text)
        self.set_orientation(orientation, origin=origin, text=text)
        self.set_position(position, origin=origin, text=text)
        self.undo_stack.endMacro()

    # repeated measurements of the selected mount
    def current_average(self) -> Average | None:
        """The average of the selected mount's measurements (core/average.py); None when it has none or
        every weight is 0."""
        measured = self.current_mount().measurements
        if not measured:
            return None
        try:
            return average([m.orientation for m in measured], [m.weight for m in measured])
        except FramewrightError:
            return None

    def add_measurement(self, source: str = "typed", origin: object | None = None) -> None:
        """Keep the selected mount's current orientation as one more measurement: one undo step."""
        mount = self.current_mount()
        if len(mount.measurements) >= MAX_MEASUREMENTS_PER_MOUNT:
            raise ValueError(f"“{mount.name}” already keeps {MAX_MEASUREMENTS_PER_MOUNT:,} measurements, the most "
                             "a mount can; remove some first")
        added = mount.measurements + (Measurement(mount.orientation, 1.0, source),)
        self._push_measurements(added, f"Add measurement {len(added)} to “{mount.name}”", origin)

    def remove_measurement(self, number: int, origin: object | None = None) -> None:
        """Remove measurement `number` (0-based) of the selected mount: one undo step."""
        mount = self.current_mount()
        if not 0 <= number < len(mount.measurements):
            raise IndexError(f"measurement {number + 1} is not one of the {len(mount.measurements)} kept")
        left = mount.measurements[:number] + mount.measurements[number + 1:]
        self._push_measurements(left, f"Remove measurement {number + 1} of “{mount.name}”", origin)

    def clear_measurements(self, origin: object | None = None) -> None:
        mount = self.current_mount()
        if mount.measurements:
            self._push_measurements((), f"Clear the measurements of “{mount.name}”", origin)

    def use_average(self, origin: object | None = None) -> None:
        """Set the selected mount's orientation to the average of its measurements: one undo step."""
        result = self.current_average()
        if result is None:
            raise ValueError("there is no average: the mount keeps no measurements with a weight above 0")
        name = self.current_mount().name
        self.set_orientation(result.mean, origin=origin,
                             text=f"Use the average of {result.count} measurements of “{name}”")

    def _push_measurements(self, measurements, text, origin) -> None:
        self.end_continuous()
        self.undo_stack.push(commands.SetMountFieldCommand(self, self._selected, "measurements",
                                                           self.current_mount().measurements, tuple(measurements),
                                                           text, origin))

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
        if source.notes:  # the original's note may state its angles, which the copy will not keep for long
            copy = replace(copy, notes=f"Copy of “{source.name}” (its note stays with it).")
        mounts = self._mounts[: index + 1] + (copy,) + self._mounts[index + 1:]
        self._push_mounts(mounts, index + 1, f"Duplicate mount “{source.name}”", origin)

    def rename_mount(self, index: int, name: str, origin: object | None = None) -> None:
        name = name.strip()
        if not name:
            raise ValueError("a mount needs a name; the old one is kept")
        old_name = self._mounts[index].name
        if name == old_name:
            return
        mounts = self._mounts[:index] + (self._mounts[index].renamed(name),) + self._mounts[index + 1:]
        text = f"Rename mount to “{name}”"
        check = self.check
        if old_name not in (check.nominal, check.measured):
            self._push_mounts(mounts, self._selected, text, origin)
            return
        # The check names its mounts: rename them there too, in the same undo step.
        self.undo_stack.beginMacro(text)
        self._push_mounts(mounts, self._selected, text, origin)
        self.set_check(replace(check, nominal=name if check.nominal == old_name else check.nominal,
                               measured=name if check.measured == old_name else check.measured),
                       origin=origin, text=text)
        self.undo_stack.endMacro()

    def set_part(self, part, index: int | None = None, origin: object | None = None) -> None:
        """Change a mount's part (box size, face names, boresight face): one undo step."""
        index = self._selected if index is None else index
        mount = self._mounts[index]
        if part == mount.part:
            return
        mounts = self._mounts[:index] + (replace(mount, part=part),) + self._mounts[index + 1:]
        self._push_mounts(mounts, self._selected, f"Edit the part of “{mount.name}”", origin)

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

    def set_chain(self, chain: Chain, origin: object | None = None, text: str = "Edit chain") -> None:
        """Replace the chain the Chain panel edits (one undo step)."""
        if not isinstance(chain, Chain):
            raise TypeError("set_chain needs a Chain")
        if chain == self.chain and self._chains:
            return
        chains = (chain,) + self._chains[1:]
        self._push_value("chains", self._chains, chains, text, origin)

    def set_check(self, check: SavedCheck, origin: object | None = None, text: str = "Edit check") -> None:
        """Replace the check the Check panel shows (one undo step)."""
        if not isinstance(check, SavedCheck):
            raise TypeError("set_check needs a SavedCheck")
        if check == self.check and self._checks:
            return
        checks = (check,) + self._checks[1:]
        self._push_value("checks", self._checks, checks, text, origin)

    def make_chain_mount(self, origin: object | None = None) -> None:
        """Add the chain's product as a new mount, named after the chain, and select it (one undo step)."""
        chain = self.chain
        base = chain.name if chain.name and chain.name != "chain" else "Chain"
        orientation, position = chain.pose_product()
        name = self.unused_name(f"{base} product")
        mount = Mount(name, orientation, position=position)
        self._push_mounts(self._mounts + (mount,), len(self._mounts), f"Add mount “{name}”", origin)

    def snap_to_right_angle(self, origin: object | None = None) -> None:
        """Set the selected mount to the nearest of the 24 right-angle orientations (one undo step)."""
        near = describe.nearest_right_angle(self.current_orientation())
        target = Orientation.from_matrix(near.right_angle.matrix)
        self.set_orientation(target, origin=origin,
                             text=f"Snap to nearest right angle ({near.right_angle.rotation_words})")

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

    def _push_value(self, key, old, new, text, origin) -> None:
        self.end_continuous()
        self.undo_stack.push(commands.ReplaceValueCommand(self, key, old, tuple(new), text, origin))

    def _apply_value(self, key: str, value, origin: object | None) -> None:
        if key == "chains":
            self._chains = value
            self._emit({CHAIN}, origin)
        elif key == "checks":
            self._checks = value
            self._emit({CHECK}, origin)
        else:
            raise KeyError(f"unknown session value {key!r}")

    def _apply_orientation(self, index: int, orientation: Orientation, origin: object | None) -> None:
        what = {ORIENTATION}
        if index != self._selected:  # undo of an edit on another mount: show that mount again
            self._selected = index
            what.add(SELECTION)
        mount = self._mounts[index]
        self._mounts = self._mounts[:index] + (mount.with_orientation(orientation),) + self._mounts[index + 1:]
        self._emit(what, origin)

    # The mount fields replaced whole by SetMountFieldCommand, and the change each one is.
    _MOUNT_FIELDS = {"position": POSITION, "measurements": MEASUREMENTS}

    def _apply_mount_field(self, index: int, field: str, value, origin: object | None) -> None:
        what = {self._MOUNT_FIELDS[field]}
        if index != self._selected:  # undo of an edit on another mount: show that mount again
            self._selected = index
            what |= {SELECTION, ORIENTATION, POSITION, MEASUREMENTS}
        mount = self._mounts[index]
        changed = mount.with_position(value) if field == "position" else mount.with_measurements(value)
        self._mounts = self._mounts[:index] + (changed,) + self._mounts[index + 1:]
        self._emit(what, origin)

    def _apply_mounts(self, mounts: tuple[Mount, ...], selected: int, origin: object | None) -> None:
        self._mounts = mounts
        self._selected = selected
        self._emit({MOUNTS, SELECTION, ORIENTATION, POSITION, MEASUREMENTS}, origin)

    def _emit(self, what, origin) -> None:
        self.changed.emit(Change(frozenset(what), origin))
