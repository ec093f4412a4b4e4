# SPDX-License-Identifier: MIT
"""The tree passes the linter configured in pyproject.toml, and the layers keep their imports.

The layering (kit/services/__init__.py, DEVELOPERS.md): faces (the command line) call services;
services read through the store and the files and run the engine. No library module imports the
terminal libraries (click, rich); the engine reads no database and no files layer.
"""

from __future__ import annotations

import ast
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
FACES = {"cli.py", "commands", "__main__.py"}  # the command line and what only it draws
DATABASE_SIDE = {"fleet_store", "parts_store", "policy_store", "order_sources", "stock_import", "catalogue_import",
                 "database_status"}
FILES_SIDE = {"sheets", "particulars_sheet", "workbook", "bom_export", "atomic", "input_files", "output_targets",
              "xlsx_limits", "toml_text", "file_types", "numbers", "currencies", "dates"}
ENGINE = {"physics", "solas", "checks", "series", "housings", "orings", "compounds", "seal_kit", "oil", "oil_grades",
          "filters", "spares", "requirements", "bom", "preflight", "parts", "rudder", "units", "display_units",
          "report", "tables", "errors", "safe_text", "safety"}
# Known, to be moved to the files layer: spares.load_policy reads the company policy file.
ENGINE_READS_FILES = {"spares": {"kit.input_files", "kit.toml_text"}}


def imported(path: Path) -> set[str]:
    """Every module ``path`` imports, at the top or inside a function."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    names: set[str] = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            names.update(a.name for a in node.names)
        elif isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            names.add(node.module)
    return names


def library_modules() -> list[Path]:
    return [p for p in sorted((ROOT / "kit").rglob("*.py")) if p.relative_to(ROOT / "kit").parts[0] not in FACES]


def test_ruff_finds_nothing():
    ruff = shutil.which("ruff") or str(Path(sys.executable).with_name("ruff"))
    if not Path(ruff).exists():
        pytest.fail("ruff is not installed: pip install -e '.[test]'")
    done = subprocess.run([ruff, "check", "--no-cache", str(ROOT)], capture_output=True, text=True, cwd=ROOT)
    assert done.returncode == 0, done.stdout + done.stderr


def test_no_library_module_imports_the_terminal():
    found = {str(p.relative_to(ROOT)): sorted(m for m in imported(p) if m.split(".")[0] in ("click", "rich"))
             for p in library_modules()}
    assert {k: v for k, v in found.items() if v} == {}
    assert len(found) > 40  # the walk found the library


def test_the_engine_reads_no_database_and_no_files_layer():
    found = {}
    for name in sorted(ENGINE):
        mods = imported(ROOT / "kit" / f"{name}.py")
        mods -= ENGINE_READS_FILES.get(name, set())
        bad = sorted(m for m in mods if m.split(".")[0] in ("sqlalchemy", "catalog_schema", "click", "rich", "openpyxl")
                     or m.startswith("kit.services") or m.split(".")[-1] in DATABASE_SIDE | FILES_SIDE)
        if bad:
            found[name] = bad
    assert found == {}


def test_only_the_store_runs_queries():
    """No module but the store's opens a connection or builds a query; services open the unit of work."""
    store = {f"{n}.py" for n in DATABASE_SIDE}
    found = {}
    for p in library_modules() + sorted((ROOT / "kit" / "commands").glob("*.py")):
        text = p.read_text(encoding="utf-8")
        in_services = p.parent.name == "services"
        hits = [w for w in ("conn.execute", "select(", "engine.begin") if w in text]
        if not in_services:
            hits += [w for w in ("engine.connect", "write_transaction") if w in text]
        if p.name not in store and hits:
            found[str(p.relative_to(ROOT))] = hits
    assert found == {}
