"""What the words say, pinned word for word: a unit word (degrees or radians, not both), several sequence
names (none assumed), primes and the word intrinsic (intrinsic), the order of yaw, pitch and roll, and a
column-major word on one line of nine. Check values: SciPy's Rotation; the texts are invented demo values;
the note and refusal words are the module's own."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.errors import DecodeError


@pytest.mark.parametrize("text, units, said", [
    ("angles in radians: 0.1 0.2 0.3", "rad", "the text says radians"),
    ("angles in degrees: 0.1 0.2 0.3", "deg", "the text says degrees"),
])
def test_a_unit_word(text, units, said):
    first = decode(text)[0]
    assert first.conventions["units"] == units
    assert first.why == f"yaw-pitch-roll (intrinsic Z-Y'-X''), the most common sequence; {said}; the text says angles"
    assert np.allclose(first.orientation.as_matrix(),
                       Rotation.from_euler("ZYX", [0.1, 0.2, 0.3], degrees=units == "deg").as_matrix(), atol=1e-12)


def test_both_unit_words_say_nothing():
    first = decode("in degrees or radians: 0.1 0.2 0.3")[0]
    assert "the text says" not in first.why


def test_both_unit_marks_are_refused():
    with pytest.raises(DecodeError) as err:
        decode("10 deg, 0.2 rad, 30 deg")
    assert str(err.value) == "the numbers are marked in both degrees and radians; expected one unit for all"


def test_several_sequence_names_assume_none_and_no_name_says_nothing():
    assert "the text names several sequences (XYZ, ZYX); none was assumed" in decode("xyz or zyx: 10 20 30")[0].notes
    assert not any("several sequences" in n for r in decode("10 20 30") for n in r.notes)


@pytest.mark.parametrize("text, sequence", [
    ("z-y'-x: 10 20 30", "ZYX"),          # one prime is enough to say the axes move
    ("z-y'-x'': 10 20 30", "ZYX"),
    ("intrinsic xyz: 10 20 30", "XYZ"),
])
def test_primes_or_the_word_intrinsic_mean_intrinsic(text, sequence):
    readings = decode(text)
    assert len(readings) == 1
    assert readings[0].conventions == {"sequence": sequence, "intrinsic": True, "units": "deg"}
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_euler(sequence, [10, 20, 30], degrees=True).as_matrix(), atol=1e-12)


def test_the_word_extrinsic():
    readings = decode("extrinsic xyz: 10 20 30")
    assert len(readings) == 1
    assert readings[0].conventions == {"sequence": "XYZ", "intrinsic": False, "units": "deg"}
    assert np.allclose(readings[0].orientation.as_matrix(),
                       Rotation.from_euler("xyz", [10, 20, 30], degrees=True).as_matrix(), atol=1e-12)


@pytest.mark.parametrize("text, sequence, intrinsic", [
    ("yaw pitch roll: 10 20 30", "ZYX", True),
    ("yaw, pitch, roll; yaw is heading: 10 20 30", "ZYX", True),     # the first mention of each counts
    ("roll pitch yaw: 10 20 30", "XYZ", False),
])
def test_the_order_of_yaw_pitch_and_roll(text, sequence, intrinsic):
    readings = decode(text)
    assert len(readings) == 1
    assert readings[0].conventions == {"sequence": sequence, "intrinsic": intrinsic, "units": "deg"}


def test_column_major_on_one_line_of_nine_transposes():
    first = decode("column-major: 1 0 0 0 0 1 0 -1 0")[0]
    assert first.conventions == {"matrix": "reference-to-body"}
    assert first.why == "the text says column-major: the nine numbers are the columns one after another"
    # the word above three rows of three says nothing of their direction
    rows = decode("column-major:\n1 0 0\n0 0 1\n0 -1 0")[0]
    assert rows.why == "as written and transposed are equally likely: the text does not say which"
