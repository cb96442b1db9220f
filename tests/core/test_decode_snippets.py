"""A table of pasted snippets, each of our own invention (written to look like what arrives from drawings,
PDFs, spreadsheets, e-mails, configuration files and programs), with the reading a technician means.

Every expected orientation is built independently with SciPy's `Rotation` (from_matrix, from_quat with
scalar_first, from_euler, from_rotvec), never with Framewright's core; matrices that are not exactly
orthonormal are first replaced by their orthogonal polar factor computed here with numpy's SVD (the
least-squares nearest rotation, CONVENTIONS.md). The decoder's best reading must match to 1e-12.
"""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode

S2 = np.sqrt(0.5)


def polar(rows):
    """Nearest rotation by SVD (U Vᵀ), independent of core/nearest.py."""
    u, _, vt = np.linalg.svd(np.array(rows, dtype=float))
    return u @ vt


def mat(rows):
    return Rotation.from_matrix(polar(rows))                  # SciPy from_matrix of the polar factor


def mat_t(rows):
    return Rotation.from_matrix(polar(rows).T)                # the nine numbers read reference -> body


def quat(w, x, y, z):
    return Rotation.from_quat([w, x, y, z], scalar_first=True)  # SciPy, w first


def euler(seq, angles, degrees=True):
    return Rotation.from_euler(seq, angles, degrees=degrees)  # SciPy: upper case intrinsic, lower extrinsic


def rotvec(v, degrees=True):
    return Rotation.from_rotvec(v, degrees=degrees)


def axang(axis, angle, degrees=True):
    axis = np.array(axis, dtype=float)
    return Rotation.from_rotvec(axis / np.linalg.norm(axis) * angle, degrees=degrees)


