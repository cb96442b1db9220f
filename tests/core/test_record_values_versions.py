"""Which figures a report of an earlier record version holds (core/record_values.expected_figures), the
versions refused with their exact words, and first_difference's handling of point-fit figures and of the
first of several differences. Check values: the record's own words and version table (version 2 added the
Gibbs vector and the MRP); figure lists invented here."""

import pytest

from core.record_values import RECORD_VERSION, RecordError, expected_figures, first_difference


def _figure(key, values=("1",), unit="dimensionless", label="A figure"):
    return {"key": key, "label": label, "values": list(values), "unit": unit}


FIGURES = [_figure("mount[0].angle", unit="deg"), _figure("mount[0].gibbs"), _figure("mount[0].mrp"),
           _figure("mount[0].mrp_note"), _figure("mount[0].gibbs.x")]


def test_version_1_leaves_out_the_gibbs_vector_and_the_mrp_only():
    kept = expected_figures(FIGURES, 1)
    # keys that only contain the words, not end with them, stay
    assert [f["key"] for f in kept] == ["mount[0].angle", "mount[0].mrp_note", "mount[0].gibbs.x"]


def test_the_current_version_keeps_every_figure():
    assert RECORD_VERSION == 2
    assert expected_figures(FIGURES, 2) == FIGURES


def test_a_figure_without_a_key_is_kept_for_the_comparison_to_name():
    loose = [{"label": "no key", "values": ["1"], "unit": ""}]
    assert expected_figures(loose, 1) == loose
    assert expected_figures(loose, 2) == loose


@pytest.mark.parametrize("version", [0, 3, -1, True, False, "2", 1.0, None])
def test_an_unknown_version_is_refused_in_words(version):
    with pytest.raises(RecordError) as raised:
        expected_figures(FIGURES, version)
    assert str(raised.value) == (f"the report is record version {version!r}; this program reads versions 1 to 2 "
                                 "(a newer report needs a newer Framewright)")


def test_point_fit_figures_are_compared_only_when_the_session_gives_them():
    fit = _figure("check[0].fit_rms", unit="mm")
    assert first_difference([fit, _figure("a")], [_figure("a")]) is None
    assert first_difference([_figure("a")], [fit, _figure("a")]) == \
        "check[0].fit_rms (A figure) is missing from the report"
    assert first_difference([_figure("check[0].fit_rms", ("2",), "mm")], [fit]) == \
        "check[0].fit_rms (A figure): the report says 2, the session gives 1"


def test_the_first_difference_in_the_reports_order_is_named():
    reported = [_figure("a"), _figure("b", ("2",)), _figure("c", ("3",))]
    expected = [_figure("c"), _figure("b"), _figure("a")]
    assert first_difference(reported, expected) == "b (A figure): the report says 2, the session gives 1"


def test_values_are_compared_before_units_and_the_label_is_the_sessions():
    reported = [_figure("a", ("2",), "deg", label="Old words")]
    expected = [_figure("a", ("1",), "mm", label="New words")]
    assert first_difference(reported, expected) == "a (New words): the report says 2, the session gives 1"


def test_the_first_missing_figure_is_named_in_the_sessions_order():
    assert first_difference([_figure("b")], [_figure("a"), _figure("b"), _figure("c")]) == \
        "a (A figure) is missing from the report"
