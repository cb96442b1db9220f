"""Measured points in the Scene: the fitted nominal points (R · p + t), the residual vectors scaled up so
they can be seen, the measured points at the tips of those vectors, and flagged points ringed and
labelled. Fed with the Measure panel's MeasuredFit (duck-typed: method, fitted, measured, residuals,
translation, flagged, rows, unit), or None to hide everything.

Length units to scene units. The scene's body frame has unit-length axes and the part is drawn with its
farthest extent at 0.45 (part_model.DRAWN_HALF_EXTENT), so one length unit of the part is
`part scale` = 0.45 / (largest half-dimension) scene units. Points are drawn relative to the fitted body
origin t (the scene's origin is the body origin), in that same scale:

    scene = s · (q − t),    s = part scale, reduced only when the farthest point would leave the view

so the fitted nominal points land on the drawn part when they lie on its faces. Directions (unit
vectors, no length) are drawn at the tip of a unit axis (s = 1, t = 0). Residuals are a small fraction of
the part, so each residual vector is drawn `factor` times its length; the factor is a 1-2-5 step chosen
so the largest residual draws about RESIDUAL_DRAWN long, and the legend says it ("residuals ×200").
The legend sits in the top-right corner: in the default view the reference axis labels fall in the
bottom corners, and the top-right one is otherwise used only while a sweep is replayed.
"""

from __future__ import annotations

import math

import numpy as np
from pyqtgraph.opengl import GLScatterPlotItem

from app.scene import gl_helpers, palette

FITTED_RGB = (170, 235, 90)      # fitted nominal points: lime
MEASURED_RGB = (245, 245, 245)   # measured points and residual vectors: white
FLAGGED_RGB = (255, 80, 230)     # flagged points: magenta ring and label
RESIDUAL_DRAWN = 0.18            # scene units for the largest residual (the axes are 1.0 long)
MAX_RADIUS = 1.25                # points stay inside the part of the scene the camera frames
MAX_FLAG_LABELS = 6
LABEL_RISE = np.array([0.0, 0.0, 0.09])  # a flag label sits above its point, not on it
_POINTS = {**gl_helpers.LINES, "glDepthMask": (0,)}


def residual_factor(largest_drawn_length: float) -> float:
    """The 1-2-5 step (…, 100, 200, 500, 1000, …) that draws the largest residual at most RESIDUAL_DRAWN
    long, and never below 1 (a large residual is drawn true to scale)."""
    if not largest_drawn_length > 0:
        return 1.0
    wanted = RESIDUAL_DRAWN / largest_drawn_length
    if wanted <= 1.0:
        return 1.0
    decade = 10.0 ** math.floor(math.log10(wanted))
    return max(step * decade for step in (1.0, 2.0, 5.0) if step * decade <= wanted * (1 + 1e-12))


def factor_text(factor: float) -> str:
    return f"\u00d7{factor:g}" if factor < 1e6 else f"\u00d7{factor:.0e}"


