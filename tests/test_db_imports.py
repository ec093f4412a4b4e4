# SPDX-License-Identifier: MIT
"""Catalogue and stock imports: matching, all-or-nothing refusal, safe spreadsheet reading."""

from __future__ import annotations

import csv
import zipfile
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner
from sqlalchemy import select

from catalog_schema.engine import write_transaction
from db_support import TOML_CYLINDER, db_url, dump, engine  # noqa: F401  (fixtures)
from kit.files.catalogue_sheet import COLUMNS
from kit.store.catalogue_import import ENTRIES
from kit.services.imports import import_catalogue, import_stock
from kit.cli import main
from kit.errors import InputError
from kit.store.fleet_store import save_vessels
from kit.engine.parts import LineItem, part_key
from kit.store.parts_store import register_parts
from kit.files.particulars_file import load_vessel
from kit.files.sheets import read_table
from kit.store.stock_import import STOCK

ROD_SEAL = part_key("rod_seal", {"d": 279.4, "D": 304.8, "L": 25.0}, "AU")
O_RING = part_key("o_ring", {"id": 236.0, "cs": 5.3}, "NBR")
OIL = part_key("oil", {}, "HM 46")


def item(key: str, kind: str) -> LineItem:
    return LineItem("SG1", kind, "", key, "", 1, "pcs", "test", key)


def write_csv(path: Path, header: list[str], rows: list[list]) -> Path:
    with path.open("w", newline="") as f:
        out = csv.writer(f)
        out.writerow(header)
        out.writerows(rows)
    return path


@pytest.fixture
def fleet(engine, tmp_path):
    """One vessel and three generic parts in the database."""
    toml = tmp_path / "v.toml"
    toml.write_text(TOML_CYLINDER)

    def setup(conn):
        save_vessels(conn, [load_vessel(toml)])
        toml.write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-TWO"))
        save_vessels(conn, [load_vessel(toml)])
        register_parts(conn, [item(ROD_SEAL, "rod_seal"), item(O_RING, "o_ring"), item(OIL, "oil")])

    write_transaction(engine, setup)
    return engine


CATALOGUE_HEADER = ["supplier_ref", "part_kind", "d", "D", "L", "id", "cs", "spec", "pack_qty", "price", "currency", "lead_time_days"]


def test_catalogue_rows_match_parts_by_their_dimensions(fleet, tmp_path):
    # 1 in = 25.4 mm exactly (international inch, 1959), so 11 in x 12 in x 25 mm is 279.4 x 304.8 x 25.
    path = write_csv(tmp_path / "cat.csv", CATALOGUE_HEADER + ["pack"], [
        ["RS-11", "rod_seal", "11 in", "12 in", "25 mm", "", "", "AU", 1, "182.50", "EUR", 21, ""],
        ["OR-236", "o_ring", "", "", "", "236 mm", "5.3 mm", "NBR", 10, 9.9, "eur", 3, ""],
        ["OIL-20", "oil", "", "", "", "", "", "HM 46", "", 95, "EUR", "", "20 L"],
        ["RS-99", "rod_seal", "99 mm", "120 mm", "20 mm", "", "", "AU", 1, 50, "EUR", 7, ""],
    ])
    report = import_catalogue(fleet, path, "Test Seals")
    assert (report.rows, report.matched) == (4, 3)
    assert report.unmatched == [(f"{path}, line 5", "RS-99", "rod_seal:d=99:D=120:L=20:au")]
    with fleet.connect() as conn:
        rows = {r.supplier_ref: r for r in conn.execute(select(ENTRIES))}
    assert rows["RS-11"].part_key == ROD_SEAL and rows["RS-11"].price == 182.5 and rows["RS-11"].lead_time_days == 21
    assert rows["OR-236"].currency == "EUR" and rows["OR-236"].pack_qty == 10
    assert (rows["OIL-20"].pack_content, rows["OIL-20"].pack_label) == (20.0, "20 L")
    assert rows["OR-236"].pack_content is None  # counted by pack_qty
    assert rows["RS-99"].part_id is None


