# SPDX-License-Identifier: MIT
"""The chief engineer's count (issue 14): a vessel's count sheet, filled in part and imported;
another vessel's sheet refused; oil only topped up counted; filter hours recorded; the print set-up."""

from __future__ import annotations

import datetime as dt
import re
import shutil
import subprocess
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner
from sqlalchemy import select

from catalog_schema.core_tables import FILTER_COUNTS
from db_support import TOML_CYLINDER, db_url, dump, engine  # noqa: F401  (fixtures)
from kit.cli import main
from kit.engine.parts import part_key
from kit.files.stock_sheet import COUNT_COLUMNS, FILTER_COLUMNS
from kit.services.orders import build_order, check_voyage
from spreadsheet_program import soffice
from test_db_imports import stock_rows

# A second unit on TEST-ONE that is only topped up: not steering, so it has no storage-tank line.
TOPPED_UP = '''
[[unit]]
id = "RAMP"
service = "stern ramp"
actuator = "cylinder"
count = 2
bore = "125 mm"
rod = "70 mm"
stroke = "900 mm"
working_pressure = "200 bar"
fluid = "HV 32"
pumps = 1
pump_flow = "60 L/min"
reservoir = "200 L"
oil_leakage = "0.4 L/day"
'''
HV32 = part_key("oil", {}, "HV 32")


@pytest.fixture
def fleet(engine, tmp_path):
    """TEST-ONE (a steering gear and a stern ramp only topped up) and TEST-TWO (the steering gear),
    loaded and their parts registered as the README's set-up does."""
    (tmp_path / "one.toml").write_text(TOML_CYLINDER + TOPPED_UP)
    (tmp_path / "two.toml").write_text(TOML_CYLINDER.replace("TEST-ONE", "TEST-TWO"))
    url = engine.url.render_as_string(hide_password=False)

    def kit(*args):
        return CliRunner().invoke(main, [*map(str, args), "--db", url])

    for name in ("one.toml", "two.toml"):
        assert kit("load", tmp_path / name).exit_code == 0
    done = kit("parts", "register")
    assert done.exit_code == 0, done.output
    engine.kit = kit
    return engine


def sheet_rows(path: Path, sheet: str = "stock") -> list[dict]:
    ws = openpyxl.load_workbook(path)[sheet]
    head = [c.value for c in ws[1]]
    return [dict(zip(head, (c.value for c in row))) for row in ws.iter_rows(min_row=2)]


def fill(path: Path, counted: dict, hours: dict | None = None) -> None:
    """Type counts into the sheet by part key (the first row of each) and hours by (unit, position)."""
    wb = openpyxl.load_workbook(path)
    ws = wb["stock"]
    head = {c.value: c.column for c in ws[1]}
    for r in range(2, ws.max_row + 1):
        key = ws.cell(r, head["part_key"]).value
        if key in counted:
            ws.cell(r, head["counted"]).value = counted.pop(key)
    ws = wb["filter_hours"]
    head = {c.value: c.column for c in ws[1]}
    for r in range(2, ws.max_row + 1):
        place = (ws.cell(r, head["unit"]).value, ws.cell(r, head["position"]).value)
        if hours and place in hours:
            value, day = hours[place]
            ws.cell(r, head["hours_since_change"]).value = value
            ws.cell(r, head["counted_on"]).value = day
    wb.save(path)


def test_count_round_trip_imports_what_was_counted_and_lists_the_rest(fleet, tmp_path):
    out = tmp_path / "count.xlsx"
    done = fleet.kit("template", "stock", out, "--vessel", "TEST-ONE", "--days", "60")
    assert done.exit_code == 0, done.output
    rows = sheet_rows(out)
    assert [c.value for c in openpyxl.load_workbook(out)["stock"][1]] == list(COUNT_COLUMNS)
    assert {r["vessel"] for r in rows} == {"TEST-ONE"}
    keys = [r["part_key"] for r in rows]
    # its own parts only: none of TEST-TWO's vessel-specific parts (filter element, valve seal kit ...)
    assert keys and not [k for k in keys if "test-two" in k]
    assert any("test-one" in k for k in keys) and HV32 in keys
    assert all(r["counted"] is None for r in rows) and all(r["uom"] in ("pcs", "L") for r in rows)
    counted = {keys[0]: 3, keys[2]: 0, HV32: 30}
    fill(out, dict(counted))
    done = fleet.kit("stock", "import", out)  # the vessel comes from the file
    assert done.exit_code == 0, done.output
    lines = done.output.splitlines()
    assert lines[0] == "TEST-ONE: 3 stock row(s) written (count)"
    blank = [r for r in rows if r["part_key"] not in counted]
    assert lines[1] == f"{len(blank) + 1} row(s) not counted (left as they were):"  # + the filter position
    assert lines[2] == f"  {out}, sheet stock, row {keys.index(blank[0]['part_key']) + 2}: {blank[0]['designation']}"
    assert lines[-1] == f"  {out}, sheet filter_hours, row 2: unit SG1, return filter hours"
    assert stock_rows(fleet, "TEST-ONE") == {(k, "unassigned"): float(q) for k, q in counted.items()}
    with fleet.connect() as conn:
        from catalog_schema.core_tables import STOCK

        days = {r.counted_on for r in conn.execute(select(STOCK.c.counted_on))}
    assert days == {dt.date.today()}  # a blank counted_on in a count sheet is the day of the import


