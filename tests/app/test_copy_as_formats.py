"""Copy as, without a window: every orientation format writes the convention it claims for every preference
that changes it (matrix direction, quaternion order, angle unit, sequence and intrinsic/extrinsic), from
every editor, and the numbers on the clipboard agree with SciPy. The numbers are read with a plain regular
expression (tests/core/test_formats_against_scipy.numbers_in), never with our decoder.

Check values: SciPy's scipy.spatial.transform.Rotation (a reference library): as_matrix, as_quat, as_rotvec,
as_euler (upper case intrinsic, lower case extrinsic), as_mrp; the Gibbs vector n tan(φ/2) from SciPy's
rotation vector (its definition in CONVENTIONS.md)."""

import csv
import json
from types import SimpleNamespace

import numpy as np
import pytest
from PySide6.QtGui import QGuiApplication
from scipy.spatial.transform import Rotation

from app import copy_as
from app.model import SessionModel
from core import representations
from core.formats import FormatOptions, csv_header
from core.orientation import Orientation
from core.session import Mount, Session
from tests.core.test_formats_against_scipy import numbers_in, scipy_numbers

ROTATION = Rotation.from_euler("ZYX", [-141.0, 27.0, 58.0], degrees=True)      # no symmetry to hide behind
NAME = "Boom camera"
CODE_FORMATS = ("text", "csv", "python", "c", "matlab")


def editor_of(kind):
    """What Copy as reads of the editor in use: its representation (core/representations.py)."""
    return SimpleNamespace(representation=representations.lookup(kind))


@pytest.fixture
def model():
    orientation = Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True))
    return SessionModel(Session((Mount("Other"), Mount(NAME, orientation)), selected=1))


def clipboard_numbers(fmt, text):
    if fmt == "csv":                     # a header naming units and convention, then the mount's row
        header, row = text.splitlines()
        cells = next(csv.reader([row]))
        assert cells[0] == NAME
        return header, numbers_in("csv", ",".join(cells[1:]))
    return None, numbers_in(fmt, text)


# (editor, preferences, what the copy must claim): each preference that changes a copy, both ways
CASES = [
    ("matrix", {"matrix_meaning": "body_to_reference"}, {"transposed": False}),
    ("matrix", {"matrix_meaning": "reference_to_body"}, {"transposed": True}),
    ("quaternion", {"quaternion_order": "wxyz"}, {"scalar_last": False}),
    ("quaternion", {"quaternion_order": "xyzw"}, {"scalar_last": True}),
    ("axis-angle", {"angle_units": "deg"}, {"degrees": True}),
    ("axis-angle", {"angle_units": "rad"}, {"degrees": False}),
    ("axis-angle", {"angle_units": "mrad"}, {"degrees": True}),     # copies are in degrees unless radians
    ("rotation-vector", {"angle_units": "rad"}, {"degrees": False}),
    ("rotation-vector", {"angle_units": "arcmin"}, {"degrees": True}),
    ("angles", {"sequence": "ZYX", "intrinsic": True, "angle_units": "deg"},
     {"sequence": "ZYX", "intrinsic": True, "degrees": True}),
    ("angles", {"sequence": "ZYX", "intrinsic": False, "angle_units": "rad"},
     {"sequence": "ZYX", "intrinsic": False, "degrees": False}),
    ("angles", {"sequence": "XYZ", "intrinsic": True, "angle_units": "rad"},
     {"sequence": "XYZ", "intrinsic": True, "degrees": False}),
    ("angles", {"sequence": "ZXZ", "intrinsic": False, "angle_units": "deg"},
     {"sequence": "ZXZ", "intrinsic": False, "degrees": True}),
    ("angles", {"sequence": "YXY", "intrinsic": True, "angle_units": "gon"},
     {"sequence": "YXY", "intrinsic": True, "degrees": True}),
]


