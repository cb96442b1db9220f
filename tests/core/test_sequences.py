"""Angle sequences: canonical ranges, the gimbal margin and its amplification, the best-conditioned
sequence and the other-convention spelling."""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core import Orientation
from core.kernels import ALL_SEQUENCES, PROPER_EULER, TAIT_BRYAN
from core.sequences import PRESETS, best_conditioned_sequence, gimbal_margin, other_convention


def test_twelve_sequences_are_the_ones_scipy_accepts():
    # Reference: SciPy's Rotation.from_euler accepts exactly the sequences without an axis repeated in a
    # row; ours are the six Tait–Bryan and six proper Euler ones (Henderson 1977, from memory).
    from itertools import product
    valid = ["".join(p) for p in product("XYZ", repeat=3) if p[0] != p[1] and p[1] != p[2]]
    assert sorted(ALL_SEQUENCES) == sorted(valid)
    assert all(s[0] != s[2] for s in TAIT_BRYAN) and all(s[0] == s[2] for s in PROPER_EULER)
    for s in ALL_SEQUENCES:
        Rotation.from_euler(s, [0.1, 0.2, 0.3])


@pytest.mark.parametrize("pitch", [0.0, 30.0, 80.0, 89.0, 89.9, -45.0])
def test_margin_and_amplification_for_yaw_pitch_roll(pitch):
    # CONVENTIONS.md: margin = 90° − |θ2| for Tait–Bryan; amplification about 1 / sin(margin).
    o = Orientation.from_angles("ZYX", [12, pitch, -7])
    m = gimbal_margin(o, "ZYX")
    # The middle angle as SciPy's Rotation.as_euler finds it for the same matrix.
    theta2 = Rotation.from_matrix(o.as_matrix()).as_euler("ZYX", degrees=True)[1]
    assert m.margin_deg == pytest.approx(90 - abs(theta2), abs=1e-9)
    assert m.margin_deg == pytest.approx(90 - abs(pitch), abs=1e-9)
    assert m.amplification == pytest.approx(1 / np.sin(np.radians(90 - abs(pitch))), rel=1e-9)
    assert not m.locked


@pytest.mark.parametrize("middle", [0.5, 20.0, 90.0, 170.0, 179.5])
def test_margin_for_proper_euler(middle):
    # CONVENTIONS.md: margin = min(θ2, 180° − θ2) for proper Euler sequences.
    o = Orientation.from_angles("ZXZ", [40, middle, 25])
    theta2 = Rotation.from_matrix(o.as_matrix()).as_euler("ZXZ", degrees=True)[1]   # SciPy's middle angle
    assert gimbal_margin(o, "ZXZ").margin_deg == pytest.approx(min(theta2, 180 - theta2), abs=1e-9)


def test_lock_is_reported_with_infinite_amplification():
    m = gimbal_margin(Orientation.from_angles("ZYX", [10, 90, 5]), "ZYX")
    assert m.locked and m.margin_deg < 1e-9 and m.amplification == float("inf")


def test_best_conditioned_sequence_moves_away_from_lock():
    o = Orientation.from_angles("ZYX", [10, 89.5, 5])
    best = best_conditioned_sequence(o)
    assert best.margin_deg > 30
    assert best.margin_deg == max(gimbal_margin(o, s).margin_deg for s in ALL_SEQUENCES)


def test_other_convention_spells_the_same_orientation():
    seq, angles, intrinsic = other_convention("ZYX", [30, 20, 10], True)
    assert (seq, intrinsic) == ("XYZ", False) and angles == (10.0, 20.0, 30.0)
    a = Orientation.from_angles("ZYX", [30, 20, 10], intrinsic=True)
    assert a.isclose(Orientation.from_angles(seq, angles, intrinsic=intrinsic), 1e-15)


def test_presets_spell_the_trade_conventions():
    # CONVENTIONS.md: yaw–pitch–roll = intrinsic ZYX (ψ, θ, φ); roll–pitch–yaw about fixed axes =
    # extrinsic XYZ (φ, θ, ψ). Checked against SciPy's from_euler ('ZYX' intrinsic, 'xyz' extrinsic).
    yaw, pitch, roll = 25.0, -8.0, 3.5
    seq, intrinsic, names = PRESETS["yaw-pitch-roll"]
    assert names == ("yaw", "pitch", "roll")
    ours = Orientation.from_angles(seq, [yaw, pitch, roll], intrinsic=intrinsic)
    assert np.abs(ours.as_matrix() - Rotation.from_euler("ZYX", [yaw, pitch, roll], degrees=True).as_matrix()).max() < 1e-15
    seq, intrinsic, names = PRESETS["roll-pitch-yaw (fixed axes)"]
    assert names == ("roll", "pitch", "yaw")
    ours = Orientation.from_angles(seq, [roll, pitch, yaw], intrinsic=intrinsic)
    assert np.abs(ours.as_matrix() - Rotation.from_euler("xyz", [roll, pitch, yaw], degrees=True).as_matrix()).max() < 1e-15


@pytest.mark.parametrize("sequence", ALL_SEQUENCES)
def test_ranges_of_returned_angles(sequence):
    rng = np.random.default_rng(31)
    for q in rng.normal(size=(300, 4)):
        a = Orientation.from_quaternion(q).as_angles(sequence).angles
        assert -180 < a[0] <= 180 and -180 < a[2] <= 180
        if sequence[0] == sequence[2]:
            assert 0 <= a[1] <= 180
        else:
            assert -90 <= a[1] <= 90


def test_a_first_angle_of_minus_180_is_reported_as_plus_180():
    a = Orientation.from_angles("ZYX", [-180, 10, 20]).as_angles("ZYX").angles
    assert a[0] == pytest.approx(180.0, abs=1e-12)
