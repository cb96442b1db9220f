"""Decode: a transform printout with several blocks reads the last and says how far the others are from
it; it names the representation it read; a copied CSV row names its mount in a note, shortened past
60 characters.

Check values: 90° about z is the quaternion (0, 0, sin 45°, cos 45°) scalar last and RPY (0, 0, 90°)
(the half-angle formula; SciPy's Rotation); translations 0, 2 and 1 m along x are at most 1 m from the
last (worked by hand)."""

import numpy as np
from scipy.spatial.transform import Rotation

from core.decode import decode
from core.decode.name_column import split_name_column


def block(time, x):
    return (f"At time {time}\n- Translation: [{x:.3f}, 0.000, 0.000]\n"
            "- Rotation: in Quaternion [0.000000, 0.000000, 0.707107, 0.707107]\n"
            "            in RPY (degree) [0.000, 0.000, 90.000]\n")


def test_of_several_blocks_the_last_is_read_and_the_spread_is_measured_from_it():
    best = decode(block(1.0, 0) + block(2.0, 2) + block(3.0, 1))[0]
    assert best.translation == (1.0, 0.0, 0.0)
    assert "the text holds 3 printout blocks; read the last; the others differ from it by up to 0° and 1 m" \
        in best.notes
    # SciPy: 90° about z.
    np.testing.assert_allclose(best.orientation.as_matrix(),
                               Rotation.from_euler("z", 90, degrees=True).as_matrix(), atol=1e-5)


def test_the_printout_names_the_representation_it_read():
    best = decode(block(1.0, 0))[0]
    # six decimals of the quaternion beat three decimals of degrees
    assert "read its quaternion (x, y, z, w), the most precisely printed representation" in best.notes
    assert any(n.startswith("the block gives 2 representations (quaternion (x, y, z, w), RPY (degree));"
                            " they agree within") for n in best.notes)


def test_a_mount_name_of_sixty_characters_is_shown_whole_and_longer_ones_shortened():
    for length, shown in ((59, "a" * 59), (60, "a" * 60), (61, "a" * 57 + "..."), (90, "a" * 57 + "...")):
        rest, note = split_name_column("name,qw,qx,qy,qz\n" + "a" * length + ",1,0,0,0")
        assert rest == "qw,qx,qy,qz\n1,0,0,0"
        assert note == f"column 'name' is the mount's name ('{shown}'), text and not a number", length
