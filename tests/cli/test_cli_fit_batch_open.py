"""`framewright fit`, `batch` and `open` through a subprocess: exit codes, the one stderr line, the JSON
keys. No Qt and no display. Fitted values are checked against SciPy's Rotation.align_vectors, a
general-purpose reference library (named beside each check)."""

import csv
import json
import sys
from pathlib import Path

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from tests.cli.test_cli import ROOT, framewright

FIT_KEYS = {"points", "unit", "matrix", "quaternion_wxyz", "axis", "angle_deg", "rotation_vector_deg", "sequence",
            "intrinsic", "angles_deg", "gimbal_margin_deg", "translation", "rms", "worst_row", "flag_threshold",
            "flagged_rows", "residuals", "notes"}
HEADER = "nominal_x,nominal_y,nominal_z,measured_x,measured_y,measured_z"


def write_points(path, nominal, measured, header=HEADER, extra=None):
    lines = [header] + [",".join(repr(float(v)) for v in (*p, *q)) + ("" if extra is None else f",{extra[i]}")
                        for i, (p, q) in enumerate(zip(nominal, measured))]
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")
    return path


@pytest.fixture
def noisy_points(tmp_path):
    rng = np.random.default_rng(7)
    nominal = rng.uniform(-80, 80, (12, 3))
    rotation = Rotation.from_euler("ZYX", [37, -14, 8], degrees=True)
    translation = np.array([410.0, -25.0, 130.0])
    measured = rotation.apply(nominal) + translation + rng.normal(0, 0.02, nominal.shape)
    return nominal, measured, write_points(tmp_path / "points.csv", nominal, measured)


def test_fit_json_matches_scipy_align_vectors(noisy_points):
    nominal, measured, path = noisy_points
    result = framewright("fit", str(path), "--json")
    assert result.returncode == 0 and result.stderr == ""
    data = json.loads(result.stdout)
    assert FIT_KEYS <= set(data)
    # Reference: SciPy's Rotation.align_vectors on the centred point sets (a general-purpose reference
    # library; it solves the same least-squares rotation, Kabsch).
    p_mean, q_mean = nominal.mean(axis=0), measured.mean(axis=0)
    reference, _ = Rotation.align_vectors(measured - q_mean, nominal - p_mean)
    np.testing.assert_allclose(data["matrix"], reference.as_matrix(), atol=1e-12)
    np.testing.assert_allclose(data["translation"], q_mean - reference.apply(p_mean), atol=1e-9)
    expected_residuals = measured - (reference.apply(nominal) + q_mean - reference.apply(p_mean))
    np.testing.assert_allclose([r["residual"] for r in data["residuals"]], expected_residuals, atol=1e-9)
    distances = np.linalg.norm(expected_residuals, axis=1)
    np.testing.assert_allclose([r["distance"] for r in data["residuals"]], distances, atol=1e-9)
    assert data["rms"] == pytest.approx(np.sqrt(np.mean(distances ** 2)), abs=1e-12)
    assert [r["row"] for r in data["residuals"]] == list(range(1, 13))
    assert data["worst_row"] == int(np.argmax(distances)) + 1
    # every representation of the same rotation, against SciPy (uppercase = intrinsic)
    np.testing.assert_allclose(data["angles_deg"], reference.as_euler("ZYX", degrees=True), atol=1e-9)
    np.testing.assert_allclose(data["rotation_vector_deg"], reference.as_rotvec(degrees=True), atol=1e-9)
    q = reference.as_quat(scalar_first=True, canonical=True)
    np.testing.assert_allclose(data["quaternion_wxyz"], q, atol=1e-12)


def test_fit_text_names_every_representation_and_lists_a_flagged_point(tmp_path):
    rng = np.random.default_rng(3)
    nominal = rng.uniform(-50, 50, (8, 3))
    measured = Rotation.from_rotvec([0.1, 0.2, -0.3]).apply(nominal) + [5.0, 6.0, 7.0] + rng.normal(0, 0.01, (8, 3))
    measured[5] += [0.5, -0.4, 0.3]                                   # one badly picked point
    path = write_points(tmp_path / "p.csv", nominal, measured)
    result = framewright("fit", str(path))
    assert result.returncode == 0, result.stderr
    text = result.stdout
    for words in ("quaternion (w, x, y, z):", "matrix (body -> reference):", "axis (", "rotation vector (deg):",
                  "angles Z-Y'-X'' intrinsic (deg):", "translation t (reference frame, mm):", "RMS residual",
                  "flagged (residual above"):
        assert words in text, words
    row6 = next(line for line in text.splitlines() if line.strip().startswith("6 "))
    assert row6.endswith("flagged")
    assert framewright("fit", str(path), "--json", "--unit", "in").stdout.count('"unit": "in"') == 1


