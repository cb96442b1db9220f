"""What a change of the session touched, as the one ``changed`` signal of the model carries it: the kinds
of change (derived from the fields that differ between the session before and after) and the origin, the
view that made it, so that view can ignore it and keep the user's own spelling."""

from __future__ import annotations

from dataclasses import dataclass

from core.operations import changed_fields, changed_mount_fields
from core.session import Session

# What a change can touch.
ORIENTATION = "orientation"  # the selected mount's orientation
POSITION = "position"  # the selected mount's position (or that it has none)
MOUNTS = "mounts"  # the list of mounts: count, names, order, properties, another mount's values
SELECTION = "selection"  # which mount is selected (so the current orientation changed too)
PREFERENCES = "preferences"  # how numbers are shown
CHAIN = "chain"  # the mount chain: its steps, or whether the scene shows its frames
CHECK = "check"  # the check: nominal and measured mounts, mode, axis, tolerances
WORDS = "words"  # which names the reference directions get in words ("down", "north"): the reference frame
SESSION = "session"  # a whole other session was loaded (or a new one begun): nothing of the last one holds
MEASUREMENTS = "measurements"  # the selected mount's repeated measurements
DESCRIPTION = "description"  # the session's description, or the data it keeps for other programs

# What the selected mount is seen through: all of it changes when another mount is selected.
CURRENT_MOUNT = frozenset({SELECTION, ORIENTATION, POSITION, MEASUREMENTS})
EVERYTHING = frozenset({ORIENTATION, POSITION, MOUNTS, SELECTION, PREFERENCES, CHAIN, CHECK, WORDS, MEASUREMENTS,
                        DESCRIPTION, SESSION})

# A selected mount's field and the kind of change it is; any other field of a mount is in the mounts list.
_MOUNT_FIELD_KINDS = {"orientation": ORIENTATION, "position": POSITION, "measurements": MEASUREMENTS}
_SESSION_FIELD_KINDS = {"preferences": PREFERENCES, "reference_frame": WORDS, "chains": CHAIN, "checks": CHECK,
                        "description": DESCRIPTION, "extra": DESCRIPTION}


@dataclass(frozen=True)
class Change:
    what: frozenset
    origin: object | None = None

    def touches(self, *kinds: str) -> bool:
        return any(kind in self.what for kind in kinds)

    def made_by(self, view: object) -> bool:
        return self.origin is not None and self.origin is view


def kinds_between(old: Session, new: Session) -> frozenset[str]:
    """The kinds of change that lead from `old` to `new`."""
    changed = changed_fields(old, new)
    what = {_SESSION_FIELD_KINDS[name] for name in changed if name in _SESSION_FIELD_KINDS}
    if "selected" in changed:
        what |= CURRENT_MOUNT
    if "mounts" in changed:
        pairs = list(zip(old.mounts, new.mounts))
        edited = [(i, changed_mount_fields(b, a)) for i, (b, a) in enumerate(pairs) if a != b]
        if len(old.mounts) != len(new.mounts) or any(fields - set(_MOUNT_FIELD_KINDS) for _, fields in edited):
            what |= {MOUNTS} | CURRENT_MOUNT        # the list itself: rows, names, parts, notes
        for i, fields in edited:
            if i == new.selected:
                what |= {_MOUNT_FIELD_KINDS[name] for name in fields if name in _MOUNT_FIELD_KINDS}
            else:                                   # another mount (a check's nominal, say)
                what.add(MOUNTS)
    return frozenset(what)
