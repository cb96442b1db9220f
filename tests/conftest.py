"""Shared test set-up. GUI tests run on Xvfb (started by pytest-xvfb) with Mesa's software OpenGL, the
baseline every build is tested on; nothing here needs a GPU."""

import os

# Software rendering everywhere, so a machine with a GPU tests what a machine without one runs.
os.environ.setdefault("LIBGL_ALWAYS_SOFTWARE", "1")
os.environ.setdefault("QT_XCB_GL_INTEGRATION", "xcb_glx")
# Tests never read or write the user's real preferences.
os.environ.setdefault("FRAMEWRIGHT_TESTING", "1")

# One hypothesis profile for every property test: a fixed example budget for CI (`ci`, the default) and a
# larger one for `make fuzz` (HYPOTHESIS_PROFILE=fuzz). Tests state no max_examples of their own.
from hypothesis import HealthCheck, settings  # noqa: E402

settings.register_profile("ci", max_examples=100, deadline=None, derandomize=True,
                          suppress_health_check=[HealthCheck.too_slow])
settings.register_profile("fuzz", max_examples=2000, deadline=None,
                          suppress_health_check=[HealthCheck.too_slow])
settings.load_profile(os.environ.get("HYPOTHESIS_PROFILE", "ci"))

import pytest  # noqa: E402


@pytest.fixture(autouse=True)
def _fresh_caches_under_mutation():
    """Under `make mutate` each mutant runs in a process forked after collection: a cache filled then
    would answer with the unmutated code. Emptied before each test there; a no-op otherwise."""
    if os.environ.get("MUTANT_UNDER_TEST"):
        from core import orientation, sequences
        sequences._parse_sequence_text.cache_clear()
        orientation._IDENTITIES.clear()
        from core.kernels import angles
        angles._terms_matrices.cache_clear()
    yield
