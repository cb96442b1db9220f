"""Edits of a session as pure functions: each takes a Session (and what the user chose) and returns the new
Session, or refuses with a message and changes nothing. The window's model applies them and keeps the old
value for undo; `describe_edit` says in words what one made of another. Numpy only; never imports Qt.

A check names its mounts, so renaming a mount renames it in every check too (one edit).
"""

from __future__ import annotations

from dataclasses import fields, replace

from core import describe
from core.average import Average, average
from core.chain import Chain
from core.errors import FramewrightError
from core.measurement import MAX_MEASUREMENTS_PER_MOUNT, Measurement
from core.orientation import Orientation
from core.position import Position
from core.session_values import Mount, PartProperties, SavedCheck, Session


def mount_index(session: Session, index: int | None) -> int:
    """The mount an edit is about: the selected one when not told."""
    index = session.selected if index is None else index
    if not isinstance(index, int) or isinstance(index, bool) or not 0 <= index < len(session.mounts):
        raise IndexError(f"mount {index} is outside 0..{len(session.mounts) - 1}")
    return index


def _with_mount(session: Session, index: int, mount: Mount) -> Session:
    return replace(session, mounts=session.mounts[:index] + (mount,) + session.mounts[index + 1:])


def unused_name(session: Session, base: str) -> str:
    """`base`, or `base 2`, `base 3`, … whichever no mount has yet."""
    names = {m.name for m in session.mounts}
    if base not in names:
        return base
    n = 2
    while f"{base} {n}" in names:
        n += 1
    return f"{base} {n}"


# ---- which mount, and how numbers are shown ---------------------------------------------------------

def select(session: Session, index: int) -> Session:
    return replace(session, selected=mount_index(session, index))


def set_preferences(session: Session, **changes) -> Session:
    """How numbers are shown (units, orders, sequence, digits, thresholds); refuses values not valid."""
    return replace(session, preferences=replace(session.preferences, **changes))


def set_reference_frame(session: Session, key: str) -> Session:
    """Name the reference directions after a frame preset (core/describe.py). It never changes R; it sets
    where gravity points for level readings."""
    return replace(session, reference_frame=describe.frame_preset(key).key)


# ---- one mount's values -----------------------------------------------------------------------------

def set_orientation(session: Session, orientation: Orientation, index: int | None = None) -> Session:
    if not isinstance(orientation, Orientation):
        raise TypeError("set_orientation needs an Orientation")
    index = mount_index(session, index)
    return _with_mount(session, index, session.mounts[index].with_orientation(orientation))


def set_position(session: Session, position: Position | None, index: int | None = None) -> Session:
    """A mount's position (a core.position.Position), or none."""
    if position is not None and not isinstance(position, Position):
        raise TypeError("set_position needs a Position or None")
    index = mount_index(session, index)
    return _with_mount(session, index, session.mounts[index].with_position(position))


def set_pose(session: Session, orientation: Orientation, position: Position | None) -> Session:
    """The selected mount's orientation and position together."""
    return set_position(set_orientation(session, orientation), position)


def set_part(session: Session, part: PartProperties, index: int | None = None) -> Session:
    """A mount's part (box size, face names, boresight face)."""
    if not isinstance(part, PartProperties):
        raise TypeError("set_part needs PartProperties")
    index = mount_index(session, index)
    return _with_mount(session, index, replace(session.mounts[index], part=part))


def snap_to_right_angle(session: Session) -> Session:
    """The selected mount at the nearest of the 24 right-angle orientations."""
    near = describe.nearest_right_angle(session.current_mount.orientation)
    return set_orientation(session, Orientation.from_matrix(near.right_angle.matrix))


# ---- repeated measurements of the selected mount ----------------------------------------------------

def set_measurements(session: Session, measurements, index: int | None = None) -> Session:
    index = mount_index(session, index)
    return _with_mount(session, index, session.mounts[index].with_measurements(measurements))


