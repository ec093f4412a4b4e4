# SPDX-License-Identifier: MIT
"""Vessel particulars into the database and back, on SQLite and PostgreSQL."""

from __future__ import annotations

import dataclasses
import json
import re
import shutil
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner

from catalog_schema.engine import write_transaction
from db_support import TOML_CYLINDER, db_url, dump, engine  # noqa: F401  (fixtures)
from kit.cli import main
from kit.errors import InputError
from kit.store.fleet_store import read_vessels, save_vessels
from kit.files.particulars_file import load_folder, load_vessel
from kit.files.particulars_sheet import load_particulars_sheet, write_particulars_template

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


# A vessel whose units give every optional field the database stores since revision 0005.
TOML_EXACT = TOML_CYLINDER + '''
[unit.rudder]
area = "9.5 m^2"
mean_height = "3.8 m"
area_forward = "1.9 m^2"
ahead_speed = "13 kn"
astern_speed = "7 kn"
profile = "flat_side"
position = "outside_jet"

[[unit]]
id = "SG2"
service = "steering"
actuator = "ram"
count = 2
ram_diameter = "220 mm"
stroke = "800 mm"
tiller_radius = "500 mm"
gland_spigot_bore = "300 mm"
max_rudder_angle = "35 deg"
working_pressure = "160 bar"
fluid = "HM 46"
pumps = 2
pump_flow = "60 L/min"
reservoir = "200 L"
rudder.area = "8 m^2"
rudder.mean_height = "3.5 m"
rudder.area_forward = "1.5 m^2"
rudder.ahead_speed = "8 kn"
rudder.profile = "hollow"
rudder.position = "behind_nozzle"
''' + "".join(f'''
[[unit]]
id = "{ref}"
service = "steering"
actuator = "rotary_vane"
count = 1
vanes = 2
vane_height = "400 mm"
housing_bore = "900 mm"
hub_diameter = "500 mm"
stock_diameter = "300 mm"
max_rudder_angle = "35 deg"
working_pressure = "100 bar"
fluid = "HM 46"
pumps = 2
pump_flow = "200 L/min"
reservoir = "400 L"
{carrier}
''' for ref, carrier in (("SG3", 'rudder_carrier = "in_actuator"'), ("SG4", "")))
TOML_EXACT = TOML_EXACT.replace('tiller_radius = "500 mm"\nmax', 'tiller_radius = "500 mm"\ntrunnion_distance = "650 mm"\nmax', 1)


def test_round_trip_keeps_trunnion_spigot_rudder_and_carrier(engine, tmp_path):
    path = tmp_path / "exact.toml"
    path.write_text(TOML_EXACT)
    from_file = load_vessel(path)
    sg1, sg2, sg3, sg4 = from_file.units
    # the file gives them (so a reader that dropped them could not pass), and the database keeps them
    assert (sg1.geometry.trunnion_distance, sg2.geometry.gland_spigot_bore) == (pytest.approx(0.65), pytest.approx(0.3))
    assert (sg1.rudder.astern_speed, sg2.rudder.astern_speed, sg2.rudder.position) == (pytest.approx(7 * 1852 / 3600), None,
                                                                                      "behind_nozzle")
    assert [u.rudder_carrier for u in from_file.units] == ["separate", "separate", "in_actuator", None]
    write_transaction(engine, lambda c: save_vessels(c, [from_file]))
    with engine.connect() as conn:
        assert read_vessels(conn) == [from_file]
    assert len(dump(engine, {"rudders"})["rudders"]) == 2
    # Loading the file again without the rudders drops their rows, as it drops a unit's filters.
    path.write_text(re.sub(r"^rudder\..*\n", "", re.sub(r"\[unit\.rudder\]\n(.+\n)+", "", TOML_EXACT), flags=re.M))
    without = load_vessel(path)
    assert [u.rudder for u in without.units] == [None, None, None, None]
    write_transaction(engine, lambda c: save_vessels(c, [without]))
    with engine.connect() as conn:
        assert read_vessels(conn) == [without]
    assert dump(engine, {"rudders"})["rudders"] == []


def _gear_checks(book: Path) -> list[tuple]:
    return list(openpyxl.load_workbook(book, read_only=True)["Gear checks"].iter_rows(values_only=True))


def test_bom_and_check_from_the_database_hold_the_gear_to_the_same_checks_as_calc_on_the_file(db_url, tmp_path):
    path = tmp_path / "exact.toml"
    path.write_text(TOML_EXACT)
    runner = CliRunner()
    assert runner.invoke(main, ["load", str(path), "--db", db_url]).exit_code == 0
    from_db, from_file, check = tmp_path / "db.xlsx", tmp_path / "file.xlsx", tmp_path / "check.xlsx"
    assert runner.invoke(main, ["bom", "--days", "90", "--db", db_url, "--out", str(from_db)]).exit_code == 0
    assert runner.invoke(main, ["bom", "--days", "90", "--particulars", str(path), "--out", str(from_file)]).exit_code == 0
    assert runner.invoke(main, ["check", "TEST-ONE", "--days", "30", "--db", db_url, "--out", str(check)]).exit_code == 1
    rows = _gear_checks(from_db)
    assert rows == _gear_checks(from_file)  # the pre-voyage check workbook is the stock's, with no gear checks
    calc = json.loads(runner.invoke(main, ["calc", str(path), "--json"]).output)
    header = rows[0]
    by_unit = {row[header.index("Unit")]: dict(zip(header, row)) for row in rows[1:]}
    for unit in calc["units"]:
        sheet = by_unit[unit["id"]]
        assert (sheet["Torque basis"], sheet["Torque at max angle [kNm]"], sheet["Margin over rudder torque [%]"]) == (
            unit["torque_basis"], unit["torque_knm"]["max_angle"], unit["rudder_torque_margin_pct"])
    # the fields the database now keeps are what these checks stand on
    assert "exact geometry" in by_unit["SG1"]["Torque basis"]
    assert [by_unit[u]["Margin over rudder torque [%]"] is not None for u in ("SG1", "SG2", "SG3")] == [True, True, False]


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


def test_particulars_workbook_carries_the_rudder_in_its_own_columns(tmp_path):
    toml = tmp_path / "exact.toml"
    toml.write_text(TOML_EXACT)
    book = tmp_path / "exact.xlsx"
    write_particulars_template(book, toml)
    assert dataclasses.replace(load_particulars_sheet(book), source=str(toml)) == load_vessel(toml)
    wb = openpyxl.load_workbook(book)
    ws = wb["units"]
    header = [c.value for c in ws[1]]
    assert [ws.cell(r, header.index("rudder_profile") + 1).value for r in range(2, 6)] == ["flat_side", "hollow", None, None]
    ws.cell(3, header.index("rudder_area") + 1).value = 8  # a bare number: the unit is missing
    wb.save(book)
    with pytest.raises(InputError) as err:
        load_particulars_sheet(book)
    assert str(err.value) == (f'{book}, sheet units, row 3: column rudder_area: expected an area with a unit, '
                              f'e.g. "12.5 m^2" (got 8)')


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
