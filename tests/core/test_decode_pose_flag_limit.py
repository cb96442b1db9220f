"""Flag lists have a limit of 2000 flags: a pose flag within it is read, past it the text is refused
(never read from a part of it). Values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def test_a_yaw_flag_as_the_2000th_flag_is_read():
    first = decode("--a 1 " * 1999 + "--yaw 0.5")[0]
    assert first.label.startswith("transform flags")
    # yaw alone about moving axes: SciPy's intrinsic 'ZYX' with (yaw, 0, 0), radians
    assert np.allclose(np.asarray(first.orientation.as_matrix()),
                       Rotation.from_euler("ZYX", [0.5, 0, 0]).as_matrix(), atol=1e-12)


def test_a_yaw_flag_as_the_2001st_flag_is_not_read_and_the_text_is_refused():
    with pytest.raises(DecodeError, match="more than 2000 numbers"):
        decode("--a 1 " * 2000 + "--yaw 0.5")
