"""The tables core/describe.py builds when it is imported (the 24 right-angle orientations, their words,
the direction words of each frame preset), rebuilt here by calling the builders again, so a fault in a
builder shows even though the module's own tables were made before any test ran. Checked against SciPy's
Rotation (create_group('O'), as_rotvec, apply)."""

import re

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import describe

MINUS = "\u2212"


def test_the_builder_makes_the_24_of_scipys_cube_group_each_once():
    rebuilt = describe._enumerate_right_angle_matrices()
    assert rebuilt.shape == (24, 3, 3)
    ours = [tuple(np.rint(m).astype(int).ravel()) for m in rebuilt]
    # SciPy's create_group('O'): the 24 rotations of the cube
    scipy_set = {tuple(np.rint(m).astype(int).ravel()) for m in Rotation.create_group("O").as_matrix()}
    assert len(set(ours)) == 24 and set(ours) == scipy_set
    assert np.array_equal(rebuilt, describe.RIGHT_ANGLE_MATRICES)


def _parse(words):
    """'identity' -> (0, None); '90° about +Z' -> (90, (0, 0, 1)); '120° about (1, −1, 1)' -> (120, (1, -1, 1))."""
    if words == "identity":
        return 0, None
    match = re.fullmatch(r"(\d+)\u00b0 about (?:([+\u2212])([XYZ])|\(([^)]*)\))", words)
    assert match, words
    angle = int(match.group(1))
    if match.group(3):
        axis = [0, 0, 0]
        axis["XYZ".index(match.group(3))] = 1 if match.group(2) == "+" else -1
        return angle, tuple(axis)
    return angle, tuple(int(v.replace(MINUS, "-")) for v in match.group(4).split(", "))


@pytest.mark.parametrize("index", range(24))
def test_each_right_angle_orientations_words_match_scipys_rotation_vector(index):
    m = describe.RIGHT_ANGLE_MATRICES[index]
    angle, axis = _parse(describe._axis_angle_words(m))
    rotvec = Rotation.from_matrix(m).as_rotvec()
    assert angle == pytest.approx(np.degrees(np.linalg.norm(rotvec)), abs=1e-9)
    if axis is None:
        return
    axis = np.array(axis, dtype=float)
    assert np.max(np.abs(axis)) == 1            # whole steps, the largest 1
    direction = rotvec / np.linalg.norm(rotvec)
    if angle == 180:
        # a half turn about n is one about -n: compare the line, then the sign rule of CONVENTIONS.md,
        # the first non-zero of x, y, z positive
        assert abs(abs(direction @ axis) / np.linalg.norm(axis) - 1) < 1e-9
        assert axis[np.flatnonzero(axis)[0]] > 0
    else:
        assert np.allclose(axis / np.linalg.norm(axis), direction, atol=1e-9)
    # the words name the same rotation: SciPy rebuilds the matrix from them
    rebuilt = Rotation.from_rotvec(np.radians(angle) * axis / np.linalg.norm(axis)).as_matrix()
    assert np.allclose(rebuilt, m, atol=1e-12)


@pytest.mark.parametrize("index", range(24))
def test_each_right_angle_orientations_mapping_is_where_scipy_sends_the_body_axes(index):
    m = describe.RIGHT_ANGLE_MATRICES[index]
    landed = Rotation.from_matrix(m).apply(np.eye(3))     # row k: where body axis k goes
    expected = []
    for k, v in enumerate(landed):
        j = int(np.argmax(np.abs(v)))
        expected.append(f"{'XYZ'[k]}\u2192{'+' if v[j] > 0 else MINUS}{'XYZ'[j]}")
    assert describe._mapping_words(m) == ", ".join(expected)


def test_the_direction_word_table_puts_each_word_on_its_signed_axis():
    table = describe._words("px", "nx", "py", "ny", "pz", "nz")
    assert table == {(0, 1): "px", (0, -1): "nx", (1, 1): "py", (1, -1): "ny", (2, 1): "pz", (2, -1): "nz"}
    # NED as the trade writes it (common practice): x north, y east, z down
    ned = describe.frame_preset("ned").words
    assert (ned[(0, 1)], ned[(1, 1)], ned[(2, 1)], ned[(2, -1)]) == ("north", "east", "down", "up")
