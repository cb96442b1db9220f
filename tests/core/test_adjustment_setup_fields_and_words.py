"""The adjustment setup's fields, one by one: each limit taken on one side and refused on the other, each
refusal's exact words (the module's own), the numbers stored as floats, the file form written only with
the keys it needs, and the covariance's symmetry and sign checks measured against the covariance's own
size (so a covariance in thousands of degrees² and one in millionths are judged alike).

Check values are worked by hand from the limits the module states (64 feet, 1e9 mm, pitch up to 100 mm,
uncertainty up to 180°, coverage up to 10, 1e-9 of the largest entry); all setups are invented."""

import pytest

from core.adjustment_setup import AdjustmentSetup
from core.errors import FramewrightError

FEET = ((100.0, 50.0, -20.0), (-100.0, 50.0, -20.0), (-100.0, -50.0, -20.0))   # invented, mm


def refusal(**fields):
    with pytest.raises(FramewrightError) as caught:
        AdjustmentSetup(**fields)
    return str(caught.value)


# --- length unit, axes, frame ------------------------------------------------------------------------

def test_an_unknown_length_unit_is_refused_naming_every_unit_there_is():
    assert refusal(length_unit="furlong") == \
        "adjustment length unit: expected one of mm, m, in, thou, got 'furlong'"


@pytest.mark.parametrize("unit", ["mm", "m", "in", "thou"])
def test_each_length_unit_is_taken(unit):
    assert AdjustmentSetup(length_unit=unit).length_unit == unit


def test_axes_of_exactly_1000_characters_are_taken_and_1001_refused():
    assert len(AdjustmentSetup(axes="x" * 1000).axes) == 1000
    assert refusal(axes="x" * 1001) == "adjustment axes: expected text of at most 1000 characters"


def test_axes_that_are_not_text_are_refused():
    assert refusal(axes=["+Z"]) == "adjustment axes: expected text of at most 1000 characters"


def test_an_unknown_axes_frame_is_refused_with_what_was_given():
    assert refusal(axes_frame="Body") == "adjustment axes frame: expected body or reference, got 'Body'"
    assert AdjustmentSetup(axes_frame="reference").axes_frame == "reference"


# --- footprint and pivot -----------------------------------------------------------------------------

def test_a_footprint_is_kept_as_tuples_of_floats_and_a_flat_list_is_read_three_at_a_time():
    setup = AdjustmentSetup(footprint=[1, 2, 3, 4, 5, 6])
    assert setup.footprint == ((1.0, 2.0, 3.0), (4.0, 5.0, 6.0))
    assert all(type(v) is float for foot in setup.footprint for v in foot)


def test_feet_that_are_not_numbers_are_refused():
    assert refusal(footprint=(("a", "b", "c"),)) == "footprint: expected feet of three numbers each"
    assert refusal(footprint=((1, 2, 3, 4),)) == "footprint: expected feet of three numbers each"


def test_64_feet_are_taken_and_65_refused():
    many = tuple((float(i), 0.0, 0.0) for i in range(65))
    assert len(AdjustmentSetup(footprint=many[:64]).footprint) == 64
    assert refusal(footprint=many) == "footprint: expected at most 64 feet of finite numbers below 1e9 mm"


@pytest.mark.parametrize("value", [1e9, -1e9])
def test_a_foot_at_1e9_mm_is_taken(value):
    assert AdjustmentSetup(footprint=((value, 0, 0),)).footprint[0][0] == value


@pytest.mark.parametrize("value", [1000000000.5, -1000000000.5, 1.000001e9, float("inf"), float("-inf"), float("nan")])
def test_a_foot_beyond_1e9_mm_or_not_finite_is_refused(value):
    assert refusal(footprint=((0, value, 0),)) == "footprint: expected at most 64 feet of finite numbers below 1e9 mm"


