"""The pose corpus (tests/core/pose_corpus.py) through the decoder: the best reading of each real-layout
snippet must be the orientation, translation, unit and kind the source means.

Expected rotations come from SciPy's `Rotation`, built from each source's own parameters (see the corpus
module); the comparison is the angle of expected⁻¹ · decoded, within the case's tolerance (radians), which
follows the print precision of the snippet.
"""

import numpy as np
import pytest
from scipy.spatial.transform import Rotation

from core.decode import decode
from tests.core.pose_corpus import CORPUS, REQUIRED_FAMILIES

BY_ID = {case.id: case for case in CORPUS}


def _as_scipy(reading) -> Rotation:
    """Our w-first Hamilton quaternion handed to SciPy as scalar first (SciPy from_quat documentation)."""
    return Rotation.from_quat(np.asarray(reading.orientation.as_quaternion(), dtype=float), scalar_first=True)


def _angle_between(expected: Rotation, found: Rotation) -> float:
    return float((expected.inv() * found).magnitude())


def _without_name(hints):
    rest = {k: v for k, v in (hints or {}).items() if k != "name"}
    return rest or None


@pytest.mark.parametrize("case", CORPUS, ids=[c.id for c in CORPUS])
def test_best_reading_is_the_pose_the_source_means(case):
    readings = decode(case.text, case.hints)
    top = readings[0]
    # Source of the expected value: case.source (SciPy Rotation built from the source's parameters)
    angle = _angle_between(case.expected, _as_scipy(top))
    assert angle <= case.tolerance, f"{case.id}: best reading {top.label!r} is {np.degrees(angle):.4f} deg off"
    allowed = case.top_kind if isinstance(case.top_kind, tuple) else (case.top_kind,)
    assert top.kind in allowed, f"{case.id}: best reading is a {top.kind}, expected {allowed}"
    if case.translation is None:
        assert top.translation is None, f"{case.id}: the text gives no translation, got {top.translation}"
    else:
        assert top.translation is not None, f"{case.id}: the translation {case.translation} was not kept"
        assert np.allclose(top.translation, case.translation, rtol=0, atol=1e-12), (
            f"{case.id}: translation {top.translation}, the text says {case.translation}")
    assert top.translation_unit == case.translation_unit, (
        f"{case.id}: unit {top.translation_unit!r}, the text says {case.translation_unit!r}")
    if case.name is not None:
        assert top.name == case.name, f"{case.id}: the name hint picked {top.name!r}"


NAMED = [c for c in CORPUS if c.name is not None]


@pytest.mark.parametrize("case", NAMED, ids=[c.id for c in NAMED])
def test_each_named_transform_becomes_a_reading(case):
    # issue 11 item 1: a file holding several named transforms gives one reading per name
    readings = decode(case.text, _without_name(case.hints))
    names = {r.name for r in readings}
    assert case.name in names, f"{case.id}: {case.name!r} is not among the readings' names {sorted(map(str, names))}"
    named = [r for r in readings if r.name == case.name]
    assert any(_angle_between(case.expected, _as_scipy(r)) <= case.tolerance for r in named)


OFFERED = [c for c in CORPUS if c.offered]


@pytest.mark.parametrize("case", OFFERED, ids=[c.id for c in OFFERED])
def test_both_quaternion_orders_are_offered_without_hints(case):
    # issue 11 item 1: a 'rotation' some datasets write w-first (and say so only in their documentation)
    # is offered in both orders; nuScenes schema_nuscenes.md documents w, x, y, z
    readings = decode(case.text)
    for wanted in case.offered:
        assert any(_angle_between(wanted, _as_scipy(r)) <= case.tolerance for r in readings), (
            f"{case.id}: a reading equal to {wanted.as_quat()} (x, y, z, w) is missing")


def test_the_corpus_has_at_least_a_hundred_cases_with_distinct_ids():
    assert len(CORPUS) >= 100
    assert len(BY_ID) == len(CORPUS)


def test_the_corpus_covers_every_format_family_of_issue_11():
    found = {case.family for case in CORPUS}
    assert found == REQUIRED_FAMILIES, f"missing {sorted(REQUIRED_FAMILIES - found)}, unknown {sorted(found - REQUIRED_FAMILIES)}"
    for family in REQUIRED_FAMILIES:
        assert sum(c.family == family for c in CORPUS) >= 5, family


def test_every_case_names_its_source_and_a_plausible_tolerance():
    for case in CORPUS:
        assert case.source.strip(), case.id
        assert 0 < case.tolerance <= 5e-3, case.id
        assert isinstance(case.expected, Rotation) and case.expected.single, case.id
        assert case.translation is None or len(case.translation) == 3, case.id
