"""core/shims.py on its own: the footprint's checks and its text, the outward normal, the swing–twist split
and every figure of a shim result, at both sides of each limit and with hostile input. Check values come
from SciPy's Rotation (applied to the feet: the height of foot i is −n · (C q_i), the docstring's rule,
evaluated by SciPy) and from geometry worked by hand here, each named beside its check. The tests of
shims together with the correction are in test_correction.py."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.errors import InvalidInputError
from core.orientation import Orientation
from core.shims import MAX_FEET, PLANE_TOLERANCE, outward_normal, read_footprint, shims, swing_and_twist

PLATE = [(100, 50, -20), (-100, 50, -20), (-100, -50, -20), (100, -50, -20)]   # 200 × 100 mm, on its −Z face
DOWN = (0, 0, -1)


def _orientation(rotation: Rotation) -> Orientation:
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


def _scipy_shims(rotation: Rotation, feet, normal):
    """The reference: SciPy turns every foot by the whole correction; each foot's height above the plate is
    −n · (C p_i), and the thinnest set lifts all by the same amount so the lowest foot has none."""
    n = np.asarray(normal, dtype=float) / np.linalg.norm(normal)
    heights = -(rotation.apply(np.asarray(feet, dtype=float)) @ n)
    return heights - heights.min()


def _refused(words, call, *args, **kwargs):
    with pytest.raises(InvalidInputError) as caught:
        call(*args, **kwargs)
    assert str(caught.value) == words
    return caught.value


# ---------------------------------------------------------------------------------------------------
# The footprint as numbers
# ---------------------------------------------------------------------------------------------------
@pytest.mark.parametrize("feet, words", [
    ([("a", 0, 0), (1, 0, 0), (0, 1, 0)], "footprint: expected rows of three numbers (x, y, z in body coordinates)"),
    ([(0, 0, 0), (1, 0), (0, 1, 0)], "footprint: expected rows of three numbers (x, y, z in body coordinates)"),
    ([(0, 0), (1, 0), (0, 1)], "footprint: expected rows of three numbers, got shape (3, 2)"),
    ([0, 0, 1], "footprint: expected rows of three numbers, got shape (3,)"),
    ([(0, 0, 0, 0)] * 3, "footprint: expected rows of three numbers, got shape (3, 4)"),
    ([[(0, 0, 0)] * 3], "footprint: expected rows of three numbers, got shape (1, 3, 3)"),
    ([(0, 0, -1), (1, 0, -1)], "footprint: expected 3 to 64 feet, got 2"),
    (np.zeros((0, 3)), "footprint: expected 3 to 64 feet, got 0"),
    ([(0, 0, -1)] * 65, "footprint: expected 3 to 64 feet, got 65"),
])
def test_a_footprint_of_the_wrong_shape_or_count_is_refused_word_for_word(feet, words):
    _refused(words, outward_normal, feet)
    _refused(words, shims, Orientation.identity(), feet, DOWN)


def _ring(count, z=-20.0, radius=50.0):
    turn = np.linspace(0, 2 * math.pi, count, endpoint=False)
    return np.column_stack([radius * np.cos(turn), radius * np.sin(turn), np.full(count, z)])


@pytest.mark.parametrize("count", [3, MAX_FEET])
def test_three_and_sixty_four_feet_are_accepted(count):
    assert MAX_FEET == 64
    tilt = Rotation.from_rotvec(np.radians([0.7, -0.4, 0.0]))
    result = shims(_orientation(tilt), _ring(count), DOWN)
    # SciPy applies the tilt to every foot (the docstring's −n · (C p))
    assert np.allclose(result.shims_mm, _scipy_shims(tilt, _ring(count), DOWN), atol=1e-9)
    assert np.allclose(outward_normal(_ring(count)), DOWN, atol=1e-12)


@pytest.mark.parametrize("value, row, column", [
    (float("inf"), 2, 2), (float("-inf"), 1, 0), (float("nan"), 3, 1), (1.000001e9, 2, 0), (-1.000001e9, 3, 2)])
def test_a_foot_that_is_not_a_finite_length_below_1e9_is_named_by_foot_and_axis(value, row, column):
    """The value as a person wrote it (1000001000.0, inf), not as numpy spells its own type."""
    feet = np.array(PLATE, dtype=float)
    feet[row - 1, column] = value
    words = f"footprint: foot {row}, {'xyz'[column]} = {value!r} is not a finite length below 1e9"
    _refused(words, outward_normal, feet)
    _refused(words, shims, Orientation.identity(), feet, DOWN)


def test_the_first_bad_number_in_reading_order_is_the_one_named():
    feet = np.array(PLATE, dtype=float)
    feet[2, 0] = float("nan")
    feet[1, 1] = float("inf")
    _refused("footprint: foot 2, y = inf is not a finite length below 1e9", outward_normal, feet)


def test_feet_a_billion_mm_out_are_accepted_and_scale_the_shims():
    # Worked here: the shims of a footprint scaled by k are k times the shims (all lengths scale alike)
    tilt = _orientation(Rotation.from_rotvec(np.radians([0.3, 0.2, 0.1])))
    base = shims(tilt, np.array(PLATE) / 100, DOWN).shims_mm
    far = np.array(PLATE) / 100 * 1e9        # feet out to 1e9 mm exactly: still accepted
    assert np.abs(far).max() == 1e9
    assert np.allclose(shims(tilt, far, DOWN).shims_mm, base * 1e9, rtol=1e-12, atol=0)
    tiny = np.array(PLATE) * 1e-9
    assert np.allclose(shims(tilt, tiny, DOWN).shims_mm, base * 1e-7, rtol=1e-9, atol=0)


# ---------------------------------------------------------------------------------------------------
# The footprint as text
# ---------------------------------------------------------------------------------------------------
def test_feet_are_read_with_any_separator_line_ending_header_and_comments():
    text = ("# bolt points of the bracket (invented)\r\n x_mm, y_mm, z_mm\r\n100, 50, -20\r"
            "-100;50;-20\n  # the far edge\n\n−100\t-50  -20\n+100 -50 -2e1\n.5 .25 -20\n")
    feet = read_footprint(text)
    assert feet.dtype == float
    assert feet.tolist() == [[100, 50, -20], [-100, 50, -20], [-100, -50, -20], [100, -50, -20], [0.5, 0.25, -20]]


def test_a_line_of_names_after_the_first_foot_is_refused_by_its_line_number():
    with pytest.raises(InvalidInputError, match=r"^footprint line 3: “x” is not a number$"):
        read_footprint("0 0 -1\n1 0 -1\nx y z\n0 1 -1")


@pytest.mark.parametrize("text, words", [
    ("x y z\n1 2 3\n4 5\n", "footprint line 3: expected three numbers (x y z), got 2"),
    ("1 2 3 4\n", "footprint line 1: expected three numbers (x y z), got 4"),
    ("1 2 3\n\n# note\n1 2 3 # note\n", "footprint line 4: expected three numbers (x y z), got 5"),
    ("1 2 3\n1 2,5 3\n", "footprint line 2: expected three numbers (x y z), got 4"),
    ("1 2 3\n1 2 inf\n", "footprint line 2: “inf” is not a finite number"),
    ("1 2 3\n1 2 3mm\n", "footprint line 2: “3mm” is not a number"),
    ("", "footprint: expected 3 to 64 feet, got 0"),
    ("x y z\n# nothing\n", "footprint: expected 3 to 64 feet, got 0"),
    ("0 0 1\n1 0 1\n", "footprint: expected 3 to 64 feet, got 2"),
    ("1 2 3\n" * 65, "footprint: more than 64 feet"),
    ("1 2 3\n" * 200, "footprint: more than 64 feet"),
    (None, "footprint: expected text of at most 100,000 characters"),
    (b"1 2 3", "footprint: expected text of at most 100,000 characters"),
])
def test_footprint_text_refusals_name_the_line_and_what_was_expected(text, words):
    _refused(words, read_footprint, text)


def test_sixty_four_feet_of_text_are_read():
    text = "\n".join(" ".join(repr(float(v)) for v in foot) for foot in _ring(MAX_FEET))
    assert np.array_equal(read_footprint(text), _ring(MAX_FEET))


def test_footprint_text_up_to_100000_characters_is_read_and_one_more_refused():
    feet = "0 0 -1\n1 0 -1\n0 1 -1\n"
    at_limit = feet + "#" * (100_000 - len(feet))
    assert len(at_limit) == 100_000
    assert read_footprint(at_limit).tolist() == [[0, 0, -1], [1, 0, -1], [0, 1, -1]]
    _refused("footprint: expected text of at most 100,000 characters", read_footprint, at_limit + "#")


# ---------------------------------------------------------------------------------------------------
# The outward normal
# ---------------------------------------------------------------------------------------------------
@pytest.mark.parametrize("side", [-1, 1])
def test_the_outward_normal_points_away_from_the_body_origin_on_either_side(side):
    # Worked here: feet on the plane z = ±20 have normal ±Z pointing away from the origin
    feet = np.array(PLATE, dtype=float) * (1, 1, -side)
    assert np.allclose(outward_normal(feet), (0, 0, side), atol=1e-12)


def test_the_outward_normal_of_a_slanted_face_is_its_unit_normal():
    # Worked here: the triangle (30, 0, 0), (0, 30, 0), (0, 0, 30) lies on x + y + z = 30, normal (1, 1, 1)/√3
    # away from the origin; the same triangle through −30 has the opposite normal
    feet = np.array([(30, 0, 0), (0, 30, 0), (0, 0, 30)], dtype=float)
    assert np.allclose(outward_normal(feet), np.ones(3) / math.sqrt(3), atol=1e-12)
    assert np.allclose(outward_normal(-feet), -np.ones(3) / math.sqrt(3), atol=1e-12)
    assert np.linalg.norm(outward_normal(feet * 1e-6)) == pytest.approx(1, abs=1e-15)


THROUGH_ORIGIN = ("footprint: the feet's plane passes through the body origin, so its outward side is not known; "
                  "give the face normal")


@pytest.mark.parametrize("scale", [100.0, 0.5])
def test_a_plane_just_off_the_origin_has_a_side_and_one_through_it_is_refused(scale):
    """The limit is 1e-9 of the footprint's size (of 1 mm for footprints smaller than that)."""
    limit = 1e-9 * max(1.0, scale)
    square = np.array([(1, 1, 0), (-1, 1, 0), (-1, -1, 0), (1, -1, 0)], dtype=float) * scale
    for offset in (1.5 * limit, 3 * limit, -1.5 * limit):
        feet = square + (0, 0, offset)
        assert np.allclose(outward_normal(feet), (0, 0, math.copysign(1, offset)), atol=1e-6)
    for offset in (0.0, 0.5 * limit, -0.5 * limit):
        _refused(THROUGH_ORIGIN, outward_normal, square + (0, 0, offset))


