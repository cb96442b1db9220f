"""The words of one mount's part of the record (core/inspection_record.py): the rotation axis line, the
gimbal margin line on both sides of gimbal lock, and the indented lines that say where the body axes point.
Built in-process from the small invented bracket session. Check values: SciPy's Rotation and worked by hand."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.orientation import Orientation
from tests.core.test_inspection_record_check_words import bracket_record, bracket_session


def _mount_items(measured):
    return bracket_record(bracket_session(measured=measured)).sections[2].items


def _figures(items):
    return {i.key: i for i in items if isinstance(i, records.Figure)}


def test_the_rotation_axis_is_labelled_and_agrees_with_scipy():
    # Invented: the measured bracket turned 30° about (1, 1, 1)
    turned = Orientation.from_axis_angle([1, 1, 1], 30.0)
    axis = _figures(_mount_items(turned))["mount[1].axis"]
    assert axis.label == "Rotation axis (x, y, z), in reference axes"
    assert axis.unit == "unit vector"
    # SciPy's Rotation: the rotation vector's direction is the axis, (1, 1, 1)/√3
    rotvec = Rotation.from_quat(turned.as_quaternion(), scalar_first=True).as_rotvec()
    assert [float(v) for v in axis.values] == pytest.approx(rotvec / np.linalg.norm(rotvec), abs=1e-7)


def test_no_rotation_prints_no_axis_but_says_why():
    items = _mount_items(Orientation.identity())
    assert "mount[1].axis" not in _figures(items)
    assert "Axis and angle: no rotation (angle 0; the axis is undefined)." in items


@pytest.mark.parametrize("pitch, locked", [(89.0, False), (90.0, True)])
def test_the_gimbal_margin_line_says_lock_only_in_lock(pitch, locked):
    # Invented: the measured bracket pitched up (ZYX intrinsic, yaw-pitch-roll); the default sequence is ZYX
    turned = Orientation.from_axis_angle([0, 1, 0], pitch)
    margin = _figures(_mount_items(turned))["mount[1].gimbal_margin"]
    plain = "Gimbal margin of ZYX intrinsic"
    if locked:
        assert margin.label == plain + " (in gimbal lock: only the first and third angles together are known)"
    else:
        assert margin.label == plain
    # worked by hand: the margin is 90° less the pitch's size, so 1° at 89° and 0 at 90°
    assert float(margin.values[0]) == pytest.approx(90.0 - pitch, abs=1e-6)


def test_the_lines_saying_where_the_body_axes_point_are_indented_under_their_heading():
    # Invented: the measured bracket turned 1° about -Y (ENU): X and Z move 1°, Y stays north (worked by hand)
    items = list(_mount_items(Orientation.from_axis_angle([0, 1, 0], -1.0)))
    start = items.index("Where the body axes point (directions named as ENU (x east, y north, z up)):")
    assert items[start + 1:start + 4] == ["    +X → +X (east), 1.0° off",
                                          "    +Y → +Y (north), exact",
                                          "    +Z → +Z (up), 1.0° off"]
