# SPDX-License-Identifier: MIT
"""The fleet at a glance (``kit vessels``) and vessel ids typed in any letter case, on SQLite and
PostgreSQL: one store function resolves the id for every command, an id that differs from a
stored one only in letter case is refused at load, and an unknown id is reported naming the
argument or option it was typed as."""

from __future__ import annotations

import datetime as dt
import json

import pytest
from click.testing import CliRunner
from sqlalchemy import insert

from catalog_schema.core_tables import DELIVERIES
from catalog_schema.engine import make_engine, write_transaction
from db_support import TOML_CYLINDER, db_url, dump  # noqa: F401  (fixtures)
from kit.cli import main
from kit.errors import UnknownVesselError
from kit.store.vessel_ids import resolve_vessel_id, resolve_vessel_ids

TODAY = dt.date.today()
# a second vessel with two units, the second a copy of the first under another id
TOML_TWO = (TOML_CYLINDER.replace('id = "TEST-ONE"', 'id = "TEST-TWO"').replace('name = "Test One"', 'name = "Test Two"')
            .replace("gross_tonnage = 4200", "gross_tonnage = 51000")
            + TOML_CYLINDER[TOML_CYLINDER.index("[[unit]]"):].replace('id = "SG1"', 'id = "SG2"'))


def run(*args: str, env: dict | None = None):
    return CliRunner().invoke(main, [str(a) for a in args], env=env)


@pytest.fixture
def fleet(db_url, tmp_path):  # noqa: F811
    """TEST-ONE (one unit) and TEST-TWO (two units) loaded, their parts registered."""
    for name, text in (("one.toml", TOML_CYLINDER), ("two.toml", TOML_TWO)):
        (tmp_path / name).write_text(text)
        assert run("load", tmp_path / name, "--db", db_url).exit_code == 0
    assert run("parts", "register", "--db", db_url).exit_code == 0
    return db_url


def filter_key(db: str) -> str:
    listed = run("parts", "list", "--kind", "filter_element", "--db", db)
    return next(line.split("\t")[0] for line in listed.output.splitlines() if "test-one" in line)


def test_vessels_lists_units_last_count_and_next_delivery(fleet, tmp_path):
    key = filter_key(fleet)
    counts = tmp_path / "count.csv"
    counts.write_text("part_key,location,quantity,counted_on\n"
                      f"{key},store A,1,{(TODAY - dt.timedelta(days=10)).isoformat()}\n"
                      f"{key},store B,2,{(TODAY - dt.timedelta(days=3)).isoformat()}\n")
    assert run("stock", "import", counts, "--vessel", "TEST-ONE", "--db", fleet).exit_code == 0
    engine = make_engine(fleet)
    day = lambda n: TODAY + dt.timedelta(days=n)  # noqa: E731
    rows = [("TEST-ONE", "Hamburg", day(-1)), ("TEST-ONE", "Rotterdam", day(20)), ("TEST-ONE", "Antwerp", day(5)),
            ("TEST-TWO", "Genoa", day(-30)), ("TEST-TWO", "Piraeus", day(0))]
    write_transaction(engine, lambda c: c.execute(insert(DELIVERIES), [{"vessel_id": v, "port": p, "due_on": d} for v, p, d in rows]))
    engine.dispose()

    listed = run("vessels", "--json", "--db", fleet)
    assert listed.exit_code == 0, listed.output
    # the latest counted_on of TEST-ONE's rows; the first delivery due today or later (today counts)
    assert json.loads(listed.output) == [
        {"id": "TEST-ONE", "name": "Test One", "ship_type": "cargo", "gross_tonnage": 4200.0, "units": 1,
         "last_count": day(-3).isoformat(), "next_delivery": {"port": "Antwerp", "due_on": day(5).isoformat()}},
        {"id": "TEST-TWO", "name": "Test Two", "ship_type": "cargo", "gross_tonnage": 51000.0, "units": 2,
         "last_count": None, "next_delivery": {"port": "Piraeus", "due_on": TODAY.isoformat()}},
    ]
    wide = run("vessels", "--db", fleet, env={"COLUMNS": "160"})
    cells = [[c.strip() for c in line.split("│")[1:-1]] for line in wide.output.splitlines() if line.startswith("│")]
    assert cells == [["TEST-ONE", "Test One", "cargo", "4,200", "1", day(-3).isoformat(), f"Antwerp, {day(5).isoformat()}"],
                     ["TEST-TWO", "Test Two", "cargo", "51,000", "2", "", f"Piraeus, {TODAY.isoformat()}"]]
    assert "left out" not in wide.output
    narrow = run("vessels", "--db", fleet, env={"COLUMNS": "50"})
    assert all(len(line) <= 50 for line in narrow.output.splitlines()), narrow.output
    assert "TEST-ONE" in narrow.output and "left out at 50 columns: " in narrow.output


def test_vessels_on_an_empty_database(db_url):  # noqa: F811
    done = run("vessels", "--db", db_url)
    assert (done.exit_code, done.output) == (0, "no vessels in the fleet database (kit load adds them)\n")
    assert json.loads(run("vessels", "--json", "--db", db_url).output) == []


