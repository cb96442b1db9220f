"""The one undo command of the session model: the whole (immutable) Session before and after an edit.

Undo and redo restore exactly the fields the edit changed (a field diff of the two values) and nothing else,
so what is not undoable (how numbers are shown, which names the reference directions get) is never
rolled back by undoing an edit made before it. An edit of the mounts also brings back the mount that was
selected when it was made (undo of an edit on another mount shows that mount again). Its text, when the
model gives none, says what the diff did (core/operations.describe_edit)."""

from __future__ import annotations

from PySide6.QtGui import QUndoCommand

from core.operations import changed_fields, describe_edit

CONTINUOUS_ID = 1001
# A run that ends this close to where it started (radians) has returned to its start.
RETURNED_TO_START_RAD = 1e-13


# Qt calls redo, undo and mergeWith itself. PySide6 6.11 crashes the whole process (a segfault in shiboken's
# error report) when an error the interpreter raised (a TypeError, a KeyError, not a `raise`) leaves such an
# override without passing through an except clause; so each re-raises what it catches, and the caller (the
# editor that made the edit) gets the error instead of the window crashing.
class ReplaceSessionCommand(QUndoCommand):
    """Replace the session. Consecutive continuous edits with the same key merge into one step (one drag,
    one typing run); a merged step that ends where it started is obsolete and leaves the stack."""

    def __init__(self, model, old, new, origin, text=None, continuous_key=None, merge_token=None):
        super().__init__(text or describe_edit(old, new))
        self._model = model
        self.old = old
        self.new = new
        self._first_origin = origin  # the editor that made it hears the first redo as its own
        self.continuous_key = continuous_key
        self.merge_token = merge_token

    @property
    def fields(self) -> frozenset[str]:
        """The session fields this edit changed (and so restores)."""
        return changed_fields(self.old, self.new)

    def id(self) -> int:
        return CONTINUOUS_ID if self.continuous_key is not None else -1

    def mergeWith(self, other) -> bool:
        try:
            return self._merge(other)
        except Exception:
            raise                                   # re-raised: see above the class

    def _merge(self, other) -> bool:
        if (getattr(other, "continuous_key", None) != self.continuous_key
                or other.merge_token != self.merge_token
                or other.old != self.new):           # something else changed in between: a step of its own
            return False
        self.new = other.new
        if self.new == self.old:
            self.setObsolete(True)
        elif _returned_to_start(self.old, self.new):
            # Back where the run began but for the last digit of rounding: restore the start exactly,
            # so the step disappears and nothing is left slightly off.
            self._model._restore(self.old, self.fields, None)
            self.setObsolete(True)
        return True

    def redo(self) -> None:
        try:
            origin, self._first_origin = self._first_origin, None
            self._model._restore(self.new, self.fields, origin)
        except Exception:
            raise                                   # re-raised: see above the class

    def undo(self) -> None:
        try:
            self._model._restore(self.old, self.fields, None)
        except Exception:
            raise                                   # re-raised: see above the class


def _returned_to_start(old, new) -> bool:
    """Only orientations differ, each by no more than rounding."""
    if changed_fields(old, new) != {"mounts"} or len(old.mounts) != len(new.mounts):
        return False
    for before, after in zip(old.mounts, new.mounts):
        if after.with_orientation(before.orientation) != before:
            return False
        if not after.orientation.isclose(before.orientation, atol=RETURNED_TO_START_RAD):
            return False
    return True
