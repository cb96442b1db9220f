"""Sequences: every spelling people type, the refusals, the presets only where they apply, the spelled
form with and without primes, and the defaults of the margin helpers.

Check values: CONVENTIONS.md (the twelve sequences, the presets, intrinsic written Z-Y′-X″); SciPy's
Rotation (a general-purpose reference library) for which sequences exist; the rest by hand."""

import numpy as np
import pytest

from core import Orientation
from core.errors import SequenceError
from core.sequences import (ALL_SEQUENCES, best_conditioned_sequence, gimbal_margin, is_proper_euler,
                            other_convention, parse_sequence, preset_names, spelled_sequence)


@pytest.mark.parametrize("text", ["ZYX", "zyx", "Z-Y-X", "Z–Y–X", "Z-Y'-X''", "Z-Y′-X″", 'Z Y" X', "z,y,x",
                                  "Z_Y_X", "Z.Y.X", "Z·Y·X", " z y x ", "Z\tY\nX"])
def test_every_spelling_of_zyx(text):
    assert parse_sequence(text) == "ZYX"


@pytest.mark.parametrize("text, words", [("ZY", "cannot read"), ("ZYXZ", "cannot read"), ("ZYW", "cannot read"),
                                         ("Z/Y/X", "cannot read"), ("", "cannot read"),
                                         ("ZZX", "repeats an axis"), ("XYY", "repeats an axis")])
def test_refusals_say_what_is_wrong(text, words):
    with pytest.raises(SequenceError, match=words):
        parse_sequence(text)


def test_refusal_of_a_repeat_lists_the_twelve():
    with pytest.raises(SequenceError) as caught:
        parse_sequence("zzy")
    assert all(s in str(caught.value) for s in ALL_SEQUENCES) and "'zzy'" in str(caught.value)
    with pytest.raises(SequenceError, match="'ZYX' or 'Z-Y′-X″'"):
        parse_sequence("ab")
    with pytest.raises(SequenceError, match="must be text"):
        parse_sequence(None)


def test_a_sequence_that_repeats_first_and_last_is_proper_euler():
    assert is_proper_euler("z-x-z") and not is_proper_euler("ZYX")
    assert parse_sequence("XYX") == "XYX"


def test_presets_apply_only_to_their_sequence_and_convention():
    # CONVENTIONS.md: yaw–pitch–roll is intrinsic ZYX; roll–pitch–yaw about fixed axes is extrinsic XYZ.
    assert preset_names("ZYX", True) == ("yaw", "pitch", "roll")
    assert preset_names("XYZ", False) == ("roll", "pitch", "yaw")
    assert preset_names("ZYX", False) is None and preset_names("XYZ", True) is None
    assert preset_names("ZXZ", True) is None and preset_names("YXZ", False) is None


def test_spelled_sequences():
    assert spelled_sequence("ZYX", True) == "Z-Y\u2032-X\u2033"          # primes mark the moving axes
    assert spelled_sequence("ZYX", True, ascii=True) == "Z-Y'-X''"
    assert spelled_sequence("XZX", False) == "X-Z-X"
    assert spelled_sequence("XZX", False, ascii=True) == "X-Z-X"


def test_other_convention_returns_floats_reversed():
    sequence, angles, intrinsic = other_convention("zyx", [1, 2, 3], True)
    assert (sequence, angles, intrinsic) == ("XYZ", (3.0, 2.0, 1.0), False)
    assert all(type(a) is np.float64 for a in angles)
    assert other_convention("XZX", (5.0, 6.0, 7.0), False) == ("XZX", (7.0, 6.0, 5.0), True)


def test_margin_defaults_to_intrinsic():
    # By hand: intrinsic ZYX (10, 80, 0) is 10° from lock; extrinsic ZYX of the same orientation is
    # intrinsic XYZ, whose middle angle differs.
    o = Orientation.from_angles("ZYX", [10.0, 80.0, 0.0])
    assert gimbal_margin(o, "ZYX").margin_deg == pytest.approx(10.0, abs=1e-9)
    assert gimbal_margin(o, "ZYX").intrinsic is True
    extrinsic = gimbal_margin(o, "ZYX", intrinsic=False)
    assert extrinsic.intrinsic is False
    assert extrinsic.margin_deg == pytest.approx(gimbal_margin(o, "XYZ").margin_deg, abs=1e-9)
    assert extrinsic.margin_deg != pytest.approx(10.0, abs=1e-3)


def test_best_conditioned_sequence_defaults_and_refusal():
    o = Orientation.from_angles("ZYX", [10.0, 89.0, 0.0])
    best = best_conditioned_sequence(o)
    assert best.intrinsic is True and best.sequence in ALL_SEQUENCES
    margins = {s: gimbal_margin(o, s).margin_deg for s in ALL_SEQUENCES}
    assert best.margin_deg == max(margins.values()) and margins[best.sequence] == best.margin_deg
    only = best_conditioned_sequence(o, ["z-y-x", "XYZ"], intrinsic=False)
    assert only.intrinsic is False and only.sequence in ("ZYX", "XYZ")
    assert only.margin_deg == max(gimbal_margin(o, s, False).margin_deg for s in ("ZYX", "XYZ"))
    with pytest.raises(SequenceError, match="no candidate sequences given"):
        best_conditioned_sequence(o, [])
