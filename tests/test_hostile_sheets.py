# SPDX-License-Identifier: MIT
"""Spreadsheets from outside, at their worst: not a workbook, the wrong sheet or columns, text
where a quantity belongs, negative stock, XML entity tricks (defusedxml refuses them), and a
sheet far past the row limit, refused while it is streamed. One line, exit 2, nothing written."""

from __future__ import annotations

import tracemalloc
import zipfile
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner
from sqlalchemy import select

import kit.files.sheets
from catalog_schema.engine import make_engine
from db_support import TOML_CYLINDER, dump
from kit.cli import main
from kit.store.parts_store import PARTS

HEADER = "part_key,location,quantity\n"


@pytest.fixture
def fleet(tmp_path):
    url = f"sqlite:///{tmp_path / 'fleet.sqlite'}"
    toml = tmp_path / "v.toml"
    toml.write_text(TOML_CYLINDER)
    for args in (["load", str(toml)], ["parts", "register"]):
        assert CliRunner().invoke(main, [*args, "--db", url]).exit_code == 0
    engine = make_engine(url)
    with engine.connect() as conn:
        key = conn.execute(select(PARTS.c.key).order_by(PARTS.c.key)).scalars().first()
    yield url, engine, key
    engine.dispose()


def stock_import(url: str, path: Path):
    return CliRunner().invoke(main, ["stock", "import", str(path), "--vessel", "TEST-ONE", "--db", url])


def book(path: Path, sheets: dict[str, list[list]]) -> Path:
    wb = openpyxl.Workbook()
    wb.remove(wb.active)
    for name, rows in sheets.items():
        ws = wb.create_sheet(name)
        for row in rows:
            ws.append(row)
    wb.save(path)
    return path


def refused(fleet, path: Path, line: str) -> None:
    url, engine, _ = fleet
    before = dump(engine)
    done = stock_import(url, path)
    assert (done.exit_code, done.stderr, done.stdout) == (2, f"kit: error: {line}\n", "")
    assert dump(engine) == before


def test_not_a_workbook(fleet, tmp_path):
    path = tmp_path / "stock.xlsx"
    path.write_bytes(b"PK\x03\x04 this is no zip at all")
    refused(fleet, path, f"{path}: file: expected an .xlsx workbook (Office Open XML spreadsheet) (got a file that is not one)")


def test_wrong_sheet(fleet, tmp_path):
    path = book(tmp_path / "s.xlsx", {"count": [["part_key", "quantity"]], "notes": [["x"]]})
    refused(fleet, path, f"{path}: sheet: expected a sheet named 'stock' (got sheets 'count', 'notes')")


def test_wrong_columns(fleet, tmp_path):
    path = book(tmp_path / "s.xlsx", {"stock": [["part_key", "qty"], ["x", 1]]})
    # issue 14: the count sheet's columns are known too
    refused(fleet, path, f"{path}, sheet stock: column qty: expected one of part_key, designation, location, quantity, "
                         "counted_on, uom, needed, on_board, as_of, counted, vessel (got an unknown column)")


def test_text_where_a_quantity_belongs(fleet, tmp_path):
    path = book(tmp_path / "s.xlsx", {"stock": [["part_key", "quantity"], [fleet[2], "five"]]})
    refused(fleet, path, f"{path}, sheet stock, row 2: column quantity: expected a plain number with a decimal point, e.g. 12.50, "
                         "and no grouping separators (decimal point: the default for text in a workbook's cells; "
                         "--decimal-mark comma reads 12,50) (got 'five')")


def test_negative_stock(fleet, tmp_path):
    path = tmp_path / "s.csv"
    path.write_text(HEADER + f"{fleet[2]},store,-3\n")
    refused(fleet, path, f"{path}, line 2: column quantity: expected a number from 0 to 1,000,000,000 (got -3.0)")


BOMB = ('<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;&lol;&lol;">'
        '<!ENTITY lol3 "&lol2;&lol2;&lol2;&lol2;&lol2;&lol2;&lol2;">]>')
EXTERNAL = '<?xml version="1.0"?><!DOCTYPE x [<!ENTITY secret SYSTEM "file:///etc/passwd">]>'


def doctored(tmp_path: Path, part: str, prolog: str) -> Path:
    """A good stock workbook whose ``part`` gets an entity-declaring prolog."""
    good = book(tmp_path / "good.xlsx", {"stock": [["part_key", "quantity"], ["x", 1]]})
    evil = tmp_path / "evil.xlsx"
    with zipfile.ZipFile(good) as src, zipfile.ZipFile(evil, "w") as dst:
        for info in src.infolist():
            data = src.read(info.filename)
            if info.filename == part:
                body = data.decode()
                body = body[body.index("?>") + 2:] if body.startswith("<?xml") else body
                data = (prolog + body).encode()
            dst.writestr(info, data)
    return evil


