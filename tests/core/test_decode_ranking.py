"""How decode ranks and narrows readings, and how it refuses. Orientation values are checked against
SciPy's Rotation (named beside each check); ranking rules are the ones the decoder promises."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, DecodeHints, decode


# --- quaternion order ---------------------------------------------------------------------------------
def test_unit_four_tuple_with_largest_first_is_w_first_and_largest_last_is_w_last():
    first = decode("0.9238795 0.3826834 0 0")
    last = decode("0.3826834 0 0 0.9238795")
    assert (first[0].kind, first[0].conventions["order"]) == ("quaternion", "wxyz")
    assert (last[0].kind, last[0].conventions["order"]) == ("quaternion", "xyzw")
    # both mean 45° about x; SciPy's from_quat (scalar last by default)
    expected = Rotation.from_quat([0.3826834, 0, 0, 0.9238795]).as_matrix()
    for readings in (first, last):
        assert np.allclose(readings[0].orientation.as_matrix(), expected, atol=1e-12)


def test_the_other_order_is_still_offered_and_jpl_comes_last_as_the_inverse():
    readings = decode("0.9238795 0.3826834 0 0")
    quaternions = [r for r in readings if r.kind == "quaternion"]
    assert [(r.conventions["order"], r.conventions["convention"]) for r in quaternions] == [
        ("wxyz", "Hamilton"), ("xyzw", "Hamilton"), ("xyzw", "JPL")]
    assert readings[-1].conventions["convention"] == "JPL" or readings[-1].kind == "axis-angle"
    hamilton_xyzw, jpl = quaternions[1], quaternions[2]
    # JPL reading of the same numbers is the inverse rotation (CONVENTIONS.md; Solà 2017)
    assert jpl.orientation.isclose(hamilton_xyzw.orientation.inverse())


def test_order_hint_leaves_exactly_one_reading():
    readings = decode("0.3 0.4 0.5 0.7071", {"kind": "quaternion", "order": "xyzw"})
    assert len(readings) == 1
    # SciPy from_quat, scalar last
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_quat([0.3, 0.4, 0.5, 0.7071]).as_matrix(), atol=1e-12)


# --- matrices -----------------------------------------------------------------------------------------
M45 = "0.7071 -0.7071 0\n0.7071 0.7071 0\n0 0 1"


def test_a_matrix_is_offered_as_written_and_transposed_equally_likely():
    readings = decode(M45)
    assert [r.conventions["matrix"] for r in readings] == ["body-to-reference", "reference-to-body"]
    assert readings[0].score == readings[1].score
    assert "equally likely" in readings[0].why
    assert readings[0].orientation.isclose(readings[1].orientation.inverse())


@pytest.mark.parametrize("words, first", [
    ("body to reference", "body-to-reference"), ("C_b^n", "body-to-reference"), ("body->ned", "body-to-reference"),
    ("DCM", "reference-to-body"), ("direction cosine matrix", "reference-to-body"),
    ("world to body", "reference-to-body"), ("C_n^b", "reference-to-body"),
])
def test_words_in_the_text_say_which_way_a_matrix_goes(words, first):
    readings = decode(f"{words}:\n{M45}")
    assert readings[0].conventions["matrix"] == first
    assert readings[0].score > readings[1].score
    assert len(readings) == 2       # the other direction is still offered


def test_a_rounded_drawing_matrix_is_accepted_with_a_notice_of_the_correction():
    best = decode(M45)[0]
    # 45° about z printed to four decimals: orthogonality error about 2e-5 (common practice)
    assert 1e-5 < best.orthogonality_error < 5e-5
    assert any("nearest rotation" in note for note in best.notes)
    assert abs(best.orientation.angle - 45.0) < 1e-9


def test_a_matrix_in_the_warning_band_decodes_with_a_strong_warning():
    best = decode("1 0 0\n0 0.99 -0.1\n0 0.1 0.99")[0]
    assert 5e-3 < best.orthogonality_error <= 5e-2
    assert any("WARNING" in note for note in best.notes)


def test_a_refused_matrix_says_which_row_or_column_is_wrong():
    with pytest.raises(DecodeError, match=r"row 2|column 2|rows 2|columns 2"):
        decode("1 0 0\n0 1.5 0\n0 0 1")
    with pytest.raises(DecodeError, match="reflection"):
        decode("1 0 0\n0 -1 0\n0 0 1")


def test_matrix_hint_leaves_one_reading():
    readings = decode(M45, DecodeHints(transposed=True))
    assert len(readings) == 1 and readings[0].conventions["matrix"] == "reference-to-body"
    # SciPy from_matrix of the transpose
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_matrix(np.array([[0.7071, 0.7071, 0], [-0.7071, 0.7071, 0], [0, 0, 1]])).as_matrix(),
                       atol=1e-9)


# --- units and sequences ------------------------------------------------------------------------------
def test_decimals_within_two_pi_may_be_radians_and_integers_above_are_degrees():
    small = decode("0.5 0.25 0.1")
    assert small[0].conventions["units"] == "rad"
    assert any(r.conventions.get("units") == "deg" for r in small)
    big = decode("30 20 10")
    assert big[0].conventions["units"] == "deg"
    assert all(r.conventions.get("units") == "deg" for r in big)   # 30 rad is not a plausible angle


def test_sequence_intrinsic_units_hints_leave_exactly_one_reading():
    readings = decode("10 20 30", {"kind": "angles", "sequence": "XYZ", "intrinsic": False, "units": "deg"})
    assert len(readings) == 1
    # SciPy: lower case is extrinsic
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_euler("xyz", [10, 20, 30], degrees=True).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("kind, text, hints", [
    ("rotation-vector", "0.1 0.2 0.3", {"units": "rad"}),
    ("axis-angle", "0 0 1 0.5", {"units": "rad"}),
    ("quaternion", "0.5 0.5 0.5 0.5", {"order": "wxyz"}),
    ("matrix", "1 0 0 0 1 0 0 0 1", {"transposed": False}),
    ("angles", "1 2 3", {"sequence": "ZYZ", "intrinsic": True, "units": "deg"}),
])
def test_every_hint_given_means_one_reading(kind, text, hints):
    assert len(decode(text, {"kind": kind, **hints})) == 1


def test_gimbal_lock_is_noted():
    best = decode("yaw 40, pitch 90, roll 10")[0]
    assert any("gimbal lock" in note for note in best.notes)
    # the decoded value is still the right orientation: SciPy from_euler
    assert np.allclose(best.orientation.as_matrix(),
                       Rotation.from_euler("ZYX", [40, 90, 10], degrees=True).as_matrix(), atol=1e-12)


def test_every_reading_explains_its_rank_and_conventions():
    for text in ("0.5 0.5 0.5 0.5", M45, "10 20 30", "0 0 1 90"):
        for r in decode(text):
            assert r.why and r.label and r.conventions
            assert np.all(np.isfinite(r.orientation.quaternion))


# --- refusals -----------------------------------------------------------------------------------------
@pytest.mark.parametrize("text, count", [("1 2", 2), ("1 2 3 4 5", 5), ("1 2 3 4 5 6 7 8", 8), ("", 0),
                                         ("Rotation matrix: see drawing", 0)])
def test_another_count_is_a_clear_error(text, count):
    with pytest.raises(DecodeError) as error:
        decode(text)
    message = str(error.value)
    assert (f"found {count} number" in message) or (count == 0 and "no numbers" in message)
    assert "9" in message and "4" in message and "3" in message


def test_decimal_commas_get_a_hint_in_the_error():
    with pytest.raises(DecodeError, match="decimal"):
        decode("0,7071 0 0 0,7071")


def test_a_kind_hint_that_does_not_fit_the_count_says_so():
    with pytest.raises(DecodeError, match="needs 9 numbers; the text holds 4"):
        decode("1 0 0 0", {"kind": "matrix"})


def test_unknown_hints_are_refused():
    with pytest.raises(DecodeError):
        decode("1 0 0 0", {"kind": "spinor"})
    with pytest.raises(DecodeError):
        decode("1 2 3", {"sequence": "XXY"})
    with pytest.raises(DecodeError):
        decode("1 2 3", {"intrinsic": "yes"})
    with pytest.raises(DecodeError):
        decode("1 2 3", {"colour": "red"})


def test_mixed_unit_marks_are_refused():
    with pytest.raises(DecodeError, match="degrees and radians"):
        decode("10° 0.2 rad 5°")


def test_our_json_object_decodes_by_its_exact_quaternion():
    text = '{"quaternion_wxyz": [0.5, 0.5, 0.5, 0.5], "matrix": [[0, 0, 1], [1, 0, 0], [0, 1, 0]]}'
    readings = decode(text)
    assert len(readings) == 1
    # 120° about (1,1,1)/√3 maps x -> y -> z (common practice); SciPy from_quat scalar_first
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_quat([0.5, 0.5, 0.5, 0.5], scalar_first=True).as_matrix(), atol=1e-15)
    assert decode(text, {"kind": "matrix"})[0].orientation.isclose(readings[0].orientation)


def test_a_block_with_several_representations_reads_its_quaternion_line():
    text = ("Mount 7, checked 2026-11-30\nQuaternion (w, x, y, z): 0.9238795, 0, 0, 0.3826834\n"
            "Matrix: 0.7071 -0.7071 0 0.7071 0.7071 0 0 0 1")
    best = decode(text)[0]
    assert best.kind == "quaternion" and best.conventions["order"] == "wxyz"
    assert any("read the quaternion on line 2" in note for note in best.notes)


def test_named_angles_and_contradicting_sequence_options_are_refused():
    with pytest.raises(DecodeError, match="contradict"):
        decode("yaw: 10, pitch: 20, roll: 30", {"sequence": "XYZ"})


def test_a_title_line_holding_a_number_is_set_aside_with_a_note():
    best = decode("Mount 7 rotation:\n0 -1 0\n1 0 0\n0 0 1")[0]
    assert best.kind == "matrix"
    assert any("title" in note and "7" in note for note in best.notes)
    # 90° about z (common practice), SciPy from_rotvec
    assert np.allclose(best.orientation.as_matrix(), Rotation.from_rotvec([0, 0, np.pi / 2]).as_matrix(), atol=1e-12)


def test_a_title_that_makes_a_valid_count_is_ranked_against_the_text_without_it():
    readings = decode("Drawing 4711 rev B\nyaw 30 pitch 20 roll 10")
    assert readings[0].kind == "angles" and "title" in readings[0].why
    # SciPy, intrinsic ZYX
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_euler("ZYX", [30, 20, 10], degrees=True).as_matrix(), atol=1e-12)
    assert any(r.kind == "axis-angle" for r in readings)     # the reading with 4711 is still offered


@pytest.mark.parametrize("text", ["q = [0.7071068, 0.7071068, , 0]", "1;0;;0", "| 1 | | 0 | 0 |"])
def test_an_empty_place_between_numbers_is_refused(text):
    with pytest.raises(DecodeError, match="missing"):
        decode(text)


def test_an_angle_of_more_than_ten_turns_is_refused():
    # '07071068' is '0.7071068' with its point lost; 7 million degrees is no mounting angle
    with pytest.raises(DecodeError, match="ten turns"):
        decode("07071068 0.7071068 0")
    # a few turns still decode (SciPy from_euler wraps them the same way)
    best = decode("yaw: 725, pitch: 0, roll: 0")[0]
    assert np.allclose(best.orientation.as_matrix(), Rotation.from_euler("ZYX", [725, 0, 0], degrees=True).as_matrix(),
                       atol=1e-12)


@pytest.mark.parametrize("kind, words", [
    ("angles", "a set of three angles needs 3 numbers; the text holds 4"),
    ("axis-angle", "an axis and angle needs 4 numbers; the text holds 3"),
    ("mrp", "an MRP vector needs 3 numbers; the text holds 4"),
    ("gibbs", "a Gibbs vector needs 3 numbers; the text holds 4"),
    ("rotation-vector", "a rotation vector needs 3 numbers; the text holds 4"),
    ("quaternion", "a quaternion needs 4 numbers; the text holds 3"),
])
def test_a_kind_hint_with_the_wrong_count_is_refused_in_plain_words(kind, words):
    text = "0.1 0.2 0.3" if words.endswith("holds 3") else "0.1 0.2 0.3 0.4"
    with pytest.raises(DecodeError, match=words):
        decode(text, DecodeHints(kind=kind))
