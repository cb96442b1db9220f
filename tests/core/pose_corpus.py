"""Poses and transforms in the layouts of open datasets' files, description files, command lines and
library printouts, each with the orientation a technician means.

Every `expected` rotation is built with SciPy's `Rotation` from the parameters the source itself gives
(from_matrix of the printed matrix after an SVD polar factor computed here, from_quat, from_euler,
from_rotvec), never with Framewright's core. Meaning of a pose (CONVENTIONS.md): the child frame is the
body, the parent frame the reference, R maps child-frame vectors into the parent (v_parent = R v_child + t).

Sources: every `source` names the format documentation whose layout the snippet imitates (a dataset's
devkit readme or schema, a message definition, a library's documentation). The values are invented unless
the source says otherwise: the calibration values in the layouts of open datasets were generated with
SciPy's `Rotation` from invented angles (noted beside them) and printed to the layout's digits; they are
never the datasets' own values.
The exceptions are named in their `source`: one TUM RGB-D ground-truth row (CC BY 4.0, attributed,
recalled from memory) and the examples quoted from the tf2, tf and SciPy documentation.
`tolerance` (radians) follows the print precision of the snippet: 1e-6 where the source parameters are
the printed numbers, larger where the text rounds a more precise source.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from scipy.spatial.transform import Rotation

S2 = math.sqrt(0.5)


@dataclass(frozen=True)
class PoseCase:
    id: str
    family: str
    source: str
    text: str
    expected: Rotation
    translation: tuple | None
    translation_unit: str | None
    top_kind: str | tuple          # a tuple: any of these kinds may come first (a block with several)
    tolerance: float = 1e-6        # radians
    hints: dict | None = None
    name: str | None = None        # the named transform the hints pick; it must appear among the names
    offered: tuple = ()            # further rotations the readings must offer without hints


def polar(rows) -> np.ndarray:
    """Nearest rotation by numpy's SVD (U Vᵀ), the least-squares polar factor (CONVENTIONS.md)."""
    u, _, vt = np.linalg.svd(np.array(rows, dtype=float))
    return u @ vt


def mat(values, cols: int = 3) -> Rotation:
    """SciPy from_matrix of the rotation block of rows (nested) or of 9, 12 or 16 numbers row-major."""
    array = np.array(values, dtype=float)
    if array.ndim == 1:
        array = array.reshape(-1, cols)
    return Rotation.from_matrix(polar(array[:3, :3]))


def xyzw(x, y, z, w) -> Rotation:
    return Rotation.from_quat([x, y, z, w])                           # SciPy: scalar last


def wxyz(w, x, y, z) -> Rotation:
    return Rotation.from_quat([w, x, y, z], scalar_first=True)        # SciPy: scalar first


def euler(seq, angles, degrees=False) -> Rotation:
    return Rotation.from_euler(seq, angles, degrees=degrees)          # lower extrinsic, upper intrinsic


def rotvec(v, degrees=False) -> Rotation:
    return Rotation.from_rotvec(v, degrees=degrees)


def axang(axis, angle, degrees=False) -> Rotation:
    axis = np.array(axis, dtype=float)
    return Rotation.from_rotvec(axis / np.linalg.norm(axis) * angle, degrees=degrees)


def fmt(values, spec: str) -> str:
    return " ".join(format(v, spec) for v in values)


ECHO_KINDS = ("quaternion", "angles", "matrix")   # a transform echo block gives all three

# ---------------------------------------------------------------------------------------------------
# Invented calibration values in the layouts of open datasets' files (never the datasets' own values).
# Each rotation is M · F, printed to the digits the layout uses: M = SciPy Rotation.from_euler('xyz',
# <the misalignment noted>, degrees=True), F the frame change such files typically show:
#   lidar to camera  [[0, -1, 0], [0, 0, -1], [1, 0, 0]]  (lidar x forward, y left, z up; camera optical)
#   camera to body   [[0, -1, 0], [1, 0, 0], [0, 0, 1]]   (camera x along body y, camera y along body -x)
# Translations and projection rows are invented at a plausible size.
# ---------------------------------------------------------------------------------------------------
# misalignment (-0.62, 0.21, -0.09) deg, no frame change; 7 significant digits as %e prints them
KITTI_IMU_TO_VELO_R = [9.999920e-01, 1.531043e-03, 3.681961e-03, -1.570785e-03, 9.999403e-01, 1.081506e-02,
                       -3.665183e-03, -1.082076e-02, 9.999347e-01]
KITTI_IMU_TO_VELO_T = [-8.532146e-01, 2.874613e-01, -7.615832e-01]
# misalignment (0.55, -0.31, 0.27) deg, lidar to camera
KITTI_VELO_TO_CAM_R = [-5.364950e-03, -9.999743e-01, 4.764090e-03, -9.624552e-03, -4.712303e-03, -9.999426e-01,
                       9.999393e-01, -5.410494e-03, -9.599023e-03]
KITTI_VELO_TO_CAM_T = [-1.183247e-02, -6.847519e-02, -2.904163e-01]
# misalignment (-0.38, 0.46, 0.02) deg, lidar to camera; 13 significant digits
KITTI_ODOMETRY_TR = [8.025936174307e-03, -9.999677107286e-01, 4.023043255562e-04, -1.052317483906e-02,
                        6.635004520224e-03, -3.490545934940e-04, -9.999779271943e-01, -6.238519407712e-02,
                        9.999457790618e-01, 8.028428310397e-03, 6.631988790873e-03, -3.187402215563e-01]
# projection rows: focal length, principal point, and -focal * 0.5372 m baseline for the second camera
KITTI_ODOMETRY_P0 = [7.071238e+02, 0, 6.019846e+02, 0, 0, 7.071238e+02, 1.838517e+02, 0, 0, 0, 1, 0]
KITTI_ODOMETRY_P1 = [7.071238e+02, 0, 6.019846e+02, -3.798669e+02, 0, 7.071238e+02, 1.838517e+02, 0, 0, 0, 1, 0]
# a small step: (0.07, -0.11, 0.035) deg
KITTI_POSES_LINE = [9.999980e-01, -6.132103e-04, -1.919113e-03, -4.218735e-02, 6.108641e-04, 9.999991e-01,
                        -1.222903e-03, -2.517306e-02, 1.919861e-03, 1.221728e-03, 9.999974e-01, 8.342619e-01]
KITTI_OBJECT_P2 = [7.103418e+02, 0, 6.087532e+02, 4.431726e+01, 0, 7.103418e+02, 1.791268e+02, 2.917354e-01,
                   0, 0, 1, 2.813467e-03]
# misalignment (0.24, -0.47, 0.58) deg, no frame change
KITTI_OBJECT_R0_RECT = [9.999151e-01, -1.015701e-02, -8.160061e-03, 1.012240e-02, 9.999396e-01, -4.271599e-03,
                        8.202955e-03, 4.188637e-03, 9.999576e-01]
# misalignment (0.16, 0.41, -0.33) deg, lidar to camera
KITTI_OBJECT_TR_VELO_TO_CAM = [7.139559e-03, -9.999578e-01, -5.779515e-03, -2.013846e-02, -2.833691e-03,
                               5.759407e-03, -9.999794e-01, -7.482157e-02, 9.999705e-01, 7.155789e-03,
                               -2.792452e-03, -3.016724e-01]
KITTI_OBJECT_TR_IMU_TO_VELO = KITTI_IMU_TO_VELO_R[0:3] + [KITTI_IMU_TO_VELO_T[0]] + KITTI_IMU_TO_VELO_R[3:6] + [
    KITTI_IMU_TO_VELO_T[1]] + KITTI_IMU_TO_VELO_R[6:9] + [KITTI_IMU_TO_VELO_T[2]]
# misalignments (-0.34, 1.21, 0.63) and (0.58, 1.07, 0.94) deg, camera to body; 12 significant digits
EUROC_CAM0_T_BS = [-0.0111204611108, -0.999716575867, 0.021050018545, -0.0231846702153,
                   0.999920565688, -0.0109929009037, 0.00616590974212, -0.0617203954786,
                   -0.00593276140662, 0.0211169142107, 0.999759410196, 0.0118364812397,
                   0.0, 0.0, 0.0, 1.0]
EUROC_CAM1_T_BS = [-0.0162155125382, -0.999691073335, 0.0188365349055, -0.0184263571904,
                   0.999817294852, -0.0164024983468, -0.00981503753488, 0.0482137465821,
                   0.0101209716407, 0.0186739375094, 0.999774399548, 0.00693158247716,
                   0.0, 0.0, 0.0, 1.0]
# misalignment (0.31, -0.22, 0.47) deg, camera optical to vehicle (x forward, y left, z up):
# [[0, 0, 1], [-1, 0, 0], [0, -1, 0]]; quaternion w, x, y, z as SciPy prints it
NUSC_CAM_FRONT_Q = [0.5043572972596415, -0.49973545145446896, 0.4983418717105526, -0.4975375103050734]
# misalignment (0.93, -0.58, 0.21) deg, -90 deg about z; quaternion w, x, y, z
NUSC_LIDAR_TOP_Q = [0.7083980231802767, 0.009313469618897965, 0.0021768028738638565, -0.705748369865055]

KITTI_RAW = "invented values in the layout of KITTI raw data {} (the KITTI raw data devkit readme)"
KITTI_ODO = "invented values in the layout of KITTI odometry {} (the KITTI odometry devkit readme)"
KITTI_OBJ = "invented values in the layout of a KITTI object calib/*.txt file (the KITTI object devkit readme)"
EUROC = "invented values in the layout of EuRoC MAV {} (the file description in the dataset's paper)"
# The TUM RGB-D benchmark (Sturm et al., IROS 2012; citation from memory) publishes its data under CC BY 4.0;
# this row's values are recalled from memory and kept with the attribution below.
TUM = ("TUM RGB-D freiburg1_xyz groundtruth.txt, first row (CC BY 4.0, TUM Computer Vision Group;"
       " layout of the TUM RGB-D file formats page)")
NUSC = ("invented values in the layout of a nuScenes calibrated_sensor.json {} (schema_nuscenes.md documents"
        " 'rotation' as w, x, y, z and translation in metres)")


def _euroc_rows(values, indent: str) -> str:
    rows = [", ".join(repr(v) for v in values[i:i + 4]) for i in range(0, 16, 4)]
    return (",\n" + indent).join(rows)


