"""Units marked on a pose line's header columns ('x [mm]', 'z (m)', 'x_mm', 'yaw [deg]'): one length unit
is the translation's, one angle unit fixes the angles'; two different marks, or a mark that is no unit
Framewright reads, are refused rather than read in the wrong unit. Rotations are checked against SciPy's
Rotation; refusal words are the module's own. All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

_QUAT = "qx, qy, qz, qw"


@pytest.mark.parametrize("position, unit", [("x [mm], y [mm], z [mm]", "mm"), ("x (m), y (m), z (m)", "m"),
                                            ("x [cm], y [cm], z [cm]", "cm"), ("x_in, y_in, z_in", "in"),
                                            ("x_thou, y_thou, z_thou", "thou"), ("x [mm], y, z", "mm"),
                                            ("x, y, z", None)])
def test_one_length_unit_on_the_position_columns_is_the_translations(position, unit):
    first = decode(f"{position}, {_QUAT}\n1, 2, 3, 0, 0, 0.6, 0.8")[0]
    assert first.translation == (1.0, 2.0, 3.0) and first.translation_unit == unit
    # qz = 0.6, qw = 0.8 by name (SciPy, scalar last)
    assert np.allclose(np.asarray(first.orientation.as_matrix()), Rotation.from_quat([0, 0, 0.6, 0.8]).as_matrix(),
                       atol=1e-12)


def test_a_time_columns_unit_is_not_the_translations():
    assert decode(f"t [s], x (m), y (m), z (m), {_QUAT}\n5, 1, 2, 3, 0, 0, 0, 1")[0].translation_unit == "m"


def test_position_columns_in_different_units_are_refused():
    with pytest.raises(DecodeError, match=r"^line 1: the position columns are marked in different units \(m, mm\);"
                                          r" Framewright will not mix them: write them in one unit"):
        decode(f"x [mm], y [mm], z [m], {_QUAT}\n1, 2, 3, 0, 0, 0, 1")


def test_a_position_column_in_a_unit_not_read_is_refused():
    with pytest.raises(DecodeError, match=r"^line 2: the position column 'x \[ft\]' is marked in 'ft', a unit"
                                          r" Framewright does not read here \(it reads m, mm, cm, in, thou\)"):
        decode(f"log\nx [ft], y [ft], z [ft], {_QUAT}\n1, 2, 3, 0, 0, 0, 1")


@pytest.mark.parametrize("mark, units, angles", [("[rad]", "rad", [1, 0, 0]), ("(degrees)", "deg", [0.5, 0, 0]),
                                                 ("[deg]", "deg", [90, 0, 0])])
def test_one_angle_unit_on_the_angle_columns_fixes_the_angles_units(mark, units, angles):
    text = f"x, y, z, roll {mark}, pitch {mark}, yaw {mark}\n1, 2, 3, {angles[2]}, {angles[1]}, {angles[0]}"
    readings = decode(text)
    assert len(readings) == 1 and readings[0].conventions["units"] == units
    # yaw, pitch, roll = SciPy's intrinsic 'ZYX'
    expected = Rotation.from_euler("ZYX", angles, degrees=units == "deg").as_matrix()
    assert np.allclose(np.asarray(readings[0].orientation.as_matrix()), expected, atol=1e-12)


def test_angle_columns_without_a_unit_offer_both_units():
    readings = decode("x, y, z, roll, pitch, yaw\n1, 2, 3, 0.1, 0.2, 0.3")
    assert {r.conventions["units"] for r in readings} == {"rad", "deg"}


def test_angle_columns_in_different_units_are_refused():
    with pytest.raises(DecodeError, match=r"^line 1: the angle columns are marked in different units \(deg, rad\)"):
        decode("x, y, z, roll [deg], pitch [deg], yaw [rad]\n1, 2, 3, 1, 0, 0")


def test_an_angle_column_in_a_unit_not_read_is_refused():
    with pytest.raises(DecodeError, match=r"^line 1: the angle column 'roll \[grad\]' is marked in 'grad'"):
        decode("x, y, z, roll [grad], pitch [grad], yaw [grad]\n1, 2, 3, 1, 0, 0")


@pytest.mark.parametrize("length, translation", [(60, (1.0, 2.0, 3.0)), (61, None)])
def test_a_column_name_of_up_to_sixty_characters_is_read(length, translation):
    name = "position" + "_" * (length - 9) + "x"       # 'position____…_x', a position x column by its name
    assert len(name) == length
    first = decode(f"{name}, y, z, {_QUAT}\n1, 2, 3, 0, 0, 0, 1")[0]
    assert first.translation == translation
    assert any(n.startswith("columns not read") for n in first.notes) == (translation is None)


def test_six_named_columns_of_position_and_quaternion_are_enough_for_a_header():
    # y, z and the four quaternion columns: the quaternion is read by name; no x, so no translation
    first = decode("# y z qx qy qz qw\n1 2 0 0 0.6 0.8")[0]
    assert first.translation is None and first.label.startswith("pose line: ")
    assert np.allclose(np.asarray(first.orientation.as_matrix()), Rotation.from_quat([0, 0, 0.6, 0.8]).as_matrix(),
                       atol=1e-12)
