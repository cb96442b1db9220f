"""Hang guard: every adversarial 100 kB input (tests/core/hostile_decode_inputs.py, seeded) is answered,
decoded or refused with our DecodeError. The alarm is a generous hang guard (30 s for an input that takes
well under 1 s); the timing itself is measured by `make bench` (tests/bench/bench_decode.py)."""

import signal

import numpy as np
import pytest

from core.decode import MAX_INPUT_BYTES, DecodeError, decode
from tests.core.hostile_decode_inputs import hostile_inputs

HANG_GUARD_SECONDS = 30
CASES = hostile_inputs()


class Hung(Exception):
    pass


def _alarm(signum, frame):
    raise Hung(f"no answer within {HANG_GUARD_SECONDS} s")


@pytest.mark.parametrize("name", sorted(CASES))
def test_hostile_input_is_answered(name):
    text = CASES[name]
    assert len(text.encode("utf-8")) <= MAX_INPUT_BYTES
    previous = signal.signal(signal.SIGALRM, _alarm)
    signal.alarm(HANG_GUARD_SECONDS)
    try:
        readings = decode(text)
    except DecodeError as error:
        message = str(error)
        assert message and "\n" not in message
        assert len(message) < 1000          # one readable line, not the input echoed back
        return
    finally:
        signal.alarm(0)
        signal.signal(signal.SIGALRM, previous)
    for r in readings:
        assert np.all(np.isfinite(r.orientation.quaternion))


def test_the_hostile_set_is_large_and_full_size():
    assert len(CASES) >= 40
    assert all(len(text.encode("utf-8")) >= 90_000 for text in CASES.values())
