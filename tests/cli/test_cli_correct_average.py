"""`framewright correct`, `framewright average` and `compare --uncertainty`, run in-process. Values are
checked against SciPy's Rotation and against cases worked by hand here (named beside each check)."""

import io
import json
import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from app import cli

NOMINAL = "yaw 30, pitch 5, roll 2.5"
MEASURED = "yaw 30.4, pitch 5.3, roll 2.5"


def run(*argv, stdin=""):
    out, err = io.StringIO(), io.StringIO()
    status = cli.main(list(argv), stdin=io.StringIO(stdin), stdout=out, stderr=err)
    return status, out.getvalue(), err.getvalue()


def _scipy(text_angles):
    return Rotation.from_euler("ZYX", text_angles, degrees=True)        # SciPy, intrinsic ZYX (yaw, pitch, roll)


def test_correct_prints_the_correction_scipy_computes_and_angles_that_rebuild_it(tmp_path):
    status, out, err = run("correct", NOMINAL, MEASURED, "--axes", "+Z; +Y; +X", "--json")
    assert status == 0 and err == ""
    data = json.loads(out)
    n, m = _scipy([30, 5, 2.5]), _scipy([30.4, 5.3, 2.5])
    expected = m.inv() * n                                               # SciPy: C = Mᵀ N (CONVENTIONS.md)
    assert data["correction_body"]["angle_deg"] == pytest.approx(np.degrees(expected.magnitude()), abs=1e-9)
    assert np.allclose(data["correction_body"]["small_angles_deg"], expected.as_rotvec(degrees=True), atol=1e-9)
    angles = data["adjustment"]["angles_deg"]
    rebuilt = Rotation.from_euler("ZYX", angles, degrees=True)           # SciPy: about Z, then Y', then X''
    assert (rebuilt * expected.inv()).magnitude() < 1e-12 and data["adjustment"]["exact"] is True


def test_correct_gives_the_hand_worked_shims_for_a_plate_tilted_half_a_degree(tmp_path):
    feet = tmp_path / "feet.csv"
    feet.write_text("x,y,z\n100,50,-20\n-100,50,-20\n-100,-50,-20\n100,-50,-20\n")
    # the measured plate is turned -0.5° about its body X from the nominal: the correction is +0.5° about X,
    # which lifts the +Y edge: 100 mm · sin 0.5° under each +Y foot (worked here); feet 3 and 4 bare
    status, out, _ = run("correct", "0 0 1 0", "1 0 0 -0.5", "--kind", "axis-angle", "--degrees", "--footprint", str(feet),
                         "--pivot", "3", "--pitch", "0.5", "--json")
    assert status == 0
    shim = json.loads(out)["shims"]
    lift = 100 * math.sin(math.radians(0.5))
    assert np.allclose(shim["shims_mm"], [lift, lift, 0, 0], atol=1e-9)
    assert np.allclose(shim["screw_turns"], [lift / 0.5, lift / 0.5, 0, 0], atol=1e-9)
    assert shim["face_normal"] == [0, 0, -1] and shim["twist_deg"] == pytest.approx(0, abs=1e-9)
    status, text, _ = run("correct", "0 0 1 0", "1 0 0 -0.5", "--kind", "axis-angle", "--degrees", "--footprint", str(feet))
    assert f"foot 1 at (100, 50, -20): {lift:.4f}" in text and "slotted holes" in text


@pytest.mark.parametrize("argv, words", [
    (["--axes", "+X; +X"], "parallel"), (["--axes", "+X; 1 2"], "axis 2"), (["--axes", "+Q"], "axis 1"),
    (["--footprint", "/nonexistent/feet.csv"], "cannot be read"), (["--pivot", "9", "--footprint", "{feet}"], "pivot"),
    (["--pitch", "-1", "--footprint", "{feet}"], "pitch")])
def test_correct_refuses_bad_axes_and_footprints_in_one_line(argv, words, tmp_path):
    feet = tmp_path / "feet.csv"
    feet.write_text("0 0 -1\n10 0 -1\n0 10 -1\n")
    status, out, err = run("correct", NOMINAL, MEASURED, *[a.replace("{feet}", str(feet)) for a in argv])
    assert status == 2 and out == "" and err.count("\n") == 1 and words in err


def _measurement_lines(rotations):
    return "\n".join(f"yaw {a[0]!r}, pitch {a[1]!r}, roll {a[2]!r}" for a in rotations.as_euler("ZYX", degrees=True))


