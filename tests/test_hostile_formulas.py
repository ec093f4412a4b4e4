# SPDX-License-Identifier: MIT
"""Formula injection: names that start with =, +, -, @, a tab or a carriage return end up as
plain text in every workbook and CSV kit writes (OWASP, "CSV Injection": those characters make a
spreadsheet program read a field as a formula)."""

from __future__ import annotations

import csv
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner

from db_support import TOML_CYLINDER
from kit.engine.bom import consolidate
from kit.engine.purchasing import Offer
from kit.files.bom_export import write_order_csv
from kit.cli import main
from kit.files.particulars_file import load_vessel
from kit.engine.requirements import assess_vessel
from kit.files.safe_text import TRIGGERS
from kit.files.sheets import Sheet, write_sheet
from kit.files.policy_file import load_policy

TRIGGERS_OWASP = ("=", "+", "-", "@", "\t", "\r")  # OWASP, "CSV Injection"
HOSTILE = {
    'name = "Test One"': 'name = "=HYPERLINK(\\"http://x.invalid\\",\\"click\\")"',
    'name = "Brackwater Test Shipping"': 'name = "@SUM(1+1)"',
    'id = "SG1"': 'id = "-2+3"',
    'fluid = "HM 46"': 'fluid = "HM 46"\npump_model = "+CMD|calc"',
    'change_interval = "2000 h"': 'change_interval = "2000 h"\nelement = "=E1*9"',
}
FRAGMENTS = ("HYPERLINK", "SUM(1+1)", "2+3", "CMD", "E1*9")


def test_kit_and_owasp_agree_on_the_triggers():
    assert TRIGGERS == TRIGGERS_OWASP


def formulas(path: Path) -> list[str]:
    """Every formula in a workbook, from its XML (what a spreadsheet program would evaluate)."""
    wb = openpyxl.load_workbook(path)
    out = []
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            out += [c.value for c in row if c.data_type == "f"]
    return out


def texts(path: Path) -> set[str]:
    wb = openpyxl.load_workbook(path)
    return {c.value for ws in wb.worksheets for row in ws.iter_rows() for c in row if c.data_type == "s"}


def csv_fields(path: Path) -> list[str]:
    with path.open(newline="", encoding="utf-8") as f:
        return [field for row in csv.reader(f) for field in row]


@pytest.fixture(scope="module")
def written(tmp_path_factory):
    """A hostile vessel loaded, stock at a hostile location, a hostile supplier's catalogue; then
    every workbook and CSV kit writes about it."""
    work = tmp_path_factory.mktemp("formulas")
    toml = TOML_CYLINDER
    for old, new in HOSTILE.items():
        assert old in toml
        toml = toml.replace(old, new, 1)
    particulars = work / "hostile.toml"
    particulars.write_text(toml)
    db = ["--db", str(work / "fleet.sqlite")]
    run = CliRunner()

    def ok(*args):
        done = run.invoke(main, [*args, *db] if args[0] not in ("template",) or args[1] == "stock" else list(args))
        assert done.exit_code in (0, 1), (args, done.output)

    ok("load", str(particulars))
    ok("parts", "register")
    ok("template", "stock", str(work / "blank.csv"))
    key = csv_fields(work / "blank.csv")[5]
    (work / "count.csv").write_text(f'part_key,location,quantity\n{key},"=HYPERLINK(""http://x.invalid"")",1\n')
    ok("stock", "import", str(work / "count.csv"), "--vessel", "TEST-ONE")
    (work / "cat.csv").write_text(f'supplier_ref,part_key,description,currency\n-SUM(1+1),{key},@SUM(1+1),EUR\n')
    ok("catalogue", "import", str(work / "cat.csv"), "--supplier", "=HYPERLINK(1)")
    ok("bom", "--days", "90", "--out", str(work / "bom.xlsx"), "--csv", str(work / "bom.csv"))
    ok("check", "TEST-ONE", "--days", "90", "--out", str(work / "check.xlsx"))
    ok("template", "stock", str(work / "stock.xlsx"), "--vessel", "TEST-ONE", "--days", "90")
    ok("template", "stock", str(work / "stock.csv"), "--vessel", "TEST-ONE", "--days", "90")
    ok("template", "particulars", str(work / "particulars.xlsx"), "--from", str(particulars))
    ok("template", "catalogue", str(work / "catalogue.xlsx"))
    ok("template", "catalogue", str(work / "catalogue.csv"))
    return work


@pytest.mark.parametrize("name", ["bom.xlsx", "check.xlsx", "stock.xlsx", "particulars.xlsx", "catalogue.xlsx"])
def test_no_hostile_text_becomes_a_formula(written, name):
    found = formulas(written / name)
    assert not [f for f in found if any(frag in f for frag in FRAGMENTS)], found


def test_hostile_text_is_kept_as_text(written):
    assert {"=HYPERLINK(1)", "-SUM(1+1)"} <= texts(written / "bom.xlsx")  # the supplier and its part number
    assert '=HYPERLINK("http://x.invalid")' in texts(written / "stock.xlsx")  # the location
    assert {'=HYPERLINK("http://x.invalid","click")', "+CMD|calc", "=E1*9", "-2+3"} <= texts(written / "particulars.xlsx")


@pytest.mark.parametrize("name", ["bom.csv", "stock.csv", "catalogue.csv"])
def test_no_csv_field_starts_with_a_trigger(written, name):
    fields = csv_fields(written / name)
    assert [f for f in fields if f.startswith(TRIGGERS_OWASP)] == []


def test_csv_keeps_the_text_behind_a_quote(written):
    assert "'=HYPERLINK(1)" in csv_fields(written / "bom.csv")
    assert "'=HYPERLINK(\"http://x.invalid\")" in csv_fields(written / "stock.csv")


def test_tab_and_carriage_return_too(tmp_path):
    """kit strips leading white space from what it reads, so a tab or CR can only come from
    within kit or from a row another program stored; the writers guard them anyway (a control
    character from the database becomes U+FFFD, see kit.files.safe_text)."""
    rows = [["\t=1+1", "\r=2+2", "@SUM(1)", "-3", "+4", "=5"]]
    write_sheet(tmp_path / "s.csv", Sheet("s", ["a", "b", "c", "d", "e", "f"], rows))
    write_sheet(tmp_path / "s.xlsx", Sheet("s", ["a", "b", "c", "d", "e", "f"], rows))
    assert [f for f in csv_fields(tmp_path / "s.csv") if f.startswith(TRIGGERS_OWASP)] == []
    assert formulas(tmp_path / "s.xlsx") == []
    result = assess_vessel(load_vessel(Path(__file__).resolve().parents[1] / "demo_fleet" / "corvina_bay.toml"), 90, load_policy())
    line = result.lines[0]
    order = consolidate([result], {}, {line.key: [Offer("\t=cmd", "\r=cmd", 1, "\t=1 pcs", 1.0, "EUR", 1)]})
    write_order_csv(order, tmp_path / "o.csv")
    assert {"\ufffd=cmd"} <= set(csv_fields(tmp_path / "o.csv"))
    assert [f for f in csv_fields(tmp_path / "o.csv") if f.startswith(TRIGGERS_OWASP)] == []
