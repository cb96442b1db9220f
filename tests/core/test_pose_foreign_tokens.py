"""Issue 11's rule for poses: a token that is no number, caption, unit or name put between two numbers
of a valid pose snippet (tests/core/pose_corpus.py) never yields a reading with another orientation or
another translation: the text is refused, or read exactly as before."""

import numpy as np
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from core.decode import DecodeError, decode
from tests.core.pose_corpus import CORPUS

FOREIGN = st.sampled_from(["NaN", "nan", ".nan", "inf", "-inf", "abc", "foo", "${x}", "q9z", "1e999", "zz",
                           "sqrt(2)", "2**3", "$(arg x)", "None", "null"])


def _spots(text):
    """Places right after a digit and before a space or a separator: between two numbers."""
    return [i for i in range(1, len(text)) if text[i - 1].isdigit() and text[i] in " ,;\t"]


VALID = [c for c in CORPUS if _spots(c.text)]


@st.composite
def pose_with_foreign_token(draw):
    case = draw(st.sampled_from(VALID))
    i = draw(st.sampled_from(_spots(case.text)))
    return case, case.text[:i] + " " + draw(FOREIGN) + " " + case.text[i:]


@settings(suppress_health_check=[HealthCheck.too_slow])
@given(pose_with_foreign_token())
def test_a_foreign_token_never_changes_a_pose(sample):
    assert len(VALID) >= 100
    case, changed = sample
    try:
        readings = decode(changed, case.hints)
    except DecodeError as error:
        assert str(error) and "\n" not in str(error)
        return
    before = decode(case.text, case.hints)[0]
    after = readings[0]
    assert np.allclose(before.orientation.as_matrix(), after.orientation.as_matrix(), atol=1e-12), changed
    assert (before.translation is None) == (after.translation is None), changed
    if before.translation is not None:
        assert np.allclose(before.translation, after.translation, rtol=0, atol=0), changed
