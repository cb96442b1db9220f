"""The export options reach every format: fixed decimals round the JSON object's numbers, the round-trip
check of every format reads what that format writes with those options, a vector representation's caption
names its unit, and a C literal of a whole number is a double ('1.0'), never an int."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.format_options import FormatOptions
from core.formats import check_every_format, render
from core.orientation import Orientation

TURN = Orientation.from_axis_angle([0, 0, 1], 30.123456)      # our own invented value


def test_fixed_decimals_round_every_number_of_the_json_object():
    data = json.loads(render(TURN, "json", FormatOptions(decimals=3)))
    assert data["angle_deg"] == 30.123                       # 30.123456 to three decimals (by hand)
    assert data["angles_deg"] == [30.123, 0.0, 0.0]
    # cos(30.123456°) = 0.86497..., sin = 0.50179... (SciPy's Rotation, below), to three decimals
    expected = np.round(Rotation.from_rotvec([0, 0, 30.123456], degrees=True).as_matrix(), 3)
    np.testing.assert_array_equal(data["matrix"], expected)


def test_the_round_trip_check_reads_each_format_as_written_with_the_options():
    options = FormatOptions(representation="quaternion", decimals=2)
    errors = check_every_format(TURN, options)
    # SciPy's Rotation: the quaternion written to two decimals, read back (normalised), against the original.
    q = Rotation.from_rotvec([0, 0, 30.123456], degrees=True).as_quat(scalar_first=True)
    back = Rotation.from_quat(np.round(q, 2), scalar_first=True)
    expected = np.degrees((back.inv() * Rotation.from_rotvec([0, 0, 30.123456], degrees=True)).magnitude())
    assert expected > 0.1                                    # the rounding is visible
    for fmt in ("text", "csv", "python", "c", "matlab"):
        assert errors[fmt] == pytest.approx(expected, abs=1e-9), fmt
    assert all(error > 0.01 for error in errors.values())


@pytest.mark.parametrize("degrees, unit", [(False, "rad"), (True, "deg")])
def test_a_rotation_vector_caption_names_its_unit(degrees, unit):
    text = render(TURN, "text", FormatOptions(representation="rotation-vector", degrees=degrees))
    assert text.startswith(f"Rotation vector ({unit}): ")


def test_a_whole_number_in_c_is_written_as_a_double_literal():
    text = render(Orientation.identity(), "c")
    assert "{1.0, 0.0, 0.0}" in text and "{0.0, 0.0, 1.0}" in text
    text = render(Orientation.identity(), "c", FormatOptions(representation="quaternion", decimals=0))
    assert "= {1.0, 0.0, 0.0, 0.0};" in text
