# SPDX-License-Identifier: MIT
"""``kit demo``, ``kit bom`` and ``kit check`` end to end on SQLite, through the real imports."""

from __future__ import annotations

import csv
import json
import os
import subprocess
import sys
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner

from kit.cli import main

ROOT = Path(__file__).resolve().parents[1]


@pytest.fixture(scope="module")
def demo(tmp_path_factory):
    out = tmp_path_factory.mktemp("demo") / "kit-demo"
    result = CliRunner().invoke(main, ["demo", "--out", str(out)])
    assert result.exit_code == 0, result.output
    return out, result.output


def test_demo_writes_both_workbooks(demo):
    out, text = demo
    assert (out / "fleet-bom.xlsx").is_file() and (out / "corvina-bay-voyage-check.xlsx").is_file()
    assert str(out / "fleet-bom.xlsx") in text
    wb = openpyxl.load_workbook(out / "fleet-bom.xlsx")
    assert "Order lines" in wb.sheetnames
    vessels = {r[2] for r in wb["Vessel split"].iter_rows(min_row=2, values_only=True)}
    assert len(vessels) >= 6


def test_check_short_exits_1_with_table(demo):
    out, _ = demo
    db = str(out / "fleet.sqlite")
    result = CliRunner().invoke(main, ["check", "CORVINA-BAY", "--days", "120", "--db", db])
    assert result.exit_code == 1, result.output
    assert "short for a 120-day voyage" in result.output
    assert "filter element" in result.output


def test_check_nothing_short_exits_0(demo, tmp_path):
    out, _ = demo
    db = str(out / "fleet.sqlite")
    runner = CliRunner()
    # fill the stock to what the voyage needs, through the stock import, then check again
    assert runner.invoke(main, ["bom", "--db", db, "--vessel", "CORVINA-BAY", "--days", "120",
                                "--out", str(tmp_path / "c.xlsx"), "--json", str(tmp_path / "c.json")]).exit_code == 0
    data = json.loads((tmp_path / "c.json").read_text())
    stock = tmp_path / "fill.csv"
    with stock.open("w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["part_key", "quantity", "location"])
        for line in data["lines"]:
            w.writerow([line["part_key"], line["required"], "steering gear room"])
    imported = runner.invoke(main, ["stock", "import", str(stock), "--vessel", "CORVINA-BAY", "--db", db])
    assert imported.exit_code == 0, imported.output
    result = runner.invoke(main, ["check", "CORVINA-BAY", "--days", "120", "--db", db, "--out", str(tmp_path / "s.xlsx")])
    assert result.exit_code == 0, result.output
    assert "everything a 120-day voyage needs is on board" in result.output
    assert (tmp_path / "s.xlsx").is_file()


def test_bom_from_particulars_without_database(tmp_path):
    out = tmp_path / "newbuild.xlsx"
    result = CliRunner().invoke(main, ["bom", "--particulars", str(ROOT / "demo_fleet"), "--days", "0", "--out", str(out),
                                       "--csv", str(tmp_path / "nb.csv"), "--db", str(tmp_path / "unused.sqlite")])
    assert result.exit_code == 0, result.output
    rows = list(csv.DictReader((tmp_path / "nb.csv").open()))
    assert rows and all(float(r["on_board"]) == 0 for r in rows)
    assert all(float(r["to_order"]) == float(r["required"]) for r in rows)


def test_bom_from_particulars_finds_a_vessel_in_any_letter_case(tmp_path):
    out = tmp_path / "one.xlsx"
    result = CliRunner().invoke(main, ["bom", "--particulars", str(ROOT / "demo_fleet"), "--vessel", "corvina-bay", "--days", "90",
                                       "--out", str(out), "--json", str(tmp_path / "one.json")])
    assert result.exit_code == 0, result.output
    lines = json.loads((tmp_path / "one.json").read_text())["lines"]
    assert lines and {v for line in lines for v in line["vessels"]} == {"CORVINA-BAY"}


def test_bom_from_particulars_refuses_an_id_it_does_not_hold(tmp_path):
    out = tmp_path / "none.xlsx"
    result = CliRunner().invoke(main, ["bom", "--particulars", str(ROOT / "demo_fleet"), "--vessel", "CORVINA-BAY", "--vessel", "NO-SUCH",
                                       "--days", "90", "--out", str(out)])
    assert result.exit_code == 2 and len(result.output.splitlines()) == 1, result.output
    assert result.output.startswith(f"kit: error: {ROOT / 'demo_fleet'}: --vessel: expected the id of a vessel in these particulars")
    assert "CORVINA-BAY" in result.output and result.output.rstrip().endswith("(got 'NO-SUCH')")
    assert not out.exists()


def test_bom_unknown_vessel_is_exit_2(demo, tmp_path):
    out, _ = demo
    result = CliRunner().invoke(main, ["bom", "--db", str(out / "fleet.sqlite"), "--vessel", "NO-SUCH", "--out", str(tmp_path / "x.xlsx")])
    assert result.exit_code == 2
    assert "expected the id of a vessel in the fleet database" in result.output
    assert not (tmp_path / "x.xlsx").exists()


def test_readme_main_command_from_a_clean_folder(tmp_path):
    """The README's first command runs `kit demo`; run it as a process in an empty folder."""
    env = {k: v for k, v in os.environ.items() if k != "KIT_DB"}
    done = subprocess.run([sys.executable, "-m", "kit", "demo"], cwd=tmp_path, env=env, capture_output=True, text=True, timeout=300)
    assert done.returncode == 0, done.stderr
    assert (tmp_path / "kit-demo" / "fleet-bom.xlsx").is_file()
    assert (tmp_path / "kit-demo" / "corvina-bay-voyage-check.xlsx").is_file()