def test_the_pivot_is_any_foot_of_the_footprint_and_no_further():
    assert AdjustmentSetup(footprint=FEET, pivot=2).pivot == 2
    assert AdjustmentSetup(footprint=FEET, pivot=0).pivot == 0
    assert refusal(footprint=FEET, pivot=3) == "pivot: expected a foot number of the footprint, got 3"


def test_without_feet_any_foot_number_from_zero_is_kept():
    # Nothing to check it against yet: the feet may be typed after the pivot.
    assert AdjustmentSetup(pivot=5).pivot == 5


@pytest.mark.parametrize("pivot, shown", [(-1, "-1"), (True, "True"), (1.0, "1.0"), ("1", "'1'")])
def test_a_pivot_that_is_not_a_foot_number_is_refused(pivot, shown):
    assert refusal(footprint=FEET, pivot=pivot) == f"pivot: expected a foot number of the footprint, got {shown}"


# --- pitch, uncertainty, coverage ------------------------------------------------------------------

@pytest.mark.parametrize("name, top", [("pitch_mm", 100.0), ("uncertainty_deg", 180.0), ("coverage", 10.0)])
def test_each_number_is_taken_at_its_top_and_stored_as_a_float(name, top):
    setup = AdjustmentSetup(**{name: int(top)})
    assert getattr(setup, name) == top and type(getattr(setup, name)) is float


@pytest.mark.parametrize("name, top, words", [("pitch_mm", 100, "pitch mm: expected a number above 0 and up to 100"),
                                              ("uncertainty_deg", 180, "uncertainty deg: expected a number above 0 "
                                                                       "and up to 180"),
                                              ("coverage", 10, "coverage: expected a number above 0 and up to 10")])
def test_each_number_just_above_its_top_or_below_zero_is_refused_in_words(name, top, words):
    assert refusal(**{name: top + 0.001}) == f"{words}, got {top + 0.001!r}"
    assert refusal(**{name: -0.001}) == f"{words}, got -0.001"


@pytest.mark.parametrize("value", [True, "2", float("nan"), float("inf")])
def test_a_coverage_that_is_not_a_finite_number_is_refused(value):
    assert refusal(coverage=value) == f"coverage: expected a number above 0 and up to 10, got {value!r}"


def test_the_coverage_cannot_be_left_out_but_pitch_and_uncertainty_can():
    assert refusal(coverage=None) == "coverage: expected a number above 0 and up to 10, got None"
    setup = AdjustmentSetup(pitch_mm=None, uncertainty_deg=None)
    assert setup.pitch_mm is None and setup.uncertainty_deg is None


def test_a_zero_uncertainty_is_taken_but_a_zero_pitch_or_coverage_is_not():
    # A perfect measurement is a limit a person may state; a zero pitch or k = 0 would divide by zero.
    assert AdjustmentSetup(uncertainty_deg=0).uncertainty_deg == 0.0
    assert refusal(pitch_mm=0) == "pitch mm: expected a number above 0 and up to 100, got 0"
    assert refusal(coverage=0.0) == "coverage: expected a number above 0 and up to 10, got 0.0"


def test_the_smallest_pitch_above_zero_is_taken():
    assert AdjustmentSetup(pitch_mm=1e-300).pitch_mm == 1e-300


# --- file form ---------------------------------------------------------------------------------------

def test_the_file_form_names_every_field_and_the_unit_only_when_it_is_not_mm():
    setup = AdjustmentSetup(axes="+Z", axes_frame="reference", footprint=FEET, pivot=1, pitch_mm=0.5,
                            uncertainty_deg=0.02, coverage=3)
    assert setup.to_dict() == {"axes": "+Z", "axes_frame": "reference", "footprint": [list(f) for f in FEET],
                               "pivot": 1, "pitch_mm": 0.5, "uncertainty_deg": 0.02, "coverage": 3.0}
    inches = AdjustmentSetup(length_unit="in").to_dict()
    assert inches["length_unit"] == "in"
    assert AdjustmentSetup.from_dict(inches) == AdjustmentSetup(length_unit="in")


