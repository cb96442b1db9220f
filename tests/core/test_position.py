"""A mount's optional position: the value (SI inside, the unit shown beside it), its place in the session
file (version 2; version-1 files open without one), hostile stored values refused by their place, and
the chain's composition of full rigid transforms.

Check values: CONVENTIONS.md "Poses" (p_ref = R · p_body + t; the 4×4 [[R, t], [0 0 0 1]]) and
"Composition"; the chain's product is checked against a product of 4×4 matrices built with numpy, its
rotation part against SciPy's Rotation (a general-purpose reference library); 1 mm = 1e-3 m (SI brochure)."""

import json
import math

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.chain import Chain, ChainStep
from core.errors import FramewrightError
from core.orientation import Orientation
from core.position import LIMIT_M, Position
from core.session import (FORMAT_NAME, Mount, Session, SessionFileError, load_session, save_session,
                          session_file_bytes, session_from_dict)

Q = Rotation.from_euler("ZYX", [30, -12, 4], degrees=True).as_quat(scalar_first=True)


def file_with(version=2, **mount_keys):
    mount = {"name": "a", "orientation": {"quaternion_wxyz": [float(v) for v in Q]}, **mount_keys}
    return {"format": FORMAT_NAME, "version": version, "mounts": [mount]}


# ---- the value --------------------------------------------------------------------------------------

def test_a_position_typed_in_mm_is_kept_in_metres_and_shown_in_mm_again():
    p = Position.from_shown((12.5, 0, -3), "mm")
    assert p.metres == pytest.approx((0.0125, 0.0, -0.003), abs=1e-18)   # 1 mm = 1e-3 m (SI brochure)
    assert p.shown() == pytest.approx((12.5, 0.0, -3.0), rel=1e-15)
    assert p.unit == "mm"
    assert p.in_unit("m").shown() == pytest.approx((0.0125, 0.0, -0.003), rel=1e-15)


@pytest.mark.parametrize("values, unit, words", [
    ((math.nan, 0, 0), "mm", "x: nan is not a finite number"),
    ((0, math.inf, 0), "m", "y: inf is not a finite number"),
    ((0, 0, 1e308), "mm", "z: 1e+308 mm is farther than 1e+06 m"),
    ((0, 0, 1.0000001e6), "m", "farther than 1e+06 m"),
    ((0, 0, 1.0000001e9), "mm", "farther than 1e+06 m"),
    ((0, 0), "mm", "expected three numbers"),
    ("123", "mm", "expected three numbers"),
    ((0, "1", 0), "mm", "y: expected a number, got str"),
    ((True, 0, 0), "mm", "x: expected a number, got bool"),
    ((0, 0, 0), "furlong", "unknown length unit 'furlong'"),
])
def test_hostile_positions_are_refused_naming_the_axis(values, unit, words):
    with pytest.raises(FramewrightError, match=words.replace("+", r"\+").replace("(", r"\(")):
        Position.from_shown(values, unit)


def test_the_limit_itself_is_a_position():
    assert Position.from_shown((LIMIT_M, -LIMIT_M, 0), "m").metres == (1e6, -1e6, 0.0)
    assert Position.from_shown((1e9, 0, 0), "mm").metres == (1e6, 0.0, 0.0)


# ---- the session file -------------------------------------------------------------------------------

def test_a_session_with_a_position_saves_and_reopens_the_same(tmp_path):
    position = Position.from_shown((120.0, -35.5, 8.25), "mm")
    session = Session(mounts=(Mount("camera", Orientation.from_quaternion(Q), position=position), Mount("bare")))
    path = tmp_path / "pose.fwsession.json"
    save_session(session, path)
    data = json.loads(path.read_text())
    assert data["version"] == 2
    assert data["mounts"][0]["position"] == {"metres": list(position.metres), "unit": "mm"}
    assert "position" not in data["mounts"][1]          # no key at all for a mount without one
    again = load_session(path)
    assert again.mounts[0].position == position
    assert again.mounts[1].position is None


