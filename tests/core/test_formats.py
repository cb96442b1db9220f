"""Export formats: every one parses back through decode to 1e-12 degrees when printed exactly, and to the
printed precision (printed_precision_deg, stated there) when printed with fixed decimals. Orientations
come from SciPy's Rotation so the numbers rendered are checked against an outside library too."""

import json
import re
from datetime import datetime

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import formats
from core.formats import (FORMAT_NAMES, FORMATS, JSON_KEYS, NOISE_RELATIVE, REPRESENTATIONS, SAFETY_CAUTION,
                          FormatOptions, shortest_decimal,
                          csv_header, printed_precision_deg, render, round_trip_error, round_trip_hints)
from core.decode import decode
from core.orientation import Orientation


def from_scipy(rotation):
    return Orientation.from_quaternion(rotation.as_quat(scalar_first=True))


SAMPLES = {
    "identity": Rotation.identity(),
    "zyx-30-20-10": Rotation.from_euler("ZYX", [30, 20, 10], degrees=True),
    "180-about-x": Rotation.from_rotvec([np.pi, 0, 0]),
    "near-180": Rotation.from_rotvec([0.3, -2.1, 2.2]),
    "gimbal-lock": Rotation.from_euler("ZYX", [40, 90, 0], degrees=True),
    "tiny": Rotation.from_rotvec([1e-9, 0, 0]),
    **{f"random-{i}": r for i, r in enumerate(Rotation.random(6, random_state=11))},
}
OPTION_SETS = [
    {},
    {"transposed": True},
    {"scalar_last": True},
    {"degrees": False},
    {"sequence": "ZXZ", "intrinsic": False},
    {"sequence": "XYZ", "intrinsic": True, "degrees": False},
]


def cases():
    for fmt in FORMAT_NAMES:
        for rep in REPRESENTATIONS:
            for extra in OPTION_SETS:
                if fmt in ("json", "report") and (rep != "matrix" or extra):
                    continue            # these two write every representation whatever the options
                yield fmt, rep, extra


@pytest.mark.parametrize("sample", list(SAMPLES))
@pytest.mark.parametrize("fmt, rep, extra", list(cases()))
def test_every_format_round_trips_exactly(sample, fmt, rep, extra):
    o = from_scipy(SAMPLES[sample])
    options = FormatOptions(representation=rep, **extra)
    text = render(o, fmt, options)
    error = round_trip_error(o, text, fmt, options)
    bound = max(1e-12, printed_precision_deg(fmt, options))
    assert error <= bound, (text, error)
    # what comes back is SciPy's rotation (checked against SciPy's Rotation.as_matrix)
    decoded = decode(text, round_trip_hints(fmt, options))[0].orientation
    assert np.allclose(decoded.as_matrix(), SAMPLES[sample].as_matrix(), atol=1e-12, rtol=0)


@pytest.mark.parametrize("decimals", [4, 6, 9])
@pytest.mark.parametrize("fmt", FORMAT_NAMES)
@pytest.mark.parametrize("rep", REPRESENTATIONS)
def test_fixed_decimals_round_trip_to_the_printed_precision(decimals, fmt, rep):
    for rotation in Rotation.random(5, random_state=decimals):
        o = from_scipy(rotation)
        options = FormatOptions(representation=rep, decimals=decimals)
        error = round_trip_error(o, render(o, fmt, options), fmt, options)
        assert error <= printed_precision_deg(fmt, options)


def test_printed_precision_is_stated_and_zero_when_exact():
    assert printed_precision_deg("text") == 0.0
    assert printed_precision_deg("report") == 0.0               # its quaternion line is exact
    assert printed_precision_deg("text", {"decimals": 4}) == pytest.approx(np.degrees(4e-4))


def test_format_list_has_plain_labels_for_the_menu():
    assert [name for name, _ in FORMATS] == ["text", "json", "csv", "python", "c", "matlab", "report"]
    assert all(label and label[0].isupper() for _, label in FORMATS)


def test_json_is_one_object_with_the_listed_keys_and_sciPy_values():
    r = Rotation.from_euler("ZYX", [30, 20, 10], degrees=True)
    data = json.loads(render(from_scipy(r), "json"))
    assert set(JSON_KEYS) <= set(data)
    # checked against SciPy's Rotation
    assert np.allclose(data["matrix"], r.as_matrix(), atol=1e-15)
    assert np.allclose(data["quaternion_wxyz"], r.as_quat(scalar_first=True, canonical=True), atol=1e-15)
    assert np.allclose(data["rotation_vector_deg"], r.as_rotvec(degrees=True), atol=1e-12)
    assert np.allclose(data["angles_deg"], r.as_euler("ZYX", degrees=True), atol=1e-12)
    assert data["angle_deg"] == pytest.approx(np.degrees(r.magnitude()), abs=1e-12)
    assert data["sequence"] == "ZYX" and data["intrinsic"] is True


def test_json_axis_is_null_at_angle_zero():
    assert json.loads(render(Orientation.identity(), "json"))["axis"] is None


