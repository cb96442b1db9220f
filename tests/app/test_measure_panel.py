"""Measure panel, driven through real widget events: clipboard paste into the table, typing in cells,
mouse clicks on Fit and Make mount. Check values come from SciPy's Rotation (a reference library)."""

import re

import numpy as np
import pytest
from PySide6.QtCore import Qt
from PySide6.QtGui import QGuiApplication
from PySide6.QtWidgets import QFileDialog, QLineEdit
from scipy.spatial.transform import Rotation

from app.panels.measure_fit import DIRECTIONS, POINTS, THREE_POINTS
from app.panels.measure_panel import MeasurePanel
from app.panels.measure_table import FLAGGED_ROW

# An invented bracket: eight datum points on a 120 x 80 x 40 mm part (body frame, mm).
NOMINAL = np.array([[0, 0, 0], [120, 0, 0], [120, 80, 0], [0, 80, 0],
                    [0, 0, 40], [120, 0, 40], [60, 80, 40], [30, 40, 20]], dtype=float)
ROTATION = Rotation.from_euler("ZYX", [31.5, -12.25, 7.75], degrees=True)   # SciPy: the known answer
TRANSLATION = np.array([512.5, -140.25, 960.0])


@pytest.fixture
def panel(qtbot, model):
    widget = MeasurePanel(model)
    qtbot.addWidget(widget)
    widget.resize(1100, 750)
    widget.show()
    qtbot.waitExposed(widget)
    widget.activateWindow()            # keyboard focus, so a cell editor commits on Return as for a person
    qtbot.waitUntil(widget.isActiveWindow, timeout=2000)
    return widget


def spreadsheet_text(nominal, measured, names=True):
    """What a spreadsheet puts on the clipboard: a header row, tab-separated cells, one row per line."""
    lines = ["point\tnom x\tnom y\tnom z\tmeas x\tmeas y\tmeas z"]
    for i, (p, q) in enumerate(zip(nominal, measured), start=1):
        cells = ([f"P{i}"] if names else []) + [repr(float(v)) for v in (*p, *q)]
        lines.append("\t".join(cells))
    return "\n".join(lines) + "\n"


def click_cell(qtbot, table, row, column):
    rect = table.visualItemRect(table.item(row, column))
    qtbot.mouseClick(table.viewport(), Qt.MouseButton.LeftButton, pos=rect.center())


def paste_into(qtbot, table, text, row=0, column=0):
    QGuiApplication.clipboard().setText(text)
    click_cell(qtbot, table, row, column)
    qtbot.keyClick(table, Qt.Key.Key_V, Qt.KeyboardModifier.ControlModifier)


def click(qtbot, button):
    qtbot.mouseClick(button, Qt.MouseButton.LeftButton)


def table_numbers(table, rows, columns):
    return np.array([[float(table.item(r, c).text()) for c in columns] for r in rows])


def shown_vector(panel, label):
    """The numbers the result box shows on the line starting with `label`."""
    line = next(l for l in panel.result_text.toPlainText().splitlines() if l.startswith(label))
    return np.array([float(v) for v in re.findall(r"-?\d+(?:\.\d+)?(?:e-?\d+)?", line.split(":", 1)[1])])


def test_spreadsheet_paste_fills_the_rows_with_the_numbers_as_given(qtbot, panel):
    table = panel.current_table()
    measured = ROTATION.apply(NOMINAL) + TRANSLATION
    text = spreadsheet_text(NOMINAL, measured).replace("-", "\u2212")   # a Unicode minus, as some sheets copy
    paste_into(qtbot, table, text)
    assert table.rowCount() == len(NOMINAL)              # the table grew from six rows to eight
    np.testing.assert_array_equal(table_numbers(table, range(8), range(3)), NOMINAL)
    np.testing.assert_array_equal(table_numbers(table, range(8), range(3, 6)), measured)
    assert all(table.item(r, 6).text() == "" for r in range(8))   # weight left blank (= 1)


