# SPDX-License-Identifier: MIT
"""The new-build team's path: particulars as TOML or workbook (or a folder of both) into
``kit calc`` and ``kit bom --particulars`` with no database, and sister ships as a series of hulls
with the quantity per hull on every order line (:mod:`kit.engine.series_of_hulls`).

The ships are demo data (invented); the filter figures are the filter rule of
:mod:`kit.engine.filters` (change interval as the makers state it, common practice)."""

from __future__ import annotations

import csv
import datetime as dt
import json
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner

from kit.cli import main
from kit.engine.bom import consolidate
from kit.engine.particulars import vessel_from_dict
from kit.engine.requirements import assess_vessel
from kit.engine.series_of_hulls import HullSeries, find_series
from kit.files.policy_file import load_policy
from kit.files.toml_text import parse_toml
from tests.spreadsheet_program import recalculated_sheets

DEMO = Path(__file__).resolve().parents[1] / "demo_fleet"
CORVINA = (DEMO / "corvina_bay.toml").read_text()
DAY = dt.date.today()  # the day the order starts and the filter hours are read


def hull_text(n: int, text: str = CORVINA) -> str:
    """Corvina Bay's particulars as hull ``n`` of a new-build series: another id and name only."""
    return text.replace('id = "CORVINA-BAY"', f'id = "HULL-{n}"').replace('name = "Corvina Bay"', f'name = "Hull {n}"')


def hull(n: int, text: str = CORVINA):
    return vessel_from_dict(parse_toml(hull_text(n, text), f"hull{n}.toml"), f"hull{n}.toml")


def order_of(vessels, days=90, policies=None):
    policy = load_policy()
    return consolidate([assess_vessel(v, days, (policies or {}).get(v.id, policy), DAY) for v in vessels])


def run(*args):
    result = CliRunner().invoke(main, [str(a) for a in args])
    return result


# --- the one particulars reader -----------------------------------------------------------------

def test_calc_reads_the_particulars_workbook_as_the_toml_file(tmp_path):
    book = tmp_path / "corvina.xlsx"
    assert run("template", "particulars", book, "--from", DEMO / "corvina_bay.toml").exit_code == 0
    from_book = run("calc", book, "--days", "90", "--json")
    from_toml = run("calc", DEMO / "corvina_bay.toml", "--days", "90", "--json")
    assert from_book.exit_code == 0, from_book.output
    assert json.loads(from_book.output) == json.loads(from_toml.output)


def _mixed_folder(tmp_path: Path) -> Path:
    folder = tmp_path / "series"
    folder.mkdir()
    for n in (1, 2):
        (folder / f"hull{n}.toml").write_text(hull_text(n))
    (folder / "hull3.toml").write_text(hull_text(3))
    assert run("template", "particulars", folder / "hull3.xlsx", "--from", folder / "hull3.toml").exit_code == 0
    (folder / "hull3.toml").unlink()
    (folder / "notes.txt").write_text("not particulars")  # neither .toml nor .xlsx: left alone
    return folder


def test_bom_particulars_folder_of_toml_and_xlsx_makes_no_database(tmp_path, monkeypatch):
    data_home = tmp_path / "xdg"
    data_home.mkdir()
    monkeypatch.setenv("XDG_DATA_HOME", str(data_home))
    monkeypatch.delenv("KIT_DB", raising=False)
    folder = _mixed_folder(tmp_path)
    done = run("bom", "--particulars", folder, "--days", "90", "--out", tmp_path / "b.xlsx", "--csv", tmp_path / "b.csv",
               "--json", tmp_path / "b.json")
    assert done.exit_code == 0, done.output
    assert list(data_home.iterdir()) == []  # no database, not even kit's folder for one
    assert "series HULL-1: 3 hulls built alike (HULL-1, HULL-2, HULL-3); 14 line(s) give the quantity per hull" in done.output
    rows = list(csv.DictReader((tmp_path / "b.csv").open(encoding="utf-8")))
    single = order_of([hull(1)])
    assert len(rows) == len(single.lines) == 14  # each hull's own parts joined: not 14 + 2 x 3 lines
    by_key = {line.key: line for line in single.lines}
    for row in rows:
        one = by_key[row["part_key"]]
        assert (int(row["hulls"]), float(row["per_hull"])) == (3, pytest.approx(one.required, abs=1e-3))
        assert float(row["required"]) == pytest.approx(3 * one.required, abs=1e-3)
    doc = json.loads((tmp_path / "b.json").read_text())
    assert doc["series"] == [{"series": "HULL-1", "hulls": ["HULL-1", "HULL-2", "HULL-3"]}]
    assert all(line["hulls"] == 3 for line in doc["lines"])


