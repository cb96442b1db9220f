"""`framewright batch` and `fit` under hostile files: error rows exit 2 unless --skip-errors, counts apart,
--out refused through a symlink or hard link of the input, an atomic write that leaves nothing behind
when it fails, terminal text with its control characters escaped, and a header of 50,000 '[' answered
(the subprocess timeout of tests/cli/test_cli.py's `framewright` is the hang guard)."""

import io
import os

import pytest

import app.cli as cli
from core import atomic_file
from tests.cli.test_cli import framewright

HEADER = "name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz\n"
ROWS = ("near,1,0,0,0,0.9999,0.01,0,0\n"      # hand-worked: 2·atan2(0.01, 0.9999) = 1.146°
        "same,1,0,0,0,1,0,0,0\n"
        "huge,1e154,0,0,0,1,0,0,0\n")         # once a false pass through an overflowing norm


def write(path, text):
    path.write_text(text, encoding="utf-8", newline="")
    return path


def test_an_error_row_refuses_with_one_line_and_exit_2(tmp_path):
    path = write(tmp_path / "m.csv", HEADER + ROWS)
    out = tmp_path / "r.csv"
    run = framewright("batch", str(path), "--tolerance", "2", "--out", str(out))
    assert run.returncode == 2 and run.stdout == "" and not out.exists()
    assert len(run.stderr.splitlines()) == 1
    assert "1 of 3 rows cannot be checked" in run.stderr and "line 4 (row 3, mount 'huge')" in run.stderr
    assert "--skip-errors" in run.stderr and "Traceback" not in run.stderr


@pytest.mark.parametrize("tolerance, status, within, outside", [("2", 0, 2, 0), ("1", 1, 1, 1)])
def test_skip_errors_lists_them_and_judges_the_others(tmp_path, tolerance, status, within, outside):
    path = write(tmp_path / "m.csv", HEADER + ROWS)
    out = tmp_path / "r.csv"
    run = framewright("batch", str(path), "--tolerance", tolerance, "--skip-errors", "--out", str(out))
    assert (run.returncode, run.stderr) == (status, "")
    lines = run.stdout.splitlines()
    assert lines[3].startswith("huge") and "ERROR" in lines[3] and "quaternion of length 1e+154" in lines[3]
    assert f"3 mounts, {outside} outside the tolerance of {tolerance} deg, {within} within, 1 in error" in lines[4]
    written = out.read_text(encoding="utf-8").splitlines()
    assert written[3].startswith("huge,,,,,error,,") and len(written) == 4


def test_skip_errors_with_no_readable_row_is_still_refused(tmp_path):
    path = write(tmp_path / "m.csv", HEADER + "a,x,0,0,0,1,0,0,0\n")
    run = framewright("batch", str(path), "--tolerance", "1", "--skip-errors")
    assert run.returncode == 2 and run.stdout == "" and "none of the 1 rows can be checked" in run.stderr


@pytest.mark.parametrize("link", ["symlink", "hard link", "other spelling"])
def test_out_onto_the_input_by_any_name_is_refused(tmp_path, link):
    path = write(tmp_path / "m.csv", HEADER + "a,1,0,0,0,1,0,0,0\n")
    before = path.read_bytes()
    alias = tmp_path / "alias.csv"
    if link == "symlink":
        alias.symlink_to(path)
    elif link == "hard link":
        os.link(path, alias)
    else:
        alias = tmp_path / "." / "sub" / ".." / "m.csv"
        (tmp_path / "sub").mkdir()
    run = framewright("batch", str(path), "--tolerance", "1", "--out", str(alias))
    assert run.returncode == 2 and "that is the input file" in run.stderr and len(run.stderr.splitlines()) == 1
    assert path.read_bytes() == before


def test_a_failed_write_leaves_neither_a_partial_file_nor_a_temporary(tmp_path, monkeypatch):
    path = write(tmp_path / "m.csv", HEADER + "a,1,0,0,0,1,0,0,0\n")
    out = write(tmp_path / "r.csv", "the previous results\n")

    def full_disk(fd):
        raise OSError(28, "No space left on device")
    monkeypatch.setattr(atomic_file.os, "fsync", full_disk)
    stdout, stderr = io.StringIO(), io.StringIO()
    status = cli.main(["batch", str(path), "--tolerance", "1", "--out", str(out)], stdout=stdout, stderr=stderr)
    assert status == 2 and stdout.getvalue() == ""
    assert "cannot be written (No space left on device); nothing was written" in stderr.getvalue()
    assert out.read_text() == "the previous results\n"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["m.csv", "r.csv"]


def test_names_with_escape_codes_print_as_visible_escapes(tmp_path):
    # ESC [1A ESC [2K moves up and erases the line above: printed raw it would hide a FAIL.
    hostile = "x\x1b[1A\x1b[2K\u202eliaf"
    path = write(tmp_path / "m.csv", HEADER + f"bad,1,0,0,0,0,1,0,0\n{hostile},1,0,0,0,1,0,0,0\n")
    run = framewright("batch", str(path), "--tolerance", "1")
    assert run.returncode == 1
    assert "\x1b" not in run.stdout and "\u202e" not in run.stdout
    assert "x\\x1b[1A\\x1b[2K\\u202eliaf" in run.stdout and "FAIL" in run.stdout.splitlines()[1]


def test_bare_carriage_returns_and_huge_fields_are_read_or_refused_by_line(tmp_path):
    path = write(tmp_path / "mac.csv", (HEADER + "a,1,0,0,0,1,0,0,0\n").replace("\n", "\r"))
    run = framewright("batch", str(path), "--tolerance", "1")
    assert run.returncode == 0 and "1 mounts, 0 outside" in run.stdout
    path = write(tmp_path / "big.csv", HEADER + "a,1,0,0,0,1," + "0" * 200_000 + ",0,0\n")
    run = framewright("batch", str(path), "--tolerance", "1")
    assert run.returncode == 2 and "line 2, column 'measured_qx'" in run.stderr and "Error" not in run.stderr
    points = write(tmp_path / "p.csv", "nominal_x,nominal_y,nominal_z,measured_x,measured_y,measured_z\r"
                   "1,0,0,1,0,0\r0,1,0,0,1,0\r0,0,1,0,0,1\r")
    run = framewright("fit", str(points))
    assert run.returncode == 0, run.stderr


def test_a_header_of_50000_brackets_is_answered(tmp_path):
    path = write(tmp_path / "p.csv", "[" * 50_000 + "\n1,2,3\n")
    run = framewright("fit", str(path))          # hang guard: the helper's 60 s subprocess timeout
    assert run.returncode == 2 and len(run.stderr.splitlines()) == 1 and "line 1" in run.stderr
