"""The body frame from three measured datum points ("3-2-1"): its orientation and distances on cases worked
by hand and against SciPy's Rotation, the third point on the −Y side turning the frame over, the two
refusals on both sides of their limits with the module's own words and reason, and the note for a
weakly determined turn about X at its 0.05 limit.

Check values: worked by hand (quarter and half turns, 3-4-5 triangles), SciPy's Rotation.from_rotvec
for a general case. All points are invented."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import Orientation
from core.fit import FitRefusedError, frame_from_three_points

ON_X_AXIS_WORDS = ("the XY-plane point lies on the X axis: the rotation about X is not determined; expected "
                   "a point well off the X axis, on the +Y side")
AT_ORIGIN_WORDS = ("the X-axis point coincides with the origin; expected a point some way along the body +X "
                   "axis")


def refusal(*points):
    with pytest.raises(FitRefusedError) as caught:
        frame_from_three_points(*points)
    return str(caught.value), caught.value.reason


def test_an_unturned_frame_gives_the_distances_worked_by_hand():
    # Origin (1, 2, 3); X point 3 along +X; XY point (4, 2, 3) + (0, 4, 0): 3 along X and 4 off it.
    frame = frame_from_three_points((1, 2, 3), (4, 2, 3), (4, 6, 3))
    assert frame.orientation.isclose(Orientation.identity(), atol=1e-15)
    np.testing.assert_array_equal(frame.origin, [1.0, 2.0, 3.0])
    assert frame.x_distance == 3.0 and frame.off_axis_distance == pytest.approx(4.0, abs=1e-15)
    assert frame.notes == ()


def test_a_third_point_on_the_minus_y_side_turns_the_frame_half_a_turn_about_x():
    # Worked by hand: Z = X × (0, −1, 0) = −Z, Y = Z × X = −Y, so R = Rx(180°) = diag(1, −1, −1).
    frame = frame_from_three_points((0, 0, 0), (2, 0, 0), (1, -1, 0))
    np.testing.assert_allclose(frame.orientation.as_matrix(), np.diag([1.0, -1.0, -1.0]), atol=1e-15)
    assert frame.off_axis_distance == pytest.approx(1.0, abs=1e-15)


def test_a_general_frame_agrees_with_scipy():
    # SciPy's Rotation (a general-purpose reference library) places body points; the frame comes back.
    turn = Rotation.from_rotvec([0.4, -1.1, 0.7])
    origin = np.array([250.0, -40.0, 12.5])
    points = [origin, origin + turn.apply([80.0, 0.0, 0.0]), origin + turn.apply([30.0, 55.0, 0.0])]
    frame = frame_from_three_points(*points)
    np.testing.assert_allclose(frame.orientation.as_matrix(), turn.as_matrix(), atol=1e-14)
    assert frame.x_distance == pytest.approx(80.0, rel=1e-14)
    assert frame.off_axis_distance == pytest.approx(55.0, rel=1e-14)


def test_an_xy_point_on_the_x_axis_is_refused_in_words_with_its_reason():
    assert refusal((0, 0, 0), (10, 0, 0), (25, 0, 0)) == (ON_X_AXIS_WORDS, "collinear")
    assert refusal((0, 0, 0), (10, 0, 0), (-5, 0, 0)) == (ON_X_AXIS_WORDS, "collinear")


def test_the_off_axis_limit_is_1e_minus_9_of_the_larger_distance_on_both_sides():
    # Distances 10 (X point) and about 10 (XY point): the limit is near 1e-8 (worked by hand).
    message, reason = refusal((0, 0, 0), (10, 0, 0), (10, 0.5e-8, 0))
    assert (message, reason) == (ON_X_AXIS_WORDS, "collinear")
    frame = frame_from_three_points((0, 0, 0), (10, 0, 0), (10, 2e-8, 0))
    assert frame.off_axis_distance == pytest.approx(2e-8, rel=1e-6)


def test_an_x_point_at_the_origin_is_refused_in_words_with_its_reason():
    assert refusal((1, 2, 3), (1, 2, 3), (0, 0, 0)) == (AT_ORIGIN_WORDS, "collinear")


def test_an_x_point_within_1e_minus_12_of_the_xy_distance_is_refused_and_just_beyond_it_is_not():
    # The XY point 1 away, the X point 0.5e-12 away: below 1e-12 of the larger distance (worked by hand).
    assert refusal((0, 0, 0), (0.5e-12, 0, 0), (0, 1, 0)) == (AT_ORIGIN_WORDS, "collinear")
    frame = frame_from_three_points((0, 0, 0), (2e-12, 0, 0), (0, 1, 0))
    assert frame.x_distance == pytest.approx(2e-12, rel=1e-12)
    assert frame.orientation.isclose(Orientation.identity(), atol=1e-12)


def test_an_xy_point_close_to_the_x_axis_is_taken_with_a_note_in_words():
    # 0.4 off an X distance of 10: 0.04 of it, below the 0.05 limit (worked by hand).
    frame = frame_from_three_points((0, 0, 0), (10, 0, 0), (5, 0.4, 0))
    assert frame.notes == ("the XY-plane point is only 0.4 off the X axis (0.04 of the X distance): the rotation "
                           "about X is weakly determined",)


def test_no_note_just_above_the_limit():
    # 0.51 off an X distance of 10: 0.051 of it, just above the 0.05 limit (worked by hand).
    assert frame_from_three_points((0, 0, 0), (10, 0, 0), (5, 0.51, 0)).notes == ()


def test_the_note_shows_the_distance_in_the_user_s_numbers_at_a_huge_scale():
    # The same shape scaled by 1e300: the distance shown is 4e299, the ratio stays 0.04 (worked by hand).
    frame = frame_from_three_points((0, 0, 0), (1e301, 0, 0), (5e300, 4e299, 0))
    assert frame.notes[0].startswith("the XY-plane point is only 4e+299 off the X axis (0.04 of the X distance)")
    assert frame.x_distance == pytest.approx(1e301, rel=1e-15)
    assert frame.off_axis_distance == pytest.approx(4e299, rel=1e-14)