# (id, text, expected kind, conventions the best reading must have, expected SciPy rotation)
SNIPPETS = [
    # --- matrices --------------------------------------------------------------------------------
    ("identity-lines", "1 0 0\n0 1 0\n0 0 1", "matrix", {}, mat(np.eye(3))),
    ("nested-brackets", "[[0, -1, 0], [1, 0, 0], [0, 0, 1]]", "matrix",
     {"matrix": "body-to-reference"}, mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]])),
    ("one-line-of-nine", "0 -1 0 1 0 0 0 0 1", "matrix", {"matrix": "body-to-reference"},
     mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]])),
    ("numpy-four-decimals", "np.array([[0.7071, -0.7071, 0.0], [0.7071, 0.7071, 0.0], [0.0, 0.0, 1.0]])",
     "matrix", {}, mat([[0.7071, -0.7071, 0], [0.7071, 0.7071, 0], [0, 0, 1]])),
    ("numpy-printed-array",
     "array([[ 1.000000e+00,  0.000000e+00,  0.000000e+00],\n"
     "       [ 0.000000e+00,  6.123234e-17, -1.000000e+00],\n"
     "       [ 0.000000e+00,  1.000000e+00,  6.123234e-17]])", "matrix", {},
     mat([[1, 0, 0], [0, 6.123234e-17, -1], [0, 1, 6.123234e-17]])),
    ("matlab-literal", "R = [0 0 1; 1 0 0; 0 1 0]", "matrix", {}, mat([[0, 0, 1], [1, 0, 0], [0, 1, 0]])),
    ("octave-output", "R =\n\n   0   0   1\n   1   0   0\n   0   1   0\n\n", "matrix", {},
     mat([[0, 0, 1], [1, 0, 0], [0, 1, 0]])),
    ("latex-bmatrix",
     "\\begin{bmatrix} 0.8660 & 0 & 0.5000 \\\\ 0 & 1 & 0 \\\\ -0.5000 & 0 & 0.8660 \\end{bmatrix}", "matrix",
     {}, mat([[0.8660, 0, 0.5], [0, 1, 0], [-0.5, 0, 0.8660]])),
    ("rows-labelled-colon", "Rotation matrix:\nX: 1 0 0\nY: 0 0 -1\nZ: 0 1 0", "matrix", {},
     mat([[1, 0, 0], [0, 0, -1], [0, 1, 0]])),
    ("rows-labelled-equals", "x = 0.9848 -0.1736 0\ny = 0.1736 0.9848 0\nz = 0 0 1", "matrix", {},
     mat([[0.9848, -0.1736, 0], [0.1736, 0.9848, 0], [0, 0, 1]])),
    ("rows-labelled-out-of-order", "Y: 0 1 0\nX: 1 0 0\nZ: 0 0 1", "matrix", {}, mat(np.eye(3))),
    ("dcm-ned-to-body", "DCM (NED to body):\n0.9397 0.3420 0\n-0.3420 0.9397 0\n0 0 1", "matrix",
     {"matrix": "reference-to-body"}, mat_t([[0.9397, 0.3420, 0], [-0.3420, 0.9397, 0], [0, 0, 1]])),
    ("c-b-n-says-body-to-nav", "C_b^n = [0 1 0; -1 0 0; 0 0 1]", "matrix", {"matrix": "body-to-reference"},
     mat([[0, 1, 0], [-1, 0, 0], [0, 0, 1]])),
    ("spreadsheet-tabs", "0.5\t-0.8660254\t0\n0.8660254\t0.5\t0\n0\t0\t1", "matrix", {},
     mat([[0.5, -0.8660254, 0], [0.8660254, 0.5, 0], [0, 0, 1]])),
    ("semicolon-csv", "0.5;-0.8660254;0\n0.8660254;0.5;0\n0;0;1", "matrix", {},
     mat([[0.5, -0.8660254, 0], [0.8660254, 0.5, 0], [0, 0, 1]])),
    ("markdown-pipes", "| 1 | 0 | 0 |\n| 0 | 0.6 | -0.8 |\n| 0 | 0.8 | 0.6 |", "matrix", {},
     mat([[1, 0, 0], [0, 0.6, -0.8], [0, 0.8, 0.6]])),
    ("pdf-unicode-minus-nbsp", "0.7071\u00a0\u22120.7071\u00a00\n0.7071\u00a00.7071\u00a00\n0\u00a00\u00a01",
     "matrix", {}, mat([[0.7071, -0.7071, 0], [0.7071, 0.7071, 0], [0, 0, 1]])),
    ("pdf-en-dash-thin-space", "0.8660\u2009\u20130.5000\u20090\n0.5000\u20090.8660\u20090\n0\u20090\u20091",
     "matrix", {}, mat([[0.8660, -0.5, 0], [0.5, 0.8660, 0], [0, 0, 1]])),
    ("c-initializer", "const double R[3][3] = {{1.0, 0.0, 0.0}, {0.0, 0.0, -1.0}, {0.0, 1.0, 0.0}};",
     "matrix", {}, mat([[1, 0, 0], [0, 0, -1], [0, 1, 0]])),
    ("eigen-comma-init", "Eigen::Matrix3d R;\nR << 0, 0, 1,\n     0, 1, 0,\n    -1, 0, 0;", "matrix", {},
     mat([[0, 0, 1], [0, 1, 0], [-1, 0, 0]])),
    ("json-key", '{"R": [[-1, 0, 0], [0, -1, 0], [0, 0, 1]]}', "matrix", {},
     mat([[-1, 0, 0], [0, -1, 0], [0, 0, 1]])),
    ("scientific-body-to-world", "body -> world:\n6.123e-17 -1 0\n1 6.123e-17 0\n0 0 1", "matrix",
     {"matrix": "body-to-reference"}, mat([[6.123e-17, -1, 0], [1, 6.123e-17, 0], [0, 0, 1]])),
    ("braces-rational", "{{0.36, 0.48, -0.8}, {-0.8, 0.6, 0}, {0.48, 0.64, 0.6}}", "matrix", {},
     mat([[0.36, 0.48, -0.8], [-0.8, 0.6, 0], [0.48, 0.64, 0.6]])),
    ("parentheses", "((1, 0, 0), (0, 0.8, -0.6), (0, 0.6, 0.8))", "matrix", {},
     mat([[1, 0, 0], [0, 0.8, -0.6], [0, 0.6, 0.8]])),
    ("email-quoted", "> 0 0 -1\n> 0 1 0\n> 1 0 0", "matrix", {}, mat([[0, 0, -1], [0, 1, 0], [1, 0, 0]])),
    ("times-ten-superscript", "1.0, 0.0, 0.0\n0.0, 6.1×10⁻¹⁷, −1.0\n0.0, 1.0, 6.1×10⁻¹⁷", "matrix", {},
     mat([[1, 0, 0], [0, 6.1e-17, -1], [0, 1, 6.1e-17]])),
    ("python-comment-units", "# mount 3, measured 2026-11-30\nR = [[0.0, 0.0, 1.0],\n     [0.0, 1.0, 0.0],\n"
     "     [-1.0, 0.0, 0.0]]", "matrix", {}, mat([[0, 0, 1], [0, 1, 0], [-1, 0, 0]])),
    ("reference-to-body-words", "reference to body:\n0 1 0\n-1 0 0\n0 0 1", "matrix",
     {"matrix": "reference-to-body"}, mat_t([[0, 1, 0], [-1, 0, 0], [0, 0, 1]])),
    ("element-names-csv", "r11,r12,r13,r21,r22,r23,r31,r32,r33\n1,0,0,0,0,-1,0,1,0", "matrix", {},
     mat([[1, 0, 0], [0, 0, -1], [0, 1, 0]])),
    # --- quaternions -----------------------------------------------------------------------------
    ("w-first-largest", "0.9238795 0 0 0.3826834", "quaternion", {"order": "wxyz"},
     quat(0.9238795, 0, 0, 0.3826834)),
    ("w-last-largest", "0 0 0.3826834 0.9238795", "quaternion", {"order": "xyzw"},
     quat(0.9238795, 0, 0, 0.3826834)),
    ("tie-defaults-w-first", "q = [0.7071068, 0.7071068, 0, 0]", "quaternion", {"order": "wxyz"},
     quat(0.7071068, 0.7071068, 0, 0)),
    ("keys-equals", "w=0.9659258, x=0, y=0.2588190, z=0", "quaternion", {}, quat(0.9659258, 0, 0.2588190, 0)),
    ("keys-q-prefix-lines", "qw: 0.5\nqx: 0.5\nqy: 0.5\nqz: 0.5", "quaternion", {}, quat(0.5, 0.5, 0.5, 0.5)),
    ("json-scalar-last-keys", '{"x": 0.0, "y": 0.0, "z": 0.7071068, "w": 0.7071068}', "quaternion", {},
     quat(0.7071068, 0, 0, 0.7071068)),
    ("yaml-orientation", "orientation:\n  x: 0.0\n  y: 0.1305262\n  z: 0.0\n  w: 0.9914449", "quaternion", {},
     quat(0.9914449, 0, 0.1305262, 0)),
    ("csv-header-w-first", "qw,qx,qy,qz\n0.8660254,0.5,0,0", "quaternion", {}, quat(0.8660254, 0.5, 0, 0)),
    ("csv-header-w-last", "qx;qy;qz;qw\n0.5;0;0;0.8660254", "quaternion", {}, quat(0.8660254, 0.5, 0, 0)),
    ("constructor-keywords", "Quaternion(w=0.9961947, x=0.0871557, y=0, z=0)", "quaternion", {},
     quat(0.9961947, 0.0871557, 0, 0)),
    ("printed-quaternion-object", "quaternion(0.9238795, 0, 0.3826834, 0)", "quaternion", {"order": "wxyz"},
     quat(0.9238795, 0, 0.3826834, 0)),
    ("w-last-list", "[0.2588190, 0, 0, 0.9659258]", "quaternion", {"order": "xyzw"},
     quat(0.9659258, 0.2588190, 0, 0)),
    ("unicode-minus-tie", "\u22120.5, 0.5, \u22120.5, 0.5", "quaternion", {"order": "wxyz"},
     quat(-0.5, 0.5, -0.5, 0.5)),
    ("not-normalised", "0.5 0.1 0.1 0.1", "quaternion", {"order": "wxyz"}, quat(0.5, 0.1, 0.1, 0.1)),
    ("q0-to-q3", "q0 = 0.7071068\nq1 = 0\nq2 = 0.7071068\nq3 = 0", "quaternion", {},
     quat(0.7071068, 0, 0.7071068, 0)),
    ("q1-to-q4-scalar-last", "q1 = 0\nq2 = 0\nq3 = 0.3826834\nq4 = 0.9238795", "quaternion", {},
     quat(0.9238795, 0, 0, 0.3826834)),
    ("caption-says-xyzw", "quaternion (x, y, z, w): 0.5 0.5 0.5 0.5", "quaternion", {"order": "xyzw"},
     quat(0.5, 0.5, 0.5, 0.5)),
    ("matlab-quaternion", "q = [0.9659 0 0 0.2588];", "quaternion", {"order": "wxyz"}, quat(0.9659, 0, 0, 0.2588)),
    ("identifier-says-xyzw", "q_xyzw = np.array([0.0, 0.0, 0.3826834, 0.9238795])", "quaternion",
     {"order": "xyzw"}, quat(0.9238795, 0, 0, 0.3826834)),
    ("fortran-exponent", "0.9238795D+00 0.0D+00 0.0D+00 0.3826834D+00", "quaternion", {"order": "wxyz"},
     quat(0.9238795, 0, 0, 0.3826834)),
    ("spreadsheet-name-column", "IMU-2\t0.9914449\t0\t0.1305262\t0", "quaternion", {"order": "wxyz"},
     quat(0.9914449, 0, 0.1305262, 0)),
    # --- axis and angle --------------------------------------------------------------------------
    ("axis-angle-keys-degree-mark", "axis = [0, 0, 1], angle = 90°", "axis-angle", {"units": "deg"},
     axang([0, 0, 1], 90)),
    ("axis-angle-lines-deg", "axis: 0.57735 0.57735 0.57735\nangle: 120 deg", "axis-angle", {"units": "deg"},
     axang([1, 1, 1], 120)),
    ("bare-axis-then-degrees", "0 0 1 45", "axis-angle", {"units": "deg"}, axang([0, 0, 1], 45)),
    ("bare-axis-then-radians", "0, 1, 0, 1.5707963", "axis-angle", {"units": "rad"},
     axang([0, 1, 0], 1.5707963, degrees=False)),
    ("angle-written-first-keys", "angle (deg) = 30; axis: 1 0 0", "axis-angle", {"units": "deg"},
     axang([1, 0, 0], 30)),
    ("axis-angle-csv-header", "axis_x,axis_y,axis_z,angle_deg\n0,0,1,-60", "axis-angle", {"units": "deg"},
     axang([0, 0, 1], -60)),
    ("axis-not-unit", "1 1 0 90", "axis-angle", {"units": "deg"}, axang([1, 1, 0], 90)),
    # --- angles ----------------------------------------------------------------------------------
    ("three-whole-numbers", "30 20 10", "angles", {"sequence": "ZYX", "intrinsic": True, "units": "deg"},
     euler("ZYX", [30, 20, 10])),
    ("ypr-keys-deg", "yaw: 45 deg, pitch: -10 deg, roll: 5 deg", "angles", {"sequence": "ZYX"},
     euler("ZYX", [45, -10, 5])),
    ("rpy-keys-any-order", "roll = 5°, pitch = −10°, yaw = 45°", "angles", {"sequence": "ZYX"},
     euler("ZYX", [45, -10, 5])),
    ("euler-zxz-named", "Euler ZXZ (deg): 90, 45, 30", "angles", {"sequence": "ZXZ", "intrinsic": True},
     euler("ZXZ", [90, 45, 30])),
    ("primes-mean-intrinsic", "Z-Y'-X'': 10.5°, 2.25°, -3.75°", "angles", {"sequence": "ZYX", "intrinsic": True},
     euler("ZYX", [10.5, 2.25, -3.75])),
    ("extrinsic-xyz-named", "extrinsic XYZ: 10, 20, 30", "angles", {"sequence": "XYZ", "intrinsic": False},
     euler("xyz", [10, 20, 30])),
    ("radians-by-decimals", "0.5236 0.3491 0.1745", "angles", {"units": "rad", "sequence": "ZYX"},
     euler("ZYX", [0.5236, 0.3491, 0.1745], degrees=False)),
    ("radians-marked", "(0.1, -0.2, 0.3) rad", "angles", {"units": "rad"},
     euler("ZYX", [0.1, -0.2, 0.3], degrees=False)),
    ("heading-pitch-roll-lines", "heading 120.0\npitch 0.0\nroll -2.5", "angles", {"sequence": "ZYX"},
     euler("ZYX", [120, 0, -2.5])),
    ("gimbal-lock-input", "ZYX = [90, 90, 0]", "angles", {"sequence": "ZYX"}, euler("ZYX", [90, 90, 0])),
    ("rpy-fixed-axes-words", "roll, pitch, yaw (fixed axes): 5, 10, 15", "angles",
     {"sequence": "XYZ", "intrinsic": False}, euler("xyz", [5, 10, 15])),
    ("degrees-minutes-seconds", "yaw 12°30'00\", pitch 0°15', roll 0", "angles", {"units": "deg"},
     euler("ZYX", [12.5, 0.25, 0])),
    ("plus-signs-exponents", "+3.0e1, +2.0E+1, +1.0e+01", "angles", {"units": "deg"}, euler("ZYX", [30, 20, 10])),
    # --- rotation vectors ------------------------------------------------------------------------
    ("rotation-vector-caption-rad", "rotation vector (rad): 0 0 1.5707963", "rotation-vector", {"units": "rad"},
     rotvec([0, 0, 1.5707963], degrees=False)),
    ("rotvec-key", "rotvec = [0.1, 0.2, 0.3]", "rotation-vector", {"units": "rad"},
     rotvec([0.1, 0.2, 0.3], degrees=False)),
    ("rotvec-degrees-marked", "rotation vector: 0°, 90°, 0°", "rotation-vector", {"units": "deg"},
     rotvec([0, 90, 0])),
]


def test_the_table_is_large_and_ids_are_unique():
    ids = [s[0] for s in SNIPPETS]
    assert len(ids) >= 60
    assert len(ids) == len(set(ids))


@pytest.mark.parametrize("name, text, kind, conventions, expected", SNIPPETS, ids=[s[0] for s in SNIPPETS])
def test_pasted_snippet_decodes_to_the_meant_orientation(name, text, kind, conventions, expected):
    best = decode(text)[0]
    assert best.kind == kind, best.why
    for key, value in conventions.items():
        assert best.conventions[key] == value, (key, best.conventions, best.why)
    # checked against SciPy's Rotation (see the module docstring)
    assert np.allclose(best.orientation.as_matrix(), expected.as_matrix(), atol=1e-12, rtol=0)
    assert not any(np.isnan(best.orientation.quaternion))
