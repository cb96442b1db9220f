"""Decode: an angle mark on a number where an axis component stands is refused, and the message says in
full how the angle could be placed first instead (the user reads this sentence to fix the text).

Check values: none numeric; the refusal rule is ours (an axis and angle is read axis first unless the
text says otherwise, common practice for 'x y z angle' listings)."""

import pytest

from core.decode import decode
from core.errors import DecodeError


@pytest.mark.parametrize("text", ["0 12° 0 1", "0 0 12° 1"])
def test_an_angle_mark_on_an_axis_component_is_refused_with_the_whole_reason(text):
    with pytest.raises(DecodeError) as err:
        decode(text)
    message = str(err.value)
    mark = text.split()[[i for i, t in enumerate(text.split()) if "°" in t][0]]
    assert message.startswith("cannot read the 4 numbers: ")
    assert message.endswith(f"'{mark}' carries an angle unit where an axis component stands (an axis and angle"
                            " is read axis first unless the text, or a unit axis after the first number, says the"
                            " angle comes first)")
    assert "XX" not in message


def test_the_same_numbers_with_the_mark_on_the_last_one_are_read():
    # the other side of the rule: the angle where an axis and angle puts it is accepted
    readings = decode("0 0 1 12°")
    assert readings[0].kind == "axis-angle"
    assert readings[0].conventions["order"] == "axis, angle"
