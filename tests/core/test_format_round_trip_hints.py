"""The read-back hints of an angles export hold the reader to angles: the export itself reads back as the
same orientation (checked against SciPy), and a quaternion or a matrix pasted where that export was
expected is refused with the count a user needs, rather than read as some other kind.

Check values: SciPy's scipy.spatial.transform.Rotation (from_euler, upper case = intrinsic, as_quat
scalar_first, as_matrix); the four and nine numbers are SciPy's own quaternion and matrix of that rotation."""

import pytest
from scipy.spatial.transform import Rotation

from core import Orientation
from core.decode import DecodeError, decode
from core.formats import FormatOptions, render, round_trip_hints

ROTATION = Rotation.from_euler("ZYX", [112.0, -37.0, 64.0], degrees=True)    # no symmetry to hide behind
ORIENTATION = Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True))
ANGLES = FormatOptions(representation="angles", sequence="ZYX", intrinsic=True)


@pytest.mark.parametrize("fmt", ["text", "csv", "python"])
def test_an_angles_export_reads_back_once_as_the_same_rotation(fmt):
    readings = decode(render(ORIENTATION, fmt, ANGLES), round_trip_hints(fmt, ANGLES))
    assert len(readings) == 1 and readings[0].kind == "angles"
    back = Rotation.from_quat(readings[0].orientation.quaternion, scalar_first=True)
    assert (back.inv() * ROTATION).magnitude() < 1e-9        # SciPy: the same rotation


@pytest.mark.parametrize("fmt", ["text", "csv", "python"])
def test_a_quaternion_under_the_angles_hints_is_refused_by_its_count(fmt):
    quaternion = " ".join(f"{q:.9f}" for q in ROTATION.as_quat(scalar_first=True))
    with pytest.raises(DecodeError) as refused:
        decode(quaternion, round_trip_hints(fmt, ANGLES))
    message = str(refused.value)
    assert "three angles needs 3 numbers" in message and "holds 4" in message


def test_a_matrix_under_the_angles_hints_is_refused_by_its_count():
    matrix = "\n".join(" ".join(f"{x:.9f}" for x in row) for row in ROTATION.as_matrix())
    with pytest.raises(DecodeError) as refused:
        decode(matrix, round_trip_hints("text", ANGLES))
    message = str(refused.value)
    assert "three angles needs 3 numbers" in message and "holds 9" in message