@pytest.mark.parametrize("kind, preferences, claimed", CASES)
def test_each_copy_follows_the_preferences_and_agrees_with_scipy(model, kind, preferences, claimed):
    model.set_preferences(**preferences)
    options = FormatOptions(representation=kind, **claimed)
    want = scipy_numbers(ROTATION, kind, options)
    for fmt in CODE_FORMATS:
        result = copy_as.copy_to_clipboard(model, fmt, editor_of(kind))
        assert result.verified, result.status_message
        assert QGuiApplication.clipboard().text() == result.text
        header, got = clipboard_numbers(fmt, result.text)
        np.testing.assert_allclose(got, want, atol=1e-12, err_msg=f"{fmt}: {result.text}")
        if header is not None:
            assert header == "name," + csv_header(options).strip()


def test_the_gibbs_vector_and_the_mrp_agree_with_scipy(model):
    rotvec = ROTATION.as_rotvec()
    angle = np.linalg.norm(rotvec)
    gibbs = rotvec / angle * np.tan(angle / 2)                      # g = n tan(φ/2)
    for kind, want in (("gibbs", gibbs), ("mrp", ROTATION.as_mrp())):
        for fmt in CODE_FORMATS:
            result = copy_as.copy_to_clipboard(model, fmt, editor_of(kind))
            assert result.verified, result.status_message
            np.testing.assert_allclose(clipboard_numbers(fmt, result.text)[1], want, atol=1e-12)


def test_code_copies_use_the_mount_name_for_the_variable(model):
    text = copy_as.copy_to_clipboard(model, "python", editor_of("matrix")).text
    assert "Boom_camera = np.array([" in text
    text = copy_as.copy_to_clipboard(model, "c", editor_of("quaternion")).text
    assert "const double Boom_camera[4] = {" in text


@pytest.mark.parametrize("editor", [None, SimpleNamespace(), SimpleNamespace(representation=None)])
def test_without_an_editor_that_says_what_it_shows_the_quaternion_is_copied(model, editor):
    model.set_preferences(quaternion_order="xyzw")
    text = copy_as.copy_to_clipboard(model, "text", editor).text
    assert text.startswith("Quaternion (x, y, z, w), Hamilton, scalar last: ")
    np.testing.assert_allclose(numbers_in("text", text), ROTATION.as_quat(canonical=True), atol=1e-12)


@pytest.mark.parametrize("sequence, intrinsic, units", [("ZYX", True, "deg"), ("XZX", False, "rad")])
def test_the_json_copy_holds_every_representation_whatever_the_preferences(model, sequence, intrinsic, units):
    model.set_preferences(sequence=sequence, intrinsic=intrinsic, angle_units=units,
                          matrix_meaning="reference_to_body", quaternion_order="xyzw")
    result = copy_as.copy_to_clipboard(model, "json", editor_of("matrix"))
    assert result.verified and result.json_text == result.text
    data = json.loads(QGuiApplication.clipboard().text())
    assert data["name"] == NAME and data["sequence"] == sequence and data["intrinsic"] is intrinsic
    np.testing.assert_allclose(data["matrix"], ROTATION.as_matrix(), atol=1e-15)    # always body -> reference
    np.testing.assert_allclose(data["quaternion_wxyz"], ROTATION.as_quat(scalar_first=True, canonical=True),
                               atol=1e-15)
    name = sequence if intrinsic else sequence.lower()
    np.testing.assert_allclose(data["angles_deg"], ROTATION.as_euler(name, degrees=True), atol=1e-12)
    mime = QGuiApplication.clipboard().mimeData()
    assert json.loads(bytes(mime.data(copy_as.JSON_MIME)).decode("utf-8")) == data


@pytest.mark.parametrize("fmt", ["text", "csv", "python", "c", "matlab"])
def test_only_json_and_the_report_carry_the_json_type(model, fmt):
    copy_as.copy_to_clipboard(model, fmt, editor_of("matrix"))
    assert not QGuiApplication.clipboard().mimeData().hasFormat(copy_as.JSON_MIME)


def test_the_selected_mount_is_the_one_copied(model):
    model.select(0)
    text = copy_as.copy_to_clipboard(model, "csv", editor_of("quaternion")).text
    assert text.splitlines()[1] == "Other,1.0,0.0,0.0,0.0"          # the identity, w first
