# SPDX-License-Identifier: MIT
"""The pre-voyage check's own workbook and words, terminal tables at 80 and 160 columns, and what
``kit bom`` ends with; on the demo fleet (SQLite), through the commands."""

from __future__ import annotations

import csv
import json
import re
import subprocess
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner

from catalog_schema.engine import make_engine
from db_support import TOML_CYLINDER
from kit.cli import main
from kit.engine.preflight import shortfall_rows
from kit.safety import SAFETY
from kit.services.orders import check_voyage
from spreadsheet_program import recalculated_sheets, soffice

ROOT = Path(__file__).resolve().parents[1]
DAYS = 120
SEAL_KINDS = {"piston_seal", "rod_seal", "stock_seal", "wiper", "guide_ring", "o_ring", "o_ring_cord", "vane_strip"}


def run(*args, width: int = 80):
    return CliRunner().invoke(main, [str(a) for a in args], env={"COLUMNS": str(width)})


@pytest.fixture(scope="module")
def demo(tmp_path_factory):
    out = tmp_path_factory.mktemp("glance") / "kit-demo"
    assert run("demo", "--out", out).exit_code == 0
    return out


@pytest.fixture(scope="module")
def corvina_order(demo, tmp_path_factory):
    """CORVINA-BAY's own order over the voyage, as ``kit bom --json`` writes it: the lines short
    are those with something to order (an independent path from the check's)."""
    work = tmp_path_factory.mktemp("order")
    done = run("bom", "--vessel", "CORVINA-BAY", "--days", DAYS, "--db", demo / "fleet.sqlite",
               "--out", work / "o.xlsx", "--json", work / "o.json")
    assert done.exit_code == 0, done.output
    return json.loads((work / "o.json").read_text())


def short_lines(order: dict) -> list[dict]:
    return [line for line in order["lines"] if line["to_order"] > 0]


def kind(line: dict) -> str:
    return line["part_key"].split(":")[0]


# --- the terminal ----------------------------------------------------------------------------

def test_check_says_what_is_short_and_what_exit_1_means(demo, corvina_order):
    done = run("check", "corvina-bay", "--days", DAYS, "--db", demo / "fleet.sqlite", width=200)
    assert done.exit_code == 1
    short = short_lines(corvina_order)
    words = []
    for label, kinds in (("seal", SEAL_KINDS), ("filter element", {"filter_element"}), ("spare part", {"spare"})):
        found = [line for line in short if kind(line) in kinds]
        if found:
            n = sum(line["to_order"] for line in found)
            words.append(f"{n:g} {label}{'' if n == 1 else 's'} ({len(found)} line{'' if len(found) == 1 else 's'})")
    words += [f"{line['to_order']:,.1f} L of {line['designation'].split(',')[0]}" for line in short if kind(line) == "oil"]
    assert words  # the demo's stock is short for this voyage
    lines = done.output.splitlines()
    assert lines[-2:] == [f"Corvina Bay (CORVINA-BAY) is short for a {DAYS}-day voyage: " + "; ".join(words) + ".",
                          "Exit status 1 means something is short (0: nothing short; 2: bad input), for scripts."]


def table_rows(text: str) -> list[list[str]]:
    return [[c.strip() for c in line.split("│")[1:-1]] for line in text.splitlines() if line.startswith("│")]


def test_check_table_at_80_and_240_columns(demo, corvina_order):
    db = demo / "fleet.sqlite"
    narrow, wide = run("check", "CORVINA-BAY", "--days", DAYS, "--db", db), run("check", "CORVINA-BAY", "--days", DAYS, "--db", db, width=240)
    assert all(len(line) <= 80 for line in narrow.output.splitlines()), narrow.output
    assert "left out at 80 columns: basis" in narrow.output and "left out" not in wide.output
    short = short_lines(corvina_order)
    # at 240 columns (designations name the valve block maker and model) each line of the shortfall is one row of the table, its part whole
    rows = table_rows(wide.output)
    assert [r[1] for r in rows] == [line["designation"].split(",")[0] if kind(line) == "oil" else line["designation"] for line in short]
    assert [float(r[5].replace(",", "")) for r in rows] == [round(line["to_order"], 1) for line in short]
    # at 80, no row takes more than two lines: the part column is wide enough for whole phrases
    assert len(table_rows(narrow.output)) <= 2 * len(short)