# ---------------------------------------------------------------------------------------------------
# 4x4 homogeneous matrices
# ---------------------------------------------------------------------------------------------------
HOMOGENEOUS = [
    PoseCase("numpy-print-4x4", "homogeneous-4x4",
             "invented values in the layout of numpy's array printing (numpy.array2string)",
             "[[ 0.  -1.   0.   0.5]\n [ 1.   0.   0.   0. ]\n [ 0.   0.   1.   0.2]\n [ 0.   0.   0.   1. ]]",
             mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), (0.5, 0.0, 0.2), None, "matrix"),
    PoseCase("bracketed-rows-4x4", "homogeneous-4x4",
             "invented values; rows written as bracketed lists, common practice",
             "[0.8660254, -0.5, 0, 1.25],\n[0.5, 0.8660254, 0, -0.4],\n[0, 0, 1, 0.9],\n[0, 0, 0, 1]",
             euler("z", 30, degrees=True), (1.25, -0.4, 0.9), None, "matrix", tolerance=1e-6),
    PoseCase("plain-rows-4x4-four-decimals", "homogeneous-4x4",
             "invented: extrinsic xyz (10, 20, 30) deg printed to 4 decimals, plain rows",
             "0.8138 -0.4410 0.3785 0.1000\n0.4698 0.8826 0.0180 -0.0500\n-0.3420 0.1632 0.9254 0.3000\n"
             "0.0000 0.0000 0.0000 1.0000",
             euler("xyz", [10, 20, 30], degrees=True), (0.1, -0.05, 0.3), None, "matrix", tolerance=1e-3),
    PoseCase("flattened-16-one-line", "homogeneous-4x4",
             "invented values; 16 numbers row-major on one line (issue 11 item 1)",
             "1 0 0 0.1 0 0 -1 0.2 0 1 0 0.3 0 0 0 1",
             euler("x", 90, degrees=True), (0.1, 0.2, 0.3), None, "matrix"),
    PoseCase("data-list-16", "homogeneous-4x4",
             "invented values in a YAML 'data: [...]' list of 16, row-major",
             "T_lidar_imu:\n  data: [0.0, -1.0, 0.0, 0.02,\n         1.0, 0.0, 0.0, -0.01,\n"
             "         0.0, 0.0, 1.0, 0.15,\n         0.0, 0.0, 0.0, 1.0]",
             mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), (0.02, -0.01, 0.15), None, "matrix"),
    PoseCase("eigen-print-4x4", "homogeneous-4x4",
             "invented: rotation 45 deg about z in the layout of Eigen's stream output (6 significant digits)",
             "T.matrix() =\n  0.707107  -0.707107          0        0.1\n  0.707107   0.707107          0          0\n"
             "         0          0          1       0.05\n         0          0          0          1",
             euler("z", 45, degrees=True), (0.1, 0.0, 0.05), None, "matrix", tolerance=1e-5),
    PoseCase("semicolon-rows-4x4", "homogeneous-4x4",
             "invented values; rows separated by ';' inside brackets, common practice in matrix languages",
             "T = [0 0 1 0.1; -1 0 0 0; 0 -1 0 0.3; 0 0 0 1]",
             mat([[0, 0, 1], [-1, 0, 0], [0, -1, 0]]), (0.1, 0.0, 0.3), None, "matrix"),
    PoseCase("python-list-4x4-mm", "homogeneous-4x4",
             "invented values; a caption naming the translation unit (mm)",
             "T_base_cam (translation in mm) = [[0, 0, 1, 120.0], [-1, 0, 0, 35.5], [0, -1, 0, 410.0], [0, 0, 0, 1]]",
             mat([[0, 0, 1], [-1, 0, 0], [0, -1, 0]]), (120.0, 35.5, 410.0), "mm", "matrix"),
    PoseCase("column-major-16", "homogeneous-4x4",
             "invented values; 16 numbers the caption says are column-major (issue 11: row-major unless the"
             " text says otherwise)",
             "model matrix (column-major): 0 1 0 0  -1 0 0 0  0 0 1 0  0.5 0.25 2 1",
             mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), (0.5, 0.25, 2.0), None, "matrix"),
    PoseCase("column-major-keyed-comment", "homogeneous-4x4",
             "invented values; a keyed 16-number list whose trailing comment says column-major (numpy"
             " reshape order='F' builds the expected matrix)",
             "T_world_cam: [0, 1, 0, 0, -1, 0, 0, 0, 0, 0, 1, 0, 0.5, 0.25, 2, 1]  # column-major",
             mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), (0.5, 0.25, 2.0), None, "matrix", name=None),
    # invented: a camera 52.3 deg about x at 4.031128874 from the origin, stored as float32 values
    PoseCase("transforms-json-frame", "homogeneous-4x4",
             "invented values in the layout of a transforms.json camera file (camera_angle_x, frames with"
             " file_path, a scalar 'rotation' and a 4x4 'transform_matrix')",
             '{\n  "camera_angle_x": 0.7302438616752625,\n  "frames": [\n    {\n      "file_path": "./train/r_0",\n'
             '      "rotation": 0.031415926535897934,\n      "transform_matrix": [\n'
             '        [-1.0, 0.0, 0.0, 0.0],\n        [0.0, -0.6115270256996155, 0.7912235260009766, 3.189523935317993],\n'
             '        [0.0, 0.7912235260009766, 0.6115270256996155, 2.465144157409668],\n'
             '        [0.0, 0.0, 0.0, 1.0]\n      ]\n    }\n  ]\n}',
             mat([[-1, 0, 0], [0, -0.6115270256996155, 0.7912235260009766],
                  [0, 0.7912235260009766, 0.6115270256996155]]),
             (0.0, 3.189523935317993, 2.465144157409668), None, "matrix"),
    PoseCase("scipy-as-matrix-4x4-style", "homogeneous-4x4",
             "invented: extrinsic xyz (5, -3, 120) deg; numpy printing with 8 decimals",
             "array([[-0.49931477, -0.86044923,  0.10154749,  1.5       ],\n"
             "       [ 0.86483855, -0.50204762, -0.00157392,  0.        ],\n"
             "       [ 0.05233596,  0.0870363 ,  0.99482945, -0.25      ],\n"
             "       [ 0.        ,  0.        ,  0.        ,  1.        ]])",
             euler("xyz", [5, -3, 120], degrees=True), (1.5, 0.0, -0.25), None, "matrix", tolerance=1e-7),
]

# ---------------------------------------------------------------------------------------------------
# 3x4 [R | t]
# ---------------------------------------------------------------------------------------------------
RT_3X4 = [
    PoseCase("kitti-odometry-tr", "rt-3x4", KITTI_ODO.format("calib.txt, line Tr"),
             "Tr: " + fmt(KITTI_ODOMETRY_TR, ".12e"),
             mat(KITTI_ODOMETRY_TR, 4), tuple(KITTI_ODOMETRY_TR[3::4]), None, "matrix"),
    PoseCase("kitti-poses-line", "rt-3x4", KITTI_ODO.format("poses/00.txt, second line (camera 0 pose)"),
             fmt(KITTI_POSES_LINE, "e"),
             mat(KITTI_POSES_LINE, 4), tuple(KITTI_POSES_LINE[3::4]), None, "matrix"),
    PoseCase("kitti-object-tr-velo-to-cam", "rt-3x4", KITTI_OBJ + ", line Tr_velo_to_cam",
             "Tr_velo_to_cam: " + fmt(KITTI_OBJECT_TR_VELO_TO_CAM, ".12e"),
             mat(KITTI_OBJECT_TR_VELO_TO_CAM, 4), tuple(KITTI_OBJECT_TR_VELO_TO_CAM[3::4]), None, "matrix"),
    PoseCase("rt-caption-three-rows", "rt-3x4", "invented values; '[R|t]' caption over three rows of four",
             "[R|t] =\n0 -1 0 0.1\n1 0 0 0.2\n0 0 1 0.3",
             mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), (0.1, 0.2, 0.3), None, "matrix"),
    PoseCase("numpy-print-3x4", "rt-3x4", "invented values in numpy's array printing, a 3x4 [R | t]",
             "[[ 1.     0.     0.     0.25 ]\n [ 0.     0.     -1.    0.   ]\n [ 0.     1.     0.     1.125]]",
             euler("x", 90, degrees=True), (0.25, 0.0, 1.125), None, "matrix"),
    PoseCase("rt-one-line-twelve", "rt-3x4", "invented values; 12 numbers row-major on one line with a key",
             "extrinsic_rt: 0.0 0.0 1.0 0.05 -1.0 0.0 0.0 0.0 0.0 -1.0 0.0 -0.02",
             mat([[0, 0, 1], [-1, 0, 0], [0, -1, 0]]), (0.05, 0.0, -0.02), None, "matrix"),
]

# ---------------------------------------------------------------------------------------------------
# 3x3 R beside a separate T / t
# ---------------------------------------------------------------------------------------------------
R_AND_T = [
    PoseCase("kitti-imu-to-velo", "r-and-t", KITTI_RAW.format("calib_imu_to_velo.txt"),
             "calib_time: 07-Jun-2011 09:12:43\nR: " + fmt(KITTI_IMU_TO_VELO_R, "e") +
             "\nT: " + fmt(KITTI_IMU_TO_VELO_T, "e") + "\n",
             mat(KITTI_IMU_TO_VELO_R), tuple(KITTI_IMU_TO_VELO_T), None, "matrix"),
    PoseCase("kitti-velo-to-cam", "r-and-t", KITTI_RAW.format("calib_velo_to_cam.txt (with delta_f, delta_c)"),
             "calib_time: 19-Apr-2011 14:05:29\nR: " + fmt(KITTI_VELO_TO_CAM_R, "e") +
             "\nT: " + fmt(KITTI_VELO_TO_CAM_T, "e") +
             "\ndelta_f: 0.000000e+00 0.000000e+00\ndelta_c: 0.000000e+00 0.000000e+00\n",
             mat(KITTI_VELO_TO_CAM_R), tuple(KITTI_VELO_TO_CAM_T), None, "matrix"),
    PoseCase("numpy-r-then-t", "r-and-t", "invented values; numpy printing of R and a column t",
             "R =\n[[ 0. -1.  0.]\n [ 1.  0.  0.]\n [ 0.  0.  1.]]\nt =\n[[0.12]\n [0.  ]\n [0.3 ]]",
             mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), (0.12, 0.0, 0.3), None, "matrix"),
    PoseCase("rotation-and-translation-mm", "r-and-t", "invented values; captions with the translation unit",
             "Rotation matrix:\n 0.0000  0.0000  1.0000\n-1.0000  0.0000  0.0000\n 0.0000 -1.0000  0.0000\n"
             "Translation (mm): 12.5 -3.0 40.0",
             mat([[0, 0, 1], [-1, 0, 0], [0, -1, 0]]), (12.5, -3.0, 40.0), "mm", "matrix"),
    PoseCase("json-rotation-matrix-translation-vector", "r-and-t",
             "invented values; JSON keys rotation_matrix / translation_vector",
             '{"rotation_matrix": [[0.8660254, -0.5, 0.0], [0.5, 0.8660254, 0.0], [0.0, 0.0, 1.0]],\n'
             ' "translation_vector": [0.0138, 0.0457, -0.4186]}',
             euler("z", 30, degrees=True), (0.0138, 0.0457, -0.4186), None, "matrix"),
    PoseCase("opencv-stereo-r-t", "r-and-t",
             "invented values in the layout of OpenCV FileStorage YAML (%YAML:1.0, !!opencv-matrix with"
             " rows, cols, dt, data); R, T as documented for stereo calibration (x2 = R x1 + T)",
             "%YAML:1.0\n---\nR: !!opencv-matrix\n   rows: 3\n   cols: 3\n   dt: d\n"
             "   data: [ 9.9996192306417131e-01, 0., 8.7265354983739347e-03, 0., 1., 0.,\n"
             "       -8.7265354983739347e-03, 0., 9.9996192306417131e-01 ]\n"
             "T: !!opencv-matrix\n   rows: 3\n   cols: 1\n   dt: d\n   data: [ -1.2012e-01, 3.1e-04, -1.5e-03 ]\n",
             mat([[9.9996192306417131e-01, 0, 8.7265354983739347e-03], [0, 1, 0], [-8.7265354983739347e-03, 0, 9.9996192306417131e-01]]),
             (-1.2012e-01, 3.1e-04, -1.5e-03), None, "matrix"),
    PoseCase("yaml-flow-r-t", "r-and-t", "invented values; YAML flow lists R (9) and t (3)",
             "R: [1, 0, 0, 0, 0, -1, 0, 1, 0]\nt: [0.0, 0.05, 0.3]",
             euler("x", 90, degrees=True), (0.0, 0.05, 0.3), None, "matrix"),
]