class MeasuredPoints:
    """Items built once; `show(fit, part_scale)` only rewrites vertex data."""

    def __init__(self, view, labels, depth=6):
        self._labels = labels
        self.fit = None
        self.part_scale = 1.0
        self.scale = 1.0        # scene units per length unit in use (see the module docstring)
        self.factor = 1.0       # residual magnification in use
        self.origin = np.zeros(3)
        self.vectors = gl_helpers.lines(None, color=palette.rgba_float(MEASURED_RGB, 0.95), width=2.0, depth=depth)
        self.rings = GLScatterPlotItem(pos=np.zeros((1, 3)), size=17.0, color=palette.rgba_float(FLAGGED_RGB),
                                       pxMode=True)
        self.fitted = GLScatterPlotItem(pos=np.zeros((1, 3)), size=9.0, color=palette.rgba_float(FITTED_RGB),
                                        pxMode=True)
        self.measured = GLScatterPlotItem(pos=np.zeros((1, 3)), size=6.0, color=palette.rgba_float(MEASURED_RGB),
                                          pxMode=True)
        for k, item in enumerate((self.rings, self.fitted, self.measured)):
            item.setGLOptions(_POINTS)
            item.setDepthValue(depth + 1 + k)
        for item in (self.vectors, self.rings, self.fitted, self.measured):
            item.setVisible(False)
            view.addItem(item)
        for k in range(MAX_FLAG_LABELS):
            labels.set_label(f"flag{k}", visible=False)

    # --- state --------------------------------------------------------------------------------------
    def show(self, fit, part_scale: float | None = None) -> None:
        if part_scale is not None:
            self.part_scale = float(part_scale)
        self.fit = fit
        self._redraw()

    def to_scene(self, points) -> np.ndarray:
        """Reference-frame points (length unit) to scene coordinates, as drawn now."""
        return self.scale * (np.asarray(points, dtype=float) - self.origin)

    def residual_tips(self) -> np.ndarray:
        """Scene positions of the drawn residual vectors' tips (where the measured dots are)."""
        return self._tips

    def legend_lines(self) -> list:
        if self.fit is None:
            return []
        unit = "" if self.fit.method == "directions" else f" {self.fit.unit}"
        scale = "" if self.fit.method == "directions" else f" (1{unit} = {self.scale:.2g} axis lengths)"
        if self.fit.residuals is None:
            return [(f"\u25cf  measured points{scale}", MEASURED_RGB)]
        largest = float(np.max(np.linalg.norm(self.fit.residuals, axis=1)))
        size = f"{largest:.3g}{unit}" if unit else f"{math.degrees(2 * math.asin(min(largest / 2, 1))):.3g}\u00b0"
        lines = [(f"\u25cf  fitted nominal points{scale}", FITTED_RGB),
                 (f"\u2014  residuals {factor_text(self.factor)} to the measured points (largest {size})",
                  MEASURED_RGB)]
        if self.fit.flagged:
            lines.append(("\u25ce  flagged: measure these points again", FLAGGED_RGB))
        return lines

    # --- drawing ------------------------------------------------------------------------------------
    def _redraw(self) -> None:
        fit = self.fit
        self._tips = np.zeros((0, 3))
        if fit is None or fit.measured is None or len(fit.measured) == 0:
            for item in (self.vectors, self.rings, self.fitted, self.measured):
                item.setVisible(False)
            self._labels_off(0)
            self._labels.set_panel("measured", "top-right", [], visible=False)
            return
        measured = np.asarray(fit.measured, dtype=float)
        fitted = None if fit.fitted is None else np.asarray(fit.fitted, dtype=float)
        if fit.method == "directions":
            self.origin, self.scale = np.zeros(3), 1.0
        else:
            self.origin = np.zeros(3) if fit.translation is None else np.asarray(fit.translation, dtype=float)
            base = fitted if fitted is not None else measured
            farthest = float(np.max(np.linalg.norm(base - self.origin, axis=1)))
            self.scale = self.part_scale
            if farthest * self.scale > MAX_RADIUS:
                self.scale = MAX_RADIUS / farthest
        if fitted is not None and fit.residuals is not None:
            residuals = np.asarray(fit.residuals, dtype=float)
            base = self.to_scene(fitted)
            self.factor = residual_factor(self.scale * float(np.max(np.linalg.norm(residuals, axis=1))))
            self._tips = base + self.factor * self.scale * residuals
            segments = np.empty((2 * len(base), 3))
            segments[0::2], segments[1::2] = base, self._tips
            self.vectors.setData(pos=segments)
            self.fitted.setData(pos=base)
            self.measured.setData(pos=self._tips)
            shown_points = base
        else:
            self.factor = 1.0
            self._tips = self.to_scene(measured)
            self.measured.setData(pos=self._tips)
            shown_points = self._tips
        has_vectors = fitted is not None and fit.residuals is not None
        self.vectors.setVisible(has_vectors)
        self.fitted.setVisible(has_vectors)
        self.measured.setVisible(True)
        flagged = [i for i in fit.flagged if 0 <= i < len(shown_points)]
        if flagged:
            self.rings.setData(pos=shown_points[flagged])
        self.rings.setVisible(bool(flagged))
        for k, i in enumerate(flagged[:MAX_FLAG_LABELS]):
            row = fit.rows[i] + 1 if i < len(fit.rows) else i + 1
            self._labels.set_label(f"flag{k}", pos=shown_points[i] + LABEL_RISE, text=f"row {row} flagged", rgb=FLAGGED_RGB,
                                   bold=True, visible=True)
        self._labels_off(min(len(flagged), MAX_FLAG_LABELS))
        self._labels.set_panel("measured", "top-right", self.legend_lines())

    def _labels_off(self, start: int) -> None:
        for k in range(start, MAX_FLAG_LABELS):
            self._labels.set_label(f"flag{k}", visible=False)
