"""Our own JSON object read back entry by entry (core/decode/our_json.py): each kind hint reads its own entry
and no other, the quaternion when no kind is given, the angles' own sequence and axes with their
defaults, the note that names the entry, which texts are not our object, and each refusal's words.

The object below is invented and holds a different rotation in every entry on purpose, so a reading that
took the wrong entry shows. Check values: SciPy's Rotation (from_quat, from_matrix, from_rotvec, from_mrp,
from_euler: upper-case axes are intrinsic, lower-case extrinsic there); the Gibbs vector g = n·tan(φ/2) of
Shuster, "A Survey of Attitude Representations" (1993), worked by hand (tan 30° = 1/√3); the refusal
words are the module's own."""

import json
import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode
from core.decode.hints import DecodeHints
from core.decode.our_json import _decode_our_json

# one invented rotation per entry
QUATERNION = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True)
MATRIX = Rotation.from_rotvec([0.1, 0.2, 0.3])
AXIS, ANGLE = (0.0, 0.6, 0.8), 50.0
AXIS_ANGLE = Rotation.from_rotvec(np.array(AXIS) * math.radians(ANGLE))
ROTATION_VECTOR = Rotation.from_rotvec([10, -20, 30], degrees=True)
GIBBS_VALUE = [1 / math.sqrt(3), 0.0, 0.0]               # n tan(φ/2) for 60° about x (Shuster 1993)
GIBBS = Rotation.from_rotvec([math.radians(60), 0, 0])
MRP = Rotation.from_euler("xyz", [5, 15, 25], degrees=True)
ANGLES = Rotation.from_euler("xyz", [40, -10, 70], degrees=True)      # extrinsic X, Y, Z


def whole_object(**changes):
    data = {"format": "framewright orientation",
            "matrix": MATRIX.as_matrix().tolist(),
            "quaternion_wxyz": QUATERNION.as_quat(scalar_first=True).tolist(),
            "axis": list(AXIS), "angle_deg": ANGLE,
            "rotation_vector_deg": ROTATION_VECTOR.as_rotvec(degrees=True).tolist(),
            "gibbs": GIBBS_VALUE, "mrp": MRP.as_mrp().tolist(),
            "sequence": "XYZ", "intrinsic": False, "angles_deg": [40, -10, 70]}
    data.update(changes)
    return json.dumps(data)


def without(*keys, **changes):
    data = json.loads(whole_object(**changes))
    for key in keys:
        del data[key]
    return json.dumps(data)


def is_rotation(reading, rotation):
    return np.allclose(reading.orientation.as_matrix(), rotation.as_matrix(), atol=1e-9, rtol=0)


@pytest.mark.parametrize("kind, rotation, entry, conventions", [
    ("quaternion", QUATERNION, "quaternion_wxyz", {"order": "wxyz", "convention": "Hamilton"}),
    ("matrix", MATRIX, "matrix", {"matrix": "body-to-reference"}),
    ("axis-angle", AXIS_ANGLE, "axis-angle", {"order": "axis, angle", "units": "deg"}),
    ("rotation-vector", ROTATION_VECTOR, "rotation-vector", {"units": "deg"}),
    ("gibbs", GIBBS, "gibbs", {}),
    ("mrp", MRP, "mrp", {}),
    ("angles", ANGLES, "angles", {"sequence": "XYZ", "intrinsic": False, "units": "deg"}),
])
def test_each_kind_reads_its_own_entry_and_says_so(kind, rotation, entry, conventions):
    readings = decode(whole_object(), {"kind": kind})
    assert len(readings) == 1
    first = readings[0]
    assert first.kind == kind and is_rotation(first, rotation)
    assert first.conventions == conventions
    assert first.notes == (f"read the '{entry}' entry of a Framewright JSON object",)


@pytest.mark.parametrize("hints", [None, {}, {"kind": None}, {"units": "rad"}, {"sequence": "ZXZ"}])
def test_without_a_kind_the_exact_quaternion_is_read(hints):
    readings = decode(whole_object(), hints)
    assert len(readings) == 1 and readings[0].kind == "quaternion"
    assert is_rotation(readings[0], QUATERNION)
    assert readings[0].notes == ("read the 'quaternion_wxyz' entry of a Framewright JSON object",)


def test_the_kind_may_be_spelled_any_way_a_hint_is():
    for spelling in ("rotvec", "ROTATION_VECTOR", "Rotation vector"):
        assert is_rotation(decode(whole_object(), {"kind": spelling})[0], ROTATION_VECTOR)
    for spelling in ("MRPS", "modified-rodrigues-parameters"):
        assert is_rotation(decode(whole_object(), {"kind": spelling})[0], MRP)
    assert decode(whole_object(), {"kind": "QUAT"})[0].notes[0] == \
        "read the 'quaternion_wxyz' entry of a Framewright JSON object"


