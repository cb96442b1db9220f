"""Batch CSV: every representation read by its header, deviations against SciPy on a 100,000-row file,
tolerance flags, the results CSV, progress, and files refused with the line, row and column named.

Check values come from SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library):
deviation D = N⁻¹ M, its magnitude() and as_rotvec(), and apply() for the pointing of a body axis."""

import io

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.batch import (
    BatchCancelledError,
    BatchFileError,
    SetConventions,
    compute_deviations,
    read_mounts,
    run_batch,
    write_results,
)
from core.check import CheckSettings

ROWS = 100_000


def small_deviations(nominal, rng, largest_deg):
    """Measured = nominal turned a little about a random body axis (SciPy)."""
    axes = rng.normal(size=(len(nominal), 3))
    axes /= np.linalg.norm(axes, axis=1, keepdims=True)
    angles = np.radians(rng.uniform(0, largest_deg, size=len(nominal)))
    return nominal * Rotation.from_rotvec(axes * angles[:, None])


def csv_text(header, names, *columns):
    fmt = "%s" + ",%.17g" * sum(c.shape[1] for c in columns)
    values = np.hstack(columns)
    return ",".join(header) + "\n" + "\n".join(map(fmt.__mod__, ((n, *v) for n, v in
                                                                 zip(names, values.tolist())))) + "\n"


def scipy_figures(nominal, measured, axis=None):
    d = nominal.inv() * measured
    total = np.degrees(d.magnitude())
    if axis is None:
        return total, None
    na, ma = nominal.apply(axis), measured.apply(axis)
    pointing = np.degrees(np.arctan2(np.linalg.norm(np.cross(na, ma), axis=1), np.sum(na * ma, axis=1)))
    return total, pointing


QUATERNION_HEADER = ["name", "nominal_qw", "nominal_qx", "nominal_qy", "nominal_qz"]


@pytest.fixture(scope="module")
def big_file():
    rng = np.random.default_rng(101)
    nominal = Rotation.random(ROWS, rng=rng)
    measured = small_deviations(nominal, rng, 1.0)
    ypr = measured.as_euler("ZYX", degrees=True)
    header = QUATERNION_HEADER + ["measured_yaw[deg]", "measured_pitch", "measured_roll"]
    names = [f"mount {i}" for i in range(ROWS)]
    return csv_text(header, names, nominal.as_quat(scalar_first=True), ypr), nominal, \
        Rotation.from_euler("ZYX", ypr, degrees=True)


def test_hundred_thousand_rows_agree_with_scipy(big_file):
    text, nominal, measured = big_file
    settings = CheckSettings(total_tolerance_deg=0.5, body_axis="+Z")
    result, output = run_batch(text, settings)
    total, pointing = scipy_figures(nominal, measured, np.array([0.0, 0.0, 1.0]))
    assert len(result.names) == ROWS and result.names[7] == "mount 7"
    np.testing.assert_allclose(result.total_deg, total, rtol=0, atol=1e-10)
    np.testing.assert_allclose(result.pointing_deg, pointing, rtol=0, atol=1e-10)
    rotvec = (nominal.inv() * measured).as_rotvec()
    np.testing.assert_allclose(result.axis, rotvec / np.linalg.norm(rotvec, axis=1, keepdims=True), atol=1e-7)
    clear = np.abs(total - 0.5) > 1e-9
    np.testing.assert_array_equal(result.passed[clear], (total <= 0.5)[clear])
    assert 0 < result.failed_count < ROWS
    # The results file says the same, to its nine decimals.
    written = np.loadtxt(io.StringIO(output), delimiter=",", skiprows=1, usecols=(1, 5, 8))
    np.testing.assert_allclose(written[:, 0], total, atol=1e-9)
    np.testing.assert_allclose(written[:, 1], pointing, atol=1e-9)
    verdicts = np.loadtxt(io.StringIO(output), delimiter=",", skiprows=1, usecols=7, dtype=str)
    np.testing.assert_array_equal(verdicts == "pass", result.passed)


def rotations_and_names(count, seed):
    rng = np.random.default_rng(seed)
    nominal = Rotation.random(count, rng=rng)
    return nominal, small_deviations(nominal, rng, 5.0), [f"m{i}" for i in range(count)]


FORMS = ["matrix as printed", "matrix reference_to_body", "axis angle rad", "rotation vector",
         "angles XYZ extrinsic", "yaw pitch roll rad"]


