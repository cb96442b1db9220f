"""A key that names a position (translation, position, t, …) says its numbers are no rotation: alone, they
are refused rather than read as three angles; and a position key that names its length unit
('translation_mm') is still read as the position, in that unit. Refusal words are the module's own;
rotations are checked against SciPy's Rotation. All values are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

_REFUSAL = "holds a position \\(x, y, z\\), and no rotation is written with it; Framewright will not read a position as angles"


@pytest.mark.parametrize("text, key, line", [
    ("translation: [1, 2, 3]", "translation", 1),
    ("position: 1 2 3", "position", 1),
    ("camera:\n  t: [0.1, 0.2, 0.3]", "t", 2),
    ('{"translation": [1, 2, 3]}', "translation", 1),
    ("cam:\n  translation_mm: [10, 20, 30]", "translation_mm", 2),
])
def test_a_position_alone_is_refused_not_read_as_angles(text, key, line):
    with pytest.raises(DecodeError, match=rf"^line {line}: '{key}' {_REFUSAL}"):
        decode(text)


def test_a_position_written_by_components_alone_is_refused():
    with pytest.raises(DecodeError, match=rf"^line 3: 'position' {_REFUSAL}"):
        decode("cam:\n  position:\n    x: 1\n    y: 2\n    z: 3")


def test_three_numbers_under_a_rotation_key_are_still_angles():
    # the other side: a key that names a rotation, or no key at all, is read as before
    assert decode("rotation: 10 20 30")[0].kind == "angles"
    assert decode("10 20 30")[0].kind == "angles"


@pytest.mark.parametrize("numbers, count", [("[1, 2, 3, 4]", 4), ("[1, 2]", 2), ("[1, 0, 0, 0, 1, 0, 0, 0, 1]", 9)])
def test_a_position_key_with_other_than_three_numbers_alone_is_refused_too(numbers, count):
    # four numbers would otherwise come back as an axis and an angle, nine as a matrix
    with pytest.raises(DecodeError, match=rf"^line 1: 'translation' names a position but holds {count} numbers"
                                          r" \(x, y, z are 3\), and no rotation is written with it"):
        decode(f"translation: {numbers}")


def test_a_key_with_no_number_beside_a_lone_position_changes_nothing():
    with pytest.raises(DecodeError, match=rf"^line 2: 'position' {_REFUSAL}"):
        decode("frame: base\nposition: 1 2 3")


@pytest.mark.parametrize("key, unit", [("translation_mm", "mm"), ("position_m", "m"), ("t_cm", "cm")])
def test_a_position_key_naming_its_unit_is_read_in_that_unit(key, unit):
    first = decode(f"cam:\n  {key}: [1, 2, 3]\n  rpy: [0.1, 0.2, 0.3]")[0]
    assert first.translation == (1.0, 2.0, 3.0) and first.translation_unit == unit
    assert not any(n.startswith("keys not read") for n in first.notes)
    # rpy about fixed X, Y, Z: SciPy's extrinsic 'xyz' in radians (common practice)
    assert np.allclose(np.asarray(first.orientation.as_matrix()),
                       Rotation.from_euler("xyz", [0.1, 0.2, 0.3]).as_matrix(), atol=1e-12)
