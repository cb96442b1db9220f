"""Every export format checked against SciPy for the convention it claims, for every option that changes
it (matrix direction, quaternion order, sequence and intrinsic/extrinsic, degrees/radians), and the report's
matrix and its "same orientation in the other convention" line. The numbers are read out of the text by a
plain regular expression here, never by our own decoder, so a copy written in the wrong convention fails.

Check values: SciPy's scipy.spatial.transform.Rotation (a general-purpose reference library): as_matrix,
as_quat (scalar_first), as_rotvec, as_euler (upper case intrinsic, lower case extrinsic)."""

import csv
import io
import json
import re

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import Orientation
from core.formats import FormatOptions, render

NUMBER = re.compile(r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?")
ROTATION = Rotation.from_euler("ZYX", [112.0, -37.0, 64.0], degrees=True)    # no symmetry to hide behind
ORIENTATION = Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True))


def numbers_in(fmt, text):
    """The numbers a format wrote, read without our decoder: after the caption (text), the whole row
    (csv), or after the last '=' (code formats, whose captions and names may hold digits)."""
    if fmt == "text":
        body = text.split(":", 1)[1]
    elif fmt == "csv":
        body = ",".join(next(csv.reader(io.StringIO(text))))
    else:
        body = text.rsplit("=", 1)[1]
    return np.array([float(x) for x in NUMBER.findall(body)])


def scipy_numbers(rotation, representation, options):
    """What the representation holds in the convention `options` claims, computed by SciPy."""
    o = options
    if representation == "matrix":
        m = rotation.as_matrix()
        return (m.T if o.transposed else m).ravel()
    if representation == "quaternion":
        q = rotation.as_quat(scalar_first=True, canonical=True)
        return np.roll(q, -1) if o.scalar_last else q
    rotvec = rotation.as_rotvec(degrees=o.degrees)
    if representation == "rotation-vector":
        return rotvec
    if representation == "axis-angle":
        angle = np.linalg.norm(rotvec)
        return np.concatenate([rotvec / angle, [angle]])
    name = o.sequence if o.intrinsic else o.sequence.lower()
    return rotation.as_euler(name, degrees=o.degrees)


CODE_FORMATS = ["text", "csv", "python", "c", "matlab"]
CASES = ([("matrix", {"transposed": t}) for t in (False, True)]
         + [("quaternion", {"scalar_last": s}) for s in (False, True)]
         + [(rep, {"degrees": d}) for rep in ("axis-angle", "rotation-vector") for d in (True, False)]
         + [("angles", {"sequence": s, "intrinsic": i, "degrees": d})
            for s in ("ZYX", "XYZ", "YZX", "ZXZ", "YXY") for i in (True, False) for d in (True, False)])


@pytest.mark.parametrize("fmt", CODE_FORMATS)
@pytest.mark.parametrize("representation, changes", CASES)
def test_each_format_writes_the_convention_it_claims(fmt, representation, changes):
    options = FormatOptions(representation=representation, **changes)
    text = render(ORIENTATION, fmt, options)
    got = numbers_in(fmt, text)
    want = scipy_numbers(ROTATION, representation, options)
    assert got.shape == want.shape, text
    np.testing.assert_allclose(got, want, atol=1e-12, err_msg=text)


@pytest.mark.parametrize("preference, value, field, expected", [
    ("matrix_meaning", "reference_to_body", "transposed", True),
    ("matrix_meaning", "body_to_reference", "transposed", False),
    ("quaternion_order", "xyzw", "scalar_last", True),
    ("quaternion_order", "wxyz", "scalar_last", False),
    ("angle_units", "rad", "degrees", False),
    ("angle_units", "deg", "degrees", True)])
def test_window_preference_names_choose_the_convention(preference, value, field, expected):
    # The window passes its preferences by name: each must reach the renderer's convention.
    rep = {"transposed": "matrix", "scalar_last": "quaternion", "degrees": "rotation-vector"}[field]
    text = render(ORIENTATION, "csv", {"representation": rep, preference: value})
    want = scipy_numbers(ROTATION, rep, FormatOptions(representation=rep, **{field: expected}))
    np.testing.assert_allclose(numbers_in("csv", text), want, atol=1e-12)


@pytest.mark.parametrize("sequence, intrinsic", [("ZYX", True), ("XYZ", False), ("ZXZ", True), ("YXY", False)])
def test_json_holds_every_representation_in_its_stated_convention(sequence, intrinsic):
    data = json.loads(render(ORIENTATION, "json", FormatOptions(sequence=sequence, intrinsic=intrinsic)))
    np.testing.assert_allclose(data["matrix"], ROTATION.as_matrix(), atol=1e-15)
    np.testing.assert_allclose(data["quaternion_wxyz"], ROTATION.as_quat(scalar_first=True, canonical=True),
                               atol=1e-15)
    np.testing.assert_allclose(data["rotation_vector_deg"], ROTATION.as_rotvec(degrees=True), atol=1e-12)
    assert data["angle_deg"] == pytest.approx(np.degrees(ROTATION.magnitude()), abs=1e-12)
    assert data["sequence"] == sequence and data["intrinsic"] is intrinsic
    name = sequence if intrinsic else sequence.lower()
    np.testing.assert_allclose(data["angles_deg"], ROTATION.as_euler(name, degrees=True), atol=1e-12)


def report_line(text, start):
    lines = text.splitlines()
    index = next(i for i, line in enumerate(lines) if line.startswith(start))
    return lines, index


@pytest.mark.parametrize("sequence, intrinsic", [("ZYX", True), ("ZYX", False), ("XYZ", True), ("ZXZ", False),
                                                 ("YXY", True)])
def test_report_matrix_angles_and_other_convention_line_against_scipy(sequence, intrinsic):
    text = render(ORIENTATION, "report", FormatOptions(sequence=sequence, intrinsic=intrinsic))
    lines, i = report_line(text, "Rotation matrix, body -> reference:")
    matrix = np.array([[float(x) for x in NUMBER.findall(line)] for line in lines[i + 1:i + 4]])
    np.testing.assert_allclose(matrix, ROTATION.as_matrix(), atol=1e-10)    # ten decimals printed
    lines, i = report_line(text, "Quaternion (w, x, y, z):")
    np.testing.assert_allclose([float(x) for x in NUMBER.findall(lines[i].split(":")[1])],
                               ROTATION.as_quat(scalar_first=True, canonical=True), atol=1e-16)
    lines, i = report_line(text, "Rotation vector (deg):")
    np.testing.assert_allclose([float(x) for x in NUMBER.findall(lines[i].split(":")[1])],
                               ROTATION.as_rotvec(degrees=True), atol=1e-9)
    name = sequence if intrinsic else sequence.lower()
    lines, i = report_line(text, "Angles ")
    assert ("intrinsic" if intrinsic else "extrinsic") in lines[i]
    np.testing.assert_allclose([float(x) for x in NUMBER.findall(lines[i].split("deg:")[1])],
                               ROTATION.as_euler(name, degrees=True), atol=1e-9)
    # The other convention: the reversed sequence, intrinsic <-> extrinsic (SciPy's case swap).
    other = sequence[::-1] if not intrinsic else sequence[::-1].lower()
    lines, i = report_line(text, "The same spelled ")
    assert ("extrinsic" if intrinsic else "intrinsic") in lines[i]
    np.testing.assert_allclose([float(x) for x in NUMBER.findall(lines[i].split("deg:")[1])],
                               ROTATION.as_euler(other, degrees=True), atol=1e-9)
