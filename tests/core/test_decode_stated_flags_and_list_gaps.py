"""Pasted text that states its convention as a flag, or holds a list with a gap, must not be misread.

- '"intrinsic": false' names the word intrinsic, but says the angles are extrinsic: read as extrinsic
  (and '"extrinsic": false' as intrinsic), never the other way by the word alone.
- yaw, pitch and roll named in that order mean intrinsic Z-Y'-X'' (common practice); a text that also
  states the angles are extrinsic contradicts itself, and is refused rather than guessed.
- 'extrinsic calibration' is a phrase of the trade (a camera's extrinsics), not a flag: it changes nothing.
- A literal (true, false, null, None) standing as an element of a list of numbers is a gap where a number
  should be: '[true, 0.5, 0.5, 0.5]' must not be read as three angles.

Check values: SciPy's Rotation (lower-case axes in from_euler are extrinsic, upper-case intrinsic, from its
documentation); the refusal words are the project's own."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def _quaternion(reading):
    return reading.orientation.quaternion


def _same(q, rotation):
    expected = rotation.as_quat(scalar_first=True)
    return np.allclose(q, expected, atol=1e-12) or np.allclose(q, -expected, atol=1e-12)


@pytest.mark.parametrize("text, scipy_sequence", [
    ('{"sequence": "XYZ", "intrinsic": false, "angles_deg": [10, 20, 30]}', "xyz"),
    ("intrinsic: false, XYZ, 10 20 30 deg", "xyz"),
    ("intrinsic = off; sequence XYZ; angles 10, 20, 30 deg", "xyz"),
    ('{"sequence": "XYZ", "extrinsic": false, "angles_deg": [10, 20, 30]}', "XYZ"),
    ('{"sequence": "XYZ", "intrinsic": true, "angles_deg": [10, 20, 30]}', "XYZ"),
    ('{"sequence": "XYZ", "extrinsic": "yes", "angles_deg": [10, 20, 30]}', "xyz"),
])
def test_a_stated_flag_decides_intrinsic_or_extrinsic(text, scipy_sequence):
    readings = decode(text)
    assert _same(_quaternion(readings[0]), Rotation.from_euler(scipy_sequence, [10, 20, 30], degrees=True))
    assert all(r.conventions.get("intrinsic") == scipy_sequence.isupper() for r in readings if r.kind == "angles")


def test_flags_that_disagree_say_nothing_and_both_readings_are_offered():
    readings = decode('{"sequence": "XYZ", "intrinsic": false, "extrinsic": false, "angles_deg": [10, 20, 30]}')
    assert {r.conventions.get("intrinsic") for r in readings if r.kind == "angles"} == {True, False}


@pytest.mark.parametrize("text", ['{"intrinsic": false, "yaw": 10, "pitch": 20, "roll": 30}',
                                  "yaw pitch roll, intrinsic=no: 10 20 30 deg",
                                  'yaw=10 pitch=20 roll=30 "extrinsic": true'])
def test_yaw_pitch_roll_stated_extrinsic_is_refused_not_guessed(text):
    with pytest.raises(DecodeError, match=r"names yaw, pitch and roll \(intrinsic Z-Y'-X''\) but states the angles "
                                          r"are extrinsic"):
        decode(text)


@pytest.mark.parametrize("text", ["extrinsic calibration yaw=10 pitch=20 roll=30",
                                  '{"intrinsic": true, "yaw": 10, "pitch": 20, "roll": 30}'])
def test_yaw_pitch_roll_without_a_contrary_flag_is_intrinsic_zyx(text):
    reading = decode(text)[0]
    assert _same(_quaternion(reading), Rotation.from_euler("ZYX", [10, 20, 30], degrees=True))


@pytest.mark.parametrize("text, word", [
    ('{"quaternion": [true, 0.5, 0.5, 0.5]}', "true"),
    ('{"quaternion": [0.5, 0.5, 0.5, null]}', "null"),
    ("q = (0.5, None, 0.5, 0.5, 0.5)", "None"),
    ("[0.5, 0.5, false, 0.5]", "false"),
    ("[abc, 0.5, 0.5, 0.5]", "abc"),
    ("[0.5, 0.5, 0.5, q3]", "q3"),
    ("[M_PI_2, 0, 0]", "M_PI_2"),
])
def test_a_literal_in_a_list_of_numbers_is_refused_as_a_gap(text, word):
    with pytest.raises(DecodeError) as caught:
        decode(text)
    assert str(caught.value) == (f"line 1: '{word}' stands in a list of numbers where a number should be; "
                                 "Framewright will not read the list with a gap (write the number)")


def test_a_flag_beside_a_list_of_numbers_is_not_a_gap():
    # '"intrinsic": true' is a key's value, not a list element; the list is read whole (SciPy check).
    reading = decode('{"sequence": "ZYX", "intrinsic": true, "angles_deg": [10, 20, 30]}')[0]
    assert _same(_quaternion(reading), Rotation.from_euler("ZYX", [10, 20, 30], degrees=True))


@pytest.mark.parametrize("text", ["quaternion: 0.1 0.2 0.3", "quat 0.1 0.2 0.3", '{"quaternion": [0.1, 0.2, 0.3]}'])
def test_three_numbers_the_text_calls_a_quaternion_are_refused_not_read_as_angles(text):
    with pytest.raises(DecodeError, match=r"^the text says quaternion, which needs 4 numbers; the text holds 3 "):
        decode(text)


def test_three_angles_named_beside_the_word_quaternion_are_still_read():
    # The words name angles too ('euler', 'yaw'...), so the text is about both: the three are angles (SciPy).
    reading = decode("quaternion to euler: yaw 10 pitch 20 roll 30 deg")[0]
    assert _same(_quaternion(reading), Rotation.from_euler("ZYX", [10, 20, 30], degrees=True))


@pytest.mark.parametrize("text, scipy", [
    ("[10 deg, 20 deg, 30 deg]", Rotation.from_euler("ZYX", [10, 20, 30], degrees=True)),
    ("[yaw, pitch, roll] = [10, 20, 30]", Rotation.from_euler("ZYX", [10, 20, 30], degrees=True)),
    ("[np.float64(0.5), 0.5, 0.5, 0.5]", Rotation.from_quat([0.5, 0.5, 0.5, 0.5], scalar_first=True)),
    ('R.from_euler("zyx", [10, 20, 30], degrees=True)', Rotation.from_euler("zyx", [10, 20, 30], degrees=True)),
])
def test_lists_of_numbers_with_units_names_or_number_types_are_still_read(text, scipy):
    assert _same(_quaternion(decode(text)[0]), scipy)


@pytest.mark.parametrize("text, flag", [
    ('{"degrees": 1, "angles": [10, 20, 30]}', "degrees"),
    ("intrinsic=0 XYZ 10 20 30 deg", "intrinsic"),
    ("angles [10, 20, 30], degrees=1", "degrees"),
    ("XYZ intrinsic=1 10 20 30", "intrinsic"),
    ("scalar_last: 1\nq: 0 0 0 1", "scalar_last"),
])
def test_a_flag_written_as_0_or_1_is_refused_not_read_as_a_number(text, flag):
    # Read as a number, '"degrees": 1' beside three angles made four numbers: an axis and an angle.
    with pytest.raises(DecodeError, match=rf"is a flag written as a number, which would be read as part of the "
                                          rf"orientation; write {flag} as true or false"):
        decode(text)


@pytest.mark.parametrize("text, values", [("in degrees: 1 2 3", [1, 2, 3]), ("in degrees: 1, 2, 3", [1, 2, 3]),
                                          ("degrees=1.5, 2, 3", [1.5, 2, 3])])
def test_a_caption_naming_the_unit_before_its_numbers_is_not_a_flag(text, values):
    assert _same(_quaternion(decode(text)[0]), Rotation.from_euler("ZYX", values, degrees=True))
