"""Where the Scene's texts go on the image so that none covers another: the overlay panels in their
corners, stacked when two would meet, and the labels near their 3D anchors, most important first, each
nudged to the nearest free spot (then drawn with a leader line to its anchor) or, when no spot near it is
free, left out. Plain geometry in pixels (x right, y down), no painting, so it is tested on its own."""

from __future__ import annotations

import math
from dataclasses import dataclass

from PySide6.QtCore import QRectF

# How far from its anchor a label may be nudged, in rings of one label height (up and down) and about
# two thirds of its width (sideways): beyond that it would be read as another point's label.
_RINGS = 3
# A label whose box is farther than this from its anchor (pixels) gets a leader line to it.
_LEADER_AFTER_PX = 4.0


@dataclass(frozen=True)
class Placed:
    rect: QRectF | None   # None: no free spot near the anchor, so the label is left out
    leader: bool          # drawn away from its anchor: a line joins the box to the anchor


def stack_panels(sizes, corners, optional, width, height, margin) -> list[QRectF | None]:
    """Each panel (w, h) in its corner ('top-left', ...), in the order given. A panel that would meet one
    already placed on the other side goes to the other corner of its own side when that one is free (so it
    does not end up in the middle of the picture, over the part); else it moves along its side (down from a
    top corner, up from a bottom one) past it. A panel that then leaves the image or still meets another is
    left out (None); so is an optional panel when the panels on its side would take more than 60 % of the
    height (it would leave the labels no room)."""
    placed: list[QRectF] = []
    sides: list[bool] = []   # on the left, for each placed panel
    out: list[QRectF | None] = []
    for (w, h), corner, extra in zip(sizes, corners, optional):
        left = margin if "left" in corner else width - w - margin
        top = margin if "top" in corner else height - h - margin
        rect = QRectF(left, top, w, h)
        hit_sides = {on_left for p, on_left in zip(placed, sides) if p.intersects(rect)}
        if hit_sides == {"left" not in corner}:    # met only by the other side's panels, across the middle
            other = QRectF(left, height - h - margin if "top" in corner else margin, w, h)
            if other.top() >= 0 and not any(p.intersects(other) for p in placed):
                rect = other
        for _ in range(len(placed)):
            hits = [p for p in placed if p.intersects(rect)]
            if not hits:
                break
            if "top" in corner:
                rect.moveTop(max(p.bottom() for p in hits) + margin)
            else:
                rect.moveBottom(min(p.top() for p in hits) - margin)
        side = [p for p, on_left in zip(placed, sides) if on_left == ("left" in corner)]
        crowded = extra and sum(p.height() + margin for p in side) + h + margin > 0.6 * height
        inside = rect.top() >= 0 and rect.bottom() <= height and rect.left() >= 0 and rect.right() <= width
        if crowded or not inside or any(p.intersects(rect) for p in placed):
            out.append(None)
            continue
        placed.append(rect)
        sides.append("left" in corner)
        out.append(rect)
    return out


def _candidates(w, h):
    """Offsets of a box's centre from its anchor: the anchor itself, then rings around it, nearest first."""
    offsets = _RING_OFFSETS.get((w, h))
    if offsets is None:
        sx, sy = w * 0.6, h * 1.05
        offsets = [(0.0, 0.0)]
        for ring in range(1, _RINGS + 1):
            ring_offsets = [(0, -ring * sy), (0, ring * sy), (ring * sx, 0), (-ring * sx, 0),
                            (ring * sx, -ring * sy), (-ring * sx, ring * sy), (ring * sx, ring * sy),
                            (-ring * sx, -ring * sy)]
            offsets += sorted(ring_offsets, key=lambda d: math.hypot(*d))
        if len(_RING_OFFSETS) > 256:
            _RING_OFFSETS.clear()
        _RING_OFFSETS[(w, h)] = offsets
    return offsets


# The ring offsets of each label size seen: a scene's labels keep their sizes from frame to frame.
_RING_OFFSETS: dict[tuple[float, float], list[tuple[float, float]]] = {}


def place_labels(anchors, sizes, importance, width, height, obstacles=()) -> list[Placed]:
    """Boxes of `sizes` (w, h) near `anchors` (x, y), wholly inside a width x height image and covering
    neither each other nor `obstacles` (the overlay panels). The most important go first (ties in the
    order given), so when the room runs out it is the least important that are left out."""
    # Boxes are (left, top, right, bottom) tuples while they are worked out: a frame tries a few hundred
    # spots, and plain tuples cost a fraction of QRectF's calls through the bindings.
    taken = [(r.left(), r.top(), r.right(), r.bottom()) for r in obstacles]
    out: list[Placed | None] = [None] * len(anchors)
    order = sorted(range(len(anchors)), key=lambda i: -importance[i])
    for i in order:
        (x, y), (w, h) = anchors[i], sizes[i]
        if w > width - 4 or h > height - 4:
            out[i] = Placed(None, False)
            continue
        box = _first_free(_boxes_near(x, y, w, h, width, height, taken), taken)
        if box is None:
            out[i] = Placed(None, False)
            continue
        out[i] = Placed(QRectF(box[0], box[1], w, h), _distance_to(box, x, y) > _LEADER_AFTER_PX)
        taken.append(box)
    return out


def _inside_view(cx, cy, w, h, width, height):
    """A w x h box centred as near (cx, cy) as the image allows, wholly inside it."""
    left = min(max(cx - w / 2, 2), width - w - 2)
    top = min(max(cy - h / 2, 2), height - h - 2)
    return left, top, left + w, top + h


def _meets(a, b) -> bool:
    """Whether two boxes share some area, as QRectF.intersects decides it (a box of no width or height
    meets nothing; boxes that only touch do not meet)."""
    return (a[0] < a[2] and a[1] < a[3] and b[0] < b[2] and b[1] < b[3]
            and a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3])


def _boxes_near(x, y, w, h, width, height, taken):
    """Spots for a box anchored at (x, y): the rings around the anchor, nearest first; then, for an anchor
    under a big box (an overlay panel), the spots just outside each edge of what covers it, nearest
    first, so the label steps out from under the panel instead of being lost."""
    for dx, dy in _candidates(w, h):
        yield _inside_view(x + dx, y + dy, w, h, width, height)
    first = _inside_view(x, y, w, h, width, height)
    escapes = []
    for other in taken:
        if _meets(other, first):
            escapes += [(x, other[3] + h / 2 + 1), (x, other[1] - h / 2 - 1),
                        (other[2] + w / 2 + 1, y), (other[0] - w / 2 - 1, y)]
    for cx, cy in sorted(escapes, key=lambda c: (c[0] - x) ** 2 + (c[1] - y) ** 2):
        yield _inside_view(cx, cy, w, h, width, height)


def _first_free(boxes, taken):
    for box in boxes:
        if not any(_meets(box, other) for other in taken):
            return box
    return None


def _distance_to(box, x: float, y: float) -> float:
    dx = max(box[0] - x, 0.0, x - box[2])
    dy = max(box[1] - y, 0.0, y - box[3])
    return math.hypot(dx, dy)


def leader_end(box: QRectF, x: float, y: float) -> tuple[float, float]:
    """The point of the box's edge nearest the anchor, where its leader line starts."""
    return min(max(x, box.left()), box.right()), min(max(y, box.top()), box.bottom())
