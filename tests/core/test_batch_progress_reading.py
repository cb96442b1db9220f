"""What a progress callback hears while a batch file is read: a start (0 of 1) and an end (1 of 1), both
named "reading", and a callback that answers False stops the read with a message naming the stage.
Check values are worked by hand from read_mounts' documented progress contract (done, total, stage)."""

import pytest

from core.batch import BatchCancelledError, read_mounts

TEXT = ("name,nominal_qw,nominal_qx,nominal_qy,nominal_qz,measured_qw,measured_qx,measured_qy,measured_qz\n"
        "a,1,0,0,0,1,0,0,0\n")


def test_reading_reports_its_start_and_its_end_by_name():
    calls = []
    read_mounts(TEXT, progress=lambda done, total, stage: calls.append((done, total, stage)))
    assert calls == [(0, 1, "reading"), (1, 1, "reading")]


def test_cancelling_at_the_start_of_reading_says_where_it_stopped():
    with pytest.raises(BatchCancelledError) as caught:
        read_mounts(TEXT, progress=lambda done, total, stage: False)
    assert str(caught.value) == "batch cancelled while reading (0 of 1)"


def test_cancelling_at_the_end_of_reading_says_where_it_stopped():
    with pytest.raises(BatchCancelledError) as caught:
        read_mounts(TEXT, progress=lambda done, total, stage: done == 0)
    assert str(caught.value) == "batch cancelled while reading (1 of 1)"