@pytest.mark.parametrize("vessel", sorted(p.name for p in (ROOT / "demo_fleet").glob("*.toml")))
def test_calc_tables_fit_80_columns_with_whole_words(vessel):
    path = ROOT / "demo_fleet" / vessel
    narrow, wide = run("calc", path, "--days", "90"), run("calc", path, "--days", "90", width=160)
    assert narrow.exit_code == wide.exit_code == 0
    assert all(len(line) <= 80 for line in narrow.output.splitlines()), narrow.output
    assert all(len(line) <= 160 for line in wide.output.splitlines())
    report = json.loads(run("calc", path, "--days", "90", "--json").output)
    text = narrow.output
    # every word of every requirement line's designation and compound is printed whole somewhere
    words = {w for li in report["lines"] for w in f"{li['designation']} {li['compound']}".split()}
    cut = sorted(w for w in words if w not in text.split() and w.rstrip(",") not in text)
    assert not cut, cut
    # the requirement list: no row wraps over more than three lines (it took eight at 80 columns before)
    body = text[text.index("Requirement list"):]
    assert len(table_rows(body)) <= 3 * len(report["lines"])


# --- kit bom's closing lines -----------------------------------------------------------------

def test_bom_ends_with_totals_and_missing_prices(demo, tmp_path):
    out = tmp_path / "fleet.xlsx"
    done = run("bom", "--db", demo / "fleet.sqlite", "--days", "90", "--out", out, "--csv", tmp_path / "fleet.csv")
    assert done.exit_code == 0, done.output
    rows = list(csv.DictReader((tmp_path / "fleet.csv").open(newline="")))
    to_order = [r for r in rows if float(r["to_order"]) > 0]
    unpriced = [r for r in to_order if not r["line_total"]]  # an oil line is priced by its plan, not one pack
    kinds = ", ".join(dict.fromkeys(r["part_key"].split(":")[0].replace("_", " ") for r in unpriced))
    # the totals the workbook's cover formulas give when LibreOffice recalculates them
    cover = {r[0]: r[1] for r in recalculated_sheets(out, tmp_path)["Cover"] if len(r) > 1}
    totals = {m.group(1): float(v) for k, v in cover.items() if (m := re.fullmatch(r"Total of priced lines \[(\w+)\]", k))}
    assert totals  # the demo catalogue is priced in one currency
    assert done.output.splitlines()[-3:] == [
        f"{len(rows)} order line(s) for 6 vessel(s), {len(to_order)} with something to order",
        "total of priced lines: " + "; ".join(f"{totals[c]:,.2f} {c}" for c in sorted(totals)),
        f"warning: {len(unpriced)} of the {len(to_order)} line(s) to order have no catalogue price ({kinds})",
    ]


def test_bom_warns_of_each_rule_not_met(tmp_path):
    # pumps far too small to swing the rudder from 35 deg to 30 deg within 28 s (SOLAS II-1/29.3.2)
    slow = tmp_path / "slow.toml"
    slow.write_text(TOML_CYLINDER.replace('pump_flow = "40 L/min"', 'pump_flow = "4 L/min"'))
    report = json.loads(run("calc", slow, "--days", "30", "--json").output)
    failed = [(u["id"], r["clause"]) for u in report["units"] for r in u["rules"] if r["verdict"] == "not met"]
    assert ("SG1", "SOLAS II-1/29.3.2") in failed
    done = run("bom", "--particulars", slow, "--days", "30", "--out", tmp_path / "b.xlsx")
    assert done.exit_code == 0
    assert [line for line in done.output.splitlines() if "not met" in line] == [
        f"warning: TEST-ONE unit {unit}: {clause} not met (see the Gear checks sheet)" for unit, clause in failed]


# --- the check workbook ----------------------------------------------------------------------

@pytest.fixture(scope="module")
def check_book(demo, tmp_path_factory):
    work = tmp_path_factory.mktemp("check")
    done = run("check", "CORVINA-BAY", "--days", DAYS, "--db", demo / "fleet.sqlite", "--out", work / "check.xlsx")
    assert done.exit_code == 1
    return work / "check.xlsx"


def section(rows: list[tuple], heading: str) -> list[tuple]:
    """The rows of the table under ``heading`` (after its header row, up to the next blank row)."""
    start = next(i for i, r in enumerate(rows) if r[0] == heading) + 2
    end = next((i for i in range(start, len(rows)) if rows[i][0] is None), len(rows))
    return rows[start:end]