def test_average_is_scipys_mean_and_flags_the_bad_repeat(tmp_path):
    rng = np.random.default_rng(5)
    base = _scipy([30, 5, 2.5])
    repeats = base * Rotation.from_rotvec(rng.normal(scale=math.radians(0.01), size=(6, 3)))
    repeats = Rotation.concatenate([repeats, base * Rotation.from_rotvec([math.radians(0.3), 0, 0])])
    path = tmp_path / "repeats.txt"
    path.write_text("# invented repeats\n" + _measurement_lines(repeats) + "\n")
    status, out, err = run("average", str(path), "--json")
    assert status == 0 and err == ""
    data = json.loads(out)
    mean = repeats.mean()                                                # SciPy, Markley et al. 2007
    assert (Rotation.from_quat(data["quaternion_wxyz"], scalar_first=True) * mean.inv()).magnitude() < 1e-9
    assert data["measurements"] == 7 and data["flagged_lines"] == [8]   # line 1 is the comment


def test_average_with_weights_is_scipys_weighted_mean_and_a_wrong_count_is_refused(tmp_path):
    rng = np.random.default_rng(8)
    repeats = _scipy([30, 5, 2.5]) * Rotation.from_rotvec(rng.normal(scale=math.radians(0.2), size=(4, 3)))
    path = tmp_path / "repeats.txt"
    path.write_text(_measurement_lines(repeats) + "\n")
    status, out, err = run("average", str(path), "--weights", "1, 2, 0.5 4", "--json")
    assert status == 0 and err == ""
    data = json.loads(out)
    mean = repeats.mean(weights=[1, 2, 0.5, 4])                          # SciPy, Markley et al. 2007
    assert (Rotation.from_quat(data["quaternion_wxyz"], scalar_first=True) * mean.inv()).magnitude() < 1e-9
    assert (Rotation.from_quat(data["quaternion_wxyz"], scalar_first=True) * repeats.mean().inv()).magnitude() > 1e-5
    assert data["weights"] == [1, 2, 0.5, 4]
    for weights, words in (("1 2 3", "3 weight(s) for 4"), ("1 2 x 4", "--weights"), ("1 -2 1 1", "weights"),
                           ("0 0 0 0", "weights")):
        status, out, err = run("average", str(path), "--weights", weights)
        assert status == 2 and out == "" and words in err, err


def test_average_refuses_three_lines_that_read_as_one_matrix_and_mixed_readings(tmp_path):
    status, _, err = run("average", "-", stdin="1 0 0\n0 1 0\n0 0 1\n")
    assert status == 2 and "read together as one orientation" in err
    status, _, err = run("average", "-", stdin="yaw 1, pitch 2, roll 3\n0.9999 0 0 0.0141\n")
    assert status == 2 and "line 2" in err


# ISO 14253-1 via `compare`: the deviation of these two is 0.5° (SciPy: see the CLI tests), tolerance 0.6°.
@pytest.mark.parametrize("uncertainty, status, word", [("0.01", 0, "conforms"), ("0.1", 4, "cannot decide"),
                                                       ("0.04", 0, "conforms")])
def test_compare_with_an_uncertainty_decides_by_the_guard_band(uncertainty, status, word):
    result, out, _ = run("compare", "yaw 30, pitch 20, roll 10", "yaw 30.4, pitch 20.3, roll 10",
                         "--tolerance", "0.6", "--uncertainty", uncertainty, "--json")
    assert result == status and json.loads(out)["decision"] == word
    assert json.loads(out)["uncertainty_deg"] == float(uncertainty)


def test_compare_outside_by_more_than_the_uncertainty_does_not_conform():
    result, out, _ = run("compare", "yaw 30, pitch 20, roll 10", "yaw 30.4, pitch 20.3, roll 10",
                         "--tolerance", "0.3", "--uncertainty", "0.05")
    assert result == 1 and "does not conform" in out


def test_compare_uncertainty_needs_a_tolerance():
    result, _, err = run("compare", "0 0 1 0", "0 0 1 1", "--uncertainty", "0.1")
    assert result == 2 and "--uncertainty needs --tolerance" in err


# --- batch with an uncertainty column: exit 1 for a proven non-conformity, else 4 for an undecided row
_U_HEADER = "name,nominal_yaw[deg],nominal_pitch,nominal_roll,measured_yaw[deg],measured_pitch,measured_roll,uncertainty_deg"


@pytest.mark.parametrize("deviations, status", [((0.1, 0.2), 0), ((0.1, 0.45), 4), ((0.45, 0.7), 1)])
def test_batch_exit_status_follows_the_decisions(tmp_path, deviations, status):
    import io

    from app.cli import main
    path = tmp_path / "mounts.csv"
    path.write_text("\n".join([_U_HEADER] + [f"m{i},10,0,0,{10 + d},0,0,0.05" for i, d in enumerate(deviations)]) + "\n")
    out, err = io.StringIO(), io.StringIO()
    assert main(["batch", str(path), "--tolerance", "0.5"], stdout=out, stderr=err) == status
    assert err.getvalue() == "" and "cannot be decided within the uncertainty" in out.getvalue()
