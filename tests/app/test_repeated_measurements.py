"""The Adjust tab's repeated measurements, as a technician uses them: the demo's radar antenna measured
three times (quaternions typed into the Quaternion editor), each kept with Add current; the mean, the
scatter and the uncertainty shown; every step undone and redone with Ctrl+Z / Ctrl+Y; saved and reopened.

The measurements are invented: the antenna 0.45° off its nominal about body Y, then small turns about
body X, Y and Z. Check values: SciPy's Rotation (`mean` for the average, `magnitude` for the angles eᵢ
to it); by hand from those angles the RMS scatter √(Σ eᵢ² / n) and the standard uncertainty of the mean
per axis √(Σ eᵢ² / (3 n (n − 1))) (equal weights: the Bessel-corrected scatter over n, shared by three
axes, as core/average.py defines it); the decision zones are ISO 14253-1's definitions."""

import math
import re

import numpy as np
import pytest
from PySide6.QtCore import Qt
from PySide6.QtWidgets import QFileDialog, QLabel
from scipy.spatial.transform import Rotation

from core import operations
from core.session import SavedCheck
from tests.app.window_driver import canonical_wxyz, focus, scipy_rotation, type_into

CTRL = Qt.KeyboardModifier.ControlModifier
RADAR = 3
OFF_DEG = 0.45
TURNS = ((0.12, (1, 0, 0)), (0.10, (0, 1, 0)), (-0.08, (0, 0, 1)))     # degrees about body axes


@pytest.fixture
def bench(qtbot, window):
    """The window on the Adjust tab, checking a copy of the radar antenna (selected) against it."""
    model = window.model
    model.select(RADAR)
    model.duplicate_mount()
    model.rename_mount(RADAR + 1, "Radar antenna, as measured")
    model.apply(operations.set_check, SavedCheck(model.mounts[RADAR].name, "Radar antenna, as measured"))
    model.undo_stack.clear()                     # the set-up is not what the tests undo
    tabs = window.side_tabs
    tabs.setCurrentIndex([tabs.tabText(i) for i in range(tabs.count())].index("Adjust"))
    qtbot.wait(20)
    nominal = scipy_rotation(model.mounts[RADAR].orientation)
    off = nominal * Rotation.from_rotvec([0, math.radians(OFF_DEG), 0])
    repeats = [off * Rotation.from_rotvec(math.radians(deg) * np.array(axis)) for deg, axis in TURNS]
    return window, window.adjust_panel.repeats, nominal, repeats


def click(qtbot, button):
    button.window().activateWindow()
    area = button.parentWidget()
    while area is not None and not hasattr(area, "ensureWidgetVisible"):
        area = area.parentWidget()
    if area is not None:
        area.ensureWidgetVisible(button)            # scrolled into view, as a person would
    assert button.isEnabled(), button.text()
    qtbot.mouseClick(button, Qt.MouseButton.LeftButton)


def type_quaternion(qtbot, window, rotation):
    for field, value in zip(window.quaternion.fields, canonical_wxyz(rotation)):
        type_into(qtbot, field, repr(float(value)))
    qtbot.keyClick(window.quaternion.fields[-1].lineEdit(), Qt.Key.Key_Return)


def add_each(qtbot, window, box, repeats):
    for rotation in repeats:
        type_quaternion(qtbot, window, rotation)
        click(qtbot, box.add_button)


def shown_numbers(label, title):
    """The numbers on the summary line that starts with `title`."""
    line = next(line for line in label.text().splitlines() if line.startswith(title))
    return np.array([float(v) for v in re.findall(r"-?\d+(?:\.\d+)?(?:e-?\d+)?", line.split(":", 1)[1])])


def press(qtbot, window, key):
    focus(qtbot, window.adjust_panel.repeats.list)
    qtbot.keyClick(window.adjust_panel.repeats.list, key, CTRL)


