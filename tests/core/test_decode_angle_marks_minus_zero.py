"""Decode: minutes and seconds with a sign on zero minutes ('−0′30″') keep the sign, and the note a user
reads names the unit as 'minutes and seconds' with the value in degrees.

Check values: 1′ = 1/60°, 1″ = 1/3600° (SI Brochure Table 4); orientations from SciPy's Rotation
(intrinsic yaw, pitch, roll is "ZYX" in upper case)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode


def _same(orientation, rotation):
    q = orientation.as_quaternion()
    expected = rotation.as_quat(scalar_first=True)
    assert min(np.abs(q - expected).max(), np.abs(q + expected).max()) < 1e-12


@pytest.mark.parametrize("text, yaw_deg, shown", [
    ("yaw −0′30″ pitch 0 roll 0", -30 / 3600, "-0.008333333333°"),    # the minus stands on the zero
    ("yaw -0'30\" pitch 0 roll 0", -30 / 3600, "-0.008333333333°"),
    ("yaw 0′30″ pitch 0 roll 0", 30 / 3600, "0.008333333333°"),        # the other side: no sign
    ("yaw −1′30″ pitch 0 roll 0", -90 / 3600, "-0.025°"),
])
def test_a_minus_on_zero_minutes_makes_the_angle_negative(text, yaw_deg, shown):
    best = decode(text)[0]
    assert best.kind == "angles"
    # SI Brochure Table 4: 30″ = 30/3600°; SciPy gives the expected orientation
    _same(best.orientation, Rotation.from_euler("ZYX", [yaw_deg, 0.0, 0.0], degrees=True))
    note = next(n for n in best.notes if "read as" in n)
    assert "(minutes and seconds) read as " + shown in note
    assert note.startswith("line 1: ")


def test_minutes_alone_are_named_by_their_unit_not_as_minutes_and_seconds():
    best = decode("yaw 30′ pitch 0 roll 0")[0]
    note = next(n for n in best.notes if "read as" in n)
    assert "minutes and seconds" not in note
    assert note.endswith("read as 0.5°")      # SI Brochure Table 4: 30′ = 0.5°