# ---------------------------------------------------------------------------------------------------
# Files with several named transforms
# ---------------------------------------------------------------------------------------------------
_KITTI_ODOMETRY_CALIB = "\n".join([
    "P0: " + fmt(KITTI_ODOMETRY_P0, ".12e"), "P1: " + fmt(KITTI_ODOMETRY_P1, ".12e"),
    "Tr: " + fmt(KITTI_ODOMETRY_TR, ".12e")])
_KITTI_OBJECT_CALIB = "\n".join([
    "P2: " + fmt(KITTI_OBJECT_P2, ".12e"), "R0_rect: " + fmt(KITTI_OBJECT_R0_RECT, ".12e"),
    "Tr_velo_to_cam: " + fmt(KITTI_OBJECT_TR_VELO_TO_CAM, ".12e"),
    "Tr_imu_to_velo: " + fmt(KITTI_OBJECT_TR_IMU_TO_VELO, ".12e")]) + "\n"
_TWO_KEYS_YAML = ("T_imu_cam0:\n  rows: 4\n  cols: 4\n  data: [" + _euroc_rows(EUROC_CAM0_T_BS, "         ") +
                  "]\nT_imu_cam1:\n  rows: 4\n  cols: 4\n  data: [" + _euroc_rows(EUROC_CAM1_T_BS, "         ") + "]\n")
_TF_STATIC_ECHO = """transforms:
- header:
    stamp:
      sec: 1700000000
      nanosec: 0
    frame_id: base_link
  child_frame_id: imu_link
  transform:
    translation:
      x: 0.1
      y: 0.0
      z: 0.05
    rotation:
      x: 0.0
      y: 0.0
      z: 0.7071068
      w: 0.7071068
- header:
    stamp:
      sec: 1700000000
      nanosec: 0
    frame_id: base_link
  child_frame_id: laser
  transform:
    translation:
      x: 0.25
      y: 0.0
      z: 0.3
    rotation:
      x: 0.0
      y: 0.0
      z: 0.0
      w: 1.0
---
"""
_TWO_PUBLISHERS_LAUNCH = """<launch>
  <node pkg="tf2_ros" exec="static_transform_publisher" name="laser_tf"
        args="0.2 0 0.15 0 0 0 base_link laser"/>
  <node pkg="tf2_ros" exec="static_transform_publisher" name="imu_tf"
        args="0 0 0.05 1.5708 0 3.14159 base_link imu"/>
</launch>"""
_TWO_JOINTS_URDF = """<robot name="cart">
  <joint name="imu_joint" type="fixed">
    <parent link="base_link"/>
    <child link="imu_link"/>
    <origin xyz="0.05 0 0.12" rpy="3.14159 0 0"/>
  </joint>
  <joint name="camera_joint" type="fixed">
    <parent link="base_link"/>
    <child link="camera_link"/>
    <origin xyz="0.3 0 0.2" rpy="0 0.2618 0"/>
  </joint>
</robot>"""
_CAMERA_INFO_YAML = """image_width: 640
image_height: 480
camera_name: narrow_stereo/left
camera_matrix:
  rows: 3
  cols: 3
  data: [430.2, 0, 319.5, 0, 430.2, 239.5, 0, 0, 1]
distortion_model: plumb_bob
distortion_coefficients:
  rows: 1
  cols: 5
  data: [-0.29, 0.08, 0.0002, -0.0001, 0]
rectification_matrix:
  rows: 3
  cols: 3
  data: [0.9998477, 0, 0.0174524, 0, 1, 0, -0.0174524, 0, 0.9998477]
projection_matrix:
  rows: 3
  cols: 4
  data: [410.1, 0, 322.4, 0, 0, 410.1, 241.7, 0, 0, 0, 1, 0]
"""

SEVERAL_NAMED = [
    PoseCase("kitti-odometry-calib-tr", "several-named", KITTI_ODO.format("calib.txt (P0, P1, Tr)"),
             _KITTI_ODOMETRY_CALIB, mat(KITTI_ODOMETRY_TR, 4), tuple(KITTI_ODOMETRY_TR[3::4]), None,
             "matrix", hints={"name": "Tr"}, name="Tr"),
    PoseCase("kitti-object-calib-r0-rect", "several-named", KITTI_OBJ, _KITTI_OBJECT_CALIB,
             mat(KITTI_OBJECT_R0_RECT), None, None, "matrix", hints={"name": "R0_rect"}, name="R0_rect"),
    PoseCase("kitti-object-calib-velo-to-cam", "several-named", KITTI_OBJ, _KITTI_OBJECT_CALIB,
             mat(KITTI_OBJECT_TR_VELO_TO_CAM, 4), tuple(KITTI_OBJECT_TR_VELO_TO_CAM[3::4]), None, "matrix",
             hints={"name": "Tr_velo_to_cam"}, name="Tr_velo_to_cam"),
    PoseCase("kitti-object-calib-imu-to-velo", "several-named", KITTI_OBJ, _KITTI_OBJECT_CALIB,
             mat(KITTI_OBJECT_TR_IMU_TO_VELO, 4), tuple(KITTI_IMU_TO_VELO_T), None, "matrix",
             hints={"name": "Tr_imu_to_velo"}, name="Tr_imu_to_velo"),
    PoseCase("yaml-two-keys-cam0", "several-named",
             EUROC.format("cam0 and cam1 sensor.yaml T_BS values") + "; arranged as one YAML with two keys",
             _TWO_KEYS_YAML, mat(EUROC_CAM0_T_BS, 4), tuple(EUROC_CAM0_T_BS[3:12:4]), None, "matrix",
             hints={"name": "T_imu_cam0"}, name="T_imu_cam0"),
    PoseCase("yaml-two-keys-cam1", "several-named",
             EUROC.format("cam0 and cam1 sensor.yaml T_BS values") + "; arranged as one YAML with two keys",
             _TWO_KEYS_YAML, mat(EUROC_CAM1_T_BS, 4), tuple(EUROC_CAM1_T_BS[3:12:4]), None, "matrix",
             hints={"name": "T_imu_cam1"}, name="T_imu_cam1"),
    PoseCase("tf-static-echo-imu", "several-named",
             "invented values in the YAML echo layout of a tf2_msgs/TFMessage (geometry_msgs/TransformStamped"
             " list: header.frame_id parent, child_frame_id child)",
             _TF_STATIC_ECHO, xyzw(0, 0, 0.7071068, 0.7071068), (0.1, 0.0, 0.05), None, "quaternion",
             hints={"name": "base_link -> imu_link"}, name="base_link -> imu_link"),
    PoseCase("tf-static-echo-laser", "several-named",
             "invented values in the YAML echo layout of a tf2_msgs/TFMessage",
             _TF_STATIC_ECHO, xyzw(0, 0, 0, 1), (0.25, 0.0, 0.3), None, "quaternion",
             hints={"name": "base_link -> laser"}, name="base_link -> laser"),
    PoseCase("launch-two-publishers-imu", "several-named",
             "invented values; launch XML with two static transform publisher nodes (args x y z yaw pitch"
             " roll frame_id child_frame_id, tf2 documentation)",
             _TWO_PUBLISHERS_LAUNCH, euler("ZYX", [1.5708, 0, 3.14159]), (0.0, 0.0, 0.05), None, "angles",
             hints={"name": "base_link -> imu"}, name="base_link -> imu"),
    PoseCase("urdf-two-joints-camera", "several-named",
             "invented values; URDF joints (origin rpy fixed-axis roll, pitch, yaw in radians, URDF joint"
             " specification); the transform is named by its joint",
             _TWO_JOINTS_URDF, euler("xyz", [0, 0.2618, 0]), (0.3, 0.0, 0.2), None, "angles",
             hints={"name": "camera_joint"}, name="camera_joint"),
    PoseCase("camera-info-rectification", "several-named",
             "invented values in the layout of a ROS camera calibration YAML (camera_matrix,"
             " distortion_coefficients, rectification_matrix, projection_matrix with rows/cols/data)",
             _CAMERA_INFO_YAML, mat([[0.9998477, 0, 0.0174524], [0, 1, 0], [-0.0174524, 0, 0.9998477]]),
             None, None, "matrix", hints={"name": "rectification_matrix"}, name="rectification_matrix"),
]