def test_three_typed_measurements_show_scipys_mean_and_the_hand_computed_scatter(qtbot, bench):
    window, box, nominal, repeats = bench
    add_each(qtbot, window, box, repeats)
    assert box.list.count() == 3 and "3 kept" in box.mount_label.text()
    mean = Rotation.concatenate(repeats).mean()                      # SciPy: Markley's eigenvector mean
    np.testing.assert_allclose(shown_numbers(box.summary_label, "Mean quaternion (w, x, y, z)"),
                               canonical_wxyz(mean), atol=2e-9, rtol=0)   # nine significant digits shown
    angles = np.degrees([(mean.inv() * r).magnitude() for r in repeats])  # SciPy: angle to the mean
    rms = math.sqrt(np.mean(angles ** 2))                                 # by hand
    u_mean = math.sqrt(np.sum(angles ** 2) / (3 * 3 * 2))                 # by hand, see the module note
    assert shown_numbers(box.summary_label, "RMS scatter")[0] == pytest.approx(rms, rel=1e-8)
    assert shown_numbers(box.summary_label, "Largest angle")[0] == pytest.approx(angles.max(), rel=1e-8)
    assert shown_numbers(box.summary_label, "Standard uncertainty")[0] == pytest.approx(u_mean, rel=1e-8)
    for i, angle in enumerate(angles):
        assert box.list.item(i).text().startswith(f"{i + 1}. typed: ")
        assert float(re.search(r"([\d.]+)° from the mean", box.list.item(i).text()).group(1)) == \
            pytest.approx(angle, rel=1e-8)
        assert "FAR" not in box.list.item(i).text()


def test_use_the_average_sets_the_orientation_and_every_editor_follows(qtbot, bench):
    window, box, nominal, repeats = bench
    add_each(qtbot, window, box, repeats)
    click(qtbot, box.average_button)
    mean = Rotation.concatenate(repeats).mean()                      # SciPy
    assert (scipy_rotation(window.model.current_orientation()).inv() * mean).magnitude() < 1e-14
    np.testing.assert_allclose([float(f.text()) for f in window.quaternion.fields], canonical_wxyz(mean),
                               atol=2e-9, rtol=0)
    assert "is 0° from the mean" in box.summary_label.text()
    press(qtbot, window, Qt.Key.Key_Z)
    assert (scipy_rotation(window.model.current_orientation()).inv() * repeats[-1]).magnitude() < 1e-14
    press(qtbot, window, Qt.Key.Key_Y)
    assert (scipy_rotation(window.model.current_orientation()).inv() * mean).magnitude() < 1e-14


def test_add_remove_and_clear_each_undo_and_redo_as_one_step(qtbot, bench):
    window, box, nominal, repeats = bench
    add_each(qtbot, window, box, repeats)
    kept = window.model.current_mount().measurements
    press(qtbot, window, Qt.Key.Key_Z)                               # the third Add current
    assert window.model.current_mount().measurements == kept[:2] and box.list.count() == 2
    press(qtbot, window, Qt.Key.Key_Y)
    assert window.model.current_mount().measurements == kept and box.list.count() == 3

    second = box.list.visualItemRect(box.list.item(1)).center()
    qtbot.mouseClick(box.list.viewport(), Qt.MouseButton.LeftButton, pos=second)
    assert box.list.currentRow() == 1
    click(qtbot, box.remove_button)
    assert window.model.current_mount().measurements == (kept[0], kept[2])
    assert box.list.item(1).text().startswith("2. typed")
    press(qtbot, window, Qt.Key.Key_Z)
    assert window.model.current_mount().measurements == kept
    press(qtbot, window, Qt.Key.Key_Y)
    assert window.model.current_mount().measurements == (kept[0], kept[2])
    press(qtbot, window, Qt.Key.Key_Z)

    click(qtbot, box.clear_button)
    assert window.model.current_mount().measurements == () and box.list.count() == 0
    assert not box.average_button.isEnabled() and box.summary_label.text() == ""
    press(qtbot, window, Qt.Key.Key_Z)
    assert window.model.current_mount().measurements == kept and box.list.count() == 3
    press(qtbot, window, Qt.Key.Key_Y)
    assert window.model.current_mount().measurements == ()


def test_the_scatter_as_the_uncertainty_changes_the_decision_shown(qtbot, bench):
    window, box, nominal, repeats = bench
    add_each(qtbot, window, box, repeats)
    click(qtbot, box.average_button)
    panel = window.adjust_panel
    mean = Rotation.concatenate(repeats).mean()                      # SciPy
    deviation = math.degrees((nominal.inv() * mean).magnitude())
    assert OFF_DEG < deviation < 0.5                                   # within the default 0.5° tolerance
    assert panel.decision_label.text().startswith("Conforms")
    assert "no measurement uncertainty was given" in panel.decision_label.text()
    click(qtbot, box.scatter_button)
    u = window.model.check.adjustment.uncertainty_deg
    angles = np.degrees([(mean.inv() * r).magnitude() for r in repeats])
    assert u == pytest.approx(math.sqrt(np.sum(angles ** 2) / 18), rel=1e-10)    # the mean's, by hand
    assert panel.uncertainty_field.text() == f"{u:g}" and "of the mean" in box.message.text()
    # ISO 14253-1: conformance needs d <= T − 2u; here 0.45° > 0.5° − 2u, and d <= T + 2u
    assert 0.5 - 2 * u < deviation <= 0.5 + 2 * u
    assert panel.decision_label.text().startswith("Cannot decide")
    press(qtbot, window, Qt.Key.Key_Z)
    assert window.model.check.adjustment.uncertainty_deg is None
    assert panel.decision_label.text().startswith("Conforms")


