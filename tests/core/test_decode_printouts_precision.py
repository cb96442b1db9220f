"""Decode: a transform printout reads the representation printed most precisely, counting a number printed
in degrees as log10(180/π) ≈ 1.76 places finer than the same places in radians; a bad number in its RPY
line is refused at that line, in the first block and in a later one.

Check values: 90° about z is the quaternion (0, 0, sin 45°, cos 45°) scalar last and RPY (0, 0, 90°)
(the half-angle formula; SciPy's Rotation); 1° = π/180 rad, so d decimals of degrees match d + 1.758
decimals of radians (worked by hand: log10(180/π) = 1.758)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def block(q, rpy, time="1.0"):
    return (f"At time {time}\n- Translation: [0.000, 0.000, 0.000]\n"
            f"- Rotation: in Quaternion [{q}]\n"
            f"            in RPY (degree) [{rpy}]\n")


Q4 = "0.0000, 0.0000, 0.7071, 0.7071"
Q5 = "0.00000, 0.00000, 0.70711, 0.70711"
RPY2 = "0.00, 0.00, 90.00"
RPY3 = "0.000, 0.000, 90.000"


@pytest.mark.parametrize("q, rpy, read", [
    (Q4, RPY2, "quaternion (x, y, z, w)"),    # 4 places beat 2 + 1.76
    (Q4, RPY3, "RPY (degree)"),               # 3 + 1.76 places beat 4
    (Q5, RPY3, "quaternion (x, y, z, w)"),    # 5 places beat 3 + 1.76
])
def test_the_most_precisely_printed_representation_is_read(q, rpy, read):
    best = decode(block(q, rpy))[0]
    assert f"read its {read}, the most precisely printed representation" in best.notes
    # SciPy: 90° about z
    np.testing.assert_allclose(best.orientation.as_matrix(), Rotation.from_euler("z", 90, degrees=True).as_matrix(),
                               atol=1e-4)


@pytest.mark.parametrize("before, line", [("", 4), (block(Q4, RPY2, "0.5"), 8)])
def test_a_bad_number_in_the_rpy_line_is_refused_at_its_line(before, line):
    text = before + block(Q4, "0.00, nan, 90.00")
    with pytest.raises(DecodeError) as err:
        decode(text)
    assert str(err.value).startswith(f"line {line}: 'nan' is not a finite number")
