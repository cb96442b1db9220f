"""Gibbs vector editor (classical Rodrigues parameters, g = n tan(φ/2)). The vector grows without bound
towards a half turn and does not exist at 180°: near it the editor says so in words instead of showing
huge numbers, and refuses typed vectors that long."""

from __future__ import annotations

import math

import numpy as np

from app.editors.parameters_editor import ParametersEditor
from core.representations import GIBBS

# Beyond this length (the angle within about 0.11° of a half turn) the numbers say little to a person and
# the next digit typed turns the vector's meaning round: shown in words, refused when typed.
LONGEST = 1000.0
NEAREST_HALF_TURN_DEG = 180.0 - math.degrees(2.0 * math.atan(LONGEST))


class GibbsEditor(ParametersEditor):
    representation = GIBBS

    def shown_problem(self, orientation):
        w = float(orientation.quaternion[0])
        if w == 0:
            return ("A half turn (180°): the Gibbs vector is infinite here and does not exist. Edit in "
                    "another editor.")
        length = float(np.linalg.norm(orientation.quaternion[1:])) / w
        if length > LONGEST:
            return (f"{orientation.angle:.4f}°, within {NEAREST_HALF_TURN_DEG:.2f}° of a half turn: the Gibbs "
                    f"vector is longer than {LONGEST:g} there (infinite at 180°). Edit in another editor.")
        return None

    def typed_problem(self, values):
        length = math.hypot(*values)                  # no overflow for huge components
        if length > LONGEST:
            return (f"a Gibbs vector of length {length:.4g} is within {NEAREST_HALF_TURN_DEG:.2f}° of a half "
                    f"turn, where it grows without bound; expected at most {LONGEST:g} (use another editor)")
        return None

    def note_words(self, orientation, values):
        return f"Length tan(\u03c6/2) = {self.fmt(math.hypot(*values))}; infinite at 180\u00b0."
