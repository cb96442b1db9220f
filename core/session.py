"""A session as plain data: named mounts, the selected one and display preferences, with our own
versioned JSON file format (``*.fwsession.json``). Numpy only; never imports Qt.

File layout (version 2; version 1 is the same without positions)::

    {
      "format": "framewright-session",
      "version": 2,
      "description": "free text",
      "reference_frame": "enu",          # names of the reference axes: enu, ned, vehicle, aircraft, camera
      "selected": 0,
      "preferences": {...},              # Preferences fields, all optional when reading
      "mounts": [
        {"name": "...",
         "orientation": {"quaternion_wxyz": [w, x, y, z]},   # Hamilton, body -> reference
         "position": {"metres": [x, y, z], "unit": "mm"},    # optional (version 2): origin in reference
         "part": {"box_size_mm": [x, y, z], "face_names": {"+X": "connector", ...},
                  "boresight": "+Z"},
         "notes": "...",
         "measurements": [                                   # optional: repeated measurements
           {"orientation": {"quaternion_wxyz": [w, x, y, z]}, "weight": 1.0, "source": "typed"}]}
      ],
      "chains": [...],                   # Chain.to_dict() each (core/chain.py)
      "checks": [                        # SavedCheck.to_dict() each: which mounts a check compares
        {"name": "check", "nominal": "mount name" or null, "measured": "mount name" or null,
         "settings": {...}}              # CheckSettings.to_dict() (core/check.py)
      ]
    }

A mount's measurements are an optional key (written only when there are some; at most
MAX_MEASUREMENTS_PER_MOUNT), so files without it read as before and the version stays 2.

Chains and checks are typed fields of Session (``Session.chains``, ``Session.checks``), checked field by
field when the file is read; a file without them holds no key for them. A check names its mounts (names
survive reordering and deleting; renaming a mount renames it in the checks too, core/operations.py).

Top-level keys this module does not know (keys a newer minor revision adds) are kept in ``Session.extra``
and written back unchanged, so saving never drops someone else's data.

This module is the one place to import from; the work is done in
  core/name_rules.py       what a name and free text may hold
  core/session_values.py   the values (Mount, PartProperties, Preferences, SavedCheck, Session)
  core/session_reading.py  reading a file, with its refusals
  core/session_writing.py  writing a file, checked to read back, atomically
"""

from core.name_rules import MAX_NAME_CHARS, free_text_problem, name_problem
from core.session_reading import load_session, load_session_and_bytes, session_from_dict
from core.session_values import (ANGLE_UNITS, BOX_SIZE_RANGE_MM, FACE_KEYS, FILE_SUFFIX,
                                 FIRST_VERSION_WITH_POSITIONS, FORMAT_NAME, FORMAT_VERSION, MATRIX_MEANINGS,
                                 QUATERNION_ORDERS, RESERVED_KEYS, Mount, PartProperties, Preferences, SavedCheck,
                                 Session, SessionFileError)
from core.session_writing import save_session, session_file_bytes, session_to_dict

__all__ = ["ANGLE_UNITS", "BOX_SIZE_RANGE_MM", "FACE_KEYS", "FILE_SUFFIX", "FIRST_VERSION_WITH_POSITIONS",
           "FORMAT_NAME", "FORMAT_VERSION", "MATRIX_MEANINGS", "MAX_NAME_CHARS", "QUATERNION_ORDERS",
           "RESERVED_KEYS", "Mount", "PartProperties", "Preferences", "SavedCheck", "Session", "SessionFileError",
           "free_text_problem", "load_session", "load_session_and_bytes", "name_problem", "save_session",
           "session_file_bytes", "session_from_dict", "session_to_dict"]
