# SPDX-License-Identifier: MIT
"""The spares policy stored in the fleet database (revision 0003), on SQLite and PostgreSQL:
``kit policy set --file`` stores a validated policy, and ``kit bom`` and ``kit check`` work each
vessel out under its policy in force today (its own, else its company's, else kit's default)
unless ``--policy`` is given."""

from __future__ import annotations

import datetime as dt
import json

import openpyxl
import pytest
from click.testing import CliRunner
from sqlalchemy import insert

from catalog_schema.engine import make_engine
from catalog_schema.tables import SparesPolicyRow
from db_support import TOML_CYLINDER, db_url  # noqa: F401  (fixtures)
from kit.cli import main

SECOND = TOML_CYLINDER.replace('"Brackwater Test Shipping"', '"Saltmere Test Lines"').replace(
    'id = "TEST-ONE"', 'id = "TEST-TWO"').replace('name = "Test One"', 'name = "Test Two"')
SETS_2 = '[policy]\nname = "Brackwater two sets"\nspare_filter_sets = 2\n'


@pytest.fixture
def fleet(db_url, tmp_path):  # noqa: F811
    """Two vessels of two companies, loaded; returns a function running kit with --db."""
    for name, text in (("one.toml", TOML_CYLINDER), ("two.toml", SECOND)):
        (tmp_path / name).write_text(text)
    runner = CliRunner()

    def kit(*args):
        return runner.invoke(main, [*args, "--db", db_url])

    assert kit("load", str(tmp_path / "one.toml")).exit_code == 0
    assert kit("load", str(tmp_path / "two.toml")).exit_code == 0
    return kit


def policy_file(tmp_path, text, name="company-policy.toml"):
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return str(path)


def set_policy(kit, scope, who, path=None, since="2025-01-01", name="fleet-2025"):
    args = ["policy", "set", scope, who, "--name", name, "--days", "90", "--from", since]
    result = kit(*args, *(["--file", path] if path else []))
    assert result.exit_code == 0, result.output
    return result


def filter_sets(kit, tmp_path, *extra) -> dict[str, float]:
    """Filter elements per vessel over 0 days: only the policy's spare sets fall due."""
    out = tmp_path / "order.json"
    result = kit("bom", "--days", "0", "--out", str(tmp_path / "order.xlsx"), "--json", str(out), *extra)
    assert result.exit_code == 0, result.output
    lines = json.loads(out.read_text())["lines"]
    return {v: q for li in lines if li["part_key"].startswith("filter_element:") for v, q in li["vessels"].items()}


def test_vessel_own_policy_sets_its_quantities(fleet, tmp_path):
    assert filter_sets(fleet, tmp_path) == {"TEST-ONE": 1, "TEST-TWO": 1}  # kit default: one spare set
    set_policy(fleet, "--vessel", "TEST-ONE", policy_file(tmp_path, SETS_2))
    # one element per change, so two spare sets are two elements; the other vessel keeps the default
    assert filter_sets(fleet, tmp_path) == {"TEST-ONE": 2, "TEST-TWO": 1}


def test_company_policy_applies_to_its_vessels_and_a_vessel_policy_wins(fleet, tmp_path):
    set_policy(fleet, "--company", "Brackwater Test Shipping", policy_file(tmp_path, SETS_2))
    assert filter_sets(fleet, tmp_path) == {"TEST-ONE": 2, "TEST-TWO": 1}
    three = policy_file(tmp_path, '[policy]\nspare_filter_sets = 3\n', "vessel.toml")
    set_policy(fleet, "--vessel", "TEST-ONE", three, name="long-voyage")
    assert filter_sets(fleet, tmp_path) == {"TEST-ONE": 3, "TEST-TWO": 1}


def test_only_the_policy_in_force_today_is_used(fleet, tmp_path):
    tomorrow = (dt.date.today() + dt.timedelta(days=1)).isoformat()
    set_policy(fleet, "--vessel", "TEST-ONE", policy_file(tmp_path, SETS_2), since=tomorrow)
    assert filter_sets(fleet, tmp_path) == {"TEST-ONE": 1, "TEST-TWO": 1}


def test_policy_file_wins_over_the_stored_policy(fleet, tmp_path):
    set_policy(fleet, "--vessel", "TEST-ONE", policy_file(tmp_path, SETS_2))
    four = policy_file(tmp_path, '[policy]\nspare_filter_sets = 4\n', "override.toml")
    assert filter_sets(fleet, tmp_path, "--policy", four) == {"TEST-ONE": 4, "TEST-TWO": 4}


def required_in_check(kit, tmp_path, *extra) -> dict[str, float]:
    out = tmp_path / "check.xlsx"
    result = kit("check", "TEST-ONE", "--days", "0", "--out", str(out), *extra)
    assert result.exit_code == 1, result.output  # nothing is on board
    rows = list(openpyxl.load_workbook(out)["Pre-voyage check"].iter_rows(values_only=True))
    # each table's rows carry the part key right of the print area (column G), "Needed" in column C
    return {r[6]: r[2] for r in rows if r[6] is not None and r[6] != "Part key"}


def test_check_uses_the_stored_policy_unless_a_file_is_given(fleet, tmp_path):
    key = "filter_element:test-one:sg1:return"
    assert required_in_check(fleet, tmp_path)[key] == 1
    set_policy(fleet, "--company", "Brackwater Test Shipping", policy_file(tmp_path, SETS_2))
    assert required_in_check(fleet, tmp_path)[key] == 2
    zero = policy_file(tmp_path, '[policy]\nspare_filter_sets = 3\n', "override.toml")
    assert required_in_check(fleet, tmp_path, "--policy", zero)[key] == 3


