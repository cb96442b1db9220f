"""A batch header's column sets (core/batch_header.py, through read_mounts): every accepted spelling of
every set, columns in any order, case, spaces and quotes, ignored columns, and each refusal word for
word. The expected column names are the file format as documented in core/batch.py's docstring and the
README; the values read back are our own invented rows (the identity, and a quaternion of our choosing)."""

import pytest

from core.batch import read_mounts
from core.batch_header import BatchFileError, SetConventions
from core.errors import InvalidInputError

SETS = {
    "matrix": ["r11", "r12", "r13", "r21", "r22", "r23", "r31", "r32", "r33"],
    "quaternion": ["qw", "qx", "qy", "qz"],
    "axis_angle": ["axis_x", "axis_y", "axis_z", "angle"],
    "rotation_vector": ["rv_x", "rv_y", "rv_z"],
    "gibbs": ["gibbs_x", "gibbs_y", "gibbs_z"],
    "mrp": ["mrp_x", "mrp_y", "mrp_z"],
    "yaw_pitch_roll": ["yaw", "pitch", "roll"],
    "angles": ["angle1[ZYX intrinsic]", "angle2", "angle3"],
}
IDENTITY = {"matrix": "1,0,0,0,1,0,0,0,1", "quaternion": "1,0,0,0", "axis_angle": "1,0,0,0"}
EVERY_SET = ("r11 r12 r13 r21 r22 r23 r31 r32 r33; qw qx qy qz; axis_x axis_y axis_z angle; rv_x rv_y rv_z; "
             "gibbs_x gibbs_y gibbs_z; mrp_x mrp_y mrp_z; yaw pitch roll; angle1 angle2 angle3")
EVERY_FIELD = ("r11, r12, r13, r21, r22, r23, r31, r32, r33, qw, qx, qy, qz, axis_x, axis_y, axis_z, angle, rv_x, "
               "rv_y, rv_z, gibbs_x, gibbs_y, gibbs_z, mrp_x, mrp_y, mrp_z, yaw, pitch, roll, angle1, angle2, angle3")
Q = ["qw", "qx", "qy", "qz"]


def _text(header, row):
    return ",".join(header) + "\n" + row + "\n"


def _refused(words, header, row=None, **kwargs):
    row = row if row is not None else ",".join(["a"] + ["0"] * (len(header) - 1))
    with pytest.raises(BatchFileError) as raised:
        read_mounts(_text(header, row), **kwargs)
    assert str(raised.value) == words
    return raised.value


@pytest.mark.parametrize("nominal", list(SETS))
@pytest.mark.parametrize("measured", list(SETS))
def test_every_set_is_recognised_for_either_role(nominal, measured):
    header = ["name"] + ["nominal_" + c for c in SETS[nominal]] + ["measured_" + c for c in SETS[measured]]
    row = ",".join(["a", IDENTITY.get(nominal, "0,0,0"), IDENTITY.get(measured, "0,0,0")])
    table = read_mounts(_text(header, row))
    assert [s.representation for s in table.sets] == [nominal, measured]
    assert table.sets[0].indices == tuple(range(1, 1 + len(SETS[nominal])))
    assert table.problems == () and table.nominal.tolist() == [[1, 0, 0, 0]] == table.measured.tolist()


def test_columns_in_any_order_are_taken_by_name():
    header = ["name", "measured_qz", "nominal_qx", "measured_qw", "nominal_qw", "measured_qy", "nominal_qz",
              "nominal_qy", "measured_qx"]
    # nominal (0.6, 0.8, 0, 0) and measured (0, 0, 0.6, 0.8), each cell under its own name
    table = read_mounts(_text(header, "a,0.8,0.8,0,0.6,0.6,0,0,0"))
    assert table.nominal.tolist() == [[0.6, 0.8, 0.0, 0.0]] and table.measured.tolist() == [[0.0, 0.0, 0.6, 0.8]]
    assert table.sets[0].columns == ("nominal_qw", "nominal_qx", "nominal_qy", "nominal_qz")
    assert table.sets[0].indices == (4, 2, 7, 6) and table.sets[1].indices == (3, 8, 5, 1)


def test_case_spaces_and_quotes_in_column_names_are_read():
    header = [' Name ', '"NOMINAL_QW"', " Nominal_Qx ", "nominal_qy", "nominal_qz", "measured_Yaw [ Rad ]",
              "MEASURED_PITCH", '"measured_roll [rad]"', " Uncertainty_Deg "]
    table = read_mounts(_text(header, "a,1,0,0,0,0,0,0,0.5"))
    assert [s.representation for s in table.sets] == ["quaternion", "yaw_pitch_roll"]
    assert table.sets[1].degrees is False and table.sets[1].sequence == "ZYX" and table.sets[1].intrinsic is True
    assert table.sets[0].columns[0] == "NOMINAL_QW" and table.uncertainty.tolist() == [0.5]