def test_fit_reads_the_headers_the_measure_panel_accepts(tmp_path):
    # 'Measured X [mm]' style titles, a name column and a weight column; rows from SciPy as above.
    nominal = np.array([[0, 0, 0], [100, 0, 0], [0, 60, 0], [0, 0, 40.0]])
    rotation = Rotation.from_euler("xyz", [5, 10, 15], degrees=True)
    measured = rotation.apply(nominal) + 1.0
    header = "Point,Nominal X [mm],Nominal Y [mm],Nominal Z [mm],Measured X [mm],Measured Y [mm],Measured Z [mm],Weight"
    lines = [header] + [f"P{i},{','.join(map(repr, p))},{','.join(map(repr, q))},1" for i, (p, q)
                        in enumerate(zip(nominal.tolist(), measured.tolist()), 1)]
    path = tmp_path / "panel.csv"
    path.write_text("\n".join(lines) + "\n")
    data = json.loads(framewright("fit", str(path), "--json").stdout)
    np.testing.assert_allclose(data["matrix"], rotation.as_matrix(), atol=1e-12)   # SciPy, extrinsic xyz
    assert any("Point" in note for note in data["notes"])


@pytest.mark.parametrize("content, words", [
    (HEADER + "\n0,0,0,0,0,0\n1,0,0,1,0,0\n2,0,0,2,0,0\n3,0,0,3,0,0\n", "lie on one line"),
    (HEADER + "\n0,0,0,0,0,0\n10,0,0,-10,0,0\n0,10,0,0,10,0\n0,0,10,0,0,10\n", "mirror image"),
    (HEADER + "\n0,0,0,0,0,0\n1,0,0,1,0,0\n0,1,0,0,abc,0\n", "line 4, column 'measured_y'"),
    ("nominal_x,nominal_y,measured_x,measured_y,measured_z\n1,2,3,4,5\n", "no column for Nominal z"),
    (HEADER + "\n0,0,0,0,0,0\n1,0,0,1,0\n", "line 3, column 'measured_z': empty"),
])
def test_refused_points_exit_2_with_one_line_naming_the_problem(tmp_path, content, words):
    path = tmp_path / "bad.csv"
    path.write_text(content)
    result = framewright("fit", str(path))
    assert result.returncode == 2 and result.stdout == ""
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith(f"framewright fit: {path}: ") and words in lines[0], lines


def test_fit_of_a_missing_or_binary_file_is_refused(tmp_path):
    missing = framewright("fit", str(tmp_path / "none.csv"))
    assert missing.returncode == 2 and "cannot be read" in missing.stderr and missing.stderr.count("\n") == 1
    binary = tmp_path / "b.csv"
    binary.write_bytes(b"\xff\xfe\x00\x01")
    result = framewright("fit", str(binary))
    assert result.returncode == 2 and "not a text file" in result.stderr


def test_demo_points_fit_flags_the_point_said_to_be_bad():
    data = json.loads(framewright("fit", "resources/demo_points.csv", "--json").stdout)
    assert data["points"] == 9 and data["flagged_rows"] == [4]


# ---- batch ------------------------------------------------------------------------------------------

def write_batch(path, rows):
    with open(path, "w", newline="") as handle:
        out = csv.writer(handle)
        out.writerow(["name", "nominal_yaw[deg]", "nominal_pitch", "nominal_roll", "measured_qw", "measured_qx",
                      "measured_qy", "measured_qz"])
        for name, ypr, rotation in rows:
            out.writerow([name, *ypr, *rotation.as_quat(scalar_first=True)])
    return path