def test_a_file_form_with_a_covariance_reads_back_the_same():
    setup = AdjustmentSetup(footprint=FEET, uncertainty_deg=0.05,
                            covariance_deg2=((0.004, 0.001, 0.0), (0.001, 0.002, 0.0), (0.0, 0.0, 0.0001)))
    data = setup.to_dict()
    assert data["covariance_deg2"] == [[0.004, 0.001, 0.0], [0.001, 0.002, 0.0], [0.0, 0.0, 0.0001]]
    assert AdjustmentSetup.from_dict(data) == setup


@pytest.mark.parametrize("data, kind", [([], "list"), ("axes", "str"), (None, "NoneType")])
def test_a_file_entry_that_is_not_an_object_is_refused_by_its_kind(data, kind):
    with pytest.raises(FramewrightError) as caught:
        AdjustmentSetup.from_dict(data)
    assert str(caught.value) == f"adjustment: expected a JSON object, got {kind}"


def test_an_empty_file_entry_is_the_default_setup():
    assert AdjustmentSetup.from_dict({}) == AdjustmentSetup()


def test_an_unknown_key_is_refused_listing_every_key_a_file_may_hold():
    with pytest.raises(FramewrightError) as caught:
        AdjustmentSetup.from_dict({"shims": 1})
    assert str(caught.value) == ("adjustment: unknown key(s) shims; expected axes, axes_frame, footprint, pivot, "
                                 "pitch_mm, uncertainty_deg, coverage, length_unit, covariance_deg2")


# --- covariance --------------------------------------------------------------------------------------

def covariance_refusal(value, uncertainty=1.0):
    return refusal(uncertainty_deg=uncertainty, covariance_deg2=value)


def test_a_large_covariance_with_round_off_asymmetry_is_taken_and_made_symmetric():
    # Entries of 1e4 degrees² off by 1e-8 (1e-12 of the largest, worked by hand): round-off, not an error.
    c = ((1e4, 1e-8, 0.0), (0.0, 1e4, 0.0), (0.0, 0.0, 1e4))
    kept = AdjustmentSetup(uncertainty_deg=100.0, covariance_deg2=c).covariance_deg2
    assert kept[0][1] == kept[1][0] == 0.5e-8


def test_a_small_covariance_that_is_not_symmetric_is_refused():
    # Entries of 1e-6 degrees² off by 1e-14 (1e-8 of the largest, worked by hand): more than round-off.
    c = ((1e-6, 1e-14, 0.0), (0.0, 1e-6, 0.0), (0.0, 0.0, 1e-6))
    assert covariance_refusal(c, 0.001) == "orientation covariance: expected a symmetric matrix"


def test_the_symmetry_bound_is_1e_minus_9_of_the_largest_entry_on_both_sides():
    # Largest entry 1; an asymmetry of 0.5e-9 is taken, 2e-9 refused (worked by hand).
    near = ((1.0, 0.5e-9, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, 1.0))
    AdjustmentSetup(uncertainty_deg=1.0, covariance_deg2=near)
    far = ((1.0, 2e-9, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, 1.0))
    assert covariance_refusal(far) == "orientation covariance: expected a symmetric matrix"


def test_a_large_covariance_with_a_round_off_negative_variance_is_taken():
    # A variance of −1e-7 beside 1e4 (1e-11 of it, worked by hand) is round-off of a zero variance.
    c = ((1e4, 0.0, 0.0), (0.0, 1e4, 0.0), (0.0, 0.0, -1e-7))
    assert AdjustmentSetup(uncertainty_deg=100.0, covariance_deg2=c).covariance_deg2[2][2] == -1e-7


