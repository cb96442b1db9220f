"""An angle written with π is in radians (issue 11 item 3: expressions are evaluated and said in a note).

Before, 'yaw PI/2, pitch 0, roll -M_PI/4' also offered 1.57° (the value read in degrees), and with the
degrees hint '0 PI/2 0' came back as 1.57° with exit 0; inside a pose (a YAML 'yaw: pi/2', a description
file's '${-pi/2}') the note that an expression was evaluated was lost. π is half a turn in radians (a
handbook fact), so the degrees reading of such a text is never offered and a text or hint that says
degrees beside π is refused. Expected rotations: SciPy's Rotation.from_euler in radians."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def _off(expected: Rotation, reading) -> float:
    found = Rotation.from_quat(np.asarray(reading.orientation.as_quaternion()), scalar_first=True)
    return float((expected.inv() * found).magnitude())


@pytest.mark.parametrize("text", ["yaw PI/2, pitch 0, roll -M_PI/4", "0 pi/2 0", "0 0 1 pi/4",
                                  "imu:\n  x: 1\n  y: 2\n  z: 3\n  roll: 0\n  pitch: 0\n  yaw: pi/2",
                                  "rotation: [0, 0, pi/2]\ntranslation: [1, 2, 3]"])
def test_no_reading_takes_an_angle_written_with_pi_for_degrees(text):
    readings = decode(text)
    assert all(r.conventions.get("units") in (None, "rad") for r in readings), [r.label for r in readings]
    assert any("evaluated" in n for n in readings[0].notes)


def test_the_keyed_yaw_pi_over_2_is_a_quarter_turn():
    top = decode("imu:\n  x: 1\n  y: 2\n  z: 3\n  roll: 0\n  pitch: 0\n  yaw: pi/2")[0]
    assert _off(Rotation.from_euler("ZYX", [math.pi / 2, 0, 0]), top) < 1e-12          # SciPy from_euler
    assert any("names π" in n for n in top.notes)


@pytest.mark.parametrize("text, hints", [
    ("0 PI/2 0", {"units": "deg"}),
    ("yaw (deg): pi/2, pitch 0, roll 0", None),
    ("imu:\n  x: 1\n  y: 2\n  z: 3\n  roll: 0\n  pitch: 0\n  yaw: pi/2", {"units": "deg"}),
])
def test_degrees_beside_pi_are_refused(text, hints):
    with pytest.raises(DecodeError, match="(?i)pi|rad"):
        decode(text, hints)


def test_a_description_file_origin_says_that_its_expression_was_evaluated():
    top = decode('<origin xyz="0.05 0 0.12" rpy="0 ${-pi/2} 0"/>')[0]
    assert any("evaluated '${-pi/2}'" in n for n in top.notes), top.notes
    assert _off(Rotation.from_euler("xyz", [0, -math.pi / 2, 0]), top) < 1e-12        # SciPy: lower case extrinsic


def test_each_transform_of_several_gets_the_notes_of_its_own_lines():
    text = "a:\n  translation: [0, 0, 1/2]\n  rotation: [0, 0, 0.5]\nb:\n  translation: [0, 0, 0]\n  rotation: [0, 0, pi/4]"
    readings = decode(text)
    a = [r for r in readings if r.name == "a"]
    b = [r for r in readings if r.name == "b"]
    assert any(r.conventions.get("units") == "deg" for r in a)          # 0.5 without π: both units offered
    assert all(r.conventions.get("units") in (None, "rad") for r in b)
    assert not any("pi/4" in n for n in a[0].notes) and any("pi/4" in n for n in b[0].notes)
