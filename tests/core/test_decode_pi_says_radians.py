"""An angle written with pi is in radians (pi is half a turn, common practice): the reading says so in
its reasons, a text that also says radians keeps its own reason, and one that says degrees is refused in
the module's own words. Check values: SciPy's Rotation; the numbers are invented demo values."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def test_pi_names_radians():
    first = decode("0, 0, pi/2")[0]
    assert first.conventions == {"sequence": "ZYX", "intrinsic": True, "units": "rad"}
    assert first.why == "yaw-pitch-roll (intrinsic Z-Y'-X''), the most common sequence; 'pi/2' names π: radians"
    assert np.allclose(first.orientation.as_matrix(),
                       Rotation.from_euler("ZYX", [0, 0, math.pi / 2]).as_matrix(), atol=1e-12)


def test_a_text_that_says_radians_keeps_its_own_reason():
    first = decode("0 0 pi/2 rad")[0]
    assert first.conventions["units"] == "rad"
    assert first.why.endswith("; the text says radians")
    assert "names π" not in first.why


def test_pi_and_degrees_together_are_refused():
    with pytest.raises(DecodeError) as err:
        decode("yaw 0 pitch 0 roll pi/2 degrees")
    assert str(err.value) == ("'pi/2' is an angle in radians (π is half a turn), but the text says degrees too;"
                              " Framewright will not guess which is meant")