def test_csv_header_names_the_columns_of_the_row():
    o = from_scipy(Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))
    for rep in REPRESENTATIONS:
        header = csv_header({"representation": rep}).strip().split(",")
        row = render(o, "csv", {"representation": rep}).strip().split(",")
        assert len(header) == len(row)
    assert csv_header({"representation": "quaternion"}) == "qw,qx,qy,qz\n"
    assert csv_header({"representation": "angles"}) == "yaw_deg,pitch_deg,roll_deg\n"
    # header and row together also decode, read by the column names
    text = csv_header({"representation": "quaternion", "scalar_last": True}) + \
        render(o, "csv", {"representation": "quaternion", "scalar_last": True})
    assert decode(text)[0].orientation.angle_to(o) < 1e-12


def test_code_formats_are_valid_in_their_language_where_we_can_check():
    o = from_scipy(Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))
    for rep in REPRESENTATIONS:
        namespace = {}
        exec(render(o, "python", {"representation": rep}), namespace)      # noqa: S102 - our own output
        arrays = [v for k, v in namespace.items() if isinstance(v, np.ndarray)]
        assert len(arrays) == 1
    c = render(o, "c")
    assert c.count("{") == c.count("}") == 4 and c.rstrip().endswith("};")
    m = render(o, "matlab")
    assert m.startswith("% ") and m.rstrip().endswith("];")


def test_report_has_every_representation_conventions_time_and_the_caution():
    o = from_scipy(Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))
    text = render(o, "report", {"timestamp": datetime(2026, 12, 1, 9, 30), "name": "Camera bracket B"})
    for words in ("Quaternion (w, x, y, z)", "Rotation matrix, body -> reference", "Axis and angle",
                  "Rotation vector", "Angles Z-Y'-X'' intrinsic", "X-Y-Z extrinsic", "Gimbal margin",
                  "Conventions:", "2026-12-01 09:30:00", "Camera bracket B", SAFETY_CAUTION):
        assert words in text, words
    assert "not given" in render(o, "report")


def test_unknown_format_or_representation_is_refused():
    from core.errors import FramewrightError
    with pytest.raises(FramewrightError):
        render(Orientation.identity(), "xml")
    with pytest.raises(FramewrightError):
        render(Orientation.identity(), "text", {"representation": "spinor"})


def test_check_every_format_reports_each_error():
    o = from_scipy(Rotation.random(random_state=3))
    errors = formats.check_every_format(o)
    assert set(errors) == set(FORMAT_NAMES)
    assert all(e <= max(1e-12, printed_precision_deg(f)) for f, e in errors.items())


def test_the_windows_preference_names_are_understood():
    o = from_scipy(Rotation.from_euler("ZYX", [30, 20, 10], degrees=True))
    options = {"representation": "quaternion", "quaternion_order": "xyzw", "angle_units": "rad",
               "matrix_meaning": "reference_to_body", "caution": "Our own caution.", "name": "IMU 2",
               "timestamp": "2026-12-01T09:30:00+00:00"}
    text = render(o, "python", options)
    assert "scalar last" in text and "IMU_2 = np.array" in text
    assert round_trip_error(o, text, "python", options) <= 1e-12
    assert "Caution: Our own caution." in render(o, "report", options)
    with pytest.raises(Exception, match="unknown format option"):
        render(o, "text", {"representation": "matrix", "colour": "red"})


@pytest.mark.parametrize("fmt", FORMAT_NAMES)
@pytest.mark.parametrize("rep", REPRESENTATIONS)
@pytest.mark.parametrize("extra", [{}, {"scalar_last": True, "degrees": False, "sequence": "XYZ",
                                        "intrinsic": False, "transposed": True}])
def test_a_copy_pasted_back_without_hints_reads_first_as_what_was_copied(fmt, rep, extra):
    # the words each format writes beside its numbers are the ones the decoder reads as clues
    o = from_scipy(Rotation.from_rotvec([0.3, -2.1, 2.2]))
    options = {"representation": rep, **extra}
    text = render(o, fmt, options)
    if fmt == "csv":
        text = csv_header(options) + text
    assert decode(text)[0].orientation.angle_to(o) < 1e-12


@pytest.mark.parametrize("fmt", ["text", "csv", "python", "c", "matlab"])
def test_typed_angles_copy_as_typed_not_with_arithmetic_noise(fmt):
    # -30.4, 5.8, 2.5 come back through the quaternion as -30.39999999999999, 5.799999999999995 and
    # 2.5000000000000004 (a few units in the last place); the copy writes what was typed.
    o = Orientation.from_angles("ZYX", (-30.4, 5.8, 2.5), degrees=True)
    text = render(o, fmt, {"representation": "angles"})
    for typed in ("-30.4", "5.8", "2.5"):
        assert re.search(rf"(?<![\d.]){re.escape(typed)}(?![\d])", text), text
    assert "9999" not in text and "0000000" not in text
    options = FormatOptions(representation="angles")
    assert round_trip_error(o, text, fmt, options) <= 1e-12


def test_shortest_decimal_stays_within_its_bound_for_hostile_values():
    rng = np.random.default_rng(12)
    values = np.concatenate([rng.normal(size=2000), rng.normal(size=500) * 1e-300, rng.normal(size=500) * 1e300,
                             [5e-324, -5e-324, 1.7976931348623157e308, 0.1, 1 / 3, -0.0, 0.0, 1e-17]])
    for value in values:
        text = shortest_decimal(value)
        back = float(text)
        assert abs(back - value) <= NOISE_RELATIVE * abs(value), (value, text)
        assert len(text) <= 24 and text != "-0.0"
