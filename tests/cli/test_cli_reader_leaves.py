"""`framewright … | head`: when the reader of standard output stops reading, the verb ends with its own
exit status and nothing on stderr (a broken pipe is no internal error, and a FAIL stays exit 1)."""

import subprocess
import sys

ARGS = [sys.executable, "-m", "app.main"]


def _run_with_reader_gone(args):
    # The reader closes its end before anything is written: every write meets a broken pipe.
    process = subprocess.Popen(ARGS + args, stdout=subprocess.PIPE, stderr=subprocess.PIPE)
    process.stdout.close()
    _, err = process.communicate(timeout=60)
    return process.returncode, err.decode()


def test_decode_into_a_closed_pipe_exits_0_quietly():
    code, err = _run_with_reader_gone(["decode", "--all", "T = [0 -1 0 0.25; 1 0 0 -0.1; 0 0 1 1.2; 0 0 0 1]"])
    assert (code, err) == (0, "")


def test_a_failing_compare_into_a_closed_pipe_still_exits_1():
    code, err = _run_with_reader_gone(["compare", "yaw 30, pitch 20, roll 10", "yaw 30.4, pitch 20.3, roll 10",
                                       "--tolerance", "0.25"])
    assert (code, err) == (1, "")