# ---------------------------------------------------------------------------------------------------
# Swing and twist
# ---------------------------------------------------------------------------------------------------
@pytest.mark.parametrize("axis", [(0, 0, 1), (0, 0, 7.5), (0, 0, 1e300), (0, 0, 1e-300), (0, 0, -1)])
def test_a_tilt_followed_by_a_turn_about_the_axis_splits_into_those_two(axis):
    # SciPy: R = Rz(30°) · Rx(10°); the twist about Z is Rz(30°), the swing (axis ⊥ Z) Rx(10°), whatever
    # the length or sense of the axis given
    rotation = Rotation.from_euler("z", 30, degrees=True) * Rotation.from_euler("x", 10, degrees=True)
    swing, twist = swing_and_twist(_orientation(rotation), axis)
    assert twist.isclose(_orientation(Rotation.from_euler("z", 30, degrees=True)), 1e-12)
    assert swing.isclose(_orientation(Rotation.from_euler("x", 10, degrees=True)), 1e-12)


def test_a_half_turn_about_a_line_in_the_face_has_no_twist():
    # Worked here: a half turn about X has w = 0 and no part along Z, so no twist about Z is defined: none
    half = Orientation.from_quaternion([0, 1, 0, 0])
    swing, twist = swing_and_twist(half, (0, 0, 1))
    assert twist == Orientation.identity() and swing.isclose(half, 1e-15)