def test_cover_lists_each_policy_in_force(fleet, tmp_path):
    set_policy(fleet, "--vessel", "TEST-ONE", policy_file(tmp_path, SETS_2))
    filter_sets(fleet, tmp_path)
    cover = list(openpyxl.load_workbook(tmp_path / "order.xlsx")["Cover"].iter_rows(values_only=True))
    policies = [r[1] for r in cover if r[0] == "Spares policy in force"]
    assert policies == ["Brackwater two sets (fleet database: fleet-2025, vessel policy from 2025-01-01): TEST-ONE",
                        "kit default (kit default spares policy): TEST-TWO"]
    assert [r[1] for r in cover if r[0] == "Oil packages bought"] == [
        "from the first vessel's policy, Brackwater two sets: pail 20 L, drum 208 L, IBC 1000 L"]


def test_show_prints_the_policy_and_the_basis_of_each_item(fleet, tmp_path):
    text = SETS_2 + '[[item]]\nkind = "seal_set"\nper = "actuator"\nquantity = 2\nbasis = "company policy"\n'
    set_policy(fleet, "--company", "Brackwater Test Shipping", policy_file(tmp_path, text))
    lines = fleet("policy", "show", "--vessel", "TEST-ONE").output.splitlines()
    assert lines[:3] == ["TEST-ONE: fleet-2025 (company policy from 2025-01-01), 90 days of cover",
                         "  policy: Brackwater two sets (fleet database: fleet-2025, company policy from 2025-01-01)",
                         "  spare filter element sets: 2; housing length: medium"]
    assert "  seal_set: 2 per actuator, seal_set; basis: company policy" in lines
    assert "  storage_oil: 1 per unit, oil in the fixed storage tank: one power actuating system including its " \
           "reservoir; basis: SOLAS II-1/29.12.3" in lines
    # set again on the same date without --file: the record is replaced, and kit's default is in force
    set_policy(fleet, "--company", "Brackwater Test Shipping")
    assert fleet("policy", "show", "--vessel", "TEST-ONE").output.splitlines()[1] == (
        "  policy: kit default (fleet database: fleet-2025, company policy from 2025-01-01; no content stored, so kit's default)")


@pytest.mark.parametrize("text, message", [
    ("[policy]\nspare_filter_sets = -1\n", "policy.spare_filter_sets: expected a whole number from 0 to 100 (got -1)"),
    ("[policy\n", "file: expected valid TOML (got "),
    ('[[item]]\nkind = "anchor"\nper = "unit"\nquantity = 1\nbasis = "company policy"\n', "].kind: expected one of seal_set, storage_oil"),
], ids=["value", "toml", "item"])
def test_bad_policy_file_is_refused_and_nothing_stored(fleet, tmp_path, text, message):
    bad = policy_file(tmp_path, text, "bad.toml")
    result = fleet("policy", "set", "--vessel", "TEST-ONE", "--name", "bad", "--days", "90", "--from", "2025-01-01",
                   "--file", bad)
    assert result.exit_code == 2
    assert result.output.startswith(f"kit: error: {bad}: ") and message in result.output
    assert len(result.output.strip().splitlines()) == 1
    assert fleet("policy", "show", "--vessel", "TEST-ONE").output.splitlines()[0] == (
        f"TEST-ONE: no spares policy in force on {dt.date.today().isoformat()}")


def test_missing_policy_file_is_one_line(fleet, tmp_path):
    missing = str(tmp_path / "nowhere.toml")
    result = fleet("policy", "set", "--vessel", "TEST-ONE", "--name", "x", "--days", "9", "--from", "2025-01-01", "--file", missing)
    assert (result.exit_code, result.output) == (
        2, f"kit: error: {missing}: file: expected a readable spares policy file (got No such file or directory)\n")


def test_bad_policy_stored_by_another_program_is_refused_by_bom_and_check(fleet, db_url, tmp_path):  # noqa: F811
    eng = make_engine(db_url)
    with eng.begin() as conn:
        conn.execute(insert(SparesPolicyRow.__table__).values(
            vessel_id="TEST-ONE", name="hand-written", cover_days=30, in_force_from=dt.date(2025, 2, 1),
            content='[policy]\nhousing_length = "huge"\n'))
    eng.dispose()
    expected = ("kit: error: fleet database: hand-written, vessel policy from 2025-02-01: policy.housing_length: "
                "expected one of short, medium, long (got 'huge')\n")
    bom = fleet("bom", "--days", "30", "--out", str(tmp_path / "o.xlsx"))
    assert (bom.exit_code, bom.output) == (2, expected)
    assert not (tmp_path / "o.xlsx").exists()
    check = fleet("check", "TEST-ONE", "--days", "30")
    assert (check.exit_code, check.output) == (2, expected)
    # a --policy file does not read the stored policy at all
    assert fleet("bom", "--days", "30", "--out", str(tmp_path / "o.xlsx"), "--policy",
                 policy_file(tmp_path, SETS_2)).exit_code == 0


def test_oil_packages_come_from_the_first_vessels_policy(fleet, tmp_path):
    drums = policy_file(tmp_path, '[policy]\nname = "drums only"\n[[oil.package]]\nname = "drum"\nvolume = "208 L"\n')
    out = tmp_path / "order.json"

    def packages():
        assert fleet("bom", "--days", "30", "--out", str(tmp_path / "o.xlsx"), "--json", str(out)).exit_code == 0
        return {p["pack"].split()[0] for oil in json.loads(out.read_text())["oil"] for p in oil["packs"] if p["count"]}

    set_policy(fleet, "--vessel", "TEST-TWO", drums)
    assert "pail" in packages()  # TEST-ONE, first by id, is under kit's default, which has pails
    set_policy(fleet, "--vessel", "TEST-ONE", drums)
    assert packages() == {"drum"}
