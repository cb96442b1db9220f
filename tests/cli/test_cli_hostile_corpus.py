"""The command line's input contract over a generated corpus of 2,100 hostile invocations (every verb),
run in-process for speed, and a sample of them through a real process without a display.

The contract (README, "Input contract"): exit 0 or 1 with nothing on stderr, or exit 2 with exactly one
line on stderr and nothing on stdout; never 3 (an internal error), never a traceback, never a non-finite
number in JSON, and an answer in bounded time."""

from __future__ import annotations

import io
import json
import os
import re
import subprocess
import sys
import time
from pathlib import Path

import pytest

from app import cli
from tests.cli.hostile_corpus import corpus

ROOT = Path(__file__).resolve().parents[2]
CASES = corpus()
HANG_GUARD_S = 20.0        # a hang guard only: a healthy case takes milliseconds
_NON_FINITE = re.compile(r"(?<![A-Za-z])(?:nan|inf|infinity)(?![A-Za-z])", re.IGNORECASE)


class _Stdin(io.TextIOWrapper):
    """Standard input as a process has it: text over a byte buffer."""


def _materialise(case, folder: Path):
    for name, data in case.files.items():
        (folder / name).write_bytes(data)
    return [a.replace("{dir}", str(folder)) for a in case.argv]


def _strict_json(text: str):
    def refuse(constant):
        raise ValueError(f"non-finite number {constant} in JSON output")
    return json.loads(text, parse_constant=refuse)


def _check_outcome(case, status, out, err, elapsed, stdin_text=""):
    where = case.describe()
    assert elapsed < HANG_GUARD_S, f"took {elapsed:.1f} s: {where}"
    assert "Traceback" not in err and "Traceback" not in out, f"traceback: {err[-400:]} {where}"
    assert status in (0, 1, 2), f"exit {status} ({err.strip()[:300]}): {where}"
    if status == 2:
        assert out == "", f"refusal with output on stdout: {where}"
        assert err.endswith("\n") and err.count("\n") == 1, f"stderr is not one line: {err[:300]!r} {where}"
        assert len(err) < 1000, f"stderr line of {len(err)} characters: {where}"
        assert err.isprintable() or err[:-1].isprintable(), f"control characters on stderr: {err!r}"
    else:
        assert err == "", f"exit {status} with stderr {err[:300]!r}: {where}"
        if case.json_out:
            _strict_json(out)
        inputs = " ".join(map(str, case.argv)) + stdin_text + " ".join(
            d.decode("utf-8", "replace") for d in case.files.values())
        if not _NON_FINITE.search(inputs):
            assert not _NON_FINITE.search(out), f"non-finite number printed: {out[:400]!r} {where}"
        assert "\x1b" not in out, f"a terminal escape reached stdout: {where}"


@pytest.fixture
def no_window():
    """`open` on a file that happens to load would start the window: the opener counts it as opened."""
    return lambda path=None: 0


@pytest.mark.parametrize("chunk", range(0, len(CASES), 300), ids=lambda c: f"cases-{c}")
def test_hostile_invocations_keep_the_contract(chunk, tmp_path, no_window, monkeypatch):
    monkeypatch.setenv("FRAMEWRIGHT_LOG_DIR", str(tmp_path))
    for index, case in enumerate(CASES[chunk:chunk + 300]):
        folder = tmp_path / f"case{chunk + index}"
        folder.mkdir()
        argv = _materialise(case, folder)
        stdin = _Stdin(io.BytesIO(case.stdin), encoding="utf-8", errors="strict")
        out, err = io.StringIO(), io.StringIO()
        start = time.monotonic()
        status = cli.main(argv, stdin=stdin, stdout=out, stderr=err, open_window=no_window)
        _check_outcome(case, status, out.getvalue(), err.getvalue(), time.monotonic() - start,
                       case.stdin.decode("utf-8", "replace"))


def test_corpus_covers_every_verb_with_at_least_2000_cases():
    verbs = {c.argv[0] for c in CASES}
    assert len(CASES) >= 2000 and {"decode", "compare", "fit", "batch", "open"} <= verbs


def _run_process(argv, stdin: bytes):
    env = {k: v for k, v in os.environ.items() if k not in ("DISPLAY", "WAYLAND_DISPLAY", "QT_QPA_PLATFORM")}
    env["PYTHONPATH"] = str(ROOT)
    return subprocess.run([sys.executable, "-m", "app.main", *argv], input=stdin, capture_output=True,
                          cwd=ROOT, env=env, timeout=120)


@pytest.mark.parametrize("index", range(0, len(CASES), len(CASES) // 40))
def test_a_sample_through_a_real_process_without_a_display(index, tmp_path, monkeypatch):
    case = CASES[index]
    argv = _materialise(case, tmp_path)
    if any("\udc80" <= ch <= "\udcff" or "\ud800" <= ch <= "\udfff" for a in argv for ch in a):
        pytest.skip("an argument a process cannot be given as text")   # argv bytes are tested below
    start = time.monotonic()
    result = _run_process(argv, case.stdin)
    out = result.stdout.decode("utf-8", "replace")
    err = result.stderr.decode("utf-8", "replace")
    _check_outcome(case, result.returncode, out, err, time.monotonic() - start)
