"""`framewright open` and `framewright` alone without a display: one stderr line and exit 2 (Qt would
abort the process), checked before Qt is loaded; and the environment rules that decide it."""

import os
import subprocess
import sys

import pytest

from app.cli import open_display_problem
from tests.cli.test_cli import ROOT


def _without_a_display(platform=None) -> dict:
    env = {k: v for k, v in os.environ.items() if k not in ("DISPLAY", "WAYLAND_DISPLAY", "QT_QPA_PLATFORM")}
    env["PYTHONPATH"] = str(ROOT)
    if platform:
        env["QT_QPA_PLATFORM"] = platform
    return env


@pytest.mark.parametrize("platform", [None, "xcb", "wayland"])
def test_open_without_a_display_is_one_line_and_exit_2(platform):
    env = _without_a_display(platform)
    result = subprocess.run([sys.executable, "-m", "app.main", "open", "resources/demo.fwsession.json"],
                            capture_output=True, text=True, cwd=ROOT, env=env, timeout=60)
    lines = result.stderr.strip().splitlines()
    assert result.returncode == 2 and result.stdout == ""
    assert len(lines) == 1 and lines[0].startswith("framewright open: no display found"), result.stderr


@pytest.mark.parametrize("platform", [None, "xcb", "wayland"])
def test_no_arguments_without_a_display_is_one_line_and_exit_2(platform):
    env = _without_a_display(platform)
    result = subprocess.run([sys.executable, "-m", "app.main"], capture_output=True, text=True, cwd=ROOT,
                            env=env, timeout=60)
    lines = result.stderr.strip().splitlines()
    assert result.returncode == 2 and result.stdout == ""
    assert len(lines) == 1 and lines[0].startswith("framewright: no display found"), result.stderr


def test_the_no_display_check_loads_no_qt():
    # Checked before the window module is imported: refusing costs no Qt start-up.
    env = _without_a_display()
    code = ("import sys; from app.main import main; status = main([]); "
            "print(status, sorted(m for m in sys.modules if m.startswith(('PySide6', 'app.window'))))")
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, env=env,
                            timeout=60)
    assert result.stdout.strip() == "2 []", result.stdout + result.stderr


@pytest.mark.parametrize("environ, refused", [
    ({}, True), ({"DISPLAY": ":0"}, False), ({"WAYLAND_DISPLAY": "wayland-0"}, False),
    ({"QT_QPA_PLATFORM": "xcb", "WAYLAND_DISPLAY": "wayland-0"}, True),
    ({"QT_QPA_PLATFORM": "wayland;xcb", "DISPLAY": ":1"}, False),
    ({"QT_QPA_PLATFORM": "offscreen"}, False), ({"QT_QPA_PLATFORM": "vnc:size=800x600"}, False),
])
def test_which_environments_have_a_display(environ, refused):
    assert (open_display_problem(environ, platform="linux") is not None) == refused
    assert open_display_problem(environ, platform="win32") is None
