"""Undo commands of the session model. Each holds the values before and after, never a diff, so undo and
redo restore exactly."""

from __future__ import annotations

from PySide6.QtGui import QUndoCommand

SET_ORIENTATION_ID = 1001
# A run that ends this close to where it started (radians) has returned to its start.
RETURNED_TO_START_RAD = 1e-13


class SetOrientationCommand(QUndoCommand):
    """Set one mount's orientation. Consecutive continuous edits with the same key merge into one step;
    a merged step that ends where it started is obsolete and leaves the stack."""

    def __init__(self, model, index, old, new, origin, text, continuous_key, merge_token):
        super().__init__(text)
        self._model = model
        self.index = index
        self.old = old
        self.new = new
        self._first_origin = origin  # the editor that made it hears the first redo as its own
        self.continuous_key = continuous_key
        self.merge_token = merge_token

    def id(self) -> int:
        return SET_ORIENTATION_ID

    def mergeWith(self, other) -> bool:
        if (self.continuous_key is None
                or getattr(other, "continuous_key", None) != self.continuous_key
                or other.merge_token != self.merge_token
                or other.index != self.index):
            return False
        self.new = other.new
        if self.new == self.old:
            self.setObsolete(True)
        elif self.new.isclose(self.old, atol=RETURNED_TO_START_RAD):
            # Back where the run began but for the last digit of rounding: restore the start exactly,
            # so the step disappears and nothing is left slightly off.
            self._model._apply_orientation(self.index, self.old, None)
            self.setObsolete(True)
        return True

    def redo(self) -> None:
        origin, self._first_origin = self._first_origin, None
        self._model._apply_orientation(self.index, self.new, origin)

    def undo(self) -> None:
        self._model._apply_orientation(self.index, self.old, None)


class ReplaceMountsCommand(QUndoCommand):
    """Add, duplicate, rename or delete: the whole (small, immutable) mount tuple before and after."""

    def __init__(self, model, old_mounts, old_selected, new_mounts, new_selected, text, origin):
        super().__init__(text)
        self._model = model
        self.old = (old_mounts, old_selected)
        self.new = (new_mounts, new_selected)
        self._first_origin = origin

    def redo(self) -> None:
        origin, self._first_origin = self._first_origin, None
        self._model._apply_mounts(*self.new, origin)

    def undo(self) -> None:
        self._model._apply_mounts(*self.old, None)


class ReplaceValueCommand(QUndoCommand):
    """Replace one immutable piece of session state (the chains, the checks) as a whole, before and
    after; the model says what the key means."""

    def __init__(self, model, key, old, new, text, origin):
        super().__init__(text)
        self._model = model
        self.key = key
        self.old = old
        self.new = new
        self._first_origin = origin

    def redo(self) -> None:
        origin, self._first_origin = self._first_origin, None
        self._model._apply_value(self.key, self.new, origin)

    def undo(self) -> None:
        self._model._apply_value(self.key, self.old, None)


class SetMountFieldCommand(QUndoCommand):
    """Set one field of one mount that is replaced whole (its position, its repeated measurements),
    before and after; the model says what the field means."""

    def __init__(self, model, index, field, old, new, text, origin):
        super().__init__(text)
        self._model = model
        self.index = index
        self.field = field
        self.old = old
        self.new = new
        self._first_origin = origin

    def redo(self) -> None:
        origin, self._first_origin = self._first_origin, None
        self._model._apply_mount_field(self.index, self.field, self.new, origin)

    def undo(self) -> None:
        self._model._apply_mount_field(self.index, self.field, self.old, None)