def test_a_part_registered_after_the_catalogue_finds_its_entries(fleet, tmp_path):
    # A catalogue is often imported before a new vessel's parts are registered: the entry that
    # matched nothing then must be matched by the registration, not only by a second import.
    later = part_key("rod_seal", {"d": 99.0, "D": 120.0, "L": 20.0}, "AU")
    path = write_csv(tmp_path / "cat.csv", CATALOGUE_HEADER, [
        ["RS-99", "rod_seal", "99 mm", "120 mm", "20 mm", "", "", "AU", 1, 50, "EUR", 7],
        ["RS-11", "rod_seal", "11 in", "12 in", "25 mm", "", "", "AU", 1, "182.50", "EUR", 21],
    ])
    import_catalogue(fleet, path, "Test Seals")
    import_catalogue(fleet, path, "Other Seals")
    registered = write_transaction(fleet, lambda conn: register_parts(conn, [item(later, "rod_seal"), item(OIL, "oil")]))
    assert (registered.parts, registered.entries_matched) == (2, 2)  # RS-99 of both suppliers; OIL has no entry
    from kit.store.order_sources import catalogue_offers

    with fleet.connect() as conn:
        offers = catalogue_offers(conn, [later, ROD_SEAL])
        unmatched = conn.execute(select(ENTRIES.c.supplier_ref).where(ENTRIES.c.part_id.is_(None))).all()
    assert {k: [(o.supplier, o.part_number) for o in found] for k, found in offers.items()} == {
        later: [("Other Seals", "RS-99"), ("Test Seals", "RS-99")], ROD_SEAL: [("Other Seals", "RS-11"), ("Test Seals", "RS-11")]}
    assert unmatched == []


def test_offers_for_more_parts_than_one_statement_takes(fleet, tmp_path):
    from catalog_schema.sql import VALUES_PER_STATEMENT
    from kit.store.order_sources import catalogue_offers

    n = VALUES_PER_STATEMENT["sqlite"] * 2 + 7
    keys = [part_key("spare", {}, f"relief cartridge:{i}") for i in range(n)]
    write_transaction(fleet, lambda conn: register_parts(conn, [item(k, "spare") for k in keys]))
    path = write_csv(tmp_path / "c.csv", ["supplier_ref", "part_key", "price", "currency"],
                     [[f"R-{i}", k, i, "EUR"] for i, k in enumerate(keys)])
    import_catalogue(fleet, path, "Test Seals")
    with fleet.connect() as conn:
        offers = catalogue_offers(conn, keys + [OIL])  # OIL is registered but no supplier lists it
    assert {k: [o.price for o in found] for k, found in offers.items()} == {k: [float(i)] for i, k in enumerate(keys)}


def test_reimport_replaces_the_suppliers_catalogue(fleet, tmp_path):
    first = write_csv(tmp_path / "a.csv", ["supplier_ref", "part_key", "currency"], [["A", ROD_SEAL, "EUR"], ["B", O_RING, "EUR"]])
    second = write_csv(tmp_path / "b.csv", ["supplier_ref", "part_key", "currency"], [["B", O_RING, "USD"]])
    import_catalogue(fleet, first, "Test Seals")
    import_catalogue(fleet, first, "Other Seals")
    import_catalogue(fleet, second, "Test Seals")
    from kit.store.catalogue_import import SUPPLIERS

    with fleet.connect() as conn:
        found = conn.execute(select(SUPPLIERS.c.name, ENTRIES.c.supplier_ref, ENTRIES.c.currency)
                             .join(SUPPLIERS, SUPPLIERS.c.id == ENTRIES.c.supplier_id)
                             .order_by(SUPPLIERS.c.name, ENTRIES.c.supplier_ref)).all()
    assert [tuple(r) for r in found] == [("Other Seals", "A", "EUR"), ("Other Seals", "B", "EUR"), ("Test Seals", "B", "USD")]


def test_one_bad_catalogue_row_refuses_the_whole_file(fleet, tmp_path):
    good = write_csv(tmp_path / "good.csv", ["supplier_ref", "part_key", "currency", "pack"], [["A", OIL, "EUR", "208 L"]])
    import_catalogue(fleet, good, "Test Seals")
    before = dump(fleet)
    book = tmp_path / "cat.xlsx"
    wb = openpyxl.Workbook()
    ws = wb.active
    ws.title = "catalogue"
    ws.append(CATALOGUE_HEADER)
    ws.append(["RS-11", "rod_seal", "11 in", "12 in", "25 mm", None, None, "AU", 1, 182.5, "EUR", 21])
    ws.append(["RS-12", "rod_seal", "12 in", "13 in", 25, None, None, "AU", 1, 190, "EUR", 21])
    wb.save(book)
    result = CliRunner().invoke(main, ["catalogue", "import", str(book), "--supplier", "Test Seals", "--db", str(fleet.url.render_as_string(hide_password=False))])
    assert result.exit_code == 2
    assert result.output.strip() == (f'kit: error: {book}, sheet catalogue, row 3: column L: expected a length with a unit, '
                                     f'e.g. "280 mm" or "11 in" (got 25)')
    assert dump(fleet) == before


