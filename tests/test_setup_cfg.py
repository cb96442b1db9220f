"""setup.cfg is read by setuptools with interpolation on every fresh install: a '%' in any value (the
equivalent-mutant notes are free text) makes `pip install -e .` fail on a clean machine, while a venv
installed earlier hides it."""

import configparser
from pathlib import Path


def test_setup_cfg_reads_with_setuptools_interpolation():
    parser = configparser.ConfigParser()          # BasicInterpolation, as setuptools reads it
    parser.read(Path(__file__).resolve().parents[1] / "setup.cfg")
    assert parser.sections()
    for section in parser.sections():
        for option in parser[section]:
            parser.get(section, option)           # raises InterpolationSyntaxError on a stray '%'
