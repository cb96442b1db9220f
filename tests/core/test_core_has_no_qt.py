"""core/ is numpy only: importing every core module must not import Qt (DESIGN.md)."""

import subprocess
import sys
from pathlib import Path

CORE = Path(__file__).resolve().parents[2] / "core"


def test_importing_core_imports_no_qt():
    modules = sorted(p.stem for p in CORE.glob("*.py") if p.stem != "__init__")
    script = (
        "import sys, importlib\n"
        f"for name in {modules!r}: importlib.import_module('core.' + name)\n"
        "qt = sorted(m for m in sys.modules if m.split('.')[0] in "
        "('PySide6', 'PyQt5', 'PyQt6', 'PySide2', 'pyqtgraph', 'OpenGL'))\n"
        "print(','.join(qt))\n"
    )
    result = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True,
                            cwd=CORE.parent, check=True)
    assert result.stdout.strip() == "", f"core imported {result.stdout.strip()}"
    assert len(modules) >= 5
