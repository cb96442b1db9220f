"""The expressions a pose reader evaluated ('${-pi/2}' in a description file, 'yaw: PI/2' in a YAML block):
each one is said in a note of the pose it belongs to, and a pose whose angles are written with π reads them
in radians (π is half a turn in radians; in degrees 'pi/2' would be 1.57°).

The readers take their numbers through poses.values_in; `read_poses` collects the evaluation notes that
values_in makes while one reader runs and hands them to the poses by line."""

from __future__ import annotations

import contextvars
import math
import re


_EVALUATED = contextvars.ContextVar("framewright_evaluated_expressions", default=None)
_EVALUATION_NOTE = re.compile(r"^line (?P<line>\d+): evaluated '(?P<written>[^']*)'")
_PI = re.compile(r"pi|π", re.IGNORECASE)
_UNITLESS_KINDS = ("matrix", "quaternion")      # kinds whose numbers have no angle unit


def collect(notes) -> None:
    """Called by values_in with a parse's notes: keeps those that say an expression was evaluated."""
    found = _EVALUATED.get()
    if found is not None:
        found.extend(n for n in notes if _EVALUATION_NOTE.match(n))


def read_poses(reader, text: str) -> list | None:
    """reader(text), with the notes of the expressions evaluated on the way given to its poses."""
    found: list[str] = []
    token = _EVALUATED.set(found)
    try:
        poses = reader(text)
    finally:
        _EVALUATED.reset(token)
    if poses and found:
        _hand_out(poses, list(dict.fromkeys(found)))
    return poses


def _hand_out(poses: list, notes: list[str]) -> None:
    """Each note to the pose (a poses.PoseText) that starts on or before its line (the last such one);
    with one pose, all of them."""
    ordered = sorted(poses, key=lambda p: p.line)
    for i, pose in enumerate(ordered):
        end = ordered[i + 1].line if i + 1 < len(ordered) else math.inf
        first = pose.line if i else -math.inf
        mine = [n for n in notes if first <= int(_EVALUATION_NOTE.match(n).group("line")) < end]
        if not mine:
            continue
        pose.notes = list(pose.notes) + mine
        with_pi = [_EVALUATION_NOTE.match(n).group("written") for n in mine if _PI.search(n)]
        if with_pi and "units" not in pose.fixed and pose.fixed.get("kind") not in _UNITLESS_KINDS:
            pose.fixed = {**pose.fixed, "units": "rad"}
            pose.notes.append(f"'{with_pi[0]}' names π: the angles are radians")