@pytest.mark.parametrize("form", FORMS)
def test_each_representation_read_from_its_header(form):
    nominal, measured, names = rotations_and_names(50, 300 + FORMS.index(form))
    if form == "matrix as printed":
        header = [f"measured_r{i}{j}" for i in (1, 2, 3) for j in (1, 2, 3)]
        columns = measured.as_matrix().reshape(-1, 9)
    elif form == "matrix reference_to_body":
        header = [f"measured_r{i}{j}" for i in (1, 2, 3) for j in (1, 2, 3)]
        header[4] += "[reference_to_body]"
        columns = np.swapaxes(measured.as_matrix(), 1, 2).reshape(-1, 9)
    elif form == "axis angle rad":
        header = ["measured_axis_x", "measured_axis_y", "measured_axis_z", "measured_angle[rad]"]
        rv = measured.as_rotvec()
        angle = np.linalg.norm(rv, axis=1, keepdims=True)
        columns = np.hstack([rv / angle * 3.0, angle])     # a non-unit axis is normalised
    elif form == "rotation vector":
        header = ["measured_rv_x", "measured_rv_y", "measured_rv_z"]
        columns = measured.as_rotvec(degrees=True)
    elif form == "angles XYZ extrinsic":
        header = ["measured_angle3", "measured_angle1[X-Y-Z extrinsic]", "measured_angle2"]
        angles = measured.as_euler("xyz", degrees=True)     # SciPy lower case = extrinsic
        columns = angles[:, [2, 0, 1]]                      # columns in any order
    else:
        header = ["measured_yaw[rad]", "measured_pitch", "measured_roll"]
        columns = measured.as_euler("ZYX")
    text = csv_text(QUATERNION_HEADER + header, names, nominal.as_quat(scalar_first=True), columns)
    result, _ = run_batch(text)
    np.testing.assert_allclose(result.total_deg, scipy_figures(nominal, measured)[0], atol=1e-9)


def test_conventions_passed_in_for_a_plain_header_and_contradictions_refused():
    nominal, measured, names = rotations_and_names(20, 5)
    header = QUATERNION_HEADER + ["measured_angle1", "measured_angle2", "measured_angle3"]
    text = csv_text(header, names, nominal.as_quat(scalar_first=True), measured.as_euler("ZXZ"))
    with pytest.raises(BatchFileError, match="need a sequence and intrinsic or extrinsic") as caught:
        read_mounts(text)
    assert caught.value.column == "measured_angle1" and caught.value.line == 1
    conventions = SetConventions(sequence="ZXZ", intrinsic=True, degrees=False)
    result, _ = run_batch(text, measured=conventions)
    np.testing.assert_allclose(result.total_deg, scipy_figures(nominal, measured)[0], atol=1e-9)
    tagged = text.replace("measured_angle1", "measured_angle1[ZXZ extrinsic]", 1)
    with pytest.raises(BatchFileError, match="the header says extrinsic but intrinsic was passed in"):
        read_mounts(tagged, measured=conventions)


def test_quoted_names_blank_lines_unicode_minus_and_extra_columns():
    text = ("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_yaw,measured_pitch,measured_roll,serial\n"
            "\"camera, left\",1,0,0,0,0,0,\u22120.25,S-1\n"
            "\n"
            "radar,1,0,0,0,0,2\u00a0,0,S-2\n")
    result, output = run_batch(text, CheckSettings(total_tolerance_deg=1.0))
    assert result.names == ("camera, left", "radar")
    np.testing.assert_allclose(result.total_deg, [0.25, 2.0], atol=1e-12)   # hand-worked: single-axis turns
    np.testing.assert_allclose(result.axis[0], [-1, 0, 0], atol=1e-12)      # −0.25° roll: axis −X
    assert result.passed.tolist() == [True, False]
    assert "ignored column(s): serial" in result.notes
    lines = output.splitlines()
    assert lines[0] == "name,total_deviation_deg,deviation_axis_x,deviation_axis_y,deviation_axis_z,result,margin_deg,problem"
    assert lines[1].startswith('"camera, left",0.250000000,-1.000000000,0.000000000,0.000000000,pass,0.75')


GOOD = ("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz\n"
        "a,1,0,0,0,1,0,0,0\n"
        "b,1,0,0,0,0.9999,0.01,0,0\n"
        "c,1,0,0,0,1,0,0,0\n")


@pytest.mark.parametrize("change, words, line, column", [
    (("0.01,0,0", "0.01,x,0"), "'x' is not a number", 3, "measured_qy"),
    (("0.01,0,0", "0.01,,0"), "is empty", 3, "measured_qy"),
    (("0.01,0,0", "0.01,nan,0"), "not a finite", 3, "measured_qy"),
    (("c,1,0,0,0,1,0,0,0", "c,1,0,0,0,1,0,0,0,7"), "has 10 cells; expected 9", 4, None),
    (("c,1,0,0,0,1,0,0,0", "c,1,0,0,0,1,0,0"), "has 8 cells; expected 9", 4, None),
    (("c,1,0,0,0,1,0,0,0", "c,0,0,0,0,1,0,0,0"), "quaternion of length 0", 4, "nominal_qw"),
])
def test_bad_rows_become_error_rows_naming_the_place(change, words, line, column):
    result, output = run_batch(GOOD.replace(*change))
    assert result.error_count == 1
    problem = result.problems[0]
    assert words in problem.message and problem.message.startswith(f"line {line} (row ")
    assert (problem.line, problem.column) == (line, column)
    assert result.verdicts()[problem.row] == "error" and not result.passed[problem.row]
    assert np.isnan(result.total_deg[problem.row])
    assert output.splitlines()[problem.row + 1].split(",")[5:7] == ["error", ""]