def test_every_command_takes_the_id_in_any_letter_case(fleet, tmp_path):
    check = run("check", "test-one", "--days", "30", "--db", fleet, env={"COLUMNS": "200"})
    assert check.exit_code == 1 and "Test One (TEST-ONE) is short for a 30-day voyage" in check.output
    bom = run("bom", "--vessel", "Test-One", "--vessel", "TEST-ONE", "--days", "90", "--out", tmp_path / "b.xlsx", "--db", fleet)
    once = run("bom", "--vessel", "TEST-ONE", "--days", "90", "--out", tmp_path / "b.xlsx", "--db", fleet)
    assert bom.output == once.output and "for 1 vessel(s)" in bom.output  # one vessel, asked for twice
    assert "for 1 vessel(s)" in run("parts", "register", "--vessel", "tEST-oNE", "--db", fleet).output
    count = tmp_path / "count.csv"
    count.write_text(f"part_key,quantity\n{filter_key(fleet)},1\n")
    imported = run("stock", "import", count, "--vessel", "test-one", "--db", fleet)
    assert imported.output == "TEST-ONE: 1 stock row(s) written (count)\n"
    assert run("template", "stock", tmp_path / "t.csv", "--vessel", "test-two", "--days", "60", "--db", fleet).exit_code == 0
    policy = run("policy", "set", "--vessel", "test-two", "--name", "own", "--days", "60", "--from", "2025-01-01", "--db", fleet)
    assert policy.exit_code == 0, policy.output
    shown = run("policy", "show", "--vessel", "Test-Two", "--db", fleet)
    assert shown.output.splitlines()[0] == "TEST-TWO: own (vessel policy from 2025-01-01), 60 days of cover"


def test_the_store_resolves_by_case_folding(fleet, tmp_path):
    """Python's casefold, not SQL lower() (ASCII only in SQLite): a non-ASCII id is found too."""
    path = tmp_path / "north.toml"
    path.write_text(TOML_CYLINDER.replace('id = "TEST-ONE"', 'id = "ÅLESUND-STJERNE"'))
    assert run("load", path, "--db", fleet).exit_code == 0
    engine = make_engine(fleet)
    with engine.connect() as conn:
        assert resolve_vessel_ids(conn, ["ålesund-stjerne", "test-two", "TEST-ONE"]) == ["ÅLESUND-STJERNE", "TEST-TWO", "TEST-ONE"]
        with pytest.raises(UnknownVesselError) as refused:
            resolve_vessel_id(conn, "test-three")
    engine.dispose()
    assert refused.value.vessel_id == "test-three"


def test_an_id_differing_only_in_case_is_refused_at_load(fleet, tmp_path):
    before = dump(make_engine(fleet))
    twin = tmp_path / "twin.toml"
    twin.write_text(TOML_CYLINDER.replace('id = "TEST-ONE"', 'id = "Test-One"'))
    done = run("load", twin, "--db", fleet)
    assert done.exit_code == 2
    assert done.output == (f"kit: error: {twin}: vessel.id: expected an id that differs from vessel 'TEST-ONE' by more than "
                           "letter case (kit matches vessel ids whatever the case) (got 'Test-One')\n")
    folder = tmp_path / "pair"
    folder.mkdir()
    (folder / "a.toml").write_text(TOML_CYLINDER.replace('id = "TEST-ONE"', 'id = "NEW-HULL"'))
    (folder / "b.toml").write_text(TOML_CYLINDER.replace('id = "TEST-ONE"', 'id = "new-hull"'))
    pair = run("load", folder, "--db", fleet)
    assert pair.exit_code == 2 and "expected an id that differs from vessel 'NEW-HULL' by more than letter case" in pair.output
    assert dump(make_engine(fleet)) == before  # nothing written
    assert run("load", tmp_path / "one.toml", "--db", fleet).exit_code == 0  # the same id again is a reload


@pytest.mark.parametrize("command, args, given, where", [
    ("check", ["check", "NO-SUCH", "--days", "30"], "VESSEL_ID", "fleet database"),
    ("bom", ["bom", "--vessel", "TEST-ONE", "--vessel", "NO-SUCH", "--out", "{tmp}/b.xlsx"], "--vessel", "fleet database"),
    ("parts register", ["parts", "register", "--vessel", "NO-SUCH"], "--vessel", "fleet database"),
    ("policy show", ["policy", "show", "--vessel", "NO-SUCH"], "--vessel", "database"),
    ("template stock", ["template", "stock", "{tmp}/t.csv", "--vessel", "NO-SUCH"], "--vessel", "database"),
], ids=["check", "bom", "parts register", "policy show", "template stock"])
def test_an_unknown_id_names_the_argument_it_was_typed_as(fleet, tmp_path, command, args, given, where):
    done = run(*[a.format(tmp=tmp_path) for a in args], "--db", fleet)
    assert done.exit_code == 2
    assert done.output == (f"kit: error: kit {command}: {given}: expected the id of a vessel in the {where} "
                           "(kit vessels lists them; letter case does not matter) (got 'NO-SUCH')\n")
    assert not (tmp_path / "b.xlsx").exists() and not (tmp_path / "t.csv").exists()
