"""The named-flag form of transform arguments with flags left out (issue 11 items 1 and 5).

Read bare, `--x 0.1 --y 0.2 --z 0.3 --yaw 1.5708` is four numbers and came back as an axis and an angle
(85.7° about (0.27, 0.53, 0.80), exit 0). The named-flag form gives a left-out flag 0 (--qw 1) — the tool's
documented defaults, from memory — so the flags are read as a pose with those defaults, and a note names
each value that was filled in. Expected rotations: SciPy's `Rotation` from the flags' own numbers."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode


def _scipy(reading) -> Rotation:
    return Rotation.from_quat(np.asarray(reading.orientation.as_quaternion()), scalar_first=True)


def _off(expected: Rotation, reading) -> float:
    return float((expected.inv() * _scipy(reading)).magnitude())


CASES = [
    # (text, expected rotation (SciPy), translation, the defaults the note must name)
    ("static_transform_publisher --x 0.1 --y 0.2 --z 0.3 --yaw 1.5708 --frame-id base_link --child-frame-id laser",
     Rotation.from_euler("ZYX", [1.5708, 0, 0]), (0.1, 0.2, 0.3), ["--roll 0", "--pitch 0"]),
    ("--x 0.5 --roll 0.1 --pitch -0.2", Rotation.from_euler("ZYX", [0, -0.2, 0.1]), (0.5, 0, 0),
     ["--y 0", "--z 0", "--yaw 0"]),
    ("--roll 0.1 --pitch 0.2 --yaw 0.3", Rotation.from_euler("ZYX", [0.3, 0.2, 0.1]), (0, 0, 0),
     ["--x 0", "--y 0", "--z 0"]),
    ("--x 1 --qz 0.7071068 --qw 0.7071068", Rotation.from_quat([0, 0, 0.7071068, 0.7071068]), (1, 0, 0),
     ["--qx 0", "--qy 0", "--y 0", "--z 0"]),
    ("--z 2 --qx 1", Rotation.from_quat([1, 0, 0, 1]), (0, 0, 2), ["--qw 1"]),
]


@pytest.mark.parametrize("text, expected, translation, defaults", CASES, ids=[c[0][:40] for c in CASES])
def test_left_out_flags_take_the_forms_defaults_and_a_note_names_them(text, expected, translation, defaults):
    readings = decode(text)
    assert len(readings) == 1                                 # the flags name every number: one reading
    top = readings[0]
    assert top.label.startswith("transform flags")
    # Source: SciPy Rotation.from_euler / from_quat of the flags' numbers (yaw-pitch-roll, intrinsic ZYX)
    assert _off(expected, top) < 1e-9
    assert np.allclose(top.translation, translation, rtol=0, atol=0)
    notes = " ".join(top.notes)
    for said in defaults:
        assert said in notes, f"{said!r} is not named in {top.notes}"


def test_a_complete_set_of_flags_fills_nothing_in():
    top = decode("--x 1 --y 2 --z 3 --yaw 0.5 --pitch 0 --roll 0")[0]
    assert not any("default" in n for n in top.notes)


@pytest.mark.parametrize("text, words", [
    ("--x 1 --qz 0.7071068 --yaw 1", ["--qz", "--yaw"]),          # two rotations: which one?
    ("--x 1 --x 2 --yaw 1", ["--x", "twice"]),
    ("--x 0.1 --yaw NaN", ["nan"]),
    ("--x 0.1 --y 0.2 --z 0.3 --yaw 1e999", ["1e999"]),
])
def test_flags_that_cannot_be_one_pose_are_refused_naming_the_flag(text, words):
    with pytest.raises(DecodeError) as refused:
        decode(text)
    for word in words:
        assert word.lower() in str(refused.value).lower()


def test_a_flag_that_is_no_part_of_a_pose_is_named_in_a_note():
    top = decode("--x 0 --y 0 --z 0 --yaw 0.5 --pitch 0 --roll 0 --period 100")[0]
    assert any("--period" in n for n in top.notes)


@pytest.mark.parametrize("text, unit", [
    ("# t in inches\n1 0 0 2\n0 1 0 3\n0 0 1 4\n0 0 0 1", "in"),
    ("# translation in thou\n1 0 0 2\n0 1 0 3\n0 0 1 4\n0 0 0 1", "thou"),
    ("# t in in\n1 0 0 2\n0 1 0 3\n0 0 1 4\n0 0 0 1", None),   # 'in' alone is a word, not a unit
    ("# x_in y_in z_in qw qx qy qz\n2, 3, 4, 1, 0, 0, 0", "in"),
    ("# x_thou y_thou z_thou qw qx qy qz\n2, 3, 4, 1, 0, 0, 0", "thou"),
])
def test_a_translation_in_inches_or_thou_is_read_in_that_unit(text, unit):
    (reading,) = [r for r in decode(text) if "transposed" not in r.label]
    assert reading.translation == (2.0, 3.0, 4.0) and reading.translation_unit == unit
