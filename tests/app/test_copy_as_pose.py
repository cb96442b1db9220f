"""Copy as a pose, without a window: the 4×4 pose matrix and the pose line of a mount with a position,
checked against SciPy for the conventions they state (R body -> reference with t in the mount's own
unit; the quaternion w-first or w-last as the preference asks), the status line with the position's
round-trip error, and a copy whose position does not read back, which is NOT verified.

Check values: SciPy's Rotation (as_matrix, as_quat); the pose convention p_ref = R p_body + t and its
4×4 form [[R, t], [0 0 0 1]] (CONVENTIONS.md, a common practice of robotics)."""

import re

import numpy as np
import pytest
from PySide6.QtGui import QGuiApplication
from scipy.spatial.transform import Rotation

from app import copy_as
from app.model import SessionModel
from core import pose_formats
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, Session

ROTATION = Rotation.from_euler("ZYX", [-63.0, 14.0, 151.0], degrees=True)
SHOWN = (120.5, -4.25, 930.0)


def placed_model(unit="mm", shown=SHOWN):
    mount = Mount("Radar antenna", Orientation.from_quaternion(ROTATION.as_quat(scalar_first=True)),
                  position=Position.from_shown(shown, unit))
    return SessionModel(Session((Mount("Mast unit"), mount), selected=1))


def data_rows(text):
    """The rows of numbers under the '#' header lines, read without our decoder."""
    rows = [line for line in text.splitlines() if line.strip() and not line.startswith("#")]
    return [[float(x) for x in re.split(r"[,\s]+", row.strip())] for row in rows]


@pytest.mark.parametrize("unit, shown", [("mm", SHOWN), ("m", (0.1205, -0.00425, 0.93))])
@pytest.mark.parametrize("order", ["wxyz", "xyzw"])
def test_the_pose_matrix_is_r_and_t_in_the_mounts_unit(unit, shown, order):
    model = placed_model(unit, shown)
    model.set_preferences(quaternion_order=order)              # the matrix has no quaternion to order
    result = copy_as.copy_to_clipboard(model, "pose-matrix")
    assert result.verified, result.status_message
    assert QGuiApplication.clipboard().text() == result.text
    header = result.text.splitlines()[0]
    assert header.startswith("# Pose as a 4x4 homogeneous matrix") and f"t in {unit};" in header
    matrix = np.array(data_rows(result.text))
    np.testing.assert_allclose(matrix[:3, :3], ROTATION.as_matrix(), atol=1e-15)
    np.testing.assert_allclose(matrix[:3, 3], shown, rtol=1e-15)
    np.testing.assert_array_equal(matrix[3], [0.0, 0.0, 0.0, 1.0])
    assert result.round_trip_error_m <= copy_as.VERIFIED_LIMIT_M


def test_the_pose_line_is_t_then_the_quaternion_w_first():
    model = placed_model()
    result = copy_as.copy_to_clipboard(model, "pose-line")
    assert result.verified, result.status_message
    assert result.text.splitlines()[1] == "# x_mm y_mm z_mm qw qx qy qz"
    (row,) = data_rows(result.text)
    np.testing.assert_allclose(row[:3], SHOWN, rtol=1e-15)
    np.testing.assert_allclose(row[3:], ROTATION.as_quat(scalar_first=True, canonical=True), atol=1e-15)


def test_the_pose_line_is_t_then_the_quaternion_w_last_when_asked():
    model = placed_model()
    model.set_preferences(quaternion_order="xyzw")
    result = copy_as.copy_to_clipboard(model, "pose-line")
    assert result.verified, result.status_message
    assert result.text.splitlines()[1] == "# x_mm y_mm z_mm qx qy qz qw"
    (row,) = data_rows(result.text)
    np.testing.assert_allclose(row[:3], SHOWN, rtol=1e-15)
    np.testing.assert_allclose(row[3:], ROTATION.as_quat(canonical=True), atol=1e-15)     # SciPy: scalar last


@pytest.mark.parametrize("fmt", copy_as.POSE_FORMATS)
@pytest.mark.parametrize("unit", ["in", "thou"])
def test_a_position_in_the_trades_inch_units_is_copied_as_a_pose(fmt, unit):
    result = copy_as.copy_to_clipboard(placed_model(unit, (4.5, -1.25, 36.0)), fmt)
    assert result.verified, result.status_message


@pytest.mark.parametrize("fmt", copy_as.POSE_FORMATS)
def test_a_verified_pose_copy_states_both_round_trip_errors(fmt):
    result = copy_as.copy_to_clipboard(placed_model(), fmt)
    label = re.escape(copy_as.FORMATS[fmt])
    assert re.fullmatch(rf"Copied as {label}; decoded back, round-trip error \d\.\de[-+]\d\d° and "
                        r"\d\.\de[-+]\d\d mm — verified\.", result.status_message), result.status_message
    assert f" and {result.round_trip_error_m * 1e3:.1e} mm — verified." in result.status_message


def written_off_by(monkeypatch, metres):
    """Copies whose position is written `metres` off along +X (a renderer with a fault)."""
    real = pose_formats.render_pose

    def moved(orientation, position, fmt, scalar_last=False):
        shifted = np.array(position.metres) + (metres, 0.0, 0.0)
        return real(orientation, Position(tuple(shifted), position.unit), fmt, scalar_last)

    monkeypatch.setattr(pose_formats, "render_pose", moved)


def test_a_pose_copy_within_a_nanometre_is_verified_and_says_how_far_in_mm(monkeypatch):
    written_off_by(monkeypatch, 9.949e-10)                      # 9.949e-07 mm, printed 9.9e-07
    result = copy_as.copy_to_clipboard(placed_model(), "pose-line")
    assert result.verified and result.json_text is None
    assert result.round_trip_error_m == pytest.approx(9.949e-10, rel=1e-6)
    assert result.status_message.endswith(" and 9.9e-07 mm — verified."), result.status_message


def test_a_pose_copy_a_millimetre_off_says_so_in_mm(monkeypatch):
    written_off_by(monkeypatch, 0.999e-3)
    result = copy_as.copy_to_clipboard(placed_model(), "pose-line")
    assert not result.verified
    assert " and 0.999 mm — NOT verified; " in result.status_message, result.status_message


def test_a_pose_copy_whose_position_is_a_micrometre_off_is_not_verified(monkeypatch):
    written_off_by(monkeypatch, 1e-6)
    result = copy_as.copy_to_clipboard(placed_model(), "pose-matrix")
    assert not result.verified
    assert result.round_trip_error_m == pytest.approx(1e-6, rel=1e-6)
    error = f"{result.round_trip_error_deg:.3g}"
    assert result.status_message == (f"Copied as 4×4 pose matrix (needs a position), but decoded back it differs "
                                     f"by {error}° and 0.001 mm — NOT verified; check the digits before handing it on.")


def test_a_pose_is_rendered_with_its_errors_as_plain_numbers():
    model = placed_model()
    text, angle, distance = copy_as.render_pose_copy(model, "pose-line")
    assert type(angle) is float and type(distance) is float
    assert (text, None, angle) == copy_as.render_copy(model, "pose-line")
    assert text == copy_as.copy_to_clipboard(model, "pose-line").text
