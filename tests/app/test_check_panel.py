"""Check panel through real typing and clicks: a known 0.5° shim against a 0.3° and a 1.0° pointing
tolerance, the nominal as the Scene's ghost while the measured mount is shown, undo, and mount renames.

Check values: SciPy's Rotation (a reference library) for the pointing error and the total deviation;
the shim is a hand-worked case: a 0.5° turn about body Y tips body +X by exactly 0.5° and leaves no roll
about it."""

import numpy as np
import pytest
from PySide6.QtCore import Qt
from scipy.spatial.transform import Rotation

from app.panels.check_panel import CheckPanel
from core.orientation import Orientation
from tests.app.window_driver import canonical_wxyz, click_side_tab, scipy_rotation, type_into

SHIM_DEG = 0.5


def orientation_of(rotation):
    return Orientation.from_quaternion(canonical_wxyz(rotation))


@pytest.fixture
def shimmed(model):
    """The demo's radar antenna as nominal, and a copy measured with a 0.5° shim under one foot."""
    nominal_index = 3
    model.select(nominal_index)
    model.duplicate_mount()
    model.rename_mount(nominal_index + 1, "Radar antenna, as measured")
    nominal = scipy_rotation(model.mounts[nominal_index].orientation)
    measured = nominal * Rotation.from_rotvec([0, np.radians(SHIM_DEG), 0])     # about the body Y axis
    model.set_orientation(orientation_of(measured))
    model.select(0)
    return model.mounts[nominal_index].name, "Radar antenna, as measured", nominal, measured


@pytest.fixture
def panel(qtbot, model):
    widget = CheckPanel(model)
    qtbot.addWidget(widget)
    widget.resize(420, 800)
    widget.show()
    qtbot.waitExposed(widget)
    widget.activateWindow()
    qtbot.waitUntil(widget.isActiveWindow, timeout=2000)
    return widget


def choose(box, data):
    """Pick an entry as a person does from the list (the combo's own 'activated' signal)."""
    index = box.findData(data)
    assert index >= 0, data
    box.setCurrentIndex(index)
    box.activated.emit(index)


def commit(qtbot, field, text):
    type_into(qtbot, field, text)
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Return)


def set_up_pointing_check(qtbot, panel, shimmed):
    nominal_name, measured_name, _, _ = shimmed
    choose(panel.nominal_box, nominal_name)
    choose(panel.measured_box, measured_name)
    choose(panel.mode_box, "pointing_and_roll")
    choose(panel.axis_box, "+X")


def test_a_half_degree_shim_fails_a_0_3_pointing_tolerance_and_passes_1_0(qtbot, panel, model, shimmed):
    _, _, nominal, measured = shimmed
    set_up_pointing_check(qtbot, panel, shimmed)
    # SciPy: the angle between where +X should point and where it does
    a, b = nominal.apply([1, 0, 0]), measured.apply([1, 0, 0])
    pointing = np.degrees(np.arctan2(np.linalg.norm(np.cross(a, b)), np.dot(a, b)))
    assert pointing == pytest.approx(SHIM_DEG, abs=1e-12)                     # hand-worked: the shim angle
    total = np.degrees((nominal.inv() * measured).magnitude())

    commit(qtbot, panel.pointing_field, "0.3")
    assert model.check.settings.pointing_tolerance_deg == 0.3
    assert panel.verdict.text() == "FAIL"
    assert f"Margin {-0.2:+.3f}".replace("-", "\u2212") in panel.margin_label.text()
    assert f"Pointing error of body +X: {pointing:.3f}°" in panel.details.text()
    assert f"Total deviation: {total:.3f}°" in panel.details.text()
    assert "Roll about body +X: 0.000°" in panel.details.text()

    commit(qtbot, panel.pointing_field, "1.0")
    assert panel.verdict.text() == "PASS"
    assert "Margin +0.500°" in panel.margin_label.text()      # pointing 1.0 − 0.5; the roll margin is 1.0

    # each tolerance change was one undo step
    model.undo()
    assert model.check.settings.pointing_tolerance_deg == 0.3 and panel.verdict.text() == "FAIL"
    assert panel.pointing_field.text() == "0.3"


def test_total_deviation_mode_and_its_axis(qtbot, panel, model, shimmed):
    nominal_name, measured_name, nominal, measured = shimmed
    choose(panel.nominal_box, nominal_name)
    choose(panel.measured_box, measured_name)
    commit(qtbot, panel.total_field, "0.45")
    assert panel.verdict.text() == "FAIL"
    commit(qtbot, panel.total_field, "0.5")                   # equal to the value: passes (core/check.py)
    assert panel.verdict.text() == "PASS"
    # the axis of D = Nᵀ M in nominal body axes: SciPy's rotation vector of nominal⁻¹ · measured
    rv = (nominal.inv() * measured).as_rotvec()
    axis = rv / np.linalg.norm(rv)
    assert f"({axis[0]:.4f}, {axis[1]:.4f}, {axis[2]:.4f})".replace("-0.0000", "0.0000") in panel.details.text()


def test_bad_tolerance_text_is_refused_and_the_last_good_value_kept(qtbot, panel, model, shimmed):
    set_up_pointing_check(qtbot, panel, shimmed)
    before = model.check.settings
    commit(qtbot, panel.pointing_field, "0,3")
    assert panel.pointing_field.problem is not None and "'.'" in panel.pointing_field.problem
    commit(qtbot, panel.roll_field, "-1")
    # the reason is said under the tolerances, not under the body axis field
    assert "0 < tolerance ≤ 180°" in panel.tolerance_note.text() and panel.message.text() == ""
    commit(qtbot, panel.roll_field, "1e308")      # would pass anything: refused, not shown in 300 digits
    assert "0 < tolerance ≤ 180°" in panel.tolerance_note.text() and len(panel.tolerance_note.text()) < 300
    assert model.check.settings == before