def test_paste_at_a_cell_fills_from_that_column_on(qtbot, panel):
    table = panel.current_table()
    paste_into(qtbot, table, "1.5\t-2.25\t3\n", row=2, column=3)
    assert [table.item(2, c).text() for c in range(3, 6)] == ["1.5", "-2.25", "3"]   # as written
    assert all(table.item(2, c).text() == "" for c in range(3))


def test_noise_free_points_give_back_the_rotation_to_1e_9(qtbot, panel):
    measured = ROTATION.apply(NOMINAL) + TRANSLATION          # SciPy rotates the nominal points
    paste_into(qtbot, panel.current_table(), spreadsheet_text(NOMINAL, measured))
    with qtbot.waitSignal(panel.fit_changed) as signal:
        click(qtbot, panel.fit_button)
    fit = signal.args[0]
    assert fit is panel.last_fit and fit.method == POINTS
    # Reference: SciPy's Rotation; the same orientation to 1e-9 (matrix elements and angle between).
    np.testing.assert_allclose(fit.orientation.as_matrix(), ROTATION.as_matrix(), atol=1e-9)
    w, x, y, z = fit.orientation.as_quaternion()
    assert (Rotation.from_quat([x, y, z, w]).inv() * ROTATION).magnitude() < 1e-9
    np.testing.assert_allclose(fit.translation, TRANSLATION, atol=1e-9)
    np.testing.assert_allclose(fit.fitted, measured, atol=1e-9)
    # What the panel shows: the quaternion to its nine significant digits, w first and w >= 0
    # (CONVENTIONS.md canonical form), and residuals that read as zero.
    expected = ROTATION.as_quat(scalar_first=True)
    expected = expected if expected[0] >= 0 else -expected
    np.testing.assert_allclose(shown_vector(panel, "Quaternion"), expected, atol=5e-9)
    assert [row[0] for row in panel.current_table().output_texts()] == ["0"] * 8
    assert panel.make_mount_button.isEnabled()


def test_one_displaced_point_is_flagged_in_its_row(qtbot, panel):
    rng = np.random.default_rng(7)
    measured = ROTATION.apply(NOMINAL) + TRANSLATION + rng.normal(scale=0.01, size=NOMINAL.shape)
    measured[5] += [0.0, 0.8, -0.6]                           # a point 1 mm off (a probe slip)
    paste_into(qtbot, panel.current_table(), spreadsheet_text(NOMINAL, measured))
    click(qtbot, panel.fit_button)
    table = panel.current_table()
    flags = [row[1] for row in table.output_texts()]
    assert [i for i, f in enumerate(flags) if f == "flagged"] == [5]
    assert table.item(5, 0).background().color() == FLAGGED_ROW
    assert table.item(4, 0).background().color() != FLAGGED_ROW
    assert "row(s) 6" in panel.result_text.toPlainText()     # rows are numbered from 1 for people
    assert float(table.item(5, 7).text()) > 0.5


def test_collinear_points_are_refused_and_the_table_is_unchanged(qtbot, panel):
    line = np.array([[0, 0, 0], [10, 20, 30], [20, 40, 60], [35, 70, 105], [50, 100, 150]], dtype=float)
    paste_into(qtbot, panel.current_table(), spreadsheet_text(line, ROTATION.apply(line)))
    before = panel.current_table().input_texts()
    with qtbot.assertNotEmitted(panel.fit_changed):
        click(qtbot, panel.fit_button)
    assert "Not fitted" in panel.message.text() and "one line" in panel.message.text()
    assert panel.current_table().input_texts() == before
    assert not panel.make_mount_button.isEnabled()
    assert panel.result_text.toPlainText() == "" and panel.last_fit is None


def test_a_cell_typed_with_a_decimal_comma_is_named_and_nothing_is_fitted(qtbot, panel):
    measured = ROTATION.apply(NOMINAL) + TRANSLATION
    table = panel.current_table()
    paste_into(qtbot, table, spreadsheet_text(NOMINAL, measured))
    click_cell(qtbot, table, 1, 1)
    qtbot.keyClick(table, Qt.Key.Key_F2)                      # start editing, as a person would
    editor = next(e for e in table.findChildren(QLineEdit) if e.isVisible())
    editor.selectAll()
    qtbot.keyClicks(editor, "1,5")
    qtbot.keyClick(editor, Qt.Key.Key_Return)
    qtbot.waitUntil(lambda: table.state() != table.State.EditingState)   # Qt commits on the next loop turn
    assert table.item(1, 1).text() == "1,5"
    click(qtbot, panel.fit_button)
    text = panel.message.text()
    assert "row 2, Nominal y" in text and "decimal point" in text
    assert table.item(1, 1).text() == "1,5"                   # the user's text stays for them to fix