def add_measurement(session: Session, source: str = "typed", weight: float = 1.0) -> Session:
    """Keep the selected mount's current orientation as one more measurement, of `weight` in the average."""
    mount = session.current_mount
    if len(mount.measurements) >= MAX_MEASUREMENTS_PER_MOUNT:
        raise ValueError(f"“{mount.name}” already keeps {MAX_MEASUREMENTS_PER_MOUNT:,} measurements, the most "
                         "a mount can; remove some first")
    return set_measurements(session, mount.measurements + (Measurement(mount.orientation, weight, source),))


def remove_measurement(session: Session, number: int) -> Session:
    """Without measurement `number` (0-based) of the selected mount."""
    kept = session.current_mount.measurements
    if not 0 <= number < len(kept):
        raise IndexError(f"measurement {number + 1} is not one of the {len(kept)} kept")
    return set_measurements(session, kept[:number] + kept[number + 1:])


def clear_measurements(session: Session) -> Session:
    return set_measurements(session, ())


def current_average(session: Session) -> Average | None:
    """The average of the selected mount's measurements (core/average.py); None when it has none or every
    weight is 0."""
    measured = session.current_mount.measurements
    if not measured:
        return None
    try:
        return average([m.orientation for m in measured], [m.weight for m in measured])
    except FramewrightError:
        return None


def use_average(session: Session) -> Session:
    """The selected mount at the average of its measurements."""
    result = current_average(session)
    if result is None:
        raise ValueError("there is no average: the mount keeps no measurements with a weight above 0")
    return set_orientation(session, result.mean)


# ---- the list of mounts -----------------------------------------------------------------------------

def add_mount(session: Session, name: str | None = None, orientation: Orientation | None = None,
              position: Position | None = None) -> Session:
    """A new mount at the end, selected."""
    mount = Mount(name or unused_name(session, "Mount"), orientation or Orientation.identity(), position=position)
    return replace(session, mounts=session.mounts + (mount,), selected=len(session.mounts))


def duplicate_mount(session: Session, index: int | None = None) -> Session:
    """A copy of a mount right after it, under a name of its own, selected."""
    index = mount_index(session, index)
    source = session.mounts[index]
    copy = source.renamed(unused_name(session, source.name + " copy"))
    if source.notes:  # the original's note may state its angles, which the copy will not keep for long
        copy = replace(copy, notes=f"Copy of “{source.name}” (its note stays with it).")
    mounts = session.mounts[: index + 1] + (copy,) + session.mounts[index + 1:]
    return replace(session, mounts=mounts, selected=index + 1)


def rename_mount(session: Session, index: int, name: str) -> Session:
    """A mount under a new name (spaces around it dropped), and the checks that named it with it."""
    name = name.strip() if isinstance(name, str) else name
    if not name:
        raise ValueError("a mount needs a name; the old one is kept")
    index = mount_index(session, index)
    old_name = session.mounts[index].name
    renamed = _with_mount(session, index, session.mounts[index].renamed(name))
    checks = tuple(replace(c, nominal=name if c.nominal == old_name else c.nominal,
                           measured=name if c.measured == old_name else c.measured) for c in session.checks)
    return replace(renamed, checks=checks)


def delete_mount(session: Session, index: int | None = None) -> Session:
    """Without a mount; the selection stays on the same mount, or moves to its neighbour."""
    index = mount_index(session, index)
    if len(session.mounts) <= 1:
        raise ValueError("the session needs at least one mount; the last one cannot be deleted")
    mounts = session.mounts[:index] + session.mounts[index + 1:]
    selected = session.selected
    if selected > index:
        selected -= 1
    elif selected == index:
        selected = min(index, len(mounts) - 1)
    return replace(session, mounts=mounts, selected=selected)


# ---- the chain and the check the panels edit ---------------------------------------------------------

