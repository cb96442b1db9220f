"""Transform printouts: several blocks are read as the last, with how far the others are from it (angle
and distance), and a line that is not part of a printout is refused with its own line number, in the first
block or a later one. Check values: SciPy's Rotation (the angle between the two quaternions' rotations,
magnitude of the relative rotation); the numbers are invented demo values; the words are the module's own."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError

H = 0.7071068     # sin and cos of 45 degrees, to 7 places (worked by hand)


def block(time, x, quaternion):
    return (f"At time {time}\n- Translation: [{x:.3f}, 0.000, 0.000]\n"
            f"- Rotation: in Quaternion [{', '.join(str(q) for q in quaternion)}]\n")


@pytest.mark.parametrize("first, second, tx", [
    ([0.0, 0.0, 0.0, 1.0], [0.0, 0.0, H, H], 1.0),
    ([0.0, 0.0, H, H], [0.0, 0.0, H, H], 2.0),
    ([0.0, 0.0, 0.0, 1.0], [0.0, 0.0, 0.3826834, 0.9238795], 0.5),
])
def test_repeated_blocks_read_the_last_and_say_how_far_the_others_are(first, second, tx):
    reading = decode(block(1.0, 0.0, first) + block(2.0, tx, second))[0]
    apart = Rotation.from_quat(first).inv() * Rotation.from_quat(second)
    degrees = math.degrees(apart.magnitude())
    assert f"the text holds 2 printout blocks; read the last; the others differ from it by up to {degrees:.3g}°" \
           f" and {tx:.3g} m" in reading.notes
    assert reading.translation == (tx, 0.0, 0.0)
    assert np.allclose(reading.orientation.as_matrix(), Rotation.from_quat(second).as_matrix(), atol=1e-6)


@pytest.mark.parametrize("where, line", [("after", 7), ("between", 4)])
def test_a_stray_line_is_refused_with_its_line_number(where, line):
    a, b = block(1.0, 0.0, [0.0, 0.0, 0.0, 1.0]), block(2.0, 1.0, [0.0, 0.0, H, H])
    text = a + b + "hello world\n" if where == "after" else a + "hello world\n" + b
    with pytest.raises(DecodeError) as err:
        decode(text)
    assert str(err.value) == f"line {line}: 'hello world' is not part of a transform printout as Framewright reads it"


def test_a_long_stray_line_is_shown_to_forty_characters():
    text = block(1.0, 0.0, [0.0, 0.0, 0.0, 1.0]) + "x" * 60 + "\n"
    with pytest.raises(DecodeError) as err:
        decode(text)
    assert str(err.value) == f"line 4: '{'x' * 40}' is not part of a transform printout as Framewright reads it"