def test_just_beyond_the_undefined_twist_a_half_turn_axis_leaning_out_of_the_face_gives_a_half_turn_twist():
    # Worked here: q = (0, cos e, 0, sin e) with sin e = 4e-15 has (w, v·z) = (0, 4e-15), of size above
    # 1e-15: the twist is (0, 0, 0, 1), a half turn about Z, and the swing the rest; at 4e-16 there is none
    leaning = Orientation.from_quaternion([0, math.sqrt(1 - 16e-30), 0, 4e-15])
    swing, twist = swing_and_twist(leaning, (0, 0, 1))
    assert np.allclose(twist.quaternion, [0, 0, 0, 1], atol=1e-15)
    assert (twist @ swing).isclose(leaning, 1e-12)
    swing, twist = swing_and_twist(Orientation.from_quaternion([0, 1, 0, 4e-16]), (0, 0, 1))
    assert twist == Orientation.identity()


@pytest.mark.parametrize("axis", [(0, 0, 0), (0, float("nan"), 1), (0, float("inf"), 1), (1, 0), (1, 0, 0, 0)])
def test_a_face_normal_that_is_not_a_direction_is_refused(axis):
    words = f"face normal: expected a direction of three finite numbers, got {axis!r}"
    _refused(words, swing_and_twist, Orientation.identity(), axis)
    _refused(words, shims, Orientation.identity(), PLATE, axis)