def set_chain(session: Session, chain: Chain) -> Session:
    """The chain the Chain panel edits (the first) replaced."""
    if not isinstance(chain, Chain):
        raise TypeError("set_chain needs a Chain")
    return replace(session, chains=(chain,) + session.chains[1:])


def set_check(session: Session, check: SavedCheck) -> Session:
    """The check the Check panel shows (the first) replaced."""
    if not isinstance(check, SavedCheck):
        raise TypeError("set_check needs a SavedCheck")
    return replace(session, checks=(check,) + session.checks[1:])


def chain_to_mount(session: Session) -> Session:
    """The chain's product (orientation and position) as a new mount named after the chain, selected."""
    chain = session.chain
    base = chain.name if chain.name and chain.name != "chain" else "Chain"
    orientation, position = chain.pose_product()
    return add_mount(session, unused_name(session, f"{base} product"), orientation, position)


# ---- what an edit did, in words ---------------------------------------------------------------------

def changed_fields(old: Session, new: Session) -> frozenset[str]:
    """The names of the Session fields that differ."""
    return frozenset(f.name for f in fields(Session) if getattr(old, f.name) != getattr(new, f.name))


def changed_mount_fields(old: Mount, new: Mount) -> frozenset[str]:
    return frozenset(f.name for f in fields(Mount) if getattr(old, f.name) != getattr(new, f.name))


def _mounts_in_words(old: Session, new: Session) -> str:
    before, after = old.mounts, new.mounts
    if len(after) == len(before) + 1:
        added = next((m for m, b in zip(after, before) if m != b), after[-1])
        return f"Add mount “{added.name}”"
    if len(after) == len(before) - 1:
        gone = next((b for m, b in zip(after, before) if m != b), before[-1])
        return f"Delete mount “{gone.name}”"
    edited = [(b, a) for b, a in zip(before, after) if a != b]
    if len(edited) != 1:
        return "Edit mounts"
    b, a = edited[0]
    what = changed_mount_fields(b, a)
    if what == {"name"}:
        return f"Rename mount to “{a.name}”"
    if what == {"orientation"}:
        return "Edit orientation"
    if what == {"position"}:
        verb = "Clear" if a.position is None else "Set" if b.position is None else "Edit"
        return f"{verb} the position of “{a.name}”"
    if what == {"orientation", "position"}:
        return f"Edit the pose of “{a.name}”"
    if what == {"part"}:
        return f"Edit the part of “{a.name}”"
    if what == {"notes"}:
        return f"Edit the notes of “{a.name}”"
    if what == {"measurements"}:
        was, now = len(b.measurements), len(a.measurements)
        if now == 0:
            return f"Clear the measurements of “{a.name}”"
        if now == was + 1 and a.measurements[:was] == b.measurements:
            return f"Add measurement {now} to “{a.name}”"
        if now == was - 1:
            gone = next((i for i, (x, y) in enumerate(zip(a.measurements, b.measurements)) if x != y), was - 1)
            return f"Remove measurement {gone + 1} of “{a.name}”"
        return f"Edit the measurements of “{a.name}”"
    return f"Edit mount “{a.name}”"


_FIELD_WORDS = {"chains": "Edit chain", "checks": "Edit check", "preferences": "Change how numbers are shown",
                "description": "Edit the description", "extra": "Edit kept data", "selected": "Select a mount"}


def describe_edit(old: Session, new: Session) -> str:
    """What the edit from `old` to `new` did, for the Undo menu ("Add mount “Spare”", "Edit chain")."""
    what = changed_fields(old, new)
    if "mounts" in what:
        return _mounts_in_words(old, new)    # a rename's checks and an add's selection follow the mounts
    if "reference_frame" in what:
        return f"Name the reference directions after {describe.frame_preset(new.reference_frame).title}"
    words = [_FIELD_WORDS[name] for name in sorted(what)]
    return "; ".join(words) if words else "No change"
