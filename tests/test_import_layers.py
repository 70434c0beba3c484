"""Layering of the package, read from the source (every import, lazy ones included).

* no module outside ``pipeins/reports`` and ``pipeins/cli`` imports ``pipeins.reports``: the
  library returns numbers and notes, the report layer writes them;
* ``pipeins.runs`` and ``pipeins.freezing`` do not import each other (no cycle), and each
  imports alone, in either order, in a fresh interpreter.

Project conventions (DEVELOPERS.md, "Layout"); no outside source applies.
"""

from __future__ import annotations

import ast
import subprocess
import sys
from pathlib import Path

import pytest

import pipeins

ROOT = Path(pipeins.__file__).parent


def _module_name(path: Path) -> str:
    parts = path.relative_to(ROOT.parent).with_suffix("").parts
    return ".".join(parts[:-1] if parts[-1] == "__init__" else parts)


def _imports(path: Path) -> set[str]:
    """Every module *path* imports, absolute, at any depth of its code."""
    name = _module_name(path)
    package = name if path.name == "__init__.py" else name.rpartition(".")[0]
    return _imports_in(path.read_text(encoding="utf-8"), package)


def _imports_in(source: str, package: str) -> set[str]:
    out = set()
    for node in ast.walk(ast.parse(source)):
        if isinstance(node, ast.Import):
            out.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                base = package.split(".")
                base = base[: len(base) - (node.level - 1)]
                stem = ".".join(base + ([node.module] if node.module else []))
            else:
                stem = node.module or ""
            out.add(stem)
            out.update(f"{stem}.{a.name}" for a in node.names)  # "from . import reports"
    return out


def _library_modules():
    for path in sorted(ROOT.rglob("*.py")):
        rel = path.relative_to(ROOT).parts
        if rel[0] in ("reports", "cli"):
            continue
        yield path


def test_resolver_sees_relative_lazy_and_package_imports():
    # the checker itself: it must catch each way of writing the import, in a module of pipeins.geometry
    for source, expected in (("def f():\n    from ..reports import render\n", "pipeins.reports"),
                             ("from .. import reports\n", "pipeins.reports"),
                             ("import pipeins.reports.notes\n", "pipeins.reports.notes"),
                             ("from ..reports.notes import render\n", "pipeins.reports.notes")):
        assert expected in _imports_in(source, "pipeins.geometry"), source
    assert "pipeins.reports" not in _imports_in("from .section import Patch\n", "pipeins.geometry")


def test_no_library_module_imports_the_reports():
    offenders = {}
    for path in _library_modules():
        bad = sorted(m for m in _imports(path) if m == "pipeins.reports" or m.startswith("pipeins.reports."))
        if bad:
            offenders[str(path.relative_to(ROOT))] = bad
    assert offenders == {}
    assert len(list(_library_modules())) > 40  # the walk did look at the library


def test_runs_and_freezing_do_not_import_each_other():
    runs, freezing = _imports(ROOT / "runs.py"), _imports(ROOT / "freezing.py")
    assert not any(m == "pipeins.freezing" or m.startswith("pipeins.freezing.") for m in runs)
    assert not any(m == "pipeins.runs" or m.startswith("pipeins.runs.") for m in freezing)


@pytest.mark.parametrize("order", [("pipeins.runs",), ("pipeins.freezing",),
                                   ("pipeins.runs", "pipeins.freezing"), ("pipeins.freezing", "pipeins.runs")])
def test_each_imports_alone_in_a_fresh_interpreter(order):
    code = "; ".join(f"import {m}" for m in order) + "; import pipeins.runs as r, pipeins.freezing as f; " \
                                                    "assert r.TempChange and f.FreezeHold"
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          cwd=str(ROOT.parent), timeout=120)
    assert done.returncode == 0, done.stderr
