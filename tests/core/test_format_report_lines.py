"""The report's lines a person reads: the gimbal margin for the chosen sequence and kind, the axis and angle
(and the words for no rotation), gimbal lock, the level line for a tilted gravity, and the layout (blank
lines between sections, one newline at the end). Check values: SciPy's Rotation, worked by hand."""

import re

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import describe
from core.formats import FormatOptions, render
from core.orientation import Orientation

# An orientation whose intrinsic and extrinsic Z-Y-X middle angles differ (35 deg against about 37.48 deg).
TURNED = Rotation.from_euler("ZYX", [50, 35, 20], degrees=True)


def _orientation(rotation):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


def _line(text, start):
    found = [line for line in text.splitlines() if line.startswith(start)]
    assert len(found) == 1, text
    return found[0]


def _margin(text):
    return float(re.match(r"Gimbal margin: ([0-9.]+) deg", _line(text, "Gimbal margin:")).group(1))


@pytest.mark.parametrize("intrinsic, scipy_sequence", [(True, "ZYX"), (False, "zyx")])
def test_the_gimbal_margin_is_for_the_kind_of_sequence_chosen(intrinsic, scipy_sequence):
    text = render(_orientation(TURNED), "report", FormatOptions(sequence="ZYX", intrinsic=intrinsic))
    # SciPy: upper case is intrinsic, lower case extrinsic; for Tait-Bryan angles the margin from lock is
    # 90 deg less the middle angle's size (common practice)
    middle = TURNED.as_euler(scipy_sequence, degrees=True)[1]
    assert _margin(text) == pytest.approx(90 - abs(middle), abs=6e-4)
    other = TURNED.as_euler("zyx" if intrinsic else "ZYX", degrees=True)[1]
    assert abs((90 - abs(other)) - _margin(text)) > 1      # the two kinds do differ here


def test_gimbal_lock_is_said_in_words():
    text = render(_orientation(Rotation.from_euler("ZYX", [30, 90, 0], degrees=True)), "report")
    assert _line(text, "Gimbal margin") == ("Gimbal margin: 0 deg, in gimbal lock: only the sum or difference "
                                            "of the first and third angles is determined")


def test_no_rotation_has_no_axis_in_words():
    text = render(Orientation.identity(), "report")
    assert _line(text, "Axis and angle") == "Axis and angle: no rotation (angle 0; the axis is undefined)"


def test_the_axis_and_angle_line_reads_as_scipys_rotation_vector():
    text = render(_orientation(TURNED), "report")
    found = re.fullmatch(r"Axis and angle: axis \((\S+), (\S+), (\S+)\), angle (\S+) deg",
                         _line(text, "Axis and angle"))
    assert found is not None
    axis, angle = np.array([float(v) for v in found.groups()[:3]]), float(found.group(4))
    rotvec = TURNED.as_rotvec()                     # SciPy: axis times angle in radians
    assert angle == pytest.approx(np.degrees(np.linalg.norm(rotvec)), abs=1e-9)
    np.testing.assert_allclose(axis, rotvec / np.linalg.norm(rotvec), atol=1e-9)


def test_the_level_line_names_a_tilted_gravity_by_its_numbers():
    text = render(_orientation(TURNED), "report", FormatOptions(gravity_down=(0, 0.6, -0.8)))
    m = describe.MINUS
    assert _line(text, "Level readings") == (f"Level readings, gravity along reference (0, 0.6, {m}0.8); "
                                             "degrees to three decimals:")
    # The +Z face's normal from straight up: the angle between body Z in the reference (SciPy's matrix,
    # third column) and up = -gravity (worked by hand from the definition)
    up = -np.array([0, 0.6, -0.8])
    expected = np.degrees(np.arccos(TURNED.as_matrix()[:, 2] @ up))
    face = re.search(r"normal ([0-9.]+) from straight up", _line(text, "    face +Z")).group(1)
    assert float(face) == pytest.approx(expected, abs=6e-4)


def test_sections_are_parted_by_blank_lines_and_the_text_ends_in_one_newline():
    text = render(_orientation(TURNED), "report")
    lines = text.split("\n")
    for start in ("Quaternion", "Where the body axes point", "Level readings", "Caution"):
        at = next(i for i, line in enumerate(lines) if line.startswith(start))
        assert lines[at - 1] == "", start
    assert text.endswith("licensed practice govern.\n") and not text.endswith("\n\n")
