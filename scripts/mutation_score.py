"""Print the mutation score of the last `make mutate` run, per module, and the mutants that survived.

Reads mutmut's results and the equivalent mutants listed in setup.cfg ([mutmut-equivalent]: a mutant's
name, then why no test can tell it from the original). Score = killed / (checked − equivalent − crashed); a mutant
that timed out counts as killed (the change made the code hang), one with no test as survived; one
whose test process crashed is shown apart (see tally).

    python scripts/mutation_score.py 'core.check.*' 'core.nearest.*'

`--only=FILE` counts only the mutants named in FILE (one a line), such as a sample's mutants/sample.txt when
earlier runs' results are still kept. After a sampled run (scripts/mutation_sample.py) `--population=N` names how many mutants the sample was drawn
from; each score then carries its 95 % Wilson interval, the range the whole run's score lies in.
"""

import configparser
import fnmatch
import math
import subprocess
import sys
from collections import defaultdict
from pathlib import Path

KILLED = {"killed", "timeout"}
CRASHED = {"segfault"}
ROOT = Path(__file__).resolve().parents[1]


def results():
    out = subprocess.run([str(ROOT / ".venv" / "bin" / "mutmut"), "results", "--all", "true"], cwd=ROOT,
                         capture_output=True, text=True, check=False).stdout
    for line in out.splitlines():
        name, _, status = line.strip().rpartition(": ")
        if name:
            yield name, status


def module_of(name):
    """'core.check.x_check__mutmut_3' -> 'core.check'."""
    parts = name.split(".")
    return ".".join(parts[:-1])


def tally(results_, equivalent, patterns=()):
    """module -> kind -> [(name, status)], kind one of killed, equivalent, crashed, survived. A mutant whose
    test process crashed ('segfault') has no verdict: forked workers also crash at the end of a session
    with no mutant active (Qt objects collected after the fork), so it is neither killed nor survived."""
    by_module = defaultdict(lambda: defaultdict(list))
    for name, status in results_:
        if patterns and not any(fnmatch.fnmatch(name, p) for p in patterns):
            continue
        if status == "not checked":
            continue
        kind = "equivalent" if name in equivalent else "killed" if status in KILLED else \
            "crashed" if status in CRASHED else "survived"
        by_module[module_of(name)][kind].append((name, status))
    return by_module


def scores(counts):
    """(score leaving crashed mutants out, score counting them as survived), in percent."""
    judged = counts["killed"] + counts["survived"]
    best = 100.0 * counts["killed"] / judged if judged else 100.0
    worst_judged = judged + counts["crashed"]
    return best, 100.0 * counts["killed"] / worst_judged if worst_judged else 100.0


def wilson_interval(killed, judged, z=1.96):
    """95 % Wilson score interval of a share killed/judged, in percent (Wilson 1927; the usual choice for a
    proportion from a small sample, since it stays inside 0-100 % where the normal approximation does not)."""
    if judged == 0:
        return 0.0, 100.0
    p = killed / judged
    centre = (p + z * z / (2 * judged)) / (1 + z * z / judged)
    half = z * math.sqrt(p * (1 - p) / judged + z * z / (4 * judged * judged)) / (1 + z * z / judged)
    return 100.0 * max(0.0, centre - half), 100.0 * min(1.0, centre + half)


def group_of(module):
    """'core.decode.poses' -> 'core', 'app.model' -> 'app': the goals are set per group."""
    return module.split(".")[0]


KINDS = ("killed", "equivalent", "crashed", "survived")


def main(argv):
    population = None
    patterns = []
    only = None
    for arg in argv:
        if arg.startswith("--population="):
            population = int(arg.split("=", 1)[1])
        elif arg.startswith("--only="):   # a file of names, one a line ('#' comments): count these alone
            lines = Path(arg.split("=", 1)[1]).read_text().splitlines()
            only = {line.strip() for line in lines if line.strip() and not line.startswith("#")}
        else:
            patterns.append(arg)
    config = configparser.ConfigParser(interpolation=None)
    config.optionxform = str
    config.read(ROOT / "setup.cfg")
    equivalent = dict(config["mutmut-equivalent"]) if config.has_section("mutmut-equivalent") else {}
    by_module = tally(((n, s) for n, s in results() if only is None or n in only), equivalent, patterns)
    if not by_module:
        print("no checked mutants; see mutants-run.log")
        return 1
    print("score = killed / (killed + survived); crashed mutants (no verdict) are left out of it, and the last "
          "column counts them as survived")
    if population is not None:
        checked = sum(len(v) for m in by_module.values() for v in m.values())
        print(f"a sample: {checked} of {population} mutants checked; '95% interval' is where the whole run's "
              "score lies (Wilson)")
    print(f"{'module':<28}{'mutants':>9}{'killed':>8}{'equiv.':>8}{'crashed':>9}{'survived':>10}{'score':>9}"
          f"{'crashed as survived':>21}" + (f"{'95% interval':>16}" if population is not None else ""))
    per_module = {m: {k: len(by_module[m][k]) for k in KINDS} for m in sorted(by_module)}
    groups = defaultdict(lambda: defaultdict(int))
    for module, counts in per_module.items():
        for k, v in counts.items():
            groups[group_of(module) + "/ (all)"][k] += v
            groups["all"][k] += v
    for module, counts in [*per_module.items(), *sorted(groups.items(), key=lambda g: g[0] == "all")]:
        best, worst = scores(counts)
        row = (f"{module:<28}{sum(counts[k] for k in KINDS):>9}{counts['killed']:>8}{counts['equivalent']:>8}"
               f"{counts['crashed']:>9}{counts['survived']:>10}{best:>8.1f}%{worst:>20.1f}%")
        if population is not None:
            low, high = wilson_interval(counts["killed"], counts["killed"] + counts["survived"])
            row += f"{low:>8.1f}-{high:.1f}%"
        print(row)
    for kind, title in (("survived", "surviving mutants"), ("crashed", "mutants whose test run crashed")):
        names = [(n, s) for m in sorted(by_module) for n, s in by_module[m][kind]]
        if names:
            print(f"\n{title} (`.venv/bin/mutmut show NAME` shows the change):")
            for name, status in names:
                print(f"  {name}  [{status}]")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
