"""scripts/mutation_score.py: how a mutmut result counts (by hand: killed / (killed + survived), an
equivalent mutant left out, a crashed one shown apart and counted as survived in the second score)."""

import importlib.util
from pathlib import Path

import pytest

SCRIPT = Path(__file__).resolve().parents[1] / "scripts" / "mutation_score.py"
spec = importlib.util.spec_from_file_location("mutation_score", SCRIPT)
mutation_score = importlib.util.module_from_spec(spec)
spec.loader.exec_module(mutation_score)

RESULTS = [
    ("core.a.x_f__mutmut_1", "killed"), ("core.a.x_f__mutmut_2", "timeout"), ("core.a.x_f__mutmut_3", "survived"),
    ("core.a.x_f__mutmut_4", "segfault"), ("core.a.x_f__mutmut_5", "survived"), ("core.a.x_f__mutmut_6", "no tests"),
    ("core.a.x_f__mutmut_7", "not checked"), ("app.b.x_g__mutmut_1", "killed"),
]


def test_each_status_counts_where_it_belongs():
    by = mutation_score.tally(RESULTS, {"core.a.x_f__mutmut_5": "a reason"})
    a = {k: [n for n, _ in v] for k, v in by["core.a"].items()}
    assert a == {"killed": ["core.a.x_f__mutmut_1", "core.a.x_f__mutmut_2"],
                 "survived": ["core.a.x_f__mutmut_3", "core.a.x_f__mutmut_6"],
                 "crashed": ["core.a.x_f__mutmut_4"], "equivalent": ["core.a.x_f__mutmut_5"]}
    counts = {k: len(by["core.a"][k]) for k in mutation_score.KINDS}
    assert mutation_score.scores(counts) == pytest.approx((50.0, 100 * 2 / 5))       # 2/4 and 2/5


def test_patterns_pick_modules_and_nothing_judged_scores_100():
    by = mutation_score.tally(RESULTS, {}, ["app.*"])
    assert list(by) == ["app.b"]
    assert mutation_score.scores({"killed": 0, "survived": 0, "crashed": 0, "equivalent": 3}) == (100.0, 100.0)
