"""Reading a file within a size cap (core.bounded_json.read_capped): the bytes of a regular file come back
whole, at the cap and across several 1 MB reads; one byte over is refused, whether the size is known
before reading or the file grew while it was read, and never more than the cap plus one byte is read;
folders, pipes, devices, missing files and read failures are refused in the module's own words. A pipe
is opened without blocking (checked by refusing a blocking open of a pipe, so a mistake fails the test
instead of hanging it). Sizes are invented; the MB figure is bytes // 1,048,576 (worked by hand)."""

import errno
import os
import stat

import pytest

from core import bounded_json
from core.bounded_json import BoundedJsonError, read_capped

MB = 1024 * 1024


def _file(tmp_path, data, name="doc.json"):
    path = tmp_path / name
    path.write_bytes(data)
    return path


def test_a_small_file_comes_back_byte_for_byte(tmp_path):
    data = b'{"invented": [1, 2, 3]}\n'
    assert read_capped(_file(tmp_path, data)) == data
    assert read_capped(str(_file(tmp_path, data))) == data          # a str path as well as a Path


def test_a_file_read_in_several_chunks_is_joined_without_anything_between(tmp_path):
    data = bytes(range(256)) * (6 * 1024 + 7)                       # about 1.5 MB: two reads of up to 1 MB
    assert read_capped(_file(tmp_path, data)) == data


def test_an_empty_file_gives_no_bytes(tmp_path):
    assert read_capped(_file(tmp_path, b"")) == b""


@pytest.mark.parametrize("size", [1, 10, 11])
def test_a_file_at_or_under_the_cap_is_read_whole(tmp_path, size):
    data = b"x" * (size - 1) + b"!"
    assert read_capped(_file(tmp_path, data), max_bytes=11) == data


def test_a_file_one_byte_over_the_cap_is_refused_with_its_size(tmp_path):
    path = tmp_path / "big.json"
    with open(path, "wb") as handle:
        handle.truncate(3 * MB + 1)                                 # sparse: nothing much written
    with pytest.raises(BoundedJsonError) as caught:
        read_capped(path, max_bytes=3 * MB)
    assert str(caught.value) == ("is 3,145,729 bytes, larger than the 3 MB a session file may be; it is "
                                 "probably not one")
    assert read_capped(path, max_bytes=3 * MB + 1)[-1:] == b"\0"    # and at that cap it is read


class _Growing:
    """os.fstat answering a smaller size than the file has, as for a file that grows after the check;
    os.read counting the bytes it hands out."""

    def __init__(self, monkeypatch, reported_size):
        self.read_total = 0
        real_fstat, real_read = os.fstat, os.read

        def fstat(fd):
            info = list(real_fstat(fd))
            info[stat.ST_SIZE] = reported_size
            return os.stat_result(info)

        def read(fd, n):
            chunk = real_read(fd, n)
            self.read_total += len(chunk)
            return chunk

        monkeypatch.setattr(os, "fstat", fstat)
        monkeypatch.setattr(os, "read", read)


@pytest.mark.parametrize("actual", [2 * MB + 1, 5 * MB])
def test_a_file_that_grew_past_the_cap_while_read_is_refused_after_reading_one_byte_over(
        tmp_path, monkeypatch, actual):
    path = _file(tmp_path, b"g" * actual)
    growing = _Growing(monkeypatch, reported_size=100)
    with pytest.raises(BoundedJsonError) as caught:
        read_capped(path, max_bytes=2 * MB)
    assert str(caught.value) == "is larger than the 2 MB a session file may be"
    assert growing.read_total == 2 * MB + 1                         # never read past the cap


def test_a_file_that_grew_but_stays_at_the_cap_is_read_whole(tmp_path, monkeypatch):
    data = b"h" * (2 * MB)
    path = _file(tmp_path, data)
    _Growing(monkeypatch, reported_size=10)
    assert read_capped(path, max_bytes=2 * MB) == data


def test_a_missing_file_is_refused_with_the_reason_in_words(tmp_path):
    with pytest.raises(BoundedJsonError) as caught:
        read_capped(tmp_path / "missing.json")
    assert str(caught.value) == "cannot be read (No such file or directory)"


def test_a_name_with_a_nul_character_is_refused(tmp_path):
    with pytest.raises(BoundedJsonError) as caught:
        read_capped(str(tmp_path) + "/bad\0name.json")
    assert str(caught.value) == "cannot be read (embedded null byte)"


def test_a_failing_read_is_refused_with_the_reason_in_words(tmp_path, monkeypatch):
    path = _file(tmp_path, b"[1]")

    def broken(fd, n):
        raise OSError(errno.EIO, "Input/output error")

    monkeypatch.setattr(os, "read", broken)
    with pytest.raises(BoundedJsonError) as caught:
        read_capped(path)
    assert str(caught.value) == "cannot be read (Input/output error)"


def test_the_file_is_closed_after_a_read_and_after_a_refusal(tmp_path, monkeypatch):
    closed = []
    real_close = os.close
    monkeypatch.setattr(os, "close", lambda fd: (closed.append(fd), real_close(fd)))
    read_capped(_file(tmp_path, b"[1]"))
    with pytest.raises(BoundedJsonError):
        read_capped(_file(tmp_path, b"x" * 20, "big.json"), max_bytes=10)
    assert len(closed) == 2


@pytest.mark.parametrize("kind, words", [("folder", "is a folder, not a file"),
                                          ("fifo", "is a named pipe (FIFO), not a file"),
                                          ("device", "is a device, not a file")])
def test_what_is_not_a_regular_file_is_refused_by_its_kind(tmp_path, monkeypatch, kind, words):
    if kind == "folder":
        path = tmp_path / "folder.json"
        path.mkdir()
    elif kind == "fifo":
        path = tmp_path / "pipe.json"
        os.mkfifo(path)
    else:
        path = "/dev/zero"                         # endless: reading it whole would never end
    real_open = os.open

    def never_blocking(name, flags, *args):
        # A pipe with no writer blocks a plain open for ever: fail instead of hanging.
        if stat.S_ISFIFO(os.stat(name).st_mode) and not flags & os.O_NONBLOCK:
            raise AssertionError("a pipe was opened in blocking mode")
        return real_open(name, flags, *args)

    monkeypatch.setattr(os, "open", never_blocking)
    with pytest.raises(BoundedJsonError) as caught:
        read_capped(path)
    assert str(caught.value) == words


def test_a_socket_is_named_as_such():
    # Linux refuses to open a socket at all (so read_capped says "cannot be read"); the wording for one
    # that some platform does open is pinned on the mode itself.
    assert bounded_json._kind(stat.S_IFSOCK) == "a socket"
    assert bounded_json._kind(stat.S_IFBLK) == "a device"
