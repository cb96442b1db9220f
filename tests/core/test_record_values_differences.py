"""first_difference's words when a report's figures and the session's disagree: a figure without a key,
differing values and units, an unknown and a missing figure. Check values: worked by hand from the
figure lists given (the message joins a list's values with ", ")."""

from core.record_values import first_difference


def _figure(values, unit="deg", key="mount.angle", label="Angle"):
    return {"key": key, "label": label, "values": values, "unit": unit}


def test_a_figure_without_a_key_is_named_so():
    expected = [_figure(["1"])]
    assert first_difference([{"label": "Angle", "values": ["1"]}], expected) == "a figure without a key"
    assert first_difference(["not a figure"], expected) == "a figure without a key"


def test_differing_values_are_both_printed_as_lists():
    reported, expected = [_figure(["1.5", "2"])], [_figure(["1.25", "2"])]
    assert first_difference(reported, expected) == \
        "mount.angle (Angle): the report says 1.5, 2, the session gives 1.25, 2"


def test_differing_units_are_printed_as_words():
    assert first_difference([_figure(["1"], "rad")], [_figure(["1"], "deg")]) == \
        "mount.angle (Angle): the report says rad, the session gives deg"


def test_the_same_figures_give_none_and_a_missing_one_is_named():
    assert first_difference([_figure(["1.5", "2"])], [_figure(["1.5", "2"])]) is None
    assert first_difference([], [_figure(["1"])]) == "mount.angle (Angle) is missing from the report"
    assert first_difference([_figure(["1"], key="x.y")], []) == "x.y (Angle) is not a figure of this session"
