"""The record prints every representation the program has, the Gibbs vector and the modified Rodrigues
parameters too, with their conventions in the label; a half turn has no Gibbs vector and says so; a report
written before they were printed (record version 1) still verifies against its session."""

from dataclasses import replace

import pytest
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.orientation import Orientation
from core.record_values import RecordError, expected_figures
from tests.core.test_inspection_record import CHECK, SESSION, _figures


def test_every_mount_prints_its_gibbs_vector_and_mrp_as_scipy_gives_them():
    record = records.session_record(SESSION, "demo_check.fwsession.json", "0" * 64)
    figures = _figures(record)
    digits = SESSION.preferences.significant_digits
    checked = []
    for i, mount in enumerate(SESSION.mounts):
        q = mount.orientation.as_quaternion()
        scipy_rotation = Rotation.from_quat(q, scalar_first=True)
        # Gibbs vector g = (x, y, z) / w of the quaternion (Shuster 1993, "A survey of attitude
        # representations", the classical Rodrigues parameters); SciPy has no Gibbs reader.
        w, xyz = scipy_rotation.as_quat(scalar_first=True)[0], scipy_rotation.as_quat(scalar_first=True)[1:]
        # SciPy's Rotation.as_mrp: the set with |p| <= 1 (angle at most 180 deg).
        mrp = scipy_rotation.as_mrp()
        assert figures[f"mount[{i}].mrp"].values == records.printed_numbers(mrp, digits), mount.name
        assert figures[f"mount[{i}].mrp"].unit == "dimensionless"
        if abs(w) < 1e-12:        # the demo's wind sensor arm is a half turn: no Gibbs vector
            assert f"mount[{i}].gibbs" not in figures
            continue
        assert figures[f"mount[{i}].gibbs"].values == records.printed_numbers(xyz / w, digits), mount.name
        assert figures[f"mount[{i}].gibbs"].unit == "dimensionless"
        checked.append(i)
    assert len(checked) == len(SESSION.mounts) - 1
    label = figures["mount[0].gibbs"].label
    assert "tan(φ/2)" in label and "Gibbs" in label and "n the axis and φ the angle" in label
    label = figures["mount[0].mrp"].label
    assert "tan(φ/4)" in label and "at most 1" in label


# Where each representation of the registry is printed in a mount's part of the record.
SPECIAL_KEYS = {"matrix": ("matrix",), "quaternion": ("quaternion_wxyz",), "axis_angle": ("axis", "angle"),
                "angles": ("angles",)}


def test_every_representation_of_the_registry_is_in_the_record():
    # A representation added to core/representations.py without a line in the record fails here.
    from core import representations

    record = records.session_record(SESSION, "a", "0" * 64)
    keys = {f.key for f in record.figures()}
    for r in representations.ALL:
        for name in SPECIAL_KEYS.get(r.key, (r.key,)):
            assert f"mount[0].{name}" in keys, r.key


def test_a_check_record_prints_them_for_the_nominal_and_the_measured():
    record = records.check_record(SESSION, CHECK, "a", "0" * 64)
    names = [m.name for m in SESSION.mounts]
    saved = SESSION.checks[0]
    keys = {f.key for f in record.figures()}
    for name in (saved.nominal, saved.measured):
        assert {f"mount[{names.index(name)}].gibbs", f"mount[{names.index(name)}].mrp"} <= keys


def test_a_half_turn_has_no_gibbs_vector_and_the_record_says_so():
    half_turn = Orientation.from_axis_angle([0, 0, 1], 180)
    mounts = (replace(SESSION.mounts[0], orientation=half_turn),) + SESSION.mounts[1:]
    record = records.session_record(replace(SESSION, mounts=mounts, chains=(), checks=()), "a", "0" * 64)
    figures = _figures(record)
    assert "mount[0].gibbs" not in figures
    assert figures["mount[0].mrp"].values == ("0", "0", "1")      # n tan(45 deg) = n (from the formula)
    lines = [item for item in record.sections[0].items if isinstance(item, str)]
    assert any(line.startswith("Gibbs vector (classical Rodrigues parameters): ")
               and "infinite at a half turn" in line for line in lines), lines


def test_a_version_1_report_is_compared_without_the_figures_added_since():
    record = records.check_record(SESSION, CHECK, "a", "0" * 64)
    now = record.numbers()["figures"]
    old = [f for f in now if not f["key"].endswith((".gibbs", ".mrp"))]
    assert len(old) < len(now)
    assert records.first_difference(old, expected_figures(now, 1)) is None
    assert records.first_difference(old, expected_figures(now, 2)).endswith("is missing from the report")
    assert records.first_difference(now, expected_figures(now, 2)) is None
    with pytest.raises(RecordError, match="version 3"):
        expected_figures(now, 3)
    with pytest.raises(RecordError, match="version"):
        expected_figures(now, "2")


def test_the_record_is_version_2():
    assert records.check_record(SESSION, CHECK, "a", "0" * 64).numbers()["version"] == 2
