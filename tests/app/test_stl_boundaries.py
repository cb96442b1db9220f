"""STL files at the edge: too large, too many triangles, truncated, garbage, non-finite or huge
coordinates, not a regular file. Each is refused with a message that says what was found; in the window
the message shows under the Scene's toolbar and the part drawn before stays.

Check values: the STL layout (80-byte header, little-endian triangle count, 50-byte records; ASCII
'solid … facet normal … outer loop … vertex x y z') is the format's common description, from memory."""

import os

import numpy as np
import pytest
from PySide6 import QtCore, QtWidgets

from app.scene import stl_reader
from app.scene.stl_reader import StlError, read_stl, write_stl_binary

TRIANGLES = np.array([[[0, 0, 0], [10, 0, 0], [0, 10, 0]], [[0, 0, 0], [0, 10, 0], [0, 0, 5.0]]])


def ascii_stl(triangles_text):
    return "solid part\n" + "".join(
        "facet normal 0 0 0\n outer loop\n" + "".join(f"  vertex {v}\n" for v in t) + " endloop\nendfacet\n"
        for t in triangles_text) + "endsolid part\n"


def test_a_file_over_the_size_cap_is_refused_from_its_size_without_reading(tmp_path, monkeypatch):
    path = tmp_path / "huge.stl"
    with open(path, "wb") as f:   # sparse: no disk is used
        f.truncate(stl_reader.MAX_FILE_BYTES + 1)
    opened = []
    monkeypatch.setattr("builtins.open", lambda *a, **k: opened.append(a) or (_ for _ in ()).throw(OSError()))
    with pytest.raises(StlError, match=r"is 100 MB; the largest STL read is 100 MB"):
        read_stl(path)
    assert opened == []


def test_the_caps_hold_a_binary_part_of_two_million_triangles():
    assert 84 + 50 * stl_reader.MAX_TRIANGLES <= stl_reader.MAX_FILE_BYTES


def test_a_binary_file_of_more_triangles_than_the_cap_is_refused(tmp_path, monkeypatch):
    monkeypatch.setattr(stl_reader, "MAX_TRIANGLES", 1)
    path = tmp_path / "two.stl"
    write_stl_binary(path, TRIANGLES)
    with pytest.raises(StlError, match="has 2 triangles; the largest part drawn has 1"):
        read_stl(path)


def test_an_ascii_file_of_more_triangles_than_the_cap_is_refused_before_parsing(tmp_path, monkeypatch):
    monkeypatch.setattr(stl_reader, "MAX_TRIANGLES", 1)
    monkeypatch.setattr(stl_reader, "_VERTEX", None)   # parsing would fail loudly
    path = tmp_path / "two.stl"
    path.write_text(ascii_stl([["0 0 0", "1 0 0", "0 1 0"]] * 2))
    with pytest.raises(StlError, match="has 2 triangles"):
        read_stl(path)


@pytest.mark.parametrize("cut", [1, 10, 49, 50, 51])
def test_a_truncated_binary_file_is_refused_saying_so(tmp_path, cut):
    path = tmp_path / "cut.stl"
    write_stl_binary(path, TRIANGLES)
    path.write_bytes(path.read_bytes()[:-cut])
    with pytest.raises(StlError, match=r"header counts 2 triangles \(184 bytes\) but the file has "
                                       rf"{184 - cut} bytes \(truncated or damaged\?\)"):
        read_stl(path)


def test_a_binary_header_claiming_four_billion_triangles_is_refused_without_allocating(tmp_path):
    path = tmp_path / "liar.stl"
    path.write_bytes(b"x" * 80 + (2 ** 32 - 1).to_bytes(4, "little") + b"\0" * 50)
    with pytest.raises(StlError, match="4,294,967,295 triangles"):
        read_stl(path)


def test_random_bytes_are_refused(tmp_path):
    rng = np.random.default_rng(5)
    for size in (0, 10, 83, 84, 85, 1000, 100_000):
        path = tmp_path / f"noise{size}.stl"
        path.write_bytes(rng.integers(0, 256, size, dtype=np.uint8).tobytes())
        with pytest.raises(StlError):
            read_stl(path)


@pytest.mark.parametrize("value, words", [
    (np.nan, "has y = nan"), (np.inf, "has y = inf"), (-np.inf, "has y = -inf"),
    (3e38, "has y = 3e\\+38; expected coordinates within ±1e\\+09"), (-2e9, "has y = -2e\\+09"),
])
def test_binary_coordinates_that_are_not_finite_or_are_huge_are_refused_naming_the_vertex(tmp_path, value, words):
    triangles = TRIANGLES.copy()
    triangles[1, 2, 1] = value
    path = tmp_path / "bad.stl"
    write_stl_binary(path, np.where(np.isfinite(triangles), triangles, 0))
    data = bytearray(path.read_bytes())
    offset = 84 + 50 + 12 + 2 * 12 + 4   # second record, after its normal, third vertex, y
    data[offset:offset + 4] = np.array([value], "<f4").tobytes()
    path.write_bytes(bytes(data))
    with pytest.raises(StlError, match=f"triangle 2, vertex 3 {words}"):
        read_stl(path)


