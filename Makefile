# Set-up and everyday commands. `make run` opens the window; `make test` installs everything and runs
# every test; `make bench` prints timings against the reference library measured in the same run.
PYTHON ?= python3
VENV := .venv
PY := $(VENV)/bin/python
STAMP := $(VENV)/.installed
TEST_STAMP := $(VENV)/.installed-test

.PHONY: run test bench screenshots system-packages clean fuzz mutate

$(PY):
	$(PYTHON) -m venv $(VENV)
	$(PY) -m pip install -q --upgrade pip

$(STAMP): pyproject.toml | $(PY)
	$(PY) -m pip install -q -e .
	touch $@

$(TEST_STAMP): pyproject.toml | $(PY)
	$(PY) -m pip install -q -e '.[test]'
	touch $@ $(STAMP)

system-packages:
	bash scripts/system-packages.sh

run: $(STAMP)
	$(PY) -m app.main

test: system-packages $(TEST_STAMP)
	$(PY) -m pytest

bench: system-packages $(TEST_STAMP)
	$(PY) tests/bench/run_all.py

# The property tests with the larger hypothesis budget (tests/conftest.py's `fuzz` profile).
fuzz: system-packages $(TEST_STAMP)
	HYPOTHESIS_PROFILE=fuzz $(PY) -m pytest tests/core/test_decode_fuzz.py tests/core/test_properties.py -q

# Mutation run (mutmut, settings in setup.cfg; never part of `make test`). MODULE narrows it to some
# files, e.g. `make mutate MODULE="core/check.py core/nearest.py"`; JOBS sets how many run at once.
# SAMPLE=1500 runs a random sample of that many mutants instead (SEED picks it) and prints each score
# with its 95 % interval: the whole run takes 4-9 hours on this machine class (scripts/mutation_sample.py).
# KEEP=1 reuses the mutants already made (only changed files are remade, only new tests recorded).
# Qt offscreen and no Xvfb: each mutant runs in a forked process, and a fork sharing the parent's X
# connection crashes in xcb (reported as a segfault, not a verdict) and leaves its own Xvfb behind.
MODULE ?= core/ app/model.py app/commands.py app/changes.py app/copy_as.py
JOBS ?= 2
SEED ?= 1
MUTANT_PATTERNS = $(foreach m,$(MODULE),$(if $(filter %.py,$(m)),$(subst /,.,$(basename $(m))).*,$(subst /,.,$(patsubst %/,%,$(m))).*))
MUTATE_STAMP := $(VENV)/.installed-mutate
$(MUTATE_STAMP): pyproject.toml $(TEST_STAMP)
	$(PY) -m pip install -q -e '.[test,mutate]'
	touch $@

mutate: system-packages $(MUTATE_STAMP)
ifdef SAMPLE
	QT_QPA_PLATFORM=offscreen $(PY) scripts/mutation_sample.py --size $(SAMPLE) --seed $(SEED) --jobs $(JOBS) $(if $(KEEP),--keep) $(MUTANT_PATTERNS)
else
	rm -rf mutants
	QT_QPA_PLATFORM=offscreen $(VENV)/bin/mutmut run --max-children $(JOBS) $(MUTANT_PATTERNS) > mutants-run.log 2>&1 || true
	$(PY) scripts/mutation_score.py $(MUTANT_PATTERNS)
endif

screenshots: system-packages $(TEST_STAMP)
	$(PY) scripts/screenshots.py

clean:
	rm -rf $(VENV) build *.egg-info .pytest_cache .hypothesis mutants mutants-run.log
