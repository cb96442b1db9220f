"""Decode: what the words of a paste say about its kind and unit, pinned word for word and checked against
SciPy's Rotation. A library call's degrees flag is named in its note; from_quat says nothing of units; named
x, y, z components are read as a vector only with that vector's prefix; mixed unit marks and a key that is
not a component name are refused in the module's own words. The numbers are invented demo values."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def same(reading, rotation):
    assert np.allclose(reading.orientation.as_matrix(), rotation.as_matrix(), atol=1e-9)


def refusal(text):
    with pytest.raises(DecodeError) as err:
        decode(text)
    return str(err.value)


@pytest.mark.parametrize("call, degrees, said", [
    ("R.from_euler('xyz', [10, 20, 30], degrees=True)", True, "degrees=True"),
    ("R.from_euler('xyz', [0.1, 0.2, 0.3])", False, "radians, the library's default"),
])
def test_a_library_euler_call_names_its_unit(call, degrees, said):
    first = decode(call)[0]
    assert first.notes[0] == f"a library call names 'xyz': lower case, extrinsic (SciPy's documented meaning), {said}"
    assert f"the library call says {said}" in first.why
    angles = [10, 20, 30] if degrees else [0.1, 0.2, 0.3]
    same(first, Rotation.from_euler("xyz", angles, degrees=degrees))


def test_an_upper_case_library_sequence_is_intrinsic():
    first = decode("R.from_euler('ZYX', [30, 20, 10], degrees=True)")[0]
    assert first.notes[0] == ("a library call names 'ZYX': upper case, intrinsic (SciPy's documented meaning),"
                              " degrees=True")
    same(first, Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))


@pytest.mark.parametrize("call, degrees, said", [
    ("R.from_rotvec([10, 20, 30], degrees=True)", True, "degrees=True"),
    ("R.from_rotvec([0.1, 0.2, 0.3])", False, "radians, the library's default"),
])
def test_a_library_rotvec_call_names_its_unit(call, degrees, said):
    first = decode(call)[0]
    assert first.kind == "rotation-vector"
    assert first.notes[0] == f"a library call: a rotation vector in {said}"
    same(first, Rotation.from_rotvec([10, 20, 30] if degrees else [0.1, 0.2, 0.3], degrees=degrees))


def test_from_quat_says_nothing_about_units():
    # asked for an axis and an angle, the numbers of a from_quat call get their unit by their size (90:
    # degrees), never "radians because the library call says so": from_quat has no unit
    readings = decode("R.from_quat([0, 0, 1, 90])", {"kind": "axis-angle"})
    assert all("the library call says" not in r.why for r in readings)
    assert readings[0].conventions == {"order": "axis, angle", "units": "deg"}
    same(readings[0], Rotation.from_rotvec([0, 0, np.radians(90)]))


def test_from_quat_order_comes_from_the_call():
    first = decode("R.from_quat([0, 0, 0.3826834, 0.9238795])")[0]
    assert first.conventions == {"order": "xyzw", "convention": "Hamilton"}
    same(first, Rotation.from_quat([0, 0, 0.3826834, 0.9238795]))


def test_bare_x_y_z_keys_are_not_a_rotation_vector():
    readings = decode("x: 10, y: 20, z: 30")
    assert readings[0].kind == "angles"
    assert all("read by their names as a rotation vector" not in r.notes for r in readings)


@pytest.mark.parametrize("text", ["rv_x: 0.1, rv_y: 0.2, rv_z: 0.3", "rv_z: 0.3, rv_x: 0.1, rv_y: 0.2"])
def test_prefixed_x_y_z_keys_are_a_rotation_vector_by_name(text):
    first = decode(text)[0]
    assert first.kind == "rotation-vector"
    assert "read by their names as a rotation vector" in first.notes
    same(first, Rotation.from_rotvec([0.1, 0.2, 0.3]))


def test_a_key_that_is_not_a_component_name_is_refused():
    assert refusal("rv_x: 0.1, rv_y: 0.2, x: 0.3") == (
        "line 1: the key 'rv_x' is not a component name like the others (x); Framewright will not guess its place")
    assert refusal("q0: 0.7071, q1: 0, q2: 0.7071, orientation_abc: 0") == (
        "line 1: the key 'orientation_abc' is not a component name like the others (q0, q1, q2); Framewright will"
        " not guess its place")


@pytest.mark.parametrize("text, units", [
    ("1 mrad, 2 deg, 3 deg", "deg and mrad"),
    ("2 gon, 1 mrad, 3 mrad", "gon and mrad"),
    ("30″, 2 gon, 1 gon", "arcsec and gon"),
])
def test_two_unit_marks_are_refused(text, units):
    assert refusal(text) == (f"the numbers are marked in {units}; expected one unit for all (degrees, minutes and"
                             " seconds may be written together)")


def test_degrees_and_minutes_together_are_one_unit():
    first = decode("10°20', 1°, 2°")[0]
    assert first.conventions["units"] == "deg"
    same(first, Rotation.from_euler("ZYX", [10 + 20 / 60, 1, 2], degrees=True))
