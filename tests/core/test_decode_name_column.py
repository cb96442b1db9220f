"""A copied CSV row whose first column is the mount's name: the name is text (its digits are never read as
a number) and is named in a note; the numbers are read under the rest of the header. Check values from
SciPy's Rotation (intrinsic ZYX = yaw, pitch, roll) and the quaternion of a 90° turn about z (cos 45°,
0, 0, sin 45°: the half-angle formula)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import formats
from core.decode import decode
from core.errors import DecodeError
from core.format_options import FormatOptions
from core.orientation import Orientation

HALF = math.sqrt(0.5)


def _same(orientation, rotation):
    q, want = orientation.as_quaternion(), rotation.as_quat(scalar_first=True)
    assert min(np.abs(q - want).max(), np.abs(q + want).max()) < 1e-12


@pytest.mark.parametrize("name", ["Camera 2", "IMU 3 (rev 4)", "Cam, 3", "=SUM(1,2)", "x" * 200])
def test_the_name_column_is_text_and_the_quaternion_is_read(name):
    text = formats.csv_with_name(name, "qw,qx,qy,qz\n", f"{HALF!r},0,0,{HALF!r}\n")
    readings = decode(text)
    _same(readings[0].orientation, Rotation.from_rotvec([0, 0, math.pi / 2]))
    assert "the mount's name" in readings[0].notes[0]
    assert len(readings[0].notes[0]) < 200                     # a long name is shortened in the note


def test_a_copied_angles_row_reads_back_as_scipy_has_it():
    orientation = Orientation.from_angles("ZYX", (30.0, 20.0, 10.0))
    options = FormatOptions(representation="angles")
    text = formats.csv_with_name("Mast 7", formats.csv_header(options), formats.render(orientation, "csv", options))
    _same(decode(text)[0].orientation, Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))


@pytest.mark.parametrize("text, words", [
    ("name,qw,qx,qy,qz\nCamera 2,0.7071,nan,0,0.7071", "not a finite number"),
    ("name,qw,qx,qy,qz\nCamera 2,0.7071,abc,0,0.7071", "abc"),
])
def test_a_bad_number_beside_a_name_is_still_refused(text, words):
    with pytest.raises(DecodeError, match=words):
        decode(text)


def test_without_a_name_header_the_first_column_is_not_set_aside():
    # 'label' is not a name column: its row keeps five numbers, and five numbers are not an orientation
    with pytest.raises(DecodeError):
        decode("label,qw,qx,qy,qz\n2,0.7071,0,0,0.7071")
