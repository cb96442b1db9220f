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


@pytest.mark.parametrize("killed, judged", [(90, 100), (81, 263), (1, 29), (1480, 1500), (3, 3)])
def test_wilson_interval_matches_scipy(killed, judged):
    # Reference: SciPy's binomtest(...).proportion_ci(method="wilson"), the same score interval.
    from scipy.stats import binomtest
    ci = binomtest(killed, judged).proportion_ci(confidence_level=0.95, method="wilson")
    low, high = mutation_score.wilson_interval(killed, judged)
    assert (low, high) == pytest.approx((100 * ci.low, 100 * ci.high), abs=0.02)


def test_wilson_interval_edges():
    assert mutation_score.wilson_interval(10, 10)[1] == pytest.approx(100.0)
    assert mutation_score.wilson_interval(0, 10)[0] == pytest.approx(0.0)
    assert mutation_score.wilson_interval(0, 0) == (0.0, 100.0)


def test_sample_draw_is_repeatable_and_filtered():
    sample_script = SCRIPT.with_name("mutation_sample.py")
    spec_ = importlib.util.spec_from_file_location("mutation_sample", sample_script)
    sampler = importlib.util.module_from_spec(spec_)
    spec_.loader.exec_module(sampler)
    names = [f"core.a.x_f__mutmut_{i}" for i in range(100)] + [f"app.b.x_g__mutmut_{i}" for i in range(50)]
    first = sampler.draw(names, ["core.*"], 10, seed=3)
    assert first == sampler.draw(list(reversed(names)), ["core.*"], 10, seed=3)
    assert len(set(first)) == 10 and all(n.startswith("core.a.") for n in first)
    assert first != sampler.draw(names, ["core.*"], 10, seed=4)
    assert len(sampler.draw(names, [], 1000, seed=1)) == 150


def test_only_counts_the_mutants_named_in_its_file(tmp_path, monkeypatch, capsys):
    # an earlier run's results stay in mutants/ when a sample reuses them: --only keeps them out of the score
    fake = [("core.a.x_f__mutmut_1", "killed"), ("core.a.x_f__mutmut_2", "survived"),
            ("core.a.x_f__mutmut_3", "survived")]
    monkeypatch.setattr(mutation_score, "results", lambda: iter(fake))
    names = tmp_path / "sample.txt"
    names.write_text("# seed 1, 2 of 3 mutants\ncore.a.x_f__mutmut_1\ncore.a.x_f__mutmut_2\n")
    mutation_score.main([f"--only={names}"])
    row = next(line for line in capsys.readouterr().out.splitlines() if line.startswith("core.a "))
    assert row.split()[1:3] == ["2", "1"] and "50.0%" in row   # 2 judged, 1 killed: the third is not counted
    mutation_score.main([])
    row = next(line for line in capsys.readouterr().out.splitlines() if line.startswith("core.a "))
    assert row.split()[1:3] == ["3", "1"] and "33.3%" in row