@pytest.mark.parametrize("change, words, column", [
    (("measured_qz", "measured_qq"), "unknown field 'qq'", "measured_qq"),
    (("measured_qz", "measured_qz[rad]"), "does not apply to a quaternion", "measured_qz[rad]"),
    (("measured_qz", "serial"), "not one complete set", None),
    (("name,", "mount,"), "first column must be 'name'", "mount"),
])
def test_a_broken_header_refuses_the_whole_file(change, words, column):
    with pytest.raises(BatchFileError, match=words) as caught:
        run_batch(GOOD.replace(*change))
    assert caught.value.line == 1
    assert caught.value.column == column


def test_several_bad_rows_are_each_named():
    bad = GOOD.replace("a,1,0,0,0", "a,1,0,?,0").replace("c,1,0,0,0", "c,1,0,0,!")
    result, _ = run_batch(bad)
    assert [(p.line, p.column) for p in result.problems] == [(2, "nominal_qy"), (4, "nominal_qz")]
    assert result.verdicts() == ["error", "fail", "error"]
    assert (result.error_count, result.failed_count, result.passed_count) == (2, 1, 0)


def test_matrices_reflected_or_far_off_are_error_rows_and_rounded_ones_noted():
    header = ["name"] + [f"{role}_r{i}{j}" for role in ("nominal", "measured") for i in (1, 2, 3)
                         for j in (1, 2, 3)]
    identity = "1,0,0,0,1,0,0,0,1"
    rounded = "0.7071,-0.7071,0,0.7071,0.7071,0,0,0,1"      # 45° about z printed to four decimals
    text = ",".join(header) + f"\nok,{identity},{rounded}\n"
    result, _ = run_batch(text)
    # Common practice: the nearest rotation of the rounded matrix is 45° about z.
    assert result.total_deg[0] == pytest.approx(45.0, abs=1e-9)
    assert any("nearest rotation" in note for note in result.notes)
    mirrored = text + f"mirror,{identity},-1,0,0,0,1,0,0,0,1\n"
    result, _ = run_batch(mirrored)
    assert result.verdicts() == ["fail", "error"]      # 45° is outside the default 0.5°
    assert result.problems[0].message.startswith("line 3 (row 2, mount 'mirror')") and "reflection" in result.problems[0].message
    skewed = text + f"skew,{identity},1,0.2,0,0,1,0,0,0,1\n"
    result, _ = run_batch(skewed)
    assert "not a rotation" in result.problems[0].message and result.verdicts()[1] == "error"


def test_header_without_rows_is_refused():
    with pytest.raises(BatchFileError, match="no rows"):
        run_batch(GOOD.splitlines()[0] + "\n")


def test_pointing_and_roll_mode_flags_rows():
    # Hand-worked: row b is a 1.146° turn about x (quaternion (0.9999, 0.01, 0, 0) normalised,
    # 2·atan2(0.01, 0.9999) = 1.14597°): body +Z swings by that much and does not roll about itself.
    settings = CheckSettings(mode="pointing_and_roll", body_axis="+Z", pointing_tolerance_deg=1.0,
                             roll_tolerance_deg=0.1)
    result, _ = run_batch(GOOD, settings)
    expected = np.degrees(2 * np.arctan2(0.01, 0.9999))
    assert result.pointing_deg[1] == pytest.approx(expected, abs=1e-12)
    assert result.roll_deg[1] == pytest.approx(0.0, abs=1e-12)
    assert result.passed.tolist() == [True, False, True]
    assert result.margin_deg[1] == pytest.approx(1.0 - expected, abs=1e-12)


def test_progress_reports_and_can_cancel(big_file):
    text = "\n".join(big_file[0].splitlines()[:60_001]) + "\n"
    calls = []
    result, _ = run_batch(text, progress=lambda done, total, stage: calls.append((stage, done, total)))
    stages = [c[0] for c in calls]
    assert stages[0] == "reading" and stages[-1] == "writing"
    computing = [c for c in calls if c[0] == "computing"]
    assert [c[1] for c in computing] == [50_000, 60_000] and computing[-1][2] == 60_000
    assert calls[-1] == ("writing", 60_000, 60_000)
    with pytest.raises(BatchCancelledError, match="cancelled while computing"):
        run_batch(text, progress=lambda done, total, stage: stage != "computing")


def test_read_compute_write_are_separate_steps():
    table = read_mounts(GOOD)
    assert [s.describe() for s in table.sets] == ["nominal: quaternion (Hamilton)", "measured: quaternion (Hamilton)"]
    result = compute_deviations(table, CheckSettings(total_tolerance_deg=1.0))
    assert result.pointing_deg is None
    assert write_results(result, decimals=3).splitlines()[2] == "b,1.146,1.000,0.000,0.000,fail,-0.146,"
