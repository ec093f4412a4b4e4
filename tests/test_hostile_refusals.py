# SPDX-License-Identifier: MIT
"""The database's own refusals during an import, on SQLite and PostgreSQL: whatever the database
refuses (a CHECK, a unique key, an integer past the column's range, a NUL in text on PostgreSQL)
reaches the user as one line naming the file, the line and the column; exit status 2; nothing
written.

kit's own checks refuse such rows first, so most cases here hand the write side rows those checks
never see (the parsing function replaced for the test): the point is that the database's word,
whichever check missed it, is traced back to the line it came from.
"""

from __future__ import annotations

import dataclasses

import pytest
from click.testing import CliRunner

import kit.files.catalogue_sheet
import kit.files.stock_sheet
from db_support import db_url, dump, engine  # noqa: F401  (fixtures)
from kit.cli import main
from test_db_imports import CATALOGUE_HEADER, O_RING, OIL, ROD_SEAL, STOCK_HEADER, fleet, write_csv  # noqa: F401  (fixture)

EXPECTED = "expected a value the database accepts"
# (line, supplier_ref, part_key, description, pack_qty, price, currency, lead_time_days): index of each
FIELD = {"supplier_ref": 1, "description": 3, "pack_qty": 4, "price": 5, "currency": 6, "lead_time_days": 7}


def _catalogue(tmp_path, rows: int = 5):
    return write_csv(tmp_path / "cat.csv", CATALOGUE_HEADER,
                     [[f"OR-{i}", "o_ring", "", "", "", f"{100 + i} mm", "5.3 mm", "NBR", 10, 9.5, "EUR", 3] for i in range(rows)])


def _entries_with(monkeypatch, index: int, field: str, value) -> None:
    """Make the catalogue's reading hand on row ``index`` with ``field`` set to ``value``."""
    real = kit.files.catalogue_sheet.read_catalogue

    def altered(*args, **kwargs):
        catalogue = real(*args, **kwargs)
        entries = list(catalogue.entries)
        row = list(entries[index])
        row[FIELD[field]] = value
        entries[index] = tuple(row)
        return dataclasses.replace(catalogue, entries=entries)

    monkeypatch.setattr(kit.files.catalogue_sheet, "read_catalogue", altered)


def _refused(fleet, args) -> str:
    """Run kit; it must exit 2 with one line on stderr and leave the database as it was."""
    url = fleet.url.render_as_string(hide_password=False)
    before = dump(fleet)
    result = CliRunner().invoke(main, [*args, "--db", url])
    assert (result.exit_code, len(result.output.splitlines())) == (2, 1), result.output
    assert "Traceback" not in result.output and dump(fleet) == before
    print(result.output)  # shown with -s: what the user reads
    return result.output


CASES = {  # field: (value, what the database's refusal names), each refused by both engines
    "price": (-1.0, "ck_catalogue_entries_price"),
    "currency": ("EURO", "ck_catalogue_entries_currency"),
    "pack_qty": (0, "ck_catalogue_entries_pack_qty"),
    "lead_time_days": (-2, "ck_catalogue_entries_lead_time_days"),
}


@pytest.mark.parametrize("field", CASES)
def test_a_check_the_database_makes_names_the_line_and_column(fleet, tmp_path, monkeypatch, field):
    value, constraint = CASES[field]
    path = _catalogue(tmp_path)
    _entries_with(monkeypatch, 2, field, value)
    out = _refused(fleet, ["catalogue", "import", str(path), "--supplier", "Test Seals"])
    assert out.startswith(f"kit: error: {path}, line 4: column {field}: {EXPECTED} (got {value!r}, refused: ")
    assert constraint in out


def test_the_refused_row_is_found_among_thousands(fleet, tmp_path, monkeypatch):
    path = _catalogue(tmp_path, rows=3000)
    _entries_with(monkeypatch, 2222, "price", -0.01)
    out = _refused(fleet, ["catalogue", "import", str(path), "--supplier", "Test Seals"])
    assert out.startswith(f"kit: error: {path}, line 2224: column price: {EXPECTED} (got -0.01, refused: ")


def test_a_unique_key_the_database_keeps_names_the_second_line(fleet, tmp_path, monkeypatch):
    path = _catalogue(tmp_path)
    _entries_with(monkeypatch, 3, "supplier_ref", "OR-1")  # line 5 repeats line 3's part number
    out = _refused(fleet, ["catalogue", "import", str(path), "--supplier", "Test Seals"])
    assert out.startswith(f"kit: error: {path}, line 5: column supplier_ref: {EXPECTED} (got 'OR-1', refused: ")


def test_an_integer_past_64_bits_names_the_line_and_column(fleet, tmp_path, monkeypatch):
    # Python's int has no limit; both engines store at most a 64-bit integer (sqlite3 refuses to bind it).
    path = _catalogue(tmp_path)
    _entries_with(monkeypatch, 1, "lead_time_days", 2**63)
    out = _refused(fleet, ["catalogue", "import", str(path), "--supplier", "Test Seals"])
    assert out.startswith(f"kit: error: {path}, line 3: column lead_time_days: {EXPECTED} (got {2**63}, refused: ")


def test_a_whole_number_past_postgresqls_integer_names_the_line(fleet, tmp_path):
    # The file as a user writes it, no check bypassed: catalogue_entries.pack_qty is PostgreSQL's
    # 32-bit integer (largest 2,147,483,647, PostgreSQL manual, "Numeric Types"); SQLite holds 64 bits,
    # and kit's own bound (pack_qty at most 1,000,000) refuses it first on both.
    rows = [[f"OR-{i}", "o_ring", "", "", "", "236 mm", "5.3 mm", "NBR", 10, 9.5, "EUR", 3] for i in range(3)]
    rows[1][8] = 3_000_000_000
    path = write_csv(tmp_path / "big.csv", CATALOGUE_HEADER, rows)
    out = _refused(fleet, ["catalogue", "import", str(path), "--supplier", "Test Seals"])
    assert out.startswith(f"kit: error: {path}, line 3: column pack_qty: ")  # kit's own bound, or the database's


