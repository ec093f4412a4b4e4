# SPDX-License-Identifier: MIT
"""The tree passes the linter configured in pyproject.toml, and the layers keep their imports.

The layering (kit/services/__init__.py, DEVELOPERS.md): faces (the command line) call services;
services read through the store and the files and run the engine. No library module imports the
terminal libraries (click, rich); the engine reads no database, files,
store or services; the files read no store or services; the store calls no services.
"""

from __future__ import annotations

import ast
import re
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
FACES = {"cli.py", "commands", "__main__.py", "web"}  # the command line, the pages, and what only they draw
# What each layer must not import: the engine no database, files, store or services; the files no
# store or services; the store no services and no sheet (kit/__init__.py and each package's docstring).
FORBIDDEN = {
    "engine": ("sqlalchemy", "catalog_schema", "openpyxl", "kit.files", "kit.store", "kit.services"),
    "files": ("catalog_schema", "kit.store", "kit.services"),  # output_targets parses a URL with sqlalchemy
    "store": ("kit.services", "openpyxl", "kit.files.sheets"),  # the store reads no sheet
}
# Shared constants that import nothing (catalog_schema/conventions.py): the stock sheet's reader
# fills in the same default location as the table's.
SHARED = {"catalog_schema.conventions"}


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


def in_package(mod: str, prefix: str) -> bool:
    return mod == prefix or mod.startswith(prefix + ".")


@pytest.mark.parametrize("layer", sorted(FORBIDDEN))
def test_each_layer_imports_only_those_below_it(layer):
    modules = sorted((ROOT / "kit" / layer).glob("*.py"))
    assert len(modules) > 5  # the layer is there
    found = {}
    for p in modules:
        bad = sorted(m for m in imported(p) - SHARED if any(in_package(m, f) for f in FORBIDDEN[layer]))
        if bad:
            found[p.stem] = bad
    assert found == {}


# What the pages must not import: they call services (and write files as the commands do), never the
# database or the store, and never the command line's libraries.
WEB_FORBIDDEN = ("sqlalchemy", "catalog_schema", "kit.store", "kit.commands", "click", "rich")


def test_the_pages_call_services_not_the_store():
    modules = sorted((ROOT / "kit" / "web").rglob("*.py"))
    assert len(modules) > 5  # the face is there
    found = {str(p.relative_to(ROOT)): sorted(m for m in imported(p) if any(in_package(m, f) for f in WEB_FORBIDDEN))
             for p in modules}
    assert {k: v for k, v in found.items() if v} == {}


def test_only_the_store_runs_queries():
    """No module but the store's opens a connection or builds a query; services open the unit of work."""
    found = {}
    for p in library_modules() + sorted((ROOT / "kit" / "commands").glob("*.py")) + sorted((ROOT / "kit" / "web").rglob("*.py")):
        text = p.read_text(encoding="utf-8")
        in_services = p.parent.name == "services"
        hits = [w for w in ("conn.execute", "select(", "engine.begin") if w in text]
        if not in_services:
            hits += [w for w in ("engine.connect", "write_transaction") if w in text]
        if p.parent.name != "store" and hits:
            found[str(p.relative_to(ROOT))] = hits
    assert found == {}


# An option name as the command line spells it: two dashes, then a lower-case word (``--out``,
# ``--decimal-mark``).
OPTION_NAME = re.compile(r"(?<![\w-])--[a-z][a-z0-9]*(?:-[a-z0-9]+)*")
# Text kit writes that names an option and is no error message: the marker ``kit demo`` leaves in
# its folder for the person who finds it.
NOT_MESSAGES = {"kit demo made this folder; the next kit demo --out here replaces it.\n"}


def option_names_in_strings(path: Path) -> list[str]:
    """Each string literal of ``path`` (docstrings aside; f-strings' literal parts included) that
    names a command-line option."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    docstrings = {id(node.body[0].value) for node in ast.walk(tree)
                  if isinstance(node, (ast.Module, ast.ClassDef, ast.FunctionDef, ast.AsyncFunctionDef)) and node.body
                  and isinstance(node.body[0], ast.Expr) and isinstance(node.body[0].value, ast.Constant)}
    return [f"line {node.lineno}: {node.value!r}" for node in ast.walk(tree)
            if isinstance(node, ast.Constant) and isinstance(node.value, str) and id(node) not in docstrings
            and node.value not in NOT_MESSAGES and OPTION_NAME.search(node.value)]


def test_option_names_only_in_the_command_line():
    """Library errors name a value neutrally (``demo folder``, ``decimal mark``); the command line
    adds its option (``OPTIONS`` in kit/commands/common.py), so no string outside it spells one."""
    found = {str(p.relative_to(ROOT)): hits for p in library_modules() if (hits := option_names_in_strings(p))}
    assert found == {}
    # the scan sees option names where they belong: the faces spell them
    assert option_names_in_strings(ROOT / "kit" / "commands" / "common.py")
