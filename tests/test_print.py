# SPDX-License-Identifier: MIT
"""Every workbook kit writes, printed: the demo fleet's order, the pre-voyage check, an enquiry,
the count sheet and each template, rendered to PDF by LibreOffice (tests/spreadsheet_program.py)
and measured there: the paper (A4 by default, Letter on request), the page count, the page header
and "page N of M" footer, the printed size of the smallest text, the order's printed columns and
that no text is cut or overlapped."""

from __future__ import annotations

import datetime as dt
import re
import shutil
import subprocess
from pathlib import Path

import openpyxl
import pytest
from click.testing import CliRunner

from kit.cli import main
from kit.files.print_setup import use_font
from kit.files.workbook import ORDER_COLUMNS, ORDER_PRINTED
from spreadsheet_program import soffice

ROOT = Path(__file__).resolve().parents[1]
# ISO 216: A4 is 210 mm x 297 mm = 595.3 pt x 841.9 pt; US Letter is 8.5 in x 11 in = 612 pt x 792 pt.
A4 = (595, 842)
LETTER = (612, 792)
# Printed text under about 8 pt is hard to read at arm's length (common practice); 0.1 pt for the
# rounding of the measure.
LEAST_PT = 7.9


def run(*args):
    result = CliRunner().invoke(main, [str(a) for a in args], env={"COLUMNS": "120"})
    assert result.exit_code in (0, 1), result.output
    return result


@pytest.fixture(scope="module")
def books(tmp_path_factory):
    """Each kind of workbook (A4, and three on Letter), rendered in one LibreOffice run."""
    work = tmp_path_factory.mktemp("print")
    demo, out = work / "kit-demo", work / "books"
    out.mkdir()
    run("demo", "--out", demo)
    db = demo / "fleet.sqlite"
    shutil.copy(demo / "fleet-bom.xlsx", out / "order.xlsx")
    shutil.copy(demo / "corvina-bay-voyage-check.xlsx", out / "check.xlsx")
    run("enquiry", "write", "--db", db, "--vessel", "CORVINA-BAY", "--days", "90", "--out", work / "enquiries")
    shutil.copy(next(p for p in sorted((work / "enquiries").glob("*.xlsx")) if p.name != "any-supplier.xlsx"),
                out / "enquiry.xlsx")
    run("template", "stock", out / "count.xlsx", "--vessel", "CORVINA-BAY", "--days", "90", "--db", db)
    run("template", "stock", out / "stock.xlsx", "--db", db)
    run("template", "particulars", out / "particulars.xlsx")
    run("template", "particulars", out / "particulars-corvina.xlsx", "--from", ROOT / "demo_fleet" / "corvina_bay.toml")
    run("template", "catalogue", out / "catalogue.xlsx")
    run("bom", "--db", db, "--vessel", "CORVINA-BAY", "--days", "90", "--out", out / "order-letter.xlsx", "--paper", "letter")
    run("check", "CORVINA-BAY", "--db", db, "--days", "120", "--out", out / "check-letter.xlsx", "--paper", "LETTER")
    run("template", "catalogue", out / "catalogue-letter.xlsx", "--paper", "letter")
    # calibration: Arial 10 pt (kit's default font) at full size, to turn word boxes into points
    wb = openpyxl.Workbook()
    use_font(wb)
    wb.active["A1"] = "Calibration at full size"
    wb.save(out / "calibration.xlsx")
    if not shutil.which("pdftotext"):
        pytest.fail("pdftotext (poppler-utils) is needed to measure the printed pages")
    profile = (work / "lo-profile").resolve().as_uri()
    subprocess.run([soffice(), f"-env:UserInstallation={profile}", "--headless", "--convert-to", "pdf", "--outdir",
                    str(work / "pdf"), *sorted(str(p) for p in out.glob("*.xlsx"))], check=True, capture_output=True,
                   timeout=600)
    return out, work / "pdf"


def pdf_pages(pdf: Path) -> list[list[tuple[float, float, float, float, str]]]:
    """Per page, every word pdftotext finds: (xMin, yMin, xMax, yMax, text)."""
    html = subprocess.run(["pdftotext", "-bbox", str(pdf), "-"], check=True, capture_output=True, text=True).stdout
    word = r'xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<'
    return [[(float(a), float(b), float(c), float(d), unescape(t)) for a, b, c, d, t in re.findall(word, page)]
            for page in html.split("<page ")[1:]]


def unescape(text: str) -> str:
    return text.replace("&amp;", "&").replace("&lt;", "<").replace("&gt;", ">").replace("&quot;", '"')


def page_size(pdf: Path) -> tuple[int, int]:
    info = subprocess.run(["pdfinfo", str(pdf)], check=True, capture_output=True, text=True).stdout
    w, h = map(float, re.search(r"Page size:\s+([\d.]+) x ([\d.]+) pts", info).groups())
    return round(w), round(h)


def points_per_box(pdfs: Path) -> float:
    """The height of a word box per point of Arial (Liberation Sans) type, from the calibration render."""
    (words,) = pdf_pages(pdfs / "calibration.pdf")
    return (words[0][3] - words[0][1]) / 10