# ---------------------------------------------------------------------------------------------------
# Shims: figures
# ---------------------------------------------------------------------------------------------------
def test_shims_under_a_slanted_triangle_match_scipy_for_any_correction_twist_and_all():
    """The twist about n does not change the shims (docstring): SciPy applying the whole correction C,
    twist included, to the feet gives the same thicknesses."""
    feet = np.array([(30, 0, 0), (0, 30, 0), (0, 0, 30)], dtype=float)
    normal = np.ones(3) / math.sqrt(3)
    for seed in range(40):
        rotation = Rotation.from_rotvec(np.radians(np.random.default_rng(seed).normal(scale=5, size=3)))
        result = shims(_orientation(rotation), feet, normal, pivot=seed % 3)
        assert np.allclose(result.shims_mm, _scipy_shims(rotation, feet, normal), atol=1e-12)
        assert result.shims_mm.min() == 0 and result.pivot == seed % 3
        assert result.pivot_lifted_mm == result.shims_mm[seed % 3]


def test_the_tilt_and_signed_twist_are_the_two_parts_of_the_correction():
    # SciPy: C = Rz(+3°) · Rx(0.4°) on a face whose outward normal is −Z: the tilt is 0.4°, the twist −3°
    # (right hand about n = −Z); on a face with normal +Z the same twist is +3°
    rotation = Rotation.from_euler("z", 3, degrees=True) * Rotation.from_euler("x", 0.4, degrees=True)
    below = shims(_orientation(rotation), PLATE, DOWN)
    assert below.tilt_deg == pytest.approx(0.4, abs=1e-12) and below.twist_deg == pytest.approx(-3, abs=1e-12)
    above = shims(_orientation(rotation), np.array(PLATE) * (1, 1, -1), (0, 0, 1))
    assert above.tilt_deg == pytest.approx(0.4, abs=1e-12) and above.twist_deg == pytest.approx(3, abs=1e-12)
    assert below.twist.isclose(_orientation(Rotation.from_euler("z", 3, degrees=True)), 1e-12)
    assert below.swing.isclose(_orientation(Rotation.from_euler("x", 0.4, degrees=True)), 1e-12)


def test_no_correction_gives_no_shims_no_tilt_and_a_positive_zero_twist():
    # Worked here: (30, 0, 0), (0, 20, 0), (0, 0, 10) lie on x/30 + y/20 + z/10 = 1, normal (2, 3, 6)/7,
    # a slanted face where q · n leaves rounding
    feet = np.array([(30, 0, 0), (0, 20, 0), (0, 0, 10)], dtype=float)
    result = shims(Orientation.identity(), feet, (2, 3, 6))
    assert result.shims_mm.tolist() == [0.0, 0.0, 0.0] and result.tilt_deg == 0
    assert result.twist_deg == 0 and math.copysign(1, result.twist_deg) == 1