def test_calc_opens_no_database(tmp_path, monkeypatch):
    data_home = tmp_path / "xdg"
    data_home.mkdir()
    monkeypatch.setenv("XDG_DATA_HOME", str(data_home))
    assert run("calc", DEMO / "corvina_bay.toml", "--days", "30").exit_code == 0
    assert list(data_home.iterdir()) == []


def test_a_vessel_id_in_a_toml_file_and_a_workbook_is_refused_naming_both(tmp_path):
    folder = _mixed_folder(tmp_path)
    (folder / "hull9.toml").write_text(hull_text(3))  # the workbook's vessel again
    out = tmp_path / "b.xlsx"
    done = run("bom", "--particulars", folder, "--days", "90", "--out", out)
    assert done.exit_code == 2
    assert done.output == (f"kit: error: {folder / 'hull9.toml'}: vessel.id: expected a vessel id no other file of this "
                           f"load has (also in {folder / 'hull3.xlsx'}) (got 'HULL-3')\n")
    assert not out.exists()
    db = tmp_path / "fleet.sqlite"
    loaded = run("load", folder, "--db", db)
    assert loaded.exit_code == 2 and "also in" in loaded.output and "hull3.xlsx" in loaded.output


def test_an_empty_folder_says_both_kinds(tmp_path):
    folder = tmp_path / "empty"
    folder.mkdir()
    done = run("bom", "--particulars", folder, "--days", "90", "--out", tmp_path / "b.xlsx")
    assert done.exit_code == 2
    assert done.output == f"kit: error: {folder}: folder: expected at least one *.toml or *.xlsx particulars file (got none)\n"


# --- series of hulls in the engine ---------------------------------------------------------------

def test_three_sister_ships_give_per_hull_a_third_of_every_line():
    order = order_of([hull(1), hull(2), hull(3)])
    single = {line.key: line for line in order_of([hull(1)]).lines}
    assert order.series == (HullSeries(("HULL-1", "HULL-2", "HULL-3")),)
    assert [line.key for line in order.lines] == list(single)
    for line in order.lines:
        assert line.hulls == 3 and line.per_hull == single[line.key].required
        assert line.required == pytest.approx(3 * line.per_hull, rel=1e-12)
        assert set(line.split) == {"HULL-1", "HULL-2", "HULL-3"}
    lines = {line.designation: line for line in order.lines}
    # 90 days x 24 h = 2160 h: ceil(2160 / 2000) = 2 changes + 1 spare set (kit default policy)
    assert lines["filter element, return filter, element Tarnwick RF-160-10"].per_hull == 3
    # the pressure filter has no maker's reference: each hull's own part, one line for the series;
    # ceil(2160 / 4000) = 1 change + 1 spare set
    own = lines["filter element, pressure filter, steering unit SG1, each hull of the HULL-1 series"]
    assert (own.per_hull, own.required) == (2, 6)


def test_a_fourth_ship_with_another_ram_is_not_of_the_series():
    odd = hull(4, CORVINA.replace('ram_diameter = "200 mm"', 'ram_diameter = "220 mm"'))
    order = order_of([hull(1), hull(2), hull(3), odd])
    assert order.series == (HullSeries(("HULL-1", "HULL-2", "HULL-3")),)
    rods = {line.designation: line for line in order.lines if line.kind == "rod_seal"}
    assert (rods["rod seal housing d 200 x D 225 x L 20"].hulls, rods["rod seal housing d 200 x D 225 x L 20"].per_hull) == (3, 1)
    four = rods["rod seal housing d 220 x D 245 x L 20"]
    assert (four.hulls, four.per_hull, four.required) == (None, None, 1)
    for line in order.lines:
        if "HULL-4" in line.split:  # shared with the odd ship, or its own: no per-hull figure
            assert line.hulls is None and line.per_hull is None
        else:
            assert line.hulls == 3 and line.required == pytest.approx(3 * line.per_hull)
    # the odd ship's own pressure filter element stays its own line, named after it
    assert any(line.designation == "filter element, pressure filter, steering unit SG1, vessel HULL-4" for line in order.lines)