def test_the_scatter_is_refused_for_a_mount_the_check_does_not_measure(qtbot, bench):
    window, box, nominal, repeats = bench
    window.model.select(0)
    add_each(qtbot, window, box, repeats[:2] + [nominal])
    before = window.model.check
    click(qtbot, box.scatter_button)
    assert "measured mount is “Radar antenna, as measured”" in box.message.text()
    assert window.model.check == before


def test_a_measurement_far_from_the_others_is_marked(qtbot, bench):
    window, box, nominal, repeats = bench
    far = repeats[0] * Rotation.from_rotvec([0, 0, math.radians(1.0)])
    taken = repeats + [repeats[1] * Rotation.from_rotvec([math.radians(0.05), 0, 0]), far]
    # the premise by hand, with SciPy: the last one is over three scatters from the others' mean
    others = Rotation.concatenate(taken[:-1])
    others_mean = others.mean()
    scatter = math.sqrt(np.mean((others_mean.inv() * others).magnitude() ** 2))
    assert (others_mean.inv() * far).magnitude() > 3 * scatter
    add_each(qtbot, window, box, taken)
    texts = [box.list.item(i).text() for i in range(box.list.count())]
    assert "FAR: over 3 scatters from the others" in texts[-1]
    assert not any("FAR" in text for text in texts[:-1]) and "1 marked FAR" in box.mount_label.text()


def test_measurements_are_saved_and_reopened(qtbot, bench, tmp_path, monkeypatch):
    window, box, nominal, repeats = bench
    add_each(qtbot, window, box, repeats)
    kept = window.model.current_mount().measurements
    shown = box.summary_label.text()
    path = tmp_path / "radar.fwsession.json"
    monkeypatch.setattr(QFileDialog, "getSaveFileName", lambda *a, **k: (str(path), ""))
    monkeypatch.setattr(QFileDialog, "getOpenFileName", lambda *a, **k: (str(path), ""))
    press(qtbot, window, Qt.Key.Key_S)                               # File ▸ Save (as, the first time)
    assert path.exists() and window.model.undo_stack.isClean()
    press(qtbot, window, Qt.Key.Key_Z)
    press(qtbot, window, Qt.Key.Key_Z)                               # two fewer, unsaved
    window.model.undo_stack.setClean()                               # no "save changes?" question
    press(qtbot, window, Qt.Key.Key_O)                               # File ▸ Open
    assert window.model.current_mount().measurements == kept
    assert box.summary_label.text() == shown


def test_every_label_of_the_box_is_plain_text_so_a_mount_name_never_draws_as_markup(qtbot, bench):
    window, box, nominal, repeats = bench
    window.model.rename_mount(window.model.selected_index, "<b>ALL PASS</b>")
    assert "“<b>ALL PASS</b>”" in box.mount_label.text()
    for label in box.findChildren(QLabel):
        assert label.textFormat() == Qt.TextFormat.PlainText, label.text()