# ---------------------------------------------------------------------------------------------------
# Position + quaternion lines, orders named by captions or headers
# ---------------------------------------------------------------------------------------------------
POSITION_QUATERNION = [
    PoseCase("caption-on-the-line-xyz-ypr", "position-quaternion",
             "invented values; the columns named before the numbers on the same line (x y z yaw pitch roll:)",
             "x y z yaw pitch roll: 0.25 0 1.1 30 0 -5", euler("ZYX", [30, 0, -5], degrees=True), (0.25, 0.0, 1.1),
             None, "angles"),
    PoseCase("caption-on-the-line-xyz-quaternion", "position-quaternion",
             "invented values; comma-separated names, '=', then the numbers (x, y, z, qx, qy, qz, qw = …)",
             "x, y, z, qx, qy, qz, qw = 1, 2, 3, 0, 0, 0.3826834, 0.9238795", xyzw(0, 0, 0.3826834, 0.9238795),
             (1.0, 2.0, 3.0), None, "quaternion"),
    PoseCase("tum-groundtruth-line", "position-quaternion", TUM,
             "# ground truth trajectory\n# file: 'rgbd_dataset_freiburg1_xyz.bag'\n"
             "# timestamp tx ty tz qx qy qz qw\n1305031098.6659 1.3563 0.6305 1.6380 0.6132 0.5962 -0.3311 -0.3986",
             xyzw(0.6132, 0.5962, -0.3311, -0.3986), (1.3563, 0.6305, 1.6380), None, "quaternion"),
    PoseCase("tum-format-estimate", "position-quaternion",
             "invented values in the TUM RGB-D trajectory layout (timestamp tx ty tz qx qy qz qw)",
             "# timestamp tx ty tz qx qy qz qw\n1700001234.5678 -0.7415 2.5836 1.6892 0.0 0.0 0.2164396 0.9762960",
             xyzw(0, 0, 0.2164396, 0.9762960), (-0.7415, 2.5836, 1.6892), None, "quaternion"),
    # quaternion: SciPy from_euler('ZYX', [-118.4, 12.7, -161.3], degrees=True), w first, 6 decimals
    PoseCase("euroc-groundtruth-csv", "position-quaternion",
             EUROC.format("mav0/state_groundtruth_estimate0/data.csv, a row of all 17 columns"),
             "#timestamp, p_RS_R_x [m], p_RS_R_y [m], p_RS_R_z [m], q_RS_w [], q_RS_x [], q_RS_y [], q_RS_z [],"
             " v_RS_R_x [m s^-1], v_RS_R_y [m s^-1], v_RS_R_z [m s^-1], b_w_RS_S_x [rad s^-1],"
             " b_w_RS_S_y [rad s^-1], b_w_RS_S_z [rad s^-1], b_a_RS_S_x [m s^-2], b_a_RS_S_y [m s^-2],"
             " b_a_RS_S_z [m s^-2]\n"
             "1403712345678901248,3.917264,-2.264183,0.851437,0.176419,-0.486706,0.851549,-0.082814,"
             "-0.031254,0.028471,0.761803,-0.002861,0.020934,0.076128,-0.021947,0.129813,0.069344",
             wxyz(0.176419, -0.486706, 0.851549, -0.082814), (3.917264, -2.264183, 0.851437), "m",
             "quaternion"),
    PoseCase("euroc-style-csv-pose-only", "position-quaternion",
             "invented values in the EuRoC ground-truth CSV header layout, position and quaternion columns only",
             "#timestamp [ns],p_RS_R_x [m],p_RS_R_y [m],p_RS_R_z [m],q_RS_w [],q_RS_x [],q_RS_y [],q_RS_z []\n"
             "1403715289501234944,0.912347,2.071856,0.963418,0.9396926,0.0,0.0,0.3420201",
             wxyz(0.9396926, 0, 0, 0.3420201), (0.912347, 2.071856, 0.963418), "m", "quaternion"),
    PoseCase("csv-header-w-first", "position-quaternion", "invented values; CSV header x,y,z,qw,qx,qy,qz",
             "x,y,z,qw,qx,qy,qz\n1.0,2.0,0.5,0.7071068,0.0,0.0,0.7071068",
             wxyz(0.7071068, 0, 0, 0.7071068), (1.0, 2.0, 0.5), None, "quaternion"),
    PoseCase("csv-header-rotation-first", "position-quaternion",
             "invented values; CSV header timestamp,qx,qy,qz,qw,x,y,z (rotation columns first)",
             "timestamp,qx,qy,qz,qw,x,y,z\n12.500,0.0,0.3826834,0.0,0.9238795,-0.4,0.1,2.2",
             xyzw(0, 0.3826834, 0, 0.9238795), (-0.4, 0.1, 2.2), None, "quaternion"),
    PoseCase("header-without-timestamp", "position-quaternion",
             "invented values; header tx ty tz qx qy qz qw without a timestamp column",
             "tx ty tz qx qy qz qw\n0.25 -0.1 1.5 0.0 0.0 -0.3826834 0.9238795",
             xyzw(0, 0, -0.3826834, 0.9238795), (0.25, -0.1, 1.5), None, "quaternion"),
    PoseCase("captioned-position-wxyz", "position-quaternion",
             "invented values; captions name the position unit and the quaternion order",
             "position (m): 0.1 0.2 0.3\nquaternion (w, x, y, z): 0.9238795 0 0 0.3826834",
             wxyz(0.9238795, 0, 0, 0.3826834), (0.1, 0.2, 0.3), "m", "quaternion"),
    PoseCase("pose-list-caption-xyzw", "position-quaternion",
             "invented values; one list captioned [x, y, z, qx, qy, qz, qw]",
             "pose [x, y, z, qx, qy, qz, qw] = [2.0, -1.0, 0.0, 0.0, 0.0, 0.2588190, 0.9659258]",
             xyzw(0, 0, 0.2588190, 0.9659258), (2.0, -1.0, 0.0), None, "quaternion"),
    PoseCase("semicolon-csv-with-unit-header", "position-quaternion",
             "invented values; semicolon CSV with units in the header",
             "x_mm;y_mm;z_mm;qw;qx;qy;qz\n120.0;-45.5;300.25;0.5;0.5;0.5;0.5",
             wxyz(0.5, 0.5, 0.5, 0.5), (120.0, -45.5, 300.25), "mm", "quaternion"),
]

# ---------------------------------------------------------------------------------------------------
# Pose YAML / JSON blocks
# ---------------------------------------------------------------------------------------------------
POSE_BLOCKS = [
    PoseCase("flat-keys-position-rpy", "pose-yaml-json",
             "invented values; a flat YAML group with x, y, z and roll, pitch, yaw keys (radians by their decimals)",
             "imu:\n  x: 0.12\n  y: -0.03\n  z: 0.4\n  roll: 0.0\n  pitch: 0.1745\n  yaw: 1.5708",
             euler("ZYX", [1.5708, 0.1745, 0.0]), (0.12, -0.03, 0.4), None, "angles"),
    PoseCase("flat-json-position-quaternion", "pose-yaml-json",
             "invented values; one flat JSON object with x, y, z and qx, qy, qz, qw",
             '{"x": 1.0, "y": 2.0, "z": 3.0, "qx": 0.0, "qy": 0.0, "qz": 0.3826834, "qw": 0.9238795}',
             xyzw(0, 0, 0.3826834, 0.9238795), (1.0, 2.0, 3.0), None, "quaternion"),
    PoseCase("pose-stamped-yaml-echo", "pose-yaml-json",
             "invented values in the YAML echo layout of geometry_msgs/PoseStamped (header, pose.position,"
             " pose.orientation x y z w)",
             "header:\n  stamp:\n    sec: 1700000000\n    nanosec: 123456789\n  frame_id: map\npose:\n"
             "  position:\n    x: 1.0\n    y: 2.0\n    z: 0.0\n  orientation:\n    x: 0.0\n    y: 0.0\n"
             "    z: 0.7071068\n    w: 0.7071068\n---\n",
             xyzw(0, 0, 0.7071068, 0.7071068), (1.0, 2.0, 0.0), None, "quaternion"),
    PoseCase("transform-stamped-yaml", "pose-yaml-json",
             "invented values in the YAML layout of geometry_msgs/TransformStamped (transform.translation,"
             " transform.rotation)",
             "header:\n  stamp:\n    sec: 0\n    nanosec: 0\n  frame_id: base_link\nchild_frame_id: imu_link\n"
             "transform:\n  translation:\n    x: 0.1\n    y: 0.0\n    z: 0.05\n  rotation:\n    x: 0.0\n"
             "    y: 0.0\n    z: 0.0\n    w: 1.0\n",
             xyzw(0, 0, 0, 1), (0.1, 0.0, 0.05), None, "quaternion"),
    PoseCase("pose-json-dicts", "pose-yaml-json", "invented values; JSON with position and orientation objects",
             '{"position": {"x": -0.5, "y": 0.25, "z": 1.0},\n'
             ' "orientation": {"x": 0.0, "y": 0.3826834, "z": 0.0, "w": 0.9238795}}',
             xyzw(0, 0.3826834, 0, 0.9238795), (-0.5, 0.25, 1.0), None, "quaternion"),
    PoseCase("nuscenes-cam-front", "pose-yaml-json", NUSC.format("CAM_FRONT record"),
             '{\n"token": "a6b903b7be2c335a554479b2930a7056",\n"sensor_token": "24ffd919c5ad91e1d519e9a93368a3db",\n'
             '"translation": [\n1.72316408271,\n0.00893571264815,\n1.49372610548\n],\n"rotation": [\n'
             + ",\n".join(repr(v) for v in NUSC_CAM_FRONT_Q) + '\n],\n'
             '"camera_intrinsic": [\n[\n1240.512483792002,\n0.0,\n826.6942773876904\n],\n[\n0.0,\n'
             '1240.512483792002,\n476.78345833288046\n],\n[\n0.0,\n0.0,\n1.0\n]\n]\n}',
             wxyz(*NUSC_CAM_FRONT_Q), (1.72316408271, 0.00893571264815, 1.49372610548), None, "quaternion",
             hints={"order": "wxyz"}, offered=(wxyz(*NUSC_CAM_FRONT_Q), xyzw(*NUSC_CAM_FRONT_Q))),
    PoseCase("nuscenes-lidar-top", "pose-yaml-json", NUSC.format("LIDAR_TOP record"),
             '{"token": "02c0302c7b39775f1c72b2dc1a009086", "sensor_token": "52eb322b385e4dd1dc7f3c494ad8a179",'
             ' "translation": [0.985216, 0.0, 1.79342], "rotation": [' + ", ".join(repr(v) for v in NUSC_LIDAR_TOP_Q)
             + '], "camera_intrinsic": []}',
             wxyz(*NUSC_LIDAR_TOP_Q), (0.985216, 0.0, 1.79342), None, "quaternion", hints={"order": "wxyz"},
             offered=(wxyz(*NUSC_LIDAR_TOP_Q), xyzw(*NUSC_LIDAR_TOP_Q))),
    PoseCase("ego-pose-style-json", "pose-yaml-json",
             "invented values in the layout of the nuScenes ego_pose table (rotation w, x, y, z per"
             " schema_nuscenes.md)",
             '{"token": "84244653ad2eac1a7de546e38c89d2a2", "timestamp": 1530000123456789,\n'
             ' "rotation": [0.8660254, 0.0, 0.0, 0.5], "translation": [411.3, 1180.9, 0.0]}',
             wxyz(0.8660254, 0, 0, 0.5), (411.3, 1180.9, 0.0), None, "quaternion", hints={"order": "wxyz"},
             offered=(wxyz(0.8660254, 0, 0, 0.5), xyzw(0.8660254, 0, 0, 0.5))),
    PoseCase("pose-with-covariance-yaml", "pose-yaml-json",
             "invented values in the YAML echo layout of geometry_msgs/PoseWithCovarianceStamped (36-number"
             " covariance beside the pose)",
             "header:\n  stamp:\n    sec: 1700000100\n    nanosec: 0\n  frame_id: map\npose:\n  pose:\n"
             "    position:\n      x: 3.5\n      y: -1.25\n      z: 0.0\n    orientation:\n      x: 0.0\n"
             "      y: 0.0\n      z: -0.2588190\n      w: 0.9659258\n  covariance:\n"
             + "".join(f"  - {0.25 if i in (0, 7) else 0.068 if i == 35 else 0.0}\n" for i in range(36)),
             xyzw(0, 0, -0.2588190, 0.9659258), (3.5, -1.25, 0.0), None, "quaternion"),
    PoseCase("yaml-flow-translation-rotation", "pose-yaml-json",
             "invented values; YAML flow maps translation {x, y, z} and rotation {x, y, z, w}",
             "translation: {x: 1.0, y: 2.0, z: 3.0}\nrotation: {x: 0.0, y: 0.0, z: 0.38268343, w: 0.92387953}",
             xyzw(0, 0, 0.38268343, 0.92387953), (1.0, 2.0, 3.0), None, "quaternion"),
    PoseCase("json-rotation-keyed-w-first", "pose-yaml-json",
             "invented values; JSON rotation object with w written first, by name",
             '{"translation": {"x": 0.0, "y": 0.0, "z": 0.75}, "rotation": {"w": 0.9659258, "x": 0.2588190,'
             ' "y": 0.0, "z": 0.0}}',
             wxyz(0.9659258, 0.2588190, 0, 0), (0.0, 0.0, 0.75), None, "quaternion"),
]

