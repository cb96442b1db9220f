"""Write a text file whole or not at all: a temporary file in the target's folder, flushed to disk, then
renamed over the target, so a full disk or a crash leaves either the old file or the new one, never half
of one; the temporary file is removed on any failure."""

from __future__ import annotations

import os
import tempfile


def write_text_atomically(path, text: str) -> None:
    path = os.fspath(path)
    folder = os.path.dirname(os.path.abspath(path))
    handle, temporary = tempfile.mkstemp(prefix="." + os.path.basename(path) + ".", suffix=".tmp", dir=folder)
    try:
        with os.fdopen(handle, "w", encoding="utf-8", newline="") as stream:
            stream.write(text)
            stream.flush()
            os.fsync(stream.fileno())
        os.replace(temporary, path)
    except BaseException:
        try:
            os.unlink(temporary)
        except OSError:
            pass
        raise