@pytest.mark.parametrize("cells, message", [
    (["A", OIL, "EURO"], "line 2: column currency: expected an ISO 4217 currency code such as EUR, USD, NOK or JPY (got 'EURO')"),
    (["A", "seal:x", "EUR"], "line 2: column part_key: expected a part key starting with a part kind"),
    (["A", O_RING, "EUR", "²"], "line 2: column pack_qty: expected a whole number from 1 to 1,000,000 (got '²')"),  # isdigit() but not int()
])
def test_catalogue_cell_errors_name_line_and_column(fleet, tmp_path, cells, message):
    path = write_csv(tmp_path / "c.csv", ["supplier_ref", "part_key", "currency", "pack_qty"][:len(cells)], [cells])
    with pytest.raises(InputError) as err:
        import_catalogue(fleet, path, "Test Seals")
    assert str(err.value).startswith(f"{path}, {message}")


def test_unknown_column_and_duplicate_part_number_are_refused(fleet, tmp_path):
    path = write_csv(tmp_path / "c.csv", ["supplier_ref", "colour", "currency"], [["A", "red", "EUR"]])
    with pytest.raises(InputError, match=r"column colour: expected one of supplier_ref, part_key"):
        import_catalogue(fleet, path, "Test Seals")
    path = write_csv(tmp_path / "d.csv", ["supplier_ref", "part_key", "currency"], [["A", O_RING, "EUR"], ["A", O_RING, "EUR"]])
    with pytest.raises(InputError, match=r"line 3: column supplier_ref: expected each part number once \(already on .*line 2\)"):
        import_catalogue(fleet, path, "Test Seals")


def test_a_file_that_is_not_a_workbook_gets_one_clear_line(tmp_path):
    path = tmp_path / "cat.xlsx"
    path.write_text("supplier_ref,currency\nA,EUR\n")
    with pytest.raises(InputError) as err:
        read_table(path, "catalogue", known=COLUMNS)
    assert str(err.value) == f"{path}: file: expected an .xlsx workbook (Office Open XML spreadsheet) (got a file that is not one)"


def test_entity_expansion_in_a_workbook_is_refused(tmp_path):
    book = tmp_path / "ok.xlsx"
    wb = openpyxl.Workbook()
    wb.active.title = "catalogue"
    wb.active.append(["supplier_ref", "currency"])
    wb.active.append(["A", "EUR"])
    wb.save(book)
    evil = tmp_path / "evil.xlsx"
    bomb = ('<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol"><!ENTITY lol2 "&lol;&lol;&lol;&lol;&lol;">]>'
            '<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>'
            '<row r="1"><c r="A1" t="inlineStr"><is><t>&lol2;</t></is></c></row></sheetData></worksheet>')
    with zipfile.ZipFile(book) as src, zipfile.ZipFile(evil, "w") as dst:
        for info in src.infolist():
            data = src.read(info.filename)
            dst.writestr(info, bomb if info.filename == "xl/worksheets/sheet1.xml" else data)
    with pytest.raises(InputError, match=r"evil\.xlsx: file: expected a workbook without XML entity declarations"):
        read_table(evil, "catalogue")


def test_row_limit(tmp_path):
    path = write_csv(tmp_path / "c.csv", ["supplier_ref", "currency"], [[str(i), "EUR"] for i in range(11)])
    with pytest.raises(InputError, match=r"rows: expected at most 10 data rows"):
        read_table(path, "catalogue", max_rows=10)


STOCK_HEADER = ["part_key", "designation", "location", "quantity", "counted_on"]


