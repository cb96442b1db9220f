"""The layering rules (DESIGN.md, DEVELOPERS.md), checked on the sources and on a fresh interpreter:
core never imports app, Qt or pyqtgraph; the command line never imports the window or Qt; and no two of
our modules import each other, directly or round a longer circle (a lazy import inside a function counts:
it is a circle all the same, only later)."""

from __future__ import annotations

import ast
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
QT_ROOTS = ("PySide6", "PyQt5", "PyQt6", "PySide2", "pyqtgraph", "OpenGL", "shiboken6")


def _module_name(path: Path) -> str:
    parts = path.relative_to(ROOT).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


MODULES = {_module_name(p): p for pkg in ("core", "app") for p in sorted((ROOT / pkg).rglob("*.py"))}


def _imports(name: str) -> set[str]:
    """Every module name this module's source imports, anywhere in it (resolved relative imports)."""
    path = MODULES[name]
    found: set[str] = set()
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.Import):
            found.update(alias.name for alias in node.names)
        elif isinstance(node, ast.ImportFrom):
            base = node.module or ""
            if node.level:
                package = name.split(".") if path.name == "__init__.py" else name.split(".")[:-1]
                package = package[:len(package) - node.level + 1]
                base = ".".join(package + ([base] if base else []))
            submodules = {f"{base}.{alias.name}" for alias in node.names} & MODULES.keys()
            # `from core import kernels` imports the submodule; `from core import Orientation` the package
            found.update(submodules)
            if len(submodules) < len(node.names):
                found.add(base)
    return found


def _ours(names: set[str]) -> set[str]:
    return {n for n in names if n in MODULES}


def test_the_sources_are_found():
    assert {"core.orientation", "core.decode", "app.cli", "app.main", "app.window"} <= MODULES.keys()


@pytest.mark.parametrize("name", sorted(n for n in MODULES if n.split(".")[0] == "core"))
def test_core_sources_import_no_app_and_no_qt(name):
    bad = {i for i in _imports(name) if i.split(".")[0] in ("app",) + QT_ROOTS}
    assert not bad, f"{name} imports {sorted(bad)}"


def test_the_command_line_source_imports_neither_the_window_nor_the_entry_point():
    bad = {i for i in _imports("app.cli") if i in ("app.main", "app.window") or i.startswith("app.scene")
           or i.startswith("app.panels") or i.startswith("app.editors")}
    assert not bad, f"app/cli.py imports {sorted(bad)}"


def _circles(graph: dict[str, set[str]]) -> list[list[str]]:
    """Every import circle a depth-first walk meets, each as a path that comes back to its start."""
    circles: list[list[str]] = []
    state: dict[str, int] = {}               # 1 = on the current path, 2 = finished
    path: list[str] = []

    def visit(node: str) -> None:
        state[node] = 1
        path.append(node)
        for nxt in sorted(graph.get(node, ())):
            if state.get(nxt) == 1:
                circles.append(path[path.index(nxt):] + [nxt])
            elif nxt not in state:
                visit(nxt)
        path.pop()
        state[node] = 2

    for name in sorted(graph):
        if name not in state:
            visit(name)
    return circles


def test_no_module_of_ours_is_on_an_import_circle():
    graph = {name: _ours(_imports(name)) - {name} for name in MODULES}
    # A package's __init__ importing its own submodules is not a circle by itself.
    for name in graph:
        if MODULES[name].name == "__init__.py":
            graph[name] = {d for d in graph[name] if not d.startswith(name + ".")}
    circles = _circles(graph)
    assert not circles, "import circles: " + "; ".join(" -> ".join(c) for c in circles)


def test_the_circle_search_finds_a_made_up_circle_and_passes_a_chain():
    assert _circles({"a": {"b"}, "b": {"c"}, "c": {"a"}}) == [["a", "b", "c", "a"]]
    assert _circles({"a": {"b"}, "b": {"c"}, "c": set()}) == []


def _fresh_interpreter(code: str) -> str:
    result = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT,
                            check=True, timeout=120)
    return result.stdout.strip()


def test_importing_every_core_module_loads_no_qt_and_no_app():
    core = sorted(n for n in MODULES if n.split(".")[0] == "core")
    loaded = _fresh_interpreter(
        "import sys, importlib\n"
        f"for name in {core!r}: importlib.import_module(name)\n"
        f"print(','.join(sorted(m for m in sys.modules if m.split('.')[0] in {('app',) + QT_ROOTS!r})))\n")
    assert loaded == "", f"core loaded {loaded}"


def test_the_command_line_verbs_load_no_qt():
    # decode, compare, fit and batch run in full in a fresh interpreter; none may load Qt (report, which
    # lays out pages, and open, which starts the window, are the two verbs that do, after reading input).
    loaded = _fresh_interpreter(
        "import io, sys\n"
        "from app import cli\n"
        "for argv in (['decode', '0 0 1 90'], ['compare', '10 20 30', '10 20 31', '--tolerance', '2']):\n"
        "    cli.main(argv, stdin=io.StringIO(''), stdout=io.StringIO(), stderr=io.StringIO())\n"
        f"print(','.join(sorted(m for m in sys.modules if m.split('.')[0] in {QT_ROOTS!r})))\n")
    assert loaded == "", f"the command line loaded {loaded}"