def test_tags_in_any_case_separated_by_spaces_or_semicolons():
    header = (["name", "nominal_angle1[xyz;EXTRINSIC; radians]", "nominal_angle2[rad]", "nominal_angle3"]
              + ["measured_r11[Reference_To_Body]"] + ["measured_" + c for c in SETS["matrix"][1:]])
    table = read_mounts(_text(header, "a,0,0,0,1,0,0,0,1,0,0,0,1"))
    nominal, measured = table.sets
    assert (nominal.sequence, nominal.intrinsic, nominal.degrees) == ("XYZ", False, False)
    assert measured.matrix_meaning == "reference_to_body"


def test_the_defaults_are_degrees_and_body_to_reference_and_conventions_passed_in_fill_what_is_unsaid():
    header = ["name"] + ["nominal_" + c for c in SETS["matrix"]] + ["measured_angle1", "measured_angle2",
                                                                     "measured_angle3"]
    row = "a,1,0,0,0,1,0,0,0,1,0,0,0"
    table = read_mounts(_text(header, row), measured=SetConventions(sequence="zxz", intrinsic=False))
    assert table.sets[0].matrix_meaning == "body_to_reference" and table.sets[1].degrees is True
    assert (table.sets[1].sequence, table.sets[1].intrinsic) == ("ZXZ", False)
    passed = read_mounts(_text(header, row), nominal=SetConventions(matrix_meaning="reference_to_body"),
                         measured=SetConventions(sequence="ZYX", intrinsic=True, degrees=False))
    assert passed.sets[0].matrix_meaning == "reference_to_body" and passed.sets[1].degrees is False
    # a header tag that agrees with what is passed in is fine
    agreed = ["name"] + ["nominal_" + c for c in Q] + ["measured_angle1[ZYX intrinsic rad]", "measured_angle2",
                                                       "measured_angle3"]
    table = read_mounts(_text(agreed, "a,1,0,0,0,0,0,0"),
                        measured=SetConventions(sequence="ZYX", intrinsic=True, degrees=False))
    assert table.sets[1].degrees is False
    # a convention a representation does not use is ignored when passed in
    quaternions = ["name"] + ["nominal_" + c for c in Q] + ["measured_" + c for c in Q]
    table = read_mounts(_text(quaternions, "a,1,0,0,0,1,0,0,0"),
                        nominal=SetConventions(sequence="ZYX", degrees=False, matrix_meaning="reference_to_body"))
    assert table.sets[0].sequence is None and table.sets[0].matrix_meaning == "body_to_reference"


def test_unknown_columns_are_ignored_and_said():
    header = ["name", "temperature", "nominal_qw", "nominal_qx", "nominal_qy", "nominal_qz", "note"] + \
             ["measured_" + c for c in Q]
    table = read_mounts(_text(header, "a,21.5,1,0,0,0,fine,1,0,0,0"))
    assert table.notes == ("ignored column(s): temperature, note",) and table.problems == ()


QUATERNIONS = ["nominal_" + c for c in Q] + ["measured_" + c for c in Q]


