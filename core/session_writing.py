"""Writing a session file: the JSON form of a Session, checked to read back before a byte is written, and
the atomic save. Numpy only; never imports Qt."""

from __future__ import annotations

import json
import os
from typing import Any

from core import atomic_file, bounded_json
from core.session_reading import UNEXPECTED, session_from_dict
from core.session_values import FORMAT_NAME, FORMAT_VERSION, Mount, Session, SessionFileError


def _mount_to_dict(mount: Mount) -> dict[str, Any]:
    data = {
        "name": mount.name,
        "orientation": {"quaternion_wxyz": [float(v) for v in mount.orientation.as_quaternion()]},
        "part": {
            "box_size_mm": list(mount.part.box_size_mm),
            "face_names": dict(mount.part.face_names),
            "boresight": mount.part.boresight,
        },
        "notes": mount.notes,
    }
    if mount.position is not None:       # no key at all for a mount without one
        data["position"] = mount.position.to_dict()
    if mount.measurements:               # nor for one without measurements
        data["measurements"] = [
            {"orientation": {"quaternion_wxyz": [float(v) for v in m.orientation.as_quaternion()]},
             "weight": m.weight, "source": m.source} for m in mount.measurements]
    return data


def session_to_dict(session: Session) -> dict[str, Any]:
    data: dict[str, Any] = {
        "format": FORMAT_NAME,
        "version": FORMAT_VERSION,
        "description": session.description,
        "reference_frame": session.reference_frame,
        "selected": session.selected,
        "preferences": session.preferences.to_dict(),
        "mounts": [_mount_to_dict(m) for m in session.mounts],
    }
    # No key at all for none, as files without chains or checks were written before they were typed.
    if session.chains:
        data["chains"] = [chain.to_dict() for chain in session.chains]
    if session.checks:
        data["checks"] = [check.to_dict() for check in session.checks]
    for key, value in session.extra.items():
        data.setdefault(key, value)
    return data


def session_file_bytes(session: Session, source: str = "session") -> bytes:
    """The bytes a save writes. They are checked to read back first: a session the loader would refuse
    (a lone surrogate or a control character in a name, a non-finite number among kept data) is a
    SessionFileError naming the field, before anything is written."""
    try:
        as_dict = session_to_dict(session)
        bounded_json.check_values(as_dict)       # names the place of a lone surrogate or a NaN
        plain = json.dumps(as_dict, ensure_ascii=True, allow_nan=False)
        data = json.loads(plain)
        bounded_json.check_values(data)
        session_from_dict(data, source=source)
        text = json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False) + "\n"
        return text.encode("utf-8")
    except SessionFileError:
        raise
    except bounded_json.BoundedJsonError as exc:
        raise SessionFileError(f"{source}: {exc}") from None
    except UNEXPECTED as exc:   # e.g. NaN or an object JSON cannot hold among the kept data
        # No cut here: SessionFileError keeps the start and the end of a long reason (core/errors.py).
        raise SessionFileError(f"{source}: cannot be written as a session file ({exc})") from None


def save_session(session: Session, path: str | os.PathLike) -> None:
    """Write atomically through core/atomic_file: a temporary file beside the target, flushed to disk,
    then renamed over it, so a crash leaves either the old file or the new one, never half of one. A
    symbolic link is written through, the file's permissions are kept, pipes, devices and folders are
    refused, and temporaries of earlier killed saves are removed. Raises SessionFileError (the session
    cannot be written) or OSError (the file cannot); either way the old file is unchanged."""
    raw = session_file_bytes(session, source=str(path))
    atomic_file.write_atomically(path, raw)

