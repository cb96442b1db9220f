"""Words a person reads and a program matches, pinned exactly: refusals of a signed axis, an unknown
sequence or representation, a zero quaternion, a zero axis in a batch row; the names a Python export and a
CSV header give to what they hold; the note that an axis was normalised, from both sides of its threshold.

Check values: the words are the project's own (a change to them is a change users see and must be made on
purpose); the notice threshold is core.orientation's 1e-9; the zero-axis row is our own invented one."""

import pytest

from core import Orientation
from core.axes import unit_vector
from core.batch import read_mounts
from core.errors import FramewrightError, InvalidInputError, SequenceError
from core.format_options import FormatOptions
from core.formats import csv_header, render
from core.kernels.checks import check_sequence_name
from core.operations import set_position
from core.session import Mount, Session


def test_an_unreadable_signed_axis_is_refused_naming_the_six_axes_and_nothing_else():
    with pytest.raises(InvalidInputError) as caught:
        unit_vector("Q")
    assert str(caught.value) == "axis: cannot read 'Q'; expected one of +X, -X, +Y, -Y, +Z, -Z"
    with pytest.raises(InvalidInputError) as caught:
        unit_vector("Q", "boresight", "three numbers")
    assert str(caught.value) == "boresight: cannot read 'Q'; expected one of +X, -X, +Y, -Y, +Z, -Z or three numbers"


def test_an_unknown_sequence_name_is_refused_listing_the_twelve():
    with pytest.raises(SequenceError) as caught:
        check_sequence_name("ABC")
    assert str(caught.value) == ("unknown angle sequence 'ABC'; expected one of XYZ, XZY, YXZ, YZX, ZXY, ZYX, "
                                 "XYX, XZX, YXY, YZY, ZXZ, ZYZ")


def test_an_unknown_representation_is_refused_listing_the_seven():
    with pytest.raises(FramewrightError) as caught:
        FormatOptions(representation="bogus").checked()
    assert str(caught.value) == ("unknown representation 'bogus'; expected one of matrix, quaternion, axis-angle, "
                                 "rotation-vector, angles, gibbs, mrp")


def test_a_quaternion_that_is_not_numbers_or_is_zero_is_refused_in_words():
    with pytest.raises(InvalidInputError) as caught:
        Orientation(["a", 0, 0, 0])
    assert str(caught.value) == "quaternion: expected numbers, got ['a', 0, 0, 0]"
    with pytest.raises(InvalidInputError) as caught:
        Orientation.from_quaternion([0, 0, 0, 0])
    assert str(caught.value) == "quaternion of zero length; expected a non-zero (w, x, y, z)"


def test_set_position_refuses_what_is_not_a_position_in_words():
    session = Session((Mount("A"),))
    with pytest.raises(TypeError) as caught:
        set_position(session, "1 2 3")
    assert str(caught.value) == "set_position needs a Position or None"


def test_a_batch_row_with_a_zero_axis_and_a_turn_is_refused_naming_its_columns():
    text = ("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,"
            "measured_axis_x,measured_axis_y,measured_axis_z,measured_angle[deg]\n"
            "a,1,0,0,0,0,0,0,10\n"
            "b,1,0,0,0,0,0,0,0\n")
    messages = [p.message for p in read_mounts(text).problems]
    # Row b turns by nothing, so its axis does not matter (the identity, worked by hand); row a cannot turn.
    assert messages == ["line 2 (row 1, mount 'a'), columns measured_axis_x, measured_axis_y, measured_axis_z, "
                        "measured_angle[deg]: rotation axis of zero length; expected a non-zero direction (x, y, z)"]


def test_a_python_export_of_an_axis_and_angle_names_its_variable_axis_angle():
    text = render(Orientation.from_axis_angle([0, 0, 1], 30, degrees=True), "python",
                  FormatOptions(representation="axis-angle"))
    assert "\naxis_angle = np.array([0.0, 0.0, 1.0, 30.0])\n" in text


@pytest.mark.parametrize("intrinsic, tag", [(True, "xyz_intrinsic"), (False, "xyz_extrinsic")])
def test_a_csv_header_of_angles_other_than_yaw_pitch_roll_says_the_convention(intrinsic, tag):
    header = csv_header(FormatOptions(representation="angles", sequence="XYZ", intrinsic=intrinsic))
    assert header == f"{tag}_angle1_deg,{tag}_angle2_deg,{tag}_angle3_deg\n"


def test_an_axis_is_noted_as_normalised_only_past_one_part_in_a_billion():
    # 1 + 2e-9 and 1 + 5e-10 as doubles differ from 1 by about those amounts (IEEE 754 spacing near 1 is
    # 2.2e-16, common practice), on either side of the 1e-9 notice threshold.
    far = Orientation.from_axis_angle([0, 0, 1 + 2e-9], 0.5)
    near = Orientation.from_axis_angle([0, 0, 1 + 5e-10], 0.5)
    assert far.notes == ("axis normalised from length 1.000000002",)
    assert near.notes == ()
