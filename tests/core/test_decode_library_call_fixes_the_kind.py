"""A SciPy-style library call in the paste (from_quat, from_euler, from_rotvec) fixes the kind: its
numbers are read only as that kind, and a count the call cannot take is refused rather than read as
another kind. Before this was pinned, 'R.from_quat([10, 20, 30])' was read as Euler angles and
'R.from_quat([0, 0, 1, 90])' ranked an axis and angle first. Check values: SciPy's Rotation (from_quat is
scalar last, documented); the numbers are invented demo values; the refusal words are the module's own."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


@pytest.mark.parametrize("text, kind, takes, holds", [
    ("R.from_quat([10, 20, 30])", "quat", 4, 3),
    ("R.from_euler('xyz', [0.1, 0.2, 0.3, 0.4])", "euler", 3, 4),
    ("R.from_rotvec([0.1, 0.2, 0.3, 0.5])", "rotvec", 3, 4),
    ("R.from_euler('xyz', [1, 2, 3, 4, 5, 6, 7, 8, 9])", "euler", 3, 9),
    ("q = r.as_quat()\n0.1 0.2 0.3", "quat", 4, 3),
])
def test_a_count_the_call_cannot_take_is_refused(text, kind, takes, holds):
    with pytest.raises(DecodeError) as err:
        decode(text)
    message = str(err.value)
    assert message.startswith(f"the text's library call (from_{kind} or as_{kind}) takes {takes} numbers, but the"
                              f" text holds {holds} (")
    assert message.endswith("): Framewright will not read them as another kind; paste the call's own numbers")


@pytest.mark.parametrize("text, kind", [
    ("R.from_quat([0, 0, 1, 90])", "quaternion"),
    ("R.from_quat([0, 0, 0.3826834, 0.9238795])", "quaternion"),
    ("R.from_rotvec([0.1, 0.2, 0.3], degrees=True)", "rotation-vector"),
    ("R.from_euler('xyz', [10, 20, 30], degrees=True)", "angles"),
])
def test_every_reading_is_of_the_kind_the_call_names(text, kind):
    readings = decode(text)
    assert readings and {r.kind for r in readings} == {kind}


def test_from_quat_of_four_numbers_reads_scalar_last_first():
    first = decode("R.from_quat([0, 0, 1, 90])")[0]
    assert first.conventions == {"order": "xyzw", "convention": "Hamilton"}
    assert np.allclose(first.orientation.as_matrix(), Rotation.from_quat([0, 0, 1, 90]).as_matrix(), atol=1e-12)


def test_a_kind_hint_still_wins_over_the_call():
    readings = decode("R.from_quat([0, 0, 1, 90])", {"kind": "axis-angle"})
    assert {r.kind for r in readings} == {"axis-angle"}


def test_the_call_matching_its_count_reads_as_before():
    first = decode("R.from_rotvec([0.1, 0.2, 0.3])")[0]
    assert np.allclose(first.orientation.as_matrix(), Rotation.from_rotvec([0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)


def test_from_euler_names_its_sequence_and_kind():
    readings = decode("R.from_euler('xyz', [10, 20, 30], degrees=True)")
    assert len(readings) == 1
    assert readings[0].why == ("the only reading: the text names XYZ; the library call says degrees=True; the text"
                               " says angles")
    assert readings[0].conventions == {"sequence": "XYZ", "intrinsic": False, "units": "deg"}


@pytest.mark.parametrize("text, order, quaternion", [
    ("R.from_quat([0.9238795, 0, 0, 0.3826834], scalar_first=True)", "wxyz", [0, 0, 0.3826834, 0.9238795]),
    ("R.from_quat([0, 0, 0.3826834, 0.9238795])", "xyzw", [0, 0, 0.3826834, 0.9238795]),
])
def test_from_quat_names_its_order_and_kind(text, order, quaternion):
    first = decode(text)[0]
    assert first.conventions == {"order": order, "convention": "Hamilton"}
    assert "; the text names this order; the text says quaternion" in first.why
    assert np.allclose(first.orientation.as_matrix(), Rotation.from_quat(quaternion).as_matrix(), atol=1e-6)


def test_from_rotvec_names_its_kind():
    first = decode("R.from_rotvec([0.1, 0.2, 0.3])")[0]
    assert first.why.endswith("; the text says rotation vector")
