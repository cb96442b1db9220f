"""The command line through a subprocess: exit codes, the one stderr line, the JSON keys. Needs no Qt
and no display. Values are checked against SciPy's Rotation (named beside each check)."""

import json
import os
import subprocess
import sys
from pathlib import Path

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

ROOT = Path(__file__).resolve().parents[2]
READING_KEYS = {"kind", "conventions", "matrix", "quaternion_wxyz", "axis", "angle_deg", "rotation_vector_deg",
                "sequence", "intrinsic", "angles_deg", "gimbal_margin_deg", "orthogonality_error", "notes"}


def framewright(*args, stdin=""):
    env = {**os.environ, "PYTHONPATH": str(ROOT), "QT_QPA_PLATFORM": "offscreen"}
    env.pop("DISPLAY", None)
    return subprocess.run([sys.executable, "-m", "app.main", *args], input=stdin, capture_output=True,
                          text=True, cwd=ROOT, env=env, timeout=60)


def test_decode_prints_the_best_reading_and_exits_0():
    result = framewright("decode", "0 0 1 90")
    assert result.returncode == 0 and result.stderr == ""
    assert result.stdout.startswith("Reading 1 of ")
    assert "axis (0, 0, 1), angle 90 deg" in result.stdout
    assert "--all" in result.stdout


def test_decode_json_has_the_promised_keys_and_scipy_values():
    result = framewright("decode", "yaw 30, pitch 20, roll 10", "--json")
    assert result.returncode == 0
    data = json.loads(result.stdout)
    assert READING_KEYS <= set(data)
    assert isinstance(data["conventions"], dict) and isinstance(data["notes"], list)
    assert data["orthogonality_error"] is None
    expected = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True)            # SciPy, intrinsic ZYX
    assert np.allclose(data["matrix"], expected.as_matrix(), atol=1e-12)
    assert np.allclose(data["quaternion_wxyz"], expected.as_quat(scalar_first=True, canonical=True), atol=1e-12)
    assert np.allclose(data["rotation_vector_deg"], expected.as_rotvec(degrees=True), atol=1e-10)
    assert data["sequence"] == "ZYX" and data["intrinsic"] is True
    assert np.allclose(data["angles_deg"], [30, 20, 10], atol=1e-10)
    assert data["gimbal_margin_deg"] == pytest.approx(70, abs=1e-9)


def test_angles_are_shown_in_the_inputs_own_sequence_unless_told_otherwise():
    own = json.loads(framewright("decode", "extrinsic XYZ: 10 20 30", "--json").stdout)
    assert (own["sequence"], own["intrinsic"]) == ("XYZ", False)
    assert np.allclose(own["angles_deg"], [10, 20, 30], atol=1e-10)
    default = json.loads(framewright("decode", "axis: 1 2 3, angle: 40", "--json").stdout)
    assert (default["sequence"], default["intrinsic"]) == ("ZYX", True)
    told = json.loads(framewright("decode", "axis: 1 2 3, angle: 40", "--json", "--sequence", "ZXZ",
                                  "--extrinsic").stdout)
    assert (told["sequence"], told["intrinsic"]) == ("ZXZ", False)
    # SciPy: lower case is extrinsic
    rotation = Rotation.from_rotvec(np.radians(40) * np.array([1, 2, 3]) / np.sqrt(14))
    assert np.allclose(default["angles_deg"], rotation.as_euler("ZYX", degrees=True), atol=1e-10)
    assert np.allclose(told["angles_deg"], rotation.as_euler("zxz", degrees=True), atol=1e-10)


def test_matrix_input_reports_its_orthogonality_error():
    data = json.loads(framewright("decode", "0.7071 -0.7071 0; 0.7071 0.7071 0; 0 0 1", "--json").stdout)
    assert data["kind"] == "matrix" and 1e-5 < data["orthogonality_error"] < 5e-5


