"""Readings shown as an instrument shows them: rounded to its division, in its unit (the resolutions are
common practice; the slope is tan(tilt) by definition)."""

import math

import pytest

from core import level_instruments as instruments
from core.errors import InvalidInputError


def test_a_precision_level_reads_to_0_02_mm_per_metre():
    # 0.1° is tan(0.1°)·1000 = 1.745 mm/m (hand-worked), shown as 87 divisions of 0.02: 1.74 mm/m
    reading = instruments.read_with(0.1, "machinist")
    assert reading.divisions == round(1000 * math.tan(math.radians(0.1)) / 0.02) == 87
    assert reading.value == pytest.approx(1.74, abs=1e-12)
    assert reading.text == "1.74 mm/m" and not reading.beyond_range


@pytest.mark.parametrize("key, tilt, text", [
    ("engineer", 0.1, "1.75 mm/m"),        # 1.745 / 0.05 = 34.9 → 35 divisions
    ("electronic", 0.001, "17 µm/m"),      # tan(0.001°)·1e6 = 17.45 → 17
    ("inclinometer", 1.23456, "1.23°"),
    ("builder", 0.1, "1.5 mm/m"),          # 1.745 / 0.5 = 3.49 → 3 divisions
    ("machinist", -0.1, "−1.74 mm/m"),
    ("machinist", 1e-6, "0.00 mm/m"),      # below half a division: zero, never −0.00
    ("machinist", -1e-6, "0.00 mm/m"),
])
def test_each_instrument_rounds_to_its_own_division(key, tilt, text):
    assert instruments.read_with(tilt, key).text == text


def test_a_steep_face_is_marked_beyond_a_levels_use():
    assert instruments.read_with(50.0, "machinist").beyond_range
    assert not instruments.read_with(45.0, "machinist").beyond_range


def test_every_instrument_names_its_resolution_and_unknown_ones_are_refused():
    for chosen in instruments.INSTRUMENTS.values():
        assert chosen.resolution > 0 and chosen.unit in ("mm/m", "um/m", "deg")
    with pytest.raises(InvalidInputError, match="unknown instrument"):
        instruments.read_with(0.1, "theodolite")
    with pytest.raises(InvalidInputError, match="finite"):
        instruments.read_with(math.nan, "machinist")