def test_a_tilt_about_the_short_edge_lifts_the_far_edge_by_the_length_times_the_sine():
    # Worked here (rigid turn): turning 1° about body −Y through the −X edge lifts the +X edge, 200 mm
    # away, by 200 mm · sin 1° off a plate below (−Z face); 0.25 mm threads give that over 0.25 turns
    result = shims(Orientation.from_axis_angle((0, -1, 0), 1), PLATE, DOWN, pivot=1, pitch_mm=0.25)
    lift = 200 * math.sin(math.radians(1))
    assert np.allclose(result.shims_mm, [lift, 0, 0, lift], atol=1e-12)
    assert np.allclose(result.turns, np.array([lift, 0, 0, lift]) / 0.25, atol=1e-12)
    assert result.pivot == 1 and result.pivot_lifted_mm == 0
    # the opposite turn lifts the −X edge instead; the pivot foot now has a shim under it
    result = shims(Orientation.from_axis_angle((0, 1, 0), 1), PLATE, DOWN, pivot=3)
    assert np.allclose(result.shims_mm, [0, lift, lift, 0], atol=1e-12)
    assert result.pivot_lifted_mm == 0 and result.turns is None
    result = shims(Orientation.from_axis_angle((0, 1, 0), 1), PLATE, DOWN, pivot=2)
    assert result.pivot_lifted_mm == pytest.approx(lift, abs=1e-12)


def test_feet_slightly_off_the_face_are_shimmed_as_if_on_it():
    """Within the plane tolerance a foot is taken to lie in the face: the shims are those of its foot
    projected onto the face (a 60° tilt would tell the difference by about 4e-5 mm)."""
    high = np.array(PLATE, dtype=float)
    high[3, 2] += 0.9 * PLANE_TOLERANCE * 200
    rotation = Rotation.from_rotvec(np.radians([60.0, 0, 0]))
    result = shims(_orientation(rotation), high, DOWN)
    # SciPy on the feet as drawn in the face
    assert np.allclose(result.shims_mm, _scipy_shims(rotation, PLATE, DOWN), atol=1e-9)


# ---------------------------------------------------------------------------------------------------
# Shims: refusals
# ---------------------------------------------------------------------------------------------------
def test_a_foot_out_of_the_face_is_refused_beyond_a_millionth_of_the_footprint():
    assert PLANE_TOLERANCE == 1e-6
    size = 200.0                            # the furthest foot from the pivot (foot 1) is 200 mm out in x
    for height in (0.9e-6 * size, -0.9e-6 * size):
        feet = np.array(PLATE, dtype=float)
        feet[3, 2] += height
        shims(Orientation.identity(), feet, DOWN)
    feet = np.array(PLATE, dtype=float)
    feet[3, 2] -= 1.1e-6 * size
    _refused("footprint: foot 4 is 0.00022 mm out of the face's plane (normal [0.0, 0.0, -1.0]); expected feet on "
             "one face", shims, Orientation.identity(), feet, DOWN)


def test_the_foot_furthest_out_of_the_face_is_the_one_named():
    feet = np.array(PLATE, dtype=float)
    feet[1, 2] += 5
    feet[2, 2] -= 7
    _refused("footprint: foot 3 is 7 mm out of the face's plane (normal [0.0, 0.0, -1.0]); expected feet on one "
             "face", shims, Orientation.identity(), feet, (0, 0, -2))


def test_a_face_normal_that_does_not_fit_the_feet_is_refused():
    # the plate lies in z = −20; a normal along X puts foot 1 200 mm out of that face (from the pivot, foot 3)
    _refused("footprint: foot 1 is 200 mm out of the face's plane (normal [1.0, 0.0, 0.0]); expected feet on one "
             "face", shims, Orientation.identity(), PLATE, (1, 0, 0), pivot=2)


ON_ONE_LINE = "footprint: the feet are on one line; a tilt across that line cannot be shimmed"


