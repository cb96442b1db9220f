"""The decoder reads the trade's angle marks (mrad, ′, ″, arcmin, arcsec, gon) on the numbers they stand
on, and refuses what it cannot tell: a mark on only some angles, a bare 'mil', a unit named in words for
unmarked numbers, marks of two units, and a marked number where a reading has no angle. Every value is
checked against SciPy's Rotation; the unit factors are the definitions (SI Brochure Table 4: 1° = 60′ =
3600″; 1 mrad = 1e-3 rad; 400 gon to a turn)."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def _same(orientation, rotation):
    q = orientation.as_quaternion()
    expected = rotation.as_quat(scalar_first=True)
    assert min(np.abs(q - expected).max(), np.abs(q + expected).max()) < 1e-12


@pytest.mark.parametrize("text, yaw_deg", [
    ("yaw 30 mrad, pitch 0, roll 0", math.degrees(0.030)),
    ("yaw 30mrad, pitch 0 mrad, roll 0 mrad", math.degrees(0.030)),
    ("yaw 0.5 milliradians, pitch 0, roll 0", math.degrees(0.0005)),
    ("yaw 30′ pitch 0 roll 0", 0.5),
    ("yaw 30' pitch 0 roll 0", 0.5),
    ("yaw 45 arcmin, pitch 0, roll 0", 0.75),
    ("yaw 1′30″ pitch 0 roll 0", 1.5 / 60),
    ("yaw 1'30\" pitch 0 roll 0", 1.5 / 60),
    ("yaw 36″ pitch 0 roll 0", 0.01),
    ("yaw 36 arcsec, pitch 0, roll 0", 0.01),
    ("yaw 2 gon, pitch 0, roll 0", 1.8),
    ("yaw −2 gon, pitch 0, roll 0", -1.8),
    ("yaw 30′ pitch 1° roll 0", 0.5),              # degrees and minutes may stand together
])
def test_marked_angles_are_converted_to_degrees(text, yaw_deg):
    readings = decode(text)
    assert readings[0].kind == "angles"
    pitch = 1.0 if "pitch 1°" in text else 0.0
    # SciPy: intrinsic yaw, pitch, roll is "ZYX" in upper case
    _same(readings[0].orientation, Rotation.from_euler("ZYX", [yaw_deg, pitch, 0.0], degrees=True))
    assert any("read as" in note for note in readings[0].notes) or "°" in text


def test_a_marked_angle_of_an_axis_and_angle_is_the_angle():
    readings = decode("axis 0 0 1 angle 12 arcsec")
    assert {r.kind for r in readings} == {"axis-angle"}    # never a quaternion of (0, 0, 1, 0.0033)
    _same(readings[0].orientation, Rotation.from_rotvec([0, 0, math.radians(12 / 3600)]))
    # the same for a degree mark, which once read as a quaternion when the angle was small
    readings = decode("axis 0 0 1 angle 0.003°")
    assert {r.kind for r in readings} == {"axis-angle"}
    _same(readings[0].orientation, Rotation.from_rotvec([0, 0, math.radians(0.003)]))


def test_every_angle_marked_in_one_unit_is_read_in_it():
    readings = decode("0.5 mrad, 0.2 mrad, 0 mrad")
    assert readings and all(r.kind in ("angles", "rotation-vector") for r in readings)
    first = readings[0]
    seq = first.conventions["sequence"]
    scipy_seq = seq if first.conventions["intrinsic"] else seq.lower()
    _same(first.orientation, Rotation.from_euler(scipy_seq, [0.0005, 0.0002, 0.0], degrees=False))


@pytest.mark.parametrize("text", ["q = ['0.7071', '0', '0', '0.7071']", 'q = ["0.7071", "0", "0", "0.7071"]'])
def test_quotes_around_numbers_are_not_minutes_or_seconds(text):
    readings = decode(text)
    assert readings[0].kind == "quaternion"
    _same(readings[0].orientation, Rotation.from_quat([0.7071, 0, 0, 0.7071], scalar_first=True))


def test_a_quoted_attribute_is_not_a_seconds_mark():
    readings = decode('<origin xyz="0 0 0" rpy="0 0 1.5707963267948966"/>')
    _same(readings[0].orientation, Rotation.from_euler("xyz", [0, 0, math.pi / 2]))


@pytest.mark.parametrize("text, says", [
    ("0.5 0 0 mrad", "only some numbers carry"),
    ("0.5 0.2 0 arcsec", "only some numbers carry"),
    ("yaw 5 mil pitch 0 roll 0", "NATO mil"),
    ("angles (mrad): 0.5 0.2 0", "names 'mrad'"),
    ('{"yaw_mrad": 0.5, "pitch_mrad": 0, "roll_mrad": 0}', "names 'mrad'"),
    ("rotation in arcseconds: 1 2 3", "names 'arcseconds'"),
    ("yaw 30 mrad, pitch 30′, roll 0", "marked in arcmin and mrad"),
    ("yaw 1 rad, pitch 2 gon, roll 0", "both degrees and radians"),
    ("0 12° 0 1", "where an axis component stands"),
    ("0 0 1 12″ 0", "cannot read|numbers"),
    ("yaw 1′75″ pitch 0 roll 0", "below 60"),
    ("yaw 1.5′30″ pitch 0 roll 0", "whole minutes"),
])
def test_what_cannot_be_told_is_refused_with_the_reason(text, says):
    with pytest.raises(DecodeError, match=says):
        decode(text)


def test_a_marked_angle_before_a_unit_axis_reads_angle_first():
    # '12° 0 0 1': the mark says the first number is an angle, and (0, 0, 1) is a unit axis (issue 11:
    # angle-first printouts); read axis first, the mark would sit on an axis component
    top = decode("12° 0 0 1")[0]
    assert top.conventions == {"order": "angle, axis", "units": "deg"}
    _same(top.orientation, Rotation.from_rotvec([0, 0, 12], degrees=True))     # SciPy from_rotvec


def test_unmarked_text_reads_as_before():
    # No new mark, no change: the ranking of plain numbers is untouched.
    readings = decode("yaw 30, pitch 20, roll 10")
    _same(readings[0].orientation, Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))
    assert decode("0 0 1 90")[0].kind == "axis-angle"


def test_degrees_minutes_and_seconds_on_one_line_each_read_by_its_mark():
    # the prime after 1°30 once counted as an opening quote and hid the −12′ that followed
    readings = decode("yaw 1°30′, pitch −12′, roll 40″")
    _same(readings[0].orientation, Rotation.from_euler("ZYX", [1.5, -0.2, 40 / 3600], degrees=True))
    readings = decode("name 'bracket': yaw 30′ pitch 0 roll 0")
    _same(readings[0].orientation, Rotation.from_euler("ZYX", [0.5, 0, 0], degrees=True))
