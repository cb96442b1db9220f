"""Modified Rodrigues parameters editor (MRP, p = n tan(φ/4)). It shows the set with |p| <= 1; a typed
set longer than 1 (the shadow set, the same orientation the long way round) is read and then shown as
its short twin."""

from __future__ import annotations

import math

from app.editors.parameters_editor import ParametersEditor
from core.representations import MRP


class MrpEditor(ParametersEditor):
    representation = MRP

    def note_words(self, orientation, values):
        length = math.hypot(*values)                  # no overflow for huge components
        if length > 1:
            return f"|p| = {self.fmt(length)} > 1: the shadow set, shown as |p| \u2264 1 on commit."
        return f"|p| = tan(\u03c6/4) = {self.fmt(length)} (\u2264 1; 1 at a half turn)."