def test_a_small_covariance_with_a_clearly_negative_variance_is_refused():
    # −1e-14 beside 1e-6 is 1e-8 of the largest: more than round-off (worked by hand).
    c = ((1e-6, 0.0, 0.0), (0.0, 1e-6, 0.0), (0.0, 0.0, -1e-14))
    assert covariance_refusal(c, 0.001) == "orientation covariance: a variance below zero; expected a covariance"


def test_an_all_zero_covariance_is_taken():
    # A fit without noise: every variance 0, nothing to be asymmetric or negative.
    zero = ((0.0, 0.0, 0.0),) * 3
    assert AdjustmentSetup(uncertainty_deg=0.0, covariance_deg2=zero).covariance_deg2 == zero


@pytest.mark.parametrize("value", ["lots", ((1, 2, 3), (4, 5)), (("a", 0, 0), (0, 1, 0), (0, 0, 1))])
def test_a_covariance_that_is_not_numbers_in_rows_is_refused(value):
    assert covariance_refusal(value) == "orientation covariance: expected 3 rows of 3 numbers (degrees²)"


@pytest.mark.parametrize("value", [((1, 0), (0, 1)), ((1, 0, 0), (0, float("inf"), 0), (0, 0, 1))])
def test_a_covariance_of_the_wrong_shape_or_not_finite_is_refused(value):
    assert covariance_refusal(value) == \
        "orientation covariance: expected 3 rows of 3 finite numbers up to 180² (degrees²)"


def test_a_covariance_without_an_uncertainty_is_refused_in_words():
    assert refusal(covariance_deg2=((1, 0, 0), (0, 1, 0), (0, 0, 1))) == \
        "orientation covariance: expected it only with a standard uncertainty"


def test_the_covariance_is_kept_as_tuples_of_floats():
    kept = AdjustmentSetup(uncertainty_deg=1.0, covariance_deg2=[[1, 0, 0], [0, 2, 0], [0, 0, 3]]).covariance_deg2
    assert kept == ((1.0, 0.0, 0.0), (0.0, 2.0, 0.0), (0.0, 0.0, 3.0))
    assert isinstance(kept, tuple) and all(isinstance(r, tuple) for r in kept)
    assert all(type(v) is float for r in kept for v in r)


def test_an_asymmetry_of_exactly_1e_minus_9_of_the_largest_entry_is_still_taken():
    # Largest entry 1, asymmetry 1e-9 exactly (1e-9 − 0 is exact): at the bound, not beyond it.
    kept = AdjustmentSetup(uncertainty_deg=1.0,
                           covariance_deg2=((1.0, 1e-9, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, 1.0))).covariance_deg2
    assert kept[0][1] == kept[1][0] == 0.5e-9


def test_a_variance_of_exactly_minus_1e_minus_9_of_the_largest_entry_is_still_taken():
    # Diagonal, so the smallest eigenvalue is the entry itself, −1e-9 of the largest (1): at the bound.
    kept = AdjustmentSetup(uncertainty_deg=1.0,
                           covariance_deg2=((1.0, 0.0, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, -1e-9))).covariance_deg2
    assert kept[2][2] == -1e-9


@pytest.mark.parametrize("key, value, shown", [("pivot", [1], "pivot: expected a foot number of the footprint, "
                                                                 "got [1]"),
                                               ("coverage", [2], "coverage: expected a number above 0 and up to 10, "
                                                                 "got [2]")])
def test_a_list_where_a_file_should_hold_a_number_is_refused_showing_the_list(key, value, shown):
    with pytest.raises(FramewrightError) as caught:
        AdjustmentSetup.from_dict({key: value})
    assert str(caught.value) == shown


def test_a_footprint_read_from_a_file_comes_back_as_tuples():
    setup = AdjustmentSetup.from_dict({"footprint": [[1, 2, 3], [4, 5, 6]], "pivot": 1})
    assert setup.footprint == ((1.0, 2.0, 3.0), (4.0, 5.0, 6.0)) and setup.pivot == 1
