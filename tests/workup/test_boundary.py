"""The core never imports the UI: checked statically (source) and at run time (sys.modules)."""

from __future__ import annotations

import ast
import subprocess
import sys
from pathlib import Path

import pytest

CORE = Path(__file__).resolve().parents[2] / "workup"
FORBIDDEN = ("textual", "screens", "rich")


def _imports(path: Path) -> list[str]:
    tree = ast.parse(path.read_text(encoding="utf-8"))
    names = []
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            names += [a.name for a in node.names]
        elif isinstance(node, ast.ImportFrom) and node.module:
            names.append(node.module)
    return names


@pytest.mark.parametrize("path", sorted(CORE.rglob("*.py")), ids=lambda p: str(p.relative_to(CORE)))
def test_core_module_has_no_ui_import(path: Path) -> None:
    bad = [n for n in _imports(path) if n.split(".")[0] in FORBIDDEN]
    assert bad == [], f"{path} imports {bad}"


def test_importing_every_core_module_loads_no_textual() -> None:
    code = (
        "import importlib, pkgutil, sys, workup\n"
        "for m in pkgutil.walk_packages(workup.__path__, 'workup.'):\n"
        "    importlib.import_module(m.name)\n"
        "bad = [m for m in sys.modules if m.split('.')[0] in ('textual', 'screens')]\n"
        "print(','.join(bad))\n"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == ""