def test_a_users_units_hint_does_not_turn_degree_entries_into_radians():
    # the entries are in degrees by their names; a units hint for pasted numbers does not change that
    for kind, rotation in (("rotation-vector", ROTATION_VECTOR), ("axis-angle", AXIS_ANGLE), ("angles", ANGLES)):
        assert is_rotation(decode(whole_object(), {"kind": kind, "units": "rad"})[0], rotation)
    for kind, rotation in (("gibbs", GIBBS), ("mrp", MRP)):
        first = decode(whole_object(), {"kind": kind, "units": "deg"})[0]
        assert is_rotation(first, rotation) and first.conventions == {}


def test_a_users_matrix_and_angle_hints_do_not_override_the_objects_own():
    first = decode(whole_object(), {"kind": "matrix", "transposed": True})[0]
    assert is_rotation(first, MATRIX) and first.conventions == {"matrix": "body-to-reference"}
    first = decode(whole_object(), {"kind": "angles", "sequence": "ZYX", "intrinsic": True})[0]
    assert is_rotation(first, ANGLES)
    first = decode(whole_object(), {"kind": "quaternion", "order": "xyzw"})[0]
    assert is_rotation(first, QUATERNION) and first.conventions["order"] == "wxyz"


def test_angles_without_a_sequence_are_intrinsic_zyx():
    # yaw, pitch, roll: intrinsic Z-Y'-X'' (common practice; the export's default sequence)
    first = decode(without("sequence", "intrinsic"), {"kind": "angles"})[0]
    assert first.conventions == {"sequence": "ZYX", "intrinsic": True, "units": "deg"}
    assert is_rotation(first, Rotation.from_euler("ZYX", [40, -10, 70], degrees=True))


@pytest.mark.parametrize("intrinsic, scipy_sequence", [(True, "XYZ"), (False, "xyz")])
def test_the_angles_intrinsic_flag_is_read(intrinsic, scipy_sequence):
    first = decode(whole_object(intrinsic=intrinsic), {"kind": "angles"})[0]
    assert first.conventions["intrinsic"] is intrinsic
    assert is_rotation(first, Rotation.from_euler(scipy_sequence, [40, -10, 70], degrees=True))


def test_extrinsic_angles_without_a_sequence_are_zyx_and_read_once():
    # the sequence defaults to ZYX whatever the flag: one reading, not a choice of sequences
    readings = decode(without("sequence"), {"kind": "angles"})
    assert [r.conventions for r in readings] == [{"sequence": "ZYX", "intrinsic": False, "units": "deg"}]
    assert is_rotation(readings[0], Rotation.from_euler("zyx", [40, -10, 70], degrees=True))


def test_angles_with_a_sequence_but_no_flag_are_intrinsic():
    first = decode(without("intrinsic"), {"kind": "angles"})[0]
    assert first.conventions == {"sequence": "XYZ", "intrinsic": True, "units": "deg"}
    assert is_rotation(first, Rotation.from_euler("XYZ", [40, -10, 70], degrees=True))


def test_an_unknown_sequence_in_the_object_is_refused():
    with pytest.raises(DecodeError, match="sequence hint: cannot read 'ABC' as an angle sequence"):
        decode(whole_object(sequence="ABC"), {"kind": "angles"})


def test_numbers_written_as_json_text_are_read_and_nested_lists_are_flattened():
    q = QUATERNION.as_quat(scalar_first=True)
    as_text = [repr(float(v)) for v in q]
    assert is_rotation(decode(whole_object(quaternion_wxyz=as_text))[0], QUATERNION)
    mixed = [float(q[0]), as_text[1], float(q[2]), as_text[3]]
    assert is_rotation(decode(whole_object(quaternion_wxyz=mixed))[0], QUATERNION)
    nested = [[float(q[0]), float(q[1])], [float(q[2]), float(q[3])]]
    assert is_rotation(decode(whole_object(quaternion_wxyz=nested))[0], QUATERNION)
    flat_matrix = MATRIX.as_matrix().ravel().tolist()
    assert is_rotation(decode(whole_object(matrix=flat_matrix), {"kind": "matrix"})[0], MATRIX)


MALFORMED = "the JSON object has a malformed representation: "