def test_a_scatter_in_roll_alone_widens_the_guard_band_of_the_roll_and_not_of_the_pointing(qtbot, bench):
    """Three measurements that differ only in roll about the boresight +X (invented: 0.3°, −0.2°, −0.1° about
    body X, the antenna 0.45° off in pointing). Their covariance, propagated to each figure, gives the
    pointing error no uncertainty and the roll all of it, so the check decides each by its own U where one u
    on every figure could not decide the pointing."""
    from core.check import CheckSettings
    window, box, nominal, _ = bench
    model = window.model
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+X", pointing_tolerance_deg=0.5,
                             roll_tolerance_deg=1.0)
    model.apply(operations.set_check, SavedCheck(model.mounts[RADAR].name, "Radar antenna, as measured",
                                                 settings=settings))
    off = nominal * Rotation.from_rotvec([0, math.radians(OFF_DEG), 0])
    repeats = [off * Rotation.from_rotvec([math.radians(d), 0, 0]) for d in (0.3, -0.2, -0.1)]
    add_each(qtbot, window, box, repeats)
    click(qtbot, box.average_button)
    click(qtbot, box.scatter_button)
    # by hand: every turn from the mean is about body X, so the mean's covariance in body axes is
    # diag(Σ eᵢ², 0, 0) / (n (n − 1)) = diag(0.14, 0, 0) / 6 deg²; in the reference frame M C Mᵀ (SciPy's M)
    mean = Rotation.concatenate(repeats).mean()
    matrix = mean.as_matrix()
    expected = matrix @ np.diag([0.14 / 6, 0, 0]) @ matrix.T
    np.testing.assert_allclose(model.check.adjustment.covariance_deg2, expected, atol=1e-9)
    u_roll = math.sqrt(0.14 / 6)
    text = window.adjust_panel.decision_label.text()
    # ISO 14253-1: pointing 0.45° <= 0.5° − 2·0 conforms; roll 0 <= 1° − 2·0.1528° conforms
    assert text.startswith("Conforms"), text
    assert f"roll 0.0000° against 1.0000°: conforms (U = {2 * u_roll:.3g}°" in text.replace("−", "-")
    assert "ISO 14253-1 decision: conforms" in window.check_panel.decision_words.text()
    # the one u typed by hand is the same about every axis: the pointing cannot be decided with it
    focus(qtbot, window.adjust_panel.uncertainty_field)
    window.adjust_panel.uncertainty_field.selectAll()
    qtbot.keyClicks(window.adjust_panel.uncertainty_field, f"{u_roll:.6f}")
    qtbot.keyClick(window.adjust_panel.uncertainty_field, Qt.Key.Key_Return)
    assert model.check.adjustment.covariance_deg2 is None
    assert window.adjust_panel.decision_label.text().startswith("Cannot decide")       # 0.45° > 0.5° − 0.31°
    press(qtbot, window, Qt.Key.Key_Z)
    np.testing.assert_allclose(model.check.adjustment.covariance_deg2, expected, atol=1e-9)
    assert window.adjust_panel.decision_label.text().startswith("Conforms")


def type_weight(qtbot, box, text):
    focus(qtbot, box.weight_field)
    box.weight_field.selectAll()
    qtbot.keyClicks(box.weight_field, text)


def test_a_weight_typed_before_add_counts_in_the_average_and_a_bad_weight_keeps_nothing(qtbot, bench):
    window, box, _, repeats = bench
    model = window.model
    add_each(qtbot, window, box, repeats[:2])
    type_quaternion(qtbot, window, repeats[2])
    type_weight(qtbot, box, "-2")
    click(qtbot, box.add_button)
    assert "weight" in box.message.text() and len(model.current_mount().measurements) == 2
    type_weight(qtbot, box, "3")
    click(qtbot, box.add_button)
    assert [m.weight for m in model.current_mount().measurements] == [1.0, 1.0, 3.0]
    # SciPy's weighted mean (Markley et al. 2007) of the same three
    expected = Rotation.concatenate(repeats).mean(weights=[1, 1, 3])
    np.testing.assert_allclose(shown_numbers(box.summary_label, "Mean quaternion (w, x, y, z)"),
                               canonical_wxyz(expected), atol=2e-9, rtol=0)
    assert "weight 3" in box.list.item(2).text()


def test_a_measurement_of_weight_0_is_not_counted_in_one_measurements_uncertainty(qtbot, bench):
    # Three measurements of weight 1 and the nominal kept with weight 0: the mean and its scatter are the
    # three's; away from the mean one measurement's u is the mean's times √3, not √4 (core/average.py:
    # the mean's covariance is one measurement's over the number that count).
    window, box, nominal, repeats = bench
    model = window.model
    add_each(qtbot, window, box, repeats)
    type_quaternion(qtbot, window, nominal)
    type_weight(qtbot, box, "0")
    click(qtbot, box.add_button)
    assert [m.weight for m in model.current_mount().measurements] == [1.0, 1.0, 1.0, 0.0]
    mean = Rotation.concatenate(repeats).mean()                      # SciPy, the three alone
    angles = np.degrees([(mean.inv() * r).magnitude() for r in repeats])
    u_mean = math.sqrt(np.sum(angles ** 2) / 18)                     # by hand, see the module note
    click(qtbot, box.scatter_button)
    assert "of one measurement" in box.message.text()
    assert model.check.adjustment.uncertainty_deg == pytest.approx(u_mean * math.sqrt(3), rel=1e-9)
    assert model.undo_stack.undoText() == "Use the scatter of 3 measurements as the uncertainty"
    click(qtbot, box.average_button)
    assert model.undo_stack.undoText() == "Use the average of 3 measurements of “Radar antenna, as measured”"