@pytest.mark.parametrize("header, words", [
    (["id"] + QUATERNIONS, "line 1: the first column must be 'name', got 'id'"),
    (["name;nominal_qw"] + QUATERNIONS[1:], "line 1: the first column must be 'name', got 'name;nominal_qw' (the "
                                            "file seems to use ';' between cells; expected ',')"),
    (QUATERNIONS, "line 1: the first column must be 'name', got 'nominal_qw'"),
    (["name"] + QUATERNIONS + ["uncertainty_deg", "UNCERTAINTY_DEG"],
     "line 1: the column 'uncertainty_deg' appears twice"),
    (["name", "nominal_qw[deg"] + QUATERNIONS[1:],
     "line 1, column 'nominal_qw[deg': cannot read this column name; expected e.g. nominal_qw or measured_yaw[deg]"),
    (["name", "measured-qw"] + QUATERNIONS,
     "line 1, column 'measured-qw': cannot read this column name; expected e.g. nominal_qw or measured_yaw[deg]"),
    (["name", "nominal_q1"] + QUATERNIONS,
     f"line 1, column 'nominal_q1': unknown field 'q1'; expected one of {EVERY_FIELD}"),
    (["name"] + QUATERNIONS + ["Nominal_QW"], "line 1, column 'Nominal_QW': nominal_qw appears twice"),
    (["name"] + QUATERNIONS[:4] + ["temperature"], "line 1: no measured columns; expected e.g. measured_qw, "
                                                   "measured_qx, measured_qy, measured_qz"),
    (["name"] + QUATERNIONS[4:], "line 1: no nominal columns; expected e.g. nominal_qw, nominal_qx, nominal_qy, "
                                 "nominal_qz"),
    (["name", "nominal_qw", "nominal_qx", "nominal_qy"] + QUATERNIONS[4:],
     "line 1: the nominal columns (nominal_qw, nominal_qx, nominal_qy) are not one complete set; for quaternion "
     f"expected nominal_qw, nominal_qx, nominal_qy, nominal_qz; expected one of: {EVERY_SET}"),
    (["name", "nominal_rv_x", "nominal_rv_y", "nominal_rv_z", "nominal_mrp_x"] + QUATERNIONS[4:],
     "line 1: the nominal columns (nominal_mrp_x, nominal_rv_x, nominal_rv_y, nominal_rv_z) are not one complete "
     f"set; for rotation_vector expected nominal_rv_x, nominal_rv_y, nominal_rv_z; expected one of: {EVERY_SET}"),
    (["name"] + QUATERNIONS + ["measured_yaw", "measured_pitch", "measured_roll"],
     "line 1: the measured columns (measured_pitch, measured_qw, measured_qx, measured_qy, measured_qz, "
     "measured_roll, measured_yaw) are not one complete set; for quaternion expected measured_qw, measured_qx, "
     f"measured_qy, measured_qz; expected one of: {EVERY_SET}"),
    (["name", "nominal_qw[foo]"] + QUATERNIONS[1:],
     "line 1, column 'nominal_qw[foo]': unknown convention 'foo'; expected deg, rad, intrinsic, extrinsic, "
     "body_to_reference, reference_to_body or a sequence such as ZYX"),
    (["name", "nominal_yaw[deg rad]", "nominal_pitch", "nominal_roll"] + QUATERNIONS[4:],
     "line 1, column 'nominal_yaw[deg rad]': contradictory conventions in [deg rad]"),
    (["name", "nominal_yaw[deg degrees]", "nominal_pitch[rad]", "nominal_roll"] + QUATERNIONS[4:],
     "line 1, column 'nominal_pitch[rad]': contradicts column 'nominal_yaw[deg degrees]' on the degrees"),
    (["name", "nominal_qw[deg]"] + QUATERNIONS[1:],
     "line 1, column 'nominal_qw[deg]': the convention degrees does not apply to a quaternion; expected only: none"),
    (["name"] + QUATERNIONS[:4] + ["measured_yaw[ZYX]", "measured_pitch", "measured_roll"],
     "line 1, column 'measured_yaw[ZYX]': the convention sequence does not apply to a yaw pitch roll; expected "
     "only: degrees"),
    (["name", "nominal_r11[rad]"] + ["nominal_" + c for c in SETS["matrix"][1:]] + QUATERNIONS[4:],
     "line 1, column 'nominal_r11[rad]': the convention degrees does not apply to a matrix; expected only: "
     "matrix_meaning"),
    (["name", "nominal_angle1[ZYX]", "nominal_angle2", "nominal_angle3"] + QUATERNIONS[4:],
     "line 1, column 'nominal_angle1[ZYX]': angle1..angle3 need a sequence and intrinsic or extrinsic; expected "
     "e.g. nominal_angle1[ZYX intrinsic] in the header, or conventions passed in"),
    (["name", "nominal_angle1[extrinsic]", "nominal_angle2", "nominal_angle3"] + QUATERNIONS[4:],
     "line 1, column 'nominal_angle1[extrinsic]': angle1..angle3 need a sequence and intrinsic or extrinsic; "
     "expected e.g. nominal_angle1[ZYX intrinsic] in the header, or conventions passed in"),
])
def test_a_header_that_is_not_one_set_a_role_is_refused_word_for_word(header, words):
    _refused(words, header)


def test_a_refusal_names_its_line_and_column():
    error = _refused("line 1, column 'Nominal_QW': nominal_qw appears twice", ["name"] + QUATERNIONS + ["Nominal_QW"])
    assert (error.line, error.column) == (1, "Nominal_QW")
    error = _refused("line 1: no measured columns; expected e.g. measured_qw, measured_qx, measured_qy, measured_qz",
                     ["name"] + QUATERNIONS[:4])
    assert (error.line, error.column) == (1, None)


def test_a_matrix_meaning_passed_in_that_is_not_one_is_refused():
    header = ["name"] + ["nominal_" + c for c in SETS["matrix"]] + QUATERNIONS[4:]
    with pytest.raises(InvalidInputError) as raised:
        read_mounts(_text(header, "a,1,0,0,0,1,0,0,0,1,1,0,0,0"), nominal=SetConventions(matrix_meaning="rows"))
    assert str(raised.value) == "nominal matrix meaning 'rows'; expected one of body_to_reference, reference_to_body"
