"""A face normal with an entry that is not a real number (None, text, a complex number) is refused with
the message that names the face normal and shows what was given, like any other slip, never a bare
conversion error; an integer normal or a normal of number text is read as a direction.

Check values: the refusal words are the module's own (face normal: expected a direction of three finite
numbers); a level plate under no correction needs no shim (worked by hand)."""

import numpy as np
import pytest

from core.errors import InvalidInputError
from core.orientation import Orientation
from core.shims import shims, swing_and_twist

PLATE = [(100, 50, -20), (-100, 50, -20), (-100, -50, -20), (100, -50, -20)]


@pytest.mark.parametrize("normal", [(None, 0, 1), ("a", "b", "c"), (0, 0, 1j), ("x", 0, 1)])
def test_a_face_normal_entry_that_is_not_a_number_is_refused_by_name(normal):
    words = f"face normal: expected a direction of three finite numbers, got {normal!r}"
    for call in (lambda: shims(Orientation.identity(), PLATE, normal),
                 lambda: swing_and_twist(Orientation.identity(), normal)):
        with pytest.raises(InvalidInputError) as caught:
            call()
        assert str(caught.value) == words


@pytest.mark.parametrize("normal", [(0, 0, -5), ("0", "0", "-1"), np.array([0, 0, -2], dtype=object)])
def test_integer_and_number_text_normals_are_directions(normal):
    result = shims(Orientation.identity(), PLATE, normal)
    # By hand: no correction, no shim under any foot, no tilt.
    assert np.array_equal(result.shims_mm, np.zeros(4)) and result.tilt_deg == 0.0


@pytest.mark.parametrize("normal", [(10**400, 0, 1), (0, -(10**400), 1)])
def test_a_face_normal_entry_beyond_a_double_is_refused_not_a_crash(normal):
    # An integer of 400 digits cannot become a double (the largest is about 1.8e308, IEEE 754).
    for call in (lambda: shims(Orientation.identity(), PLATE, normal),
                 lambda: swing_and_twist(Orientation.identity(), normal)):
        with pytest.raises(InvalidInputError, match=r"^face normal: expected a direction of three finite numbers"):
            call()


def test_a_very_long_face_normal_is_shown_shortened_in_the_refusal():
    normal = "7" * 100_000
    with pytest.raises(InvalidInputError) as caught:
        shims(Orientation.identity(), PLATE, normal)
    message = str(caught.value)
    assert message.startswith("face normal: expected a direction of three finite numbers, got '777")
    # The echo is cut to 80 characters and marked as cut, so a pasted file cannot flood the status line.
    assert len(message) < 200 and message.endswith("…")
