"""The report for a person line by line (core/format_report.py): its title, mount, date and conventions
lines, the numbers block at the default and at a chosen number of decimals (the quaternion exact or
rounded, the matrix in right-aligned columns), the two spellings of the angles for each kind of sequence,
the notes, the caution's one full stop, the section on where the body axes point for the frame chosen, and
the level section's gravity words and elevations.

Check values: SciPy's Rotation (as_quat, as_matrix, as_rotvec, as_mrp, as_euler: upper-case axes
intrinsic, lower-case extrinsic); the Gibbs vector g = n·tan(φ/2) of Shuster, "A Survey of Attitude
Representations" (1993); the gimbal margin of Tait-Bryan angles, 90° less the middle angle's size, and the
swing 1/cos(middle angle) (common practice), worked by hand for a middle angle of 35°; the elevation of a
body axis, the arcsine of its vertical component (worked by hand from the definition). Numbers are printed
by core/number_text.format_number, the one formatter every format uses; the words are the module's own."""

import math
from datetime import datetime

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import describe
from core.format_report import SAFETY_CAUTION
from core.formats import FormatOptions, render
from core.number_text import format_number
from core.orientation import Orientation

TURNED = Rotation.from_euler("ZYX", [50, 35, 20], degrees=True)       # invented: yaw 50, pitch 35, roll 20
MINUS = describe.MINUS


def orientation(rotation=TURNED):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


def report(**options):
    return render(orientation(), "report", FormatOptions(**options))


def line(text, start):
    found = [x for x in text.splitlines() if x.startswith(start)]
    assert len(found) == 1, text
    return found[0]


def joined(values, d):
    return ", ".join(format_number(v, d) for v in values)


def numbers_block(rotation, d, exact_quaternion):
    """The quaternion, matrix, axis-angle and parameter-set lines, from SciPy's values."""
    q = rotation.as_quat(scalar_first=True, canonical=True)
    quaternion = ", ".join(format_number(v, None if exact_quaternion else d) for v in q)
    rotvec = rotation.as_rotvec()
    angle = np.linalg.norm(rotvec)
    axis = rotvec / angle
    gibbs = axis * math.tan(angle / 2)                      # Shuster (1993)
    return ([f"Quaternion (w, x, y, z): {quaternion}", "Rotation matrix, body -> reference:"]
            + ["    " + "  ".join(format_number(v, d).rjust(d + 3) for v in row) for row in rotation.as_matrix()]
            + [f"Axis and angle: axis ({joined(axis, d)}), angle {format_number(math.degrees(angle), d)} deg",
               f"Rotation vector (deg): {joined(rotation.as_rotvec(degrees=True), d)}",
               f"Gibbs vector: {joined(gibbs, d)}",
               f"Modified Rodrigues parameters: {joined(rotation.as_mrp(), d)}"])


@pytest.mark.parametrize("decimals, d", [(None, 10), (3, 3), (6, 6)])
def test_the_numbers_block_line_for_line(decimals, d):
    lines = report(decimals=decimals).splitlines()
    start = lines.index("") + 1
    assert lines[start:start + 9] == numbers_block(TURNED, d, exact_quaternion=decimals is None)


def test_the_exact_quaternion_reads_back_as_the_orientations_own():
    q = [float(v) for v in line(report(), "Quaternion").split(": ")[1].split(", ")]
    np.testing.assert_allclose(q, TURNED.as_quat(scalar_first=True), rtol=0, atol=2e-15)
    assert line(report(decimals=2), "Quaternion") == "Quaternion (w, x, y, z): 0.87, 0.02, 0.34, 0.35"


def test_the_matrix_columns_are_right_aligned_to_the_widest_number():
    rows = [x for x in report(decimals=2).splitlines() if x.startswith("    ") and "." in x][:3]
    # "-0.57" is five characters: each column is decimals + 3 wide, two spaces apart, after four spaces
    assert rows == ["     0.53  -0.59   0.61", "     0.63   0.75   0.19", "    -0.57   0.28   0.77"]


def test_the_head_lines_with_everything_given():
    text = report(name="Mast 7", timestamp=datetime(2026, 1, 2, 3, 4, 5, 678901), decimals=4)
    assert text.splitlines()[:4] == [
        "Framewright orientation report", "Mount: Mast 7", "Date and time: 2026-01-02 03:04:05",
        "Conventions: v_ref = R v_body (the columns of R are the body axes in reference coordinates);"
        " Hamilton quaternion, w first, w not negative; angles in degrees; numbers printed to 4 decimals."]
    assert text.splitlines()[4] == ""


@pytest.mark.parametrize("timestamp, shown", [
    (None, "not given"), ("", "not given"), ("shift 2, Tuesday", "shift 2, Tuesday"),
    (datetime(2026, 12, 1, 9, 30), "2026-12-01 09:30:00"),
])
def test_the_date_line(timestamp, shown):
    text = report(timestamp=timestamp)
    assert text.splitlines()[:2] == ["Framewright orientation report", f"Date and time: {shown}"]
    assert "Mount:" not in text


