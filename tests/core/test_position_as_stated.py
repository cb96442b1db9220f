"""A translation in the unit a pasted text states: converted to metres once, shown in that unit (a
centimetre text is shown in millimetres, the nearest unit the window offers), the 1000 km bound on both
sides, and an unknown unit refused by name.

Check values: 1 cm = 10 mm = 0.01 m (SI prefixes, common practice); 1 in = 25.4 mm exactly (the 1959
international inch, common practice); the numbers worked by hand."""

import pytest

from core.errors import FramewrightError
from core.position import position_as_stated


def test_centimetres_are_shown_in_millimetres():
    position = position_as_stated((12.5, 0, -3), "cm")
    # By hand: 12.5 cm = 125 mm = 0.125 m; −3 cm = −30 mm = −0.03 m.
    assert position.unit == "mm"
    assert position.metres == pytest.approx((0.125, 0.0, -0.03), rel=1e-15)
    assert position.shown() == pytest.approx((125.0, 0.0, -30.0), rel=1e-15)


@pytest.mark.parametrize("unit, metres", [("in", (0.0254, 0.0508, 0.0)), ("mm", (0.001, 0.002, 0.0)),
                                          ("m", (1.0, 2.0, 0.0)), ("thou", (0.0000254, 0.0000508, 0.0))])
def test_other_units_are_kept_as_stated(unit, metres):
    position = position_as_stated((1, 2, 0), unit)
    # By hand from the unit's length: 1 in = 0.0254 m, 1 thou = 0.001 in = 0.0000254 m.
    assert position.unit == unit
    assert position.metres == pytest.approx(metres, rel=1e-12)
    assert position.shown() == pytest.approx((1.0, 2.0, 0.0), rel=1e-12)


def test_the_1000_km_bound_in_centimetres_on_both_sides():
    # By hand: 1e8 cm = 1e6 m, the bound itself (taken); 1.01e8 cm = 1.01e6 m is beyond it (refused).
    assert position_as_stated((1e8, 0, 0), "cm").metres[0] == pytest.approx(1e6, rel=1e-12)
    with pytest.raises(FramewrightError, match=r"x: 1\.01e\+09 mm is farther than 1e\+06 m \(1000 km\)"):
        position_as_stated((1.01e8, 0, 0), "cm")


def test_an_unknown_unit_is_refused_by_name():
    with pytest.raises(FramewrightError) as caught:
        position_as_stated((1, 0, 0), "km")
    assert str(caught.value) == ("the translation is in 'km', which Framewright cannot convert yet "
                                 "(expected mm, m, in, thou, cm)")
