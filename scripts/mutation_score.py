"""Print the mutation score of the last `make mutate` run, per module, and the mutants that survived.

Reads mutmut's results and the equivalent mutants listed in setup.cfg ([mutmut-equivalent]: a mutant's
name, then why no test can tell it from the original). Score = killed / (checked − equivalent); a mutant
that timed out counts as killed (the change made the code hang), one with no test as survived.

    python scripts/mutation_score.py 'core.check.*' 'core.nearest.*'
"""

import configparser
import fnmatch
import subprocess
import sys
from collections import defaultdict
from pathlib import Path

KILLED = {"killed", "timeout"}
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


def main(patterns):
    config = configparser.ConfigParser(interpolation=None)
    config.optionxform = str
    config.read(ROOT / "setup.cfg")
    equivalent = dict(config["mutmut-equivalent"]) if config.has_section("mutmut-equivalent") else {}
    by_module = defaultdict(lambda: defaultdict(list))
    for name, status in results():
        if patterns and not any(fnmatch.fnmatch(name, p) for p in patterns):
            continue
        if status == "not checked":
            continue
        kind = "equivalent" if name in equivalent else "killed" if status in KILLED else "survived"
        by_module[module_of(name)][kind].append((name, status))
    if not by_module:
        print("no checked mutants; see mutants-run.log")
        return 1
    print(f"{'module':<24}{'mutants':>9}{'killed':>8}{'equiv.':>8}{'survived':>10}{'score':>9}")
    totals = defaultdict(int)
    for module in sorted(by_module):
        counts = {k: len(by_module[module][k]) for k in ("killed", "equivalent", "survived")}
        judged = counts["killed"] + counts["survived"]
        score = 100.0 * counts["killed"] / judged if judged else 100.0
        print(f"{module:<24}{sum(counts.values()):>9}{counts['killed']:>8}{counts['equivalent']:>8}"
              f"{counts['survived']:>10}{score:>8.1f}%")
        for k, v in counts.items():
            totals[k] += v
    judged = totals["killed"] + totals["survived"]
    print(f"{'all':<24}{sum(totals.values()):>9}{totals['killed']:>8}{totals['equivalent']:>8}"
          f"{totals['survived']:>10}{100.0 * totals['killed'] / max(judged, 1):>8.1f}%")
    survivors = [(n, s) for m in sorted(by_module) for n, s in by_module[m]["survived"]]
    if survivors:
        print("\nsurviving mutants (`.venv/bin/mutmut show NAME` shows the change):")
        for name, status in survivors:
            print(f"  {name}  [{status}]")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
