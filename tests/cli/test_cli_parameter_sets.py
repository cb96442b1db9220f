"""The command line with the two parameter sets: `decode --kind` takes any spelling of the registry, the
JSON and text outputs hold the Gibbs vector and the modified Rodrigues parameters (checked against SciPy's
Rotation.as_mrp / from_mrp), and `batch` reads gibbs_ / mrp_ columns."""

import io
import json

import numpy as np
from scipy.spatial.transform import Rotation

from app.cli import main


def run(*argv, stdin=""):
    out, err = io.StringIO(), io.StringIO()
    status = main(list(argv), io.StringIO(stdin), out, err)
    return status, out.getvalue(), err.getvalue()


def test_decode_reads_mrps_by_any_spelling_of_the_kind_and_prints_both_sets():
    for spelling in ("mrp", "MRP", "modified_rodrigues_parameters"):
        status, out, err = run("decode", "--kind", spelling, "--json", "0.1 -0.2 0.3")
        assert status == 0, err
        data = json.loads(out)
        assert data["kind"] == "mrp"
        np.testing.assert_allclose(data["mrp"], [0.1, -0.2, 0.3], atol=1e-12)
        want = Rotation.from_mrp([0.1, -0.2, 0.3])                          # SciPy's from_mrp
        np.testing.assert_allclose(data["quaternion_wxyz"], np.roll(want.as_quat(canonical=True), 1), atol=1e-12)
        x, y, z, w = want.as_quat(canonical=True)
        np.testing.assert_allclose(data["gibbs"], [x / w, y / w, z / w], atol=1e-12)   # g = (x, y, z) / w


def test_the_old_kind_spellings_still_work_and_an_unknown_one_is_refused():
    status, out, _ = run("decode", "--kind", "rotation_vector", "--radians", "--json", "0.1 0.2 0.3")
    assert status == 0 and json.loads(out)["kind"] == "rotation-vector"
    status, out, err = run("decode", "--kind", "spinor", "0.1 0.2 0.3")
    assert status == 2 and out == "" and "spinor" in err


def test_decode_text_says_the_gibbs_vector_is_infinite_at_a_half_turn():
    status, out, _ = run("decode", "--kind", "quaternion", "0 1 0 0")
    assert status == 0
    assert "Gibbs vector: infinite at a half turn" in out
    assert "modified Rodrigues parameters: 1, 0, 0" in out                  # |p| = tan(45°) = 1


def test_a_captioned_gibbs_vector_decodes_without_hints():
    status, out, _ = run("decode", "--json", "Gibbs vector: 0 0 1")
    data = json.loads(out)
    assert status == 0 and data["kind"] == "gibbs"
    assert abs(data["angle_deg"] - 90.0) < 1e-12           # |g| = tan(45°) = 1 (Shuster 1993)


def test_batch_checks_gibbs_against_mrp_columns(tmp_path):
    rotations = Rotation.random(20, random_state=8)
    q = rotations.as_quat()
    g = q[:, :3] / q[:, 3:]                                  # g = (x, y, z) / w (Shuster 1993)
    p = (rotations * Rotation.from_rotvec([0, 0, np.radians(0.5)])).as_mrp()   # 0.5° off, by SciPy
    lines = ["name,nominal_gibbs_x,nominal_gibbs_y,nominal_gibbs_z,measured_mrp_x,measured_mrp_y,measured_mrp_z"]
    lines += [f"m{i},{a[0]:.17g},{a[1]:.17g},{a[2]:.17g},{b[0]:.17g},{b[1]:.17g},{b[2]:.17g}" for i, (a, b) in enumerate(zip(g, p))]
    path = tmp_path / "mounts.csv"
    path.write_text("\n".join(lines) + "\n")
    status, out, err = run("batch", str(path), "--tolerance", "1")
    assert status == 0, err
    status, out, err = run("batch", str(path), "--tolerance", "0.4", "--out", str(tmp_path / "out.csv"))
    assert status == 1, err
    rows = (tmp_path / "out.csv").read_text().splitlines()[1:]
    totals = [float(r.split(",")[1]) for r in rows]
    np.testing.assert_allclose(totals, 0.5, atol=1e-9)
