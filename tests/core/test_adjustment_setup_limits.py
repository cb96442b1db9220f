"""The adjustment setup's limits on both sides: the covariance's 180² bound (degrees², the square of a
half turn, the largest standard uncertainty a setup takes) and the message naming every unknown key of a
file, so a person can see which ones to remove."""

import pytest

from core.adjustment_setup import AdjustmentSetup
from core.errors import FramewrightError


def diagonal(variance):
    return ((variance, 0.0, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, 1.0))


def test_a_covariance_of_exactly_180_squared_is_taken():
    # The limit is 180² = 32400 degrees² (worked by hand), the square of the largest uncertainty (180°).
    setup = AdjustmentSetup(uncertainty_deg=180.0, covariance_deg2=diagonal(32400.0))
    assert setup.covariance_deg2[0][0] == 32400.0


@pytest.mark.parametrize("variance", [32400.5, 32401.0, 32760.0, -32401.0])
def test_a_covariance_just_beyond_180_squared_is_refused(variance):
    # Just above 180² = 32400 (worked by hand) and below 181² = 32761: beyond the bound, refused.
    with pytest.raises(FramewrightError, match=r"3 rows of 3 finite numbers up to 180²"):
        AdjustmentSetup(uncertainty_deg=180.0, covariance_deg2=diagonal(variance))


def test_the_message_lists_each_unknown_key_and_the_expected_ones():
    data = {"axes": "+Z", "colour": "red", "bogus": 1}
    with pytest.raises(FramewrightError) as caught:
        AdjustmentSetup.from_dict(data)
    message = str(caught.value)
    # Sorted and separated by ", " so each name reads on its own.
    assert "unknown key(s) bogus, colour; expected axes, axes_frame, footprint" in message
    assert "XX" not in message