def test_top_up_only_oil_is_registered_counted_and_on_board_in_the_order(fleet, tmp_path):
    out = tmp_path / "count.csv"
    assert fleet.kit("template", "stock", out, "--vessel", "TEST-ONE", "--days", "60").exit_code == 0
    text = out.read_text(encoding="utf-8").splitlines()
    assert text[0] == ",".join(COUNT_COLUMNS)
    oil = next(line.split(",") for line in text if HV32 in line)
    # 2 x 0.4 L/day? no: the leakage is the unit's, 0.4 L/day x 60 days = 24 L (leakage rate x period)
    assert oil[1] == "L" and float(oil[3]) == pytest.approx(0.4 * 60)
    oil[6] = "30"
    out.write_text("\n".join([text[0], ",".join(oil)]) + "\n", encoding="utf-8")
    done = fleet.kit("stock", "import", out, "--vessel", "TEST-ONE")
    assert done.exit_code == 0, done.output
    order, _ = build_order(fleet, ["TEST-ONE"], 60)
    line = next(li for li in order.lines if li.key == HV32)
    assert line.on_board == 30.0 and line.required == pytest.approx(24.0)


def test_another_vessels_sheet_is_refused_in_both_modes(fleet, tmp_path):
    out = tmp_path / "two.xlsx"
    assert fleet.kit("template", "stock", out, "--vessel", "TEST-TWO", "--days", "60").exit_code == 0
    fill(out, {sheet_rows(out)[0]["part_key"]: 1})
    before = dump(fleet)
    for mode in ("count", "adjust"):
        done = fleet.kit("stock", "import", out, "--vessel", "TEST-ONE", "--mode", mode)
        assert done.exit_code == 2
        assert done.output == (f"kit: error: {out}, sheet stock, row 2: column vessel: expected 'TEST-ONE', the vessel of "
                               "this import (this file was made for another vessel) (got 'TEST-TWO')\n")
    assert dump(fleet) == before


def test_a_file_naming_no_vessel_needs_one(fleet, tmp_path):
    path = tmp_path / "old.csv"
    path.write_text(f"part_key,designation,location,quantity,counted_on\n{HV32},,,5,\n", encoding="utf-8")
    before = dump(fleet)
    done = fleet.kit("stock", "import", path)
    assert done.exit_code == 2
    assert done.output == (f"kit: error: {path}: --vessel: expected the vessel's id: the file names none (a vessel's "
                           "own count sheet does), so give it (got none)\n")
    assert dump(fleet) == before
    assert fleet.kit("stock", "import", path, "--vessel", "TEST-ONE").exit_code == 0  # the old sheet still works
    assert stock_rows(fleet, "TEST-ONE") == {(HV32, "unassigned"): 5.0}


def test_template_of_a_vessel_needs_the_voyage(fleet, tmp_path):
    done = fleet.kit("template", "stock", tmp_path / "c.xlsx", "--vessel", "TEST-ONE")
    assert done.exit_code == 2
    assert done.output == ("kit: error: kit template stock: --days: expected a number of days (no spares policy with days "
                           "of cover is in force for TEST-ONE; kit policy set records one)\n")
    assert not (tmp_path / "c.xlsx").exists()


