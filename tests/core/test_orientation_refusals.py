"""Each from_* refusal of Orientation word for word (the name of what is wrong, the shape or value found),
and the axis-length note on both sides of its 1e-9 limit. Values by hand."""

import numpy as np
import pytest

from core.errors import InvalidInputError
from core.orientation import Orientation

NAN = np.nan


@pytest.mark.parametrize("make, words", [
    (lambda: Orientation.from_axis_angle([1, 0], 10), "axis: expected shape (..., 3), got (2,)"),
    (lambda: Orientation.from_axis_angle([[1, 0, 0]], 10), "axis: expected 3 numbers, got shape (1, 3)"),
    (lambda: Orientation.from_axis_angle([NAN, 0, 0], 10), "axis: contains NaN or infinity; expected finite numbers"),
    (lambda: Orientation.from_axis_angle([1, 0, 0], NAN), "angle: contains NaN or infinity; expected finite numbers"),
    (lambda: Orientation.from_axis_angle([1, 0, 0], [1, 2]), "angle: expected one number, got shape (2,)"),
    (lambda: Orientation.from_axis_angle([1, 0, 0], 1e300),
     "angle: 1e+300° is more than a million turns; expected an angle in degrees (is a decimal point missing?)"),
    (lambda: Orientation.from_axis_angle([1, 0, 0], 1e300, degrees=False),
     "angle: 5.73e+301° is more than a million turns; expected an angle in radians (is a decimal point missing?)"),
    (lambda: Orientation.from_axis_angle([0, 0, 0], 10),
     "rotation axis of zero length; expected a non-zero direction (x, y, z)"),
    (lambda: Orientation.from_rotation_vector([1, 0]), "rotation vector: expected shape (..., 3), got (2,)"),
    (lambda: Orientation.from_rotation_vector([[1, 0, 0]]), "rotation vector: expected 3 numbers, got shape (1, 3)"),
    (lambda: Orientation.from_rotation_vector([np.inf, 0, 0]),
     "rotation vector: contains NaN or infinity; expected finite numbers"),
    (lambda: Orientation.from_rotation_vector([1e300, 0, 0]),
     "rotation vector: 1e+300° is more than a million turns; expected an angle in degrees (is a decimal point missing?)"),
    (lambda: Orientation.from_mrp([1, 0]), "modified Rodrigues parameters: expected shape (..., 3), got (2,)"),
    (lambda: Orientation.from_mrp([[1, 0, 0]]), "modified Rodrigues parameters: expected 3 numbers, got shape (1, 3)"),
    (lambda: Orientation.from_mrp([NAN, 0, 0]),
     "modified Rodrigues parameters: contains NaN or infinity; expected finite numbers"),
    (lambda: Orientation.from_axis_angle([1, 0, 0], 180).as_gibbs(),
     "the Gibbs vector is infinite at a half turn (180°); use another representation (the modified Rodrigues "
     "parameters are 1 long there)"),
])
def test_each_refusal_word_for_word(make, words):
    with pytest.raises(InvalidInputError) as refused:
        make()
    assert str(refused.value) == words


@pytest.mark.parametrize("axis, note", [
    ((0, 0, 2), ("axis normalised from length 2",)),
    ((0, 0, 0.5), ("axis normalised from length 0.5",)),
    ((0, 0, 1 + 2e-9), ("axis normalised from length 1.000000002",)),
    ((0, 0, 1 - 2e-9), ("axis normalised from length 0.999999998",)),
    ((0, 0, 1 + 5e-10), ()),                     # within 1e-9 of unit: no note
    ((0, 0, 1), ()),
    ((0, 0, 0), ()),                             # a zero axis with a zero angle is the identity, no note
])
def test_a_non_unit_axis_is_noted_beyond_1e_9(axis, note):
    angle = 0.0 if axis == (0, 0, 0) else 30.0
    o = Orientation.from_axis_angle(axis, angle)
    assert o.notes == note
    if angle:   # the turn is about the axis' direction: 30° about +z, w = cos 15° (by hand)
        np.testing.assert_allclose(o.quaternion, [np.cos(np.radians(15)), 0, 0, np.sin(np.radians(15))],
                                   atol=1e-15)