# ---------------------------------------------------------------------------------------------------
# Transform echo printouts (tf2 documentation: `echo A B` prints the pose of B in A)
# ---------------------------------------------------------------------------------------------------
_REPEATED = "\n".join(
    f"At time 1700000000.{n}00000000\n- Translation: [0.500, 0.000, 0.250]\n"
    f"- Rotation: in Quaternion (xyzw) [0.000, 0.000, {qz:.3f}, {qw:.3f}]\n"
    f"- Rotation: in RPY (radian) [0.000, 0.000, {rad:.3f}]\n- Rotation: in RPY (degree) [0.000, 0.000, {deg:.3f}]"
    for n, qz, qw, rad, deg in ((1, 0.087, 0.996, 0.175, 10.0), (2, 0.092, 0.996, 0.183, 10.5),
                                (3, 0.096, 0.995, 0.192, 11.0)))
ECHO = [
    PoseCase("echo-ros1-block", "transform-echo",
             "invented values in the transform echo layout (tf_echo source: At time, Translation, Rotation in"
             " Quaternion [x, y, z, w], in RPY (radian), in RPY (degree); RPY = fixed-axis roll, pitch, yaw)",
             "At time 1631014570.211\n- Translation: [0.120, -0.045, 0.310]\n"
             "- Rotation: in Quaternion [0.097, -0.054, 0.565, 0.817]\n"
             "            in RPY (radian) [0.100, -0.200, 1.200]\n"
             "            in RPY (degree) [5.730, -11.459, 68.755]",
             euler("xyz", [0.1, -0.2, 1.2]), (0.120, -0.045, 0.310), None, ECHO_KINDS, tolerance=2e-3),
    PoseCase("echo-ros2-with-matrix", "transform-echo",
             "invented values in the newer transform echo layout (Quaternion (xyzw), RPY sections, Matrix)",
             "At time 1700000000.123456789\n- Translation: [0.049, -0.055, 0.019]\n"
             "- Rotation: in Quaternion (xyzw) [-0.176, -0.206, 0.898, 0.347]\n"
             "- Rotation: in RPY (radian) [-0.524, 0.175, 2.356]\n"
             "- Rotation: in RPY (degree) [-30.000, 10.000, 135.000]\n- Matrix:\n"
             "  -0.696 -0.551 -0.460  0.049\n   0.696 -0.674 -0.247 -0.055\n"
             "  -0.174 -0.492  0.853  0.019\n   0.000  0.000  0.000  1.000",
             euler("xyz", [-30, 10, 135], degrees=True), (0.049, -0.055, 0.019), None, ECHO_KINDS,
             tolerance=2e-3),
    PoseCase("echo-repeated-blocks-last", "transform-echo",
             "invented values; three repeated echo blocks, yaw 10, 10.5, 11 deg (issue 11: the last is read)",
             _REPEATED, euler("xyz", [0, 0, 11], degrees=True), (0.5, 0.0, 0.25), None, ECHO_KINDS,
             tolerance=2e-3),
    PoseCase("echo-tf2-tutorial-example", "transform-echo",
             "ROS 2 tf2 tutorial (docs.ros.org): publisher args '1 2 3 0.5 0.1 -1.0 foo bar' (yaw pitch roll,"
             " body-fixed) echoed as this block",
             "At time 0.0\n- Translation: [1.000, 2.000, 3.000]\n- Rotation: in Quaternion [-0.475, -0.076, 0.240, 0.843]",
             euler("ZYX", [0.5, 0.1, -1.0]), (1.0, 2.0, 3.0), None, "quaternion", tolerance=2e-3),
    PoseCase("echo-with-command-line", "transform-echo",
             "invented values; the command line pasted above its echo block, pitch printed -0.000",
             "$ ros2 run tf2_ros tf2_echo base_link camera_link\n[INFO] [1700000000.5]: Waiting for transform"
             " base_link ->  camera_link: Invalid frame ID \"base_link\" passed to canTransform\n"
             "At time 0.0\n- Translation: [0.000, 0.000, 0.000]\n- Rotation: in Quaternion [0.000, 0.000, 0.000, 1.000]\n"
             "            in RPY (radian) [0.000, -0.000, 0.000]\n            in RPY (degree) [0.000, -0.000, 0.000]",
             xyzw(0, 0, 0, 1), (0.0, 0.0, 0.0), None, ECHO_KINDS, tolerance=2e-3),
    PoseCase("echo-optical-frame", "transform-echo",
             "invented values; camera optical frame (roll -90, yaw -90 deg) in the newer echo layout",
             "At time 1700000000.0\n- Translation: [0.000, 0.000, 0.200]\n"
             "- Rotation: in Quaternion (xyzw) [-0.500, 0.500, -0.500, 0.500]\n"
             "- Rotation: in RPY (radian) [-1.571, 0.000, -1.571]\n"
             "- Rotation: in RPY (degree) [-90.000, 0.000, -90.000]\n- Matrix:\n"
             "   0.000  0.000  1.000  0.000\n  -1.000  0.000  0.000  0.000\n"
             "   0.000 -1.000  0.000  0.200\n   0.000  0.000  0.000  1.000",
             euler("xyz", [-90, 0, -90], degrees=True), (0.0, 0.0, 0.2), None, ECHO_KINDS, tolerance=2e-3),
    PoseCase("echo-translation-quaternion-only", "transform-echo",
             "invented values; an echo block with only Translation and Quaternion (xyzw)",
             "At time 1700000000.250000000\n- Translation: [-0.120, 0.000, 0.450]\n"
             "- Rotation: in Quaternion (xyzw) [0.000, 0.259, 0.000, 0.966]",
             euler("y", 30, degrees=True), (-0.12, 0.0, 0.45), None, "quaternion", tolerance=2e-3),
]

# ---------------------------------------------------------------------------------------------------
# Transform-publisher argument lists (tf2 documentation: x y z yaw pitch roll | x y z qx qy qz qw,
# then frame_id child_frame_id; yaw about Z, pitch about Y, roll about X = intrinsic Z-Y'-X'', radians)
# ---------------------------------------------------------------------------------------------------
PUBLISHER = [
    PoseCase("publisher-positional-ypr", "publisher-args",
             "invented values; static transform publisher positional form x y z yaw pitch roll parent child",
             "ros2 run tf2_ros static_transform_publisher 0.1 0 0.2 1.5708 0 0 base_link laser",
             euler("ZYX", [1.5708, 0, 0]), (0.1, 0.0, 0.2), None, "angles"),
    PoseCase("publisher-tutorial-example", "publisher-args",
             "ROS 2 tf2 tutorial (docs.ros.org): 'static_transform_publisher 1 2 3 0.5 0.1 -1.0 foo bar',"
             " (yaw, pitch, roll) body-fixed",
             "ros2 run tf2_ros static_transform_publisher 1 2 3 0.5 0.1 -1.0 foo bar",
             euler("ZYX", [0.5, 0.1, -1.0]), (1.0, 2.0, 3.0), None, "angles"),
    PoseCase("publisher-positional-quaternion", "publisher-args",
             "invented values; positional form x y z qx qy qz qw parent child",
             "rosrun tf2_ros static_transform_publisher 0 0 0 0 0 0.7071068 0.7071068 map odom",
             xyzw(0, 0, 0.7071068, 0.7071068), (0.0, 0.0, 0.0), None, "quaternion"),
    PoseCase("publisher-launch-with-period", "publisher-args",
             "tf documentation example: args=\"1 0 0 0 0 0 1 link1_parent link1 100\" (quaternion form with"
             " period in ms)",
             '<launch>\n<node pkg="tf" type="static_transform_publisher" name="link1_broadcaster"'
             ' args="1 0 0 0 0 0 1 link1_parent link1 100" />\n</launch>',
             xyzw(0, 0, 0, 1), (1.0, 0.0, 0.0), None, "quaternion"),
    PoseCase("publisher-named-flags-ypr", "publisher-args",
             "invented values; named-flag form (--x --y --z --yaw --pitch --roll --frame-id --child-frame-id)",
             "ros2 run tf2_ros static_transform_publisher --x 0.1 --y 0 --z 0.2 --yaw 1.5708 --pitch 0"
             " --roll 0.3 --frame-id base_link --child-frame-id imu_link",
             euler("ZYX", [1.5708, 0, 0.3]), (0.1, 0.0, 0.2), None, "angles"),
    PoseCase("publisher-named-flags-quaternion", "publisher-args",
             "invented values; named-flag form with --qx --qy --qz --qw",
             "ros2 run tf2_ros static_transform_publisher --x 1 --y 2 --z 3 --qx 0 --qy 0 --qz 0.3826834"
             " --qw 0.9238795 --frame-id world --child-frame-id cam",
             xyzw(0, 0, 0.3826834, 0.9238795), (1.0, 2.0, 3.0), None, "quaternion"),
    PoseCase("publisher-named-flags-left-out", "publisher-args",
             "invented values; named-flag form with --y, --z, --pitch and --roll left out (the form's default"
             " for a left-out flag is 0, from memory); read bare, the four numbers were an axis and an angle",
             "ros2 run tf2_ros static_transform_publisher --x 0.25 --yaw 1.5708 --frame-id base_link"
             " --child-frame-id gps",
             euler("ZYX", [1.5708, 0, 0]), (0.25, 0.0, 0.0), None, "angles"),
    PoseCase("publisher-named-flags-quaternion-left-out", "publisher-args",
             "invented values; named-flag form with only --qz and --qw (--qx, --qy 0 by default, from memory)",
             "ros2 run tf2_ros static_transform_publisher --x 0.1 --y 0.2 --z 0.3 --qz 0.7071068 --qw 0.7071068"
             " --frame-id map --child-frame-id odom",
             xyzw(0, 0, 0.7071068, 0.7071068), (0.1, 0.2, 0.3), None, "quaternion"),
    PoseCase("publisher-named-flags-order-shuffled", "publisher-args",
             "invented values; named flags in another order: the flags name each number",
             "ros2 run tf2_ros static_transform_publisher --frame-id a --child-frame-id b --roll -0.2"
             " --pitch 0.1 --yaw 0.5 --z 3 --y 2 --x 1",
             euler("ZYX", [0.5, 0.1, -0.2]), (1.0, 2.0, 3.0), None, "angles"),
    PoseCase("publisher-launch-python-arguments", "publisher-args",
             "invented values; a launch description's arguments list of strings (positional ypr form)",
             "Node(package='tf2_ros', executable='static_transform_publisher',\n"
             "     arguments=['0', '0', '0.5', '0', '0.2618', '0', 'base_link', 'lidar'])",
             euler("ZYX", [0, 0.2618, 0]), (0.0, 0.0, 0.5), None, "angles"),
]

