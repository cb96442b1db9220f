"""The Gibbs vector and MRP editors, shown from View ▸ Gibbs vector and MRP editors and driven by real key
events at a laptop size (1280×800): typing in one updates the others (checked against SciPy's
Rotation.from_mrp / as_mrp), the Gibbs editor says in words that the vector is infinite at a half turn and
refuses typed vectors that long, and Copy as from either writes that representation."""

import numpy as np
import pytest
from PySide6.QtCore import QPoint, QRect
from scipy.spatial.transform import Rotation

from app import copy_as
from core.decode import decode
from core.orientation import Orientation
from tests.app.window_driver import assert_editors_agree, leave_editor, scipy_rotation, type_into


@pytest.fixture
def shown(qtbot, window):
    window.resize(1280, 800)
    qtbot.waitUntil(lambda: (window.width(), window.height()) == (1280, 800), timeout=3000)
    window.parameters_action.trigger()              # View ▸ Gibbs vector and MRP editors, as a person would
    qtbot.waitUntil(lambda: all(e.isVisible() for e in window.parameter_editors), timeout=2000)
    qtbot.wait(50)
    return window


@pytest.fixture
def win(shown):
    shown.model.set_preferences(significant_digits=15)  # enough digits to compare at 1e-9
    return shown


def gibbs(window):
    return window.parameter_editors[0]


def mrp(window):
    return window.parameter_editors[1]


def test_the_editors_are_hidden_until_asked_for_and_then_shown_whole_inside_the_window(qtbot, shown):
    win = shown
    fields = [f for editor in win.parameter_editors for f in editor.fields]
    # once the editors' row has taken the height it needs (the window fits it after the layout settles)
    qtbot.waitUntil(lambda: all(f.visibleRegion().boundingRect() == f.rect() for f in fields), timeout=3000)
    for field in fields:
        inside = QRect(field.mapTo(win, QPoint(0, 0)), field.size())
        assert win.rect().contains(inside)
    assert win.scene.view.height() >= 250, win.scene.view.height()     # the Scene keeps most of its height
    win.parameters_action.trigger()
    assert not any(e.isVisible() for e in win.parameter_editors)


def test_typing_mrps_updates_every_other_editor_as_scipy_reads_them(qtbot, win):
    p = [0.1, -0.25, 0.4]
    for field, text in zip(mrp(win).fields, map(str, p)):
        type_into(qtbot, field, text)
    # SciPy's Rotation.from_mrp reads the same numbers
    assert_editors_agree(win, Rotation.from_mrp(p))
    np.testing.assert_allclose([float(f.text()) for f in gibbs(win).fields],
                               Rotation.from_mrp(p).as_quat()[:3] / Rotation.from_mrp(p).as_quat()[3], atol=1e-9)
    assert [f.text() for f in mrp(win).fields] == ["0.1", "-0.25", "0.4"]      # the typed spelling stays


def test_a_typed_shadow_set_is_read_and_shown_as_its_short_twin_on_leaving(qtbot, win):
    shadow = -np.array([0.1, -0.25, 0.4]) / np.dot([0.1, -0.25, 0.4], [0.1, -0.25, 0.4])
    for field, value in zip(mrp(win).fields, shadow):
        type_into(qtbot, field, repr(float(value)))
    assert "shadow" in mrp(win).note.text()
    leave_editor(qtbot, win)
    # SciPy's as_mrp gives the set with |p| <= 1
    np.testing.assert_allclose([float(f.text()) for f in mrp(win).fields], Rotation.from_mrp(shadow).as_mrp(),
                               atol=1e-9)


def test_typing_a_gibbs_vector_agrees_with_the_handbook_formula(qtbot, win):
    # Shuster (1993), "A Survey of Attitude Representations": g = n tan(φ/2); here φ = 90° about z
    for field, text in zip(gibbs(win).fields, ("0", "0", "1")):
        type_into(qtbot, field, text)
    assert_editors_agree(win, Rotation.from_rotvec([0, 0, np.pi / 2]))


def test_the_gibbs_editor_says_infinite_at_a_half_turn_instead_of_numbers(qtbot, win):
    win.model.set_orientation(Orientation.from_axis_angle((1, 0, 0), 180))
    qtbot.wait(20)
    editor = gibbs(win)
    assert "infinite" in editor.note.text() and "half turn" in editor.note.text()
    assert all(f.text() == "" and not f.isEnabled() for f in editor.fields)
    np.testing.assert_allclose([float(f.text()) for f in mrp(win).fields], [1, 0, 0], atol=1e-12)
    # near a half turn: words, not a number of eleven digits
    win.model.set_orientation(Orientation.from_axis_angle((0, 1, 0), 179.99))
    qtbot.wait(20)
    assert "within" in editor.note.text() and all(f.text() == "" for f in editor.fields)
    win.model.set_orientation(Orientation.from_axis_angle((0, 1, 0), 170))
    qtbot.wait(20)
    assert all(f.isEnabled() for f in editor.fields)
    assert float(editor.fields[1].text()) == pytest.approx(np.tan(np.radians(85)), rel=1e-12)   # tan(φ/2)


@pytest.mark.parametrize("text", ["5000", "1e300", "nan", "inf", "1e400", "abc"])
def test_a_hostile_gibbs_vector_is_refused_and_the_last_good_value_kept(qtbot, win, text):
    before = win.model.current_orientation()
    type_into(qtbot, gibbs(win).fields[0], text)
    assert gibbs(win).fields[0].problem is not None
    assert win.model.current_orientation().isclose(before, atol=1e-12)
    assert "Not used" in gibbs(win).note.text()


def test_copy_as_from_the_parameter_editors_writes_their_representation(qtbot, win):
    win.model.set_orientation(Orientation.from_axis_angle((1, 2, 3), 100))
    for editor, caption, kind in ((gibbs(win), "Gibbs vector", "gibbs"), (mrp(win), "Modified Rodrigues", "mrp")):
        type_into(qtbot, editor.fields[0], editor.fields[0].text())
        leave_editor(qtbot, win)
        win.current_editor = editor          # the editor stays "the one in use", as for the other editors
        result = copy_as.copy_to_clipboard(win.model, "text", win.current_editor)
        assert result.verified and result.text.startswith(caption), result.text
        # pasted back without hints it reads first as what was copied
        reading = decode(result.text)[0]
        assert reading.kind == kind
        assert scipy_rotation(reading.orientation).approx_equal(scipy_rotation(win.model.current_orientation()),
                                                                atol=1e-12)


def test_the_overlay_can_write_either_set(qtbot, win):
    from app.scene import overlay_text
    o = Orientation.from_axis_angle((0, 0, 1), 90)
    assert overlay_text.representation_lines(o, "mrp") == ["p = n tan(\u03c6/4) (0.0000, 0.0000, 0.4142)"]
    assert overlay_text.representation_lines(o, "gibbs") == ["g = n tan(\u03c6/2) (0.0000, 0.0000, 1.0000)"]
    half = Orientation.from_axis_angle((0, 0, 1), 180)
    assert "infinite" in overlay_text.representation_lines(half, "gibbs")[0]
    assert overlay_text.representation_lines(o, "rotation vector") == \
        overlay_text.representation_lines(o, "rotation-vector")        # the earlier spelling still reads