def smallest_pt(pages, per_point: float) -> float:
    return min(w[3] - w[1] for page in pages for w in page) / per_point


# workbook -> what its page header starts with, its most pages (before: main's renders, see the
# closing note of issue 14), the pages of the demo fleet's order sheet itself not counted here
EXPECTED = {
    "order": ("Bill of materials, Cover: whole fleet, 6 vessels", 30),
    "check": ("Pre-voyage check: Corvina Bay (CORVINA-BAY)", 1),
    "enquiry": ("Enquiry E", 4),
    "count": ("Stock count: Corvina Bay (CORVINA-BAY)", 3),
    "stock": ("Stock sheet (template): sheet stock", 4),
    "particulars": ("Particulars (template): sheet vessel", 15),
    "particulars-corvina": ("Particulars of Corvina Bay (CORVINA-BAY): sheet vessel", 15),
    "catalogue": ("Catalogue (template): sheet catalogue", 3),
}


@pytest.mark.parametrize("name", list(EXPECTED))
def test_every_workbook_prints_on_a4_numbered_with_a_header_and_readable_text(books, name):
    _, pdfs = books
    pdf = pdfs / f"{name}.pdf"
    pages = pdf_pages(pdf)
    header, most = EXPECTED[name]
    assert 1 <= len(pages) <= most, len(pages)
    assert sorted(page_size(pdf)) == sorted(A4)
    today = dt.date.today().isoformat()
    for n in range(1, len(pages) + 1):
        text = subprocess.run(["pdftotext", "-layout", "-f", str(n), "-l", str(n), str(pdf), "-"], check=True,
                              capture_output=True, text=True).stdout
        assert f"page {n} of {len(pages)}" in text.lower(), (name, n)
        assert today in text, (name, n)
        if n == 1:
            assert " ".join(text.split()).startswith(header), text[:200]
    assert smallest_pt(pages, points_per_box(pdfs)) >= LEAST_PT


@pytest.mark.parametrize("name", ["order-letter", "check-letter", "catalogue-letter"])
def test_paper_letter_prints_on_us_letter(books, name):
    _, pdfs = books
    assert sorted(page_size(pdfs / f"{name}.pdf")) == sorted(LETTER)
    assert smallest_pt(pdf_pages(pdfs / f"{name}.pdf"), points_per_box(pdfs)) >= LEAST_PT


def sheet_pages(pages, sheet: str) -> list:
    return [p for p in pages if " ".join(w[4] for w in p[:12]).startswith(f"Bill of materials, {sheet}:")]


def test_order_sheet_prints_the_purchasers_columns_whole_and_under_their_headings(books):
    out, pdfs = books
    pages = sheet_pages(pdf_pages(pdfs / "order.pdf"), "Order lines")
    assert pages
    words = [w[4] for page in pages for w in page]
    printed = [name for name, _, _ in ORDER_COLUMNS[:ORDER_PRINTED]]
    assert {"Designation", "Supplier", "Packs", "Currency", "Why"} <= set(words)
    for hidden in ("key", "Basis", "Compound", "Earliest"):  # outside the print area
        assert hidden not in words, hidden
    # no cut text: every word of the printed text columns is on the paper, whole
    ws = openpyxl.load_workbook(out / "order.xlsx")["Order lines"]
    head = [c.value for c in ws[1]]
    wanted = [w for row in ws.iter_rows(min_row=2, values_only=True)
              for col in ("Designation", "Supplier", "Supplier part no", "Why this supplier")
              if row[head.index(col)] for w in str(row[head.index(col)]).split()]
    assert wanted and set(wanted) <= set(words), sorted(set(wanted) - set(words))[:10]
    # the headings stand above the first row on every page: nothing of the heading row reaches
    # down into the row below it (the first data row's words start lower than every heading word)
    heading_words = {w for name in printed for w in name.split()}
    for page in pages:
        top = min(w[1] for w in page if w[4] == "Designation")
        heading = [w for w in page if w[4] in heading_words and w[1] < top + 40]
        below = min(w[1] for w in page if w[1] > max(h[3] for h in heading) - 0.5 and w[4] not in heading_words)
        assert max(h[3] for h in heading) <= below
    assert len(pages) <= 12


def test_gear_checks_and_cover_print_on_few_pages_with_the_caution_on_the_page(books):
    out, pdfs = books
    pages = pdf_pages(pdfs / "order.pdf")
    checks = sheet_pages(pages, "Gear checks")
    assert 1 <= len(checks) <= 2  # was 11 pages across, mostly empty
    text = " ".join(w[4] for page in checks for w in page)
    assert "SOLAS II-1/29 verdicts" in text and "CORVINA-BAY" in text and "TIDEWHISTLE" in text
    cover = sheet_pages(pages, "Cover")
    assert len(cover) <= 2
    width = page_size(pdfs / "order.pdf")[0]
    margin = 0.4 * 72 * 0.9  # kit's side margins, less a little
    for page in cover + checks:
        assert max(w[2] for w in page) <= width - margin  # no line runs off the paper
    caution = [w for page in cover for w in page if w[4] == "CAUTION:"]
    assert caution