def test_pasted_decimal_commas_are_refused_and_the_table_is_unchanged(qtbot, panel):
    table = panel.current_table()
    before = table.input_texts()
    paste_into(qtbot, table, "1,5\t2,5\t3,5\t1,5\t2,5\t3,5\n")
    assert "decimal comma" in panel.message.text()
    assert table.input_texts() == before


def test_make_mount_adds_a_mount_and_undo_removes_it(qtbot, panel, model):
    measured = ROTATION.apply(NOMINAL) + TRANSLATION
    paste_into(qtbot, panel.current_table(), spreadsheet_text(NOMINAL, measured))
    click(qtbot, panel.fit_button)
    count = len(model.mounts)
    qtbot.keyClicks(panel.mount_name, "Camera bracket as measured")
    click(qtbot, panel.make_mount_button)
    assert len(model.mounts) == count + 1
    made = model.mounts[-1]
    assert made.name == "Camera bracket as measured"
    assert made.orientation.isclose(panel.last_fit.orientation)
    model.undo()
    assert len(model.mounts) == count
    assert all(m.name != "Camera bracket as measured" for m in model.mounts)


def test_editing_after_a_fit_withdraws_it(qtbot, panel):
    measured = ROTATION.apply(NOMINAL) + TRANSLATION
    table = panel.current_table()
    paste_into(qtbot, table, spreadsheet_text(NOMINAL, measured))
    click(qtbot, panel.fit_button)
    with qtbot.waitSignal(panel.fit_changed) as signal:
        paste_into(qtbot, table, "7\n", row=0, column=6)
    assert signal.args == [None]
    assert not panel.make_mount_button.isEnabled()
    assert all(row == ["", ""] for row in table.output_texts())


def test_csv_import_reads_named_columns_and_ignores_others(qtbot, panel, tmp_path, monkeypatch):
    measured = ROTATION.apply(NOMINAL) + TRANSLATION
    lines = ["Point,Nominal X [mm],Nominal Y [mm],Nominal Z [mm],Measured X [mm],Measured Y [mm],"
             "Measured Z [mm],Weight,Operator"]
    lines += [",".join([f"P{i}"] + [repr(float(v)) for v in (*p, *q)] + ["2" if i == 3 else "", "AB"])
              for i, (p, q) in enumerate(zip(NOMINAL, measured), start=1)]
    path = tmp_path / "bracket points.csv"
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")
    monkeypatch.setattr(QFileDialog, "getOpenFileName", lambda *a, **k: (str(path), ""))
    click(qtbot, panel.import_button)
    table = panel.current_table()
    assert table.rowCount() == 8
    np.testing.assert_array_equal(table_numbers(table, range(8), range(3, 6)), measured)
    assert table.item(2, 6).text() == "2.0" and table.item(0, 6).text() == ""
    assert "Point" in panel.message.text() and "Operator" in panel.message.text()
    click(qtbot, panel.fit_button)
    np.testing.assert_allclose(panel.last_fit.orientation.as_matrix(), ROTATION.as_matrix(), atol=1e-9)


def test_csv_without_a_measured_column_is_refused_naming_it(qtbot, panel, tmp_path, monkeypatch):
    path = tmp_path / "short.csv"
    path.write_text("nominal_x,nominal_y,nominal_z,measured_x,measured_y\n1,2,3,4,5\n", encoding="utf-8")
    monkeypatch.setattr(QFileDialog, "getOpenFileName", lambda *a, **k: (str(path), ""))
    before = panel.current_table().input_texts()
    click(qtbot, panel.import_button)
    assert "Measured z" in panel.message.text() and "unchanged" in panel.message.text()
    assert panel.current_table().input_texts() == before


