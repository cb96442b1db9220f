"""What the Decode list says about each reading, in plain words: its result (axis and angle, the angles in
the session's sequence), its translation and transform name, how far it is from the best reading of the
same transform, and how the list is grouped. No Qt widgets here: the panel draws these words."""

from __future__ import annotations

from dataclasses import dataclass

from app.text import numbers, significant
from core import representations
from core.sequences import preset_names, spelled_sequence

# More readings than this and the list is grouped by kind: at a laptop size the list shows about four
# readings with their results before it scrolls.
ONE_SCREEN = 4

# Longer notes are cut to this many characters in the list (about two lines at a laptop size); the
# reading's tooltip holds every note in full.
NOTE_CHARS = 120

# a kind in words: the registry's names (core/representations.py), with the two the list says its own way
_KIND_WORDS = {**{r.kind: r.name for r in representations.ALL}, "matrix": "matrix", "angles": "three angles"}
_UNIT_WORDS = {"deg": "degrees", "rad": "radians"}
_ORDER_WORDS = {"wxyz": "w, x, y, z", "xyzw": "x, y, z, w"}


@dataclass(frozen=True)
class Group:
    """A header (None: no header) and the positions, in the decoder's list, of the readings under it."""
    header: str | None
    members: tuple[int, ...]


def _value_words(key: str, value) -> str | None:
    """One convention in words; None when there is nothing to say (a value the decoder left unset)."""
    if value is None:
        return None
    if key == "intrinsic" and isinstance(value, bool):
        return "intrinsic" if value else "extrinsic"
    if key == "transposed" and isinstance(value, bool):
        return "transposed" if value else "as written"
    if isinstance(value, bool):
        return f"{key.replace('_', ' ')} {'yes' if value else 'no'}"
    if key == "units":
        return _UNIT_WORDS.get(str(value), str(value))
    if key == "order":
        return f"order {_ORDER_WORDS.get(str(value), str(value))}"
    if key == "sequence":
        return f"sequence {value}"
    return str(value)


def conventions_words(reading) -> str:
    """The reading's assumptions as words ("sequence XYZ, extrinsic, radians"), never Python's words."""
    conventions = reading.conventions
    if isinstance(conventions, str):
        return conventions
    if not isinstance(conventions, dict):
        return "; ".join(str(v) for v in conventions or () if v is not None)
    words = (_value_words(k, v) for k, v in conventions.items())
    return ", ".join(w for w in words if w)


def _angle(value: float, degrees: bool, digits: int) -> str:
    return f"{significant(float(value), digits)}{'°' if degrees else ' rad'}"


def rotation_words(orientation, preferences) -> list[str]:
    """Axis and angle, then the angles in the preferred sequence, in the preferred angle unit."""
    digits, degrees = preferences.significant_digits, preferences.angle_units != "rad"
    axis, angle = orientation.as_axis_angle(degrees=degrees)
    if significant(float(angle), digits) == "0":
        lines = ["rotation: none (angle 0)"]
    else:
        lines = [f"rotation {_angle(angle, degrees, digits)} about ({numbers(axis, digits)})"]
    angles = orientation.as_angles(preferences.sequence, preferences.intrinsic, degrees=degrees)
    names = preset_names(preferences.sequence, preferences.intrinsic)
    spelled = spelled_sequence(preferences.sequence, preferences.intrinsic)
    kind = "intrinsic" if preferences.intrinsic else "extrinsic"
    lines.append(f"{spelled} {kind}{' (' + ', '.join(names) + ')' if names else ''}: "
                 f"{', '.join(_angle(a, degrees, digits) for a in angles.angles)}"
                 + (" (gimbal lock: only the first and third together are known)" if angles.locked else ""))
    return lines


def translation_words(reading, digits: int) -> str:
    """'0.1, 0, 0.2 m', or the numbers and '(unit not stated)' when the text gives no unit."""
    spelled = numbers(reading.translation, digits)
    return f"{spelled} {reading.translation_unit}" if reading.translation_unit else f"{spelled} (unit not stated)"


def elided(text: str, limit: int = NOTE_CHARS) -> str:
    return text if len(text) <= limit else text[:limit - 1].rstrip() + "…"


def shared_notes(readings) -> list[str]:
    """Notes every reading carries (they are about the text, not one reading): said once, above the list."""
    return [note for note in readings[0].notes if all(note in r.notes for r in readings[1:])] if readings else []


def reading_lines(reading, rank: int, best, best_rank: int, preferences, show_name: bool,
                  said_above=()) -> list[str]:
    """The rows of one reading in the list: its name and result first, then its own notes (cut short)."""
    digits = preferences.significant_digits
    lines = [f"{rank}. {reading.label}"]
    if best is not None and best is not reading:
        distance = significant(float(best.orientation.angle_to(reading.orientation)), digits)
        lines.append(f"   differs from reading {best_rank} by {distance}°")
    if show_name and reading.name is not None:
        lines.append(f"   transform {elided(reading.name)}")
    lines += [f"   {line}" for line in rotation_words(reading.orientation, preferences)]
    if reading.translation is not None:
        lines.append(f"   translation x, y, z: {translation_words(reading, digits)}")
    lines += [f"   note: {elided(note)}" for note in reading.notes if note not in said_above]
    return lines


def reading_tip(reading, lines: list[str]) -> str:
    """The reading in full for its tooltip: every line uncut, its conventions and why it ranks there."""
    full = [line for line in lines if not line.lstrip().startswith("note: ")]
    full += [f"   note: {note}" for note in reading.notes]
    if reading.name is not None:
        full.append(f"Transform: {reading.name}")
    full.append(f"Conventions: {conventions_words(reading)}")
    if reading.why:
        full.append(f"Rank: {reading.why}")
    return "\n".join(full)


def _count(n: int) -> str:
    return f"{n} reading{'s' if n != 1 else ''}"


def _transform_title(name, n: int) -> str:
    return f"Transform {elided(name) if name is not None else '(no name)'}: {_count(n)}"


def _kind_title(kind, n: int) -> str:
    words = _KIND_WORDS.get(kind, kind)
    return f"{words[:1].upper()}{words[1:]}: {_count(n)}"


def groups(readings) -> list[Group]:
    """Several named transforms: one group per name, in the text's order. Otherwise, a list longer than a
    screen: one group per kind, in the order of each kind's best reading. Otherwise one group, no header.
    Each group keeps the decoder's order, so its best reading comes first."""
    if len({r.name for r in readings}) > 1:
        key, title = (lambda r: r.name), _transform_title
    elif len(readings) > ONE_SCREEN:
        key, title = (lambda r: r.kind), _kind_title
    else:
        return [Group(None, tuple(range(len(readings))))]
    members: dict = {}
    for i, reading in enumerate(readings):
        members.setdefault(key(reading), []).append(i)
    return [Group(title(value, len(found)), tuple(found)) for value, found in members.items()]
