"""scripts/apply_mutant.py: a mutant's diff as `mutmut show` prints it (a method without its class's
indentation) is read and put into the source at the right indentation, and refused when its lines are
not found exactly once. The diff and the source are our own small examples, worked by hand."""

import importlib.util
from pathlib import Path

SCRIPT = Path(__file__).resolve().parents[1] / "scripts" / "apply_mutant.py"
spec = importlib.util.spec_from_file_location("apply_mutant", SCRIPT)
apply_mutant = importlib.util.module_from_spec(spec)
spec.loader.exec_module(apply_mutant)

SHOWN = """# core.a.xǁPartǁsize__mutmut_3: survived
--- core/a.py
+++ core/a.py
@@ -1,4 +1,4 @@
 def size(self):

-    return self.n > 1
+    return self.n >= 1
"""

SOURCE = """class Part:
    def size(self):

        return self.n > 1


def size(other):
    return other
"""


def test_a_method_diff_is_read_and_put_in_at_the_class_indentation():
    path, hunks = apply_mutant.parse(SHOWN)
    assert path == "core/a.py"
    assert hunks == [(["def size(self):", "", "    return self.n > 1"], ["def size(self):", "", "    return self.n >= 1"])]
    changed = apply_mutant.apply(SOURCE, hunks)
    assert changed == SOURCE.replace("self.n > 1", "self.n >= 1")


def test_lines_not_found_exactly_once_write_nothing():
    _, hunks = apply_mutant.parse(SHOWN)
    assert apply_mutant.apply(SOURCE.replace("self.n > 1", "self.n > 2"), hunks) is None
    twice = SOURCE + "\n\nclass Other:\n    def size(self):\n\n        return self.n > 1\n"
    assert apply_mutant.apply(twice, hunks) is None
