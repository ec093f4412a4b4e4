# SPDX-License-Identifier: MIT
"""How every workbook kit writes prints: the paper (A4 by default, or US Letter), the
orientation, fitted to the page width or not, the rows repeated on each page, the print area, and a
page header saying what the workbook is, for which vessel or fleet and when, with "page N of M" in
the footer.

One function for every kind of workbook, so the order, the pre-voyage check, the count sheet, the
enquiries and the templates print alike. It works on a write-only sheet too, as long as it is
called before the sheet's rows are written (openpyxl writes the page set-up after the rows, but
keeps the print titles and area it is given).
"""

from __future__ import annotations

from openpyxl.worksheet.properties import PageSetupProperties

from kit.files.safe_text import visible

# ECMA-376 Part 1, 18.3.1.63 (pageSetup), paperSize: 1 is US Letter (8.5 in x 11 in), 9 is A4
# (210 mm x 297 mm, ISO 216); both checked in the rendered PDF's page size by the tests.
PAPER_SIZES = {"a4": 9, "letter": 1}
PAPERS = tuple(PAPER_SIZES)
DEFAULT_PAPER = "a4"
HEADER_CHARS = 80  # a page header longer than this runs into its right-hand part
PAGE_NUMBERS = "page &P of &N"


def header_text(text: str, limit: int = HEADER_CHARS) -> str:
    """Text for a page header or footer: visible, cut to ``limit`` characters with "...", and each
    ``&`` doubled, since ``&`` starts a code there (``&P`` the page number)."""
    shown = str(visible(text))
    if len(shown) > limit:
        shown = shown[:limit - 3] + "..."
    return shown.replace("&", "&&")


def set_print(ws, *, paper: str = DEFAULT_PAPER, what: str, scope: str | None = None, day: str | None = None,
              landscape: bool = False, fit_width: bool = True, title_rows: str | None = None,
              title_cols: str | None = None, area: str | None = None, footer: str | None = None,
              margins: tuple[float, float, float] | None = None, font_size: int = 10,
              grid: bool = False, centred: bool = False) -> None:
    """Print set-up of ``ws``: ``paper`` ("a4" or "letter"), portrait or ``landscape``, fitted one
    page wide (``fit_width``; as many pages down as it takes) or at full size across pages; the
    rows (``"1:1"``) and columns (``"A:C"``) repeated on every page; the print ``area``; the page
    header "``what``: ``scope``" on the left and ``day`` on the right; ``footer`` on the left of
    the footer and "page N of M" on its right. ``margins``: left and right, top and bottom, header
    and footer, in inches (as the file keeps them; default :data:`SIDE_MARGIN_IN`, 0.75 and 0.3); ``font_size`` of the header and footer, in points."""
    if paper not in PAPER_SIZES:
        raise ValueError(f"paper {paper!r}: expected one of {', '.join(PAPERS)}")
    ps = ws.page_setup
    ps.paperSize = PAPER_SIZES[paper]
    ps.orientation = "landscape" if landscape else "portrait"
    ps.fitToWidth, ps.fitToHeight = (1 if fit_width else 0), 0
    ws.sheet_properties.pageSetUpPr = PageSetupProperties(fitToPage=fit_width)
    side, top, header = margins or (SIDE_MARGIN_IN, 0.75, 0.3)
    ws.page_margins.left = ws.page_margins.right = side
    ws.page_margins.top = ws.page_margins.bottom = top
    ws.page_margins.header = ws.page_margins.footer = header
    if title_rows:
        ws.print_title_rows = title_rows
    if title_cols:
        ws.print_title_cols = title_cols
    if area:
        ws.print_area = area
    if grid:
        ws.print_options.gridLines = True
    if centred:
        ws.print_options.horizontalCentered = True
    ws.oddHeader.left.text = header_text(f"{what}: {scope}" if scope else what)
    if day:
        ws.oddHeader.right.text = header_text(day, 40)
    if footer:
        ws.oddFooter.left.text = header_text(footer, 100)
    ws.oddFooter.right.text = PAGE_NUMBERS
    for part in (ws.oddHeader.left, ws.oddHeader.right, ws.oddFooter.left, ws.oddFooter.right):
        part.size = font_size


__all__ = ["PAPERS", "DEFAULT_PAPER", "PAPER_SIZES", "header_text", "set_print"]


# The printable width of the page between kit's side margins (0.4 in each), in points: A4 is
# 595.3 x 841.9 pt (ISO 216), Letter 612 x 792 pt (8.5 in x 11 in).
PAGE_POINTS = {"a4": (595.3, 841.9), "letter": (612.0, 792.0)}
SIDE_MARGIN_IN = 0.4
# Every workbook's default font: Arial, or a font with its metrics (Liberation Sans), is on every
# office machine, so columns print as wide everywhere; Calibri is missing where LibreOffice runs
# alone, and its stand-in sets wider.
FONT_NAME = "Arial"
FONT_PT = 10
# Printed text below about 8 pt is hard to read at arm's length (common practice).
LEAST_PT = 8.0


def use_font(wb, size: int = FONT_PT) -> None:
    """Make Arial ``size`` pt the default font of the new workbook ``wb`` (its Normal style, which
    unstyled cells and the column widths go by)."""
    from openpyxl.styles import Font
    from openpyxl.utils.indexed_list import IndexedList

    font = Font(name=FONT_NAME, size=size, family=2)
    wb._fonts = IndexedList([font])
    wb._named_styles["Normal"].font = font


def column_points(width: float) -> float:
    """A column's printed width in points at full size: ``width`` counts the digit 0 of the default
    font (7 pixels of 96 per inch in Arial 10), plus 5 pixels of padding (ECMA-376 Part 1,
    18.3.1.13 col, width; from memory, checked against LibreOffice renders in the tests)."""
    return (width * 7 + 5) * 0.75


def fits_width(widths, paper: str = DEFAULT_PAPER, landscape: bool = False, side_margin: float = SIDE_MARGIN_IN,
               font_pt: float = FONT_PT) -> bool:
    """Whether columns of ``widths`` fitted one page wide still print their ``font_pt`` text at
    :data:`LEAST_PT` or more."""
    short, long = PAGE_POINTS[paper]
    room = (long if landscape else short) - 2 * 72 * side_margin
    return room / sum(column_points(w) for w in widths) * font_pt >= LEAST_PT


__all__ += ["FONT_NAME", "FONT_PT", "LEAST_PT", "column_points", "fits_width", "use_font"]
