# SPDX-License-Identifier: MIT
"""Workbooks of a few kilobytes that imply billions of rows or millions of cells: a cell at
XFD1048576, a used range of the whole sheet, a row numbered 999999999, a row of 100,000 empty
cells, a shared-string table declaring 2**31 strings. Each is refused with one line before
openpyxl builds anything, with the memory of the process capped (RLIMIT_AS) and a time-out only
as a guard against a hang: figures belong to ``python -m benchmarks.hostile_workbooks``."""

from __future__ import annotations

import resource
import subprocess
import sys
from pathlib import Path

import pytest
from sqlalchemy import select

from catalog_schema.core_tables import STOCK
from click.testing import CliRunner
from db_support import dump
from kit.cli import main
from test_hostile_sheets import book, fleet  # noqa: F401  (fixture)

from benchmarks.hostile_workbooks import CASES, hostile, sheet_xml

MEMORY_CAP = 1 << 30  # bytes of address space for the refusing process; kit needs about a fifth


def kit_capped(*args: str) -> subprocess.CompletedProcess:
    def cap() -> None:
        resource.setrlimit(resource.RLIMIT_AS, (MEMORY_CAP, MEMORY_CAP))

    return subprocess.run([sys.executable, "-m", "kit", *args], capture_output=True, text=True, timeout=120,
                          preexec_fn=cap)


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_a_hostile_workbook_is_refused_with_bounded_memory(fleet, tmp_path, case):
    url, engine, key = fleet
    path = hostile(tmp_path, case, key)
    before = dump(engine)
    done = kit_capped("stock", "import", str(path), "--vessel", "TEST-ONE", "--db", url)
    where = f"{path}, {case.part}"
    assert (done.returncode, done.stderr, done.stdout) == (2, f"kit: error: {where}{case.refusal}\n", "")
    assert dump(engine) == before


def test_a_normal_import_fits_under_the_same_cap(fleet, tmp_path):
    """The cap above is no refusal by itself: a good workbook imports under it."""
    url, engine, key = fleet
    path = book(tmp_path / "s.xlsx", {"stock": [["part_key", "location", "quantity"], [key, "store", 3]]})
    done = kit_capped("stock", "import", str(path), "--vessel", "TEST-ONE", "--db", url)
    assert (done.returncode, done.stderr) == (0, "")


def test_a_used_range_smaller_than_the_data_hides_no_rows(fleet, tmp_path):
    """openpyxl's read-only reader stops at the declared <dimension>; kit reads every row."""
    url, engine, key = fleet
    rows = [f'<row r="{n}"><c r="A{n}" t="inlineStr"><is><t>{key}</t></is></c>'
            f'<c r="B{n}" t="inlineStr"><is><t>shelf {n}</t></is></c><c r="C{n}"><v>{n}</v></c></row>' for n in range(3, 7)]
    path = hostile(tmp_path, None, key, sheet=sheet_xml(key, "".join(rows), dimension="A1:B2"))
    done = CliRunner().invoke(main, ["stock", "import", str(path), "--vessel", "TEST-ONE", "--db", url])
    assert (done.exit_code, done.stderr) == (0, "")
    with engine.connect() as conn:
        stored = conn.execute(select(STOCK.c.location, STOCK.c.quantity).order_by(STOCK.c.location)).all()
    assert [(loc, float(q)) for loc, q in stored if loc.startswith("shelf")] == [(f"shelf {n}", float(n)) for n in range(3, 7)]
    assert len(stored) == 5  # and the good row the sheet starts with


def test_limits_are_documented():
    """SECURITY.md states each limit kit enforces on workbooks."""
    import kit.files.sheets

    text = (Path(__file__).resolve().parents[1] / "SECURITY.md").read_text()
    for limit in (kit.files.sheets.MAX_COLUMNS, kit.files.sheets.MAX_CELLS, kit.files.sheets.MAX_SHARED_STRINGS, 2 * kit.files.sheets.MAX_ROWS + 100):
        assert f"{limit:,}" in text, limit
