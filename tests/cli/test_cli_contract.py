"""The command line's general contract: exit 3 with a log for internal errors, one stderr line for usage
errors and for input that is not text, standard input read under a cap."""

from __future__ import annotations

import io
import os
import subprocess
import sys
from pathlib import Path

import pytest

from app import cli

ROOT = Path(__file__).resolve().parents[2]


def test_argument_bytes_that_are_not_utf8_are_refused_in_one_line():
    env = {k: v for k, v in os.environ.items() if k != "DISPLAY"}
    env["PYTHONPATH"] = str(ROOT)
    result = subprocess.run([sys.executable.encode(), b"-m", b"app.main", b"decode", b"0 0 1 \xff90"],
                            capture_output=True, cwd=ROOT, env=env, timeout=60)
    assert result.returncode == 2 and result.stdout == b""
    assert result.stderr.count(b"\n") == 1 and b"UTF-8" in result.stderr


def test_endless_standard_input_is_refused_after_the_cap_not_read_whole(tmp_path):
    # /dev/zero never ends: reading it whole would exhaust memory; the cap answers at once
    with open("/dev/zero", "rb") as zeros:
        result = subprocess.run([sys.executable, "-m", "app.main", "decode", "-"], stdin=zeros,
                                capture_output=True, cwd=ROOT, timeout=60,
                                env={**os.environ, "PYTHONPATH": str(ROOT)})
    assert result.returncode == 2 and result.stderr.count(b"\n") == 1
    assert b"longer than" in result.stderr


def test_an_internal_error_is_exit_3_with_one_line_and_the_traceback_in_a_log(tmp_path, monkeypatch):
    def broken(*args, **kwargs):
        raise ZeroDivisionError("planted by the test")
    monkeypatch.setattr(cli, "decode", broken)
    monkeypatch.setenv("FRAMEWRIGHT_LOG_DIR", str(tmp_path))
    out, err = io.StringIO(), io.StringIO()
    assert cli.main(["decode", "0 0 1 90"], stdout=out, stderr=err) == cli.EXIT_INTERNAL
    line = err.getvalue()
    assert line.count("\n") == 1 and "internal error" in line and "ZeroDivisionError" in line
    logs = list(tmp_path.glob("framewright-error-*.log"))
    assert len(logs) == 1 and str(logs[0]) in line
    assert "planted by the test" in logs[0].read_text() and "Traceback" in logs[0].read_text()
    assert out.getvalue() == ""


def test_a_floating_point_warning_is_an_internal_error_not_noise_on_stderr(tmp_path, monkeypatch):
    import numpy as np

    def noisy(*args, **kwargs):
        return np.float64(1e308) * 10        # overflow: numpy warns
    monkeypatch.setattr(cli, "decode", noisy)
    monkeypatch.setenv("FRAMEWRIGHT_LOG_DIR", str(tmp_path))
    err = io.StringIO()
    assert cli.main(["decode", "0 0 1 90"], stdout=io.StringIO(), stderr=err) == cli.EXIT_INTERNAL
    assert "RuntimeWarning" in err.getvalue() and err.getvalue().count("\n") == 1


@pytest.mark.parametrize("argv", [["frob"], ["decode", "--kind", "banana", "1 2 3"], ["batch"],
                                  ["compare", "1 2 3"], []])
def test_usage_errors_are_one_line_and_exit_2(argv):
    if not argv:
        argv = ["--bogus"]
    err = io.StringIO()
    assert cli.main(argv, stdout=io.StringIO(), stderr=err) == cli.EXIT_REFUSED
    assert err.getvalue().count("\n") == 1 and "usage:" in err.getvalue()
