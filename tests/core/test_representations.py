"""The representation registry (core/representations.py): every spelling earlier versions accepted still
names the same representation, the kinds decode, the formats and the command line use come from it, and
the two parameter sets read from captioned text, batch columns and the command line — never from bare
numbers."""

import json

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import representations
from core.batch import read_mounts
from core.decode import KINDS, decode
from core.orientation import Orientation


@pytest.mark.parametrize("spelling, kind", [
    ("rotation-vector", "rotation-vector"), ("rotation_vector", "rotation-vector"), ("rotvec", "rotation-vector"),
    ("rotation vector", "rotation-vector"), ("axis-angle", "axis-angle"), ("axis_angle", "axis-angle"),
    ("axisangle", "axis-angle"), ("euler", "angles"), ("dcm", "matrix"), ("quat", "quaternion"),
    ("Gibbs", "gibbs"), ("gibbs_vector", "gibbs"), ("MRP", "mrp"), ("modified_rodrigues_parameters", "mrp")])
def test_every_spelling_names_one_representation(spelling, kind):
    assert representations.lookup(spelling).kind == kind


def test_one_entry_per_representation_and_the_decoders_kinds_are_its_kinds():
    assert len({r.key for r in representations.ALL}) == len(representations.ALL)
    assert KINDS[:5] == ("matrix", "quaternion", "axis-angle", "rotation-vector", "angles")   # as before
    assert set(KINDS) == {r.kind for r in representations.ALL}
    assert representations.lookup("spinor") is None


@pytest.mark.parametrize("text, kind", [
    ("Gibbs vector: 0.1, -0.2, 0.3", "gibbs"),
    ("Gibbs 0.1 -0.2 0.3", "gibbs"),
    ("Rodrigues parameters = [0.1, -0.2, 0.3]", "gibbs"),
    ("classical Rodrigues parameters: 0.1 -0.2 0.3", "gibbs"),
    ("MRP: 0.1, -0.2, 0.3", "mrp"),
    ("modified Rodrigues parameters (0.1, -0.2, 0.3)", "mrp"),
    ("mrp_x,mrp_y,mrp_z\n0.1,-0.2,0.3", "mrp"),
    ("gibbs_x,gibbs_y,gibbs_z\n0.1,-0.2,0.3", "gibbs"),
])
def test_captioned_numbers_read_first_as_the_parameter_set_the_caption_names(text, kind):
    reading = decode(text)[0]
    assert reading.kind == kind
    # SciPy's Rotation.from_mrp for the modified set; g = n tan(φ/2) (Shuster 1993) for the Gibbs vector,
    # here through the quaternion (1, g) / sqrt(1 + |g|²)
    g = np.array([0.1, -0.2, 0.3])
    want = Rotation.from_mrp(g) if kind == "mrp" else Rotation.from_quat([*g, 1.0])
    got = reading.orientation.as_quaternion(scalar_last=True)
    assert Rotation.from_quat(got).approx_equal(want, atol=1e-12)


@pytest.mark.parametrize("text", ["0.1 -0.2 0.3", "0.1, 0.2, 0.3", "[1, 2, 3]", "rvec = [0.1, 0.2, 0.3]",
                                  "cv::Rodrigues(rvec): 0.1 0.2 0.3", "yaw 10 pitch 20 roll 30"])
def test_bare_or_otherwise_named_numbers_never_read_as_gibbs_or_mrp(text):
    assert not {r.kind for r in decode(text)} & {"gibbs", "mrp"}


def test_a_hint_reads_bare_numbers_as_a_parameter_set():
    [reading] = decode("0.1 -0.2 0.3", {"kind": "modified_rodrigues_parameters"})
    assert reading.kind == "mrp"
    assert Rotation.from_quat(reading.orientation.as_quaternion(scalar_last=True)).approx_equal(
        Rotation.from_mrp([0.1, -0.2, 0.3]), atol=1e-12)                   # SciPy's from_mrp


def test_our_json_holds_both_sets_and_null_for_the_gibbs_vector_at_a_half_turn():
    from core import formats
    data = json.loads(formats.render(Orientation.from_axis_angle((0, 0, 1), 180), "json"))
    assert data["gibbs"] is None and data["mrp"] == [0.0, 0.0, 1.0]
    with pytest.raises(Exception, match="infinite"):
        decode(formats.render(Orientation.from_axis_angle((0, 0, 1), 180), "json"), {"kind": "gibbs"})
    o = Orientation.from_axis_angle((1, 2, 3), 100)
    [reading] = decode(formats.render(o, "json"), {"kind": "mrp"})
    assert reading.orientation.angle_to(o) < 1e-12


