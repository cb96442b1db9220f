"""The intermediate frames of a mount chain, drawn small and labelled in a column beside the part.

A chain's frames all share the origin with the body frame (only their orientations differ), so drawn in
place they would hide each other and the part. They are drawn instead as small triads one under the other
beside the part, reference side first (at the top), joined by a faint line that shows the order; each has
the full orientation of its frame. Triads are built when the row grows and
only hidden when it shrinks, so an edit moves transforms and never rebuilds items.
"""

from __future__ import annotations

import numpy as np

from app.scene import gl_helpers, palette
from app.scene.frame_triad import FrameTriad

TRIAD_LENGTH = 0.28
# A column down the right-hand side of the default (iso) view, clear of the part and the axes; it stays
# inside the scene's radius, so every view preset keeps it in the picture.
ROW_CENTRE = np.array([-0.78, 1.08, 0.22])
ROW_DIRECTION = np.array([0.0, 0.0, -1.0])  # first step at the top
ROW_LENGTH = 1.5
MAX_SPACING = 0.42
LABEL_DROP = np.array([-0.05, 0.05, -0.12])  # labels sit just under the origin of their triad


def row_positions(count: int) -> np.ndarray:
    """Where the `count` small frames stand (reference frame), evenly on the row, first on the left."""
    if count <= 0:
        return np.zeros((0, 3))
    spacing = ROW_LENGTH / max(count - 1, 1) if count > 1 else 0.0
    spacing = min(spacing, MAX_SPACING)
    offsets = (np.arange(count) - (count - 1) / 2.0) * spacing
    return ROW_CENTRE + offsets[:, None] * ROW_DIRECTION


class ChainFrames:
    """Small labelled frames; `set_frames([(matrix, label), ...])` shows exactly those."""

    def __init__(self, view, labels, depth=5):
        self._view = view
        self._labels = labels
        self._depth = depth
        self._groups = []
        self._shown = 0
        self.path = gl_helpers.lines(None, color=palette.rgba_float(palette.REFERENCE_RGB, 0.35), width=1.0,
                                     mode="line_strip", depth=depth)
        self.path.setVisible(False)
        view.addItem(self.path)

    @property
    def count(self) -> int:
        return self._shown

    def positions(self) -> np.ndarray:
        return row_positions(self._shown)

    def set_frames(self, frames) -> None:
        frames = list(frames)
        while len(self._groups) < len(frames):
            group = gl_helpers.group(depth=self._depth)
            self._view.addItem(group)
            FrameTriad(group, TRIAD_LENGTH, palette.AXIS_RGB, alpha=0.9, width=2.0, head=0.05)
            self._groups.append(group)
            self._labels.set_label(f"chain{len(self._groups) - 1}", visible=False)
        positions = row_positions(len(frames))
        for k, group in enumerate(self._groups):
            key = f"chain{k}"
            if k >= len(frames):
                group.setVisible(False)
                self._labels.set_label(key, visible=False)
                continue
            matrix, label = frames[k]
            group.setTransform(gl_helpers.transform(np.asarray(matrix, dtype=float), positions[k]))
            group.setVisible(True)
            self._labels.set_label(key, pos=positions[k] + LABEL_DROP, text=label,
                                   rgb=palette.LABEL_TEXT_RGB, visible=True)
        self._shown = len(frames)
        if len(frames) > 1:
            self.path.setData(pos=positions)  # first step -> ... -> product
        self.path.setVisible(len(frames) > 1)
