"""How a batch header's column sets are described, one for every representation and each convention a
tag can set, and the refusal word for word when a header tag and a convention passed in disagree.
The conventions named are the ones the header states (or the documented defaults: degrees,
body_to_reference); intrinsic ZYX for yaw-pitch-roll is common practice."""

import pytest

from core.batch import read_mounts
from core.batch_header import BatchFileError, SetConventions

MATRIX = ["r11", "r12", "r13", "r21", "r22", "r23", "r31", "r32", "r33"]
QUATERNION = ["qw", "qx", "qy", "qz"]


def _file(nominal, measured):
    header = ",".join(["name"] + ["nominal_" + c for c in nominal] + ["measured_" + c for c in measured])
    return header + "\n" + ",".join(["a"] + ["0"] * (len(nominal) + len(measured))) + "\n"


@pytest.mark.parametrize("nominal, measured, words", [
    (["angle1[ZYX intrinsic]", "angle2", "angle3"], ["angle1[xyz extrinsic rad]", "angle2", "angle3"],
     ["nominal: angles ZYX intrinsic, degrees", "measured: angles XYZ extrinsic, radians"]),
    (["yaw", "pitch", "roll"], ["yaw[rad]", "pitch", "roll"],
     ["nominal: yaw-pitch-roll (intrinsic ZYX), degrees", "measured: yaw-pitch-roll (intrinsic ZYX), radians"]),
    (["r11[reference_to_body]"] + MATRIX[1:], ["axis_x", "axis_y", "axis_z", "angle[rad]"],
     ["nominal: matrix, reference_to_body", "measured: axis and angle, radians"]),
    (MATRIX, ["rv_x", "rv_y", "rv_z"], ["nominal: matrix, body_to_reference", "measured: rotation vector, degrees"]),
    (["gibbs_x", "gibbs_y", "gibbs_z"], ["mrp_x", "mrp_y", "mrp_z"],
     ["nominal: Gibbs vector", "measured: modified Rodrigues parameters"]),
    (QUATERNION, QUATERNION, ["nominal: quaternion (Hamilton)", "measured: quaternion (Hamilton)"])])
def test_each_column_set_is_described_with_the_conventions_in_force(nominal, measured, words):
    assert [s.describe() for s in read_mounts(_file(nominal, measured)).sets] == words


@pytest.mark.parametrize("first, passed, says", [
    ("angle1[ZYX extrinsic]", SetConventions(intrinsic=True), "the header says extrinsic but intrinsic was passed in"),
    ("angle1[ZYX intrinsic]", SetConventions(intrinsic=False), "the header says intrinsic but extrinsic was passed in"),
    ("angle1[ZYX intrinsic rad]", SetConventions(degrees=True), "the header says rad but deg was passed in"),
    ("angle1[ZYX intrinsic deg]", SetConventions(degrees=False), "the header says deg but rad was passed in"),
    ("angle1[ZYX]", SetConventions(sequence="XYZ", intrinsic=True), "the header says ZYX but XYZ was passed in")])
def test_a_header_and_a_convention_passed_in_that_disagree_are_refused_naming_both(first, passed, says):
    with pytest.raises(BatchFileError) as raised:
        read_mounts(_file([first, "angle2", "angle3"], QUATERNION), passed)
    assert str(raised.value) == f"line 1, column 'nominal_{first}': {says}; expected them to agree"