# ---------------------------------------------------------------------------------------------------
# Description files: URDF <origin xyz rpy> (fixed-axis roll, pitch, yaw = extrinsic xyz, radians);
# SDFormat <pose>x y z roll pitch yaw</pose> (radians unless degrees="true")
# ---------------------------------------------------------------------------------------------------
DESCRIPTION = [
    PoseCase("urdf-origin", "description-origin", "invented values; URDF joint origin element",
             '<origin xyz="0 0 0.1" rpy="0 0 1.5708"/>', euler("xyz", [0, 0, 1.5708]), (0.0, 0.0, 0.1), None,
             "angles"),
    PoseCase("urdf-joint-block", "description-origin", "invented values; URDF fixed joint with parent and child",
             '<joint name="imu_joint" type="fixed">\n  <parent link="base_link"/>\n  <child link="imu_link"/>\n'
             '  <origin xyz="0.05 0 0.12" rpy="3.14159 0 0"/>\n</joint>',
             euler("xyz", [3.14159, 0, 0]), (0.05, 0.0, 0.12), None, "angles"),
    PoseCase("urdf-origin-rpy-first", "description-origin", "invented values; rpy attribute before xyz",
             '<origin rpy="0.1 0.2 0.3" xyz="1 2 3" />', euler("xyz", [0.1, 0.2, 0.3]), (1.0, 2.0, 3.0), None,
             "angles"),
    PoseCase("urdf-camera-optical", "description-origin",
             "invented values; the optical-frame joint of a camera description (rpy -pi/2 0 -pi/2 written out)",
             '<joint name="camera_optical_joint" type="fixed">\n  <origin xyz="0 0 0" rpy="-1.5708 0 -1.5708"/>\n'
             '  <parent link="camera_link"/>\n  <child link="camera_optical_frame"/>\n</joint>',
             euler("xyz", [-1.5708, 0, -1.5708]), (0.0, 0.0, 0.0), None, "angles"),
    # The URDF XML specification gives xyz a default of the zero vector when it is not written (from memory).
    PoseCase("urdf-origin-rpy-only", "description-origin",
             "invented values; origin without xyz (the format's default translation is zero)",
             '<origin rpy="0 0.7854 0"/>', euler("xyz", [0, 0.7854, 0]), (0.0, 0.0, 0.0), None, "angles"),
    PoseCase("urdf-origin-scientific", "description-origin", "invented values; exponent notation in attributes",
             '<origin xyz="1.2e-3 -4.5e-2 0.0" rpy="0.0 -1.0e-1 2.5e-1"/>',
             euler("xyz", [0, -0.1, 0.25]), (1.2e-3, -4.5e-2, 0.0), None, "angles"),
    PoseCase("sdf-pose", "description-origin",
             "invented values; SDFormat pose element (x y z roll pitch yaw, radians)",
             '<link name="lidar">\n  <pose relative_to="base_link">0.1 0 0.2 0 0 1.5708</pose>\n</link>',
             euler("xyz", [0, 0, 1.5708]), (0.1, 0.0, 0.2), None, "angles"),
    PoseCase("sdf-pose-degrees", "description-origin",
             "invented values; SDFormat pose with degrees=\"true\" (angles in degrees)",
             '<pose degrees="true">0 0 1 0 30 90</pose>', euler("xyz", [0, 30, 90], degrees=True),
             (0.0, 0.0, 1.0), None, "angles"),
]

# ---------------------------------------------------------------------------------------------------
# Constants and expressions (issue 11 item 3)
# ---------------------------------------------------------------------------------------------------
EXPRESSIONS = [
    PoseCase("urdf-minus-m-pi-over-2", "expressions", "invented values; ${...} expressions in a description file",
             '<origin xyz="0 0 0" rpy="${-M_PI/2} 0 ${-M_PI/2}"/>', euler("xyz", [-math.pi / 2, 0, -math.pi / 2]),
             (0.0, 0.0, 0.0), None, "angles"),
    PoseCase("urdf-pi-over-4", "expressions", "invented values; ${pi/4} in a description file",
             '<origin xyz="0.2 0 0.1" rpy="0 0 ${pi/4}"/>', euler("xyz", [0, 0, math.pi / 4]), (0.2, 0.0, 0.1),
             None, "angles"),
    PoseCase("urdf-upper-pi-over-2", "expressions", "invented values; ${PI/2} in a description file",
             '<origin xyz="0 0 0.3" rpy="0 ${PI/2} 0"/>', euler("xyz", [0, math.pi / 2, 0]), (0.0, 0.0, 0.3), None,
             "angles"),
    PoseCase("urdf-expression-sum", "expressions", "invented values; sums and products inside ${...}",
             '<origin xyz="${0.1 + 0.05} 0 ${-0.2/2}" rpy="${-pi/2 + pi/4} 0 ${pi/180*30}"/>',
             euler("xyz", [-math.pi / 2 + math.pi / 4, 0, math.pi / 180 * 30]), (0.1 + 0.05, 0.0, -0.2 / 2), None,
             "angles"),
    PoseCase("urdf-expression-parentheses", "expressions", "invented values; parentheses inside ${...}",
             '<origin xyz="0 0 ${(0.5 - 0.1) * 2}" rpy="${-(pi/2)} 0 0"/>', euler("xyz", [-(math.pi / 2), 0, 0]),
             (0.0, 0.0, (0.5 - 0.1) * 2), None, "angles"),
    PoseCase("launch-args-pi-over-4", "expressions", "invented values; pi/4 written in a publisher arg list",
             'args="0 0 0.3 pi/4 0 0 base_link laser"', euler("ZYX", [math.pi / 4, 0, 0]), (0.0, 0.0, 0.3), None,
             "angles"),
    PoseCase("launch-args-upper-pi", "expressions", "invented values; PI/2 and -PI/2 in a publisher arg list",
             "static_transform_publisher 0 0 0 -PI/2 0 -PI/2 base_link camera_optical",
             euler("ZYX", [-math.pi / 2, 0, -math.pi / 2]), (0.0, 0.0, 0.0), None, "angles"),
    PoseCase("keyed-pi-symbol", "expressions", "invented values; the π symbol in keyed yaw, pitch, roll",
             "yaw = π/6, pitch = 0, roll = -π/12", euler("ZYX", [math.pi / 6, 0, -math.pi / 12]), None, None,
             "angles"),
    PoseCase("sdf-pose-expression-free-m-pi", "expressions", "invented values; ${M_PI} in a description file",
             '<origin xyz="0 0 0" rpy="${M_PI} 0 0"/>', euler("xyz", [math.pi, 0, 0]), (0.0, 0.0, 0.0), None,
             "angles"),
]

# ---------------------------------------------------------------------------------------------------
# Matrix YAML with rows / cols / dt / data (the header numbers are not data)
# ---------------------------------------------------------------------------------------------------
MATRIX_YAML = [
    PoseCase("opencv-r-3x3", "matrix-yaml", "invented values in OpenCV FileStorage YAML layout",
             "%YAML:1.0\n---\nR: !!opencv-matrix\n   rows: 3\n   cols: 3\n   dt: d\n"
             "   data: [ 0., -1., 0., 1., 0., 0., 0., 0., 1. ]\n",
             mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), None, None, "matrix"),
    PoseCase("opencv-4x4", "matrix-yaml", "invented values in OpenCV FileStorage YAML layout, a 4x4",
             "%YAML:1.0\n---\nT_cam_lidar: !!opencv-matrix\n   rows: 4\n   cols: 4\n   dt: d\n"
             "   data: [ 0., -1., 0., 0.05, 0., 0., -1., -0.12, 1., 0., 0., -0.3, 0., 0., 0., 1. ]\n",
             mat([[0, -1, 0], [0, 0, -1], [1, 0, 0]]), (0.05, -0.12, -0.3), None, "matrix"),
    PoseCase("euroc-sensor-yaml", "matrix-yaml", EUROC.format("mav0/cam0/sensor.yaml"),
             "# General sensor definitions.\nsensor_type: camera\ncomment: VI-Sensor cam0 (MT9M034)\n\n"
             "# Sensor extrinsics wrt. the body-frame.\nT_BS:\n  cols: 4\n  rows: 4\n  data: ["
             + _euroc_rows(EUROC_CAM0_T_BS, "         ") + "]\n\n# Camera specific definitions.\nrate_hz: 20\n"
             "resolution: [752, 480]\ncamera_model: pinhole\nintrinsics: [462.118, 460.735, 371.942, 245.608]"
             " #fu, fv, cu, cv\ndistortion_model: radial-tangential\n"
             "distortion_coefficients: [-0.27916503, 0.06842517, 0.00031276, -2.41836275e-05]\n",
             mat(EUROC_CAM0_T_BS, 4), tuple(EUROC_CAM0_T_BS[3:12:4]), None, "matrix"),
    PoseCase("opencv-3x4-float", "matrix-yaml", "invented values in OpenCV FileStorage YAML layout, dt: f, 3x4",
             "%YAML:1.0\n---\nRT: !!opencv-matrix\n   rows: 3\n   cols: 4\n   dt: f\n"
             "   data: [ 1., 0., 0., 1.5e-01, 0., 0., -1., 0., 0., 1., 0., 2.5e-01 ]\n",
             euler("x", 90, degrees=True), (0.15, 0.0, 0.25), None, "matrix"),
    PoseCase("yaml-rotation-rows-cols-data", "matrix-yaml",
             "invented values; rows/cols/data without a type tag",
             "rotation:\n  rows: 3\n  cols: 3\n  data: [0.9659258, -0.2588190, 0.0, 0.2588190, 0.9659258, 0.0,"
             " 0.0, 0.0, 1.0]",
             euler("z", 15, degrees=True), None, None, "matrix"),
    PoseCase("opencv-r-cols-before-rows", "matrix-yaml",
             "invented values; OpenCV YAML with the 3x3 header numbers written cols first",
             "R_imu_cam: !!opencv-matrix\n  cols: 3\n  rows: 3\n  dt: d\n  data: [ 1., 0., 0., 0., 0.8660254,"
             " -0.5, 0., 0.5, 0.8660254 ]",
             euler("x", 30, degrees=True), None, None, "matrix"),
]