@pytest.mark.parametrize("token, words", [
    ("nan", "has z = nan"), ("inf", "has z = inf"), ("-1e400", "has z = -inf"), ("1e300", "has z = 1e\\+300"),
    ("1e12", "has z = 1e\\+12"),
])
def test_ascii_coordinates_that_are_not_finite_or_are_huge_are_refused_naming_the_vertex(tmp_path, token, words):
    path = tmp_path / "bad.stl"
    path.write_text(ascii_stl([["0 0 0", "1 0 0", "0 1 0"], ["0 0 0", f"0 1 {token}", "1 1 1"]]))
    with pytest.raises(StlError, match=f"triangle 2, vertex 2 {words}"):
        read_stl(path)


def test_an_ascii_coordinate_that_is_not_a_number_is_refused_naming_the_line(tmp_path):
    path = tmp_path / "bad.stl"
    path.write_text(ascii_stl([["0 0 0", "1 0 0", "0 1 0"], ["0 0 0", "0 1 0x1p3", "1 1 1"]]))
    with pytest.raises(StlError, match=r"line 12: vertex coordinate '0x1p3' is not a number"):
        read_stl(path)


def test_a_vertex_line_with_two_numbers_is_refused(tmp_path):
    path = tmp_path / "short.stl"
    path.write_text(ascii_stl([["0 0 0", "1 0", "0 1 0"]]))
    with pytest.raises(StlError, match="not a number|not a whole number"):
        read_stl(path)


def test_a_directory_and_a_fifo_are_refused_without_blocking(tmp_path):
    with pytest.raises(StlError, match="not a regular file"):
        read_stl(tmp_path)
    fifo = tmp_path / "pipe.stl"
    os.mkfifo(fifo)   # opening it for reading would wait for a writer forever
    with pytest.raises(StlError, match="not a regular file"):
        read_stl(fifo)


def test_an_ordinary_file_still_reads(tmp_path):
    path = tmp_path / "ok.stl"
    write_stl_binary(path, TRIANGLES)
    np.testing.assert_array_equal(read_stl(path), TRIANGLES)
    path.write_text(ascii_stl([[" ".join(f"{c:g}" for c in v) for v in t] for t in TRIANGLES]))
    np.testing.assert_array_equal(read_stl(path), TRIANGLES)


# --- in the window: the message shows and the part stays ---------------------------------------------

@pytest.fixture
def scene(qtbot):
    from app.scene.scene_widget import SceneWidget
    widget = SceneWidget()
    qtbot.addWidget(widget)
    widget.resize(1280, 800)
    widget.show()
    qtbot.waitExposed(widget)
    return widget


def stl_button(scene):
    return next(b for b in scene.findChildren(QtWidgets.QPushButton) if b.text().startswith("Part from STL"))


@pytest.mark.parametrize("content, words", [
    (b"x" * 80 + (5).to_bytes(4, "little") + b"\0" * 60, "truncated or damaged"),
    (ascii_stl([["0 0 0", "1 0 nan", "0 1 0"]]).encode(), "has z = nan"),
    (ascii_stl([["0 0 0", "0 0 0", "0 0 0"]]).encode(), "every vertex is at the origin"),
    (ascii_stl([["0 0 0", "1e-12 0 0", "0 1e-12 0"]]).encode(), "within 1e-12 of the origin"),
])
def test_clicking_part_from_stl_on_a_bad_file_shows_why_and_keeps_the_part(qtbot, scene, tmp_path, monkeypatch,
                                                                         content, words):
    good = tmp_path / "good.stl"
    write_stl_binary(good, TRIANGLES)
    bad = tmp_path / "bad.stl"
    bad.write_bytes(content)
    chosen = [str(good)]
    monkeypatch.setattr(QtWidgets.QFileDialog, "getOpenFileName", lambda *a, **k: (chosen[0], "STL files (*.stl)"))
    qtbot.mouseClick(stl_button(scene), QtCore.Qt.MouseButton.LeftButton)
    assert scene.part.source == str(good)
    lower, upper, scale = scene.part.lower.copy(), scene.part.upper.copy(), scene.part.scale
    chosen[0] = str(bad)
    qtbot.mouseClick(stl_button(scene), QtCore.Qt.MouseButton.LeftButton)
    message = scene.toolbar.message
    assert message.isVisible() and words in message.text() and "(kept the last part)" in message.text()
    assert scene.part.source == str(good)
    np.testing.assert_array_equal(scene.part.lower, lower)
    np.testing.assert_array_equal(scene.part.upper, upper)
    assert scene.part.scale == scale


@pytest.mark.parametrize("size", [(5e-324, 10, 10), (1e300, 10, 10), (0, 1, 1), (np.nan, 1, 1)])
def test_the_scene_refuses_a_box_it_cannot_draw_and_keeps_the_last(scene, size):
    scene.set_part((50, 40, 30))
    with pytest.raises(ValueError, match="part dimensions"):
        scene.set_part(size)
    assert list(scene.part.size) == [50, 40, 30] and np.isfinite(scene.part.scale)