def stock_rows(engine, vessel: str) -> dict[tuple[str, str], float]:
    from kit.store.parts_store import PARTS

    with engine.connect() as conn:
        q = select(PARTS.c.key, STOCK.c.location, STOCK.c.quantity).join(PARTS, PARTS.c.id == STOCK.c.part_id).where(STOCK.c.vessel_id == vessel)
        return {(k, loc): qty for k, loc, qty in conn.execute(q)}


def test_stock_count_then_adjust(fleet, tmp_path):
    count = write_csv(tmp_path / "count.csv", STOCK_HEADER, [
        [O_RING, "O-ring", "", 12, "2025-03-01"], [OIL, "oil", "steering gear room", 200, ""]])
    import_stock(fleet, count, "TEST-ONE")
    adjust = write_csv(tmp_path / "adj.csv", STOCK_HEADER, [[O_RING, "", "", -2, ""], [OIL, "", "steering gear room", 20, ""]])
    import_stock(fleet, adjust, "TEST-ONE", "adjust")
    assert stock_rows(fleet, "TEST-ONE") == {(O_RING, "unassigned"): 10.0, (OIL, "steering gear room"): 220.0}
    assert stock_rows(fleet, "TEST-TWO") == {}


def test_stock_issue_past_what_is_on_board_refuses_the_file(fleet, tmp_path):
    import_stock(fleet, write_csv(tmp_path / "c.csv", STOCK_HEADER, [[O_RING, "", "", 3, ""]]), "TEST-ONE")
    before = dump(fleet)
    path = write_csv(tmp_path / "a.csv", STOCK_HEADER, [[OIL, "", "", 5, ""], [O_RING, "", "", -4, ""]])
    with pytest.raises(InputError) as err:
        import_stock(fleet, path, "TEST-ONE", "adjust")
    assert str(err.value) == f"{path}, line 3: column quantity: expected an issue of at most 3 (what is on board at unassigned) (got -4.0)"
    assert dump(fleet) == before


def test_stock_import_cli_errors(fleet, tmp_path):
    url = fleet.url.render_as_string(hide_password=False)
    before = dump(fleet)
    path = write_csv(tmp_path / "s.csv", STOCK_HEADER, [[OIL, "", "", 5, ""], ["oil:hm 68", "", "", 1, ""]])
    result = CliRunner().invoke(main, ["stock", "import", str(path), "--vessel", "TEST-ONE", "--db", url])
    assert result.exit_code == 2
    assert result.output.strip() == (f"kit: error: {path}, line 3: column part_key: expected the key of a generic part "
                                     f"in the database (see kit template stock) (got 'oil:hm 68')")
    result = CliRunner().invoke(main, ["stock", "import", str(path), "--vessel", "NOPE", "--db", url])
    assert result.exit_code == 2 and "--vessel: expected the id of a vessel in the database" in result.output
    negative = write_csv(tmp_path / "n.csv", STOCK_HEADER, [[OIL, "", "", -5, ""]])
    result = CliRunner().invoke(main, ["stock", "import", str(negative), "--vessel", "TEST-ONE", "--db", url])
    assert result.exit_code == 2
    assert result.output.strip() == f"kit: error: {negative}, line 2: column quantity: expected a number from 0 to 1,000,000,000 (got -5.0)"
    assert dump(fleet) == before


def test_stock_template_round_trips_through_import(fleet, tmp_path):
    url = fleet.url.render_as_string(hide_password=False)
    out = tmp_path / "count.xlsx"
    # Without --vessel the sheet lists every generic part and names no vessel (issue 14: with
    # --vessel it is that vessel's count sheet, tested in tests/test_db_count.py), so the import needs --vessel.
    result = CliRunner().invoke(main, ["template", "stock", str(out), "--db", url])
    assert result.exit_code == 0, result.output
    wb = openpyxl.load_workbook(out)
    ws = wb["stock"]
    assert [c.value for c in ws[1]] == STOCK_HEADER
    assert sorted(ws.cell(r, 1).value for r in range(2, ws.max_row + 1)) == sorted([ROD_SEAL, O_RING, OIL])
    for r in range(2, ws.max_row + 1):
        ws.cell(r, 4).value = r
    wb.save(out)
    result = CliRunner().invoke(main, ["stock", "import", str(out), "--vessel", "TEST-ONE", "--db", url])
    assert result.exit_code == 0, result.output
    assert sorted(stock_rows(fleet, "TEST-ONE").values()) == [2.0, 3.0, 4.0]