def test_batch_reads_gibbs_and_mrp_columns_as_scipy_does():
    rotations = Rotation.random(50, random_state=5)
    q = rotations.as_quat()                                  # scalar last
    g = q[:, :3] / q[:, 3:]                                  # g = (x, y, z) / w (Shuster 1993)
    p = rotations.as_mrp()                                   # SciPy's as_mrp
    lines = ["name,nominal_gibbs_x,nominal_gibbs_y,nominal_gibbs_z,measured_mrp_z,measured_mrp_x,measured_mrp_y"]
    lines += [f"m{i},{a[0]:.17g},{a[1]:.17g},{a[2]:.17g},{b[2]:.17g},{b[0]:.17g},{b[1]:.17g}" for i, (a, b) in enumerate(zip(g, p))]
    table = read_mounts("\n".join(lines) + "\n")
    assert not table.problems
    for i in range(50):
        want = Orientation.from_quaternion(q[i], scalar_last=True)
        assert Orientation(table.nominal[i]).angle_to(want) < 1e-10
        assert Orientation(table.measured[i]).angle_to(want) < 1e-10
    assert [s.describe() for s in table.sets] == ["nominal: Gibbs vector", "measured: modified Rodrigues parameters"]


def test_batch_refuses_a_unit_on_pure_numbers_and_flags_non_finite_rows():
    from core.batch import BatchFileError
    with pytest.raises(BatchFileError, match="does not apply"):
        read_mounts("name,nominal_mrp_x[deg],nominal_mrp_y,nominal_mrp_z,measured_qw,measured_qx,measured_qy,"
                    "measured_qz\na,0,0,0,1,0,0,0\n")
    table = read_mounts("name,nominal_gibbs_x,nominal_gibbs_y,nominal_gibbs_z,measured_qw,measured_qx,measured_qy,"
                        "measured_qz\na,inf,0,0,1,0,0,0\nb,1e300,0,0,1,0,0,0\n")
    assert [p.row for p in table.problems] == [0]
    # a Gibbs vector of 1e300 is a half turn about x (g = n tan(φ/2), Shuster 1993)
    assert Orientation(table.nominal[1]).angle_to(Orientation.from_axis_angle((1, 0, 0), 180)) < 1e-9


@pytest.mark.parametrize("fmt", ["text", "json", "csv", "python", "c", "matlab", "report"])
def test_every_format_writes_and_reads_back_the_gibbs_vector_and_refuses_it_at_a_half_turn(fmt):
    from core import formats
    for rotation in Rotation.random(8, random_state=13):
        o = Orientation.from_quaternion(rotation.as_quat(scalar_first=True))
        options = {"representation": "gibbs"}
        text = formats.render(o, fmt, options)
        if fmt == "csv":
            text = formats.csv_header(options) + text
        assert formats.round_trip_error(o, text, fmt, options) <= 1e-12
        assert decode(text)[0].orientation.angle_to(o) < 1e-12      # read first as what was copied
    half = Orientation.from_axis_angle((0, 1, 0), 180)
    if fmt in ("json", "report"):     # every representation: the Gibbs vector is said to be infinite
        assert "infinite" in formats.render(half, "report") and '"gibbs": null' in formats.render(half, "json")
    else:
        with pytest.raises(Exception, match="infinite at a half turn"):
            formats.render(half, fmt, {"representation": "gibbs"})


@pytest.mark.parametrize("text", ["MRP: 10° 0 0", "mrp = [0.1, 0.2 rad, 0.3]", "Gibbs vector: 30′ 0 0"])
def test_a_parameter_set_with_an_angle_mark_is_refused_or_read_as_angles(text):
    # the parameter sets are pure numbers: a number marked as an angle is never one of theirs
    try:
        readings = decode(text)
    except Exception as error:
        assert "unit" in str(error)
    else:
        assert not {r.kind for r in readings} & {"gibbs", "mrp"}
    with pytest.raises(Exception, match="pure numbers|unit"):
        decode("10° 0 0", {"kind": "mrp"})