# ---------------------------------------------------------------------------------------------------
# Rotation vectors labelled rvec / rvecs / om (radians)
# ---------------------------------------------------------------------------------------------------
ROTATION_VECTORS = [
    PoseCase("opencv-yaml-rvec", "rotation-vector-label", "invented values in OpenCV FileStorage YAML layout",
             "%YAML:1.0\n---\nrvec: !!opencv-matrix\n   rows: 3\n   cols: 1\n   dt: d\n"
             "   data: [ 1.0e-01, -2.0e-01, 3.0e-01 ]\n",
             rotvec([0.1, -0.2, 0.3]), None, None, "rotation-vector"),
    PoseCase("rvec-inline", "rotation-vector-label", "invented values; rvec label, radians",
             "rvec = [0.1234, -0.5678, 0.9012]", rotvec([0.1234, -0.5678, 0.9012]), None, None, "rotation-vector"),
    PoseCase("rvec-tvec-numpy-columns", "rotation-vector-label",
             "invented values; rvec and tvec as numpy column arrays",
             "rvec:\n[[ 0.0567]\n [-0.3427]\n [ 0.0135]]\ntvec:\n[[-1.23 ]\n [ 0.45 ]\n [12.7  ]]",
             rotvec([0.0567, -0.3427, 0.0135]), (-1.23, 0.45, 12.7), None, "rotation-vector"),
    PoseCase("om-small-angles", "rotation-vector-label", "invented values; om label (a calibration rotation vector)",
             "om = [ 0.00611   0.00409  -0.00359 ]", rotvec([0.00611, 0.00409, -0.00359]), None, None,
             "rotation-vector"),
    PoseCase("rvecs-first-view", "rotation-vector-label", "invented values; rvecs label with one view",
             "rvecs: [array([[ 1.2345],\n       [-0.0123],\n       [ 0.0456]])]",
             rotvec([1.2345, -0.0123, 0.0456]), None, None, "rotation-vector"),
    PoseCase("rvec-tvec-json", "rotation-vector-label", "invented values; JSON rvec and tvec",
             '{"rvec": [2.221441, 0.0, 0.0], "tvec": [0.1, 0.2, 1.5]}', rotvec([2.221441, 0, 0]), (0.1, 0.2, 1.5),
             None, "rotation-vector"),
    PoseCase("om-yaml", "rotation-vector-label", "invented values; om key in YAML",
             "om: [0.5, -0.3, 0.2]\nT: [-60.1, 0.2, 1.1]", rotvec([0.5, -0.3, 0.2]), (-60.1, 0.2, 1.1), None,
             "rotation-vector"),
]

# ---------------------------------------------------------------------------------------------------
# Quaternions written a + bi + cj + dk (Hamilton's notation: w + x i + y j + z k)
# ---------------------------------------------------------------------------------------------------
IJK = [
    PoseCase("ijk-four-decimals", "quaternion-ijk", "invented: 90 deg about z printed to 4 decimals",
             "0.7071 + 0i + 0j + 0.7071k", euler("z", 90, degrees=True), None, None, "quaternion", tolerance=1e-3),
    PoseCase("ijk-q-equals", "quaternion-ijk", "invented values; q = w + xi + yj + zk",
             "q = 0.9238795 + 0.0000000i + 0.0000000j + 0.3826834k", wxyz(0.9238795, 0, 0, 0.3826834), None, None,
             "quaternion"),
    PoseCase("ijk-halves", "quaternion-ijk", "invented values; all halves",
             "0.5 + 0.5i + 0.5j + 0.5k", wxyz(0.5, 0.5, 0.5, 0.5), None, None, "quaternion"),
    PoseCase("ijk-negative-terms", "quaternion-ijk", "invented values; minus signs between terms",
             "0.5 - 0.5i + 0.5j - 0.5k", wxyz(0.5, -0.5, 0.5, -0.5), None, None, "quaternion"),
    PoseCase("ijk-spaced-units", "quaternion-ijk", "invented values; a space before each unit letter",
             "q = 0.8660254 + 0.5 i + 0 j + 0 k", wxyz(0.8660254, 0.5, 0, 0), None, None, "quaternion"),
    PoseCase("ijk-four-decimals-general", "quaternion-ijk",
             "invented: the unit quaternion along (1, 2, 3, 4) printed to 4 decimals",
             "0.1826 + 0.3651i + 0.5477j + 0.7303k", wxyz(1, 2, 3, 4), None, None, "quaternion", tolerance=1e-3),
    PoseCase("numpy-quaternion-repr", "quaternion-ijk",
             "invented values; numpy-quaternion's repr quaternion(w, x, y, z) (its documentation)",
             "quaternion(0.7071068, 0.0, 0.7071068, 0.0)", wxyz(0.7071068, 0, 0.7071068, 0), None, None,
             "quaternion"),
]

# ---------------------------------------------------------------------------------------------------
# Axis-angle with the angle first, as the caption says
# ---------------------------------------------------------------------------------------------------
ANGLE_FIRST = [
    PoseCase("angle-axis-caption-rad", "angle-first-axis-angle", "invented values; caption names angle then axis",
             "angle (rad), axis: 0.785398 0 0 1", axang([0, 0, 1], 0.785398), None, None, "axis-angle"),
    PoseCase("eigen-angleaxis-constructor", "angle-first-axis-angle",
             "invented values; Eigen::AngleAxisd(angle, axis) constructor (Eigen documentation: angle in radians"
             " first)",
             "Eigen::AngleAxisd aa(0.785398, Eigen::Vector3d(0, 0, 1));", axang([0, 0, 1], 0.785398), None, None,
             "axis-angle"),
    PoseCase("angle-keyed-then-axis", "angle-first-axis-angle", "invented values; angle and axis keyed",
             "AngleAxis: angle = 1.5708 rad, axis = [0, 1, 0]", axang([0, 1, 0], 1.5708), None, None, "axis-angle"),
    PoseCase("angle-about-axis-degrees", "angle-first-axis-angle",
             "invented: 30 deg about (1, 1, 1)/sqrt(3), axis printed to 4 decimals",
             "rotation: 30° about [0.5774, 0.5774, 0.5774]", axang([1, 1, 1], 30, degrees=True), None, None,
             "axis-angle", tolerance=1e-3),
    PoseCase("angle-first-bracket-caption", "angle-first-axis-angle",
             "invented: 120 deg about (1, 1, 1)/sqrt(3); angle printed to 4 decimals (2.0944 rad)",
             "angle-axis [angle first]: 2.0944 0.57735 0.57735 0.57735", axang([1, 1, 1], 2 * math.pi / 3), None,
             None, "axis-angle", tolerance=1e-3),
    PoseCase("angle-axis-tuple-unnormalised", "angle-first-axis-angle",
             "invented values; (angle, axis) tuple with an axis that is not unit length",
             "(angle, axis) = (120 deg, [1, 1, 1])", axang([1, 1, 1], 120, degrees=True), None, None, "axis-angle"),
    PoseCase("theta-then-n", "angle-first-axis-angle", "invented values; theta then n",
             "theta, n = 90 deg, (1, 0, 0)", axang([1, 0, 0], 90, degrees=True), None, None, "axis-angle"),
]

# ---------------------------------------------------------------------------------------------------
# Library calls and printouts (SciPy Rotation documentation: lower-case sequence extrinsic, upper-case
# intrinsic, radians unless degrees=True, as_quat scalar last unless scalar_first=True; Eigen quaternion
# constructor w first, coeffs() x, y, z, w)
# ---------------------------------------------------------------------------------------------------
LIBRARY = [
    PoseCase("scipy-from-euler-lower", "library-call", "SciPy Rotation.from_euler documentation",
             "R.from_euler('xyz', [10, 20, 30], degrees=True)", euler("xyz", [10, 20, 30], degrees=True), None,
             None, "angles"),
    PoseCase("scipy-from-euler-upper", "library-call", "SciPy Rotation.from_euler documentation",
             "Rotation.from_euler('XYZ', [10, 20, 30], degrees=True)", euler("XYZ", [10, 20, 30], degrees=True),
             None, None, "angles"),
    PoseCase("scipy-as-euler-lower-printout", "library-call", "SciPy as_euler documentation; invented values",
             ">>> r.as_euler('zyx', degrees=True)\narray([30., 20., 10.])", euler("zyx", [30, 20, 10], degrees=True),
             None, None, "angles"),
    PoseCase("scipy-as-euler-upper-printout", "library-call", "SciPy as_euler documentation; invented values",
             ">>> r.as_euler('ZYX', degrees=True)\narray([ 45.        ,  10.        , -20.        ])",
             euler("ZYX", [45, 10, -20], degrees=True), None, None, "angles"),
    PoseCase("scipy-as-euler-radians", "library-call",
             "SciPy as_euler documentation (radians unless degrees=True); invented values",
             ">>> r.as_euler('xyz')\narray([0.1, 0.2, 0.3])", euler("xyz", [0.1, 0.2, 0.3]), None, None, "angles"),
    PoseCase("scipy-as-quat-printout", "library-call", "SciPy as_quat documentation (scalar last)",
             ">>> r.as_quat()\narray([0.        , 0.        , 0.38268343, 0.92387953])",
             xyzw(0, 0, 0.38268343, 0.92387953), None, None, "quaternion"),
    PoseCase("scipy-as-quat-scalar-first", "library-call", "SciPy as_quat(scalar_first=True) documentation",
             ">>> r.as_quat(scalar_first=True)\narray([0.92387953, 0.        , 0.        , 0.38268343])",
             wxyz(0.92387953, 0, 0, 0.38268343), None, None, "quaternion"),
    PoseCase("scipy-as-rotvec-radians", "library-call", "SciPy as_rotvec documentation (radians)",
             ">>> r.as_rotvec()\narray([0.        , 0.        , 0.78539816])", rotvec([0, 0, 0.78539816]), None,
             None, "rotation-vector"),
    PoseCase("scipy-as-rotvec-degrees", "library-call", "SciPy as_rotvec(degrees=True) documentation",
             ">>> r.as_rotvec(degrees=True)\narray([ 0.,  0., 45.])", rotvec([0, 0, 45], degrees=True), None, None,
             "rotation-vector"),
    PoseCase("scipy-from-euler-proper-lower", "library-call", "SciPy from_euler documentation, proper Euler",
             "Rotation.from_euler('zxz', [45, 30, 60], degrees=True)", euler("zxz", [45, 30, 60], degrees=True),
             None, None, "angles"),
    PoseCase("eigen-quaternion-constructor", "library-call",
             "Eigen::Quaterniond(w, x, y, z) constructor (Eigen documentation: w first)",
             "Eigen::Quaterniond q(0.9238795, 0.0, 0.0, 0.3826834);", wxyz(0.9238795, 0, 0, 0.3826834), None,
             None, "quaternion"),
    PoseCase("eigen-coeffs-printout", "library-call",
             "Eigen Quaternion::coeffs() documentation (x, y, z, w); stream output to 6 significant digits",
             "q.coeffs().transpose() = 0 0 0.382683 0.92388", xyzw(0, 0, 0.38268343, 0.92387953), None, None,
             "quaternion", tolerance=2e-5),
]