def test_check_workbook_title_and_shortfall_rows(demo, check_book, corvina_order):
    wb = openpyxl.load_workbook(check_book)
    assert wb.sheetnames == ["Pre-voyage check"]
    rows = [r[:7] for r in wb["Pre-voyage check"].iter_rows(values_only=True)]
    assert rows[0][0] == "Pre-voyage check: Corvina Bay (CORVINA-BAY)"
    assert rows[2][0].startswith(f"Voyage: {DAYS} days.") and rows[3][0].startswith(
        "Spares policy: kit default (fleet database: demo fleet policy, company policy from 2026-01-01")
    shortfall = section(rows, "1. Shortfall")
    engine = make_engine(f"sqlite:///{demo / 'fleet.sqlite'}")
    try:
        engine_rows = shortfall_rows(check_voyage(engine, "CORVINA-BAY", DAYS).short)
    finally:
        engine.dispose()
    assert [(r[0], r[1], r[2], r[3], r[4], r[6]) for r in shortfall] == [
        (e.part, e.uom, round(e.needed, 3), round(e.on_board, 3), round(e.short, 3), e.key) for e in engine_rows]
    assert [(r[6], r[4]) for r in shortfall] == [(line["part_key"], round(line["to_order"], 3)) for line in short_lines(corvina_order)]
    # what the check covered: every oil and filter element line, short or not, as the order has them
    covered = section(rows, "4. Filter elements covered") + section(rows, "3. Oil covered (storage tank and top-up, per fluid)")
    expected = [line for line in corvina_order["lines"] if kind(line) in ("filter_element", "oil")]
    assert sorted((r[6], r[2], r[3]) for r in covered) == sorted(
        (line["part_key"], round(line["required"], 3), round(line["on_board"], 3)) for line in expected)
    oil = section(rows, f"2. Oil of each unit (top-up over {DAYS} days)")
    assert [r[0] for r in oil] == ["unit SG1: HM 46"] and oil[0][2] >= oil[0][3] > 0  # storage tank = one system's charge
    text = " ".join(str(r[0]) for r in rows if r[0])
    assert " ".join(SAFETY.split()) in text


def pdf_of(book: Path) -> Path:
    out = book.parent / "pdf"
    profile = (book.parent / "lo-profile").resolve().as_uri()
    subprocess.run([soffice(), f"-env:UserInstallation={profile}", "--headless", "--convert-to", "pdf", "--outdir", str(out),
                    str(book)], check=True, capture_output=True, timeout=180)
    return out / f"{book.stem}.pdf"


def test_check_workbook_prints_on_one_a4_page_at_a_readable_size(check_book):
    pdf = pdf_of(check_book)
    info = subprocess.run(["pdfinfo", str(pdf)], capture_output=True, text=True, check=True).stdout
    assert re.search(r"^Pages:\s+1$", info, re.M), info
    # A4 is 210 mm x 297 mm (ISO 216), 595.3 pt x 841.9 pt
    width, height = map(float, re.search(r"^Page size:\s+([\d.]+) x ([\d.]+) pts", info, re.M).groups())
    assert (round(width), round(height)) == (595, 842)
    # The printed scale: how far apart two headings print against the row heights between them
    # in the sheet (points). The body is set at 10 pt; printed text under about 8.5 pt is hard to
    # read at arm's length (common practice).
    boxes = subprocess.run(["pdftotext", "-bbox", str(pdf), "-"], capture_output=True, text=True, check=True).stdout
    tops = {word: float(y) for y, word in re.findall(r'yMin="([\d.]+)" xMax="[\d.]+" yMax="[\d.]+">([^<]*)<', boxes)
            if word in ("1.", "2.")}
    ws = openpyxl.load_workbook(check_book).active
    first, second = (next(r for r in range(1, ws.max_row + 1) if str(ws.cell(r, 1).value).startswith(h)) for h in ("1. ", "2. "))
    scale = (tops["2."] - tops["1."]) / sum(ws.row_dimensions[r].height for r in range(first, second))
    assert 10 * scale >= 8.5, scale
    assert scale <= 1.0001  # fitted to the width, never enlarged
    text = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True, check=True).stdout
    assert f"Pre-voyage check: Corvina Bay (CORVINA-BAY), {DAYS} days" in text  # the page header
    assert "page 1 of 1" in text  # the footer
    assert "1. Shortfall" in text and "4. Filter elements covered" in text and "CAUTION" in text
    assert "Part key" not in text  # the keys lie outside the print area


