"""Session files at their edges: a stored quaternion slightly off unit norm on both sides of the accepted
band (1e-6), and format versions older than, equal to, newer than and not of the kind this one reads.

Check values: the file layout of core/session.py (version 1); SciPy's Rotation (a general-purpose
reference library) for what a slightly long quaternion means once normalised."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.session import FORMAT_NAME, FORMAT_VERSION, SessionFileError, session_from_dict

Q = Rotation.from_euler("ZYX", [30, -12, 4], degrees=True).as_quat(scalar_first=True)


def file_with(quaternion=Q, version=FORMAT_VERSION):
    return {"format": FORMAT_NAME, "version": version,
            "mounts": [{"name": "a", "orientation": {"quaternion_wxyz": [float(v) for v in quaternion]}}]}


@pytest.mark.parametrize("norm", [1 + 0.99e-6, 1 - 0.99e-6, 1 + 1e-9, 1.0])
def test_a_quaternion_just_inside_the_band_is_read_and_normalised(norm):
    session = session_from_dict(file_with(Q * norm))
    q = session.mounts[0].orientation.as_quaternion()
    assert abs(np.linalg.norm(q) - 1.0) < 1e-15
    # SciPy normalises the same numbers to the same rotation.
    want = Rotation.from_quat(Q * norm, scalar_first=True).as_quat(scalar_first=True)
    np.testing.assert_allclose(q, want, atol=1e-15)


@pytest.mark.parametrize("norm", [1 + 1.01e-6, 1 - 1.01e-6, 1.001, 0.5])
def test_a_quaternion_just_outside_the_band_is_refused_naming_its_norm(norm):
    with pytest.raises(SessionFileError) as caught:
        session_from_dict(file_with(Q * norm))
    message = str(caught.value)
    assert "mounts[0].orientation.quaternion_wxyz" in message and "unit quaternion" in message
    assert f"{norm:.9g}" in message


@pytest.mark.parametrize("version, words", [(0, "format version 0 is not valid"),
                                            (-1, "format version -1 is not valid"),
                                            (FORMAT_VERSION + 1, "written by a newer Framewright"),
                                            (99, "written by a newer Framewright"),
                                            ("1", '"version" is missing or not a whole number'),
                                            (1.0, '"version" is missing or not a whole number'),
                                            (True, '"version" is missing or not a whole number'),
                                            (None, '"version" is missing or not a whole number')])
def test_versions_this_program_cannot_read_are_refused_by_name(version, words):
    with pytest.raises(SessionFileError, match=words.replace("(", r"\(")):
        session_from_dict(file_with(version=version))


def test_the_current_version_reads_and_the_newer_message_names_both_versions():
    # Version 2 added positions; version-1 files still read.
    assert FORMAT_VERSION == 2
    assert session_from_dict(file_with(version=1)).mounts[0].name == "a"
    assert session_from_dict(file_with(version=2)).mounts[0].name == "a"
    with pytest.raises(SessionFileError) as caught:
        session_from_dict(file_with(version=3))
    assert "format version 3; this one reads up to 2" in str(caught.value)


def test_a_file_of_another_kind_is_refused_whatever_its_version():
    data = file_with()
    data["format"] = "framewright-sessions"
    with pytest.raises(SessionFileError, match="not a Framewright session"):
        session_from_dict(json.loads(json.dumps(data)))
