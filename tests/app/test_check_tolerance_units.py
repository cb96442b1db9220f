"""A tolerance typed in the unit the drawing states (0.5 mrad, 90″, 1′30″) is judged in degrees and shown
in that unit again, the field remembering it, also through a saved session. The shim is the hand-worked
case of test_check_panel.py (a 0.5° turn about body Y: a 0.5° total deviation); the factors are the
definitions (SI Brochure Table 4: 1 mrad = 1e-3 rad, 1° = 3600″)."""

import math

import pytest
from PySide6.QtCore import Qt

from core.session import load_session, save_session
from tests.app.test_check_panel import SHIM_DEG, choose, panel, shimmed  # noqa: F401  (fixtures)
from tests.app.window_driver import type_into


def commit(qtbot, field, text):
    type_into(qtbot, field, text)
    qtbot.keyClick(field.lineEdit(), Qt.Key.Key_Return)


def _set_up(panel, shimmed):
    nominal, measured, _, _ = shimmed
    choose(panel.nominal_box, nominal)
    choose(panel.measured_box, measured)


@pytest.mark.parametrize("typed, degrees, unit, shown", [
    ("10 mrad", math.degrees(0.010), "mrad", "10"),          # 0.573° > 0.5°: passes
    ("8 mrad", math.degrees(0.008), "mrad", "8"),            # 0.458° < 0.5°: fails
    ("1800″", 0.5, "arcsec", "1800"),                          # exactly 0.5°: equal passes
    ("29′", 29 / 60, "arcmin", "29"),
    ("0°30′", 0.5, "dms", "0° 30′ 0.0″"),
])
def test_a_tolerance_with_its_unit_is_judged_in_degrees_and_shown_in_its_unit(qtbot, panel, shimmed, typed,
                                                                             degrees, unit, shown):
    _set_up(panel, shimmed)
    commit(qtbot, panel.total_field, typed)
    settings = panel.model.check.settings
    assert settings.total_tolerance_deg == pytest.approx(degrees, rel=1e-12)
    assert settings.unit_of("total") == unit
    assert panel.total_field.text() == shown
    assert "(" in panel.tolerance_labels["total"].text() and units_symbol(unit) in panel.tolerance_labels["total"].text()
    passes = SHIM_DEG <= degrees + 1e-12
    assert ("PASS" in panel.verdict_text()) == passes, panel.verdict_text()
    assert typed in panel.tolerance_note.text()


def units_symbol(unit):
    from core import units
    return units.ANGLE_UNITS[unit].symbol


def test_a_bare_number_takes_the_fields_unit_and_undo_brings_back_degrees(qtbot, panel, shimmed):
    _set_up(panel, shimmed)
    commit(qtbot, panel.total_field, "10 mrad")
    commit(qtbot, panel.total_field, "7")                    # 7 mrad, the field's unit now
    assert panel.model.check.settings.total_tolerance_deg == pytest.approx(math.degrees(0.007), rel=1e-12)
    panel.model.undo_stack.undo()
    panel.model.undo_stack.undo()
    assert panel.model.check.settings.unit_of("total") == "deg"
    assert panel.total_field.text() == "0.5"


def test_a_bad_tolerance_is_refused_and_the_last_good_one_kept(qtbot, panel, shimmed):
    _set_up(panel, shimmed)
    before = panel.model.check.settings
    for bad in ("1° 2 gon", "0.5 mm", "200°", "0 mrad"):
        commit(qtbot, panel.total_field, bad)
        assert panel.model.check.settings == before, bad
        assert panel.total_field.problem is not None


def test_the_stated_unit_is_kept_in_the_session_file(qtbot, panel, shimmed, tmp_path):
    _set_up(panel, shimmed)
    commit(qtbot, panel.total_field, "10 mrad")
    path = tmp_path / "units.fwsession.json"
    save_session(panel.model.session(), path)
    again = load_session(path)
    assert again.checks[0].settings.unit_of("total") == "mrad"
    assert again.checks[0].settings.total_tolerance_deg == pytest.approx(math.degrees(0.010), rel=1e-12)