@pytest.mark.parametrize("sequence, intrinsic, first, second", [
    ("ZYX", True, ("Angles Z-Y'-X'' intrinsic (yaw, pitch, roll)", "ZYX"),
     ("The same spelled X-Y-Z extrinsic (roll, pitch, yaw)", "xyz")),
    ("XYZ", False, ("Angles X-Y-Z extrinsic (roll, pitch, yaw)", "xyz"),
     ("The same spelled Z-Y'-X'' intrinsic (yaw, pitch, roll)", "ZYX")),
    ("ZYX", False, ("Angles Z-Y-X extrinsic", "zyx"), ("The same spelled X-Y'-Z'' intrinsic", "XYZ")),
    ("ZXZ", True, ("Angles Z-X'-Z'' intrinsic", "ZXZ"), ("The same spelled Z-X-Z extrinsic", "zxz")),
])
def test_both_spellings_of_the_angles(sequence, intrinsic, first, second):
    text = report(sequence=sequence, intrinsic=intrinsic, decimals=6)
    for words, scipy_sequence in (first, second):
        angles = TURNED.as_euler(scipy_sequence, degrees=True)          # SciPy's as_euler
        assert line(text, words.split(" ")[0] + " " + words.split(" ")[1]) == f"{words}, deg: {joined(angles, 6)}"


def test_the_gimbal_margin_line_worked_by_hand():
    # middle angle 35°: margin 90 − 35 = 55°, swing 1 / cos 35° = 1.2208 (common practice)
    assert line(report(), "Gimbal margin") == ("Gimbal margin: 55.000 deg (first and third angles swing about "
                                               "1.22 times as much as the orientation)")


def test_notes_of_the_options_then_of_the_orientation_follow_the_margin():
    o = Orientation.from_quaternion(2 * TURNED.as_quat(scalar_first=True))       # read with a note
    assert o.notes == ("normalised from norm 2",)
    lines = render(o, "report", FormatOptions(notes=("demo data, invented", "second note"))).splitlines()
    at = next(i for i, x in enumerate(lines) if x.startswith("Gimbal margin"))
    assert lines[at + 1:at + 5] == ["Note: demo data, invented", "Note: second note", "Note: normalised from norm 2", ""]


@pytest.mark.parametrize("caution, shown", [
    (None, SAFETY_CAUTION + "."), ("check it", "check it."), ("check it.", "check it."),
    ("check it...", "check it."), ("...check it", "...check it."), ("see sheet X.", "see sheet X."),
    ("", SAFETY_CAUTION + "."),
])
def test_the_caution_ends_in_one_full_stop(caution, shown):
    text = report(caution=caution)
    assert text.endswith(f"\n\nCaution: {shown}\n")


@pytest.mark.parametrize("frame", [None, "enu", "NED", "camera"])
def test_where_the_body_axes_point_in_the_frame_chosen(frame):
    text = report(reference_frame=frame)
    preset = describe.frame_preset(frame)
    lines = text.splitlines()
    at = lines.index(f"Where the body axes point (reference directions named as {preset.title}):")
    described = describe.describe_orientation(orientation(), preset)
    assert lines[at + 1:at + 1 + len(described)] == ["    " + x for x in described]
    assert lines[at + 1 + len(described)] == ""
    assert lines[at - 1] == ""


def test_the_ned_words_differ_from_the_default():
    # body Z is 39.7° from reference +Z: "up" in ENU, "down" in NED (the presets' words)
    assert "    +Z \u2192 +Z (up), 39.7\u00b0 off" in report().splitlines()
    assert "    +Z \u2192 +Z (down), 39.7\u00b0 off" in report(reference_frame="ned").splitlines()


@pytest.mark.parametrize("down, words", [
    (None, f"reference {MINUS}Z (Z up)"), ((0, 0, -1), f"reference {MINUS}Z (Z up)"),
    ((0, 0, 1), "reference +Z (Z down)"), ((1, 0, 0), "reference +X"), ((0, -1, 0), f"reference {MINUS}Y"),
    ((0, 0, -2), f"reference {MINUS}Z (Z up)"),
])
def test_the_level_section_names_the_gravity_direction(down, words):
    text = report(gravity_down=down)
    assert line(text, "Level readings") == f"Level readings, gravity along {words}; degrees to three decimals:"


def test_the_level_section_lines_for_gravity_down_z():
    lines = report().splitlines()
    at = lines.index(f"Level readings, gravity along reference {MINUS}Z (Z up); degrees to three decimals:")
    faces = lines[at + 1:at + 7]
    assert [x.split(":")[0] for x in faces] == [f"    face {f}" for f in ("+X", f"{MINUS}X", "+Y", f"{MINUS}Y", "+Z",
                                                                          f"{MINUS}Z")]
    assert lines[at + 7] == f"    up: face +Z; down: face {MINUS}Z"
    # the elevation of each body axis is the arcsine of its vertical component (SciPy's matrix, row z)
    elevations = [math.degrees(math.asin(v)) for v in TURNED.as_matrix()[2]]
    words = ", ".join(f"{axis} {f'{e:.3f}'.replace('-', MINUS)}" for axis, e in zip(("+X", "+Y", "+Z"), elevations))
    assert lines[at + 8] == "    elevation above the horizontal: " + words
    assert words == f"+X {MINUS}35.000, +Y 16.270, +Z 50.332"
    assert lines[at + 9] == ""
