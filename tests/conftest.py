"""Shared test set-up. GUI tests run on Xvfb (started by pytest-xvfb) with Mesa's software OpenGL, the
baseline every build is tested on; nothing here needs a GPU."""

import os

# Software rendering everywhere, so a machine with a GPU tests what a machine without one runs.
os.environ.setdefault("LIBGL_ALWAYS_SOFTWARE", "1")
os.environ.setdefault("QT_XCB_GL_INTEGRATION", "xcb_glx")
# Tests never read or write the user's real preferences.
os.environ.setdefault("FRAMEWRIGHT_TESTING", "1")