def test_nothing_short_check_says_so(demo, tmp_path, corvina_order):
    db = demo.parent / "filled.sqlite"
    db.write_bytes((demo / "fleet.sqlite").read_bytes())
    fill = tmp_path / "fill.csv"
    with fill.open("w", newline="") as f:
        csv.writer(f).writerows([["part_key", "quantity", "location"]]
                                + [[line["part_key"], line["required"], "hold"] for line in corvina_order["lines"]])
    assert run("stock", "import", fill, "--vessel", "CORVINA-BAY", "--db", db).exit_code == 0
    done = run("check", "Corvina-Bay", "--days", DAYS, "--db", db, "--out", tmp_path / "ok.xlsx", width=200)
    assert done.exit_code == 0
    assert done.output.splitlines()[0] == (f"Corvina Bay (CORVINA-BAY): everything a {DAYS}-day voyage needs is on board; "
                                           "nothing is short (exit status 0)")
    rows = list(openpyxl.load_workbook(tmp_path / "ok.xlsx")["Pre-voyage check"].iter_rows(values_only=True))
    assert f"Nothing short: everything a {DAYS}-day voyage needs is on board." in [r[0] for r in rows[:8]]
    start = next(i for i, r in enumerate(rows) if r[0] == "1. Shortfall")
    assert rows[start + 2][0] == "Nothing short."


@pytest.mark.parametrize("vessel, name", [("QUARRENBY-RIDGE", "Quarrenby Ridge"), ("OXBOW-LANTERN", "Oxbow Lantern")])
def test_a_long_check_keeps_headings_with_their_rows_and_the_caution_whole(tmp_path, vessel, name):
    db = tmp_path / "fleet.sqlite"
    assert run("load", ROOT / "demo_fleet", "--db", db).exit_code == 0  # no stock: every line is short
    book = tmp_path / "long.xlsx"
    assert run("check", vessel, "--days", "180", "--db", db, "--out", book).exit_code == 1
    pdf = pdf_of(book)
    pages = int(re.search(r"^Pages:\s+(\d+)$", subprocess.run(["pdfinfo", str(pdf)], capture_output=True, text=True).stdout, re.M)[1])
    assert pages >= 2
    rows = [r for r in openpyxl.load_workbook(book).active.iter_rows(values_only=True)]
    for n in range(1, pages + 1):
        page = subprocess.run(["pdftotext", "-layout", "-f", str(n), "-l", str(n), str(pdf), "-"],
                              capture_output=True, text=True, check=True).stdout
        assert f"page {n} of {pages}" in page and f"Pre-voyage check: {name} ({vessel}), 180 days" in page
        # the notes and the caution on one page, not split over two
        assert ("Needed: what the voyage needs" in page) == ("kit's figures are a planning aid" in page)
        for i, r in enumerate(rows):
            if r[0] and re.match(r"\d\. ", str(r[0])) and r[0] in page:
                first_row = str(rows[i + 2][0]).split()[0]  # heading, header row, then the first row
                assert first_row in page[page.index(r[0]):], (n, r[0])


def test_an_ampersand_in_the_vessel_name_prints_in_the_page_header(tmp_path):
    # "&" starts a code in a page header, "&&" prints one "&" (ECMA-376 Part 1, oddHeader; from memory,
    # checked here by the LibreOffice render)
    path = tmp_path / "amp.toml"
    path.write_text(TOML_CYLINDER.replace('name = "Test One"', 'name = "Brack & Sons &P"'))
    db = tmp_path / "fleet.sqlite"
    assert run("load", path, "--db", db).exit_code == 0
    book = tmp_path / "amp.xlsx"
    assert run("check", "test-one", "--days", "30", "--db", db, "--out", book).exit_code == 1
    header = openpyxl.load_workbook(book).active.oddHeader.left.text
    assert header == "Pre-voyage check: Brack && Sons &&P (TEST-ONE), 30 days"
    text = subprocess.run(["pdftotext", "-layout", str(pdf_of(book)), "-"], capture_output=True, text=True, check=True).stdout
    assert "Pre-voyage check: Brack & Sons &P (TEST-ONE), 30 days" in text
