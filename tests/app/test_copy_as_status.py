"""Copy as, without a window: when a copy is called verified and what the status line says (verified, NOT
verified, nothing copied), the limits of "verified" on both sides, which formats are offered for a mount
with and without a position, and a failing renderer that leaves the user's clipboard alone.

Check values: the limits app/copy_as.py documents (1e-9° and 1e-9 m), worked by hand; the off-by-0.1°
copy is made by turning the orientation 0.1° about +Z before it is written (so its error is 0.1°)."""

import re
from types import SimpleNamespace

import pytest
from PySide6.QtGui import QGuiApplication

from app import copy_as
from app.copy_as import CopyResult
from app.model import SessionModel
from core import formats, representations
from core.orientation import Orientation
from core.position import Position
from core.session import Mount, Session

TURN = Orientation.from_angles("ZYX", (33.0, -12.0, 71.0))
QUATERNION_EDITOR = SimpleNamespace(representation=representations.QUATERNION)
ORIENTATION_FORMATS = [f for f in copy_as.FORMATS if f not in copy_as.POSE_FORMATS]


@pytest.fixture
def model():
    return SessionModel(Session((Mount("Mast unit", TURN),)))


@pytest.fixture
def placed():
    return SessionModel(Session((Mount("Mast unit", TURN, position=Position.from_shown((120.0, -4.5, 9.0))),)))


@pytest.mark.parametrize("fmt", ORIENTATION_FORMATS)
def test_a_good_copy_says_it_was_verified_with_its_error(model, fmt):
    result = copy_as.copy_to_clipboard(model, fmt, QUATERNION_EDITOR)
    assert result.verified and result.fmt == fmt and result.round_trip_error_m is None
    assert 0.0 <= result.round_trip_error_deg <= copy_as.VERIFIED_LIMIT_DEG
    label = re.escape(copy_as.FORMATS[fmt])
    assert re.fullmatch(rf"Copied as {label}; decoded back, round-trip error \d\.\de[-+]\d\d° — verified\.",
                        result.status_message), result.status_message
    assert f"{result.round_trip_error_deg:.1e}°" in result.status_message


def test_a_copy_off_by_a_tenth_of_a_degree_is_not_verified_and_says_by_how_much(model, monkeypatch):
    real = formats._RENDERERS["csv"]
    monkeypatch.setitem(formats._RENDERERS, "csv",
                        lambda o, options: real(o @ Orientation.from_axis_angle([0, 0, 1], 0.1), options))
    result = copy_as.copy_to_clipboard(model, "csv", QUATERNION_EDITOR)
    assert not result.verified
    assert result.round_trip_error_deg == pytest.approx(0.1, abs=1e-9)
    assert result.status_message == ("Copied as CSV (header and row), but decoded back it differs by 0.1° — NOT "
                                     "verified; check the digits before handing it on.")
    assert QGuiApplication.clipboard().text() == result.text       # copied all the same, and said so


def test_a_failing_renderer_copies_nothing_and_keeps_the_clipboard(model, monkeypatch):
    QGuiApplication.clipboard().setText("kept")

    def broken(orientation, options):
        raise RuntimeError("simulated failure")

    monkeypatch.setitem(formats._RENDERERS, "matlab", broken)
    result = copy_as.copy_to_clipboard(model, "matlab", QUATERNION_EDITOR)
    assert result == CopyResult("matlab", "", None, None, "Nothing copied: MATLAB / Octave failed (simulated failure).")
    assert not result.verified and QGuiApplication.clipboard().text() == "kept"


def test_an_unknown_format_is_refused_by_name(model):
    with pytest.raises(KeyError, match="unknown copy format 'xml'; expected one of text, json, csv, python, c, "
                                       "matlab, report, pose-matrix, pose-line"):
        copy_as.render_copy(model, "xml")
    QGuiApplication.clipboard().setText("kept")
    result = copy_as.copy_to_clipboard(model, "xml")
    assert result.status_message.startswith("Nothing copied: xml failed (") and "unknown copy format" in \
        result.status_message
    assert QGuiApplication.clipboard().text() == "kept"


