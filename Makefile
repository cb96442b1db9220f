# Set-up and everyday commands. `make run` opens the window; `make test` installs everything and runs
# every test; `make bench` prints timings against the reference library measured in the same run.
PYTHON ?= python3
VENV := .venv
PY := $(VENV)/bin/python
STAMP := $(VENV)/.installed
TEST_STAMP := $(VENV)/.installed-test

.PHONY: run test bench screenshots system-packages clean

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

screenshots: system-packages $(TEST_STAMP)
	$(PY) scripts/screenshots.py

clean:
	rm -rf $(VENV) build *.egg-info .pytest_cache .hypothesis
