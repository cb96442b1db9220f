"""A mutation run on a random sample of the mutants, for when the whole run (about 24,000 mutants, 4-9 hours
on two shared cores) does not fit the time there is. `make mutate SAMPLE=1500 SEED=1` runs it.

Mutant sampling estimates the score of the whole run: each mutant is drawn with the same chance, so the share
killed in the sample estimates the share killed in all, and scripts/mutation_score.py prints its 95 % Wilson
interval beside each score. The seed makes a sample repeatable; a new seed gives an independent one, which is
how to check a score after adding tests for the survivors of an earlier sample (those survivors are no longer
a fair draw).

    python scripts/mutation_sample.py --size 1500 --seed 1 --jobs 1 'core.*' 'app.model.*'
"""

import argparse
import fnmatch
import random
import shutil
import subprocess
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
MUTMUT = str(ROOT / ".venv" / "bin" / "mutmut")
# No mutant has this name: `mutmut run` with it makes every mutant and records which tests reach which
# function, then stops without running a mutant ("nothing matches"), which is the listing step we need.
NO_MUTANT = "no-mutant-has-this-name"


def draw(names, patterns, size, seed):
    """`size` names drawn without replacement from those matching a pattern, sorted; all of them if fewer."""
    pool = sorted(n for n in names if not patterns or any(fnmatch.fnmatch(n, p) for p in patterns))
    if size >= len(pool):
        return pool
    return sorted(random.Random(seed).sample(pool, size))


def all_mutant_names():
    out = subprocess.run([MUTMUT, "results", "--all", "true"], cwd=ROOT, capture_output=True, text=True,
                         check=False).stdout
    return [line.strip().rpartition(": ")[0] for line in out.splitlines() if ": " in line]


def main(argv):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--size", type=int, required=True)
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--jobs", type=int, default=2)
    parser.add_argument("--log", default="mutants-run.log")
    parser.add_argument("--keep", action="store_true",
                        help="keep the mutants already made (mutmut then remakes only changed source files and "
                             "records only new tests), instead of starting afresh")
    parser.add_argument("patterns", nargs="*")
    args = parser.parse_args(argv)
    if args.size < 1:
        parser.error("--size must be at least 1")
    if not args.keep:
        shutil.rmtree(ROOT / "mutants", ignore_errors=True)
    with open(ROOT / args.log, "w") as log:
        subprocess.run([MUTMUT, "run", "--max-children", str(args.jobs), NO_MUTANT], cwd=ROOT, stdout=log,
                       stderr=subprocess.STDOUT, check=False)
        names = all_mutant_names()
        if not names:
            print(f"no mutants were made; see {args.log}")
            return 1
        sample = draw(names, args.patterns, args.size, args.seed)
        (ROOT / "mutants" / "sample.txt").write_text(
            f"# seed {args.seed}, {len(sample)} of {len(names)} mutants\n" + "\n".join(sample) + "\n")
        print(f"running {len(sample)} of {len(names)} mutants (seed {args.seed}); progress in {args.log}",
              flush=True)
        log.flush()
        subprocess.run([MUTMUT, "run", "--max-children", str(args.jobs), *sample], cwd=ROOT, stdout=log,
                       stderr=subprocess.STDOUT, check=False)
    population = len([n for n in names if not args.patterns or any(fnmatch.fnmatch(n, p) for p in args.patterns)])
    return subprocess.run([sys.executable, str(ROOT / "scripts" / "mutation_score.py"),
                           f"--population={population}", f"--only={ROOT / 'mutants' / 'sample.txt'}",
                           *args.patterns], cwd=ROOT, check=False).returncode


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