def test_three_datum_points_give_the_body_frame(qtbot, panel):
    panel.set_method(THREE_POINTS)
    origin = np.array([250.0, 40.0, -15.0])
    # The body origin, a point 100 mm along body +X and one in the body XY plane on the +Y side, each
    # placed in the reference frame with SciPy's rotation.
    points = origin + ROTATION.apply([[0, 0, 0], [100, 0, 0], [35, 60, 0]])
    QGuiApplication.clipboard().setText("\n".join("\t".join(repr(float(v)) for v in p) for p in points))
    click_cell(qtbot, panel.current_table(), 0, 0)
    click(qtbot, panel.paste_button)
    click(qtbot, panel.fit_button)
    np.testing.assert_allclose(panel.last_fit.orientation.as_matrix(), ROTATION.as_matrix(), atol=1e-12)
    np.testing.assert_allclose(shown_vector(panel, "Body origin"), origin, atol=1e-9)


def test_three_datum_points_on_one_line_are_refused(qtbot, panel):
    panel.set_method(THREE_POINTS)
    paste_into(qtbot, panel.current_table(), "0\t0\t0\n10\t0\t0\n20\t0\t0\n")
    click(qtbot, panel.fit_button)
    assert "not determined" in panel.message.text() and panel.last_fit is None


def test_two_directions_use_triad_and_match_the_first_exactly(qtbot, panel):
    panel.set_method(DIRECTIONS)
    body = np.array([[0.0, 0.0, 1.0], [1.0, 0.0, 0.0]])       # 'down' as the part sees it, its boresight
    reference = ROTATION.apply(body)                          # SciPy: where they point in the reference frame
    reference[1] = Rotation.from_rotvec([0.0, 0.0, 0.002]).apply(reference[1])   # a sight 0.11° off
    paste_into(qtbot, panel.current_table(), "\n".join(
        "\t".join(repr(float(v)) for v in (*b, *r)) for b, r in zip(body, reference)))
    click(qtbot, panel.fit_button)
    fit = panel.last_fit
    assert fit.fit.method == "TRIAD"
    np.testing.assert_allclose(fit.orientation.apply(body[0]), reference[0], atol=1e-12)
    assert panel.current_table().output_texts()[0][0] == "0"
    # TRIAD keeps the second direction in the plane of the pair, 90° from the first, so its residual is
    # the measured pair angle's departure from 90° (worked out here with plain numpy).
    measured_pair = np.degrees(np.arccos(reference[0] @ reference[1] / np.linalg.norm(reference[1])))
    assert float(panel.current_table().output_texts()[1][0]) == pytest.approx(abs(measured_pair - 90), rel=1e-3)
    assert fit.per_row[1] == pytest.approx(abs(measured_pair - 90), abs=1e-9)


def test_three_directions_match_scipy_align_vectors(qtbot, panel):
    panel.set_method(DIRECTIONS)
    rng = np.random.default_rng(3)
    body = np.array([[0.0, 0.0, 1.0], [1.0, 0.0, 0.0], [0.0, 0.6, 0.8]])
    reference = ROTATION.apply(body) + rng.normal(scale=1e-3, size=(3, 3))
    weights = np.array([1.0, 2.0, 0.5])
    paste_into(qtbot, panel.current_table(), "\n".join(
        "\t".join(repr(float(v)) for v in (*b, *r, w)) for b, r, w in zip(body, reference, weights)))
    click(qtbot, panel.fit_button)
    # Reference: SciPy's Rotation.align_vectors solves the same weighted problem (on unit vectors).
    unit = reference / np.linalg.norm(reference, axis=1)[:, None]
    expected, _ = Rotation.align_vectors(unit, body, weights=weights)
    np.testing.assert_allclose(panel.last_fit.orientation.as_matrix(), expected.as_matrix(), atol=1e-12)
    assert "least squares" in panel.result_text.toPlainText()


