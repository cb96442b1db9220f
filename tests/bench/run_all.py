"""`make bench`: every benchmark in one run, each printing its own table against the reference measured
in the same run. Starts a private Xvfb for the window and scene benchmarks when there is no display.
Timings only; nothing here passes or fails."""

import importlib
import os
import shutil
import subprocess
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

BENCHMARKS = ["bench_core", "bench_kernels", "bench_decode", "bench_batch", "bench_fit", "bench_correct",
              "bench_window", "bench_startup", "bench_scene"]


def start_display():
    """A virtual screen for the GUI benchmarks, with Mesa's software OpenGL (no GPU needed)."""
    os.environ.setdefault("LIBGL_ALWAYS_SOFTWARE", "1")
    if os.environ.get("DISPLAY") or not shutil.which("Xvfb"):
        return None
    for number in range(90, 110):
        if Path(f"/tmp/.X{number}-lock").exists():
            continue
        server = subprocess.Popen(["Xvfb", f":{number}", "-screen", "0", "2560x1600x24", "-ac",
                                   "+extension", "GLX", "+render", "-noreset"],
                                  stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        time.sleep(1.0)
        if server.poll() is None:
            os.environ["DISPLAY"] = f":{number}"
            return server
    return None


def main():
    server = start_display()
    # The Scene asks Qt to share GL contexts, which only works before any QApplication exists; the window
    # and scene benchmarks each make windows, so set it up first.
    import app.scene  # noqa: F401
    print(f"Framewright benchmarks, {time.strftime('%Y-%m-%d')}, {os.cpu_count()} cores, "
          f"Python {sys.version.split()[0]}")
    try:
        for name in BENCHMARKS:
            try:
                module = importlib.import_module(f"tests.bench.{name}")
            except ModuleNotFoundError as missing:
                print(f"\n[{name}] not available: {missing}")
                continue
            print(f"\n[{name}]")
            sys.stdout.flush()
            module.main()
            sys.stdout.flush()
    finally:
        sys.stdout.flush()
        if server is not None:
            # Qt would talk to the display again while the interpreter shuts down; end here instead.
            server.terminate()
            os._exit(0)


if __name__ == "__main__":
    main()