def _postgresql_only(engine) -> None:
    if engine.dialect.name != "postgresql":
        pytest.skip("SQLite stores a NUL character in text; PostgreSQL refuses it")


def test_a_nul_in_text_names_the_line_and_column_on_postgresql(fleet, tmp_path, monkeypatch):
    _postgresql_only(fleet)
    path = _catalogue(tmp_path)
    _entries_with(monkeypatch, 0, "description", "seal\x00kit")
    out = _refused(fleet, ["catalogue", "import", str(path), "--supplier", "Test Seals"])
    assert out.startswith(f"kit: error: {path}, line 2: column description: {EXPECTED} (got 'seal\\x00kit', refused: ")


def _stock_with(monkeypatch, index: int, position: int, value) -> None:
    real = kit.files.stock_sheet._rows

    def altered(table, *args, **kwargs):
        out = real(table, *args, **kwargs)
        row = list(out[index])
        row[position] = value
        out[index] = tuple(row)
        return out

    monkeypatch.setattr(kit.files.stock_sheet, "_rows", altered)


def test_stock_below_zero_the_database_refuses_names_the_line(fleet, tmp_path, monkeypatch):
    path = write_csv(tmp_path / "stock.csv", STOCK_HEADER, [[k, "", "store", 1, ""] for k in (ROD_SEAL, O_RING, OIL)])
    _stock_with(monkeypatch, 1, 3, -1.0)  # (row, key, location, quantity, counted_on)
    out = _refused(fleet, ["stock", "import", str(path), "--vessel", "TEST-ONE"])
    assert out.startswith(f"kit: error: {path}, line 3: column quantity: {EXPECTED} (got -1.0, refused: ")
    assert "ck_stock_quantity" in out


def test_a_nul_in_a_stock_location_names_the_line_on_postgresql(fleet, tmp_path, monkeypatch):
    _postgresql_only(fleet)
    path = write_csv(tmp_path / "stock.csv", STOCK_HEADER, [[k, "", "store", 1, ""] for k in (ROD_SEAL, O_RING, OIL)])
    _stock_with(monkeypatch, 2, 2, "store\x00room")
    out = _refused(fleet, ["stock", "import", str(path), "--vessel", "TEST-ONE", "--mode", "adjust"])
    assert out.startswith(f"kit: error: {path}, line 4: column location: {EXPECTED} (got 'store\\x00room', refused: ")


def test_a_refusal_that_does_not_come_again_is_one_line_about_the_database(engine):
    # Another writer may change what the database refused before kit runs the transaction again
    # to find the row: then kit says what the database said, and nothing is written.
    from sqlalchemy import insert

    from catalog_schema.engine import write_transaction
    from catalog_schema.errors import DatabaseError
    from catalog_schema.refusals import located
    from kit.store.catalogue_import import SUPPLIERS

    tries = []

    def write(conn, rows):
        tries.append(len(rows))
        conn.execute(insert(SUPPLIERS), [{"name": None if len(tries) == 1 else name} for (name,) in rows])

    with pytest.raises(DatabaseError) as err:
        write_transaction(engine, lambda conn: located(conn, SUPPLIERS, ["name"], [("Test Seals",)], write,
                                                       lambda i: f"s.csv, line {i + 2}"))
    assert str(err.value).startswith(f"database {engine.url.render_as_string(hide_password=True)}: "
                                     "refused the change, nothing was written; ")
    assert tries == [1, 1] and dump(engine, ["suppliers"]) == {"suppliers": []}


def test_a_particulars_row_the_database_refuses_names_the_file_and_unit(engine, tmp_path, monkeypatch):
    # kit load: the particulars' own checks refuse a unit count below 1 first; past them, the
    # database's CHECK (units.count >= 1) is traced to the file and unit.
    import kit.store.fleet_store
    from db_support import TOML_CYLINDER

    toml = tmp_path / "v.toml"
    toml.write_text(TOML_CYLINDER)
    real = kit.store.fleet_store._unit_row
    monkeypatch.setattr(kit.store.fleet_store, "_unit_row", lambda u, seq: {**real(u, seq), "count": 0})
    out = _refused(engine, ["load", str(toml)])
    assert out.startswith(f"kit: error: {toml}, unit SG1: column count: {EXPECTED} (got 0, refused: ")
    assert "ck_units_count" in out


def test_a_vessel_row_the_database_refuses_names_the_file(engine, tmp_path):
    import dataclasses

    from catalog_schema.engine import write_transaction
    from catalog_schema.refusals import RefusedRowError
    from db_support import TOML_CYLINDER
    from kit.store.fleet_store import save_vessels
    from kit.files.particulars_file import load_vessel

    toml = tmp_path / "v.toml"
    toml.write_text(TOML_CYLINDER)
    vessel = dataclasses.replace(load_vessel(toml), gross_tonnage=0.0)  # past the particulars' own check
    with pytest.raises(RefusedRowError) as err:
        write_transaction(engine, lambda conn: save_vessels(conn, [vessel]))
    assert str(err.value).startswith(f"{toml}: column gross_tonnage: {EXPECTED} (got 0.0, refused: ")
    assert dump(engine, ["vessels"]) == {"vessels": []}
