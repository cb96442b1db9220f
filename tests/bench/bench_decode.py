"""Decoder benchmark: the worst decode time over adversarial 100 kB inputs (tests/core/
hostile_decode_inputs.py), goal <= 1 s, against a plain 100 kB text of words and numbers decoded in the
same run (the ratio shows whether any input costs more than ordinary text of its size).

Timings only; nothing here passes or fails."""

import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from core.decode import DecodeError, decode  # noqa: E402
from tests.core.hostile_decode_inputs import SIZE, hostile_inputs  # noqa: E402

GOAL_SECONDS = 1.0
SHOWN = 5


def _time(text: str) -> float:
    start = time.perf_counter()
    try:
        decode(text)
    except DecodeError:
        pass
    return time.perf_counter() - start


def plain_text() -> str:
    """An invented log of the same size: words and a few numbers per line."""
    line = "mount bracket check 12 on the left side, reading 0.5 taken\n"
    return (line * (SIZE // len(line) + 1))[:SIZE]


def main():
    baseline = min(_time(plain_text()) for _ in range(3))
    times = sorted(((min(_time(text) for _ in range(2)), name) for name, text in hostile_inputs().items()),
                   reverse=True)
    worst, worst_name = times[0]
    print(f"decode, {len(times)} adversarial inputs of ~{SIZE // 1000} kB (best of 2 each; "
          f"ratio = input / plain 100 kB text)")
    print(f"{'input':44s} {'time':>9s} {'ratio':>7s}")
    print(f"{'plain text (reference)':44s} {baseline * 1e3:7.0f}ms {1:7.2f}")
    for t, name in times[:SHOWN]:
        print(f"{name:44s} {t * 1e3:7.0f}ms {t / baseline:7.2f}")
    print(f"{'worst: ' + worst_name:44s} {worst * 1e3:7.0f}ms {worst / baseline:7.2f}  "
          f"goal <= {GOAL_SECONDS:g} s: {'met' if worst <= GOAL_SECONDS else 'NOT met'}")


if __name__ == "__main__":
    main()