def test_the_fit_uncertainty_becomes_the_checks_in_one_undo_step(qtbot, panel, model):
    from core import operations
    from core.session import SavedCheck
    from core.uncertainty import point_fit_standard_uncertainty
    rng = np.random.default_rng(11)
    measured = ROTATION.apply(NOMINAL) + TRANSLATION + rng.normal(scale=0.02, size=NOMINAL.shape)
    paste_into(qtbot, panel.current_table(), spreadsheet_text(NOMINAL, measured))
    click(qtbot, panel.fit_button)
    assert "Standard uncertainty of the orientation" in panel.result_text.toPlainText()
    assert panel.use_uncertainty_button.isEnabled()
    click(qtbot, panel.use_uncertainty_button)                 # no check yet: refused, nothing changes
    assert model.check.adjustment.uncertainty_deg is None and "measured mount" in panel.message.text()
    model.apply(operations.set_check, SavedCheck(nominal=model.mounts[0].name, measured=model.mounts[1].name))
    steps = model.undo_stack.count()
    click(qtbot, panel.use_uncertainty_button)
    fit = panel.last_fit.fit
    want, _ = point_fit_standard_uncertainty(NOMINAL, fit.orientation, fit.residuals)
    assert model.check.adjustment.uncertainty_deg == pytest.approx(want, rel=1e-12)
    # the covariance goes with it (degrees²), so each figure gets its own u: Cov(δ) = σ² H⁻¹ by hand here,
    # H = Σ |cᵢ|² I − cᵢ cᵢᵀ of the centred nominal points turned by the fit, σ² = Σ|rᵢ|² / (3n − 6)
    c = fit.orientation.apply(NOMINAL - NOMINAL.mean(axis=0))
    h = np.sum(c * c) * np.eye(3) - c.T @ c
    sigma2 = np.sum(fit.residuals ** 2) / (3 * len(NOMINAL) - 6)
    np.testing.assert_allclose(model.check.adjustment.covariance_deg2, sigma2 * np.linalg.inv(h) * (180 / np.pi) ** 2,
                               rtol=1e-9)
    assert model.undo_stack.count() == steps + 1
    model.undo_stack.undo()
    assert model.check.adjustment.uncertainty_deg is None and model.check.adjustment.covariance_deg2 is None


def test_four_directions_give_the_quest_uncertainty_and_two_give_none(qtbot, panel):
    panel.set_method(DIRECTIONS)
    rng = np.random.default_rng(5)
    body = np.array([[0.0, 0.0, 1.0], [1.0, 0.0, 0.0], [0.0, 0.6, 0.8], [0.6, 0.8, 0.0]])
    reference = ROTATION.apply(body) + rng.normal(scale=1e-3, size=(4, 3))
    paste_into(qtbot, panel.current_table(), "\n".join(
        "\t".join(repr(float(v)) for v in (*b, *r)) for b, r in zip(body, reference)))
    click(qtbot, panel.fit_button)
    fit = panel.last_fit
    # Shuster & Oh (1981), as worked here: P = σ² (Σ (I − rᵢ rᵢᵀ))⁻¹ with σ² = Σ θᵢ² / (2n − 3) from the
    # residual angles θᵢ, rᵢ the measured unit directions
    unit = reference / np.linalg.norm(reference, axis=1)[:, None]
    sigma2 = np.sum(np.radians(fit.fit.residual_angles_deg) ** 2) / (2 * 4 - 3)
    expected = sigma2 * np.linalg.inv(sum(np.eye(3) - np.outer(r, r) for r in unit))
    np.testing.assert_allclose(fit.covariance_rad2, expected, rtol=1e-9)
    assert fit.uncertainty_deg == pytest.approx(np.degrees(np.sqrt(np.linalg.eigvalsh(expected).max())), rel=1e-9)
    assert "QUEST covariance" in panel.result_text.toPlainText() and panel.use_uncertainty_button.isEnabled()
    # two directions (TRIAD) leave one degree of freedom: no uncertainty from so little
    panel.current_table().clear_inputs()
    paste_into(qtbot, panel.current_table(), "\n".join(
        "\t".join(repr(float(v)) for v in (*b, *r)) for b, r in zip(body[:2], reference[:2])))
    click(qtbot, panel.fit_button)
    assert panel.last_fit.uncertainty_deg is None and not panel.use_uncertainty_button.isEnabled()