def test_a_version_1_file_opens_without_positions():
    session = session_from_dict(file_with(version=1))
    assert session.mounts[0].position is None


def test_a_version_1_file_that_claims_a_position_is_refused_not_dropped():
    with pytest.raises(SessionFileError, match=r"mounts\[0\]\.position: a position needs format version 2"):
        session_from_dict(file_with(version=1, position={"metres": [0, 0, 0], "unit": "mm"}))


@pytest.mark.parametrize("position, where, words", [
    ({"metres": [0, 0, 1e308], "unit": "mm"}, "position.metres[2]", "expected a distance in metres from -1e+06"),
    ({"metres": [0, 0, 1000001], "unit": "m"}, "position.metres[2]", "expected a distance in metres"),
    ({"metres": [0, "1", 0]}, "position.metres[1]", "expected a number, got text"),
    ({"metres": [0, 0]}, "position.metres", "expected a list of 3 numbers"),
    ({"metres": [0, 0, 0], "unit": "inch"}, "position.unit", "expected one of mm, m"),
    ({"metres": [0, 0, 0], "unit": "mm", "rotation": 1}, "position", "found also ['rotation']"),
    ({"unit": "mm"}, "position", 'expected {"metres"'),
    ([0, 0, 0], "position", "expected an object"),
    ({"metres": [0, True, 0]}, "position.metres[1]", "expected a number, got true"),
])
def test_a_damaged_stored_position_is_refused_by_its_place(position, where, words):
    with pytest.raises(SessionFileError) as caught:
        session_from_dict(file_with(position=position))
    message = str(caught.value)
    assert f"mounts[0].{where}" in message and words in message
    assert not caught.value.unexpected


def test_a_nan_position_from_a_file_is_refused_by_the_reader(tmp_path):
    path = tmp_path / "nan.fwsession.json"
    text = json.dumps(file_with(position={"metres": [0, 0, 0], "unit": "mm"})).replace("[0, 0, 0]", "[0, NaN, 0]")
    path.write_text(text)
    with pytest.raises(SessionFileError):
        load_session(path)


def test_saving_checks_that_the_position_reads_back():
    session = Session(mounts=(Mount("a", position=Position.from_shown((1, 2, 3), "m")),))
    assert b'"unit": "m"' in session_file_bytes(session)


# ---- the chain ----------------------------------------------------------------------------------------

def _homogeneous(rotation: Rotation, t) -> np.ndarray:
    """[[R, t], [0 0 0 1]] (CONVENTIONS.md "Poses"), built with numpy from SciPy's matrix."""
    h = np.eye(4)
    h[:3, :3] = rotation.as_matrix()
    h[:3, 3] = t
    return h


def test_a_chain_of_poses_is_the_product_of_its_4x4_matrices():
    rotations = [Rotation.from_euler("ZYX", a, degrees=True) for a in ([30, 10, -5], [-80, 45, 12], [5, -3, 170])]
    translations_mm = [(100.0, -20.0, 5.0), (0.0, 35.0, -12.5), (7.0, 7.0, 7.0)]
    steps = [ChainStep(f"s{i}", Orientation.from_quaternion(r.as_quat(scalar_first=True)),
                       position=Position.from_shown(t, "mm"))
             for i, (r, t) in enumerate(zip(rotations, translations_mm))]
    orientation, position = Chain(tuple(steps)).pose_product()
    want = np.linalg.multi_dot([_homogeneous(r, np.array(t) * 1e-3) for r, t in zip(rotations, translations_mm)])
    np.testing.assert_allclose(orientation.as_matrix(), want[:3, :3], atol=1e-14)
    np.testing.assert_allclose(position.metres, want[:3, 3], atol=1e-15)
    assert position.unit == "mm"
    # The rotation part on its own, against SciPy's composition (R = R_1 R_2 R_3).
    scipy_product = rotations[0] * rotations[1] * rotations[2]
    assert orientation.angle_to(Orientation.from_quaternion(scipy_product.as_quat(scalar_first=True))) < 1e-12