def test_feet_on_one_line_are_refused_and_nearly_on_one_line_are_not():
    """Worked here: for (0, 0), (100, 0), (50, d) scaled by 100 the smaller singular value is about 0.894 d/100;
    the limit 1e-9 falls at d ≈ 1.1e-7 mm."""
    def feet(d):
        return [(0, 0, -5), (100, 0, -5), (50, d, -5)]
    result = shims(Orientation.from_axis_angle((1, 0, 0), 1e-3), feet(3e-7), DOWN)
    assert np.all(np.isfinite(result.shims_mm))
    for d in (4e-8, 0.0):
        _refused(ON_ONE_LINE, shims, Orientation.identity(), feet(d), DOWN)
    _refused(ON_ONE_LINE, shims, Orientation.identity(), [(0, 0, -5), (1e9, 0, -5), (-1e9, 0, -5), (5, 0, -5)],
             DOWN)


def test_feet_all_at_one_point_are_refused():
    _refused("footprint: all feet are at the same point; expected feet spread over the face", shims,
             Orientation.identity(), [(1e-300, 0, -5)] * 4, DOWN)


@pytest.mark.parametrize("pivot", [-1, 4, 1.0, True, False, "1", None, np.float64(0)])
def test_a_pivot_that_is_not_a_foot_number_is_refused_with_the_range(pivot):
    _refused(f"pivot: expected a foot number from 1 to 4, got {pivot!r}", shims, Orientation.identity(), PLATE,
             DOWN, pivot=pivot)


@pytest.mark.parametrize("pivot", [0, 3, np.int64(3), np.int32(1)])
def test_every_foot_can_be_the_pivot_numpy_integers_too(pivot):
    assert shims(Orientation.identity(), PLATE, DOWN, pivot=pivot).pivot == pivot


@pytest.mark.parametrize("pitch", [0, 0.0, -0.5, 100.000001, 1e300, float("nan"), float("inf"), True, "0.5"])
def test_a_thread_pitch_outside_0_to_100_mm_is_refused(pitch):
    _refused(f"thread pitch: expected a length in mm above 0 and up to 100, got {pitch!r}", shims,
             Orientation.identity(), PLATE, DOWN, pitch_mm=pitch)


@pytest.mark.parametrize("pitch", [100, 100.0, 1, 1e-300, np.float64(0.7)])
def test_a_thread_pitch_up_to_100_mm_gives_turns(pitch):
    result = shims(Orientation.from_axis_angle((0, -1, 0), 1), PLATE, DOWN, pitch_mm=pitch)
    # the turns are the shims over the pitch (a levelling screw rises one pitch a turn: common practice)
    assert np.array_equal(result.turns, result.shims_mm / pitch)


def test_line_numbers_count_windows_line_ends_once_and_capital_names_are_a_header():
    with pytest.raises(InvalidInputError, match=r"^footprint line 3: expected three numbers \(x y z\), got 2$"):
        read_footprint("X Y Z\r\n0 0 -1\r\n1 0\r\n")


def test_a_face_normal_given_as_a_column_is_read_and_named_to_six_decimals():
    assert np.allclose(shims(Orientation.identity(), PLATE, [[0], [0], [-1]]).shims_mm, 0, atol=0)
    feet = np.array(PLATE, dtype=float)
    feet[2, 2] -= 7
    # (0, 1, −7)/√50 to six decimals: 0.141421, −0.989949
    with pytest.raises(InvalidInputError, match=r"normal \[0\.0, 0\.141421, -0\.989949\]\)"):
        shims(Orientation.identity(), feet, (0, 1, -7))


@pytest.mark.parametrize("turn, twist", [(1, -1), (-1, 1), (0.5, -0.5)])
def test_a_twist_of_one_degree_gets_its_sign_like_any_other(turn, twist):
    # SciPy: a turn about +Z is a turn of the opposite sign about the outward normal −Z
    rotation = Rotation.from_euler("z", turn, degrees=True)
    assert shims(_orientation(rotation), PLATE, DOWN).twist_deg == pytest.approx(twist, abs=1e-12)