# ---------------------------------------------------------------------------------------------------
# [x, y, z, w] captions (and the [w, x, y, z] counterpart)
# ---------------------------------------------------------------------------------------------------
XYZW = [
    PoseCase("caption-bracketed-xyzw", "xyzw-caption", "invented values; [x, y, z, w] caption",
             "[x, y, z, w] = [0, 0, 0.3826834, 0.9238795]", xyzw(0, 0, 0.3826834, 0.9238795), None, None,
             "quaternion"),
    PoseCase("caption-parenthesised-xyzw", "xyzw-caption", "invented values; quat (x, y, z, w) caption",
             "quat (x, y, z, w): 0.1 0.2 0.3 0.9273618", xyzw(0.1, 0.2, 0.3, 0.9273618), None, None, "quaternion"),
    PoseCase("caption-orientation-xyzw", "xyzw-caption", "invented values; orientation [x y z w] caption",
             "orientation [x y z w]: -0.5 0.5 -0.5 0.5", xyzw(-0.5, 0.5, -0.5, 0.5), None, None, "quaternion"),
    PoseCase("caption-in-trailing-comment", "xyzw-caption",
             "invented values; the order named in a trailing comment",
             "q = [0.0, 0.7071068, 0.0, 0.7071068]  # x, y, z, w", xyzw(0, 0.7071068, 0, 0.7071068), None, None,
             "quaternion"),
    PoseCase("caption-xyzw-compact", "xyzw-caption", "invented values; Quaternion (xyzw) caption",
             "Quaternion (xyzw): 0.2588190 0 0 0.9659258", xyzw(0.2588190, 0, 0, 0.9659258), None, None,
             "quaternion"),
    PoseCase("caption-underscore-xyzw", "xyzw-caption", "invented values; q_xyzw key",
             "q_xyzw = [0, 0, -0.7071068, 0.7071068]", xyzw(0, 0, -0.7071068, 0.7071068), None, None, "quaternion"),
    PoseCase("caption-bracketed-wxyz", "xyzw-caption", "invented values; [w, x, y, z] caption, the counterpart",
             "[w, x, y, z] = [0.3826834, 0, 0, 0.9238795]", wxyz(0.3826834, 0, 0, 0.9238795), None, None,
             "quaternion"),
]

# ---------------------------------------------------------------------------------------------------
# Data inside # or // comments when the comment holds the only data
# ---------------------------------------------------------------------------------------------------
COMMENTED = [
    PoseCase("hash-comment-matrix", "comment-data", "invented values; a Python comment holding a matrix",
             "# R_imu_cam = [[0, -1, 0], [1, 0, 0], [0, 0, 1]]", mat([[0, -1, 0], [1, 0, 0], [0, 0, 1]]), None, None,
             "matrix"),
    PoseCase("slash-comment-quaternion-wxyz", "comment-data", "invented values; a C++ comment holding a quaternion",
             "// q (w, x, y, z) = 0.9238795, 0, 0, 0.3826834", wxyz(0.9238795, 0, 0, 0.3826834), None, None,
             "quaternion"),
    PoseCase("hash-comment-4x4-one-line", "comment-data",
             "invented values; a YAML comment holding a row-major 4x4 on one line",
             "# T_base_lidar (row-major 4x4): 1 0 0 0.5 0 1 0 0 0 0 1 1.2 0 0 0 1",
             Rotation.identity(), (0.5, 0.0, 1.2), None, "matrix"),
    PoseCase("hash-comment-keyed-ypr", "comment-data", "invented values; keyed yaw, pitch, roll in a comment",
             "# yaw=30 deg, pitch=5 deg, roll=-2 deg", euler("ZYX", [30, 5, -2], degrees=True), None, None, "angles"),
    PoseCase("slash-comment-matrix-rows", "comment-data", "invented values; three // comment lines, one row each",
             "// 0.8660254 -0.5 0\n// 0.5 0.8660254 0\n// 0 0 1", euler("z", 30, degrees=True), None, None, "matrix"),
    PoseCase("hash-comment-pose-line", "comment-data", "invented values; a commented TUM-layout pose line",
             "# timestamp tx ty tz qx qy qz qw\n# 1.0 0.5 0.0 0.2 0.0 0.0 0.7071068 0.7071068",
             xyzw(0, 0, 0.7071068, 0.7071068), (0.5, 0.0, 0.2), None, "quaternion"),
]

# ---------------------------------------------------------------------------------------------------
# Frame names with slashes (names, never division)
# ---------------------------------------------------------------------------------------------------
SLASHED_NAMES = [
    PoseCase("publisher-slashed-frames-period", "frame-names", "invented values; leading-slash frames and a period",
             '<node pkg="tf" type="static_transform_publisher" name="camera_init_to_map"'
             ' args="0 0 0 1.570795 0 1.570795 /map /camera_init 10" />',
             euler("ZYX", [1.570795, 0, 1.570795]), (0.0, 0.0, 0.0), None, "angles"),
    PoseCase("transform-stamped-namespaced", "frame-names",
             "invented values; TransformStamped YAML with namespaced frames robot1/base_link",
             "header:\n  frame_id: robot1/base_link\nchild_frame_id: robot1/imu\ntransform:\n  translation:\n"
             "    x: 0.0\n    y: 0.02\n    z: 0.1\n  rotation:\n    x: 0.0\n    y: 0.0\n    z: 1.0\n    w: 0.0\n",
             xyzw(0, 0, 1, 0), (0.0, 0.02, 0.1), None, "quaternion"),
    PoseCase("named-flags-slashed-frames", "frame-names", "invented values; named flags with /base_link /laser",
             "ros2 run tf2_ros static_transform_publisher --x 0.2 --y 0 --z 0.1 --qx 0 --qy 0 --qz 0 --qw 1"
             " --frame-id /base_link --child-frame-id /laser",
             xyzw(0, 0, 0, 1), (0.2, 0.0, 0.1), None, "quaternion"),
    PoseCase("echo-slashed-command", "frame-names", "invented values; echo of /odom /base_link with its block",
             "$ rosrun tf tf_echo /odom /base_link\nAt time 1631014570.211\n- Translation: [2.000, 1.000, 0.000]\n"
             "- Rotation: in Quaternion [0.000, 0.000, 0.707, 0.707]\n            in RPY (radian) [0.000, -0.000, 1.571]\n"
             "            in RPY (degree) [0.000, -0.000, 90.000]",
             euler("z", 90, degrees=True), (2.0, 1.0, 0.0), None, ECHO_KINDS, tolerance=2e-3),
    PoseCase("urdf-namespaced-links", "frame-names", "invented values; links named base/chassis and base/imu",
             '<joint name="base/imu_joint" type="fixed">\n  <parent link="base/chassis"/>\n  <child link="base/imu"/>\n'
             '  <origin xyz="0 0.1 0.05" rpy="0 0 -1.5708"/>\n</joint>',
             euler("xyz", [0, 0, -1.5708]), (0.0, 0.1, 0.05), None, "angles"),
    PoseCase("json-slashed-frames", "frame-names", "invented values; JSON frame ids /world and /sensors/lidar_top",
             '{"frame_id": "/world", "child_frame_id": "/sensors/lidar_top",\n'
             ' "translation": {"x": 1.0, "y": 0.0, "z": 1.8}, "rotation": {"x": 0, "y": 0, "z": 0.3826834,'
             ' "w": 0.9238795}}',
             xyzw(0, 0, 0.3826834, 0.9238795), (1.0, 0.0, 1.8), None, "quaternion"),
    PoseCase("positional-publisher-namespaced", "frame-names",
             "invented values; positional quaternion form with base/odom and base/imu",
             "static_transform_publisher 1 0 0 0 0 0 1 base/odom base/imu", xyzw(0, 0, 0, 1), (1.0, 0.0, 0.0), None,
             "quaternion"),
]

CORPUS: list[PoseCase] = (HOMOGENEOUS + RT_3X4 + R_AND_T + SEVERAL_NAMED + POSITION_QUATERNION + POSE_BLOCKS
                          + ECHO + PUBLISHER + DESCRIPTION + EXPRESSIONS + MATRIX_YAML + ROTATION_VECTORS + IJK
                          + ANGLE_FIRST + LIBRARY + XYZW + COMMENTED + SLASHED_NAMES)

# Every format family of issue 11 items 1, 2 and 4 (and the expressions and names of item 3)
REQUIRED_FAMILIES = frozenset({
    "homogeneous-4x4", "rt-3x4", "r-and-t", "several-named", "position-quaternion", "pose-yaml-json",
    "transform-echo", "publisher-args", "description-origin", "expressions", "matrix-yaml",
    "rotation-vector-label", "quaternion-ijk", "angle-first-axis-angle", "library-call", "xyzw-caption",
    "comment-data", "frame-names"})
