"""`framewright report --check NAME --points POINTS.csv`: the record of a check whose measured orientation
was fitted from points holds the fit's residual table, each residual as SciPy's fit gives it; points whose
fit is not the measured mount are refused by name; verify-report compares the session's figures and says
the fit's were not compared. No display, through a subprocess."""

import json

import numpy as np
import pytest
from pypdf import PdfReader
from scipy.spatial.transform import Rotation

from core import inspection_record as records
from core.record_files import read_html_report
from tests.cli.test_cli import ROOT, framewright
from tests.cli.test_cli_fit_batch_open import write_points

DEMO_CHECK = ROOT / "resources" / "demo_check.fwsession.json"
CHECK = "Radar antenna after remount"
MEASURED = "Radar antenna, as measured"


@pytest.fixture(scope="module")
def fitted(tmp_path_factory):
    """Invented point pairs on the radar antenna (a 12-point survey with 0.02 mm noise) and a copy of the
    demo session whose measured mount is their best fit, as SciPy's align_vectors finds it."""
    folder = tmp_path_factory.mktemp("fitted")
    rng = np.random.default_rng(15)
    nominal = rng.uniform(-60, 60, (12, 3))
    rotation = Rotation.from_euler("ZYX", [-30.1, 5.3, 2.9], degrees=True)
    measured = rotation.apply(nominal) + [1520.0, -310.0, 95.0] + rng.normal(0, 0.02, nominal.shape)
    points = write_points(folder / "antenna points.csv", nominal, measured)
    # Reference: SciPy's Rotation.align_vectors on the centred point sets (Kabsch, least squares).
    p_mean, q_mean = nominal.mean(axis=0), measured.mean(axis=0)
    fit, _ = Rotation.align_vectors(measured - q_mean, nominal - p_mean)
    residuals = measured - (fit.apply(nominal) + q_mean - fit.apply(p_mean))
    data = json.loads(DEMO_CHECK.read_text())
    mount = next(m for m in data["mounts"] if m["name"] == MEASURED)
    mount["orientation"] = {"quaternion_wxyz": list(fit.as_quat(scalar_first=True))}
    session = folder / "fitted.fwsession.json"
    session.write_text(json.dumps(data))
    return {"points": points, "session": session, "residuals": residuals, "folder": folder}


def _report(fitted, suffix, *extra):
    out = fitted["folder"] / f"report.{suffix}"
    result = framewright("report", str(fitted["session"]), "--check", CHECK, "--points", str(fitted["points"]),
                         "-o", str(out), *extra)
    return out, result


def test_the_record_holds_the_residual_table_as_scipy_gives_it(fitted):
    out, result = _report(fitted, "html")
    assert result.returncode == 0 and result.stderr == "", result.stderr
    data, printed = read_html_report(out.read_bytes(), "html")
    figures = {f["key"]: f for f in data["figures"]}
    residuals = fitted["residuals"]
    for i, residual in enumerate(residuals):
        row = figures[f"check[0].fit_residual[{i}]"]
        assert row["unit"] == "mm" and row["label"].startswith(f"row {i + 1}")
        np.testing.assert_allclose([float(v) for v in row["values"][:3]], residual, atol=1e-6)
        assert float(row["values"][3]) == pytest.approx(np.linalg.norm(residual), abs=1e-6)
    rms = np.sqrt(np.mean(np.sum(residuals ** 2, axis=1)))
    assert float(figures["check[0].fit_rms"]["values"][0]) == pytest.approx(rms, rel=1e-6)
    assert figures["check[0].fit_points"]["values"] == ["antenna points.csv"]
    assert "Residuals of the point fit" in out.read_text()


def test_the_pdf_prints_the_residual_table(fitted):
    out, result = _report(fitted, "pdf", "--points-unit", "in")
    assert result.returncode == 0, result.stderr
    text = " ".join(" ".join(page.extract_text().split()) for page in PdfReader(str(out)).pages)
    assert "Residuals of the point fit (measured − fitted, reference axes), in" in text
    assert "antenna points.csv" in text and "RMS residual of the point fit" in text


def test_verify_report_compares_the_session_figures_and_says_the_fit_was_not(fitted):
    out, _ = _report(fitted, "html")
    result = framewright("verify-report", str(out), str(fitted["session"]))
    assert result.returncode == 0, result.stdout
    assert "figures of the point fit are as the report wrote them, not compared" in result.stdout
    result = framewright("verify-report", str(out), str(DEMO_CHECK))     # the session before the fit
    assert result.returncode == 1 and "NOT the record of this session" in result.stdout


def test_points_whose_fit_is_not_the_measured_mount_are_refused(fitted):
    out = fitted["folder"] / "refused.pdf"
    result = framewright("report", str(DEMO_CHECK), "--check", CHECK, "--points", str(fitted["points"]),
                         "-o", str(out))
    assert result.returncode == 2 and not out.exists()
    assert f"the measured mount '{MEASURED}' is not the fit of antenna points.csv" in result.stderr


def test_points_need_a_check_and_readable_rows(fitted, tmp_path):
    result = framewright("report", str(fitted["session"]), "--points", str(fitted["points"]),
                         "-o", str(tmp_path / "r.pdf"))
    assert result.returncode == 2 and "--points goes with --check NAME" in result.stderr
    bad = tmp_path / "bad.csv"
    bad.write_text("nominal_x,nominal_y,nominal_z,measured_x,measured_y,measured_z\n1,2,x,4,5,6\n")
    result = framewright("report", str(fitted["session"]), "--check", CHECK, "--points", str(bad),
                         "-o", str(tmp_path / "r.pdf"))
    assert result.returncode == 2 and "bad.csv" in result.stderr and not (tmp_path / "r.pdf").exists()


def test_a_record_refuses_a_fit_of_another_orientation_in_core():
    from core.fit import fit_points
    from core.session import load_session

    session = load_session(DEMO_CHECK)
    nominal = np.array([[0, 0, 0], [100, 0, 0], [0, 50, 0], [0, 0, 30.0]])
    fit = fit_points(nominal, nominal + 5.0)          # no rotation: not the radar antenna as measured
    with pytest.raises(records.RecordError, match="is not the fit of p.csv"):
        records.check_record(session, CHECK, "a", "0" * 64, fit=fit, fit_source="p.csv")


def test_the_flag_threshold_is_the_fits_and_says_its_rule():
    # One point misread by 0.5 mm among twelve surveyed to 0.02 mm (invented): flagged by the fit's rule.
    from core.fit import fit_points
    from core.session import load_session

    rng = np.random.default_rng(3)
    nominal = rng.uniform(-60, 60, (12, 3))
    measured = nominal + [10.0, 0, 0] + rng.normal(0, 0.02, nominal.shape)
    measured[4] += [0.5, 0, 0]
    fit = fit_points(nominal, measured)
    session = load_session(DEMO_CHECK)
    from dataclasses import replace
    mounts = tuple(replace(m, orientation=fit.orientation) if m.name == MEASURED else m for m in session.mounts)
    record = records.check_record(replace(session, mounts=mounts), CHECK, "a", "0" * 64, fit=fit)
    figures = {f.key: f for f in record.figures()}
    threshold = figures["check[0].fit_flag_threshold"]
    assert threshold.label.startswith("Flag threshold of the residual distance (flagged when")
    assert float(threshold.values[0]) == pytest.approx(fit.flag_threshold, rel=1e-8)
    assert figures["check[0].fit_residual[4]"].label == "row 5 (flagged)"
    assert 4 in fit.flagged and float(figures["check[0].fit_residual[4]"].values[3]) > fit.flag_threshold