def test_filter_hours_leave_the_series_and_blank_only_that_line():
    run_hull = CORVINA.replace('element = "Tarnwick RF-160-10"',
                               f'element = "Tarnwick RF-160-10"\nhours_since_change = "1500 h"\nhours_read_on = {DAY.isoformat()}')
    order = order_of([hull(1), hull(2, run_hull), hull(3)])
    assert order.series == (HullSeries(("HULL-1", "HULL-2", "HULL-3")),)
    ret = next(line for line in order.lines if line.designation.endswith("Tarnwick RF-160-10"))
    # HULL-2's element changes at 500 h, then every 2000 h: 1 change in 2160 h + 1 spare set = 2
    assert ret.split == {"HULL-1": 3, "HULL-2": 2, "HULL-3": 3} and (ret.hulls, ret.per_hull) == (None, None)
    assert all(line.hulls == 3 for line in order.lines if line is not ret)


def test_another_policy_or_gross_tonnage_is_another_series():
    from kit.engine.spares import policy_from_data

    two = policy_from_data({"policy": {"spare_filter_sets": 2}}, "company.toml")
    assert find_series([assess_vessel(v, 90, two if v.id == "HULL-3" else load_policy(), DAY)
                        for v in (hull(1), hull(2), hull(3))]) == [HullSeries(("HULL-1", "HULL-2"))]
    bigger = hull(3, CORVINA.replace("gross_tonnage = 7980", "gross_tonnage = 8100"))
    assert order_of([hull(1), hull(2), bigger]).series == (HullSeries(("HULL-1", "HULL-2")),)


def test_each_hulls_stock_counts_on_the_joined_line():
    results = [assess_vessel(v, 90, load_policy(), DAY) for v in (hull(1), hull(2), hull(3))]
    own = next(i.key for i in results[1].lines if i.role == "pressure")
    order = consolidate(results, on_board={("HULL-2", own): 1.0, ("HULL-1", "filter_element:hull-1:sg1:pressure"): 2.0})
    line = next(line for line in order.lines if line.key == "filter_element:hull-1:sg1:pressure")
    assert own == "filter_element:hull-2:sg1:pressure"
    assert (line.required, line.on_board, line.to_order) == (6, 3.0, 3.0)


# --- the workbook as a spreadsheet program computes it -----------------------------------------

def test_workbook_series_columns_after_recalculation(tmp_path):
    folder = _mixed_folder(tmp_path)
    out = tmp_path / "series.xlsx"
    assert run("bom", "--particulars", folder, "--days", "90", "--out", out).exit_code == 0
    single = {line.designation.replace("vessel HULL-1", "each hull of the HULL-1 series"): line for line in order_of([hull(1)]).lines}
    head = [c.value for c in next(openpyxl.load_workbook(out, read_only=True)["Order lines"].iter_rows(max_row=1))]
    assert head[head.index("Required"):head.index("Required") + 3] == ["Required", "Per hull", "Hulls"]
    sheets = recalculated_sheets(out, tmp_path)
    rows = sheets["Order lines"]
    col = {name: i for i, name in enumerate(rows[0])}
    assert len(rows) - 1 == len(single)
    for row in rows[1:]:
        one = single[row[col["Designation"]]]
        assert int(row[col["Hulls"]]) == 3
        assert float(row[col["Per hull"]]) == pytest.approx(one.required, abs=1e-3)
        assert float(row[col["Required"]]) == pytest.approx(3 * one.required, abs=3e-3)
        assert float(row[col["To order"]]) == pytest.approx(3 * one.required, abs=3e-3)  # nothing on board
    cover = {r[0]: r[1] for r in sheets["Cover"] if r and r[0]}
    assert cover["Series of hulls"] == "the HULL-1 series, 3 hulls built alike: Hull 1 (HULL-1), Hull 2 (HULL-2), Hull 3 (HULL-3)"
    split = [r for r in sheets["Vessel split"][1:] if r]
    assert len(split) == 3 * len(single)  # the split per vessel stays