def test_all_lists_every_reading_best_first():
    data = json.loads(framewright("decode", "0.5 0.25 0.1", "--all", "--json").stdout)
    assert len(data["readings"]) > 2
    assert data["readings"][0]["conventions"] == data["conventions"]
    assert all(READING_KEYS <= set(r) for r in data["readings"])
    text = framewright("decode", "0.5 0.25 0.1", "--all").stdout
    assert text.count("Reading ") == len(data["readings"])


def test_options_narrow_to_one_reading():
    data = json.loads(framewright("decode", "0.3 0.4 0.5 0.7071", "--kind", "quaternion", "--scalar-last",
                                  "--all", "--json").stdout)
    assert len(data["readings"]) == 1
    # SciPy from_quat is scalar last
    assert np.allclose(data["matrix"], Rotation.from_quat([0.3, 0.4, 0.5, 0.7071]).as_matrix(), atol=1e-12)
    data = json.loads(framewright("decode", "1 0 0 0 0 -1 0 1 0", "--transposed", "--json").stdout)
    assert data["conventions"]["matrix"] == "reference-to-body"
    data = json.loads(framewright("decode", "0 0 1 1.5707963267948966", "--kind", "axis-angle", "--radians",
                                  "--json").stdout)
    assert data["angle_deg"] == pytest.approx(90, abs=1e-9)


def test_text_is_read_from_standard_input():
    result = framewright("decode", "-", "--json", stdin="Rotation matrix:\n1 0 0\n0 1 0\n0 0 1\n")
    assert result.returncode == 0 and json.loads(result.stdout)["angle_deg"] == 0
    assert framewright("decode", stdin="0 0 1 90").returncode == 0


@pytest.mark.parametrize("text, words", [
    ("1 2 3 4 5", "found 5 numbers"),
    ("1 0 0\n0 1.5 0\n0 0 1", "row 2"),
    ("1 0 0\n0 -1 0\n0 0 1", "reflection"),
    ("see drawing 4711-B", "found 1 number"),
    ("1/√2 0 0 1/√2", "expression"),
])
def test_refused_input_exits_2_with_one_stderr_line_and_no_stdout(text, words):
    result = framewright("decode", text)
    assert result.returncode == 2
    assert result.stdout == ""
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and words in lines[0] and lines[0].startswith("framewright decode: ")


def test_input_over_100_kB_is_refused():
    result = framewright("decode", "-", stdin="1 " * 60000)
    assert result.returncode == 2 and "bytes" in result.stderr and result.stdout == ""


def test_compare_prints_deviation_and_axis():
    result = framewright("compare", "yaw 30, pitch 20, roll 10", "yaw 30.5, pitch 20, roll 10")
    assert result.returncode == 0
    assert result.stdout.startswith("deviation: 0.5 deg about (")


def test_compare_json_and_exit_status_follow_the_tolerance():
    nominal, measured = "yaw 30, pitch 20, roll 10", "yaw 30.4, pitch 20.3, roll 10"
    inside = framewright("compare", nominal, measured, "--tolerance", "1", "--json")
    outside = framewright("compare", nominal, measured, "--tolerance", "0.2", "--json")
    assert (inside.returncode, outside.returncode) == (0, 1)
    a, b = json.loads(inside.stdout), json.loads(outside.stdout)
    assert {"deviation_deg", "axis", "within_tolerance"} <= set(a)
    assert a["within_tolerance"] is True and b["within_tolerance"] is False
    # D = Nᵀ M in nominal body axes (CONVENTIONS.md), computed with SciPy
    n = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True)
    m = Rotation.from_euler("ZYX", [30.4, 20.3, 10], degrees=True)
    d = n.inv() * m
    assert a["deviation_deg"] == pytest.approx(np.degrees(d.magnitude()), abs=1e-10)
    assert np.allclose(a["axis"], d.as_rotvec() / d.magnitude(), atol=1e-9)
    text = framewright("compare", nominal, measured, "--tolerance", "0.2").stdout
    assert "OUTSIDE tolerance" in text