def test_json_that_does_not_read_back_is_not_offered_as_json(model, monkeypatch):
    monkeypatch.setitem(formats._RENDERERS, "json", lambda o, options: "{not json")
    result = copy_as.copy_to_clipboard(model, "report", QUATERNION_EDITOR)
    assert result.verified and result.text.startswith("Framewright orientation report")
    mime = QGuiApplication.clipboard().mimeData()
    assert mime.text() == result.text and not mime.hasFormat(copy_as.JSON_MIME)


def test_the_report_carries_the_json_type_as_well(model):
    result = copy_as.copy_to_clipboard(model, "report", QUATERNION_EDITOR)
    mime = QGuiApplication.clipboard().mimeData()
    assert mime.text() == result.text
    assert bytes(mime.data(copy_as.JSON_MIME)).decode("utf-8") == result.json_text
    assert result.json_text == formats.render(TURN, "json", {"name": "Mast unit"})


@pytest.mark.parametrize("error_deg, verified", [(None, False), (0.0, True), (1e-9, True), (1.0001e-9, False),
                                                 (float("nan"), False)])
def test_an_orientation_copy_is_verified_up_to_a_billionth_of_a_degree(error_deg, verified):
    assert CopyResult("json", "", None, error_deg, "").verified is verified
    assert CopyResult("json", "", None, error_deg, "", round_trip_error_m=5.0).verified is verified   # no pose


@pytest.mark.parametrize("fmt", copy_as.POSE_FORMATS)
@pytest.mark.parametrize("error_deg, error_m, verified", [
    (0.0, 0.0, True), (1e-9, 1e-9, True), (0.0, 1.0001e-9, False), (1.0001e-9, 0.0, False), (0.0, None, False),
    (None, 0.0, False)])
def test_a_pose_copy_is_verified_when_its_position_reads_back_within_a_nanometre(fmt, error_deg, error_m,
                                                                                  verified):
    assert CopyResult(fmt, "", None, error_deg, "", error_m).verified is verified


def test_pose_formats_are_offered_only_for_a_mount_with_a_position(model, placed):
    for fmt in copy_as.FORMATS:
        assert copy_as.offered(placed, fmt)
        assert copy_as.offered(model, fmt) is (fmt not in copy_as.POSE_FORMATS)


def test_a_pose_copy_of_a_mount_without_a_position_is_refused_and_copies_nothing(model):
    QGuiApplication.clipboard().setText("kept")
    result = copy_as.copy_to_clipboard(model, "pose-matrix")
    assert result.status_message == ("Nothing copied: 4×4 pose matrix (needs a position) failed (the pose-matrix "
                                     "format needs a mount with a position; this one has none).")
    assert QGuiApplication.clipboard().text() == "kept"


def test_a_copy_written_in_another_convention_than_its_caption_is_not_verified(model, monkeypatch):
    # w-last numbers under a w-first caption: read back with the format's own hints they are another
    # orientation, so the copy must not pass (a reading that guessed the order would hide the fault)
    real = formats._values

    def swapped(orientation, options):
        values = real(orientation, options)
        return values[1:] + values[:1] if options.representation == "quaternion" else values

    monkeypatch.setattr(formats, "_values", swapped)
    for fmt in ("text", "python", "c", "matlab", "csv"):
        result = copy_as.copy_to_clipboard(model, fmt, QUATERNION_EDITOR)
        assert not result.verified and "NOT verified" in result.status_message, (fmt, result.status_message)


@pytest.mark.parametrize("kind", ["matrix", "angles", "axis-angle", "rotation-vector"])
@pytest.mark.parametrize("fmt", ["json", "report"])
def test_json_and_the_report_are_read_back_by_their_exact_quaternion_from_any_editor(model, fmt, kind):
    # the report prints its matrix and angles to ten decimals and its quaternion exactly: read back by
    # the quaternion, whichever editor was in use, the copy is exact
    editor = SimpleNamespace(representation=representations.lookup(kind))
    result = copy_as.copy_to_clipboard(model, fmt, editor)
    assert result.verified, result.status_message
    assert result.round_trip_error_deg < 1e-12
