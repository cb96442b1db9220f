"""Every item of one mount's part of the record (core/inspection_record.py), in print order: each figure's
key, label (the record's own words), unit and values, and the lines of words between them. Built in-process
from an invented session of one tilted camera bracket. Check values: SciPy's Rotation for every quaternion,
matrix, axis, angle and vector; tan(φ/2) and tan(φ/4) for the Gibbs vector and the MRP (their published
formulas); labels are the record's own words."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, PartProperties, Preferences, Session

# Invented: a camera bracket turned yaw 30°, pitch 20°, roll 10° (ZYX intrinsic, built through SciPy).
TURN = Rotation.from_euler("ZYX", [30.0, 20.0, 10.0], degrees=True)
BRACKET = Orientation.from_quaternion(TURN.as_quat(scalar_first=True))
# Invented: the camera's box, with its lens on +X
CAMERA = PartProperties(box_size_mm=(80.0, 50.0, 30.0), face_names={"+X": "lens"}, boresight="+X")


def _record(orientation=BRACKET, preferences=None, position=(12.5, -3.0, 40.0), notes=""):
    where = None if position is None else Position.from_shown(position, "mm")
    mount = Mount("Camera bracket", orientation, notes=notes, position=where, part=CAMERA)
    session = Session(mounts=(mount,), reference_frame="enu", preferences=preferences or Preferences())
    return records.session_record(session, "bracket.fwsession.json", "0" * 64)


def _items(**kwargs):
    return list(_record(**kwargs).sections[0].items)


def _figures(items):
    return {i.key: i for i in items if isinstance(i, records.Figure)}


def _numbers(figure):
    return [float(v) for v in figure.values]


def test_the_figures_come_in_print_order_with_their_labels_and_units():
    # the record's own words, in the order a reader meets them
    expected = [
        ("mount[0].name", "Mount", "", ()),
        ("mount[0].quaternion_wxyz", "Quaternion (w, x, y, z), Hamilton, w not negative", "dimensionless", ()),
        ("mount[0].matrix", "Rotation matrix, body → reference (v_ref = R · v_body; the columns are the body "
                            "axes)", "dimensionless", (3, 3)),
        ("mount[0].axis", "Rotation axis (x, y, z), in reference axes", "unit vector", ()),
        ("mount[0].angle", "Rotation angle about that axis (right-hand rule)", "deg", ()),
        ("mount[0].rotation_vector", "Rotation vector (x, y, z) = angle × axis", "deg", ()),
        ("mount[0].gibbs", "Gibbs vector (classical Rodrigues parameters) (x, y, z) = n tan(φ/2), n the axis and "
                           "φ the angle", "dimensionless", ()),
        ("mount[0].mrp", "Modified Rodrigues parameters (MRP) (x, y, z) = n tan(φ/4), n the axis and φ the angle, "
                         "the set of length at most 1", "dimensionless", ()),
        ("mount[0].angles", "Angles Z-Y′-X″ intrinsic (yaw, pitch, roll)", "deg", ()),
        ("mount[0].gimbal_margin", "Gimbal margin of ZYX intrinsic", "deg", ()),
        ("mount[0].position", "Position of the body origin (x, y, z), in reference axes", "mm", ()),
    ]
    items = _items()
    got = [(i.key, i.label, i.unit, i.shape) for i in items if isinstance(i, records.Figure)]
    assert got == expected


def test_the_mount_is_named_by_its_own_name():
    assert _figures(_items())["mount[0].name"].values == ("Camera bracket",)


def test_the_quaternion_and_matrix_agree_with_scipy():
    figures = _figures(_items())
    # SciPy's Rotation, scalar first; w is positive here so no sign flip is needed
    quaternion = TURN.as_quat(scalar_first=True)
    assert quaternion[0] > 0
    assert _numbers(figures["mount[0].quaternion_wxyz"]) == pytest.approx(quaternion, abs=1e-9)
    assert _numbers(figures["mount[0].matrix"]) == pytest.approx(TURN.as_matrix().ravel(), abs=1e-9)


def test_the_axis_angle_and_rotation_vector_agree_with_scipy():
    figures = _figures(_items())
    rotvec = TURN.as_rotvec(degrees=True)               # SciPy's Rotation, degrees
    angle = float(np.linalg.norm(rotvec))
    assert _numbers(figures["mount[0].angle"]) == pytest.approx([angle], abs=1e-7)
    assert _numbers(figures["mount[0].axis"]) == pytest.approx(rotvec / angle, abs=1e-9)
    assert _numbers(figures["mount[0].rotation_vector"]) == pytest.approx(rotvec, abs=1e-7)


def test_the_gibbs_vector_and_mrp_follow_their_formulas():
    figures = _figures(_items())
    rotvec = TURN.as_rotvec()                           # SciPy's Rotation, radians
    phi = float(np.linalg.norm(rotvec))
    axis = rotvec / phi
    # published formulas: Gibbs n tan(φ/2), MRP n tan(φ/4)
    assert _numbers(figures["mount[0].gibbs"]) == pytest.approx(axis * np.tan(phi / 2), abs=1e-9)
    assert _numbers(figures["mount[0].mrp"]) == pytest.approx(axis * np.tan(phi / 4), abs=1e-9)
    # SciPy's Rotation agrees on the MRP
    assert _numbers(figures["mount[0].mrp"]) == pytest.approx(TURN.as_mrp(), abs=1e-9)


def test_the_angles_and_gimbal_margin_agree_with_scipy():
    figures = _figures(_items())
    assert _numbers(figures["mount[0].angles"]) == pytest.approx([30.0, 20.0, 10.0], abs=1e-7)
    # worked by hand: the margin of a Tait–Bryan sequence is 90° less the middle angle's size
    assert _numbers(figures["mount[0].gimbal_margin"]) == pytest.approx([70.0], abs=1e-7)


def test_the_position_is_printed_as_typed_in_millimetres():
    figure = _figures(_items())["mount[0].position"]
    assert figure.values == ("12.5", "-3", "40")
    assert figure.unit == "mm"


def test_a_mount_without_a_position_prints_no_position():
    assert "mount[0].position" not in _figures(_items(position=None))


def test_extrinsic_angles_are_labelled_extrinsic_with_their_trade_names():
    # Invented: the same bracket read in the fixed-axes roll-pitch-yaw preset (XYZ extrinsic)
    figures = _figures(_items(preferences=Preferences(sequence="XYZ", intrinsic=False)))
    assert figures["mount[0].angles"].label == "Angles X-Y-Z extrinsic (roll, pitch, yaw)"
    assert figures["mount[0].gimbal_margin"].label == "Gimbal margin of XYZ extrinsic"
    # SciPy's Rotation: lower case is extrinsic
    extrinsic = TURN.as_euler("xyz", degrees=True)
    assert _numbers(figures["mount[0].angles"]) == pytest.approx(extrinsic, abs=1e-7)
    # worked by hand: the margin is 90° less the size of the middle angle of this very sequence
    assert _numbers(figures["mount[0].gimbal_margin"]) == pytest.approx([90.0 - abs(extrinsic[1])], abs=1e-7)
    assert abs(extrinsic[1]) != pytest.approx(abs(TURN.as_euler("XYZ", degrees=True)[1]), abs=1e-3)


def test_intrinsic_angles_without_trade_names_name_no_angles():
    figures = _figures(_items(preferences=Preferences(sequence="XYZ", intrinsic=True)))
    assert figures["mount[0].angles"].label == "Angles X-Y′-Z″ intrinsic"
    assert _numbers(figures["mount[0].angles"]) == pytest.approx(TURN.as_euler("XYZ", degrees=True), abs=1e-7)


def test_the_figures_keep_the_sessions_significant_digits():
    figures = _figures(_items(preferences=Preferences(significant_digits=4)))
    quaternion = TURN.as_quat(scalar_first=True)        # SciPy's Rotation
    # 4 significant digits counted from the largest (w, below 1): 4 decimals (worked by hand)
    assert figures["mount[0].quaternion_wxyz"].values == tuple(f"{v:.4f}".rstrip("0") for v in quaternion)


def test_a_tiny_turn_still_prints_its_axis():
    # Invented: a turn of 1e-6° about Z; any angle above 0 has an axis
    figures = _figures(_items(orientation=Orientation.from_axis_angle([0, 0, 1], 1e-6)))
    assert figures["mount[0].axis"].values == ("0", "0", "1")
    assert _numbers(figures["mount[0].angle"]) == pytest.approx([1e-6], rel=1e-6)


def test_the_words_between_the_figures():
    items = _items(notes="  aligned   on the\nbench  ")
    lines = [i for i in items if isinstance(i, str)]
    assert lines[0] == "Where the body axes point (directions named as ENU (x east, y north, z up)):"
    assert all(line.startswith("    ") for line in lines[1:-1])
    assert lines[-1] == "Notes: aligned on the bench"


def test_the_level_table_follows_the_position_and_precedes_the_directions():
    items = _items()
    kinds = [type(i).__name__ for i in items]
    position = [i for i, x in enumerate(items) if isinstance(x, records.Figure) and x.key == "mount[0].position"][0]
    assert kinds[position + 1] == "Table"
    assert items[position + 2].startswith("Where the body axes point")


def test_the_session_section_is_titled_by_number_and_name_and_pictures_the_part_over_the_reference():
    section = _record().sections[0]
    assert section.title == "Mount 1: Camera bracket"
    assert section.picture.ghost_label == "reference"
    assert section.picture.ghost.angle_to(Orientation.identity()) == pytest.approx(0, abs=1e-9)
    assert section.picture.orientation.angle_to(BRACKET) == pytest.approx(0, abs=1e-9)
    assert section.picture.preset == "enu"
    assert section.picture.part == CAMERA
