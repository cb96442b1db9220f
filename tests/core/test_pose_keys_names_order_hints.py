"""Keyed poses (core/decode/pose_keys.py): the name a transform takes from its group, the keys a note
names as not read (and the shape keys it leaves out), the order of several poses (the order of the
text), and a kind hint that agrees with the format. Rotations are checked against SciPy's Rotation;
words are the module's own. All values are invented."""

import numpy as np
from scipy.spatial.transform import Rotation

from core.decode import decode

_FOUR = "[1, 0, 0, 1, 0, 1, 0, 2, 0, 0, 1, 3, 0, 0, 0, 1]"


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def test_a_transform_under_a_generic_key_at_the_top_has_no_name():
    first = decode(f"transform: {_FOUR}")[0]
    assert first.name is None and first.translation == (1.0, 2.0, 3.0)
    assert first.notes == ("read 'transform' as a 4x4 transform, rows written one after another",)


def test_a_transform_under_a_generic_key_takes_its_groups_name():
    first = decode(f"camera:\n  transform: {_FOUR}")[0]
    assert first.name == "camera"
    assert np.allclose(_matrix(first), np.eye(3), atol=1e-12)


def test_a_transform_under_its_own_key_takes_that_name():
    first = decode(f"T_base_cam: {_FOUR}")[0]
    assert first.name == "T_base_cam"


def test_image_rows_and_cols_are_not_named_among_the_keys_not_read():
    first = decode(f"transform: {_FOUR}\nrows: 480\ncols: 640\ndt: 0.01\ncamera_name: left")[0]
    assert "keys not read (no part of a pose): camera_name" in first.notes


def test_every_other_key_not_read_is_named_once():
    first = decode(f"transform: {_FOUR}\nimage_width: 640\nimage_width: 640\ncamera_name: left")[0]
    assert "keys not read (no part of a pose): image_width, camera_name" in first.notes


def test_a_kind_hint_of_matrix_agrees_with_a_keyed_transform():
    readings = decode(f"transform: {_FOUR}", {"kind": "matrix"})
    assert readings and all(r.kind == "matrix" for r in readings)
    assert readings[0].translation == (1.0, 2.0, 3.0)


def test_poses_come_in_the_order_of_the_text_when_a_quaternion_is_written_by_components():
    text = ("camera:\n  translation: [1, 2, 3]\n  rpy: [0.1, 0.2, 0.3]\n"
            "imu:\n  position: [4, 5, 6]\n  orientation:\n    w: 0.8\n    x: 0.6\n    y: 0\n    z: 0\n")
    readings = decode(text)
    assert [r.name for r in readings] == ["camera", "imu"]
    camera, imu = readings
    # rpy about fixed X, Y, Z: SciPy's extrinsic 'xyz' in radians (common practice)
    assert np.allclose(_matrix(camera), Rotation.from_euler("xyz", [0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)
    assert imu.translation == (4.0, 5.0, 6.0)
    # w = 0.8, x = 0.6 by name (SciPy, scalar first)
    assert np.allclose(_matrix(imu), Rotation.from_quat([0.8, 0.6, 0, 0], scalar_first=True).as_matrix(),
                       atol=1e-12)
    assert "the quaternion's components are named (w, x, y, z); read as w, x, y, z" in imu.notes


def test_a_quaternion_by_components_above_its_position_keeps_the_text_order():
    text = ("arm:\n  translation: [1, 2, 3]\n  rpy: [0, 0, 0]\n"
            "imu:\n  orientation:\n    qw: 1\n    qx: 0\n    qy: 0\n    qz: 0\n  position: [4, 5, 6]\n")
    assert [r.name for r in decode(text)] == ["arm", "imu"]