@pytest.mark.parametrize("hostile", ["1e308", "0", "180.000001", "9" * 400, "nan"])
def test_a_tolerance_outside_zero_to_180_degrees_is_refused_without_spilling_its_digits(
        qtbot, panel, model, shimmed, hostile):
    # 0 < t ≤ 180°: no two orientations are more than 180° apart (common practice: the largest rotation
    # angle between two orientations is 180°), so a larger tolerance could never fail.
    set_up_pointing_check(qtbot, panel, shimmed)
    before = model.check.settings
    commit(qtbot, panel.pointing_field, hostile)
    assert model.check.settings == before
    assert panel.pointing_field.problem is not None
    note = panel.tolerance_note.text()
    assert note and len(note) < 160, note           # the reason is said, briefly: no 300-digit number
    assert len(panel.margin_label.text()) < 120 and len(panel.details.text()) < 1200
    assert panel.tolerance_note.isVisible()


def test_a_tolerance_of_exactly_180_degrees_is_accepted(qtbot, panel, model, shimmed):
    set_up_pointing_check(qtbot, panel, shimmed)
    commit(qtbot, panel.pointing_field, "180")
    assert model.check.settings.pointing_tolerance_deg == 180.0 and panel.tolerance_note.text() == ""


def test_the_scene_ghost_is_the_nominal_while_the_measured_mount_is_shown(qtbot, window):
    model = window.model
    click_side_tab(qtbot, window, "Check")   # the person works in the Check tab
    panel = window.check_panel
    nominal = model.mounts[3]
    model.select(3)
    model.duplicate_mount()
    model.set_orientation(nominal.orientation @ Orientation.from_axis_angle((0, 1, 0), SHIM_DEG))
    measured = model.current_mount()
    model.select(0)
    choose(panel.nominal_box, nominal.name)
    choose(panel.measured_box, measured.name)
    # choosing the measured mount shows it, with the nominal as the ghost
    assert model.current_mount().name == measured.name
    assert window.scene.orientation() == measured.orientation
    assert window.scene._ghost == nominal.orientation
    assert window.scene._ghost_label == f"nominal, {nominal.name}"
    assert model.ghost_label() == f"nominal, {nominal.name}"
    # another mount selected: no second orientation, the ghost is the reference again
    model.select(0)
    assert model.ghost_orientation() is None
    assert window.scene._ghost == Orientation.identity() and window.scene._ghost_label == "reference"
    qtbot.mouseClick(panel.show_button, Qt.MouseButton.LeftButton)
    assert model.current_mount().name == measured.name and window.scene._ghost == nominal.orientation


def test_renaming_a_checked_mount_renames_it_in_the_check_in_one_undo_step(qtbot, panel, model, shimmed):
    nominal_name, measured_name, _, _ = shimmed
    set_up_pointing_check(qtbot, panel, shimmed)
    steps = model.undo_stack.count()
    model.rename_mount(3, "Radar, nominal")
    assert model.check.nominal == "Radar, nominal" and model.undo_stack.count() == steps + 1
    assert panel.nominal_box.currentText() == "Radar, nominal"
    model.undo()
    assert model.check.nominal == nominal_name and model.mounts[3].name == nominal_name
    # a deleted nominal leaves the check waiting, saying so; undo brings it back
    model.delete_mount(3)
    assert panel.verdict.text() == "—" and "(no such mount)" in panel.nominal_box.currentText()
    model.undo()
    assert panel.verdict.text() in ("PASS", "FAIL")


def test_the_verdict_states_the_iso_14253_1_decision_once_an_uncertainty_is_typed(qtbot, panel, model, shimmed):
    """ISO 14253-1: conforms when the figure is at most T − U, does not conform beyond T + U, otherwise the
    measurement cannot decide (U = k·u). Our cases: a pointing error of 0.5° (the hand-worked shim) and
    the roll of 0 against tolerances of 1° or 0.3°."""
    from app.panels.adjust_panel import AdjustPanel
    from tests.app.test_adjust_panel import type_and_enter
    set_up_pointing_check(qtbot, panel, shimmed)
    commit(qtbot, panel.pointing_field, "1.0")
    assert panel.verdict.text() == "PASS"
    assert "No measurement uncertainty was given" in panel.decision_words.text()
    adjust = AdjustPanel(model)
    qtbot.addWidget(adjust)
    adjust.show()
    qtbot.waitExposed(adjust)
    type_and_enter(qtbot, adjust.uncertainty_field, "0.1")          # U = 0.2: 0.5 <= 1 − 0.2
    assert panel.decision_words.text().startswith("ISO 14253-1 decision: conforms (u = 0.100°, k = 2, U = 0.200°)")
    type_and_enter(qtbot, adjust.uncertainty_field, "0.3")          # U = 0.6: 1 − 0.6 < 0.5 <= 1 + 0.6
    assert panel.verdict.text() == "PASS"
    assert "cannot decide within the measurement uncertainty" in panel.decision_words.text()
    commit(qtbot, panel.pointing_field, "0.3")                       # 0.5 <= 0.3 + 0.6: still undecided
    assert panel.verdict.text() == "FAIL" and "cannot decide" in panel.decision_words.text()
    type_and_enter(qtbot, adjust.uncertainty_field, "0.05")         # U = 0.1: 0.5 > 0.3 + 0.1
    assert "decision: does not conform" in panel.decision_words.text()
    model.undo()
    model.undo()
    model.undo()
    model.undo()
    assert model.check.adjustment.uncertainty_deg is None
    assert "No measurement uncertainty was given" in panel.decision_words.text()