def test_filter_hours_from_the_count_are_stored_and_the_newer_figure_wins(fleet, tmp_path):
    out = tmp_path / "count.xlsx"
    assert fleet.kit("template", "stock", out, "--vessel", "TEST-ONE", "--days", "60").exit_code == 0
    assert [c.value for c in openpyxl.load_workbook(out)["filter_hours"][1]] == list(FILTER_COLUMNS)
    today = dt.date.today()
    fill(out, {}, {("SG1", "return"): (700, today)})
    done = fleet.kit("stock", "import", out)
    assert done.exit_code == 0 and "running hours of 1 filter position(s)" in done.output
    with fleet.connect() as conn:
        assert conn.execute(select(FILTER_COUNTS)).all() == [("TEST-ONE", "SG1", "return", 700 * 3600.0, today)]
    # 60 days x 24 h = 1440 h; change interval 2000 h (maker's interval); 700 h run: the first change
    # is due at 2000 - 700 = 1300 h, within the voyage, the next at 3300 h, after it: 1 change
    # (kit.engine.filters: 1 + floor((R - (I - h)) / I)), + 1 spare set (common practice) = 2 elements.
    check = check_voyage(fleet, "TEST-ONE", 60)
    need = {li.key: li for li in check.short.lines}
    element = part_key("filter_element", {}, "TEST-ONE:SG1:return")
    assert need[element].required == 2
    # An older reading (a week ago, 100 h) is kept out: the newer count stays.
    fill(out, {}, {("SG1", "return"): (100, today - dt.timedelta(days=7))})
    assert fleet.kit("stock", "import", out).exit_code == 0
    with fleet.connect() as conn:
        assert conn.execute(select(FILTER_COUNTS.c.run_since_change)).scalar_one() == 700 * 3600.0
    # A count read newer than the particulars' figure wins; the particulars' newer figure wins over the count.
    toml = tmp_path / "one.toml"
    toml.write_text((TOML_CYLINDER + TOPPED_UP).replace('change_interval = "2000 h"\n', 'change_interval = "2000 h"\n'
                    f'hours_since_change = "1900 h"\nhours_read_on = {today - dt.timedelta(days=3)}\n'))
    assert fleet.kit("load", toml).exit_code == 0
    assert check_voyage(fleet, "TEST-ONE", 60).short.lines  # the count (today, 700 h) is newer: still 2 elements
    assert {li.key: li.required for li in check_voyage(fleet, "TEST-ONE", 60).short.lines}[element] == 2
    toml.write_text((TOML_CYLINDER + TOPPED_UP).replace('change_interval = "2000 h"\n', 'change_interval = "2000 h"\n'
                    f'hours_since_change = "1900 h"\nhours_read_on = {today}\n'))
    with fleet.begin() as conn:
        conn.execute(FILTER_COUNTS.update().values(counted_on=today - dt.timedelta(days=1)))
    assert fleet.kit("load", toml).exit_code == 0
    # 1900 h read today: first change at 100 h, the next at 2100 h, after 1440 h: 1 change... and
    # 1 + floor((1440 - 100) / 2000) = 1, + 1 spare set = 2; at 90 days (2160 h): 1 + floor(2060 / 2000) = 2, + 1 = 3.
    assert {li.key: li.required for li in check_voyage(fleet, "TEST-ONE", 90).short.lines}[element] == 3


def _word_heights(pdf: Path) -> list[list[float]]:
    """Per page, the height of every word box pdftotext finds (about the printed font size)."""
    html = subprocess.run(["pdftotext", "-bbox", str(pdf), "-"], check=True, capture_output=True, text=True).stdout
    return [[float(b) - float(a) for a, b in re.findall(r'yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)"', page)]
            for page in html.split("<page ")[1:]]


def test_count_sheet_prints_on_a4_with_header_footer_and_readable_text(fleet, tmp_path):
    out = tmp_path / "count.xlsx"
    assert fleet.kit("template", "stock", out, "--vessel", "TEST-ONE", "--days", "60").exit_code == 0
    wb = openpyxl.load_workbook(out)
    for name in ("stock", "filter_hours"):
        ws = wb[name]
        # ECMA-376 Part 1, 18.3.1.63 (pageSetup): paperSize 9 is A4 paper (210 mm by 297 mm)
        assert int(ws.page_setup.paperSize) == 9 and ws.page_setup.orientation == "portrait"
        assert ws.sheet_properties.pageSetUpPr.fitToPage and ws.page_setup.fitToWidth == 1 and ws.page_setup.fitToHeight == 0
        assert ws.print_title_rows == "$1:$1"
        assert ws.print_area == f"'{name}'!$A$1:$H${ws.max_row}"  # part_key and vessel outside it
        assert "Test One (TEST-ONE)" in ws.oddHeader.left.text and dt.date.today().isoformat() in ws.oddHeader.right.text
        assert ws.oddFooter.right.text == "page &P of &N"
        assert all(ws.cell(2, c).font.sz >= 9 for c in range(1, 9))
    exe = soffice()
    if not shutil.which("pdftotext"):
        pytest.fail("pdftotext (poppler-utils) is needed to measure the printed page")
    profile = (tmp_path / "lo-profile").resolve().as_uri()
    subprocess.run([exe, f"-env:UserInstallation={profile}", "--headless", "--convert-to", "pdf", "--outdir", str(tmp_path),
                    str(out)], check=True, capture_output=True, timeout=180)
    pdf = tmp_path / "count.pdf"
    info = subprocess.run(["pdfinfo", str(pdf)], check=True, capture_output=True, text=True).stdout
    # ISO 216: A4 is 210 x 297 mm = 595.3 x 841.9 pt
    assert re.search(r"Page size:\s+595\.\d+ x 841\.\d+ pts", info), info
    pages = int(re.search(r"Pages:\s+(\d+)", info).group(1))
    assert pages == 3  # the stock sheet, the filter hours and the notes, a page each
    text = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], check=True, capture_output=True, text=True).stdout
    assert "page 1 of 3" in text and "Stock count: Test One (TEST-ONE)" in text and "counted" in text
    assert HV32 not in text  # the key column stays off the page
    # A word box of 9 pt Liberation Sans (the footer) is 8.96 pt high: no printed text below 9 pt.
    assert min(min(h) for h in _word_heights(pdf)) >= 8.9
