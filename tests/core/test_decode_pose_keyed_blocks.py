"""Keyed pose blocks: a matrix with its shape written beside it, flat x/y/z with roll/pitch/yaw, R_00/T_00
pairs and a rectifying rotation among other transforms. What a user relies on: which reading ranks first,
its rotation, translation and name, and that no key read into a pose is reported as 'not read'.
Values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

# a quarter turn about z: SciPy's Rotation.from_rotvec([0, 0, pi/2]) gives rows (0 -1 0), (1 0 0), (0 0 1)
QUARTER_Z = Rotation.from_rotvec([0.0, 0.0, np.pi / 2]).as_matrix()
ROWS_3X3 = "[0, -1, 0, 1, 0, 0, 0, 0, 1]"
ROWS_4X4 = "[0, -1, 0, 1, 1, 0, 0, 2, 0, 0, 1, 3, 0, 0, 0, 1]"
AS_WRITTEN = "a transform's rotation maps the child frame into the parent frame: as written"


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def _not_read(reading):
    return [n for n in reading.notes if n.startswith("keys not read")]


def test_a_shaped_4x4_under_a_plain_key_is_a_transform_read_as_written():
    readings = decode(f"M:\n  rows: 4\n  cols: 4\n  data: {ROWS_4X4}\n")
    first = readings[0]
    assert first.label.startswith("4x4 transform")
    assert first.translation == (1.0, 2.0, 3.0) and first.name == "M"
    # the child-to-parent rotation is the upper-left 3x3 as written (common practice for [R | t])
    assert np.allclose(_matrix(first), QUARTER_Z, atol=1e-12)
    assert AS_WRITTEN in first.why


@pytest.mark.parametrize("rows", ["4.5", '""'])
def test_shaped_rows_that_are_no_whole_number_are_refused(rows):
    text = f'{{"M": {{"rows": {rows}, "cols": 4, "data": {ROWS_4X4}}}}}'
    with pytest.raises(DecodeError, match="rows and cols must be whole numbers from 1 to 16"):
        decode(text)


def test_flat_x_y_z_with_roll_pitch_yaw_reads_every_key():
    readings = decode("x: 1\ny: 2\nz: 3\nroll: 0.1\npitch: 0.2\nyaw: 0.3\n")
    first = readings[0]
    assert first.translation == (1.0, 2.0, 3.0)
    assert first.conventions == {"sequence": "ZYX", "intrinsic": True, "units": "rad"}
    # yaw-pitch-roll about moving axes = SciPy's intrinsic 'ZYX' with (yaw, pitch, roll)
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [0.3, 0.2, 0.1]).as_matrix(), atol=1e-12)
    assert "roll, pitch and yaw read by name (yaw-pitch-roll, intrinsic Z-Y'-X'')" in first.notes
    assert _not_read(first) == []


def test_suffixed_r_and_t_pair_is_one_transform_named_by_its_suffix():
    readings = decode(f"R_00: {ROWS_3X3}\nT_00: [1, 2, 3]\n")
    first = readings[0]
    assert first.label.startswith("rotation R with translation T: matrix as written")
    assert first.translation == (1.0, 2.0, 3.0) and first.name == "00"
    assert np.allclose(_matrix(first), QUARTER_Z, atol=1e-12)
    assert AS_WRITTEN in first.why
    assert all(r.translation == (1.0, 2.0, 3.0) for r in readings)


def test_a_rectifying_rotation_beside_a_transform_is_read_and_not_reported_unread():
    readings = decode(f"R0_rect: {ROWS_3X3}\nTr: [0, -1, 0, 1, 1, 0, 0, 2, 0, 0, 1, 3]\n")
    rect = [r for r in readings if r.name == "R0_rect"]
    assert rect and rect[0].translation is None
    assert np.allclose(_matrix(rect[0]), QUARTER_Z, atol=1e-12)
    assert all(_not_read(r) == [] for r in readings)
    assert any(r.name == "Tr" and r.translation == (1.0, 2.0, 3.0) for r in readings)


def test_the_orientation_reason_leads_the_why():
    first = decode("position: [1, 2, 3]\norientation: [0.1, 0.2, 0.3, 0.927]")[0]
    assert first.why.startswith("orientation lists are usually x, y, z, w (common practice); ")


def test_flat_x_y_z_with_qx_to_qw_reads_every_key_as_w_x_y_z():
    first = decode("x: 1\ny: 2\nz: 3\nqx: 0.1\nqy: 0.2\nqz: 0.3\nqw: 0.927\n")[0]
    assert first.translation == (1.0, 2.0, 3.0)
    # SciPy's from_quat takes x, y, z, w (scalar last), Hamilton
    assert np.allclose(_matrix(first), Rotation.from_quat([0.1, 0.2, 0.3, 0.927]).as_matrix(), atol=1e-12)
    assert _not_read(first) == []
