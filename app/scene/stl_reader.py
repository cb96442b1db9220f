"""Read an STL part model (binary or ASCII) into an (N, 3, 3) array of triangles. numpy only."""

from __future__ import annotations

import os
import re

import numpy as np

_BINARY_RECORD = np.dtype([("normal", "<f4", 3), ("vertices", "<f4", (3, 3)), ("attribute", "<u2")])
_VERTEX = re.compile(rb"vertex\s+(\S+)\s+(\S+)\s+(\S+)")


class StlError(ValueError):
    """The file is not an STL we can read; the message says what was found."""


def read_stl(path) -> np.ndarray:
    path = os.fspath(path)
    try:
        with open(path, "rb") as f:
            data = f.read()
    except OSError as exc:
        raise StlError(f"cannot open the STL file {path!r}: {exc.strerror}") from exc
    if _looks_binary(data):
        triangles = _read_binary(data, path)
    elif data.lstrip()[:5].lower() == b"solid":
        triangles = _read_ascii(data, path)
    else:
        raise StlError(f"{path!r} is neither a binary STL (80-byte header, count, 50-byte records) nor an "
                       "ASCII STL (starting with 'solid')")
    if len(triangles) == 0:
        raise StlError(f"{path!r} holds no triangles")
    if not np.all(np.isfinite(triangles)):
        raise StlError(f"{path!r} has NaN or infinite vertex coordinates")
    return triangles


def _looks_binary(data: bytes) -> bool:
    # Binary files may also begin with 'solid' in their header, so trust the size arithmetic.
    if len(data) < 84:
        return False
    count = int.from_bytes(data[80:84], "little")
    return len(data) == 84 + 50 * count


def _read_binary(data: bytes, path: str) -> np.ndarray:
    count = int.from_bytes(data[80:84], "little")
    records = np.frombuffer(data, dtype=_BINARY_RECORD, count=count, offset=84)
    return records["vertices"].astype(float)


def _read_ascii(data: bytes, path: str) -> np.ndarray:
    found = _VERTEX.findall(data)
    if len(found) % 3:
        raise StlError(f"{path!r}: {len(found)} 'vertex' lines is not a whole number of triangles")
    try:
        values = np.array(found, dtype=float)
    except ValueError as exc:
        raise StlError(f"{path!r}: a 'vertex' line has a coordinate that is not a number ({exc})") from exc
    return values.reshape(-1, 3, 3)


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
