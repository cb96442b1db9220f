"""Our own JSON object (the export) read back by the representation the kind hint asks for: each entry
must give the same rotation, checked against SciPy's Rotation. The rotation is invented."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import DecodeError, decode

# fixed-axis X, then Y, then Z by 10, 20, 30 degrees: SciPy's extrinsic 'xyz' (lower case)
TRUTH = Rotation.from_euler("xyz", [10, 20, 30], degrees=True)


def _object(**changes):
    rotvec = TRUTH.as_rotvec()
    angle = float(np.linalg.norm(rotvec))
    data = {"quaternion_wxyz": list(TRUTH.as_quat(scalar_first=True)),
            "matrix": TRUTH.as_matrix().tolist(),
            "axis": list(rotvec / angle), "angle_deg": float(np.degrees(angle)),
            "angles_deg": [10, 20, 30], "sequence": "XYZ", "intrinsic": False}
    data.update(changes)
    return json.dumps(data)


def _matrix(reading):
    return np.asarray(reading.orientation.as_matrix())


@pytest.mark.parametrize("kind", ["quaternion", "matrix", "axis-angle", "angles"])
def test_each_entry_asked_for_gives_the_same_rotation(kind):
    first = decode(_object(), {"kind": kind})[0]
    assert first.kind == kind
    assert np.allclose(_matrix(first), TRUTH.as_matrix(), atol=1e-9)


def test_the_angles_entry_keeps_its_own_sequence_and_axes():
    first = decode(_object(), {"kind": "angles"})[0]
    assert first.conventions["sequence"] == "XYZ" and first.conventions["intrinsic"] is False
    assert first.conventions["units"] == "deg"


def test_a_missing_angle_is_refused_by_its_key():
    text = _object()
    data = json.loads(text)
    del data["angle_deg"]
    with pytest.raises(DecodeError, match="JSON key 'angle_deg' should hold 1 finite numbers"):
        decode(json.dumps(data), {"kind": "axis-angle"})
