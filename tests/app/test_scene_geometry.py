"""Scene geometry (pure numpy), the STL reader and the model binding, checked against outside values."""

import numpy as np
import pytest
from PySide6.QtCore import QObject, Signal
from scipy.spatial.transform import Rotation

from app.scene import geometry
from app.scene.stl_reader import StlError, read_stl, write_stl_binary
from core.orientation import Orientation


@pytest.mark.parametrize("axis, r, angle_deg", [((0, 0, 1), (1, 0, 1), 120.0), ((1, 2, -1), (0.3, -1, 2), 75.0),
                                                ((1, 1, 1), (1, 0, 0), 240.0)])
def test_point_on_the_circle_of_rotation_is_where_scipy_rotates_r(axis, r, angle_deg):
    pieces = geometry.rodrigues_pieces(axis, r)
    n = np.asarray(axis, float) / np.linalg.norm(axis)
    # Check value from SciPy's Rotation.from_rotvec(φ n).apply(r).
    expected = Rotation.from_rotvec(np.radians(angle_deg) * n).apply(r)
    np.testing.assert_allclose(pieces.on_circle(np.radians(angle_deg)), expected, atol=1e-12)
    # r∥ along n and r⊥ across it (CONVENTIONS.md); α the angle between r and n
    np.testing.assert_allclose(np.cross(pieces.r_par, n), 0, atol=1e-12)
    assert abs(np.dot(pieces.r_perp, n)) < 1e-12
    cos_alpha = np.dot(r, n) / np.linalg.norm(r)
    assert pieces.alpha_deg == pytest.approx(np.degrees(np.arccos(cos_alpha)), abs=1e-9)


def test_cone_sector_vertices_keep_the_half_angle_and_stop_at_the_swept_angle():
    pieces = geometry.rodrigues_pieces((0, 0, 1), (1, 0, 1))
    tris = geometry.cone_sector_triangles(pieces, np.radians(90), 16)
    np.testing.assert_allclose(tris[:, 0], 0)  # apex at the origin
    rim = tris[:, 1:].reshape(-1, 3)
    angles = np.degrees(np.arccos(rim[:, 2] / np.linalg.norm(rim, axis=1)))
    np.testing.assert_allclose(angles, 45.0, atol=1e-9)
    azimuths = np.degrees(np.arctan2(rim[:, 1], rim[:, 0]))
    assert azimuths.min() > -1e-9 and azimuths.max() == pytest.approx(90.0)


def test_box_faces_are_wound_outward():
    verts, faces, owners = geometry.box_mesh((4.0, 2.0, 1.0))
    for (a, b, c), owner in zip(faces, owners):
        normal = np.cross(verts[b] - verts[a], verts[c] - verts[a])
        assert np.dot(normal, geometry.FACE_NORMALS[owner]) > 0, owner


def test_arrowhead_basis_points_z_along_the_direction():
    m = geometry.basis_with_z_along((1.0, -2.0, 0.5))
    np.testing.assert_allclose(m.T @ m, np.eye(3), atol=1e-12)
    assert np.linalg.det(m) == pytest.approx(1.0)
    np.testing.assert_allclose(m[:, 2], np.array([1.0, -2.0, 0.5]) / np.linalg.norm([1.0, -2.0, 0.5]))


def test_ascii_and_binary_stl_read_back_the_same_triangles(tmp_path):
    tris = np.array([[[0, 0, 0], [1, 0, 0], [0, 1, 0]], [[0, 0, 0], [0, 1, 0], [0, 0, 1.5]]], float)
    binary = tmp_path / "two.stl"
    write_stl_binary(binary, tris)
    ascii_text = "solid two\n" + "".join(
        "facet normal 0 0 0\n outer loop\n" + "".join(f"  vertex {x:e} {y:e} {z:e}\n" for x, y, z in t)
        + " endloop\nendfacet\n" for t in tris) + "endsolid two\n"
    ascii_path = tmp_path / "two_ascii.stl"
    ascii_path.write_text(ascii_text)
    np.testing.assert_allclose(read_stl(binary), tris)
    np.testing.assert_allclose(read_stl(ascii_path), tris)


def test_binary_stl_whose_header_starts_with_solid_is_still_read_as_binary(tmp_path):
    tris = np.array([[[0, 0, 0], [1, 0, 0], [0, 1, 0]]], float)
    path = tmp_path / "tricky.stl"
    write_stl_binary(path, tris)
    data = bytearray(path.read_bytes())
    data[:5] = b"solid"  # some exporters do this
    path.write_bytes(bytes(data))
    np.testing.assert_allclose(read_stl(path), tris)


def test_broken_stl_files_get_messages_that_say_what_is_wrong(tmp_path):
    cut = tmp_path / "cut.stl"
    cut.write_text("solid x\nfacet normal 0 0 1\nouter loop\nvertex 0 0 0\nvertex 1 0 0\nendloop\nendfacet\n")
    with pytest.raises(StlError, match="not a whole number of triangles"):
        read_stl(cut)
    with pytest.raises(StlError, match="cannot open"):
        read_stl(tmp_path / "missing.stl")


class FakeModel(QObject):
    """The duck-typed model the scene binding assumes: changed(change), current_orientation(),
    ghost_orientation()."""

    changed = Signal(object)

    def __init__(self):
        super().__init__()
        self.orientation = Orientation.identity()
        self.ghost = None

    def current_orientation(self):
        return self.orientation

    def ghost_orientation(self):
        return self.ghost


def test_binding_follows_the_model_and_shows_the_reference_as_ghost_when_there_is_no_second(qtbot):
    from app.scene.model_binding import bind_scene_to_model
    from app.scene.scene_widget import SceneWidget

    scene = SceneWidget()
    qtbot.addWidget(scene)
    model = FakeModel()
    binding = bind_scene_to_model(scene, model)
    assert scene._ghost == Orientation.identity() and scene._ghost_label == "reference"
    model.orientation = Orientation.from_axis_angle((0, 0, 1), 30)
    model.ghost = Orientation.from_axis_angle((0, 0, 1), 29)
    model.changed.emit(None)
    assert scene.orientation() == model.orientation
    assert scene._ghost == model.ghost
    binding.disconnect()
    model.orientation = Orientation.identity()
    model.changed.emit(None)
    assert scene.orientation() != model.orientation


def test_binding_takes_the_part_of_the_real_session_model(qtbot, model):
    from app.scene.model_binding import bind_scene_to_model
    from app.scene.scene_widget import SceneWidget

    scene = SceneWidget()
    qtbot.addWidget(scene)
    bind_scene_to_model(scene, model)
    part = model.current_mount().part
    assert tuple(scene.part.size) == part.box_size_mm
    assert scene.part.boresight_face == part.boresight
    assert scene.orientation() == model.current_orientation()