@pytest.mark.parametrize("part", ["xl/worksheets/sheet1.xml", "xl/workbook.xml", "[Content_Types].xml"])
@pytest.mark.parametrize(("prolog", "refusal"), [(BOMB, "EntitiesForbidden"), (EXTERNAL, "EntitiesForbidden")], ids=["bomb", "external"])
def test_entity_tricks_are_refused_by_defusedxml(fleet, tmp_path, part, prolog, refusal):
    path = doctored(tmp_path, part, prolog)
    refused(fleet, path, f"{path}: file: expected a workbook without XML entity declarations (got {refusal})")


def test_row_limit_is_documented():
    """SECURITY.md and the README state the limit kit enforces."""
    root = Path(__file__).resolve().parents[1]
    limit = f"{kit.files.sheets.MAX_ROWS:,}"
    assert limit in (root / "SECURITY.md").read_text() and limit in (root / "README.md").read_text()


def huge_sheet(path: Path, key: str, rows: int) -> Path:
    if path.suffix == ".csv":
        path.write_text(HEADER + "".join(f"{key},place {i} {'x' * 200},1\n" for i in range(rows)))
        return path
    wb = openpyxl.Workbook(write_only=True)  # writes no dimension record: openpyxl's reader would pass over it all
    ws = wb.create_sheet("stock")
    ws.append(["part_key", "location", "quantity", "counted_on"])
    for i in range(rows):
        ws.append([key, "store", i, "2024-01-01"])
    wb.save(path)
    return path


def peak_memory(fleet, path: Path):
    url, engine, _ = fleet
    before = dump(engine)
    tracemalloc.start()
    try:
        done = stock_import(url, path)
        peak = tracemalloc.get_traced_memory()[1]
    finally:
        tracemalloc.stop()
    assert dump(engine) == before
    return done, peak


@pytest.mark.parametrize("suffix", [".csv", ".xlsx"])
def test_a_huge_sheet_is_refused_while_streamed(fleet, tmp_path, monkeypatch, suffix):
    """Sheets 20 and 80 times the limit: refused in one line, and the larger costs no more memory."""
    monkeypatch.setattr(kit.files.sheets, "MAX_ROWS", 500)
    results = [peak_memory(fleet, huge_sheet(tmp_path / f"huge{rows}{suffix}", fleet[2], rows)) for rows in (10_000, 40_000)]
    for (done, _), rows in zip(results, (10_000, 40_000)):
        path = tmp_path / f"huge{rows}{suffix}"
        line = (f"{path}: rows: expected at most 500 data rows (got more)" if suffix == ".csv" else
                f"{path}, xl/worksheets/sheet1.xml: rows: expected at most 500 data rows (and a few blank ones) (got more than 1,100 rows)")
        assert (done.exit_code, done.stderr) == (2, f"kit: error: {line}\n")
    (_, small), (_, large) = results
    assert large < small * 1.3, f"peak {large} bytes for 4 times the rows of a sheet that took {small}"


def test_just_past_the_limit_names_the_sheet(fleet, tmp_path, monkeypatch):
    monkeypatch.setattr(kit.files.sheets, "MAX_ROWS", 500)
    path = huge_sheet(tmp_path / "s.xlsx", fleet[2], 501)
    refused(fleet, path, f"{path}, sheet stock: rows: expected at most 500 data rows (got more)")


def test_too_much_cell_text_is_refused_before_reading(fleet, tmp_path, monkeypatch):
    """The shared-string table is held whole by openpyxl, so its size is checked first."""
    monkeypatch.setattr(kit.files.sheets, "MAX_SHARED_STRINGS_BYTES", 1 << 20)
    good = book(tmp_path / "good.xlsx", {"stock": [["part_key", "quantity"], [fleet[2], 1]]})
    path = tmp_path / "s.xlsx"
    with zipfile.ZipFile(good) as src, zipfile.ZipFile(path, "w", zipfile.ZIP_DEFLATED) as dst:
        for info in src.infolist():
            dst.writestr(info, src.read(info.filename))
        items = "".join(f"<si><t>place {i} {'x' * 100}</t></si>" for i in range(12_000))
        dst.writestr("xl/sharedStrings.xml", f'<sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">{items}</sst>')
    with zipfile.ZipFile(path) as z:
        mib = z.getinfo("xl/sharedStrings.xml").file_size / 2**20
    refused(fleet, path, f"{path}: file: expected cell text (shared strings) of at most 1 MiB unpacked (got {mib:.1f} MiB)")
