"""The largest angle a batch cell may hold, 3600° either way (ten turns), in degrees and in radians
(20 pi = 62.8319 rad, hand-worked), from both sides, with the refusal word for word for each kind of
column set. The rows are our own invented ones."""

import pytest

from core.batch import read_mounts

NOMINAL = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,"


def _messages(columns, row):
    return [p.message for p in read_mounts(NOMINAL + columns + "\na,1,0,0,0," + row + "\n").problems]


YPR = "measured_yaw,measured_pitch,measured_roll"
ANGLES_RAD = "measured_angle1[ZYX intrinsic rad],measured_angle2,measured_angle3"
AXIS_ANGLE_RAD = "measured_axis_x,measured_axis_y,measured_axis_z,measured_angle[rad]"
ROTATION_VECTOR = "measured_rv_x,measured_rv_y,measured_rv_z"


@pytest.mark.parametrize("columns, inside, outside, says", [
    (YPR, "3600,0,0", "-3601,0,0", "columns measured_yaw, measured_pitch, measured_roll: an angle of 3601 deg; "
                                   "expected at most 3600 deg either way"),
    (ANGLES_RAD, "62.83,0,0", "0,62.84,0", "columns measured_angle1[ZYX intrinsic rad], measured_angle2, "
                                          "measured_angle3: an angle of 62.84 rad; expected at most 62.8319 rad "
                                          "either way"),
    (AXIS_ANGLE_RAD, "0,0,1,-62.83", "0,0,1,-62.84", "column 'measured_angle[rad]': angle -62.84 rad; expected at "
                                                     "most 62.8319 rad either way"),
    (ROTATION_VECTOR, "0,3600,0", "0,0,-3601", "columns measured_rv_x, measured_rv_y, measured_rv_z: rotation "
                                               "vector of length 3601 deg; expected at most 3600 deg")])
def test_an_angle_up_to_ten_turns_is_read_and_beyond_is_refused_naming_the_columns(columns, inside, outside, says):
    assert _messages(columns, inside) == []
    assert _messages(columns, outside) == [f"line 2 (row 1, mount 'a'), {says}"]