@pytest.mark.parametrize("text, hints, words", [
    (whole_object(quaternion_wxyz=[1, 0, 0]), None, "JSON key 'quaternion_wxyz' should hold 4 finite numbers"),
    (whole_object(quaternion_wxyz=[1, 0, 0, 0, 0]), None,
     "JSON key 'quaternion_wxyz' should hold 4 finite numbers"),
    (whole_object(quaternion_wxyz=None), None, "JSON key 'quaternion_wxyz' should hold 4 finite numbers"),
    (whole_object(quaternion_wxyz=[1, 0, 0, 1e400]), None,
     "JSON key 'quaternion_wxyz' should hold 4 finite numbers"),
    (whole_object(quaternion_wxyz=["x", 0, 0, 0]), None, "could not convert string to float: 'x'"),
    (whole_object(quaternion_wxyz={"w": 1}), None, "float() argument must be a string or a real number"),
    (whole_object(matrix=[[1, 0, 0], [0, 1, 0]]), {"kind": "matrix"}, "JSON key 'matrix' should hold 9 finite numbers"),
    (without("axis"), {"kind": "axis-angle"}, "JSON key 'axis' should hold 3 finite numbers"),
    (whole_object(axis=[0, 0, 1, 0]), {"kind": "axis-angle"}, "JSON key 'axis' should hold 3 finite numbers"),
    (whole_object(angle_deg=[50, 1]), {"kind": "axis-angle"}, "JSON key 'angle_deg' should hold 1 finite numbers"),
    (without("angle_deg"), {"kind": "axis-angle"}, "JSON key 'angle_deg' should hold 1 finite numbers"),
    (without("rotation_vector_deg"), {"kind": "rotation-vector"},
     "JSON key 'rotation_vector_deg' should hold 3 finite numbers"),
    (whole_object(rotation_vector_deg=[1, 2, 3, 4]), {"kind": "rotation-vector"},
     "JSON key 'rotation_vector_deg' should hold 3 finite numbers"),
    (without("gibbs"), {"kind": "gibbs"}, "JSON key 'gibbs' should hold 3 finite numbers"),
    (whole_object(gibbs=None), {"kind": "gibbs"},
     "JSON key 'gibbs' is null: the Gibbs vector is infinite at a half turn (180°): it does not exist there"),
    (without("mrp"), {"kind": "mrp"}, "JSON key 'mrp' should hold 3 finite numbers"),
    (whole_object(mrp=None), {"kind": "mrp"}, "JSON key 'mrp' should hold 3 finite numbers"),
    (whole_object(mrp=[0.1, 0.2]), {"kind": "mrp"}, "JSON key 'mrp' should hold 3 finite numbers"),
    (without("angles_deg"), {"kind": "angles"}, "JSON key 'angles_deg' should hold 3 finite numbers"),
    (whole_object(angles_deg=[1, 2, 3, 4]), {"kind": "angles"}, "JSON key 'angles_deg' should hold 3 finite numbers"),
])
def test_a_bad_entry_is_refused_by_its_key(text, hints, words):
    with pytest.raises(DecodeError) as caught:
        decode(text, hints)
    assert str(caught.value).startswith(MALFORMED)
    assert words in str(caught.value)


@pytest.mark.parametrize("literal", ["NaN", "Infinity", "-Infinity"])
def test_non_finite_json_literals_are_refused(literal):
    # Python's json module reads these non-standard literals; our object never holds them
    text = '{"quaternion_wxyz": [%s, 0, 0, 1]}' % literal
    with pytest.raises(DecodeError, match=r"JSON key 'quaternion_wxyz' should hold 4 finite numbers"):
        decode(text)


def test_only_the_entry_asked_for_is_checked():
    # a broken matrix does not stop the quaternion from being read, nor a null Gibbs vector the MRPs
    assert is_rotation(decode(whole_object(matrix="broken"))[0], QUATERNION)
    assert is_rotation(decode(whole_object(gibbs=None), {"kind": "mrp"})[0], MRP)
    assert is_rotation(decode(whole_object(rotation_vector_deg="broken"), {"kind": "angles"})[0], ANGLES)


@pytest.mark.parametrize("text", [
    '{"pose": {"quaternion_wxyz": [1, 0, 0, 0]}}',        # the key one level down
    '{"note": "quaternion_wxyz"}',                         # the word in a value
    '[{"quaternion_wxyz": [1, 0, 0, 0]}]',                # a list, not an object
    '{"quaternion_wxyz": [1, 0, 0, 0]',                    # not JSON
    '{"quaternion": [1, 0, 0, 0]}',                        # another key
    'quaternion_wxyz = {1, 0, 0, 0}',
    '',
])
def test_texts_that_are_not_our_object_are_left_to_the_other_readers(text):
    assert _decode_our_json(text, DecodeHints()) is None


def test_a_deeply_nested_object_is_not_our_object_and_does_not_crash():
    text = '{"quaternion_wxyz": ' + "[" * 100_000 + "]" * 100_000 + "}"
    assert _decode_our_json(text, DecodeHints()) is None


def test_the_note_comes_before_the_readings_own_notes():
    # an axis of length 2 is scaled to unit length, and the reading says so after naming the entry
    first = decode(whole_object(axis=[0, 1.2, 1.6]), {"kind": "axis-angle"})[0]
    assert first.notes[0] == "read the 'axis-angle' entry of a Framewright JSON object"
    assert len(first.notes) > 1 and all(isinstance(note, str) for note in first.notes)
    assert is_rotation(first, AXIS_ANGLE)