def test_batch_exit_status_follows_the_tolerance_and_writes_results(tmp_path):
    nominal = [(10, 5, 0), (-40, 2, 1)]
    # measured: 0.3° and 0.8° about a tilted axis away from each nominal (SciPy composes them)
    turns = [Rotation.from_rotvec(np.radians(a) * np.array([0.6, 0, 0.8])) for a in (0.3, 0.8)]
    rows = [(f"m{i}", ypr, Rotation.from_euler("ZYX", ypr, degrees=True) * turn)
            for i, (ypr, turn) in enumerate(zip(nominal, turns))]
    path = write_batch(tmp_path / "b.csv", rows)
    out = tmp_path / "result.csv"
    inside = framewright("batch", str(path), "--tolerance", "1")
    outside = framewright("batch", str(path), "--tolerance", "0.5", "--out", str(out))
    assert (inside.returncode, outside.returncode) == (0, 1)
    assert inside.stderr == outside.stderr == ""
    assert "2 mounts, 0 outside" in inside.stdout and "2 mounts, 1 outside" in outside.stdout
    m1 = next(line for line in outside.stdout.splitlines() if line.startswith("m1"))
    assert "FAIL" in m1 and "0.8000" in m1
    written = list(csv.DictReader(out.open()))
    assert [r["result"] for r in written] == ["pass", "fail"]
    # D = Nᵀ M (CONVENTIONS.md): its angle is the turn applied above, computed by SciPy
    assert [float(r["total_deviation_deg"]) for r in written] == pytest.approx(
        [np.degrees(t.magnitude()) for t in turns], abs=1e-8)


def test_batch_refuses_a_bad_cell_naming_row_and_column(tmp_path):
    path = tmp_path / "b.csv"
    path.write_text("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,"
                    "measured_qz\nok,1,0,0,0,1,0,0,0\nbad,1,0,0,0,1,0,zero,0\n")
    result = framewright("batch", str(path), "--tolerance", "1", "--out", str(tmp_path / "r.csv"))
    assert result.returncode == 2 and result.stdout == ""
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and "row 2" in lines[0] and "'measured_qy'" in lines[0] and "line 3" in lines[0]
    assert not (tmp_path / "r.csv").exists()          # nothing partial is written


@pytest.mark.parametrize("args, words", [(("--tolerance", "-1"), "--tolerance"),
                                         (("--tolerance", "1", "--out", "SAME"), "input file")])
def test_batch_refuses_bad_options(tmp_path, args, words):
    path = write_batch(tmp_path / "b.csv", [("a", (0, 0, 0), Rotation.identity())])
    args = [str(path) if a == "SAME" else a for a in args]
    result = framewright("batch", str(path), *args)
    assert result.returncode == 2 and words in result.stderr and result.stderr.count("\n") == 1


def test_demo_batch_has_one_mount_outside_half_a_degree():
    result = framewright("batch", "resources/demo_batch.csv", "--tolerance", "0.5")
    assert result.returncode == 1 and "5 mounts, 1 outside" in result.stdout


# ---- open -------------------------------------------------------------------------------------------

@pytest.mark.parametrize("content", [b"{not json", b'{"format": "other", "version": 1}', b""])
def test_open_of_a_damaged_file_is_one_stderr_line_and_exit_2_without_a_window(tmp_path, content):
    path = tmp_path / "bad.fwsession.json"
    path.write_bytes(content)
    result = framewright("open", str(path))        # no display here: a window would fail, not hang
    assert result.returncode == 2 and result.stdout == ""
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("framewright open: ") and str(path) in lines[0]


def test_open_hands_a_good_file_to_the_window(monkeypatch):
    # In-process with a stand-in window module, so no display (and no Qt) is needed.
    import types
    import app
    import app.main
    calls = []
    fake = types.ModuleType("app.window")
    fake.run_window = lambda path=None: calls.append(path) or 0
    monkeypatch.setitem(sys.modules, "app.window", fake)
    monkeypatch.setattr(app, "window", fake, raising=False)
    demo = str(ROOT / "resources" / "demo.fwsession.json")
    assert app.main.main(["open", demo]) == 0 and calls == [demo]


def test_help_names_the_new_verbs():
    text = framewright("--help").stdout
    assert all(verb in text for verb in ("fit", "batch", "open"))


def test_fit_reports_the_orientations_standard_uncertainty(noisy_points):
    # The covariance itself is checked against hand-worked values and a Monte Carlo in
    # tests/core/test_uncertainty.py; here: the command line carries it, largest at least every axis.
    _, _, path = noisy_points
    data = json.loads(framewright("fit", str(path), "--json").stdout)
    assert data["uncertainty_deg"] > 0 and len(data["uncertainty_axes_deg"]) == 3
    assert data["uncertainty_deg"] >= max(data["uncertainty_axes_deg"]) - 1e-15
    text = framewright("fit", str(path)).stdout
    assert "standard uncertainty of the orientation (from the residuals)" in text
