"""Keyed poses (core/decode/pose_keys.py): what each rotation key reads as (rotation vector, rpy, ypr,
quaternions whose key says the order or does not, 3x3 matrices), R/T pairs and their suffixes, a
rectifying rotation alone, flat pose blocks, and each refusal's words and line. Rotations are checked
against SciPy's Rotation; words are the module's own. All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

_QUARTER_Z = [0, -1, 0, 1, 0, 0, 0, 0, 1]     # a quarter turn about Z, rows (worked by hand)


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


def _pose(rotation_line: str) -> str:
    return f"cam:\n  translation: [1, 2, 3]\n  {rotation_line}"


def test_a_rotation_vector_key_is_read_in_radians():
    first = decode(_pose("rvec: [0.1, 0.2, 0.3]"))[0]
    assert first.kind == "rotation-vector" and first.name == "cam" and first.translation == (1.0, 2.0, 3.0)
    assert first.notes == ("'rvec' is a rotation vector; its length is in radians (common practice)",)
    # SciPy's from_rotvec (radians)
    assert np.allclose(_matrix(first), Rotation.from_rotvec([0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("numbers, count", [("[0.1, 0.2, 0.3, 0.4]", 4), ("[0.1, 0.2]", 2)])
def test_a_rotation_vector_of_other_than_three_numbers_is_refused(numbers, count):
    with pytest.raises(DecodeError, match=rf"^line 3: 'rvec' \(a rotation vector\) needs 3 numbers; found {count}"):
        decode(_pose(f"rvec: {numbers}"))


def test_rpy_is_roll_pitch_yaw_about_fixed_axes_in_radians():
    first = decode(_pose("rpy: [0.1, 0.2, 0.3]"))[0]
    assert first.notes == ("rpy: roll, pitch, yaw about fixed axes X, Y, Z in radians (common practice)",)
    # SciPy's extrinsic 'xyz' in radians
    assert np.allclose(_matrix(first), Rotation.from_euler("xyz", [0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)


def test_ypr_is_yaw_pitch_roll_intrinsic_and_its_units_are_judged():
    first = decode(_pose("ypr: [10, 20, 30]"))[0]
    assert first.conventions == {"sequence": "ZYX", "intrinsic": True, "units": "deg"}
    # SciPy's intrinsic 'ZYX' in degrees (values beyond 2 pi: degrees)
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [10, 20, 30], degrees=True).as_matrix(),
                       atol=1e-12)


@pytest.mark.parametrize("key, numbers, order", [("quaternion_wxyz", "[0.8, 0.6, 0, 0]", "wxyz"),
                                                 ("q_xyzw", "[0.6, 0, 0, 0.8]", "xyzw")])
def test_a_quaternion_key_that_says_its_order_is_read_in_that_order_alone(key, numbers, order):
    readings = decode(_pose(f"{key}: {numbers}"))
    assert len(readings) == 1 and readings[0].conventions["order"] == order
    assert readings[0].notes == ()
    # both are w = 0.8, x = 0.6 (SciPy, scalar last)
    assert np.allclose(_matrix(readings[0]), Rotation.from_quat([0.6, 0, 0, 0.8]).as_matrix(), atol=1e-12)


def test_an_orientation_list_offers_both_orders_and_prefers_scalar_last():
    readings = decode("cam:\n  position: [1, 2, 3]\n  orientation: [0.6, 0, 0, 0.8]")
    first = readings[0]
    assert first.conventions["order"] == "xyzw"
    assert first.why.startswith("orientation lists are usually x, y, z, w (common practice); ")
    assert "'orientation' holds 4 numbers and does not say which is w: both orders are offered" in first.notes
    assert any(r.conventions.get("order") == "wxyz" for r in readings[1:])
    assert not any(r.why.startswith("orientation lists") for r in readings[1:])


def test_a_rotation_list_of_four_offers_both_orders_without_a_preference():
    readings = decode("cam:\n  translation: [1, 2, 3]\n  rotation: [0.6, 0, 0, 0.8]")
    assert not any(r.why.startswith("orientation lists") for r in readings)
    assert "'rotation' holds 4 numbers and does not say which is w: both orders are offered" in readings[0].notes


def test_nine_numbers_under_a_rotation_key_are_a_matrix():
    first = decode(_pose(f"rotation: {_QUARTER_Z}"))[0]
    assert first.kind == "matrix"
    assert np.allclose(_matrix(first), Rotation.from_euler("z", 90, degrees=True).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("numbers", ["[0, -1, 0, 1, 0]", "[0, -1, 0, 1, 0, 0, 0, 0, 1, 0]"])
def test_a_rotation_key_with_a_count_no_rotation_has_is_refused(numbers):
    count = len(numbers.split(","))
    with pytest.raises(DecodeError, match=rf"^line 3: 'rotation' holds {count} numbers; a rotation is 9 \(a matrix\),"
                                          r" 4 \(a quaternion\) or 3 \(angles or a rotation vector\)"):
        decode(_pose(f"rotation: {numbers}"))


def test_r_and_t_pairs_are_named_by_their_suffix():
    text = f"R_00: {_QUARTER_Z}\nT_00: [1, 2, 3]\nR_01: [1, 0, 0, 0, 1, 0, 0, 0, 1]\nT_01: [4, 5, 6]"
    readings = decode(text)
    firsts = {r.name: r for r in reversed(readings)}
    assert list(dict.fromkeys(r.name for r in readings)) == ["00", "01"]
    assert firsts["00"].label.startswith("rotation R with translation T: ")
    assert "read 'R_00' (3x3) with 'T_00' (translation)" in firsts["00"].notes
    assert firsts["00"].translation == (1.0, 2.0, 3.0) and firsts["01"].translation == (4.0, 5.0, 6.0)
    assert np.allclose(_matrix(firsts["00"]), Rotation.from_euler("z", 90, degrees=True).as_matrix(), atol=1e-12)


def test_a_bare_r_and_t_pair_has_no_name():
    first = decode(f"R: {_QUARTER_Z}\nT: [1, 2, 3]")[0]
    assert first.name is None and first.translation == (1.0, 2.0, 3.0)


def test_a_rectifying_rotation_among_transforms_is_a_rotation_of_its_own():
    readings = decode(f"R0_rect: {_QUARTER_Z}\nTr: [1, 0, 0, 1, 0, 1, 0, 2, 0, 0, 1, 3]")
    rect = next(r for r in readings if r.name == "R0_rect")
    assert rect.label.startswith("rotation: ") and rect.translation is None
    assert "read 'R0_rect' as a 3x3 rotation (no translation is written with it)" in rect.notes
    tr = next(r for r in readings if r.name == "Tr")
    assert tr.translation == (1.0, 2.0, 3.0)


def test_a_flat_block_with_quaternion_components_reads_them_by_name():
    first = decode("x: 1\ny: 2\nz: 3\nqx: 0\nqy: 0\nqz: 0.6\nqw: 0.8")[0]
    assert first.translation == (1.0, 2.0, 3.0)
    assert first.notes == ("x, y, z read as the position beside the named rotation components",
                           "the quaternion's components are named (qx, qy, qz, qw); read as w, x, y, z")
    # qz = 0.6, qw = 0.8 (SciPy, scalar last)
    assert np.allclose(_matrix(first), Rotation.from_quat([0, 0, 0.6, 0.8]).as_matrix(), atol=1e-12)


def test_a_flat_block_with_roll_pitch_yaw_reads_yaw_pitch_roll():
    first = decode("x: 1\ny: 2\nz: 3\nroll: 0.1\npitch: 0.2\nyaw: 0.3")[0]
    assert "roll, pitch and yaw read by name (yaw-pitch-roll, intrinsic Z-Y'-X'')" in first.notes
    assert np.allclose(_matrix(first), Rotation.from_euler("ZYX", [0.3, 0.2, 0.1]).as_matrix(), atol=1e-12)


def test_components_under_translation_and_rotation_groups_are_read_by_name():
    text = "cam:\n  translation:\n    x: 1\n    y: 2\n    z: 3\n  rotation:\n    x: 0\n    y: 0\n    z: 0.6\n    w: 0.8"
    first = decode(text)[0]
    assert first.translation == (1.0, 2.0, 3.0)
    assert np.allclose(_matrix(first), Rotation.from_quat([0, 0, 0.6, 0.8]).as_matrix(), atol=1e-12)


def test_a_key_of_the_pose_written_twice_is_refused_naming_both_lines():
    with pytest.raises(DecodeError, match=r"^line 3: 'translation' under 'cam' is written twice \(lines 2 and 3\);"
                                          r" Framewright will not guess which one is meant"):
        decode("cam:\n  translation: [1, 2, 3]\n  translation: [1, 2, 4]\n  rpy: [0, 0, 0]")


def test_a_top_level_key_written_twice_is_refused_without_a_group():
    with pytest.raises(DecodeError, match=r"^line 2: 'rpy' is written twice \(lines 1 and 2\)"):
        decode("rpy: [0, 0, 0]\nrpy: [0, 0, 1]\ntranslation: [1, 2, 3]")


def test_numbers_under_no_key_beside_a_pose_are_refused():
    with pytest.raises(DecodeError, match=r"^line 4: '5 6 7' holds numbers under no key of the pose; Framewright"
                                          r" will not guess where they belong"):
        decode("cam:\n  translation: [1, 2, 3]\n  rpy: [0, 0, 0]\n5 6 7")


def test_a_unit_said_in_a_comment_applies_to_a_keyed_translation():
    assert decode("# t in mm\ncam:\n  translation: [1, 2, 3]\n  rpy: [0, 0, 0]")[0].translation_unit == "mm"
    assert decode("cam:\n  translation: [1, 2, 3]\n  rpy: [0, 0, 0]")[0].translation_unit is None


def test_a_json_pose_is_labelled_as_json():
    first = decode('{"cam": {"translation": [1, 2, 3], "rotation": [0, 0, 0.6, 0.8]}}')[0]
    assert first.label.startswith("pose (JSON): ") and first.name == "cam"


@pytest.mark.parametrize("rotation_line, hints", [
    ("rvec: [0.1, 0.2, 0.3]", {"units": "rad", "kind": "rotation-vector"}),
    ("ypr: [10, 20, 30]", {"sequence": "ZYX", "kind": "angles"}),
    ("quaternion_wxyz: [0.8, 0.6, 0, 0]", {"order": "wxyz", "kind": "quaternion"}),
    ("q_xyzw: [0.6, 0, 0, 0.8]", {"order": "xyzw", "kind": "quaternion"}),
    ("rpy: [0.1, 0.2, 0.3]", {"units": "rad", "sequence": "XYZ", "intrinsic": False}),
])
def test_hints_that_agree_with_what_the_key_fixes_are_taken(rotation_line, hints):
    readings = decode(_pose(rotation_line), hints)
    assert len(readings) == 1 and readings[0].translation == (1.0, 2.0, 3.0)


@pytest.mark.parametrize("rotation_line, hints, key", [
    ("rvec: [0.1, 0.2, 0.3]", {"units": "deg"}, "units"),
    ("ypr: [10, 20, 30]", {"sequence": "XYZ"}, "sequence"),
    ("quaternion_wxyz: [0.8, 0.6, 0, 0]", {"order": "xyzw"}, "order"),
])
def test_hints_that_contradict_what_the_key_fixes_are_refused(rotation_line, hints, key):
    with pytest.raises(DecodeError, match=rf"^the text is a pose \(keyed text\), whose {key} is "):
        decode(_pose(rotation_line), hints)


def test_ypr_fixes_the_sequence_but_not_the_units():
    first = decode(_pose("ypr: [0.1, 0.2, 0.3]"))[0]
    assert "sequence fixed by the pose; " in first.why and "units fixed" not in first.why


def test_three_numbers_under_a_rotation_key_beside_a_position_are_angles():
    first = decode(_pose("rotation: [10, 20, 30]"))[0]
    assert first.kind == "angles" and first.translation == (1.0, 2.0, 3.0)
