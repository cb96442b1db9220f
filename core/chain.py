"""A mount chain: reference -> bracket -> plate -> ... -> body, as an immutable value.

Each step holds the orientation of its child frame in its parent frame (v_parent = R_step · v_child), so
the chain composes as R = R_1 · R_2 · ... · R_n (CONVENTIONS.md: R = R_A · R_AB · R_B,body), step 1 being
the one fixed to the reference. A step marked `inverted` contributes R_stepᵀ: its value was given the
other way round (parent in child), as some drawings do. A disabled step contributes nothing (identity),
e.g. a spacer that is not fitted.

A step may also carry a position: where the child frame's origin is in the parent frame, so the step is a
rigid transform p_parent = R_step · p_child + t_step. The chain then composes full transforms
(CONVENTIONS.md "Composition"): R = R_1 · R_2 · ..., t = t_1 + R_1 · t_2 + R_1 · R_2 · t_3 + ...; a step
without a position moves nothing (t = 0), an inverted one contributes (R_stepᵀ, −R_stepᵀ · t_step). The
product has a position exactly when some enabled step has one.

Every edit (add, remove, move, reorder, invert, enable) returns a new Chain; nothing is changed in place,
which is what the undo stack above us needs.

Session-file form (to_dict / from_dict)::

    {"name": "antenna mast",
     "steps": [{"name": "bracket", "orientation": {"quaternion_wxyz": [w, x, y, z]},
                "position": {"metres": [x, y, z], "unit": "mm"},      # optional (session version 2)
                "inverted": false, "enabled": true}, ...]}

The orientation entry has the same form as a mount's in core/session.py, and the same rule: a stored
quaternion is unit within UNIT_TOLERANCE or the file is refused (naming the step), never normalised
silently. A quaternion typed or pasted by a person is a different thing: the decoder and the editors
normalise it and say so in a note before it ever becomes a step.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, replace

import numpy as np

from core import kernels
from core.errors import FramewrightError, InvalidInputError
from core.orientation import Orientation
from core.position import DEFAULT_UNIT, LIMIT_M, Position

# As the session loader's mounts: a saved quaternion is unit to about 1e-16, so anything off by more
# than this was edited by hand or damaged.
UNIT_TOLERANCE = 1e-6


@dataclass(frozen=True)
class ChainStep:
    """One link: `orientation` of the child frame in the parent frame, as entered."""

    name: str
    orientation: Orientation
    inverted: bool = False
    enabled: bool = True
    position: Position | None = None      # the child frame's origin in the parent frame

    def __post_init__(self):
        if not isinstance(self.name, str):
            raise InvalidInputError(f"step name: expected text, got {self.name!r}")
        if not isinstance(self.orientation, Orientation):
            raise InvalidInputError(
                f"step {self.name!r}: expected an Orientation, got {type(self.orientation).__name__}")
        if self.position is not None and not isinstance(self.position, Position):
            raise InvalidInputError(f"step {self.name!r}: expected a Position or none, "
                                    f"got {type(self.position).__name__}")
        for flag in ("inverted", "enabled"):
            if not isinstance(getattr(self, flag), bool):
                raise InvalidInputError(f"step {self.name!r}: {flag} must be true or false, "
                                        f"got {getattr(self, flag)!r}")

    @property
    def contribution(self):
        """What this step multiplies into the chain: its orientation, its inverse, or the identity."""
        if not self.enabled:
            return Orientation.identity()
        return self.orientation.inverse() if self.inverted else self.orientation

    @property
    def translation(self) -> np.ndarray:
        """What this step adds to the chain's translation, in its parent frame (metres): t, −Rᵀ t when
        inverted, zero when disabled or without a position."""
        if not self.enabled or self.position is None:
            return np.zeros(3)
        t = np.array(self.position.metres)
        return -(self.orientation.as_matrix().T @ t) if self.inverted else t

    def to_dict(self):
        data = {
            "name": self.name,
            "orientation": {"quaternion_wxyz": [float(v) for v in self.orientation.quaternion]},
            "inverted": self.inverted,
            "enabled": self.enabled,
        }
        if self.position is not None:
            data["position"] = self.position.to_dict()
        return data

    @classmethod
    def from_dict(cls, data, where="step"):
        if not isinstance(data, dict):
            raise FramewrightError(f"{where}: expected a JSON object, got {type(data).__name__}")
        for key in ("name", "orientation"):
            if key not in data:
                raise FramewrightError(f"{where}: missing {key!r}; expected keys name, orientation, "
                                       f"position, inverted, enabled")
        orientation = data["orientation"]
        if not isinstance(orientation, dict) or "quaternion_wxyz" not in orientation:
            raise FramewrightError(f"{where}: orientation must be {{\"quaternion_wxyz\": [w, x, y, z]}}, "
                                   f"got {orientation!r}")
        if isinstance(data["name"], str):   # named, shortened: a name can be any length
            name = data["name"]
            where = f"{where} ({name[:40]!r}{'…' if len(name) > 40 else ''})"
        try:
            _check_unit(orientation["quaternion_wxyz"])
            value = Orientation.from_quaternion(orientation["quaternion_wxyz"])
            position = Position.from_dict(data["position"]) if "position" in data else None
            return cls(data["name"], value, data.get("inverted", False), data.get("enabled", True), position)
        except FramewrightError as exc:
            raise type(exc)(f"{where}: {exc}") from exc


def _check_unit(values):
    """Refuse a stored quaternion whose norm (computed scaled, so 1e200 does not overflow) is not 1."""
    if isinstance(values, (bool, str)) or not isinstance(values, (list, tuple)) or \
            any(isinstance(v, bool) or not isinstance(v, (int, float)) for v in values):
        raise InvalidInputError(f"quaternion_wxyz: expected a list of 4 numbers, got {values!r}")
    q = kernels.check_array(values, (4,), "quaternion_wxyz")
    if q.shape != (4,):
        raise InvalidInputError(f"quaternion_wxyz: expected 4 numbers, got shape {q.shape}")
    if not np.any(q):
        raise InvalidInputError("quaternion of zero length; expected a unit (w, x, y, z)")
    norm = float(kernels.unit_vectors(q, "quaternion")[1])
    if not abs(norm - 1.0) <= UNIT_TOLERANCE:
        raise InvalidInputError(f"quaternion_wxyz: expected a unit quaternion, its norm is {norm:.9g} "
                                f"(the file may be damaged; limit 1 ± {UNIT_TOLERANCE:g})")


@dataclass(frozen=True)
class Frame:
    """An intermediate frame: the cumulative orientation (this frame -> reference) after step `index`,
    and where its origin is in the reference frame (None while no step so far has a position)."""

    index: int
    name: str
    orientation: Orientation
    position: Position | None = None


@dataclass(frozen=True)
class Chain:
    """An ordered tuple of ChainStep, reference side first."""

    steps: tuple = ()
    name: str = "chain"

    def __post_init__(self):
        steps = tuple(self.steps)
        for i, step in enumerate(steps):
            if not isinstance(step, ChainStep):
                raise InvalidInputError(f"chain step {i}: expected a ChainStep, got {type(step).__name__}")
        if not isinstance(self.name, str):
            raise InvalidInputError(f"chain name: expected text, got {self.name!r}")
        # A frame's distance from the reference is at most the sum of the steps' distances (a turn keeps
        # lengths): within the limit of one position, every frame is a valid position too.
        reach = sum(math.dist(s.position.metres, (0.0, 0.0, 0.0)) for s in steps if s.position is not None)
        if reach > LIMIT_M:
            raise InvalidInputError(f"chain {self.name!r}: its steps' positions add up to {reach:.6g} m, farther "
                                    f"than {LIMIT_M:g} m from the reference; expected mounting distances")
        object.__setattr__(self, "steps", steps)

    def __len__(self):
        return len(self.steps)

    def _index(self, index, allow_end=False):
        top = len(self.steps) if allow_end else len(self.steps) - 1
        if not isinstance(index, int) or isinstance(index, bool) or not 0 <= index <= top:
            raise InvalidInputError(
                f"no step at index {index!r}; the chain has {len(self.steps)} step(s), "
                f"expected an index from 0 to {top}")
        return index

    # --- results --------------------------------------------------------------------------------------

    def product(self):
        """body -> reference through every enabled step."""
        result = Orientation.identity()
        for step in self.steps:
            result = result @ step.contribution
        return result

    def has_position(self) -> bool:
        """Whether some enabled step has a position (so the product has one)."""
        return any(step.enabled and step.position is not None for step in self.steps)

    def position_unit(self) -> str:
        """The unit the product's position is shown in: that of the first step that has one."""
        return next((s.position.unit for s in self.steps if s.enabled and s.position is not None), DEFAULT_UNIT)

    def pose_product(self):
        """(orientation, position): the whole chain as one rigid transform body -> reference; the position
        is None when no enabled step has one."""
        frames = self.frames()
        if not frames:
            return Orientation.identity(), None
        return frames[-1].orientation, frames[-1].position

    def frames(self):
        """The cumulative orientation (and position, from the first step that has one) after each enabled
        step, reference side first; the last one is the product (none when no step is enabled)."""
        frames = []
        cumulative = Orientation.identity()
        translation = np.zeros(3)
        placed = False
        unit = self.position_unit()
        for i, step in enumerate(self.steps):
            if step.enabled:
                # t = t_so_far + R_so_far · t_step, with R_so_far before this step
                translation = translation + cumulative.as_matrix() @ step.translation
                placed = placed or step.position is not None
                cumulative = cumulative @ step.contribution
                position = Position(tuple(translation), unit) if placed else None
                frames.append(Frame(i, step.name, cumulative, position))
        return tuple(frames)

    # --- edits (each returns a new chain) -------------------------------------------------------------

    def with_step(self, step, at=None):
        """`step` inserted before index `at` (appended at the body end when None)."""
        at = len(self.steps) if at is None else self._index(at, allow_end=True)
        return replace(self, steps=self.steps[:at] + (step,) + self.steps[at:])

    def without_step(self, index):
        index = self._index(index)
        return replace(self, steps=self.steps[:index] + self.steps[index + 1:])

    def with_step_replaced(self, index, step):
        index = self._index(index)
        return replace(self, steps=self.steps[:index] + (step,) + self.steps[index + 1:])

    def moved(self, index, to):
        """The step at `index` moved so that it ends up at index `to`."""
        index, to = self._index(index), self._index(to)
        steps = list(self.steps)
        steps.insert(to, steps.pop(index))
        return replace(self, steps=tuple(steps))

    def reordered(self, order):
        """Steps in the order given as a permutation of the indices, e.g. (2, 0, 1)."""
        order = tuple(order)
        if sorted(order) != list(range(len(self.steps))):
            raise InvalidInputError(
                f"reorder: {order!r} is not a permutation of 0..{len(self.steps) - 1}; expected each step "
                f"index exactly once")
        return replace(self, steps=tuple(self.steps[i] for i in order))

    def with_inverted(self, index, inverted=None):
        """Step `index` with its inverted flag set (toggled when `inverted` is None)."""
        step = self.steps[self._index(index)]
        flag = (not step.inverted) if inverted is None else inverted
        return self.with_step_replaced(index, replace(step, inverted=flag))

    def with_enabled(self, index, enabled=None):
        """Step `index` enabled or disabled (toggled when `enabled` is None)."""
        step = self.steps[self._index(index)]
        flag = (not step.enabled) if enabled is None else enabled
        return self.with_step_replaced(index, replace(step, enabled=flag))

    def renamed(self, name):
        return replace(self, name=name)

    # --- session file ---------------------------------------------------------------------------------

    def to_dict(self):
        return {"name": self.name, "steps": [step.to_dict() for step in self.steps]}

    @classmethod
    def from_dict(cls, data):
        if not isinstance(data, dict):
            raise FramewrightError(f"chain: expected a JSON object, got {type(data).__name__}")
        steps = data.get("steps", [])
        if not isinstance(steps, list):
            raise FramewrightError(f"chain: 'steps' must be a list, got {type(steps).__name__}")
        name = data.get("name", "chain")
        return cls(tuple(ChainStep.from_dict(s, where=f"chain {name!r} step {i}") for i, s in enumerate(steps)),
                   name)
