"""Read an STL part model (binary or ASCII) into an (N, 3, 3) array of triangles. numpy only.

Bounded before anything is parsed: a file over MAX_FILE_BYTES or a part of more than MAX_TRIANGLES is
refused from its size and its count alone, so a huge or hostile file costs neither memory nor time. Every
coordinate must be finite and within MAX_COORDINATE; a truncated or damaged file is refused with what
was found, never drawn in part."""

from __future__ import annotations

import os
import re
import stat

import numpy as np

# 100 MiB holds a binary part of two million triangles (84 + 50 × 2,000,000 bytes) with room to spare.
MAX_FILE_BYTES = 100 * 1024 * 1024
MAX_TRIANGLES = 2_000_000
# A coordinate beyond a billion file units (1000 km in mm) is garbage or a unit mix-up, not a part; it
# would also leave nothing of the part's own detail in the single precision the scene draws with.
MAX_COORDINATE = 1e9

_HEADER_BYTES = 84
_RECORD_BYTES = 50
_BINARY_RECORD = np.dtype([("normal", "<f4", 3), ("vertices", "<f4", (3, 3)), ("attribute", "<u2")])
assert _BINARY_RECORD.itemsize == _RECORD_BYTES
_VERTEX = re.compile(rb"vertex\s+(\S+)\s+(\S+)\s+(\S+)")


class StlError(ValueError):
    """The file is not an STL we can read; the message says what was found."""


def read_stl(path) -> np.ndarray:
    path = os.fspath(path)
    data = _read_capped(path)
    if _looks_binary(data):
        triangles = _read_binary(data, path)
    elif data.lstrip()[:5].lower() == b"solid" and b"\0" not in data[:1024]:
        triangles = _read_ascii(data, path)
    elif len(data) >= _HEADER_BYTES:
        count = int.from_bytes(data[80:84], "little")
        raise StlError(f"{path!r} is not a readable STL: read as binary, its header counts {count:,} triangles "
                       f"({_HEADER_BYTES + _RECORD_BYTES * count:,} bytes) but the file has {len(data):,} bytes "
                       f"(truncated or damaged?); an ASCII STL would start with 'solid'")
    else:
        raise StlError(f"{path!r} is neither a binary STL (80-byte header, count, 50-byte records) nor an "
                       "ASCII STL (starting with 'solid')")
    if len(triangles) == 0:
        raise StlError(f"{path!r} holds no triangles")
    _check_coordinates(triangles, path)
    return triangles


def _read_capped(path: str) -> bytes:
    """The file's bytes, refused before reading when it is not a regular file or is over the cap (and
    read no further than the cap, in case it grows meanwhile)."""
    try:
        info = os.stat(path)
        if not stat.S_ISREG(info.st_mode):
            raise StlError(f"{path!r} is not a regular file; expected an STL file")
        if info.st_size > MAX_FILE_BYTES:
            raise StlError(f"{path!r} is {info.st_size / 2 ** 20:,.0f} MB; the largest STL read is "
                           f"{MAX_FILE_BYTES // 2 ** 20} MB")
        with open(path, "rb") as f:
            data = f.read(MAX_FILE_BYTES + 1)
    except OSError as exc:
        raise StlError(f"cannot open the STL file {path!r}: {exc.strerror or exc}") from exc
    if len(data) > MAX_FILE_BYTES:
        raise StlError(f"{path!r} grew past {MAX_FILE_BYTES // 2 ** 20} MB while being read; the largest "
                       f"STL read is {MAX_FILE_BYTES // 2 ** 20} MB")
    return data


def _looks_binary(data: bytes) -> bool:
    # Binary files may also begin with 'solid' in their header, so trust the size arithmetic.
    if len(data) < _HEADER_BYTES:
        return False
    count = int.from_bytes(data[80:84], "little")
    return len(data) == _HEADER_BYTES + _RECORD_BYTES * count


def _too_many(count: int, path: str) -> None:
    if count > MAX_TRIANGLES:
        raise StlError(f"{path!r} has {count:,} triangles; the largest part drawn has {MAX_TRIANGLES:,}")


def _read_binary(data: bytes, path: str) -> np.ndarray:
    count = int.from_bytes(data[80:84], "little")
    _too_many(count, path)
    records = np.frombuffer(data, dtype=_BINARY_RECORD, count=count, offset=_HEADER_BYTES)
    return records["vertices"].astype(float)


def _read_ascii(data: bytes, path: str) -> np.ndarray:
    # Counted first (a linear scan): a file of millions of vertex lines is refused before parsing.
    _too_many(data.count(b"vertex") // 3, path)
    found = _VERTEX.findall(data)
    if len(found) % 3:
        raise StlError(f"{path!r}: {len(found)} 'vertex' lines is not a whole number of triangles")
    try:
        values = np.array(found, dtype=float)
    except ValueError:
        raise StlError(_first_bad_number(data, path)) from None
    return values.reshape(-1, 3, 3)


def _first_bad_number(data: bytes, path: str) -> str:
    for match in _VERTEX.finditer(data):
        for token in match.groups():
            try:
                float(token)
            except ValueError:
                line = data.count(b"\n", 0, match.start()) + 1
                shown = token[:40].decode("ascii", "replace")
                return (f"{path!r}, line {line}: vertex coordinate {shown!r} is not a number; expected "
                        f"'vertex x y z' with three numbers")
    return f"{path!r}: a 'vertex' line has a coordinate that is not a number"


def _check_coordinates(triangles: np.ndarray, path: str) -> None:
    finite = np.isfinite(triangles)
    if not finite.all():
        t, v, c = (int(i) for i in np.argwhere(~finite)[0])
        raise StlError(f"{path!r}: triangle {t + 1}, vertex {v + 1} has {'xyz'[c]} = {triangles[t, v, c]}; "
                       f"expected finite coordinates")
    if max(float(triangles.max()), -float(triangles.min())) > MAX_COORDINATE:   # no |t| temporary
        t, v, c = (int(i) for i in np.argwhere(np.abs(triangles) > MAX_COORDINATE)[0])
        raise StlError(f"{path!r}: triangle {t + 1}, vertex {v + 1} has {'xyz'[c]} = {triangles[t, v, c]:.4g}; "
                       f"expected coordinates within ±{MAX_COORDINATE:g} (a unit mix-up or a damaged file?)")


def write_stl_binary(path, triangles) -> None:
    """Write triangles as a binary STL (used by the demo and the tests)."""
    triangles = np.asarray(triangles, dtype=float).reshape(-1, 3, 3)
    records = np.zeros(len(triangles), dtype=_BINARY_RECORD)
    normals = np.cross(triangles[:, 1] - triangles[:, 0], triangles[:, 2] - triangles[:, 0])
    lengths = np.linalg.norm(normals, axis=1, keepdims=True)
    records["normal"] = np.divide(normals, lengths, out=np.zeros_like(normals), where=lengths > 0)
    records["vertices"] = triangles
    with open(path, "wb") as f:
        f.write(b"Framewright part".ljust(80, b" "))
        f.write(len(triangles).to_bytes(4, "little"))
        f.write(records.tobytes())