def test_compare_with_options_applied_to_both_and_refused_input():
    ok = framewright("compare", "1 0 0 0", "0.9999 0.0141 0 0", "--kind", "quaternion", "--json")
    assert ok.returncode == 0 and json.loads(ok.stdout)["within_tolerance"] is None
    bad = framewright("compare", "1 0 0 0", "1 2", "--tolerance", "1")
    assert bad.returncode == 2 and bad.stdout == "" and bad.stderr.count("\n") == 1
    assert "measured" in bad.stderr
    both_stdin = framewright("compare", "-", "-")
    assert both_stdin.returncode == 2


def test_no_arguments_opens_the_window(monkeypatch):
    # In-process with a stand-in window module, so no display (and no Qt) is needed.
    import types
    import app
    import app.main
    calls = []
    fake = types.ModuleType("app.window")
    fake.run_window = lambda: calls.append("opened") or 0
    monkeypatch.setitem(sys.modules, "app.window", fake)
    monkeypatch.setattr(app, "window", fake, raising=False)
    monkeypatch.setenv("QT_QPA_PLATFORM", "offscreen")   # passes the display check without a display
    assert app.main.main([]) == 0 and calls == ["opened"]
    assert app.main.main(["decode", "1 0 0 0"]) == 0 and calls == ["opened"]   # a command opens no window


def test_help_works_and_names_the_verbs():
    result = framewright("--help")
    assert result.returncode == 0 and "decode" in result.stdout and "compare" in result.stdout


def test_cli_imports_no_qt():
    code = ("import sys, app.cli, app.main, core.decode, core.formats; "
            "print([m for m in sys.modules if m.startswith(('PySide6', 'shiboken6', 'pyqtgraph', 'OpenGL'))])")
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT,
                            env={**os.environ, "PYTHONPATH": str(ROOT)}, timeout=60)
    assert result.returncode == 0, result.stderr
    assert result.stdout.strip() == "[]"


def test_verbs_are_one_function_pair_each():
    from app import cli
    for name, (help_text, add_arguments, run) in cli.VERBS.items():
        assert callable(add_arguments) and callable(run) and help_text
        name = name.replace("-", "_")            # verify-report: add_verify_report_arguments
        assert add_arguments.__name__ == f"add_{name}_arguments" and run.__name__ == f"run_{name}"


def test_text_that_starts_with_a_minus_is_text_not_an_option():
    result = framewright("decode", "-0.5,0,0,0.8660254", "--kind", "quaternion", "--scalar-first", "--json")
    assert result.returncode == 0, result.stderr
    # SciPy, w first
    expected = Rotation.from_quat([-0.5, 0, 0, 0.8660254], scalar_first=True)
    assert np.allclose(json.loads(result.stdout)["matrix"], expected.as_matrix(), atol=1e-12)
    assert framewright("compare", "-30 20 10", "-30 20 10.1", "--tolerance", "1").returncode == 0


def test_decode_angle_first_and_axis_first_options_pick_the_layout():
    # issue 11: '0.785398 0 0 1' printed angle first; with every option there is one reading
    result = framewright("decode", "0.785398 0 0 1", "--kind", "axis-angle", "--radians", "--angle-first", "--json")
    assert result.returncode == 0 and result.stderr == ""
    data = json.loads(result.stdout)
    assert data["conventions"]["order"] == "angle, axis"
    expected = Rotation.from_rotvec([0, 0, 0.785398])                   # SciPy from_rotvec: angle times axis
    assert np.allclose(data["matrix"], expected.as_matrix(), atol=1e-12)
    other = framewright("decode", "0.785398 0 0 1", "--axis-first", "--degrees", "--json")
    assert json.loads(other.stdout)["conventions"]["order"] == "axis, angle"
