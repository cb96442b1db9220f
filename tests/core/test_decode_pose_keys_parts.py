"""Keyed pose blocks, part by part: a rotation key whose caption says the quaternion order, a rotation read
alone after keys that hold no pose, R_00/T_00 pairs with their translations, and a quaternion written as
named components under 'orientation:' (qx … qw), with or without a position beside it.

Check values: SciPy's Rotation (from_quat is scalar last: [0, 0, s, s] and from_rotvec([0, 0, pi/2]) are
both a quarter turn about z, rows 0 -1 0 / 1 0 0 / 0 0 1); s = sin 45° = 0.7071068 to 7 places (worked by
hand); '(x, y, z, w)' and 'scalar last' naming the scalar-last order (common practice)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

S = 0.7071068
QUARTER_Z = Rotation.from_rotvec([0.0, 0.0, np.pi / 2]).as_matrix()        # SciPy
MATRIX = "0 -1 0 1 0 0 0 0 1"                                                # QUARTER_Z row after row


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def _as_written(reading, written):
    # a matrix reading is offered both ways; the direction it took says how the written matrix is used
    want = written if reading.conventions["matrix"] == "body-to-reference" else written.T
    return np.allclose(_matrix(reading), want, atol=1e-12)


@pytest.mark.parametrize("caption, numbers, order", [
    ("rotation (x, y, z, w)", f"[0, 0, {S}, {S}]", "xyzw"),
    ("rotation (scalar last)", f"[0, 0, {S}, {S}]", "xyzw"),
    ("rotation (w, x, y, z)", f"[{S}, 0, 0, {S}]", "wxyz"),
])
def test_a_caption_naming_the_order_fixes_it(caption, numbers, order):
    readings = decode(f"position: [1, 2, 3]\n{caption}: {numbers}\n")
    assert {r.conventions["order"] for r in readings} == {order}
    best = readings[0]
    assert best.conventions == {"order": order, "convention": "Hamilton"}
    assert best.translation == (1.0, 2.0, 3.0)
    assert not any("does not say which is w" in n for n in best.notes)
    # SciPy, scalar last: [0, 0, s, s] is the quarter turn about z
    np.testing.assert_allclose(_matrix(best), Rotation.from_quat([0, 0, S, S]).as_matrix(), atol=1e-6)


def test_a_caption_without_the_order_offers_both():
    # the other side: nothing in the caption says where w stands
    readings = decode(f"position: [1, 2, 3]\nrotation: [0, 0, {S}, {S}]\n")
    assert {r.conventions["order"] for r in readings} == {"wxyz", "xyzw"}
    assert any("does not say which is w: both orders are offered" in n for n in readings[0].notes)


def test_a_shaped_rotation_after_a_key_with_no_pose_is_read():
    text = f"camera_name: left\nR:\n  rows: 3\n  cols: 3\n  data: [{MATRIX.replace(' ', ', ')}]\n"
    best = decode(text)[0]
    assert best.label.startswith("rotation: matrix")
    assert best.name == "R" and best.translation is None
    assert "read 'R' as a 3x3 rotation (no translation is written with it)" in best.notes
    assert "keys not read (no part of a pose): camera_name" in best.notes
    assert _as_written(best, QUARTER_Z)


def test_a_rectifying_rotation_after_a_projection_is_read():
    text = f"P0: 1 0 0 0 0 1 0 0 0 0 1 0\nR0_rect: {MATRIX}\nTr_velo_to_cam: 1 0 0 1 0 1 0 2 0 0 1 3\n"
    readings = decode(text)
    assert {r.name for r in readings} == {"R0_rect", "Tr_velo_to_cam"}
    rect = next(r for r in readings if r.name == "R0_rect")
    assert rect.label.startswith("rotation: matrix") and rect.translation is None
    assert _as_written(rect, QUARTER_Z)
    assert "the text holds 2 transforms (R0_rect, Tr_velo_to_cam)" in rect.notes


def test_suffix_pairs_keep_their_own_translations():
    text = f"R_00: {MATRIX}\nT_00: 1 2 3\nR_01: 1 0 0 0 1 0 0 0 1\nT_01: 4 5 6\n"
    readings = decode(text)
    by_name = {}
    for r in readings:
        by_name.setdefault(r.name, r)
    assert set(by_name) == {"00", "01"}
    assert by_name["00"].translation == (1.0, 2.0, 3.0)
    assert by_name["01"].translation == (4.0, 5.0, 6.0)
    assert "read 'R_00' (3x3) with 'T_00' (translation)" in by_name["00"].notes
    assert _as_written(by_name["00"], QUARTER_Z)
    assert by_name["00"].label.startswith("rotation R with translation T")


def test_a_suffix_pair_with_a_short_translation_is_refused():
    with pytest.raises(DecodeError):
        decode(f"R_00: {MATRIX}\nT_00: 1 2\n")


@pytest.mark.parametrize("position", ["  position: [1, 2, 3]\n", ""])
def test_named_quaternion_components_under_orientation(position):
    text = f"pose:\n{position}  orientation:\n    qx: 0\n    qy: 0\n    qz: {S}\n    qw: {S}\n"
    best = decode(text)[0]
    assert best.conventions == {"order": "wxyz", "convention": "Hamilton"}
    assert best.numbers == (S, 0.0, 0.0, S)
    assert "the quaternion's components are named (qw, qx, qy, qz); read as w, x, y, z" in best.notes
    assert best.translation == ((1.0, 2.0, 3.0) if position else None)
    # SciPy, scalar last
    np.testing.assert_allclose(_matrix(best), Rotation.from_quat([0, 0, S, S]).as_matrix(), atol=1e-6)
