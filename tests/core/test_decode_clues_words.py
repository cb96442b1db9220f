"""Decode: what the words around the numbers say (unit marks, matrix direction, primes on a sequence, π,
a library call) changes the reading that ranks first and the reason a user reads.

Check values: SciPy's Rotation for every orientation; the meaning of a direction cosine matrix as
reference -> body (common practice); primes on Z-Y'-X'' mark intrinsic rotations (common practice);
SciPy's documented meanings of from_quat (scalar last) and from_rotvec (radians unless degrees=True)."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


def test_numbers_marked_in_degrees_say_degrees():
    best = decode("10° 20° 30°")[0]
    assert best.conventions["units"] == "deg"
    assert "the numbers are marked in degrees" in best.why
    # SciPy: intrinsic Z-Y'-X'' in degrees.
    want = Rotation.from_euler("ZYX", [10, 20, 30], degrees=True).as_matrix()
    np.testing.assert_allclose(best.orientation.as_matrix(), want, atol=1e-12)


def test_numbers_marked_in_radians_say_radians():
    best = decode("0.1rad 0.2rad 0.3rad")[0]
    assert best.conventions["units"] == "rad"
    assert "the numbers are marked in radians" in best.why


def test_a_direction_cosine_matrix_is_read_reference_to_body_and_says_why():
    m = np.array([[1, 0, 0], [0, 0, -1], [0, 1, 0]], dtype=float)   # 90° about x, worked by hand
    best = decode("DCM: 1 0 0 0 0 -1 0 1 0")[0]
    assert best.conventions == {"matrix": "reference-to-body"}
    assert "the text calls it a direction cosine matrix, usually reference -> body" in best.why
    # SciPy: the body -> reference rotation is the transpose of a reference -> body matrix.
    np.testing.assert_allclose(best.orientation.as_matrix(), Rotation.from_matrix(m.T).as_matrix(), atol=1e-12)


def test_a_text_naming_both_directions_says_so_in_a_note():
    readings = decode("body to reference and reference to body: 1 0 0 0 0 -1 0 1 0")
    for r in readings:
        assert "the text names both directions (body to reference and reference to body)" in r.notes
        assert all(isinstance(n, str) for n in r.notes)
    assert readings[0].score == readings[1].score


def test_primes_on_the_sequence_mean_intrinsic_only():
    readings = decode("Z-Y'-X'' 10 20 30")
    assert [r.conventions["intrinsic"] for r in readings] == [True]
    # Without primes both meanings are offered, intrinsic first.
    plain = decode("zyx 10 20 30")
    assert [r.conventions["intrinsic"] for r in plain[:2]] == [True, False]


def test_pi_with_degrees_is_refused_in_plain_words():
    with pytest.raises(DecodeError) as err:
        decode("degrees: pi/2 0 0")
    message = str(err.value)
    assert "'pi/2' is an angle in radians" in message
    assert "the text says degrees too; Framewright will not guess which is meant" in message


def test_a_library_quaternion_call_is_scalar_last_and_says_so():
    readings = decode("Rotation.from_quat([0, 0, 0.7071067811865476, 0.7071067811865476])")
    best = readings[0]
    assert best.kind == "quaternion" and best.conventions == {"order": "xyzw", "convention": "Hamilton"}
    assert ("a library call: from_quat is scalar last unless scalar_first=True (SciPy's documented meaning)"
            in best.notes)
    assert not any("rotation vector" in n for n in best.notes)
    # SciPy: from_quat is scalar last.
    want = Rotation.from_quat([0, 0, 0.7071067811865476, 0.7071067811865476]).as_matrix()
    np.testing.assert_allclose(best.orientation.as_matrix(), want, atol=1e-12)


def test_a_library_rotation_vector_call_is_radians_by_default():
    readings = decode("Rotation.from_rotvec([0, 0, 1])")
    best = readings[0]
    assert best.kind == "rotation-vector" and best.conventions == {"units": "rad"}
    assert all(r.conventions.get("units") == "rad" for r in readings if "units" in r.conventions)
    assert best.label == "rotation vector in radians (axis times angle)"
    # SciPy: from_rotvec reads radians by default.
    np.testing.assert_allclose(best.orientation.as_matrix(), Rotation.from_rotvec([0, 0, 1]).as_matrix(),
                               atol=1e-12)
