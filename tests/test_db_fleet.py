# SPDX-License-Identifier: MIT
"""Vessel particulars into the database and back, on SQLite and PostgreSQL."""

from __future__ import annotations

import dataclasses
import shutil
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner

from catalog_schema.engine import write_transaction
from db_support import TOML_CYLINDER, db_url, dump, engine  # noqa: F401  (fixtures)
from kit.cli import main
from kit.errors import InputError
from kit.fleet_store import read_vessels, save_vessels
from kit.particulars import load_folder, load_vessel
from kit.particulars_sheet import load_particulars_sheet, write_particulars_template

DEMO = Path(__file__).resolve().parents[1] / "demo_fleet"


def fleet_folder(tmp_path: Path) -> Path:
    """The demo fleet's particulars files, or one small file while the demo fleet is absent."""
    if sorted(DEMO.glob("*.toml")):
        return DEMO
    folder = tmp_path / "fleet"
    folder.mkdir()
    (folder / "test_one.toml").write_text(TOML_CYLINDER)
    return folder


def test_round_trip_reads_back_what_the_files_say(engine, tmp_path):
    folder = fleet_folder(tmp_path)
    from_files = load_folder(folder)  # the reference: the files read again, not the database
    write_transaction(engine, lambda c: save_vessels(c, load_folder(folder)))
    with engine.connect() as conn:
        back = read_vessels(conn)
    assert back == sorted(from_files, key=lambda v: v.id)


def test_loading_twice_changes_nothing(engine, tmp_path):
    folder = fleet_folder(tmp_path)
    write_transaction(engine, lambda c: save_vessels(c, load_folder(folder)))
    first = dump(engine)
    write_transaction(engine, lambda c: save_vessels(c, load_folder(folder)))
    assert dump(engine) == first


def test_a_unit_dropped_from_the_file_leaves_the_database(engine, tmp_path):
    two_units = TOML_CYLINDER + TOML_CYLINDER[TOML_CYLINDER.index("[[unit]]"):].replace('id = "SG1"', 'id = "SG2"')
    path = tmp_path / "v.toml"
    path.write_text(two_units)
    write_transaction(engine, lambda c: save_vessels(c, [load_vessel(path)]))
    path.write_text(TOML_CYLINDER)
    write_transaction(engine, lambda c: save_vessels(c, [load_vessel(path)]))
    with engine.connect() as conn:
        (vessel,) = read_vessels(conn)
    assert [u.id for u in vessel.units] == ["SG1"]
    assert len(dump(engine, {"filter_positions"})["filter_positions"]) == 1


def test_particulars_workbook_reads_as_the_toml_it_was_filled_from(tmp_path):
    folder = fleet_folder(tmp_path)
    for toml in sorted(folder.glob("*.toml")):
        book = tmp_path / f"{toml.stem}.xlsx"
        write_particulars_template(book, toml)
        assert dataclasses.replace(load_particulars_sheet(book), source=str(toml)) == load_vessel(toml)


def test_particulars_workbook_error_names_sheet_row_and_column(tmp_path):
    toml = tmp_path / "v.toml"
    toml.write_text(TOML_CYLINDER)
    book = tmp_path / "v.xlsx"
    write_particulars_template(book, toml)
    wb = openpyxl.load_workbook(book)
    ws = wb["units"]
    column = [c.value for c in ws[1]].index("working_pressure") + 1
    ws.cell(2, column).value = 160  # a bare number: the unit is missing
    wb.save(book)
    with pytest.raises(InputError) as err:
        load_particulars_sheet(book)
    assert str(err.value) == (f'{book}, sheet units, row 2: column working_pressure: expected a pressure with a unit, '
                              f'e.g. "160 bar" or "2400 psi" (got 160)')


def test_cli_load_of_a_bad_folder_writes_nothing_and_exits_2(db_url, tmp_path):
    folder = tmp_path / "fleet"
    shutil.copytree(fleet_folder(tmp_path), folder, ignore=shutil.ignore_patterns("*.md"))
    runner = CliRunner()
    ok = runner.invoke(main, ["load", str(folder), "--db", db_url])
    assert ok.exit_code == 0, ok.output
    from catalog_schema.engine import make_engine

    eng = make_engine(db_url)
    before = dump(eng)
    (folder / "zz_bad.toml").write_text(TOML_CYLINDER.replace('id = "TEST-ONE"', 'id = "TEST-TWO"')
                                        .replace('name = "Test One"', 'name = "Test Two"').replace('"160 bar"', '"160 parsecs"'))
    (folder / "aa_changed.toml").write_text(TOML_CYLINDER.replace("gross_tonnage = 4200", "gross_tonnage = 9999"))
    bad = runner.invoke(main, ["load", str(folder), "--db", db_url])
    assert bad.exit_code == 2
    assert bad.output.strip() == (f"kit: error: {folder / 'zz_bad.toml'}: unit[0].working_pressure: expected a pressure "
                                  f"with a unit, e.g. \"160 bar\" or \"2400 psi\" (got '160 parsecs')")
    assert dump(eng) == before  # aa_changed.toml was good, but the load is all or nothing
    eng.dispose()