def test_an_inverted_disabled_or_bare_step_composes_as_its_4x4_says():
    a = Rotation.from_rotvec([0.3, -0.2, 0.9])
    b = Rotation.from_rotvec([-1.1, 0.4, 0.2])
    c = Rotation.from_rotvec([0.0, 2.0, 0.5])
    steps = (ChainStep("a", Orientation.from_quaternion(a.as_quat(scalar_first=True)),
                       position=Position.from_shown((0.5, 0.25, -1.0), "m")),
             ChainStep("b inverted", Orientation.from_quaternion(b.as_quat(scalar_first=True)), inverted=True,
                       position=Position.from_shown((10.0, -40.0, 3.0), "mm")),
             ChainStep("c bare", Orientation.from_quaternion(c.as_quat(scalar_first=True))),
             ChainStep("d off", Orientation.identity(), enabled=False, position=Position.from_shown((9, 9, 9), "m")))
    orientation, position = Chain(steps).pose_product()
    want = (_homogeneous(a, (0.5, 0.25, -1.0)) @ np.linalg.inv(_homogeneous(b, (0.010, -0.040, 0.003)))
            @ _homogeneous(c, (0.0, 0.0, 0.0)))
    np.testing.assert_allclose(orientation.as_matrix(), want[:3, :3], atol=1e-14)
    np.testing.assert_allclose(position.metres, want[:3, 3], atol=1e-15)
    assert position.unit == "m"          # the first step's unit


def test_a_chain_without_positions_has_none_and_its_frames_say_where_one_begins():
    r = Orientation.from_quaternion(Q)
    assert Chain((ChainStep("a", r), ChainStep("b", r))).pose_product()[1] is None
    frames = Chain((ChainStep("a", r), ChainStep("b", r, position=Position.from_shown((1, 2, 3), "mm")))).frames()
    assert frames[0].position is None
    np.testing.assert_allclose(frames[1].position.metres, r.as_matrix() @ [0.001, 0.002, 0.003], atol=1e-18)


def test_a_chain_whose_positions_reach_too_far_is_refused():
    far = Position.from_shown((6e5, 0, 0), "m")
    with pytest.raises(FramewrightError, match="add up to 1.2e\\+06 m"):
        Chain((ChainStep("a", Orientation.identity(), position=far), ChainStep("b", Orientation.identity(), position=far)))


def test_a_chain_step_position_saves_and_reads_back_and_version_1_refuses_it():
    step = ChainStep("plate", Orientation.from_quaternion(Q), position=Position.from_shown((1, 2, 3), "mm"))
    assert ChainStep.from_dict(json.loads(json.dumps(step.to_dict()))) == step
    data = file_with(version=1)
    data["chains"] = [{"name": "c", "steps": [step.to_dict()]}]
    with pytest.raises(SessionFileError, match=r"chains\[0\]\.steps\[0\]\.position: a position needs format version 2"):
        session_from_dict(data)
    data["version"] = 2
    data["chains"][0]["steps"][0]["position"]["metres"][1] = 1e300
    with pytest.raises(SessionFileError, match=r"chains\[0\]\.steps\[0\]\.position\.metres\[1\]"):
        session_from_dict(data)


def test_a_saved_check_keeps_its_position_tolerance_and_a_version_1_file_may_not_hold_one():
    data = file_with(version=2)
    data["checks"] = [{"name": "check", "nominal": "a", "measured": "a",
                       "settings": {"mode": "total", "position_tolerance_mm": 0.5}}]
    assert session_from_dict(data).checks[0].settings.position_tolerance_mm == 0.5
    data["checks"][0]["settings"]["position_tolerance_mm"] = -1
    with pytest.raises(SessionFileError, match=r"checks\[0\]\.settings\.position_tolerance_mm: expected a tolerance"):
        session_from_dict(data)
    data["version"] = 1
    data["checks"][0]["settings"]["position_tolerance_mm"] = 0.5
    with pytest.raises(SessionFileError, match="needs format version 2"):
        session_from_dict(data)
