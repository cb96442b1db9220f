"""A mount's part of the record (core/inspection_record.py): its level table (one row of three angles per
face, gravity named by the frame), its slope table, its angle label and its notes. Check values: SciPy's
Rotation for the face normals, the trade's frame definitions (common practice: ENU z up, NED z down) and
hand-worked slopes."""

import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.session import Preferences
from tests.core.test_inspection_record_check_words import MEASURED, bracket_record, bracket_session

FACES = {"+X": (1, 0, 0), "-X": (-1, 0, 0), "+Y": (0, 1, 0), "-Y": (0, -1, 0), "+Z": (0, 0, 1), "-Z": (0, 0, -1)}
UP = {"enu": (0.0, 0.0, 1.0), "ned": (0.0, 0.0, -1.0)}          # common practice: ENU z up, NED z down


def _tables(section):
    return [i for i in section.items if isinstance(i, records.Table)]


def _measured_section(frame="enu", shown=records.ReportUnits(), **kwargs):
    return bracket_record(bracket_session(frame=frame, **kwargs), shown=shown).sections[2]


@pytest.mark.parametrize("frame", ["enu", "ned"])
def test_each_level_row_holds_its_own_faces_three_angles_as_scipy_gives_them(frame):
    table = _tables(_measured_section(frame))[0]
    assert table.columns == ("face", "tilt from level", "off plumb", "normal from straight up")
    rotation = Rotation.from_quat(MEASURED.as_quaternion(), scalar_first=True)
    assert [row.key for row in table.rows] == [f"mount[1].level[{face}]" for face in FACES]
    for row, (face, body_normal) in zip(table.rows, FACES.items()):
        normal = rotation.apply(body_normal)                    # SciPy: the face's normal in the reference
        from_up = math.degrees(math.acos(np.clip(normal @ UP[frame], -1.0, 1.0)))
        tilt = min(from_up, 180.0 - from_up)                   # the face's plane from level (by hand)
        assert len(row.values) == 3, row
        assert [float(v) for v in row.values] == pytest.approx([tilt, 90.0 - tilt, from_up], abs=1e-6), face
        assert row.unit == "deg"


@pytest.mark.parametrize("frame, gravity", [("enu", "−Z"), ("ned", "+Z")])
def test_the_level_table_names_where_gravity_points_in_its_frame(frame, gravity):
    table = _tables(_measured_section(frame))[0]
    assert table.title == (f"Level readings: what a level shows on each face (gravity along reference {gravity}, "
                           f"'down' in {frame.upper()})")


@pytest.mark.parametrize("frame, up_face", [("enu", "+Z"), ("ned", "-Z")])
def test_each_level_row_says_which_face_it_is_and_where_it_faces(frame, up_face):
    labels = {row.key[-3:-1]: row.label for row in _tables(_measured_section(frame))[0].rows}
    down_face = "-Z" if up_face == "+Z" else "+Z"
    # the bracket is 1° from the reference, so its Z faces are up and down, the others side faces (by hand)
    assert labels[up_face] == f"face {up_face}, facing up"
    assert labels[down_face] == f"face {down_face}, facing down"
    assert labels["+X"] == "face +X, facing side" and labels["-Y"] == "face -Y, facing side"


def test_slopes_name_a_side_face_from_plumb_and_an_up_face_from_level():
    section = _measured_section(shown=records.ReportUnits("deg", "mm/m"))
    slopes = _tables(section)[1]
    assert slopes.columns == ("face", "slope")
    rows = {row.key: row for row in slopes.rows}
    side, up = rows["mount[1].level_slope[+X]"], rows["mount[1].level_slope[+Z]"]
    assert side.label == "face +X, from plumb" and up.label == "face +Z, from level"
    # worked by hand: each leans 1°, and 1000·tan(1°) = 17.4550649 mm/m
    expected = 1000.0 * math.tan(math.radians(1.0))
    for row in (side, up):
        assert row.unit == "mm/m" and len(row.values) == 1
        assert float(row.values[0]) == pytest.approx(expected, rel=1e-8)
    assert rows["mount[1].level_slope[+Y]"].values == ("0",)      # the +Y normal stays horizontal: plumb (by hand)


def test_in_degrees_there_is_no_slope_table():
    assert len(_tables(_measured_section())) == 1


def test_a_sequence_without_trade_names_is_labelled_without_them():
    plain = _measured_section(preferences=Preferences(sequence="ZXZ"))
    named = _measured_section()
    figures = {i.key: i for i in plain.items if isinstance(i, records.Figure)}
    assert figures["mount[1].angles"].label == "Angles Z-X′-Z″ intrinsic"
    figures = {i.key: i for i in named.items if isinstance(i, records.Figure)}
    assert figures["mount[1].angles"].label == "Angles Z-Y′-X″ intrinsic (yaw, pitch, roll)"


def test_a_mounts_notes_are_printed_on_one_line():
    nominal = bracket_record(bracket_session(notes="Shimmed   at the\nleft foot\t(invented)")).sections[1]
    lines = [i for i in nominal.items if isinstance(i, str)]
    assert lines[-1] == "Notes: Shimmed at the left foot (invented)"       # whitespace runs become one space
    assert None not in nominal.items


def test_a_mount_without_notes_prints_no_notes_line():
    nominal = bracket_record(bracket_session(notes="   ")).sections[1]
    assert not any(isinstance(i, str) and i.startswith("Notes") for i in nominal.items)
