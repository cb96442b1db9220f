"""Three ways our own JSON object used to be read as the wrong orientation with no refusal
(core/decode/our_json.py), each now read right or refused:

- a byte-order mark or zero-width space before the '{' (as some editors save a file) hid the object, and
  its lines were read as bare numbers: with the axis-angle hint the quaternion's four numbers were taken
  for an axis and an angle, 36° off;
- an 'angle-first' order hint (meant for pasted numbers) was applied to the object's axis and angle entries,
  which are named and come in their own order;
- an "intrinsic" entry that is not true or false ("false" as text, 0, null) was read by Python's bool(), so
  the text "false" meant intrinsic.

The exported object is of an invented rotation; check values from SciPy's Rotation (from_euler: upper-case
axes intrinsic, lower-case extrinsic)."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import formats
from core.decode import DecodeError, decode
from core.format_options import FormatOptions
from core.orientation import Orientation

TRUTH = Rotation.from_euler("xyz", [30, 20, 10], degrees=True)          # extrinsic X, Y, Z
EXPORT = formats.render(Orientation.from_quaternion(TRUTH.as_quat(scalar_first=True)), "json",
                        FormatOptions(sequence="XYZ", intrinsic=False))
KINDS = ["quaternion", "matrix", "axis-angle", "rotation-vector", "gibbs", "mrp", "angles"]


def is_truth(reading, rotation=TRUTH):
    return np.allclose(reading.orientation.as_matrix(), rotation.as_matrix(), atol=1e-9, rtol=0)


@pytest.mark.parametrize("kind", KINDS)
@pytest.mark.parametrize("before", ["\ufeff", "\u200b", "\ufeff \n\u200b"])
def test_an_invisible_character_before_the_object_changes_nothing(before, kind):
    plain = decode(EXPORT, {"kind": kind})
    marked = decode(before + EXPORT, {"kind": kind})
    assert len(marked) == 1 and is_truth(marked[0])
    assert marked[0].notes == plain[0].notes and marked[0].conventions == plain[0].conventions
    assert "Framewright JSON object" in marked[0].notes[0]


@pytest.mark.parametrize("order", ["angle-first", "axis-first"])
def test_an_order_hint_does_not_reorder_the_objects_axis_and_angle(order):
    readings = decode(EXPORT, {"kind": "axis-angle", "order": order})
    assert len(readings) == 1 and is_truth(readings[0])
    assert readings[0].conventions == {"order": "axis, angle", "units": "deg"}


@pytest.mark.parametrize("value", ["false", "true", 0, 1, None, [False], "no"])
def test_an_intrinsic_entry_that_is_not_true_or_false_is_refused(value):
    data = json.loads(EXPORT)
    data["intrinsic"] = value
    with pytest.raises(DecodeError) as caught:
        decode(json.dumps(data), {"kind": "angles"})
    assert "JSON key 'intrinsic' should be true or false, not " + json.dumps(value) in str(caught.value)


@pytest.mark.parametrize("value, scipy_sequence", [(True, "XYZ"), (False, "xyz")])
def test_a_true_or_false_intrinsic_entry_is_read(value, scipy_sequence):
    data = json.loads(EXPORT)
    data["intrinsic"] = value
    first = decode(json.dumps(data), {"kind": "angles"})[0]
    assert first.conventions["intrinsic"] is value
    assert is_truth(first, Rotation.from_euler(scipy_sequence, data["angles_deg"], degrees=True))


def test_the_intrinsic_entry_is_only_checked_when_the_angles_are_read():
    data = json.loads(EXPORT)
    data["intrinsic"] = "false"
    assert is_truth(decode(json.dumps(data))[0])                  # the quaternion, exact


def test_a_long_intrinsic_entry_is_echoed_cut_to_40_characters():
    data = json.loads(EXPORT)
    data["intrinsic"] = "x" * 100
    with pytest.raises(DecodeError) as caught:
        decode(json.dumps(data), {"kind": "angles"})
    assert str(caught.value).endswith("should be true or false, not " + ('"' + "x" * 39))


def test_hints_that_contradict_the_kind_are_refused_as_for_pasted_numbers():
    # a sequence belongs to angles: with the rotation-vector kind it fits no reading, in our object as in
    # three pasted numbers (the hints reach the reading of the entry unchanged)
    hints = {"kind": "rotation-vector", "sequence": "XYZ"}
    for text in (EXPORT, "10 20 30"):
        with pytest.raises(DecodeError, match="no reading fits the hints given"):
            decode(text, hints)
