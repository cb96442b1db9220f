"""Angles in the trade's units in the window: the one preference (the toolbar's "Angles in") shows every
angle field in that unit, and any angle field reads a number with its own unit mark, converts it on
commit and says how it read it. Values checked against SciPy's Rotation; unit factors from their
definitions (SI Brochure Table 4; 400 gon and 6400 NATO mils to a turn)."""

import math

import numpy as np
import pytest
from PySide6.QtCore import Qt
from scipy.spatial.transform import Rotation

from tests.app.window_driver import type_into


def _choose_units(qtbot, window, key):
    box = window.units_box
    index = box.findData(key)
    assert index >= 0, key
    box.setFocus()
    box.setCurrentIndex(index)
    box.activated.emit(index)          # what a user's pick in the list sends
    qtbot.waitUntil(lambda: window.model.preferences.angle_units == key, timeout=2000)


def _quaternion(window):
    return window.model.current_orientation().as_quaternion()


def _same(q, rotation):
    expected = rotation.as_quat(scalar_first=True)
    assert min(np.abs(q - expected).max(), np.abs(q + expected).max()) < 1e-9


@pytest.mark.parametrize("size", [(1280, 800), (1920, 1080)])
def test_every_angle_unit_is_offered_and_the_editors_show_it(qtbot, window, size):
    window.resize(*size)
    keys = [window.units_box.itemData(i) for i in range(window.units_box.count())]
    assert keys == ["deg", "rad", "mrad", "arcmin", "arcsec", "gon", "mil"]
    yaw_deg = window.model.current_orientation().as_angles("ZYX", intrinsic=True).angles[0]
    _choose_units(qtbot, window, "mrad")
    shown = float(window.angles.fields[0].text())
    assert shown == pytest.approx(math.radians(yaw_deg) * 1e3, rel=1e-6)   # 1 mrad = 1e-3 rad
    assert window.angles.title() == "Angles, mrad" and "mrad" not in window.angles.labels[0].text()
    _choose_units(qtbot, window, "gon")
    assert float(window.angles.fields[0].text()) == pytest.approx(yaw_deg / 0.9, rel=1e-6)


def test_typing_in_milliradians_sets_the_orientation(qtbot, window):
    _choose_units(qtbot, window, "mrad")
    for field, text in zip(window.angles.fields, ("30", "20", "10")):
        type_into(qtbot, field, text)
    qtbot.keyClick(window.angles.fields[2].lineEdit(), Qt.Key.Key_Return)
    # SciPy: intrinsic yaw, pitch, roll ("ZYX" upper case) of 30, 20, 10 mrad
    _same(_quaternion(window), Rotation.from_euler("ZYX", [0.030, 0.020, 0.010]))


@pytest.mark.parametrize("typed, degrees", [("0.5 mrad", math.degrees(0.0005)), ("30″", 30 / 3600),
                                            ("1°30′", 1.5), ("2 gon", 1.8), ("12 arcsec", 12 / 3600)])
def test_a_field_reads_a_number_with_its_unit_mark_and_says_so(qtbot, window, typed, degrees):
    fields = window.angles.fields
    for field, text in zip(fields, ("0", "0", "0")):
        type_into(qtbot, field, text)
    type_into(qtbot, fields[0], typed)
    qtbot.keyClick(fields[0].lineEdit(), Qt.Key.Key_Return)
    _same(_quaternion(window), Rotation.from_euler("ZYX", [degrees, 0, 0], degrees=True))
    assert float(fields[0].text()) == pytest.approx(degrees, rel=1e-8)     # 9 digits, in the field's unit
    assert window.angles.note.text().startswith("Read ")
    assert typed.replace(" ", "") in window.angles.note.text().replace(" ", "")


@pytest.mark.parametrize("typed, says", [("1° 2 gon", "mixes"), ("0.5 mm", "not an angle unit"),
                                         ("1′ 2′", "twice")])
def test_a_bad_unit_mark_is_refused_and_the_last_good_value_kept(qtbot, window, typed, says):
    before = window.model.current_orientation()
    field = window.angles.fields[0]
    type_into(qtbot, field, typed)
    assert field.problem is not None and says in field.problem
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Return)
    assert window.model.current_orientation() == before


def test_the_axis_and_angle_editor_reads_marks_on_the_angle_only(qtbot, window):
    editor = window.axis_angle
    for field, text in zip(editor.axis_fields, ("0", "0", "1")):
        type_into(qtbot, field, text)
    type_into(qtbot, editor.angle_field, "90′")
    qtbot.keyClick(editor.angle_field.lineEdit(), Qt.Key.Key_Return)
    _same(_quaternion(window), Rotation.from_rotvec([0, 0, math.radians(1.5)]))
    type_into(qtbot, editor.axis_fields[0], "1 mrad")          # an axis component has no unit
    assert editor.axis_fields[0].problem is not None
